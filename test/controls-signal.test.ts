// Control signals of the Korrin Bay tank channels (tether pull in N, fin actuators
// dimensionless). Each check names its reference: Gillespie (1996, Phys. Rev. E 54, 2084) for
// the Ornstein–Uhlenbeck statistics, NumPy for sinusoids, clipping and spectra, SciPy for the
// distribution of drawn levels and switching times, and the definitions of a linear chirp and
// of a zero-order hold (common practice, no source).
import { describe, expect, it } from 'vitest';

import { generateControlSignal } from '../sim/controls/control-signal.ts';
import type { ControlSpec } from '../sim/controls/control-spec.ts';
import { RandomStream, StreamPurpose } from '../sim/random/random-stream.ts';
import { SpecError } from '../sim/random/spec-problem.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

function channelStream(episode: number, channel: number, seed: number | string = 4242): RandomStream {
  return new RandomStream(seed, episode, StreamPurpose.controls, channel);
}

function signal(spec: ControlSpec, recordIntervalS: number, stepCount: number, episode = 0, seed: number | string = 4242): Float64Array {
  const out = new Float64Array(stepCount);
  generateControlSignal(spec, channelStream(episode, 0, seed), recordIntervalS, stepCount, out, 0, 1);
  return out;
}

const python = referencePythonAvailability();

describe.runIf(python.available)('Ornstein–Uhlenbeck channel (Gillespie 1996, exact update)', () => {
  it('has the stationary mean and variance and lag-1 autocorrelation exp(-dt / tau), computed by NumPy', () => {
    const meanValue = 1.5; // N, steady tether pull
    const std = 0.8; // N
    const timeConstantS = 0.05;
    const dtS = 0.01;
    const n = 200_000;
    const x = signal({ kind: 'ornstein-uhlenbeck', meanValue, std, timeConstantS }, dtS, n);
    const stats = runReferencePython<{ mean: number; variance: number; lag1: number; lag5: number }>(
      `
import json, sys
import numpy as np
x = np.array(json.load(sys.stdin))
d = x - x.mean()
print(json.dumps({"mean": float(x.mean()), "variance": float(x.var()),
  "lag1": float(np.dot(d[:-1], d[1:]) / np.dot(d, d)), "lag5": float(np.dot(d[:-5], d[5:]) / np.dot(d, d))}))
`,
      Array.from(x),
    );
    const rho = Math.exp(-dtS / timeConstantS);
    // Standard errors for an AR(1) series of n samples (Box & Jenkins): the mean's
    // sqrt(s^2 (1 + rho) / ((1 - rho) n)), the variance's s^2 sqrt(2 (1 + rho^2) / ((1 - rho^2) n)),
    // the lag-1 coefficient's sqrt((1 - rho^2) / n); tolerances are 5 of them.
    expect(Math.abs(stats.mean - meanValue)).toBeLessThan(5 * Math.sqrt((std * std * (1 + rho)) / ((1 - rho) * n)));
    expect(Math.abs(stats.variance - std * std)).toBeLessThan(5 * std * std * Math.sqrt((2 * (1 + rho * rho)) / ((1 - rho * rho) * n)));
    expect(Math.abs(stats.lag1 - rho)).toBeLessThan(5 * Math.sqrt((1 - rho * rho) / n));
    expect(Math.abs(stats.lag5 - rho ** 5)).toBeLessThan(0.02);
  });

  it('starts in the stationary distribution: first values of 5,000 episodes pass KS against scipy.stats.norm', () => {
    const spec: ControlSpec = { kind: 'ornstein-uhlenbeck', meanValue: -0.2, std: 0.3, timeConstantS: 2 };
    const first = Array.from({ length: 5000 }, (_, episode) => signal(spec, 0.01, 1, episode)[0]);
    const p = runReferencePython<number>(
      `
import json, sys
from scipy import stats
print(json.dumps(float(stats.kstest(json.load(sys.stdin), stats.norm(loc=-0.2, scale=0.3).cdf).pvalue)))
`,
      first,
    );
    expect(p).toBeGreaterThan(1e-3);
  });
});

