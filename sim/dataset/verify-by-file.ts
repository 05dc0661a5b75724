// `pliant verify`'s check of a dataset folder with each problem put beside the file it is about,
// for the app's screens, which mark files one by one. The checking itself is verifyDataset's,
// unchanged: the app and the command line can never disagree about whether a folder is good.
import { verifyDataset } from './verify-dataset.ts';
import { MANIFEST_FILE, SEED_FILE, WORK_FOLDER } from './dataset-files.ts';
import { readFolderState } from './dataset-folder-state.ts';

export interface FileProblem {
  /** Path relative to the dataset folder; "" when the problem is about the folder as a whole. */
  file: string;
  message: string;
}

export interface VerifyByFileReport {
  ok: boolean;
  /** Files the manifest lists (documents and data files), all of which were checked. */
  checkedFiles: number;
  problems: FileProblem[];
}

export async function verifyDatasetByFile(dir: string): Promise<VerifyByFileReport> {
  const report = await verifyDataset(dir);
  const manifest = (await readFolderState(dir)).manifest;
  const listed = manifest ? [...manifest.documents.map((d) => d.path), ...manifest.files.map((f) => f.path)] : [];
  const names = [...listed, MANIFEST_FILE, SEED_FILE, WORK_FOLDER].sort((a, b) => b.length - a.length);
  return {
    ok: report.ok,
    checkedFiles: listed.length,
    problems: report.problems.map((message) => ({ file: fileNamedIn(message, names), message })),
  };
}

/**
 * The first file name in `message`, taking the longest name first so "episodes/ep-000001.npz"
 * is not mistaken for a shorter name inside it; a name counts only as a whole word, between
 * the start, a space or a colon and the end, a space, a colon or a comma.
 */
function fileNamedIn(message: string, namesLongestFirst: readonly string[]): string {
  let best = '';
  let bestAt = Infinity;
  for (const name of namesLongestFirst) {
    let from = 0;
    for (;;) {
      const at = message.indexOf(name, from);
      if (at < 0) break;
      const before = at === 0 ? ' ' : message[at - 1];
      const after = message[at + name.length] ?? ' ';
      if (/[\s:]/.test(before) && /[\s:,]/.test(after)) {
        if (at < bestAt) {
          best = name;
          bestAt = at;
        }
        break;
      }
      from = at + 1;
    }
  }
  return best;
}
