// Sampling a checked scenario into episodes: deterministic from (seed, episode index) alone,
// independent per parameter, labels that agree with the system actually built, start-state
// noise on free nodes only, per-channel controls, replay tables, previews and overrides.
// Physical relations used: a chain of n equal parts of EA and length L has structural springs
// k = EA·n/L (Hooke's law for a bar, k = EA/ℓ, any strength-of-materials text, e.g. Gere &
// Goodno, Mechanics of Materials); a body's mass is density × volume; the sample standard
// deviation of n normal draws has relative standard error about 1/√(2n) (textbook sampling
// theory, e.g. Kendall & Stuart).
import { describe, expect, it } from 'vitest';

import { NODE_DRIVEN, NODE_PINNED, RELATION_STRUCTURAL } from '../sim/core/model.ts';
import { checkScenarioValue } from '../sim/scenario/check-scenario.ts';
import { previewEpisodes } from '../sim/scenario/preview-episodes.ts';
import { sampleEpisode } from '../sim/scenario/sample-episode.ts';
import type { SampledEpisode } from '../sim/scenario/sampled-episode.ts';
import { withOverrides } from '../sim/scenario/scenario-overrides.ts';
import { ScenarioProblemError } from '../sim/scenario/scenario-problem.ts';
import type { Scenario } from '../sim/scenario/scenario-types.ts';

type Json = any; // fixtures are edited freely before checking

/** Korrin Bay tether sweep (invented demo values). */
function tether(): Json {
  return {
    formatVersion: 1,
    name: 'korrin-tether-sweep',
    system: {
      kind: 'chain',
      partCount: { kind: 'integer', min: 10, max: 40 },
      lengthM: { kind: 'uniform', min: 2, max: 5 },
      totalMassKg: { kind: 'uniform', min: 0.5, max: 1.2 },
      axialStiffnessN: { kind: 'log-uniform', min: 1000, max: 20000 },
      secondNeighbourSpringRatio: 0.05,
      dampingRatio: 0.1,
      diameterM: 0.012,
      anchor: 'top-driven',
      drivenAxes: ['x', 'z'],
      forceHandles: [-1],
      forceAxes: ['y'],
    },
    world: { fluid: { densityKgPerM3: 1000, normalDragNsPerM3: 50, tangentialDragNsPerM3: 5 } },
    controls: {
      default: { kind: 'sinusoid', amplitude: { kind: 'uniform', min: 0.05, max: 0.2 }, frequencyHz: { kind: 'uniform', min: 0.2, max: 1 }, phaseRad: { kind: 'uniform', min: 0, max: 6.28 } },
      // The tip's channel name carries its node index, which varies with partCount: name it by index.
      channels: { '2': { kind: 'ornstein-uhlenbeck', meanValue: 0, std: 0.5, timeConstantS: 0.3 } },
      // Raw signals, so they compare with their definitions; the ramp-in has its own suite.
      rampInS: 0,
    },
    time: { recordIntervalS: 0.02, recordedSteps: 50 },
    initialState: { positionNoiseM: 0.002, velocityNoiseMPerS: { kind: 'uniform', min: 0, max: 0.01 } },
    episodes: 1000,
    seed: '12345678901234567890',
  };
}

function checked(value: Json): Scenario {
  const result = checkScenarioValue(value);
  if (!result.ok) throw new Error(JSON.stringify(result.problems));
  return result.scenario;
}

function comparable(e: SampledEpisode) {
  return {
    index: e.index,
    masterSeed: e.masterSeed,
    split: e.split,
    labels: e.labels,
    positions: Array.from(e.system.model.positionM),
    velocities: Array.from(e.system.model.velocityMPerS),
    stiffness: Array.from(e.system.model.stiffnessNPerM),
    damping: Array.from(e.system.model.dampingNsPerM),
    controls: Array.from(e.controls),
    channels: e.system.controlChannels.map((c) => c.name),
    recording: e.recording,
  };
}

