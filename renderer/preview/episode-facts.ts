// The facts panel of a previewed episode: its size, split, time base and stability margin, then
// every value the sampler drew for it as a table of parameter, value and unit, lists of values
// summarised by their count and range so the panel stays a screen high.
import { h } from '../ui/element.ts';
import { dimensionlessDash, groupParameters } from '../ui/parameter-label.ts';
import type { PreviewEpisodeSummary } from './preview-worker-protocol.ts';

export function renderEpisodeFacts(host: HTMLElement, e: PreviewEpisodeSummary): void {
  const rows: [string, string][] = [
    ['episode', String(e.index)],
    ['split', e.split],
    ['system', `${e.kind}: ${e.nodeCount} nodes, ${e.springCount} springs${e.cellCount ? `, ${e.cellCount} cells` : ''}`],
    ['recorded', `${e.recordedSteps} steps every ${e.recordIntervalS} s (${(e.recordedSteps * e.recordIntervalS).toFixed(3)} s)`],
    ['integration', `${e.substeps} sub-steps of ${e.dtS.toExponential(3)} s; stability limit ${e.criticalDtS.toExponential(3)} s (${((100 * e.dtS) / e.criticalDtS).toFixed(0)} % of it)`],
    ['controls', e.channels.length === 0 ? 'none' : channelSummary(e.channels)],
  ];
  host.replaceChildren(
    h('dl', { className: 'facts' }, ...rows.flatMap(([k, v]) => [h('dt', { text: k }), h('dd', { text: v })])),
    parameterTable(e.labels, 'episode-parameters'),
  );
}

/**
 * Parameter · value · unit, one row per drawn quantity (indexed ones grouped, see
 * groupParameters); `varying` pointers come first, and `limit` shows the first rows only.
 */
export function parameterTable(labels: Record<string, string>, role: string, limit = Infinity, varying: ReadonlySet<string> = new Set()): HTMLTableElement {
  const groups = groupParameters(labels);
  const varies = (g: (typeof groups)[number]): boolean => g.pointers.some((p) => varying.has(p));
  const ordered = [...groups.filter(varies), ...groups.filter((g) => !varies(g))];
  const shown = ordered.slice(0, limit);
  const rows = shown.map((g) =>
    h('tr', { attrs: { 'data-pointer': g.label.pointer } }, h('th', { attrs: { scope: 'row' }, title: g.label.pointer, text: g.label.name }), h('td', { className: 'num', text: g.value }), h('td', { className: 'unit', text: g.label.unit })),
  );
  const table = h(
    'table',
    { className: 'parameter-table', attrs: { 'data-role': role } },
    h('thead', {}, h('tr', {}, h('th', { attrs: { scope: 'col' }, text: 'parameter' }), h('th', { attrs: { scope: 'col' }, text: 'value' }), h('th', { attrs: { scope: 'col' }, text: 'unit' }))),
    h('tbody', {}, ...rows),
  );
  if (ordered.length > shown.length) table.append(h('tfoot', {}, h('tr', {}, h('td', { attrs: { colspan: '3' }, text: `and ${ordered.length - shown.length} more under This episode` }))));
  return table;
}

/** "16 channels: actuator, 1 … " would run long; name the kinds and units once. */
function channelSummary(channels: PreviewEpisodeSummary['channels']): string {
  const units = [...new Set(channels.map((c) => dimensionlessDash(c.unit)))].map((u) => (u === '–' ? 'dimensionless' : u));
  if (channels.length <= 3) return channels.map((c) => `${c.name} (${dimensionlessDash(c.unit) === '–' ? 'dimensionless' : c.unit})`).join(', ');
  return `${channels.length} channels (${channels[0].name} … ${channels[channels.length - 1].name}), ${units.join(' or ')}`;
}
