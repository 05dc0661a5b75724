// The bridge inside the desktop app: forwards to the two functions the preload script exposes as
// window.pliantBridge (see electron/preload.ts), which carry requests over our one IPC channel.
import type { PreloadBridgeApi } from '../../sim/bridge/bridge-contract.ts';
import { BridgeRequestError } from './bridge-request-error.ts';
import type { PliantBridge } from './pliant-bridge.ts';
import { unwrapReply } from './unwrap-reply.ts';

export function createElectronBridge(preload: PreloadBridgeApi): PliantBridge {
  return {
    transport: 'electron',
    async invoke(name, args) {
      let reply: unknown;
      try {
        reply = await preload.invoke(name, args);
      } catch {
        // ipcRenderer.invoke rejects only when nothing answers on the channel: the main process is broken.
        throw new BridgeRequestError('shell-unreachable', `The desktop app did not answer ${name}. Restart Pliant.`);
      }
      return unwrapReply(name, reply);
    },
    onEvent: (listener) => preload.onEvent(listener),
  };
}
