// Colour scales of the 3-D view: a diverging scale for signed quantities (strain, actuator
// level: contraction cold, extension warm, zero a pale neutral) and a categorical palette for
// materials. Colours are written into caller-owned Float32Arrays so per-frame recolouring
// never allocates. The stops are our own choice, picked to stay apart for common forms of
// colour blindness (blue–orange rather than red–green; common practice, no source).

/** Diverging stops from −1 to +1, display (sRGB) values in 0…1, evenly spaced. */
const DIVERGING_STOPS = new Float32Array([
  0.09, 0.25, 0.55, // deep blue: strongest contraction
  0.32, 0.55, 0.80,
  0.88, 0.88, 0.84, // neutral
  0.93, 0.60, 0.30,
  0.70, 0.25, 0.05, // burnt orange: strongest extension
]);

/**
 * Sequential stops from 0 to the limit for magnitudes that are never negative (prediction
 * error): pale where the model is right, dark plum where it is furthest off. Our own stops,
 * monotone in lightness so the order reads without hue (common practice, no source).
 */
const SEQUENTIAL_STOPS = new Float32Array([
  0.93, 0.93, 0.86, // pale: no error
  0.96, 0.76, 0.42,
  0.88, 0.47, 0.24,
  0.67, 0.20, 0.27,
  0.33, 0.06, 0.30, // plum: at the limit or beyond
]);

/** Categorical colours for materials, in order of material index. */
const MATERIAL_PALETTE = new Float32Array([
  0.20, 0.52, 0.60, // teal
  0.85, 0.55, 0.20, // amber
  0.45, 0.35, 0.65, // violet
  0.55, 0.65, 0.25, // moss
  0.75, 0.30, 0.40, // rose
  0.35, 0.40, 0.45, // slate
]);
export const MATERIAL_PALETTE_SIZE = MATERIAL_PALETTE.length / 3;

/** Colour of nodes and springs that belong to no material (chains, unowned nodes). */
const PLAIN = [0.78, 0.80, 0.76] as const;

/**
 * Writes the diverging colour of value/limit (clamped to ±1) into out[offset..offset+2].
 * A non-positive limit shows everything as neutral.
 */
export function writeDivergingColour(value: number, limit: number, out: Float32Array, offset: number): void {
  let t = limit > 0 ? value / limit : 0;
  if (!(t >= -1)) t = -1; // also catches NaN
  if (t > 1) t = 1;
  writeBetweenStops(DIVERGING_STOPS, (t + 1) * 0.5, out, offset);
}

/** Writes the colour at fraction u (0…1) along evenly spaced stops into out[offset..offset+2]. */
function writeBetweenStops(stops: Float32Array, u: number, out: Float32Array, offset: number): void {
  const segments = stops.length / 3 - 1;
  const scaled = u * segments;
  let segment = Math.floor(scaled);
  if (segment >= segments) segment = segments - 1;
  const f = scaled - segment;
  const a = 3 * segment;
  out[offset] = stops[a] + f * (stops[a + 3] - stops[a]);
  out[offset + 1] = stops[a + 1] + f * (stops[a + 4] - stops[a + 1]);
  out[offset + 2] = stops[a + 2] + f * (stops[a + 5] - stops[a + 2]);
}

/** Writes the sequential colour of value/limit (clamped to 0…1) into out[offset..offset+2]. */
export function writeSequentialColour(value: number, limit: number, out: Float32Array, offset: number): void {
  let t = limit > 0 ? value / limit : 0;
  if (!(t >= 0)) t = 0; // also catches NaN
  if (t > 1) t = 1;
  writeBetweenStops(SEQUENTIAL_STOPS, t, out, offset);
}

/** Writes the colour of material index m (−1: none) into out[offset..offset+2]. */
export function writeMaterialColour(material: number, out: Float32Array, offset: number): void {
  if (material < 0) {
    out[offset] = PLAIN[0];
    out[offset + 1] = PLAIN[1];
    out[offset + 2] = PLAIN[2];
    return;
  }
  const a = 3 * (material % MATERIAL_PALETTE_SIZE);
  out[offset] = MATERIAL_PALETTE[a];
  out[offset + 1] = MATERIAL_PALETTE[a + 1];
  out[offset + 2] = MATERIAL_PALETTE[a + 2];
}

/** CSS colour for a legend swatch of material m. */
export function materialCss(material: number): string {
  const rgb = new Float32Array(3);
  writeMaterialColour(material, rgb, 0);
  return rgbCss(rgb);
}

/** CSS linear-gradient stops of the diverging scale, left (−1) to right (+1). */
export function divergingGradientCss(): string {
  return gradientCss(DIVERGING_STOPS);
}

/** CSS linear-gradient stops of the sequential scale, left (0) to right (the limit). */
export function sequentialGradientCss(): string {
  return gradientCss(SEQUENTIAL_STOPS);
}

function gradientCss(stops: Float32Array): string {
  const segments = stops.length / 3 - 1;
  const parts: string[] = [];
  for (let s = 0; s <= segments; s++) parts.push(`${rgbCss(stops.subarray(3 * s, 3 * s + 3))} ${((100 * s) / segments).toFixed(0)}%`);
  return `linear-gradient(to right, ${parts.join(', ')})`;
}

function rgbCss(rgb: ArrayLike<number>): string {
  const byte = (v: number) => Math.round(Math.min(1, Math.max(0, v)) * 255);
  return `rgb(${byte(rgb[0])}, ${byte(rgb[1])}, ${byte(rgb[2])})`;
}
