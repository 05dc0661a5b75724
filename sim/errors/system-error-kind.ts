// The kind (pliant-error.ts) of an operating-system error, told by its errno code as Node reports
// it in `error.code`, never by its message. A full disk, missing permission or a read-only disk
// is the machine's state, not a mistake in what was asked; a path that does not exist or names
// the wrong sort of thing is the person's to fix. Codes as in POSIX errno.h (The Open Group Base
// Specifications, <errno.h>); which side each falls on is common practice, no source.
import type { ErrorKind } from './pliant-error.ts';

const ENVIRONMENT_CODES = new Set([
  'ENOSPC', // no space left on the device
  'EDQUOT', // disk quota exceeded
  'EACCES', // permission denied
  'EPERM', // operation not permitted
  'EROFS', // read-only file system
  'EIO', // input/output error
  'EMFILE', // too many open files in this process
  'ENFILE', // too many open files in the system
  'EBUSY', // device or resource busy
  'ENOMEM', // not enough memory
  'ETXTBSY', // text file busy
  'EAGAIN', // resource temporarily unavailable
]);

const USER_CODES = new Set([
  'ENOENT', // no such file or folder
  'ENOTDIR', // a part of the path is not a folder
  'EISDIR', // a folder where a file was expected
  'EEXIST', // already exists
  'ENOTEMPTY', // folder not empty
  'ENAMETOOLONG', // file name too long
  'ELOOP', // too many symbolic links
]);

/** The errno code of a Node.js system error (ENOSPC, EACCES, ...), or undefined for any other value. */
export function systemErrorCode(error: unknown): string | undefined {
  if (typeof error !== 'object' || error === null) return undefined;
  const code = (error as { code?: unknown }).code;
  return typeof code === 'string' && /^E[A-Z0-9]+$/.test(code) ? code : undefined;
}

/** 'environment' or 'user' for a known errno code, undefined for codes that say nothing either way. */
export function systemErrorKind(code: string): ErrorKind | undefined {
  if (ENVIRONMENT_CODES.has(code)) return 'environment';
  if (USER_CODES.has(code)) return 'user';
  return undefined;
}