describe('chirp channel (definition of a linear chirp, common practice, no source)', () => {
  it('zero crossings give the instantaneous frequency f0 + (f1 - f0) t / T', () => {
    const dtS = 1e-3;
    const stepCount = 10_000;
    const durationS = stepCount * dtS;
    const f0 = 1;
    const f1 = 10;
    const x = signal({ kind: 'chirp', amplitude: 0.6, startFrequencyHz: f0, endFrequencyHz: f1, phaseRad: 0.3 }, dtS, stepCount);
    const crossingsS: number[] = [];
    for (let t = 1; t < stepCount; t++) {
      if ((x[t - 1] < 0) !== (x[t] < 0)) crossingsS.push((t - 1 + x[t - 1] / (x[t - 1] - x[t])) * dtS);
    }
    // The phase advances by pi between crossings; for a quadratic phase that is exact at the midpoint.
    expect(crossingsS.length).toBeGreaterThan(100);
    for (let i = 1; i < crossingsS.length; i++) {
      const midS = 0.5 * (crossingsS[i] + crossingsS[i - 1]);
      const measuredHz = 1 / (2 * (crossingsS[i] - crossingsS[i - 1]));
      const expectedHz = f0 + ((f1 - f0) * midS) / durationS;
      expect(Math.abs(measuredHz - expectedHz) / expectedHz).toBeLessThan(2e-3);
    }
  });
});

describe.runIf(python.available)('sinusoid, band-limited and clipped channels against NumPy', () => {
  it('sinusoid equals offset + A * numpy.sin(2 pi f t + phase) on t = numpy.arange(n) * dt', () => {
    const spec: ControlSpec = { kind: 'sinusoid', amplitude: 0.8, frequencyHz: 1.7, phaseRad: -0.4, offset: 0.1 };
    const x = signal(spec, 0.004, 5000);
    const reference = runReferencePython<number[]>(
      `
import json, sys
import numpy as np
t = np.arange(5000) * 0.004
print(json.dumps((0.1 + 0.8 * np.sin(2 * np.pi * 1.7 * t + -0.4)).tolist()))
`,
      null,
    );
    for (let i = 0; i < x.length; i++) expect(Math.abs(x[i] - reference[i])).toBeLessThan(1e-12);
  });

  it('band-limited noise has the asked std (numpy.std) and no power above the cutoff (numpy.fft.rfft)', () => {
    // 16 components up to 2 Hz repeat every 8 s; over two whole periods the components are
    // orthogonal, so the sample variance is the sum of A^2 / 2 exactly (Parseval).
    const dtS = 0.01;
    const stepCount = 1600;
    const x = signal({ kind: 'band-limited', cutoffHz: 2, std: 0.35, componentCount: 16 }, dtS, stepCount);
    const result = runReferencePython<{ std: number; mean: number; aboveFraction: number }>(
      `
import json, sys
import numpy as np
x = np.array(json.load(sys.stdin))
power = np.abs(np.fft.rfft(x)) ** 2
f = np.fft.rfftfreq(x.size, d=0.01)
print(json.dumps({"std": float(np.std(x)), "mean": float(np.mean(x)),
  "aboveFraction": float(power[f > 2 + 1e-9].sum() / power.sum())}))
`,
      Array.from(x),
    );
    expect(result.std).toBeCloseTo(0.35, 10);
    expect(Math.abs(result.mean)).toBeLessThan(1e-12);
    expect(result.aboveFraction).toBeLessThan(1e-20);
  });

  it('clip equals numpy.clip of the unclipped signal drawn from the same stream', () => {
    const unclipped: ControlSpec = { kind: 'ornstein-uhlenbeck', meanValue: 0, std: 0.7, timeConstantS: 0.2 };
    const clipped: ControlSpec = { ...unclipped, clip: { min: -1, max: 0.5 } };
    const raw = signal(unclipped, 0.01, 3000);
    const x = signal(clipped, 0.01, 3000);
    const reference = runReferencePython<number[]>(
      `
import json, sys
import numpy as np
print(json.dumps(np.clip(np.array(json.load(sys.stdin)), -1, 0.5).tolist()))
`,
      Array.from(raw),
    );
    expect(Array.from(x)).toEqual(reference);
    expect(x.some((v) => v === 0.5) && x.some((v) => v === -1)).toBe(true);
  });
});

describe.runIf(python.available)('held levels against SciPy (Kolmogorov–Smirnov, p > 1e-3)', () => {
  it('piecewise-constant levels are uniform on [min, max) and steps switch at uniform times', () => {
    const levelsSignal = signal({ kind: 'piecewise-constant', holdS: 0.01, min: -1, max: 1 }, 0.01, 20_000);
    const out = new Float64Array(200_000);
    const labels = generateControlSignal({ kind: 'steps', stepCount: 20_000, min: 0, max: 4 }, channelStream(0, 1), 0.001, 200_000, out, 0, 1);
    const p = runReferencePython<number[]>(
      `
import json, sys
from scipy import stats
d = json.load(sys.stdin)
print(json.dumps([float(stats.kstest(d["levels"], stats.uniform(loc=-1, scale=2).cdf).pvalue),
  float(stats.kstest(d["switches"], stats.uniform(loc=0, scale=200).cdf).pvalue),
  float(stats.kstest(d["stepLevels"], stats.uniform(loc=0, scale=4).cdf).pvalue)]))
`,
      { levels: Array.from(levelsSignal), switches: labels.switchTimesS, stepLevels: labels.levels },
    );
    expect(p[0]).toBeGreaterThan(1e-3);
    expect(p[1]).toBeGreaterThan(1e-3);
    expect(p[2]).toBeGreaterThan(1e-3);
  });
});

