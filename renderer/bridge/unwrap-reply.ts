// Turns a shell's reply envelope into the request's result, or a BridgeRequestError. The
// envelope crosses a process boundary, so its shape is checked rather than trusted.
import type { RequestErrorCode, RequestName, RequestResult } from '../../sim/bridge/bridge-contract.ts';
import { BridgeRequestError } from './bridge-request-error.ts';

export function unwrapReply<K extends RequestName>(name: K, reply: unknown): RequestResult<K> {
  if (typeof reply === 'object' && reply !== null) {
    const envelope = reply as { ok?: unknown; result?: unknown; error?: { code?: unknown; message?: unknown } };
    if (envelope.ok === true && 'result' in envelope) return envelope.result as RequestResult<K>;
    if (envelope.ok === false && typeof envelope.error?.code === 'string' && typeof envelope.error.message === 'string') {
      throw new BridgeRequestError(envelope.error.code as RequestErrorCode, envelope.error.message);
    }
  }
  throw new BridgeRequestError('shell-unreachable', `Pliant's shell answered ${name} with something that is not a reply.`);
}
