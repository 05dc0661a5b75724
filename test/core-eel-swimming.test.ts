// The Korrin Bay eel demo (scenarios/korrin-eel.json) swims, at the speed resistive-force
// theory predicts for the motion its body actually makes. Gray & Hancock (1955, J. Exp. Biol.
// 32, 802) balance the drag along and across each element of a waving filament: an element
// with slope y_x and lateral velocity y_t on a body swimming forwards at U feels a forward force
// per length [U·(C_t + C_n·y_x²) + (C_n − C_t)·y_t·y_x] / (1 + y_x²) (tangent and normal drag of
// its velocity (−U, y_t); Lighthill, Mathematical Biofluiddynamics, 1975, ch. 3; from memory;
// a pure travelling wave y_t = −V·y_x gives their U/V = (r − 1)·S/(1 + r·S) for small slopes).
// Zero mean force over the top and bottom outlines (2L of filament) plus the normal drag on the
// head and tail faces (height h each) gives
//   U = −(C_n − C_t)·2L·⟨y_t·y_x/(1 + y_x²)⟩ / (2L·⟨(C_t + C_n·y_x²)/(1 + y_x²)⟩ + 2·C_n·h),
// with ⟨⟩ the mean over the centreline's elements and the last two seconds, y_x and y_t measured
// from the simulated centreline. The theory leaves out the body's inertia, the difference between
// centreline and outlines and the swimming speed's ripple, so the check asks for agreement within
// a factor of 1.5 in the median episode and 2.2 in each. The simulator uses the same drag law
// per panel; what the check adds is that the recorded kinematics and speed are those of a
// resistive-force swimmer, not of a drifting body. Measured along the centroid's own path, since
// a body with cells of unequal stiffness swims along a slightly turned direction.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';

import { describe, expect, it } from 'vitest';

import { recordTrajectory } from '../sim/episode/record-episode.ts';
import { checkScenarioText } from '../sim/scenario/check-scenario.ts';
import { sampleEpisode } from '../sim/scenario/sample-episode.ts';
import { SCENARIOS_DIR } from './support/e2e-web-app.ts';

interface Swim {
  bodyLengthM: number;
  speedMPerS: number;
  predictedMPerS: number;
}

function swim(index: number): Swim {
  const checked = checkScenarioText(readFileSync(join(SCENARIOS_DIR, 'korrin-eel.json'), 'utf8'), 'korrin-eel.json');
  if (!checked.ok) throw new Error(JSON.stringify(checked.problems));
  const episode = sampleEpisode(checked.scenario, index);
  const model = episode.system.model;
  const cellM = episode.labels['/system/cellSizeM'] as number;
  const cn = episode.labels['/world/fluid/normalDragNsPerM3'] as number;
  const ct = episode.labels['/world/fluid/tangentialDragNsPerM3'] as number;
  const built = model.positionM.slice();
  // The centreline: the middle row of nodes (start noise moves them a little), head first.
  let yMin = Infinity;
  for (let i = 0; i < model.nodeCount; i++) yMin = Math.min(yMin, built[3 * i + 1]);
  const centre: number[] = [];
  for (let i = 0; i < model.nodeCount; i++) if (Math.abs(built[3 * i + 1] - (yMin + cellM)) < 0.25 * cellM) centre.push(i);
  centre.sort((a, b) => built[3 * a] - built[3 * b]);
  const bodyLengthM = built[3 * centre[centre.length - 1]] - built[3 * centre[0]];

  const trajectory = recordTrajectory(model, episode.world, episode.controls, episode.recording);
  const n = model.nodeCount;
  const dtS = episode.recording.recordIntervalS;
  const first = trajectory.steps - Math.round(2 / dtS);
  const at = (t: number, node: number, axis: number): number => trajectory.positionM[(t * n + node) * 3 + axis];
  const centroid = (t: number, axis: number): number => {
    let sum = 0;
    let mass = 0;
    for (let i = 0; i < n; i++) {
      sum += model.massKg[i] * at(t, i, axis);
      mass += model.massKg[i];
    }
    return sum / mass;
  };
  // The body swims along a direction of its own (its wave is not symmetric about x): measure
  // in the frame whose x' axis points backwards along the centroid's path, y' across it.
  const travelX = centroid(trajectory.steps, 0) - centroid(first, 0);
  const travelY = centroid(trajectory.steps, 1) - centroid(first, 1);
  const travelM = Math.hypot(travelX, travelY);
  const speedMPerS = travelM / ((trajectory.steps - first) * dtS);
  const back = [-travelX / travelM, -travelY / travelM];
  const across = [-back[1], back[0]];
  const vel = (t: number, node: number, axis: number): number => trajectory.velocityMPerS[(t * n + node) * 3 + axis];
  let push = 0;
  let resist = 0;
  let samples = 0;
  for (let t = first; t <= trajectory.steps; t++) {
    for (let j = 0; j + 1 < centre.length; j++) {
      const a = centre[j];
      const b = centre[j + 1];
      const dx = at(t, b, 0) - at(t, a, 0);
      const dy = at(t, b, 1) - at(t, a, 1);
      const slope = (dx * across[0] + dy * across[1]) / (dx * back[0] + dy * back[1]);
      const lateral = 0.5 * ((vel(t, a, 0) + vel(t, b, 0)) * across[0] + (vel(t, a, 1) + vel(t, b, 1)) * across[1]);
      push += (lateral * slope) / (1 + slope * slope);
      resist += (ct + cn * slope * slope) / (1 + slope * slope);
      samples++;
    }
  }
  push /= samples;
  resist /= samples;
  const heightM = 2 * cellM;
  const predictedMPerS = (-(cn - ct) * 2 * bodyLengthM * push) / (2 * bodyLengthM * resist + 2 * cn * heightM);
  return { bodyLengthM, speedMPerS, predictedMPerS };
}

describe('the Korrin Bay eel swims (Gray & Hancock 1955 resistive-force theory)', () => {
  // All 24 episodes of the demo; before the tuning the median centroid moved 12.6 mm in 3 s
  // (0.02 body lengths per second).
  const swims = Array.from({ length: 24 }, (_, i) => swim(i));
  const median = (values: number[]): number => values.sort((a, b) => a - b)[values.length >> 1];

  it('median above 0.25 body lengths per second (0.35 measured), every episode above 0.1 (0.18 the slowest)', () => {
    const rates = swims.map((w) => w.speedMPerS / w.bodyLengthM);
    expect(median(rates.slice())).toBeGreaterThan(0.25);
    for (const rate of rates) expect(rate).toBeGreaterThan(0.1);
  });

  it('speed over the theory\'s prediction for the measured motion: median within a factor 1.5 (0.78 measured), every episode within 2.2 (0.52 to 1.06)', () => {
    const ratios = swims.map((w) => w.speedMPerS / w.predictedMPerS);
    const middle = median(ratios.slice());
    expect(middle).toBeGreaterThan(1 / 1.5);
    expect(middle).toBeLessThan(1.5);
    for (const ratio of ratios) {
      expect(ratio).toBeGreaterThan(1 / 2.2);
      expect(ratio).toBeLessThan(2.2);
    }
  });
});
