// A dataset command that cannot be carried out as asked — a flag, the state of a folder, a seed
// file, a replay file — found before anything is written. The message says what, where and how
// to fix it; the command line prints only that and exits with 2. (Failed reads and writes on the
// way are DatasetReadError and DatasetWriteError.)

export class DatasetRequestError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'DatasetRequestError';
  }
}
