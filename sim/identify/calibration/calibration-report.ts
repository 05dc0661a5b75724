// What a calibration tells its reader: calibration.json (every number, machine-readable),
// REPORT.md (the same for people, with the caution that simulated data is no hardware test)
// and residual-over-time.svg (RMS marker error per frame at the start and at the fit).
import { unitOfLabel } from '../../dataset/manifest/label-units.ts';
import { renderLineChart } from '../../plots/svg-line-chart.ts';
import { PLIANT_VERSION } from '../../scenario/pliant-version.ts';
import { SAFETY_CAUTION } from '../../scenario/safety-caution.ts';
import type { CalibrationResult } from './calibrate.ts';
import { COVARIANCE_JACOBIAN_STEP_THETA } from './calibrate.ts';
import type { FittedRange } from './fitted-scenario.ts';
import { LOG_SEARCH_WIDENING } from './free-parameters.ts';
import { DEFAULT_FIT_SETTINGS } from './levenberg-marquardt-fit.ts';
import type { Measurement } from './measurement.ts';
import { NULL_DIRECTION_SHARE, RELATIVE_SINGULAR_VALUE_FLOOR, RELATIVE_STANDARD_ERROR_CEILING } from './parameter-uncertainty.ts';

export const RESIDUAL_PLOT_FILE = 'residual-over-time.svg';

export interface ReportInputs {
  result: CalibrationResult;
  measurement: Measurement;
  scenarioName: string;
  fittedScenarioName: string;
  rangeStandardErrors: number;
  ranges: FittedRange[];
}

export function calibrationJson(inputs: ReportInputs): Record<string, unknown> {
  const { result, measurement } = inputs;
  const u = result.uncertainty;
  return {
    calibrationFormat: 1,
    pliantVersion: PLIANT_VERSION,
    scenario: inputs.scenarioName,
    measurement: measurement.source,
    measurementDescription: measurement.description,
    fittedScenario: inputs.fittedScenarioName,
    rangeStandardErrors: inputs.rangeStandardErrors,
    parameters: result.parameters.map((p) => ({
      pointer: p.pointer,
      unit: unitOfLabel(p.pointer),
      scaling: p.scaling,
      nominal: p.nominal,
      start: p.start,
      value: p.identifiable ? p.value : null,
      standardError: p.standardError,
      relativeStandardError: p.standardError === null ? null : p.standardError / Math.abs(p.value),
      identifiable: p.identifiable,
      notIdentifiableBecause: p.reason,
      fittedRange: inputs.ranges.find((r) => r.pointer === p.pointer) ?? null,
      searchBox: [p.searchMin, p.searchMax],
      atSearchEdge: p.atSearchEdge,
    })),
    knownParameters: measurement.knownParameters,
    correlation: u ? { pointers: result.fittedPointers, matrix: u.correlation } : null,
    jacobianSingularValues: u ? u.singularValues : null,
    residual: {
      count: result.residualCount,
      degreesOfFreedom: u?.degreesOfFreedom ?? null,
      startRmsM: result.startRmsM,
      firstFrameRmsM: result.fittedFrameRmsM[0],
      startMismatch: result.startMismatch,
      fittedRmsM: result.rmsM,
      sigmaM: u?.sigmaM ?? null,
    },
    // The per-frame RMS marker error the residual plot draws, so other tools (the app) can draw it too.
    residualOverTime: { timeS: Array.from(result.frameTimesS), startRmsM: Array.from(result.startFrameRmsM), fittedRmsM: Array.from(result.fittedFrameRmsM) },
    fit: {
      method: 'Levenberg-Marquardt (ml-levenberg-marquardt), forward-difference Jacobian in scaled parameters',
      iterations: result.iterations,
      stages: result.fitRounds,
      simulations: result.simulations,
      blownUpCandidates: result.blowUps,
      substeps: result.substeps,
      recordIntervalS: result.recordIntervalS,
      frames: measurement.frameCount,
      markers: measurement.markers.length,
      settings: DEFAULT_FIT_SETTINGS,
      covarianceJacobianStepTheta: COVARIANCE_JACOBIAN_STEP_THETA,
      thresholds: {
        relativeSingularValueFloor: RELATIVE_SINGULAR_VALUE_FLOOR,
        nullDirectionShare: NULL_DIRECTION_SHARE,
        relativeStandardErrorCeiling: RELATIVE_STANDARD_ERROR_CEILING,
      },
    },
    safetyCaution: SAFETY_CAUTION,
  };
}

function number(x: number): string {
  if (x === 0) return '0';
  const magnitude = Math.abs(x);
  return magnitude >= 1e-3 && magnitude < 1e6 ? String(Number(x.toPrecision(5))) : x.toExponential(3);
}

