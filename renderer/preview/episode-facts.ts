// The facts panel of a previewed episode: its size, split, time base and stability margin, and
// every value the sampler drew for it, each with its unit.
import { h } from '../ui/element.ts';
import type { PreviewEpisodeSummary } from './preview-worker-protocol.ts';
import { unitFromKey } from '../sweep/unit-from-key.ts';
import { pointerSegments } from '../../sim/scenario/json-source-map.ts';

export function renderEpisodeFacts(host: HTMLElement, e: PreviewEpisodeSummary): void {
  const rows: [string, string][] = [
    ['episode', String(e.index)],
    ['split', e.split],
    ['system', `${e.kind}: ${e.nodeCount} nodes, ${e.springCount} springs${e.cellCount ? `, ${e.cellCount} cells` : ''}`],
    ['recorded', `${e.recordedSteps} steps every ${e.recordIntervalS} s (${(e.recordedSteps * e.recordIntervalS).toFixed(3)} s)`],
    ['integration', `${e.substeps} sub-steps of ${e.dtS.toExponential(3)} s; stability limit ${e.criticalDtS.toExponential(3)} s (${((100 * e.dtS) / e.criticalDtS).toFixed(0)} % of it)`],
    ['controls', e.channels.length === 0 ? 'none' : e.channels.map((c) => `${c.name} (${c.unit === '1' ? 'dimensionless' : c.unit})`).join(', ')],
  ];
  for (const [pointer, value] of Object.entries(e.labels)) rows.push([pointer, withUnit(pointer, value)]);
  host.replaceChildren(...rows.flatMap(([k, v]) => [h('dt', { text: k }), h('dd', { text: v })]));
}

/** A drawn value with the unit its key names ("/system/lengthM" → "12.5 m"). */
function withUnit(pointer: string, value: string): string {
  const tokens = pointerSegments(pointer).filter((t) => !/^[0-9]+$/.test(t));
  const unit = tokens.length > 0 ? unitFromKey(tokens[tokens.length - 1]) : null;
  return unit ? `${value} ${unit}` : value;
}