describe('determinism (same seed and index give the same episode; project contract)', () => {
  it('samples identical arrays and labels for the same (seed, index), from two separate checks', () => {
    const a = sampleEpisode(checked(tether()), 7);
    const b = sampleEpisode(checked(tether()), 7);
    expect(comparable(a)).toEqual(comparable(b));
    expect(a.controls.length).toBe(50 * a.system.controlChannels.length);
  });

  it('episode i does not depend on the episode count or on which episodes were sampled before', () => {
    const many = checked(tether());
    const fewer = checked({ ...tether(), episodes: 12 });
    const inOrder = Array.from({ length: 12 }, (_, i) => sampleEpisode(many, i));
    expect(comparable(sampleEpisode(fewer, 11))).toEqual(comparable(inOrder[11]));
    expect(comparable(sampleEpisode(many, 3))).toEqual(comparable(inOrder[3]));
    // Different episodes do differ.
    expect(inOrder[3].labels['/system/lengthM']).not.toBe(inOrder[4].labels['/system/lengthM']);
  });

  it('a different seed gives different draws', () => {
    const a = sampleEpisode(checked(tether()), 2);
    const b = sampleEpisode(checked({ ...tether(), seed: 1 }), 2);
    expect(a.labels['/system/lengthM']).not.toBe(b.labels['/system/lengthM']);
  });

  it('making one more parameter random leaves every other draw of every episode unchanged', () => {
    const base = checked(tether());
    const more = tether();
    more.system.diameterM = { kind: 'uniform', min: 0.01, max: 0.015 };
    more.world.airDragPerS = { kind: 'uniform', min: 0, max: 0.1 };
    const extended = checked(more);
    for (const i of [0, 5, 99]) {
      const a = sampleEpisode(base, i);
      const b = sampleEpisode(extended, i);
      const { ['/system/diameterM']: diameterB, ['/world/airDragPerS']: dragB, ...restB } = b.labels;
      const { ['/system/diameterM']: diameterA, ['/world/airDragPerS']: dragA, ...restA } = a.labels;
      expect(restB).toEqual(restA);
      expect(diameterA).toBe(0.012);
      expect(diameterB).not.toBe(0.012);
      expect(dragA).toBe(0);
      expect(dragB).toBeGreaterThanOrEqual(0);
      expect(Array.from(b.controls)).toEqual(Array.from(a.controls));
      expect(Array.from(b.system.model.positionM)).toEqual(Array.from(a.system.model.positionM));
      expect(b.split).toBe(a.split);
    }
  });
});

describe('labels are the parameters the built system has (k = EA·n/L for a bar; mass = Σ node masses)', () => {
  const scenario = checked({ ...tether(), initialState: {} });
  for (const i of [0, 1, 2, 3, 4]) {
    it(`episode ${i}`, () => {
      const e = sampleEpisode(scenario, i);
      const m = e.system.model;
      const n = e.labels['/system/partCount'] as number;
      const lengthM = e.labels['/system/lengthM'] as number;
      const ea = e.labels['/system/axialStiffnessN'] as number;
      expect(m.nodeCount - 1).toBe(n);
      let structural = 0;
      for (let s = 0; s < m.springCount; s++) {
        if (m.springRelation[s] !== RELATION_STRUCTURAL) continue;
        structural++;
        expect(m.stiffnessNPerM[s]).toBeCloseTo((ea * n) / lengthM, 6);
      }
      expect(structural).toBe(n);
      const last = 3 * (m.nodeCount - 1);
      expect(Math.hypot(m.positionM[last] - m.positionM[0], m.positionM[last + 1] - m.positionM[1], m.positionM[last + 2] - m.positionM[2])).toBeCloseTo(lengthM, 12);
      expect(m.massKg.reduce((a, b) => a + b, 0)).toBeCloseTo(e.labels['/system/totalMassKg'] as number, 12);
      expect(e.world.fluid.enabled).toBe(true);
      expect(e.world.ground.enabled).toBe(false);
      expect(e.labels['/world/fluid/densityKgPerM3']).toBe(e.world.fluid.densityKgPerM3);
      // The tip handle keeps its name whatever the part count (the channel key is stable).
      expect(e.system.controlChannels.map((c) => c.name)).toEqual(['top-offset-x', 'top-offset-z', 'force-tip-y']);
    });
  }

  it('a lattice from a map: total mass is density × cell volume × cells (2-D cells one cell thick)', () => {
    const fin = checked({
      formatVersion: 1,
      name: 'korrin-fin',
      system: {
        kind: 'lattice',
        cellSizeM: { kind: 'uniform', min: 0.008, max: 0.012 },
        base: 'clamped',
        shape: { maps: [[[1, 1, 1], [2, 2, 2], [2, 0, 2]], [[1, 1], [2, 2], [2, 2]]] },
        materials: [
          { name: 'root', youngsModulusPa: 5e5, densityKgPerM3: { kind: 'uniform', min: 1000, max: 1200 }, dampingRatio: 0.05 },
          { name: 'actuator', youngsModulusPa: 2e5, densityKgPerM3: 1050, dampingRatio: 0.05, actuatorChannel: 0, actuationStrainMax: 0.1 },
        ],
      },
      time: { recordIntervalS: 0.01, recordedSteps: 5 },
      episodes: 20,
      seed: 9,
    });
    const seen = new Set<number>();
    for (let i = 0; i < 20; i++) {
      const e = sampleEpisode(fin, i);
      const a = e.labels['/system/cellSizeM'] as number;
      const rootDensity = e.labels['/system/materials/0/densityKgPerM3'] as number;
      const mapIndex = e.labels['/system/shape/maps'] as number;
      seen.add(mapIndex);
      const [rootCells, actuatorCells] = mapIndex === 0 ? [3, 5] : [2, 4];
      const expected = (rootCells * rootDensity + actuatorCells * 1050) * a * a * a;
      expect(e.system.model.massKg.reduce((x, y) => x + y, 0)).toBeCloseTo(expected, 12);
      expect(e.system.model.cellCount).toBe(rootCells + actuatorCells);
    }
    expect(seen).toEqual(new Set([0, 1]));
  });
});

