// The one error type request handlers throw on purpose. It carries a contract error code and a
// message written for the person using the app; anything else that escapes a handler is turned
// into one of these at the registry boundary so no stack trace ever reaches the renderer.
import type { RequestErrorCode, RequestErrorInfo } from '../sim/bridge/bridge-contract.ts';
import { translateDatasetError } from './dataset-error-translation.ts';

export class RequestError extends Error {
  readonly code: RequestErrorCode;

  constructor(code: RequestErrorCode, message: string) {
    super(message);
    this.name = 'RequestError';
    this.code = code;
  }

  toInfo(): RequestErrorInfo {
    return { code: this.code, message: this.message };
  }
}

const FS_CODES: Record<string, { code: RequestErrorCode; says: string }> = {
  ENOENT: { code: 'not-found', says: 'does not exist' },
  ENOTDIR: { code: 'not-found', says: 'is not inside a folder (a part of the path is a file)' },
  EISDIR: { code: 'io-error', says: 'is a folder, not a file' },
  EEXIST: { code: 'already-exists', says: 'already exists' },
  EACCES: { code: 'permission-denied', says: 'cannot be accessed with your account\'s permissions' },
  EPERM: { code: 'permission-denied', says: 'cannot be changed with your account\'s permissions' },
  ENOSPC: { code: 'io-error', says: 'cannot be written: the disk is full' },
  EROFS: { code: 'permission-denied', says: 'is on a read-only disk' },
};

/**
 * Turns whatever a handler threw into a contract error. Pliant's own errors are mapped by their
 * kind and code (dataset-error-translation.ts); raw file-system errors keep their meaning
 * (a missing file is "not-found", not "internal"); only the message text of other errors is
 * kept, because their stacks describe our code, not the user's problem.
 */
export function toRequestErrorInfo(thrown: unknown, requestName: string): RequestErrorInfo {
  if (thrown instanceof RequestError) return thrown.toInfo();
  const translated = translateDatasetError(thrown);
  if (translated instanceof RequestError) return translated.toInfo();
  const errno = thrown as { code?: unknown; path?: unknown; message?: unknown } | null;
  if (errno && typeof errno.code === 'string' && FS_CODES[errno.code]) {
    const known = FS_CODES[errno.code];
    const where = typeof errno.path === 'string' ? `"${errno.path}"` : 'The file';
    return { code: known.code, message: `${where} ${known.says}. Check the path and try again.` };
  }
  const text = errno && typeof errno.message === 'string' ? firstLine(errno.message) : String(thrown);
  return { code: 'internal', message: `Request ${requestName} failed inside Pliant: ${text}` };
}

function firstLine(text: string): string {
  const end = text.indexOf('\n');
  return end < 0 ? text : text.slice(0, end);
}
