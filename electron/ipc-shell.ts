// Connects the request registry to Electron IPC without importing Electron: one listener for the
// single request channel, which refuses any sender that is not our own page before the
// registry sees the message, and one forwarder that sends registry events to the window.
import type { BridgeEvent, RequestName, RequestReply } from '../sim/bridge/bridge-contract.ts';
import type { RequestHandlers } from './request-handlers.ts';
import type { SenderFrame } from './sender-frame-check.ts';
import { isTrustedSenderFrame } from './sender-frame-check.ts';

/** The part of Electron's IpcMainInvokeEvent the shell reads. */
export interface InvokeEventLike {
  readonly senderFrame: SenderFrame | null;
}

export const REFUSED_SENDER_REPLY: RequestReply<RequestName> = {
  ok: false,
  error: { code: 'refused-sender', message: 'This request came from a page that is not Pliant\'s own, so it was ignored.' },
};

/** For ipcMain.handle(IPC_REQUEST_CHANNEL, ...). */
export function createIpcRequestListener(
  handlers: RequestHandlers,
  onRefusedSender?: (url: string) => void,
): (event: InvokeEventLike, name: unknown, args: unknown) => Promise<RequestReply<RequestName>> {
  return async (event, name, args) => {
    if (!isTrustedSenderFrame(event.senderFrame)) {
      onRefusedSender?.(event.senderFrame?.url ?? '(frame gone)');
      return REFUSED_SENDER_REPLY;
    }
    return handlers.handle(name, args);
  };
}

/** Sends every registry event to the window until the returned function is called. */
export function forwardEvents(handlers: RequestHandlers, send: (event: BridgeEvent) => void): () => void {
  return handlers.onEvent(send);
}
