// How the app words the dataset run's settings in messages (sim/dataset/formats/run-words.ts): the app has
// no command-line flags, so a message names what the person sees on the Export screen instead
// — the "Resume a cancelled export in this folder" tick box and the dataset folder name.
import type { RunWords } from '../sim/dataset/formats/run-words.ts';
import { neutralMessageOf, wordRun } from '../sim/dataset/formats/run-words.ts';

/** The Export screen's tick box (renderer/export/export-screen.ts), quoted as it reads there. */
const RESUME_BOX = '"Resume a cancelled export in this folder"';

export const APP_RUN_WORDS: RunWords = {
  out: 'the dataset folder',
  'resume:': 'cannot resume:',
  'force:': 'cannot replace the folder:',
  'run-again-resuming': `start the export again with ${RESUME_BOX} ticked`,
  'again-resuming': `start the export again with ${RESUME_BOX} ticked`,
  'start-over': 'export under a new dataset folder name to start over',
  'other-out': 'choose another dataset folder name',
  'resume-or-replace': `tick ${RESUME_BOX} to finish the export that started there, or choose another dataset folder name`,
  workers: 'worker threads',
  'finish-unfinished': `finish it on the Export screen with ${RESUME_BOX} ticked`,
  'verify-folder': 'press "Verify checksums" on the Datasets screen',
  'reproduce-seed': 'regenerate the folder from its seed file on the Seed file screen',
  'same-shard': 'finish it with `pliant generate … --resume` and the --shard it was started with, which the app does not split',
};

/** A pipeline message (neutral, or already plain) in the app's words. */
export function inAppWords(text: string): string {
  return wordRun(text, APP_RUN_WORDS);
}

/** The app's wording of one of the run's errors: its neutral text worded for the app, else its message. */
export function appMessageOf(error: Error): string {
  return inAppWords(neutralMessageOf(error) ?? error.message);
}
