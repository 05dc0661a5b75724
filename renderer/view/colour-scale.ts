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

/**
 * Categorical colours for `count` materials, in order of material index, display (sRGB) values.
 * Hues are spread evenly round the CIELAB hue circle and the lightness steps through three
 * levels, so neighbours in hue differ in lightness too and no two colours coincide however many
 * materials a body has (a fixed list of six repeated from the seventh). Our own construction;
 * the CIELAB → sRGB formulas are CIE 15:2004 and IEC 61966-2-1 (from memory).
 */
export function materialPalette(count: number): Float32Array {
  const n = Math.max(1, Math.floor(count));
  const cached = paletteCache.get(n);
  if (cached) return cached;
  const palette = new Float32Array(3 * n);
  for (let i = 0; i < n; i++) {
    const hueRad = ((PALETTE_START_HUE_DEG + (360 * i) / n) * Math.PI) / 180;
    const lightness = n <= 2 ? PALETTE_LIGHTNESS[0] : PALETTE_LIGHTNESS[i % PALETTE_LIGHTNESS.length];
    labToSrgb(lightness, PALETTE_CHROMA * Math.cos(hueRad), PALETTE_CHROMA * Math.sin(hueRad), palette, 3 * i);
  }
  paletteCache.set(n, palette);
  return palette;
}

const PALETTE_START_HUE_DEG = 200; // the first material is the app's teal family
const PALETTE_CHROMA = 42;
const PALETTE_LIGHTNESS = [56, 74, 40] as const;
const paletteCache = new Map<number, Float32Array>();

/** CIELAB (D65 white) to display sRGB in 0…1, clipped to the gamut, into out[offset..offset+2]. */
function labToSrgb(l: number, a: number, b: number, out: Float32Array, offset: number): void {
  const fy = (l + 16) / 116;
  const fx = fy + a / 500;
  const fz = fy - b / 200;
  const inverse = (f: number): number => (f > 6 / 29 ? f * f * f : 3 * (6 / 29) * (6 / 29) * (f - 4 / 29));
  const x = 0.95047 * inverse(fx);
  const y = inverse(fy);
  const z = 1.08883 * inverse(fz);
  const linear = [3.2406 * x - 1.5372 * y - 0.4986 * z, -0.9689 * x + 1.8758 * y + 0.0415 * z, 0.0557 * x - 0.204 * y + 1.057 * z];
  for (let k = 0; k < 3; k++) {
    const c = Math.min(1, Math.max(0, linear[k]));
    out[offset + k] = c <= 0.0031308 ? 12.92 * c : 1.055 * Math.pow(c, 1 / 2.4) - 0.055;
  }
}

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

/** Writes the colour of material index m (−1: none) from a materialPalette into out[offset..offset+2]. */
export function writeMaterialColour(material: number, palette: Float32Array, out: Float32Array, offset: number): void {
  if (material < 0) {
    out[offset] = PLAIN[0];
    out[offset + 1] = PLAIN[1];
    out[offset + 2] = PLAIN[2];
    return;
  }
  const a = 3 * (material % (palette.length / 3));
  out[offset] = palette[a];
  out[offset + 1] = palette[a + 1];
  out[offset + 2] = palette[a + 2];
}

/** CSS colour for a legend swatch of material m of `count`. */
export function materialCss(material: number, count: number): string {
  const rgb = new Float32Array(3);
  writeMaterialColour(material, materialPalette(count), rgb, 0);
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
