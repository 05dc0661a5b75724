// The user-facing error for a dataset file that could not be written: says what went wrong,
// where, and how to fix it, in one line the command line and the app can show as it is.
import { dirname } from 'node:path';

import { PliantError } from '../../errors/pliant-error.ts';
import { systemErrorCode } from '../../errors/system-error-kind.ts';
import { COMMAND_LINE_WORDS, say, wordRun } from './run-words.ts';

export type DatasetWriteFailure =
  | 'disk-full'
  | 'not-writable'
  | 'missing-folder'
  | 'not-a-folder'
  | 'in-the-way'
  | 'too-large'
  | 'failed';

/**
 * Always of kind 'environment' (never a usage mistake): whatever the cause (a full disk, no
 * permission, a missing folder, a name in the way), the machine refused the write, and the
 * command line has always exited with 1 for it (tests pin that). `errorCode` is "write-" and the
 * failure, e.g. "write-disk-full".
 */
export class DatasetWriteError extends PliantError {
  override readonly name = 'DatasetWriteError';
  /** What kind of failure this is, for callers that react differently (e.g. stop a whole run on a full disk). */
  readonly failure: DatasetWriteFailure;
  /** The final path that was being written. */
  readonly path: string;
  /** The operating-system error code behind it (ENOSPC, EACCES, ...), if there was one. */
  readonly errno: string | undefined;
  /** The same as `errno`, under the name Node's system errors use, so code that checks `error.code` treats both alike. */
  readonly code: string | undefined;
  /** The message with the run's settings in neutral form (run-words.ts), for a shell to word itself. */
  readonly neutralMessage: string;

  constructor(failure: DatasetWriteFailure, path: string, message: string, errno?: string) {
    super('environment', `write-${failure}`, wordRun(message, COMMAND_LINE_WORDS));
    this.neutralMessage = message;
    this.failure = failure;
    this.path = path;
    this.errno = errno;
    this.code = errno;
  }
}

const PERMISSION_REASONS: Record<string, string> = {
  EACCES: 'permission denied',
  EPERM: 'the operation is not permitted',
  EROFS: 'the file system is read-only',
};

/** The errno code of a Node.js system error, or undefined for any other value. */
export function errnoCodeOf(error: unknown): string | undefined {
  return systemErrorCode(error);
}

/** Turns an operating-system error met while writing `finalPath` into a DatasetWriteError. */
export function datasetWriteErrorFromErrno(errno: string | undefined, finalPath: string, detail: string): DatasetWriteError {
  const folder = dirname(finalPath);
  switch (errno) {
    case 'ENOSPC':
    case 'EDQUOT':
      return new DatasetWriteError('disk-full', finalPath,
        `the disk is full while writing ${finalPath}; free space and ${say('again-resuming')}`, errno);
    case 'EACCES':
    case 'EPERM':
    case 'EROFS':
      return new DatasetWriteError('not-writable', finalPath,
        `cannot write to ${folder}: ${PERMISSION_REASONS[errno]}; make the folder writable or choose another output folder`, errno);
    case 'ENOENT':
      return new DatasetWriteError('missing-folder', finalPath,
        `cannot write ${finalPath}: the folder ${folder} does not exist; create it or choose another output folder`, errno);
    case 'ENOTDIR':
      return new DatasetWriteError('not-a-folder', finalPath,
        `cannot write ${finalPath}: part of the folder path ${folder} is a file, not a folder; choose another output folder`, errno);
    case 'EISDIR':
      return new DatasetWriteError('in-the-way', finalPath,
        `cannot write ${finalPath}: a folder of that name is in the way; move it aside or choose another output folder`, errno);
    default:
      return new DatasetWriteError('failed', finalPath,
        `could not write ${finalPath}: ${detail}${errno ? ` (${errno})` : ''}; check the disk and ${say('again-resuming')}`, errno);
  }
}

/** Wraps anything thrown while writing `finalPath`; DatasetWriteErrors pass through unchanged. */
export function toDatasetWriteError(error: unknown, finalPath: string): DatasetWriteError {
  if (error instanceof DatasetWriteError) return error;
  const detail = error instanceof Error ? error.message : String(error);
  return datasetWriteErrorFromErrno(errnoCodeOf(error), finalPath, detail);
}
