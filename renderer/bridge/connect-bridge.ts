// Picks the bridge for wherever the page is running: the preload's window.pliantBridge inside
// the desktop app, otherwise the web-mode server named by the page's own address.
import type { PreloadBridgeApi } from '../../sim/bridge/bridge-contract.ts';
import { PRELOAD_GLOBAL_NAME } from '../../sim/bridge/bridge-contract.ts';
import { createElectronBridge } from './electron-bridge.ts';
import type { PliantBridge } from './pliant-bridge.ts';
import type { InPageFolderPicker } from './web-bridge.ts';
import { createWebBridge, readSessionToken } from './web-bridge.ts';

export function connectBridge(options: { pickFolderInPage?: InPageFolderPicker } = {}): PliantBridge {
  const preload = (window as unknown as Record<string, PreloadBridgeApi | undefined>)[PRELOAD_GLOBAL_NAME];
  if (preload) return createElectronBridge(preload);

  const token = readSessionToken(window.location.hash);
  if (token === null) {
    throw new Error('This page needs the full address Pliant printed when "npm run web" started (it ends in #session=...). Open that address.');
  }
  const webOptions: Parameters<typeof createWebBridge>[0] = {
    origin: window.location.origin,
    token,
    fetch: (url, init) => window.fetch(url, init),
    createEventSource: (url) => new EventSource(url),
  };
  if (options.pickFolderInPage) webOptions.pickFolderInPage = options.pickFolderInPage;
  return createWebBridge(webOptions);
}
