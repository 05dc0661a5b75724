// What a long job (an export, a reproduction, a score, a render) tells the shell that runs it,
// one shape for every kind, so the worker protocol and every job share it. 'done' may carry a
// message for the person; without one the shell says what 'done' means for the job's kind.
export type JobMessage =
  | { type: 'progress'; done: number; total: number }
  | { type: 'done'; done: number; total: number; message?: string }
  | { type: 'cancelled'; done: number; total: number }
  | { type: 'failed'; message: string };
