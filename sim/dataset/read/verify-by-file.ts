// `pliant verify`'s check of a dataset folder with each problem put beside the file it is about,
// for the app's screens, which mark files one by one. The checking itself is verifyDataset's,
// unchanged: the app and the command line can never disagree about whether a folder is good.
import type { VerifyFinding } from './verify-dataset.ts';
import { verifyDataset } from './verify-dataset.ts';

export type FileProblem = VerifyFinding;

export interface VerifyByFileReport {
  ok: boolean;
  /** Files the manifest lists (documents and data files), all of which were checked. */
  checkedFiles: number;
  problems: FileProblem[];
}

export async function verifyDatasetByFile(dir: string): Promise<VerifyByFileReport> {
  const report = await verifyDataset(dir);
  return { ok: report.ok, checkedFiles: report.checkedFileCount, problems: report.findings };
}
