// The identification report of `pliant baseline fit --model grey-box`, in Markdown: what was
// fitted, how, the estimates beside the true values with their errors, what to distrust, and
// the safety caution every Pliant report carries.
import type { BaselineModel } from './baseline-model.ts';

function number(value: number | null, digits = 6): string {
  if (value === null) return '—';
  return Math.abs(value) >= 1e-3 && Math.abs(value) < 1e6 ? String(Number(value.toPrecision(digits))) : value.toExponential(digits - 1);
}

function percent(value: number | null): string {
  if (value === null) return '—';
  return value < 1e-4 ? `${value.toExponential(1)}` : `${(100 * value).toPrecision(3)} %`;
}

export function greyBoxReport(model: BaselineModel): string {
  const part = model.greyBox!;
  const lines: string[] = [];
  lines.push(`# Grey-box identification: ${model.dataset.name}`, '');
  lines.push(`Dataset \`${model.dataset.name}\` (master seed ${model.dataset.masterSeed}, ${model.dataset.exportDtype} export), split${model.fittedOn.splits.length > 1 ? 's' : ''} ${model.fittedOn.splits.join(', ')}: ${part.episodes.length} episode${part.episodes.length === 1 ? '' : 's'} identified one by one. Written by Pliant ${model.pliantVersion}.`, '');
  lines.push('> **Safety.** ' + model.safetyCaution, '');
  lines.push('## Method', '');
  lines.push('For every free node (not pinned, driven, a force handle, on an actuated spring or near the ground) and every record interval, Newton\'s law of the semi-implicit Euler step, m·(v(t+Δt) − v(t))/Δt = F, is one linear equation per axis in the unknown coefficients: per spring relation a stiffness k and a damping c (the damping of a spring of that relation with the relation\'s median reduced mass; dampings of its other springs scale with √μ), the apparent gravity g (weight net of buoyancy, per unit mass), the air-drag rate and, for chains in a fluid, the resistive-force coefficients times the chain width. They are solved by linear least squares (singular value decomposition of the column-scaled design); standard errors are those of ordinary least squares. See `sim/identify/baselines/BASELINES.md`.', '');
  if (part.warnings.length > 0) {
    lines.push('## Warnings', '');
    for (const w of part.warnings) lines.push(`- ${w}`);
    lines.push('');
  }
  lines.push('## Summary', '', '| parameter | unit | episodes | median relative error | largest relative error | largest absolute error |', '| --- | --- | --- | --- | --- | --- |');
  for (const s of part.summary) lines.push(`| ${s.name} | ${s.unit} | ${s.episodes} | ${percent(s.medianRelativeError)} | ${percent(s.maxRelativeError)} | ${number(s.maxAbsoluteError, 2)} |`);
  lines.push('', 'Relative errors are |estimate − truth| / |truth|; a true value of zero has none, only an absolute error.', '');
  lines.push('## Episodes', '');
  for (const e of part.episodes) {
    lines.push(`### ${e.episode} (${e.split})`, '');
    lines.push(`${e.rows} equations from ${e.freeNodes} free nodes (${e.excludedNodes} left out${e.contactExclusions ? `, ${e.contactExclusions} node-intervals near the ground` : ''}); condition number ${number(e.condition, 3)}; residual RMS ${number(e.residualRmsN, 3)} N.`, '');
    lines.push('| parameter | unit | estimate | standard error | truth | relative error |', '| --- | --- | --- | --- | --- | --- |');
    for (const p of e.parameters) {
      const truth = p.truthRange ? `${number(p.truth)} (springs range ${number(p.truthRange[0])} to ${number(p.truthRange[1])})` : number(p.truth);
      lines.push(`| ${p.name} | ${p.unit} | ${number(p.estimate)} | ${number(p.standardError, 2)} | ${truth} | ${p.relativeError === null ? (p.absoluteError === null ? '—' : `abs ${number(p.absoluteError, 2)}`) : percent(p.relativeError)} |`);
    }
    lines.push('');
  }
  return `${lines.join('\n')}\n`;
}
