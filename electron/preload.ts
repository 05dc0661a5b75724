// The sandboxed preload script: exposes exactly two functions to the page as window.pliantBridge
// through contextBridge (Electron's security checklist, item 3) and nothing of ipcRenderer itself,
// so the page can send only on our one request channel and only receive our events. The IPC
// event object is never handed to the page: it would expose the sender and reply machinery.
// Built as a single CommonJS file because sandboxed preloads cannot load other modules.
import type { IpcRendererEvent } from 'electron';
import { contextBridge, ipcRenderer } from 'electron';

import type { BridgeEvent, PreloadBridgeApi, RequestName, RequestReply } from '../sim/bridge/bridge-contract.ts';
import { IPC_EVENT_CHANNEL, IPC_REQUEST_CHANNEL, PRELOAD_GLOBAL_NAME } from '../sim/bridge/bridge-contract.ts';

const api: PreloadBridgeApi = {
  invoke: (name: string, args: unknown) => ipcRenderer.invoke(IPC_REQUEST_CHANNEL, name, args) as Promise<RequestReply<RequestName>>,
  onEvent: (listener: (event: BridgeEvent) => void) => {
    const relay = (_event: IpcRendererEvent, payload: BridgeEvent): void => listener(payload);
    ipcRenderer.on(IPC_EVENT_CHANNEL, relay);
    return () => {
      ipcRenderer.removeListener(IPC_EVENT_CHANNEL, relay);
    };
  },
};

contextBridge.exposeInMainWorld(PRELOAD_GLOBAL_NAME, api);
