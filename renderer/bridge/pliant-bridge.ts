// The only way the renderer talks to the world: typed requests and events, the same whether the
// page runs inside the desktop app (electron-bridge.ts) or in a browser in web mode
// (web-bridge.ts). connect-bridge.ts picks the right one.
import type { BridgeEvent, RequestArgs, RequestName, RequestResult } from '../../sim/bridge/bridge-contract.ts';

export interface PliantBridge {
  readonly transport: 'electron' | 'web';
  /** Resolves with the result, or rejects with a BridgeRequestError carrying the contract's error code. */
  invoke<K extends RequestName>(name: K, args: RequestArgs<K>): Promise<RequestResult<K>>;
  /** Returns a function that removes the listener. */
  onEvent(listener: (event: BridgeEvent) => void): () => void;
}
