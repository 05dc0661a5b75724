// The desktop window's options, value by value, against Electron's security checklist
// ("Security, Native Capabilities, and Your Responsibility", electronjs.org docs/tutorial/security):
// item 2 no Node.js integration, 3 context isolation, 4 process sandboxing, 6 webSecurity on,
// 8 no allowRunningInsecureContent, 9 no experimentalFeatures, 10 no enableBlinkFeatures,
// 11-12 no <webview>, 13 limit navigation (no navigate-on-drop).
import { describe, expect, it } from 'vitest';

import { mainWindowOptions } from '../electron/window-options.ts';

const PRELOAD = '/opt/pliant/resources/app/dist/electron/preload.cjs';

describe('main window options (Electron security checklist)', () => {
  const options = mainWindowOptions(PRELOAD);
  const web = options.webPreferences ?? {};

  it('item 3: contextIsolation is true', () => expect(web.contextIsolation).toBe(true));
  it('item 4: sandbox is true', () => expect(web.sandbox).toBe(true));
  it('item 2: nodeIntegration is false, also in workers and subframes', () => {
    expect(web.nodeIntegration).toBe(false);
    expect(web.nodeIntegrationInWorker).toBe(false);
    expect(web.nodeIntegrationInSubFrames).toBe(false);
  });
  it('item 6: webSecurity is true', () => expect(web.webSecurity).toBe(true));
  it('item 8: allowRunningInsecureContent is false', () => expect(web.allowRunningInsecureContent).toBe(false));
  it('item 9: experimentalFeatures is false', () => expect(web.experimentalFeatures).toBe(false));
  it('item 10: enableBlinkFeatures is not set', () => expect('enableBlinkFeatures' in web).toBe(false));
  it('items 11-12: the <webview> tag is disabled', () => expect(web.webviewTag).toBe(false));
  it('item 13: a dropped file cannot navigate the window away', () => expect(web.navigateOnDragDrop).toBe(false));
  it('uses the default session, where the app protocol and permission handlers are installed', () => {
    expect('partition' in web).toBe(false);
    expect('session' in web).toBe(false);
  });
  it('loads the given preload script and nothing else is set', () => {
    expect(web.preload).toBe(PRELOAD);
    expect(Object.keys(web).sort()).toEqual([
      'allowRunningInsecureContent',
      'contextIsolation',
      'experimentalFeatures',
      'navigateOnDragDrop',
      'nodeIntegration',
      'nodeIntegrationInSubFrames',
      'nodeIntegrationInWorker',
      'preload',
      'safeDialogs',
      'sandbox',
      'spellcheck',
      'webSecurity',
      'webviewTag',
    ]);
    expect(web.safeDialogs).toBe(true);
    expect(web.spellcheck).toBe(false);
  });
  it('opens hidden until the first paint, titled Pliant', () => {
    expect(options.show).toBe(false);
    expect(options.title).toBe('Pliant');
  });
});
