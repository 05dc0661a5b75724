// Where each control channel acts, as the fields a training script reads (axis, node, clamp),
// checked by what the channel does when it is the only one moved: the reference is the
// channel contract in sim/dataset/LAYOUT.md (a driven offset is reached at the end of the
// control interval; a handle force acts on its node along its axis, so in free fall with no
// springs the first step changes only that node's velocity along that axis by F·dt/m,
// Newton's second law), not the code that wrote the fields.
import { readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';

import { describe, expect, it } from 'vitest';

import { Simulator } from '../sim/core/simulator.ts';
import { checkScenarioValue } from '../sim/scenario/check-scenario.ts';
import { sampleEpisode } from '../sim/scenario/sample-episode.ts';

const ROOT = resolve(import.meta.dirname, '..');
const AXES = { x: 0, y: 1, z: 2 } as const;

function episodeOf(value: unknown) {
  const checked = checkScenarioValue(value);
  if (!checked.ok) throw new Error(JSON.stringify(checked.problems));
  return sampleEpisode(checked.scenario, 0);
}

describe('control channel fields', () => {
  it('chain: each driven offset moves exactly its node along its axis, and each handle force pushes its node along its axis', () => {
    const tether = JSON.parse(readFileSync(join(ROOT, 'scenarios/korrin-tether.json'), 'utf8'));
    tether.system.forceHandles = [-1, 5];
    tether.system.forceAxes = ['y', 'z'];
    tether.initialState = { settleS: 0 };
    const episode = episodeOf(tether);
    const channels = episode.system.controlChannels;
    expect(channels.map((c) => [c.kind, c.axis, c.node, c.clamp])).toEqual([
      ['driven-offset', 'x', 0, null],
      ['driven-offset', 'z', 0, null],
      ['handle-force', 'y', episode.system.model.nodeCount - 1, null],
      ['handle-force', 'z', episode.system.model.nodeCount - 1, null],
      ['handle-force', 'y', 5, null],
      ['handle-force', 'z', 5, null],
    ]);
    for (const channel of channels) {
      const model = episodeOf(tether).system.model;
      const world = { ...episode.world, gravityMPerS2: [0, 0, 0] as [number, number, number], airDragPerS: 0 };
      model.velocityMPerS.fill(0);
      const before = model.positionM.slice();
      const simulator = new Simulator(model, world, { kernel: 'js' });
      const controls = new Float64Array(channels.length);
      controls[channel.index] = channel.kind === 'driven-offset' ? 0.01 : 2;
      simulator.setControls(controls);
      const dtS = 1e-5;
      simulator.advanceInterval(dtS, 1);
      const node = channel.node!;
      const axis = AXES[channel.axis!];
      if (channel.kind === 'driven-offset') {
        expect(model.positionM[3 * node + axis] - before[3 * node + axis]).toBeCloseTo(0.01, 12);
        for (const other of [0, 1, 2].filter((k) => k !== axis)) expect(model.positionM[3 * node + other]).toBe(before[3 * node + other]);
      } else {
        // Springs at rest exert nothing, so only the pushed node gains velocity, F·dt/m.
        expect(model.velocityMPerS[3 * node + axis]).toBeCloseTo((2 * dtS) / model.massKg[node], 9);
        let others = 0;
        for (let i = 0; i < model.nodeCount * 3; i++) if (i !== 3 * node + axis && Math.abs(model.velocityMPerS[i]) > 1e-12) others++;
        expect(others).toBe(0);
      }
    }
  });

  it('lattice: a clamp offset names its clamp and axis, actuators name neither', () => {
    const fin = JSON.parse(readFileSync(join(ROOT, 'scenarios/korrin-fin.json'), 'utf8'));
    fin.system.base = 'free';
    fin.system.clamps = [{ name: 'hull-mount', face: '-y', drivenAxes: ['x', 'z'] }];
    const channels = episodeOf(fin).system.controlChannels;
    expect(channels.map((c) => [c.kind, c.axis, c.node, c.clamp])).toEqual([
      ['actuator', null, null, null],
      ['actuator', null, null, null],
      ['driven-offset', 'x', null, 'hull-mount'],
      ['driven-offset', 'z', null, 'hull-mount'],
    ]);
  });
});
