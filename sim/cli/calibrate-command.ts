// `pliant calibrate SCENARIO MEASUREMENT --out FITTED`: fits the scenario's free parameters to a
// bench measurement and writes a scenario that randomises around the fit, with calibration.json,
// REPORT.md and the residual plot beside it. Mistakes in the inputs exit 2 with a message.
import { mkdirSync } from 'node:fs';
import { readFile } from 'node:fs/promises';
import { basename, dirname, join, resolve } from 'node:path';

import { writeFileAtomic } from '../dataset/formats/atomic-file.ts';
import { calibrate } from '../identify/calibration/calibrate.ts';
import { calibrationJson, calibrationMarkdown, RESIDUAL_PLOT_FILE, residualPlot } from '../identify/calibration/calibration-report.ts';
import { DEFAULT_RANGE_STANDARD_ERRORS, fittedScenario } from '../identify/calibration/fitted-scenario.ts';
import { readMeasurement } from '../identify/calibration/read-measurement.ts';
import { SAFETY_CAUTION } from '../scenario/safety-caution.ts';
import { formatProblems } from '../scenario/scenario-problem.ts';
import type { CliCommand } from './command.ts';
import { CliUsageError } from './command.ts';
import { parseArguments } from './command-arguments.ts';
import { loadScenarioFile, reportingScenarioProblems } from './scenario-file.ts';
import { shownPath } from './shown-path.ts';

export const calibrateCommand: CliCommand = {
  name: 'calibrate',
  usage: [
    'Usage: pliant calibrate SCENARIO MEASUREMENT --out FITTED.json [options]',
    '',
    'Fits the free parameters of SCENARIO to MEASUREMENT (a measurement descriptor .json naming',
    'its table; see sim/identify/calibration/MEASUREMENT.md) by Levenberg–Marquardt, and writes',
    'FITTED.json: the scenario with each fitted parameter uniform over its value ± K standard',
    'errors, ready for `pliant generate`. Parameters the data cannot tell apart are reported as',
    'not identifiable and keep their spec.',
    '',
    'Options:',
    '  --out FITTED.json    the fitted scenario to write (required)',
    '  --fit P1,P2,...      fit these JSON pointers (e.g. /system/axialStiffnessN) instead of every',
    '                       distributed parameter the measurement does not know',
    `  --range-se K         half-width of each fitted range in standard errors (default ${DEFAULT_RANGE_STANDARD_ERRORS})`,
    '  --report DIR         folder for calibration.json, REPORT.md and the residual plot',
    '                       (default: FITTED-report/ next to FITTED.json)',
    '',
    'Exit status: 0 when fitted, 2 for a mistake in the inputs, 1 when the fitted scenario fails its checks.',
  ].join('\n'),
  async run(args, io) {
    const parsed = parseArguments('calibrate', args, { valued: ['--out', '--fit', '--range-se', '--report'], switches: [] });
    if (parsed.positionals.length !== 2) throw new CliUsageError('give a scenario and a measurement: pliant calibrate SCENARIO MEASUREMENT --out FITTED.json');
    const [scenarioPath, measurementPath] = parsed.positionals;
    const out = parsed.values.get('--out');
    if (out === undefined) throw new CliUsageError('--out FITTED.json is required: the fitted scenario to write');
    if (!out.endsWith('.json')) throw new CliUsageError(`--out ${out}: the fitted scenario is a scenario file; give a name ending in .json`);
    const k = rangeStandardErrors(parsed.values.get('--range-se'));
    const fitPointers = parsed.values.get('--fit')?.split(',').map((p) => p.trim());
    if (fitPointers?.some((p) => !p.startsWith('/'))) throw new CliUsageError(`--fit ${parsed.values.get('--fit')}: give JSON pointers separated by commas, each starting with "/", e.g. --fit /system/axialStiffnessN,/system/dampingRatio`);

    const load = await loadScenarioFile(scenarioPath, io.cwd);
    if (!load.ok) {
      io.stderr(`${load.report}\n`);
      return 2;
    }
    const loaded = load.loaded;
    const written: unknown = JSON.parse(await readFile(loaded.absolutePath, 'utf8'));
    return reportingScenarioProblems(io, loaded, async () => {
      const measurement = await readMeasurement(measurementPath, io.cwd);
      const result = calibrate(loaded.scenario, measurement, { fitPointers });
      const outPath = resolve(io.cwd, out);
      const reportDir = resolve(io.cwd, parsed.values.get('--report') ?? join(dirname(out), `${basename(out, '.json')}-report`));
      const fitted = fittedScenario(written, result, k, measurementPath);
      const inputs = { result, measurement, scenarioName: scenarioPath, fittedScenarioName: shownPath(io.cwd, outPath), rangeStandardErrors: k, ranges: fitted.ok ? fitted.ranges : [] };
      const encoder = new TextEncoder();
      mkdirSync(reportDir, { recursive: true });
      writeFileAtomic(join(reportDir, 'calibration.json'), encoder.encode(`${JSON.stringify(calibrationJson(inputs), null, 2)}\n`));
      writeFileAtomic(join(reportDir, 'REPORT.md'), encoder.encode(calibrationMarkdown(inputs)));
      writeFileAtomic(join(reportDir, RESIDUAL_PLOT_FILE), encoder.encode(residualPlot(inputs)));
      if (!fitted.ok) {
        io.stderr(`the fitted scenario fails its checks, so ${out} was not written (the report in ${shownPath(io.cwd, reportDir)} has the fit):\n${formatProblems(fitted.problems, out)}\n`);
        return 1;
      }
      mkdirSync(dirname(outPath), { recursive: true });
      writeFileAtomic(outPath, encoder.encode(`${JSON.stringify(fitted.value, null, 2)}\n`));
      const lines = [`calibrated ${scenarioPath} to ${measurementPath}: residual RMS ${result.startRmsM.toExponential(3)} m → ${result.rmsM.toExponential(3)} m, ${result.iterations} iterations, ${result.simulations} simulations`];
      for (const p of result.parameters) {
        lines.push(p.identifiable ? `  ${p.pointer} = ${p.value.toPrecision(6)} ± ${(p.standardError as number).toPrecision(3)} (1 SE)${p.atSearchEdge ? '  at the search edge' : ''}` : `  ${p.pointer}: not identifiable from this data (kept as written)`);
      }
      if (result.startMismatch) lines.push(`warning: ${result.startMismatch}`);
      lines.push(`wrote ${shownPath(io.cwd, outPath)} (fitted ranges ± ${k} SE) and ${shownPath(io.cwd, reportDir)}/{REPORT.md, calibration.json, ${RESIDUAL_PLOT_FILE}}`, `Caution: ${SAFETY_CAUTION}`, '');
      io.stdout(lines.join('\n'));
      return 0;
    });
  },
};

function rangeStandardErrors(text: string | undefined): number {
  if (text === undefined) return DEFAULT_RANGE_STANDARD_ERRORS;
  const value = /^\d+(\.\d+)?$/.test(text) ? Number(text) : NaN;
  if (!(value > 0) || value > 10) throw new CliUsageError(`--range-se "${text}" must be a number above 0 and at most 10 (standard errors either side of each fitted value), e.g. --range-se 2`);
  return value;
}
