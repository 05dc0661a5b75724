// `pliant baseline fit|predict`: the reference models every score is compared with — the
// persistence and constant-velocity floors, a linear model with inputs (DMDc) and grey-box
// parameter identification — fitted on a dataset's train split and written as predictions
// folders that `pliant score` reads. See sim/identify/baselines/BASELINES.md.
import { mkdirSync } from 'node:fs';
import { basename, dirname, join, resolve } from 'node:path';

import { writeFileAtomic } from '../dataset/formats/atomic-file.ts';
import { baselineModelHead, fitBaseline } from '../identify/baselines/baseline-fit.ts';
import { BASELINE_MODEL_NAMES, type BaselineModel } from '../identify/baselines/baseline-model.ts';
import { readBaselineModel, writeBaselineModel } from '../identify/baselines/baseline-model-file.ts';
import { predictBaseline } from '../identify/baselines/baseline-predict.ts';
import { openDataset } from '../identify/baselines/dataset-episodes.ts';
import { greyBoxReport } from '../identify/baselines/grey-box-report.ts';
import { parseRankChoice } from '../identify/baselines/rank-rule.ts';
import { SAFETY_CAUTION } from '../scenario/safety-caution.ts';
import type { CliCommand, CliIo } from './command.ts';
import { CliUsageError } from './command.ts';
import { choiceOption, parseArguments, type ParsedArguments,wholeNumberOption } from './command-arguments.ts';
import { asCliFailure } from './dataset-failure.ts';
import { shownPath } from './shown-path.ts';

const USAGE = [
  'Usage: pliant baseline fit DATASET --model MODEL --out MODEL.json [options]',
  '       pliant baseline predict MODEL.json DATASET --out PRED_DIR [--split S,…] [--skip-unfitted]',
  '       pliant baseline predict --model persistence|constant-velocity DATASET --out PRED_DIR [--split S,…]',
  '',
  'Reference models to score learned models against (sim/identify/baselines/BASELINES.md).',
  '',
  'fit: fits MODEL on the episodes of --split (default train) and writes MODEL.json:',
  '  --model persistence | constant-velocity   nothing to fit (the floors)',
  '  --model linear      least-squares linear model with inputs (DMDc), one per node count',
  '      --delays K                 past states in the model, default 0',
  '      --rank stable|auto|R|energy:F  singular values kept: stable (default: the largest',
  '                                 rank whose rollout cannot grow without bound), auto (the',
  '                                 numerical rank), at most R, or the fewest holding the',
  '                                 fraction F of Σσ²',
  '      --state relative|absolute  positions from each episode\'s initial ones (default) or as is',
  '      --no-affine                leave out the constant column (gravity, rest lengths)',
  '  --model grey-box    per-episode stiffness, damping, gravity and drag by least squares on the',
  '                      recorded accelerations; also writes MODEL.md, the identification report',
  '',
  'predict: open-loop rollout from each episode\'s initial state and controls, one NPZ per ok',
  'episode of --split (default: every split but train), plus predictions.json.',
  '  --skip-unfitted     predict what the linear model can and list episodes of node counts it',
  '                      was not fitted on, instead of refusing',
  '',
  'Exit status: 0 done, 2 a mistake in the request or the inputs, 1 a failed read or write.',
].join('\n');

function splitList(text: string | undefined, fallback: string[]): string[] {
  if (text === undefined) return fallback;
  const splits = text.split(',').map((s) => s.trim()).filter((s) => s !== '');
  if (splits.length === 0) throw new CliUsageError('--split needs at least one split name, e.g. --split test,held-out');
  return [...new Set(splits)];
}

async function guarded<T>(body: () => Promise<T>): Promise<T> {
  try {
    return await body();
  } catch (error) {
    throw asCliFailure(error);
  }
}

function reportPath(modelPath: string): string {
  const name = basename(modelPath);
  return join(dirname(modelPath), `${name.endsWith('.json') ? name.slice(0, -5) : name}.md`);
}

async function runFit(parsed: ParsedArguments, io: CliIo): Promise<number> {
  if (parsed.positionals.length !== 1) throw new CliUsageError('give exactly one dataset folder: pliant baseline fit DATASET --model MODEL --out MODEL.json');
  const modelText = parsed.values.get('--model');
  if (modelText === undefined) throw new CliUsageError(`--model is required; one of ${BASELINE_MODEL_NAMES.join(', ')}`);
  const model = choiceOption('--model', modelText, BASELINE_MODEL_NAMES);
  const out = parsed.values.get('--out');
  if (out === undefined) throw new CliUsageError('--out MODEL.json is required: the model file to write');
  const linearOnly = ['--delays', '--rank', '--state'].filter((o) => parsed.values.has(o));
  if (parsed.switches.has('--no-affine')) linearOnly.push('--no-affine');
  if (model !== 'linear' && linearOnly.length > 0) throw new CliUsageError(`${linearOnly.join(', ')} only apply to --model linear`);
  const rankText = parsed.values.get('--rank') ?? 'stable';
  const rank = parseRankChoice(rankText);
  if (rank === null) throw new CliUsageError(`--rank "${rankText}" is not stable, auto, a whole number ≥ 1 or energy:F with 0 < F ≤ 1 (e.g. energy:0.9999)`);
  const delays = parsed.values.has('--delays') ? wholeNumberOption('--delays', parsed.values.get('--delays')!, 0, 50) : 0;
  const stateForm = choiceOption('--state', parsed.values.get('--state') ?? 'relative', ['relative', 'absolute'] as const);
  const splits = splitList(parsed.values.get('--split'), ['train']);
  const outPath = resolve(io.cwd, out);
  const dataset = await guarded(() => openDataset(resolve(io.cwd, parsed.positionals[0])));
  const fitted = await guarded(() => fitBaseline(dataset, { model, splits, linear: { delays, affine: !parsed.switches.has('--no-affine'), stateForm, rank } }));
  await guarded(async () => {
    mkdirSync(dirname(outPath), { recursive: true });
    writeBaselineModel(outPath, fitted);
  });
  io.stdout(`${shownPath(io.cwd, outPath)}: ${summary(fitted)}\n`);
  if (fitted.greyBox) {
    const report = reportPath(outPath);
    await guarded(async () => writeFileAtomic(report, new TextEncoder().encode(greyBoxReport(fitted))));
    io.stdout(`${shownPath(io.cwd, report)}: identification report\n`);
    for (const s of fitted.greyBox.summary) {
      const absolute = s.maxAbsoluteError === null ? '' : `largest absolute error ${s.maxAbsoluteError.toExponential(2)} ${s.unit}`;
      const line = s.maxAbsoluteError === null
        ? 'no true value to compare with'
        : s.medianRelativeError === null
          ? `true value 0; ${absolute}`
          : `relative error median ${s.medianRelativeError.toExponential(2)}, largest ${s.maxRelativeError!.toExponential(2)}; ${absolute}`;
      io.stdout(`  ${s.name.padEnd(23)} ${line}\n`);
    }
    for (const w of fitted.greyBox.warnings) io.stderr(`warning: ${w}\n`);
  }
  io.stdout(`${SAFETY_CAUTION}\n`);
  return 0;
}

