// The desktop shell's remaining safeguards, each against Electron's security checklist
// ("Security, Native Capabilities, and Your Responsibility"): item 5 permission requests (Electron
// grants all by default, so a handler must deny them), items 12-14 webviews, navigation and new
// windows, and the custom protocol that replaces file:// (items 1 and 7; API names from Electron's
// protocol docs: registerSchemesAsPrivileged before ready, protocol.handle).
import { mkdirSync, mkdtempSync, realpathSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import type { MenuItemConstructorOptions, Session, WebContents } from 'electron';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { appMenuTemplate } from '../electron/app-menu.ts';
import { createAppProtocolHandler } from '../electron/app-protocol.ts';
import { APP_ENTRY_URL, APP_SCHEME_REGISTRATION, isAppUrl } from '../electron/app-scheme.ts';
import { createNativeFolderChooser, folderDialogOptions } from '../electron/folder-dialog.ts';
import { guardSession } from '../electron/session-guard.ts';
import { guardWebContents } from '../electron/web-contents-guard.ts';

type Listener = (...args: unknown[]) => unknown;

/** Records what the guards install, standing in for Electron's Session / WebContents. */
function recorder() {
  const listeners = new Map<string, Listener>();
  const installed: Record<string, Listener> = {};
  const target = {
    on(event: string, listener: Listener) {
      listeners.set(event, listener);
      return target;
    },
    setPermissionRequestHandler: (h: Listener) => (installed.permissionRequest = h),
    setPermissionCheckHandler: (h: Listener) => (installed.permissionCheck = h),
    setDevicePermissionHandler: (h: Listener) => (installed.devicePermission = h),
    setWindowOpenHandler: (h: Listener) => (installed.windowOpen = h),
  };
  return { target, listeners, installed };
}

function preventable() {
  const event = { prevented: false, preventDefault: () => (event.prevented = true) };
  return event;
}

describe('session permissions (checklist item 5)', () => {
  const { target, listeners, installed } = recorder();
  guardSession(target as unknown as Session);

  it.each(['media', 'geolocation', 'notifications', 'openExternal', 'fileSystem', 'clipboard-read'])('denies a %s permission request', (permission) => {
    const answers: boolean[] = [];
    installed.permissionRequest({}, permission, (granted: boolean) => answers.push(granted), {});
    expect(answers).toEqual([false]);
  });

  it('answers every permission check and device request with false', () => {
    expect(installed.permissionCheck({}, 'media', 'pliant://app', {})).toBe(false);
    expect(installed.devicePermission({ deviceType: 'usb', origin: 'pliant://app' })).toBe(false);
  });

  it('cancels downloads: the page never writes files, the main process does', () => {
    const event = preventable();
    listeners.get('will-download')!(event, {}, {});
    expect(event.prevented).toBe(true);
  });
});

describe('navigation and new windows (checklist items 12-14)', () => {
  const { target, listeners, installed } = recorder();
  guardWebContents(target as unknown as WebContents);

  it.each(['https://example.com/', 'pliant://app/index.html', 'file:///etc/passwd'])('refuses navigation to %s', (url) => {
    const event = preventable();
    listeners.get('will-navigate')!(event, url);
    expect(event.prevented).toBe(true);
  });

  it('refuses redirects and webview attachment', () => {
    for (const name of ['will-redirect', 'will-attach-webview']) {
      const event = preventable();
      listeners.get(name)!(event, {}, {});
      expect(event.prevented).toBe(true);
    }
  });

  it('denies every new window', () => {
    expect(installed.windowOpen({ url: 'https://example.com/', disposition: 'new-window' })).toEqual({ action: 'deny' });
    expect(installed.windowOpen({ url: 'pliant://app/index.html', disposition: 'foreground-tab' })).toEqual({ action: 'deny' });
  });
});

describe('app scheme (registerSchemesAsPrivileged / protocol.handle)', () => {
  it('registers pliant: as standard and secure with fetch, and does not bypass the CSP', () => {
    expect(APP_SCHEME_REGISTRATION).toEqual({
      scheme: 'pliant',
      privileges: {
        standard: true,
        secure: true,
        supportFetchAPI: true,
        codeCache: true,
        bypassCSP: false,
        corsEnabled: false,
        allowServiceWorkers: false,
        stream: false,
      },
    });
    expect(APP_ENTRY_URL).toBe('pliant://app/index.html');
  });

  it('recognises our origin by parsing, not by prefix', () => {
    expect(isAppUrl('pliant://app/assets/index-abc.js')).toBe(true);
    expect(isAppUrl('pliant://app.example.com/')).toBe(false);
    expect(isAppUrl('pliant://app:8080/')).toBe(false);
    expect(isAppUrl('pliantx://app/')).toBe(false);
  });
});

describe('app protocol handler', () => {
  let root: string;
  let rendererDir: string;
  let handler: ReturnType<typeof createAppProtocolHandler>;

  beforeAll(() => {
    root = realpathSync(mkdtempSync(join(tmpdir(), 'pliant-protocol-')));
    rendererDir = join(root, 'renderer');
    mkdirSync(join(rendererDir, 'assets'), { recursive: true });
    writeFileSync(join(rendererDir, 'index.html'), '<!doctype html><title>Pliant</title>');
    writeFileSync(join(rendererDir, 'assets', 'index-3f2a.js'), 'export const tank = "Korrin Bay";');
    writeFileSync(join(rendererDir, '.env'), 'SECRET=1');
    writeFileSync(join(root, 'secret.txt'), 'not part of the app');
    symlinkSync(root, join(rendererDir, 'escape'));
    handler = createAppProtocolHandler(rendererDir);
  });
  afterAll(() => rmSync(root, { recursive: true, force: true }));

  it('serves the entry page at / and files by path, with their media types', async () => {
    const page = await handler(new Request('pliant://app/'));
    expect(page.status).toBe(200);
    expect(page.headers.get('content-type')).toBe('text/html; charset=utf-8');
    expect(await page.text()).toBe('<!doctype html><title>Pliant</title>');
    const script = await handler(new Request('pliant://app/assets/index-3f2a.js?v=1'));
    expect(script.headers.get('content-type')).toBe('text/javascript; charset=utf-8');
    expect(script.headers.get('x-content-type-options')).toBe('nosniff');
    expect(await script.text()).toBe('export const tank = "Korrin Bay";');
  });

  // Chromium normalises dot segments before calling the handler; these raw URLs check that the
  // handler refuses them on its own too, should a URL ever reach it unnormalised.
  it.each([
    'pliant://app/../secret.txt',
    'pliant://app/%2e%2e/secret.txt',
    'pliant://app/%2E%2E/secret.txt',
    'pliant://app/assets/..%2f..%2fsecret.txt',
    'pliant://app/assets/%2e%2e%5c%2e%2e%5csecret.txt',
    'pliant://app/assets//index-3f2a.js',
    'pliant://app/index.html%00.js',
    'pliant://app/%E0%A4%A',
  ])('refuses the raw URL %s with 400', async (url) => {
    const response = await handler({ method: 'GET', url });
    expect(response.status).toBe(400);
  });

  it('refuses a symlink out of the renderer folder (403), dot files and other hosts (404), and writes (405)', async () => {
    expect((await handler(new Request('pliant://app/escape/secret.txt'))).status).toBe(403);
    expect((await handler(new Request('pliant://app/.env'))).status).toBe(404);
    expect((await handler(new Request('pliant://other/index.html'))).status).toBe(404);
    expect((await handler({ method: 'POST', url: 'pliant://app/index.html' })).status).toBe(405);
  });
});

describe('native folder dialog', () => {
  it('asks for a folder, worded for its purpose, and may create one', () => {
    expect(folderDialogOptions('export')).toEqual({
      title: 'Where should the dataset go?',
      buttonLabel: 'Write here',
      message: 'Pick or create the folder the new dataset is written into.',
      properties: ['openDirectory', 'createDirectory', 'dontAddToRecent'],
    });
    expect(folderDialogOptions('dataset').properties).toContain('openDirectory');
    expect(folderDialogOptions('dataset').properties).not.toContain('openFile');
  });

  it('returns the picked folder, or null when the person cancels', async () => {
    const picked = createNativeFolderChooser(async () => ({ canceled: false, filePaths: ['/home/ana/korrin-bay'] }));
    const cancelled = createNativeFolderChooser(async () => ({ canceled: true, filePaths: [] }));
    expect(picked.mode).toBe('native');
    if (picked.mode === 'native' && cancelled.mode === 'native') {
      expect(await picked.choose('dataset')).toBe('/home/ana/korrin-bay');
      expect(await cancelled.choose('dataset')).toBeNull();
    }
  });
});

describe('menu bar', () => {
  const labels = (items: MenuItemConstructorOptions[]): string[] =>
    items.flatMap((item) => [item.label ?? `(${item.type})`, ...labels((item.submenu as MenuItemConstructorOptions[] | undefined) ?? [])]);

  it('labels every item in our own words (no item falls back to a role\'s default label)', () => {
    const template = appMenuTemplate({ isMac: false, allowDevTools: false, actions: { showAbout: () => undefined, showSafetyNote: () => undefined } });
    expect(labels(template)).toEqual([
      'Pliant', 'About Pliant', 'Before you use simulated data…', '(separator)', 'Close Pliant',
      'Edit', 'Undo', 'Redo', '(separator)', 'Cut', 'Copy', 'Paste', 'Select all',
      'View', 'Reload the page', '(separator)', 'Larger', 'Smaller', 'Normal size', '(separator)', 'Full screen',
    ]);
  });

  it('offers the page inspector only when allowed (unpackaged builds)', () => {
    const template = appMenuTemplate({ isMac: true, allowDevTools: true, actions: { showAbout: () => undefined, showSafetyNote: () => undefined } });
    expect(labels(template)).toContain('Page inspector');
    expect(labels(template)).toContain('Hide Pliant');
  });

  it('runs the about and safety-note actions from their items', () => {
    const ran: string[] = [];
    const template = appMenuTemplate({ isMac: false, allowDevTools: false, actions: { showAbout: () => ran.push('about'), showSafetyNote: () => ran.push('safety') } });
    const items = template[0].submenu as MenuItemConstructorOptions[];
    (items[0].click as () => void)();
    (items[1].click as () => void)();
    expect(ran).toEqual(['about', 'safety']);
  });
});
