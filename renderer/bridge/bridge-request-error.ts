// The error a bridge request rejects with: the contract's error code plus a message meant for
// the person using Pliant, so screens can show it as it is.
import type { RequestErrorCode } from '../../sim/bridge/bridge-contract.ts';

export class BridgeRequestError extends Error {
  readonly code: RequestErrorCode;

  constructor(code: RequestErrorCode, message: string) {
    super(message);
    this.name = 'BridgeRequestError';
    this.code = code;
  }
}