function summary(model: BaselineModel): string {
  if (model.linear) {
    const groups = model.linear.groups.map((g) => `${g.nodeCount} nodes: ${g.episodes.length} episode${g.episodes.length === 1 ? '' : 's'}, rank ${g.rank} of ${g.operator.columns}, spectral radius ${g.spectralRadius.toFixed(6)}, one-step RMS ${g.oneStepRms.toExponential(2)}`);
    return `linear model fitted on ${model.fittedOn.episodes.length} episodes of ${model.fittedOn.splits.join(', ')}\n  ${groups.join('\n  ')}`;
  }
  if (model.greyBox) return `grey-box estimates for ${model.greyBox.episodes.length} episodes of ${model.fittedOn.splits.join(', ')}`;
  return `${model.model} floor (nothing to fit) for ${model.dataset.name}`;
}

async function runPredict(parsed: ParsedArguments, io: CliIo): Promise<number> {
  const modelText = parsed.values.get('--model');
  const expected = modelText === undefined ? 2 : 1;
  if (parsed.positionals.length !== expected) {
    throw new CliUsageError(modelText === undefined
      ? 'give a model file and a dataset folder: pliant baseline predict MODEL.json DATASET --out PRED_DIR'
      : 'with --model give only the dataset folder: pliant baseline predict --model persistence DATASET --out PRED_DIR');
  }
  const out = parsed.values.get('--out');
  if (out === undefined) throw new CliUsageError('--out PRED_DIR is required: the predictions folder to write');
  const datasetDir = resolve(io.cwd, parsed.positionals[expected - 1]);
  const dataset = await guarded(() => openDataset(datasetDir));
  let model: BaselineModel;
  if (modelText !== undefined) {
    const name = choiceOption('--model', modelText, BASELINE_MODEL_NAMES);
    if (name !== 'persistence' && name !== 'constant-velocity') throw new CliUsageError(`--model ${name} needs fitting first: pliant baseline fit DATASET --model ${name} --out MODEL.json, then predict with MODEL.json`);
    model = baselineModelHead(dataset, name, { splits: [], episodes: [] });
  } else {
    model = await guarded(() => readBaselineModel(resolve(io.cwd, parsed.positionals[0])));
    if (model.dataset.name !== dataset.manifest.name || model.dataset.masterSeed !== dataset.manifest.masterSeed) {
      io.stderr(`note: the model was fitted on ${model.dataset.name} (seed ${model.dataset.masterSeed}); predicting ${dataset.manifest.name} (seed ${dataset.manifest.masterSeed})\n`);
    }
  }
  const fallback = Object.keys(dataset.manifest.splits).filter((s) => s !== 'train');
  const splits = splitList(parsed.values.get('--split'), fallback);
  if (splits.length === 0) throw new CliUsageError(`${shownPath(io.cwd, datasetDir)} has no split but train; name the splits to predict with --split`);
  const outDir = resolve(io.cwd, out);
  const outcome = await guarded(() => predictBaseline(model, dataset, { splits, outDir, skipUnfitted: parsed.switches.has('--skip-unfitted') }));
  io.stdout(`${shownPath(io.cwd, outDir)}: ${model.model} predictions of ${outcome.written.length} episodes of ${splits.join(', ')}\n`);
  if (outcome.skipped.length > 0) io.stderr(`not predicted (the linear model has no operator of their node count): ${outcome.skipped.join(', ')}\n`);
  return 0;
}

export const baselineCommand: CliCommand = {
  name: 'baseline',
  usage: USAGE,
  async run(args, io) {
    const [action, ...rest] = args;
    if (action === 'fit') {
      return runFit(parseArguments('baseline', rest, { valued: ['--model', '--out', '--split', '--delays', '--rank', '--state'], switches: ['--no-affine'] }), io);
    }
    if (action === 'predict') {
      return runPredict(parseArguments('baseline', rest, { valued: ['--model', '--out', '--split'], switches: ['--skip-unfitted'] }), io);
    }
    throw new CliUsageError(action === undefined ? 'say what to do: pliant baseline fit … or pliant baseline predict …' : `unknown action "${action}"; use fit or predict (see \`pliant baseline --help\`)`);
  },
};
