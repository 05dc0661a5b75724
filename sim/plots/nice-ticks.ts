// Axis ticks at "nice" round values (1, 2 or 5 times a power of ten) for the report charts, so
// axes read like a hand-drawn plot and the same data always gives the same SVG text.
// The 1-2-5 rule is common practice, no source.

export interface AxisTicks {
  min: number;
  max: number;
  values: number[];
}

const NICE_STEPS = [1, 2, 5, 10];

/** Ticks covering [low, high] with about `target` intervals; a flat range is widened. */
export function niceTicks(low: number, high: number, target = 5): AxisTicks {
  let lo = low;
  let hi = high;
  if (!Number.isFinite(lo) || !Number.isFinite(hi)) {
    lo = 0;
    hi = 1;
  }
  if (hi < lo) [lo, hi] = [hi, lo];
  if (hi === lo) {
    const pad = lo === 0 ? 1 : Math.abs(lo) * 0.1;
    lo -= pad;
    hi += pad;
  }
  const rough = (hi - lo) / Math.max(1, target);
  const power = 10 ** Math.floor(Math.log10(rough));
  const step = power * NICE_STEPS.find((s) => s * power >= rough)!;
  const first = Math.floor(lo / step) * step;
  const last = Math.ceil(hi / step) * step;
  const values: number[] = [];
  const count = Math.round((last - first) / step);
  // Ticks are computed from their index, not by repeated addition, so they carry no drift.
  for (let i = 0; i <= count; i++) values.push(roundToStep(first + i * step, step));
  return { min: values[0], max: values[values.length - 1], values };
}

/** Decades covering [low, high] (both > 0) for a logarithmic axis. */
export function decadeTicks(low: number, high: number): AxisTicks {
  const lo = Math.floor(Math.log10(low > 0 && Number.isFinite(low) ? low : 1e-12));
  let hi = Math.ceil(Math.log10(high > 0 && Number.isFinite(high) ? high : 1));
  if (hi <= lo) hi = lo + 1;
  const values: number[] = [];
  for (let e = lo; e <= hi; e++) values.push(10 ** e);
  return { min: values[0], max: values[values.length - 1], values };
}

function roundToStep(value: number, step: number): number {
  const digits = Math.max(0, -Math.floor(Math.log10(step)) + 1);
  return Number(value.toFixed(Math.min(digits, 15)));
}

/** Short, locale-free tick label. */
export function tickLabel(value: number): string {
  if (value === 0) return '0';
  const magnitude = Math.abs(value);
  if (magnitude >= 1e4 || magnitude < 1e-3) return value.toExponential(0).replace('e+', 'e');
  return String(Number(value.toPrecision(6)));
}
