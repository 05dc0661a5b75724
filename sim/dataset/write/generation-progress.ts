// What a dataset run reports while it works, so the command line (bar or JSON lines) and the
// desktop app can show the same progress without knowing how the run is organised.

export type GenerationEvent =
  | { type: 'start'; total: number; alreadyDone: number; workers: number; outDir: string }
  | { type: 'episode'; id: string; index: number; status: 'ok' | 'rejected'; done: number; total: number; rejected: number; reason?: string }
  | { type: 'assemble'; file: string }
  | { type: 'finish'; total: number; ok: number; rejected: number; outDir: string };

export type GenerationListener = (event: GenerationEvent) => void;
