// Ctrl-C during a long run: the first interrupt asks the run to stop at the next episode
// boundary (so no half-written file is left and --resume carries on); a second one ends the
// process at once, which is still safe because every file is written atomically.
import type { CliIo } from './command.ts';

export interface InterruptStop {
  requested: () => boolean;
  release: () => void;
}

export function stopOnInterrupt(io: CliIo): InterruptStop {
  let stopRequested = false;
  const onInterrupt = (): void => {
    if (stopRequested) process.exit(130);
    stopRequested = true;
    io.stderr('\nstopping after the episodes in progress (press Ctrl-C again to stop now)…\n');
  };
  process.on('SIGINT', onInterrupt);
  return {
    requested: () => stopRequested,
    release: () => {
      process.off('SIGINT', onInterrupt);
    },
  };
}
