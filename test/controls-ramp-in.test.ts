// The ramp-in window of control signals (sim/controls/ramp-in.ts) against NumPy's Hann window
// (numpy.hanning: 0.5 − 0.5·cos(2πn/(M − 1)); Blackman & Tukey 1958 via NumPy's docs), of
// which it is the rising half, and its effect on the Korrin Bay demos: without it the first
// record interval moved a control a median 5.7× (tether), 5.7× (fin) and 7.8× (eel) more than
// any later interval did, the jolt the window is there to remove.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';

import { describe, expect, it } from 'vitest';

import { generateControlSignal } from '../sim/controls/control-signal.ts';
import { rampInWindow } from '../sim/controls/ramp-in.ts';
import { RandomStream, StreamPurpose } from '../sim/random/random-stream.ts';
import { checkScenarioText } from '../sim/scenario/check-scenario.ts';
import { sampleEpisode } from '../sim/scenario/sample-episode.ts';
import { SCENARIOS_DIR } from './support/e2e-web-app.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

const python = referencePythonAvailability();

describe.runIf(python.available)('ramp-in window = rising half of numpy.hanning', () => {
  it('at 41 points over 0.8 s: equal to numpy.hanning(81)[0:41] within 1e-15, then 1', () => {
    const rampInS = 0.8;
    const points = 41;
    const reference = runReferencePython<number[]>('import json, sys, numpy as np\nm = json.load(sys.stdin)\nprint(json.dumps(np.hanning(2 * m - 1)[:m].tolist()))', points);
    for (let n = 0; n < points; n++) {
      expect(Math.abs(rampInWindow((n * rampInS) / (points - 1), rampInS) - reference[n])).toBeLessThan(1e-15);
    }
    expect(rampInWindow(rampInS * 1.01, rampInS)).toBe(1);
    expect(rampInWindow(5, 0)).toBe(1);
  });
});

describe('a windowed signal (definition of the window, common practice, no source)', () => {
  it('a constant 2.0 over 0.1 s records: 0 at t = 0, w(t)·2 during 0.5 s, 2 afterwards; clip acts first', () => {
    const out = new Float64Array(10);
    generateControlSignal({ kind: 'constant', value: 2, clip: { min: 0.5 } }, new RandomStream(1, 0, StreamPurpose.controls, 0), 0.1, 10, out, 0, 1, { rampInS: 0.5 });
    for (let t = 0; t < 10; t++) {
      const time = 0.1 * t;
      const expected = time < 0.5 ? 2 * 0.5 * (1 - Math.cos((Math.PI * time) / 0.5)) : 2;
      expect(out[t]).toBeCloseTo(expected, 14);
    }
    expect(out[0]).toBe(0);
  });
});

describe('the Korrin Bay demos start smoothly', () => {
  for (const name of ['korrin-tether', 'korrin-fin', 'korrin-eel']) {
    it(`${name}: every control starts at 0, and the largest per-interval change during the ramp is at most the largest after it in the median episode (at most 1.5× in any)`, () => {
      const checked = checkScenarioText(readFileSync(join(SCENARIOS_DIR, `${name}.json`), 'utf8'), `${name}.json`);
      if (!checked.ok) throw new Error(JSON.stringify(checked.problems));
      const scenario = checked.scenario;
      expect(scenario.controls.rampInS).toBeGreaterThan(0);
      const rampSteps = Math.ceil(scenario.controls.rampInS / scenario.time.recordIntervalS);
      const ratios: number[] = [];
      for (let e = 0; e < scenario.episodes; e++) {
        const episode = sampleEpisode(scenario, e);
        const channels = episode.system.controlChannels.length;
        let early = 0;
        let late = 0;
        for (let c = 0; c < channels; c++) {
          expect(Math.abs(episode.controls[c])).toBe(0);
          let previous = 0;
          for (let t = 0; t < scenario.time.recordedSteps; t++) {
            const u = episode.controls[t * channels + c];
            const change = Math.abs(u - previous);
            previous = u;
            if (t <= rampSteps) early = Math.max(early, change);
            else late = Math.max(late, change);
          }
        }
        ratios.push(early / late);
      }
      ratios.sort((a, b) => a - b);
      expect(ratios[ratios.length >> 1]).toBeLessThanOrEqual(1);
      expect(ratios[ratios.length - 1]).toBeLessThanOrEqual(1.5);
    });
  }
});
