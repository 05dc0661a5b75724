// The options of Pliant's one window. Each security-relevant web preference is written out, even
// where it equals Electron's default, so a change of default can never loosen it silently and a
// test can assert every value. Items refer to Electron's security checklist ("Security, Native
// Capabilities, and Your Responsibility").
import type { BrowserWindowConstructorOptions } from 'electron';

export function mainWindowOptions(preloadPath: string): BrowserWindowConstructorOptions {
  return {
    width: 1360,
    height: 860,
    minWidth: 960,
    minHeight: 600,
    title: 'Pliant',
    // Shown once the first frame is painted, so the window never flashes empty.
    show: false,
    backgroundColor: '#10161c',
    webPreferences: {
      preload: preloadPath,
      contextIsolation: true, // item 3
      sandbox: true, // item 4
      nodeIntegration: false, // item 2
      nodeIntegrationInWorker: false,
      nodeIntegrationInSubFrames: false,
      webSecurity: true, // item 6
      allowRunningInsecureContent: false, // item 8
      experimentalFeatures: false, // item 9 (and no enableBlinkFeatures, item 10)
      webviewTag: false, // items 11 and 12: no <webview> at all
      navigateOnDragDrop: false, // a dropped file must not replace the app page (item 13)
      spellcheck: false,
      safeDialogs: true,
    },
  };
}
