// Writes a score to its report folder: score.json (checked against SCORE_SCHEMA first), REPORT.md
// and the SVG charts under plots/, each file atomically. The bytes depend only on the score, so
// the same inputs give the same files.
import { mkdirSync, readdirSync, rmSync } from 'node:fs';
import { join } from 'node:path';

import { writeFileAtomic } from '../../dataset/formats/atomic-file.ts';
import { datasetWriteErrorFromErrno, errnoCodeOf } from '../../dataset/formats/dataset-write-error.ts';
import { scoreProblems } from './score-check.ts';
import type { ScoreDocument } from './score-document.ts';
import { scorePlots } from './score-plots.ts';
import { scoreReport } from './score-report.ts';

export const SCORE_FILE = 'score.json';
export const REPORT_FILE = 'REPORT.md';

/** The files a score writes, relative to the report folder, in writing order. */
export function scoreFiles(score: ScoreDocument): { path: string; text: string }[] {
  const problems = scoreProblems(JSON.parse(JSON.stringify(score)));
  // The document is built by this program; a schema failure is a bug, reported as one.
  if (problems.length > 0) throw new Error(`internal: the score does not satisfy its schema: ${problems.slice(0, 5).join('; ')}`);
  const plots = scorePlots(score);
  return [
    { path: SCORE_FILE, text: `${JSON.stringify(score, null, 1)}\n` },
    ...plots.map((p) => ({ path: p.path, text: p.svg })),
    { path: REPORT_FILE, text: scoreReport(score, plots) },
  ];
}

export function writeScore(outDir: string, score: ScoreDocument): string[] {
  const files = scoreFiles(score);
  try {
    mkdirSync(join(outDir, 'plots'), { recursive: true });
  } catch (error) {
    throw datasetWriteErrorFromErrno(errnoCodeOf(error), join(outDir, 'plots'), 'cannot create the report folder');
  }
  for (const file of files) writeFileAtomic(join(outDir, file.path), new TextEncoder().encode(file.text));
  // A chart of an earlier score (another parameter) would sit beside this report as if it were its own.
  const written = new Set(files.map((f) => f.path));
  for (const name of readdirSync(join(outDir, 'plots'))) {
    if (/^error-vs-.*\.svg$/.test(name) && !written.has(`plots/${name}`)) rmSync(join(outDir, 'plots', name), { force: true });
  }
  return files.map((f) => f.path);
}