export function calibrationMarkdown(inputs: ReportInputs): string {
  const { result, measurement } = inputs;
  const u = result.uncertainty;
  const k = inputs.rangeStandardErrors;
  const lines: string[] = [];
  lines.push(`# Calibration of ${inputs.scenarioName} to ${measurement.source}`, '');
  lines.push(`> **Safety.** ${SAFETY_CAUTION}`, '');
  lines.push(`Measurement: ${measurement.description}`, '');
  lines.push(
    `${measurement.frameCount} frames at ${measurement.sampleRateHz} Hz, ${measurement.markers.length} markers (${measurement.markers.map((m) => `${m.name} on node ${m.node}`).join(', ')}), ` +
      `${result.residualCount} residuals. Simulated from the scenario's laid-out shape at rest with the recorded drive, ${result.substeps} sub-steps per frame.`,
    '',
  );
  if (result.startMismatch) lines.push(`**Warning:** ${result.startMismatch}.`, '');
  lines.push('## Fitted parameters', '');
  lines.push(`| parameter | unit | start | fitted | standard error | relative | written to ${inputs.fittedScenarioName} |`, '| --- | --- | --- | --- | --- | --- | --- |');
  for (const p of result.parameters) {
    const unit = unitOfLabel(p.pointer);
    if (!p.identifiable) {
      lines.push(`| \`${p.pointer}\` | ${unit} | ${number(p.start)} | **not identifiable from this data** | — | — | kept as written |`);
      continue;
    }
    const se = p.standardError as number;
    const range = inputs.ranges.find((r) => r.pointer === p.pointer);
    lines.push(`| \`${p.pointer}\` | ${unit} | ${number(p.start)} | ${number(p.value)}${p.atSearchEdge ? ' (at the search edge)' : ''} | ${number(se)} | ${(100 * se / Math.abs(p.value)).toPrecision(2)} % | ${range ? `uniform ${number(range.min)} to ${number(range.max)}` : '—'} |`);
  }
  lines.push('');
  const untold = result.parameters.filter((p) => !p.identifiable);
  if (untold.length > 0) {
    lines.push('### Not identifiable from this data', '');
    for (const p of untold) lines.push(`- \`${p.pointer}\`: ${p.reason}. It was held at its nominal value ${number(p.nominal)} while the others were fitted again, and the fitted scenario keeps its original spec.`);
    lines.push('');
  }
  const edge = result.parameters.filter((p) => p.atSearchEdge);
  if (edge.length > 0) {
    lines.push(`**Warning:** ${edge.map((p) => `\`${p.pointer}\``).join(', ')} ended on the edge of the search box (the scenario's range widened ×${LOG_SEARCH_WIDENING}); the true value may lie beyond it, and its standard error does not describe that. Check the scenario's range and the measurement.`, '');
  }
  if (Object.keys(measurement.knownParameters).length > 0) {
    lines.push('Known from the bench (used as given, not fitted): ' + Object.entries(measurement.knownParameters).map(([p, v]) => `\`${p}\` = ${v}`).join(', ') + '.', '');
  }
  lines.push('## Fit', '');
  lines.push(`- Residual RMS: ${number(result.startRmsM)} m at the start, ${number(result.rmsM)} m at the fit${u ? `; σ̂ = √(SSR/(n − p)) = ${number(u.sigmaM)} m with n − p = ${u.degreesOfFreedom}` : ''}.`);
  lines.push(`- Levenberg–Marquardt (ml-levenberg-marquardt): ${result.iterations} iterations in ${result.fitRounds} fit${result.fitRounds === 1 ? '' : 's'}, ${result.simulations} simulations${result.blowUps ? `, ${result.blowUps} candidates blew up and counted as failed steps` : ''}.`);
  lines.push(`- Parameters with a one-signed range are fitted as ln(value / nominal), the others as (value − nominal) / half-range. Standard errors: σ̂²(JᵀJ)⁻¹ with J by central differences (step ${COVARIANCE_JACOBIAN_STEP_THETA} in the scaled parameter) at the optimum (Seber & Wild, *Nonlinear Regression*, 1989), carried to each value by the delta method. They describe the noise of this measurement under the model; they do not cover a model that is wrong.`);
  lines.push(`- A parameter is reported not identifiable when the Jacobian's singular value along a direction it takes part in (share ≥ ${NULL_DIRECTION_SHARE}) is below ${RELATIVE_SINGULAR_VALUE_FLOOR} of the largest, or when its standard error exceeds ${100 * RELATIVE_STANDARD_ERROR_CEILING} % of its value (of its half-range, for a parameter whose range spans zero).`);
  if (u) lines.push(`- Singular values of J relative to the largest: ${u.relativeSingularValues.map((s) => s.toExponential(2)).join(', ')}.`);
  lines.push('');
  if (u && result.fittedPointers.length > 1) {
    lines.push('### Correlation of the fitted parameters', '');
    lines.push(`| | ${result.fittedPointers.map((p) => `\`${p}\``).join(' | ')} |`, `| --- |${result.fittedPointers.map(() => ' --- |').join('')}`);
    result.fittedPointers.forEach((p, i) => lines.push(`| \`${p}\` | ${u.correlation[i].map((c) => c.toFixed(3)).join(' | ')} |`));
    lines.push('');
  }
  lines.push('## Residual over time', '', `![RMS marker error per frame](${RESIDUAL_PLOT_FILE})`, '');
  lines.push('## Next', '', `\`${inputs.fittedScenarioName}\` randomises each fitted parameter uniformly over its value ± ${k} standard errors; generate a sweep around the fit with`, '', '```', `pliant generate ${inputs.fittedScenarioName} --out DIR`, '```', '');
  return `${lines.join('\n')}\n`;
}

export function residualPlot(inputs: ReportInputs): string {
  const { result } = inputs;
  return renderLineChart({
    title: `Residual over time: ${inputs.scenarioName} vs ${inputs.measurement.source}`,
    xLabel: 'time (s)',
    yLabel: 'RMS marker error (m)',
    yScale: 'log',
    series: [
      { name: 'start values', x: result.frameTimesS, y: result.startFrameRmsM, style: 'line' },
      { name: 'fitted values', x: result.frameTimesS, y: result.fittedFrameRmsM, style: 'line' },
    ],
    guides: result.uncertainty ? [{ y: result.uncertainty.sigmaM, label: `σ̂ = ${number(result.uncertainty.sigmaM)} m` }] : [],
  });
}
