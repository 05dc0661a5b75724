// A dataset run's errors name its settings (the output folder, resuming, starting over, worker
// threads) in a neutral form, so that each shell words them for itself: the command line says
// `--resume`, the app names the tick box on its Export screen, which has no flags at all. A
// message carries ⟦phrase⟧ marks; DatasetRequestError, DatasetReadError, DatasetWriteError and
// RejectionLimitError keep that neutral text as `neutralMessage` and set `message` to the
// command line's wording, the pipeline's first user, so no mark ever reaches a person.

/** The phrases a run's messages use. Each is a whole phrase, not a flag, so both wordings read as sentences. */
export type RunPhrase =
  /** Before a folder path: the folder the run writes. */
  | 'out'
  /** Starts a message about a folder that cannot be resumed. */
  | 'resume:'
  /** Starts a message about a folder that cannot be replaced. */
  | 'force:'
  /** The way to carry on after an interruption: same run, resuming. */
  | 'run-again-resuming'
  /** The same, said shorter (after a failed write). */
  | 'again-resuming'
  /** Replacing what is in the folder with a fresh run. */
  | 'start-over'
  /** Picking another folder to write. */
  | 'other-out'
  /** What to do about a folder that is not empty. */
  | 'resume-or-replace'
  /** Before a number of worker threads. */
  | 'workers'
  /** Asking for the same shard as the folder holds. */
  | 'same-shard'
  /** How to finish a folder whose run stopped before it was done. */
  | 'finish-unfinished'
  /** Where to see every problem of a dataset folder. */
  | 'verify-folder'
  /** How to write a dataset folder again from its seed file. */
  | 'reproduce-seed';

export type RunWords = Readonly<Record<RunPhrase, string>>;

/** How the command line (sim/cli) says each phrase. */
export const COMMAND_LINE_WORDS: RunWords = {
  out: '--out',
  'resume:': '--resume:',
  'force:': '--force:',
  'run-again-resuming': 'run the same command again with --resume',
  'again-resuming': 'run again with --resume',
  'start-over': 'use --force to start over',
  'other-out': 'choose another --out folder',
  'resume-or-replace': 'give --resume to finish the run that started there, --force to replace it, or an empty folder',
  workers: '--workers',
  'same-shard': 'give the same --shard',
  'finish-unfinished': 'resume it with `pliant generate … --resume`',
  'verify-folder': 'run `pliant verify` on the folder',
  'reproduce-seed': 'regenerate the folder with `pliant reproduce seed.json`',
};

/** The mark for `phrase` inside a message. */
export function say(phrase: RunPhrase): string {
  return `\u27e6${phrase}\u27e7`;
}

const MARK = /\u27e6([a-z:-]+)\u27e7/g;

/** `text` with every mark replaced by its words; an unknown mark is left as it is, so a mistake shows. */
export function wordRun(text: string, words: RunWords): string {
  return text.replace(MARK, (mark, phrase: string) => (Object.hasOwn(words, phrase) ? words[phrase as RunPhrase] : mark));
}

/** The neutral text of one of the run's errors, or null for anything else. */
export function neutralMessageOf(error: unknown): string | null {
  if (!(error instanceof Error)) return null;
  const neutral = (error as { neutralMessage?: unknown }).neutralMessage;
  return typeof neutral === 'string' ? neutral : null;
}
