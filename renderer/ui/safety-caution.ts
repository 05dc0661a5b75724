// The caution every place that hands out simulated data shows: a simulated dataset is no
// substitute for testing on hardware. The words come from the shell (app.info), so the screens,
// the dataset cards and the README say the same thing.
import { h } from './element.ts';

export function safetyCaution(notice: string): HTMLElement {
  return h('aside', { className: 'safety-caution', attrs: { role: 'note', 'data-role': 'safety-caution' } }, h('strong', { text: 'Safety' }), h('p', { text: notice }));
}