describe('start-state noise touches free nodes only (sample std within 5% for n ≈ 6000, rel. s.e. 1/√(2n))', () => {
  it('leaves the pinned top in place and spreads the others with the stated standard deviation', () => {
    const value = tether();
    value.system.partCount = 2000;
    value.system.anchor = 'top-pinned';
    value.system.forceHandles = [];
    value.controls = {};
    value.initialState = { positionNoiseM: 0.003, velocityNoiseMPerS: 0.02 };
    const noisy = sampleEpisode(checked(value), 0);
    value.initialState = {};
    const quiet = sampleEpisode(checked(value), 0);
    const x = noisy.system.model.positionM;
    const x0 = quiet.system.model.positionM;
    const v = noisy.system.model.velocityMPerS;
    for (let i = 0; i < noisy.system.model.nodeCount; i++) {
      if (noisy.system.model.nodeFlags[i] & NODE_PINNED) {
        expect([x[3 * i], x[3 * i + 1], x[3 * i + 2]]).toEqual([x0[3 * i], x0[3 * i + 1], x0[3 * i + 2]]);
        expect([v[3 * i], v[3 * i + 1], v[3 * i + 2]]).toEqual([0, 0, 0]);
      }
    }
    const dx: number[] = [];
    const dv: number[] = [];
    for (let i = 3; i < x.length; i++) {
      dx.push(x[i] - x0[i]);
      dv.push(v[i]);
    }
    const std = (a: number[]) => Math.sqrt(a.reduce((s, d) => s + d * d, 0) / a.length);
    expect(std(dx)).toBeGreaterThan(0.003 * 0.95);
    expect(std(dx)).toBeLessThan(0.003 * 1.05);
    expect(std(dv)).toBeGreaterThan(0.02 * 0.95);
    expect(std(dv)).toBeLessThan(0.02 * 1.05);
  });

  it('leaves a driven top in place and keeps 2-D lattices in their plane', () => {
    const driven = sampleEpisode(checked({ ...tether(), initialState: { positionNoiseM: 0.01 } }), 4);
    const m = driven.system.model;
    for (let i = 0; i < m.nodeCount; i++) {
      if (m.nodeFlags[i] & NODE_DRIVEN) expect([m.positionM[3 * i], m.positionM[3 * i + 1], m.positionM[3 * i + 2]]).toEqual([0, 0, 0]);
    }
    const fin = (initialState: Json): Scenario =>
      checked({
        formatVersion: 1,
        name: 'fin',
        system: { kind: 'lattice', cellSizeM: 0.01, base: 'free', originM: [0, 0, 0.5], shape: { maps: [[[1, 1, 1, 1], [1, 1, 1, 1]]] }, materials: [{ name: 'gel', youngsModulusPa: 1e5, densityKgPerM3: 1000, dampingRatio: 0.1 }] },
        time: { recordIntervalS: 0.01, recordedSteps: 5 },
        initialState,
        episodes: 3,
        seed: 5,
      });
    const flat = sampleEpisode(fin({ positionNoiseM: 0.001, velocityNoiseMPerS: 0.01 }), 1).system.model;
    const still = sampleEpisode(fin({}), 1).system.model;
    let movedInPlane = 0;
    for (let i = 0; i < flat.nodeCount; i++) {
      expect(flat.positionM[3 * i + 2]).toBe(0.5);
      expect(flat.velocityMPerS[3 * i + 2]).toBe(0);
      if (flat.positionM[3 * i] !== still.positionM[3 * i] && flat.positionM[3 * i + 1] !== still.positionM[3 * i + 1]) movedInPlane++;
    }
    expect(movedInPlane).toBe(flat.nodeCount);
  });
});

