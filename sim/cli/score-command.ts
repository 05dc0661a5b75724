// `pliant score DATASET PREDICTIONS --out REPORT_DIR`: scores a model's open-loop predictions
// (one <episode id>.npz per episode) against the recorded trajectories of a dataset and writes
// score.json, REPORT.md and SVG charts. Exit 0 when scored, 2 for a mistake in the request or
// the predictions folder, 1 when a dataset file cannot be read or a report file written.
import { resolve } from 'node:path';

import { DEFAULT_HORIZONS, parseHorizons } from '../identify/score/horizons.ts';
import { REPORT_FILE, SCORE_FILE, writeScore } from '../identify/score/score-outputs.ts';
import { DEFAULT_VPT_THRESHOLD, scorePredictions } from '../identify/score/score-predictions.ts';
import type { CliCommand } from './command.ts';
import { CliUsageError } from './command.ts';
import { parseArguments } from './command-arguments.ts';
import { asCliFailure } from './dataset-failure.ts';
import { shownPath } from './shown-path.ts';

function threshold(text: string): number {
  const value = Number(text);
  if (!/^([0-9]+(\.[0-9]*)?|\.[0-9]+)(e-?[0-9]+)?$/i.test(text) || !(value > 0) || !Number.isFinite(value)) {
    throw new CliUsageError(`--vpt-threshold "${text}" is not a positive number; write for example --vpt-threshold ${DEFAULT_VPT_THRESHOLD}`);
  }
  return value;
}

export const scoreCommand: CliCommand = {
  name: 'score',
  usage: [
    'Usage: pliant score DATASET PREDICTIONS --out REPORT_DIR [options]',
    '',
    'PREDICTIONS is a folder with one <episode id>.npz per episode (e.g. ep-000042.npz) holding',
    '`positions` (T+1, N, 3) in m and optionally `velocities` (T+1, N, 3) in m/s, predicted from the',
    'episode\'s recorded initial state and controls (see "Predictions folders" in sim/dataset/LAYOUT.md).',
    '',
    'Options:',
    '  --out DIR              report folder: score.json, REPORT.md, plots/*.svg (required)',
    '  --split A,B            splits to score (default: test and every held-out split)',
    `  --horizons LIST        horizons in steps (10) or seconds (0.5s) (default: ${DEFAULT_HORIZONS} where they fit, and the whole rollout)`,
    `  --vpt-threshold X      normalised error that ends the valid prediction time (default ${DEFAULT_VPT_THRESHOLD})`,
    '  --allow-missing        score the episodes that have a prediction file; list the others in the report',
    '',
    'Exit status: 0 scored, 2 a mistake in the request or the predictions, 1 a file that cannot be read or written.',
  ].join('\n'),
  async run(args, io) {
    const parsed = parseArguments('score', args, { valued: ['--out', '--split', '--horizons', '--vpt-threshold'], switches: ['--allow-missing'] });
    if (parsed.positionals.length !== 2) throw new CliUsageError('give a dataset folder and a predictions folder: pliant score DATASET PREDICTIONS --out REPORT_DIR');
    const out = parsed.values.get('--out');
    if (out === undefined) throw new CliUsageError('say where the report goes: --out REPORT_DIR');
    const [datasetArg, predictionsArg] = parsed.positionals;
    const datasetDir = resolve(io.cwd, datasetArg);
    const outDir = resolve(io.cwd, out);
    if (outDir === datasetDir) throw new CliUsageError('--out is the dataset folder; write the report to a folder of its own so the dataset stays as its manifest lists it');
    const splitText = parsed.values.get('--split');
    const splits = splitText === undefined ? null : splitText.split(',').map((s) => s.trim());
    if (splits && splits.some((s) => s === '')) throw new CliUsageError(`--split "${splitText}" has an empty name; write for example --split test,held-out`);
    try {
      const horizonText = parsed.values.get('--horizons');
      const score = await scorePredictions({
        datasetDir,
        predictionsDir: resolve(io.cwd, predictionsArg),
        splits,
        horizons: horizonText === undefined ? null : parseHorizons(horizonText),
        vptThreshold: parsed.values.has('--vpt-threshold') ? threshold(parsed.values.get('--vpt-threshold')!) : DEFAULT_VPT_THRESHOLD,
        allowMissing: parsed.switches.has('--allow-missing'),
      });
      writeScore(outDir, score);
      const shown = shownPath(io.cwd, outDir);
      const o = score.overall;
      io.stdout(`scored ${o.episodes} episodes of ${score.settings.splits.join(', ')}: one-step RMSE ${o.oneStepRmseM!.mean.toPrecision(3)} m, `
        + `valid prediction time ${o.validPredictionTimeS!.mean.toPrecision(3)} s (mean); see ${shown}/${REPORT_FILE} and ${shown}/${SCORE_FILE}\n`);
      const missing = score.predictions.missing.length;
      if (missing > 0) io.stdout(`${missing} episode${missing === 1 ? '' : 's'} had no prediction file and ${missing === 1 ? 'was' : 'were'} left out; ${REPORT_FILE} lists them\n`);
      return 0;
    } catch (error) {
      throw asCliFailure(error);
    }
  },
};
