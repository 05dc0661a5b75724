// What crosses a boundary of an error: its kind, stable code and message, as plain data that
// survives a worker thread's postMessage (which keeps neither an error's class nor its fields),
// and the error rebuilt from it on the other side. `reportOf` is the one classification of a
// thrown value: Pliant's own errors say their kind, an operating-system error is classified by
// its errno code (system-error-kind.ts), anything else is a bug.
import type { ErrorKind } from './pliant-error.ts';
import { PliantError } from './pliant-error.ts';
import { systemErrorCode, systemErrorKind } from './system-error-kind.ts';

export interface ErrorReport {
  kind: ErrorKind;
  errorCode: string;
  message: string;
}

/** The stable code of an error that is not Pliant's and not a known system error. */
export const UNEXPECTED_ERROR_CODE = 'unexpected';

export function reportOf(error: unknown): ErrorReport {
  if (error instanceof PliantError) return { kind: error.kind, errorCode: error.errorCode, message: error.message };
  const message = error instanceof Error ? error.message : String(error);
  const errno = systemErrorCode(error);
  const kind = errno === undefined ? undefined : systemErrorKind(errno);
  if (errno !== undefined && kind !== undefined) return { kind, errorCode: `system-${errno.toLowerCase()}`, message };
  return { kind: 'bug', errorCode: UNEXPECTED_ERROR_CODE, message };
}

/** An error rebuilt from its report on the other side of a thread; it keeps the kind and code. */
export class ReportedError extends PliantError {
  constructor(report: ErrorReport) {
    super(report.kind, report.errorCode, report.message);
    this.name = 'ReportedError';
  }
}