describe('zero-order hold at the record rate (definition, common practice, no source)', () => {
  it('step-list holds each value from its time on, also when times do not divide exactly in binary', () => {
    const x = signal({ kind: 'step-list', timesS: [0, 0.3, 0.7], values: [0, 2, -1] }, 0.1, 10);
    expect(Array.from(x)).toEqual([0, 0, 0, 2, 2, 2, 2, -1, -1, -1]);
  });

  it('piecewise-constant switches exactly at multiples of holdS and labels its level count', () => {
    const out = new Float64Array(10);
    const labels = generateControlSignal({ kind: 'piecewise-constant', holdS: 0.3, min: 0, max: 1 }, channelStream(0, 0), 0.1, 10, out, 0, 1);
    const changes = [];
    for (let t = 1; t < 10; t++) if (out[t] !== out[t - 1]) changes.push(t);
    expect(changes).toEqual([3, 6, 9]);
    expect(labels.levelCount).toBe(4);
  });

  it('steps switch stepCount times, at the labelled times, to the labelled levels', () => {
    const out = new Float64Array(1000);
    const labels = generateControlSignal({ kind: 'steps', stepCount: 5, min: -0.5, max: 0.5 }, channelStream(2, 0), 0.01, 1000, out, 0, 1);
    const times = labels.switchTimesS as number[];
    const levels = labels.levels as number[];
    expect(times).toHaveLength(5);
    expect(levels).toHaveLength(6);
    expect([...times].sort((a, b) => a - b)).toEqual(times);
    expect(out[0]).toBe(levels[0]);
    expect(out[999]).toBe(levels[5]);
    for (let i = 0; i < 5; i++) expect(out[Math.ceil(times[i] / 0.01 - 1e-9)]).toBe(levels[i + 1]);
  });

  it('replay copies the loaded column and refuses a column shorter than the episode', () => {
    const column = Float64Array.from({ length: 8 }, (_, i) => 0.1 * i);
    const out = new Float64Array(8);
    const spec: ControlSpec = { kind: 'replay', file: 'korrin-bay/fin-sweep.npy', column: 2, clip: { max: 0.5 } };
    const labels = generateControlSignal(spec, channelStream(0, 0), 0.02, 8, out, 0, 1, { replay: column });
    expect(Array.from(out)).toEqual([0, 0.1, 0.2, 0.30000000000000004, 0.4, 0.5, 0.5, 0.5]);
    expect(labels).toEqual({ kind: 'replay', file: 'korrin-bay/fin-sweep.npy', column: 2, clip: { max: 0.5 } });
    expect(() => generateControlSignal(spec, channelStream(0, 0), 0.02, 9, new Float64Array(9), 0, 1, { replay: column, pointer: '/controls/fin' })).toThrow(
      /\/controls\/fin\/column: column 2 of korrin-bay\/fin-sweep\.npy has 8 rows, the episode needs 9/,
    );
  });
});

