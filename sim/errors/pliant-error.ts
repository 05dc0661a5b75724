// The one base of Pliant's own errors. Every error Pliant throws on purpose says which of three
// kinds it is, because that is what each boundary (exit code, HTTP status, app reply) needs:
//   - 'user': what was asked cannot be done as asked (a flag, a scenario, a path, a file the
//     person chose); they fix it by asking differently;
//   - 'environment': the machine or the files on it got in the way (a full disk, no permission,
//     a read-only disk, a file that is there but damaged); they fix the machine or the files;
//   - 'bug': Pliant itself is wrong; it keeps its stack trace so it can be reported.
// `errorCode` is a stable, lower-case name of the particular failure ("dataset-read",
// "write-disk-full"), kept across versions so scripts and the app can tell failures apart
// without reading the message. Environment-free: every room of sim/ may import this folder.

export type ErrorKind = 'user' | 'environment' | 'bug';

export const ERROR_KINDS: readonly ErrorKind[] = ['user', 'environment', 'bug'];

export class PliantError extends Error {
  readonly kind: ErrorKind;
  readonly errorCode: string;

  constructor(kind: ErrorKind, errorCode: string, message: string) {
    super(message);
    this.kind = kind;
    this.errorCode = errorCode;
  }
}
