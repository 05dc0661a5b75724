// The desktop app's entry point in Electron's main process. It only wires Electron's objects to
// the plain, tested modules beside it; no decision about security or requests is made here.
// Long jobs never run on this thread: the job runner starts a worker thread per job.
import { realpath } from 'node:fs/promises';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

import { app, BrowserWindow, dialog, ipcMain, Menu, protocol, session } from 'electron';

import { IPC_EVENT_CHANNEL, IPC_REQUEST_CHANNEL } from '../sim/bridge/bridge-contract.ts';
import { appMenuTemplate } from './app-menu.ts';
import { createAppProtocolHandler } from './app-protocol.ts';
import { APP_ENTRY_URL, APP_SCHEME, APP_SCHEME_REGISTRATION, isAppUrl } from './app-scheme.ts';
import { createDefaultServices } from './default-services.ts';
import { createNativeFolderChooser } from './folder-dialog.ts';
import { createIpcRequestListener, forwardEvents } from './ipc-shell.ts';
import { createRequestHandlers } from './request-handlers.ts';
import { SAFETY_NOTICE } from './safety-notice.ts';
import { guardSession } from './session-guard.ts';
import { guardWebContents } from './web-contents-guard.ts';
import { mainWindowOptions } from './window-options.ts';

// Built layout (see build-electron.ts): dist/electron/main.mjs, dist/electron/preload.cjs and
// the renderer in dist/renderer/.
const rendererDir = fileURLToPath(new URL('../renderer/', import.meta.url));
const preloadPath = fileURLToPath(new URL('./preload.cjs', import.meta.url));
const scenariosDir = app.isPackaged
  ? join(process.resourcesPath, 'scenarios')
  : fileURLToPath(new URL('../../scenarios/', import.meta.url));

// Both must happen before the ready event; Electron allows them only then. enableSandbox makes
// every renderer sandboxed even if a window's options were ever to forget it (checklist item 4).
app.enableSandbox();
protocol.registerSchemesAsPrivileged([APP_SCHEME_REGISTRATION]);

if (!app.requestSingleInstanceLock()) app.quit();

app.on('web-contents-created', (_event, contents) => guardWebContents(contents));
app.on('window-all-closed', () => app.quit());

let mainWindow: BrowserWindow | null = null;

app.on('second-instance', () => {
  if (mainWindow) {
    if (mainWindow.isMinimized()) mainWindow.restore();
    mainWindow.focus();
  }
});

app.whenReady().then(start).catch((error: unknown) => {
  dialog.showErrorBox('Pliant could not start', error instanceof Error ? error.message : String(error));
  app.quit();
});

async function start(): Promise<void> {
  guardSession(session.defaultSession);
  session.defaultSession.protocol.handle(APP_SCHEME, createAppProtocolHandler(await realpath(rendererDir)));

  const services = await createDefaultServices({
    mode: 'desktop',
    version: app.getVersion(),
    bundledScenariosDir: scenariosDir,
    folderChooser: createNativeFolderChooser(
      (options) => (mainWindow ? dialog.showOpenDialog(mainWindow, options) : dialog.showOpenDialog(options)),
      { scenario: scenariosDir },
    ),
    reportInternalError: (name, error) => console.error(`[pliant] request ${name} failed:`, error),
  });
  const handlers = createRequestHandlers(services);
  ipcMain.handle(
    IPC_REQUEST_CHANNEL,
    createIpcRequestListener(handlers, (url) => console.warn(`[pliant] refused a request from ${url}`)),
  );

  const about = (): void => {
    void dialog.showMessageBox({
      type: 'info',
      title: 'About Pliant',
      message: `Pliant ${app.getVersion()}`,
      detail: 'Generates labelled, reproducible trajectory datasets of ropes, tethers and soft bodies with a mass-spring and voxel simulator.',
    });
  };
  const safetyNote = (): void => {
    void dialog.showMessageBox({ type: 'warning', title: 'Before you use simulated data', message: SAFETY_NOTICE });
  };
  Menu.setApplicationMenu(
    Menu.buildFromTemplate(
      appMenuTemplate({ isMac: process.platform === 'darwin', allowDevTools: !app.isPackaged, actions: { showAbout: about, showSafetyNote: safetyNote } }),
    ),
  );

  const window = new BrowserWindow(mainWindowOptions(preloadPath));
  mainWindow = window;
  const stopForwarding = forwardEvents(handlers, (event) => {
    if (!window.isDestroyed() && isAppUrl(window.webContents.getURL())) window.webContents.send(IPC_EVENT_CHANNEL, event);
  });
  window.once('ready-to-show', () => window.show());
  window.on('closed', () => {
    stopForwarding();
    mainWindow = null;
  });
  await window.loadURL(APP_ENTRY_URL);
}