describe('labels, layout and determinism (definition, common practice, no source)', () => {
  it('returns the drawn parameters as JSON labels and writes only its own channel', () => {
    const out = new Float64Array(3 * 100).fill(Number.NaN);
    const spec: ControlSpec = {
      kind: 'sinusoid',
      amplitude: { kind: 'uniform', min: 0.2, max: 0.9 },
      frequencyHz: { kind: 'log-uniform', min: 0.2, max: 5 },
      clip: { min: -0.5, max: 0.5 },
    };
    const labels = generateControlSignal(spec, channelStream(3, 1), 0.01, 100, out, 1, 3);
    expect(Object.keys(labels)).toEqual(['kind', 'amplitude', 'frequencyHz', 'phaseRad', 'offset', 'clip']);
    expect(labels.amplitude as number).toBeGreaterThanOrEqual(0.2);
    expect(labels.amplitude as number).toBeLessThan(0.9);
    expect(labels.clip).toEqual({ min: -0.5, max: 0.5 });
    expect(JSON.parse(JSON.stringify(labels))).toEqual(labels);
    for (let t = 0; t < 100; t++) {
      expect(Number.isNaN(out[t * 3])).toBe(true);
      expect(Number.isNaN(out[t * 3 + 2])).toBe(true);
      const value = out[t * 3 + 1];
      const a = labels.amplitude as number;
      const f = labels.frequencyHz as number;
      expect(value).toBe(Math.min(0.5, Math.max(-0.5, a * Math.sin(2 * Math.PI * f * (t * 0.01)))));
    }
  });

  it('the same seed gives identical arrays; another episode, channel or seed gives another signal', () => {
    const specs: ControlSpec[] = [
      { kind: 'ornstein-uhlenbeck', meanValue: 0, std: 1, timeConstantS: 0.1 },
      { kind: 'band-limited', cutoffHz: 3, std: 0.4, componentCount: { kind: 'integer', min: 4, max: 12 } },
      { kind: 'piecewise-constant', holdS: 0.25, min: -1, max: 1 },
      { kind: 'steps', stepCount: 4, min: -1, max: 1 },
      { kind: 'sinusoid', amplitude: 1, frequencyHz: { kind: 'uniform', min: 0.5, max: 2 }, phaseRad: { kind: 'uniform', min: 0, max: 6.28 } },
      { kind: 'chirp', amplitude: { kind: 'uniform', min: 0.5, max: 1 }, startFrequencyHz: 0.5, endFrequencyHz: 4 },
      { kind: 'constant', value: { kind: 'normal', mean: 0, std: 1, min: -2, max: 2 } },
    ];
    for (const spec of specs) {
      const base = signal(spec, 0.01, 500, 7, '18446744073709551615');
      expect(signal(spec, 0.01, 500, 7, '18446744073709551615')).toEqual(base);
      expect(signal(spec, 0.01, 500, 8, '18446744073709551615')).not.toEqual(base);
      expect(signal(spec, 0.01, 500, 7, 1)).not.toEqual(base);
      const other = new Float64Array(500);
      generateControlSignal(spec, channelStream(7, 1, '18446744073709551615'), 0.01, 500, other, 0, 1);
      expect(other).not.toEqual(base);
    }
  });

  it('a constant clip draws nothing, so adding it does not change the unclipped part', () => {
    const spec: ControlSpec = { kind: 'band-limited', cutoffHz: 2, std: 1, componentCount: 8 };
    const raw = signal(spec, 0.01, 400);
    const clipped = signal({ ...spec, clip: { min: -1.2 } }, 0.01, 400);
    for (let t = 0; t < 400; t++) expect(clipped[t]).toBe(Math.max(-1.2, raw[t]));
  });

  it('refuses specs it cannot generate, naming the member and the fix, before drawing', () => {
    const cases: [ControlSpec, RegExp][] = [
      [{ kind: 'sinusoid', amplitude: 1, frequencyHz: 80 }, /\/controls\/0\/frequencyHz: .*Nyquist limit of a 0.01 s record interval/],
      [{ kind: 'chirp', amplitude: 1, startFrequencyHz: 1, endFrequencyHz: { kind: 'uniform', min: 10, max: 60 } }, /endFrequencyHz: frequency range \[10, 60\] Hz/],
      [{ kind: 'band-limited', cutoffHz: 51, std: 1, componentCount: 4 }, /cutoffHz/],
      [{ kind: 'piecewise-constant', holdS: 0.005, min: 0, max: 1 }, /holdS: hold time can be 0.005 s, shorter than the 0.01 s record interval/],
      [{ kind: 'steps', stepCount: 3, min: { kind: 'uniform', min: 0, max: 2 }, max: 1 }, /\/controls\/0\/max: "min" can be 2, above the 1/],
      [{ kind: 'steps', stepCount: { kind: 'uniform', min: 1, max: 4 }, min: 0, max: 1 }, /stepCount: must be a whole number/],
      [{ kind: 'ornstein-uhlenbeck', meanValue: 0, std: -1, timeConstantS: 1 }, /std: must not be negative/],
      [{ kind: 'step-list', timesS: [0.5, 1], values: [1, 2] }, /timesS\/0: the first time must be 0 s/],
      [{ kind: 'step-list', timesS: [0, 2, 1], values: [1, 2, 3] }, /timesS\/2: time 2 can be 1 s, before time 1/],
      [{ kind: 'constant', value: 1, clip: { min: 2, max: 1 } }, /clip\/max: "min" can be 2/],
    ];
    for (const [spec, message] of cases) {
      const stream = channelStream(0, 0);
      const call = () => generateControlSignal(spec, stream, 0.01, 100, new Float64Array(100), 0, 1, { pointer: '/controls/0' });
      expect(call, JSON.stringify(spec)).toThrow(SpecError);
      expect(call, JSON.stringify(spec)).toThrow(message);
      expect(stream.uint32DrawCount).toBe(0);
    }
  });
});
