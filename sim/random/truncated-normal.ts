// Exact sampling of a standard normal restricted to [lower, upper] by rejection, after Robert
// (1995), "Simulation of truncated normal variables", Statistics and Computing 5, 121-125.
// Rejection needs only exp, log and sqrt, so no approximate normal CDF can bend the tails; the
// proposal is chosen per interval so that at least about half of the attempts are accepted.
import type { RandomStream } from './random-stream.ts';

/**
 * Attempts before giving up. With an acceptance rate of at least 0.49 the chance of reaching
 * this is below 1e-2900, so it only guards against a non-finite bound slipping through.
 */
export const TRUNCATED_NORMAL_MAX_ATTEMPTS = 10_000;

const SQRT_TWO_PI = Math.sqrt(2 * Math.PI);
const TWO_SQRT_E = 2 * Math.sqrt(Math.E);

/** One draw of Z ~ N(0, 1) conditioned on lower <= Z <= upper (finite bounds, lower <= upper). */
export function sampleTruncatedStandardNormal(stream: RandomStream, lower: number, upper: number): number {
  if (!Number.isFinite(lower) || !Number.isFinite(upper) || lower > upper) {
    throw new RangeError(`truncated normal needs finite bounds with lower <= upper, got [${lower}, ${upper}]`);
  }
  if (lower === upper) return lower;
  if (lower >= 0) return sampleUpperTail(stream, lower, upper);
  if (upper <= 0) return -sampleUpperTail(stream, -upper, -lower);
  return sampleAroundZero(stream, lower, upper);
}

// lower < 0 < upper. A uniform proposal beats plain normal draws on intervals narrower than
// sqrt(2 pi) (the two acceptance rates cross there); both accept at least 0.49 of the time.
function sampleAroundZero(stream: RandomStream, lower: number, upper: number): number {
  const width = upper - lower;
  if (width < SQRT_TWO_PI) {
    for (let attempt = 0; attempt < TRUNCATED_NORMAL_MAX_ATTEMPTS; attempt++) {
      const z = lower + width * stream.nextFloat64();
      if (stream.nextFloat64() < Math.exp(-0.5 * z * z)) return z;
    }
  } else {
    for (let attempt = 0; attempt < TRUNCATED_NORMAL_MAX_ATTEMPTS; attempt++) {
      const z = stream.nextNormal();
      if (z >= lower && z <= upper) return z;
    }
  }
  return rejectionFailed(lower, upper);
}

// 0 <= lower < upper. Robert's translated exponential with the optimal rate, or a uniform
// proposal when the interval is shorter than the width at which the two are equally efficient.
function sampleUpperTail(stream: RandomStream, lower: number, upper: number): number {
  const root = Math.sqrt(lower * lower + 4);
  const width = upper - lower;
  const uniformWins = width < (TWO_SQRT_E / (lower + root)) * Math.exp((lower * lower - lower * root) / 4);
  if (uniformWins) {
    for (let attempt = 0; attempt < TRUNCATED_NORMAL_MAX_ATTEMPTS; attempt++) {
      const z = lower + width * stream.nextFloat64();
      // exp((lower^2 - z^2) / 2), factored so that large bounds do not cancel.
      if (stream.nextFloat64() < Math.exp(0.5 * (lower - z) * (lower + z))) return z;
    }
  } else {
    const rate = 0.5 * (lower + root);
    for (let attempt = 0; attempt < TRUNCATED_NORMAL_MAX_ATTEMPTS; attempt++) {
      const z = lower - Math.log(1 - stream.nextFloat64()) / rate;
      if (z <= upper && stream.nextFloat64() < Math.exp(-0.5 * (z - rate) * (z - rate))) return z;
    }
  }
  return rejectionFailed(lower, upper);
}

function rejectionFailed(lower: number, upper: number): never {
  throw new RangeError(
    `truncated normal on [${lower}, ${upper}] (in standard deviations) accepted no draw in ` +
      `${TRUNCATED_NORMAL_MAX_ATTEMPTS} attempts; check that the bounds are ordinary finite numbers`,
  );
}