describe('controls per channel (sinusoid u = offset + A·sin(2πft + φ), the spec\'s definition)', () => {
  it('drives each channel from its own spec and stream and labels the drawn parameters by channel name', () => {
    const e = sampleEpisode(checked(tether()), 3);
    const channels = e.system.controlChannels;
    const count = channels.length;
    const interval = e.recording.recordIntervalS;
    for (const channel of channels.filter((c) => c.kind === 'driven-offset')) {
      const prefix = `/controls/${channel.name}`;
      expect(e.labels[`${prefix}/kind`]).toBe('sinusoid');
      const a = e.labels[`${prefix}/amplitude`] as number;
      const f = e.labels[`${prefix}/frequencyHz`] as number;
      const phase = e.labels[`${prefix}/phaseRad`] as number;
      for (let t = 0; t < e.recording.recordedSteps; t++) {
        expect(e.controls[t * count + channel.index]).toBeCloseTo(a * Math.sin(2 * Math.PI * f * t * interval + phase), 12);
      }
    }
    const x = channels.find((c) => c.name === 'top-offset-x')!;
    const z = channels.find((c) => c.name === 'top-offset-z')!;
    expect(e.labels[`/controls/${x.name}/amplitude`]).not.toBe(e.labels[`/controls/${z.name}/amplitude`]);
    const handle = channels.find((c) => c.kind === 'handle-force')!;
    expect(e.labels[`/controls/${handle.name}/kind`]).toBe('ornstein-uhlenbeck');
  });

  it('plays back a column of a replay table through options.replay, and says clearly when it cannot', () => {
    const value = tether();
    value.controls = { default: { kind: 'none' }, channels: { '0': { kind: 'replay', file: 'tank-run-3.npy', column: 1 } }, rampInS: 0 };
    const scenario = checked(value);
    const rows = 60;
    const data = new Float64Array(rows * 2);
    for (let r = 0; r < rows; r++) {
      data[2 * r] = -r;
      data[2 * r + 1] = r / 100;
    }
    const e = sampleEpisode(scenario, 0, { replay: (file) => (file === 'tank-run-3.npy' ? { data, rows, columns: 2 } : { data: new Float64Array(0), rows: 0, columns: 0 }) });
    const count = e.system.controlChannels.length;
    for (let t = 0; t < 50; t++) expect(e.controls[t * count]).toBe(t / 100);
    expect(() => sampleEpisode(scenario, 0)).toThrow(ScenarioProblemError);
    try {
      sampleEpisode(scenario, 0);
    } catch (error) {
      expect((error as ScenarioProblemError).problems[0].pointer).toBe('/controls/channels/0/file');
      expect((error as ScenarioProblemError).problems[0].message).toContain('no replay files can be read here');
    }
    try {
      sampleEpisode(scenario, 0, { replay: () => ({ data: new Float64Array(rows), rows, columns: 1 }) });
      throw new Error('expected a problem');
    } catch (error) {
      expect((error as ScenarioProblemError).problems[0]).toEqual({
        pointer: '/controls/channels/0/column',
        message: 'asks for column 1 of "tank-run-3.npy", which has 1 column (counting from 0); pick a column below 1',
      });
    }
  });
});

describe('previews and command-line overrides', () => {
  it('previews exactly the first episodes that generate would write', () => {
    const scenario = checked(tether());
    const preview = previewEpisodes(scenario, 3);
    expect(preview.map(comparable)).toEqual([0, 1, 2].map((i) => comparable(sampleEpisode(scenario, i))));
    expect(previewEpisodes(checked({ ...tether(), episodes: 2 }), 5)).toHaveLength(2);
  });

  it('replaces episodes, seed and format, and refuses bad values with a pointer', () => {
    const scenario = checked(tether());
    const changed = withOverrides(scenario, { episodes: 5, seed: '42', format: 'hdf5' });
    expect(changed.episodes).toBe(5);
    expect(changed.export.format).toBe('hdf5');
    expect(comparable(sampleEpisode(changed, 1)).labels).toEqual(comparable(sampleEpisode(withOverrides(scenario, { seed: 42 }), 1)).labels);
    expect(scenario.episodes).toBe(1000);
    expect(() => withOverrides(scenario, { episodes: 0 })).toThrow(ScenarioProblemError);
    try {
      withOverrides(scenario, { episodes: 0 });
    } catch (error) {
      expect((error as ScenarioProblemError).problems).toEqual([{ pointer: '/episodes', message: 'must be ≥ 1 (got 0)' }]);
    }
    expect(() => withOverrides(scenario, { seed: '-3' })).toThrow(ScenarioProblemError);
  });

  it('refuses an episode index outside the sweep', () => {
    expect(() => sampleEpisode(checked({ ...tether(), episodes: 3 }), 3)).toThrow(/outside the scenario's 3 episodes/);
  });
});
