// A small histogram of draws from one distributed parameter, drawn on a canvas with its range
// and unit written under it, so a sweep's spread can be judged before anything is simulated.
import { h } from '../ui/element.ts';

const BAR_COLOUR = '#2f7f8c';
const AXIS_COLOUR = '#6d675b';
const MAX_BINS = 24;

export interface HistogramSummary {
  count: number;
  mean: number;
  min: number;
  max: number;
}

/** Bins `samples` over [lo, hi]; whole-number draws get one bin per value when few enough. */
export function histogramCounts(samples: Float64Array, lo: number, hi: number, integer: boolean): { counts: Uint32Array; lo: number; width: number } {
  let bins = MAX_BINS;
  let start = lo;
  let width = (hi - lo) / bins;
  if (integer && hi - lo + 1 <= MAX_BINS * 2) {
    bins = hi - lo + 1;
    start = lo - 0.5;
    width = 1;
  }
  if (!(width > 0)) {
    bins = 1;
    width = 1;
  }
  const counts = new Uint32Array(bins);
  for (let i = 0; i < samples.length; i++) {
    let b = Math.floor((samples[i] - start) / width);
    if (b < 0) b = 0;
    if (b >= bins) b = bins - 1;
    counts[b]++;
  }
  return { counts, lo: start, width };
}

export function summarise(samples: Float64Array): HistogramSummary {
  let sum = 0;
  let min = Infinity;
  let max = -Infinity;
  for (let i = 0; i < samples.length; i++) {
    sum += samples[i];
    if (samples[i] < min) min = samples[i];
    if (samples[i] > max) max = samples[i];
  }
  return { count: samples.length, mean: sum / samples.length, min, max };
}

export function renderHistogram(samples: Float64Array, lo: number, hi: number, integer: boolean, unit: string | null, caption: string): HTMLElement {
  const canvas = h('canvas', { className: 'histogram-canvas', attrs: { width: '220', height: '48', role: 'img' } });
  const { counts } = histogramCounts(samples, lo, hi, integer);
  let peak = 0;
  for (const c of counts) peak = Math.max(peak, c);
  const ctx = canvas.getContext('2d');
  if (ctx) {
    const barWidth = canvas.width / counts.length;
    ctx.fillStyle = BAR_COLOUR;
    counts.forEach((c, i) => {
      const barHeight = peak > 0 ? ((canvas.height - 2) * c) / peak : 0;
      ctx.fillRect(i * barWidth + 0.5, canvas.height - barHeight, Math.max(1, barWidth - 1), barHeight);
    });
    ctx.fillStyle = AXIS_COLOUR;
    ctx.fillRect(0, canvas.height - 1, canvas.width, 1);
  }
  const s = summarise(samples);
  const u = unit && unit !== '1' ? ` ${unit}` : '';
  canvas.setAttribute('aria-label', `${caption}: ${s.count} draws from ${formatValue(s.min)} to ${formatValue(s.max)}${u}, mean ${formatValue(s.mean)}${u}`);
  return h(
    'figure',
    { className: 'histogram', attrs: { 'data-role': 'histogram', 'data-draws': String(s.count) } },
    canvas,
    h('figcaption', {}, h('span', { text: `${formatValue(lo)}${u}` }), h('span', { className: 'histogram-mean', text: `mean ${formatValue(s.mean)}${u} · ${s.count} draws` }), h('span', { text: `${formatValue(hi)}${u}` })),
  );
}

/** Four significant digits, no trailing noise ("0.1", "2.5e+9"). */
export function formatValue(value: number): string {
  if (!Number.isFinite(value)) return String(value);
  if (value !== 0 && (Math.abs(value) >= 1e5 || Math.abs(value) < 1e-3)) return value.toExponential(3).replace(/\.?0+e/, 'e');
  return String(Number(value.toPrecision(4)));
}
