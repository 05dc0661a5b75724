// The scenario keys of obstacles, accuracy and numerics, end to end from a scenario to an
// episode's arrays and labels. Values are Korrin Bay demo inventions. Checks against outside
// facts: Coulomb friction needs μ_k ≤ μ_s (Halliday & Resnick, friction); a uniform(a, b) draw
// lies in [a, b] (definition of the distribution); JSON pointers address the value they name
// (RFC 6901).
import { describe, expect, it } from 'vitest';

import { ENERGY_TERMS } from '../sim/core/energy.ts';
import { FLOW_COLUMNS } from '../sim/core/energy-flows.ts';
import { produceEpisode } from '../sim/dataset/write/episode-product.ts';
import { ReplayTable } from '../sim/dataset/write/replay-inputs.ts';
import { checkScenarioValue } from '../sim/scenario/check-scenario.ts';
import { sampleEpisode } from '../sim/scenario/sample-episode.ts';

type Json = any; // fixtures are edited freely before checking

function rockTank(): Json {
  return {
    formatVersion: 1,
    name: 'korrin-tether-rocks',
    system: { kind: 'chain', partCount: 8, lengthM: 0.8, totalMassKg: 0.3, axialStiffnessN: 200, dampingRatio: 0.1, diameterM: 0.01, anchor: 'top-pinned', originM: [0, 0.9, 0], directionUnit: [1, -0.2, 0] },
    world: {
      ground: { staticFriction: 0.6, kineticFriction: 0.5 },
      obstacles: [
        { shape: 'sphere', centerM: [{ kind: 'uniform', min: 0.3, max: 0.5 }, 0.2, 0], radiusM: { kind: 'uniform', min: 0.1, max: 0.2 }, staticFriction: 0.5, kineticFriction: 0.4 },
        { shape: 'box', centerM: [0.8, 0.1, 0], sizeM: [0.3, 0.2, { kind: 'uniform', min: 0.2, max: 0.4 }], staticFriction: 0.4, kineticFriction: 0.3 },
        { shape: 'cylinder', centerM: [-0.3, 0.1, 0], radiusM: 0.1, lengthM: 0.5, axis: 'z', staticFriction: 0.4, kineticFriction: 0.3 },
      ],
    },
    time: { recordIntervalS: 0.01, recordedSteps: 30, substeps: { accuracy: 0.1 } },
    episodes: 4,
    seed: 20261203,
    numerics: { energyBalance: true, richardsonShare: 1 },
    export: { forces: true },
  };
}

describe('world.obstacles: randomised sizes and places become labels and world obstacles', () => {
  it('each drawn number is labelled at its JSON pointer and lands in the episode\'s world', () => {
    const checked = checkScenarioValue(rockTank());
    if (!checked.ok) throw new Error(JSON.stringify(checked.problems));
    const episode = sampleEpisode(checked.scenario, 2);
    const [sphere, box, cylinder] = episode.world.obstacles;
    const x = episode.labels['/world/obstacles/0/centerM/0'] as number;
    expect(x).toBeGreaterThanOrEqual(0.3);
    expect(x).toBeLessThanOrEqual(0.5);
    expect(sphere.centerM[0]).toBe(x);
    expect(sphere.radiusM).toBe(episode.labels['/world/obstacles/0/radiusM']);
    expect(box.halfSizeM[2]).toBe(0.5 * (episode.labels['/world/obstacles/1/sizeM/2'] as number));
    expect(box.halfSizeM[0]).toBe(0.15);
    expect(cylinder.axis).toBe(2);
    expect(cylinder.halfLengthM).toBe(0.25);
    expect(episode.recording.substeps).toEqual({ accuracy: 0.1 });
    expect(episode.richardson).toBe(true);
  });

  it('kinetic friction above static on an obstacle is refused with its pointer and a fix', () => {
    const value = rockTank();
    value.world.obstacles[1].kineticFriction = 0.7;
    const checked = checkScenarioValue(value);
    expect(checked.ok).toBe(false);
    if (checked.ok) return;
    const problem = checked.problems.find((p) => p.pointer === '/world/obstacles/1/kineticFriction');
    expect(problem?.message).toMatch(/kinetic ≤ static/);
  });

  it('a box without sizeM, an unknown shape and accuracy 0 are each refused at their place', () => {
    const value = rockTank();
    delete value.world.obstacles[1].sizeM;
    value.world.obstacles[2].shape = 'cone';
    value.time.substeps = { accuracy: 0 };
    const checked = checkScenarioValue(value);
    expect(checked.ok).toBe(false);
    if (checked.ok) return;
    const pointers = checked.problems.map((p) => p.pointer);
    expect(pointers.some((p) => p.startsWith('/world/obstacles/1'))).toBe(true);
    expect(pointers.some((p) => p.startsWith('/world/obstacles/2'))).toBe(true);
    expect(pointers.some((p) => p.startsWith('/time/substeps'))).toBe(true);
  });
});

describe('substeps {accuracy}: a target the sub-step limit cannot meet is refused before any run', () => {
  it('accuracy 1e-6 on a stiff tether: a problem at /time/substeps/accuracy naming ω_max and the fixes', () => {
    const value = rockTank();
    value.system.axialStiffnessN = 1e6;
    value.time.substeps = { accuracy: 1e-6 };
    const checked = checkScenarioValue(value);
    expect(checked.ok).toBe(false);
    if (checked.ok) return;
    const problem = checked.problems.find((p) => p.pointer === '/time/substeps/accuracy');
    expect(problem?.message).toMatch(/ω_max = .* rad\/s.*Loosen the accuracy target/);
  });
});

describe('an episode with numerics and forces: arrays and /numerics labels', () => {
  it('energy_flows, the four force arrays and the balance and Richardson labels, with consistent shapes', () => {
    const checked = checkScenarioValue(rockTank());
    if (!checked.ok) throw new Error(JSON.stringify(checked.problems));
    const product = produceEpisode(checked.scenario, 1, 'float64', new ReplayTable([]));
    expect(product.record.status).toBe('ok');
    const arrays = new Map(product.arrays!.map((a) => [a.name, a]));
    const n = product.record.simulation.nodeCount;
    const e = product.record.simulation.springCount;
    expect(arrays.get('energies')!.shape).toEqual([31, ENERGY_TERMS.length]);
    expect(arrays.get('energy_flows')!.shape).toEqual([31, FLOW_COLUMNS.length]);
    expect(arrays.get('edge_tension')!.shape).toEqual([30, e]);
    for (const name of ['contact_normal_force', 'contact_friction_force', 'fluid_force']) expect(arrays.get(name)!.shape).toEqual([30, n, 3]);
    const labels = product.record.labels;
    // The work balance closes to rounding; the energy balance holds the integrator's error.
    expect(labels['/numerics/workBalanceResidualMaxJ'] as number).toBeLessThan(1e-10 * (labels['/numerics/energyScaleJ'] as number + 10));
    expect(labels['/numerics/energyBalanceResidualMaxJ'] as number).toBeGreaterThan(0);
    expect(labels['/numerics/richardsonSubstepCount']).toBe(2 * product.record.simulation.substeps);
    expect(labels['/numerics/richardsonPositionErrorMaxM'] as number).toBeGreaterThan(0);
    expect(labels['/numerics/richardsonPositionErrorRmsM'] as number).toBeLessThanOrEqual(labels['/numerics/richardsonPositionErrorMaxM'] as number);
  });

  it('with numerics.energyBalance false and no forces, no optional array is stored', () => {
    const value = rockTank();
    value.numerics = { energyBalance: false };
    value.export = {};
    const checked = checkScenarioValue(value);
    if (!checked.ok) throw new Error(JSON.stringify(checked.problems));
    const product = produceEpisode(checked.scenario, 0, 'float32', new ReplayTable([]));
    const names = product.arrays!.map((a) => a.name);
    for (const name of ['energy_flows', 'edge_tension', 'contact_normal_force', 'contact_friction_force', 'fluid_force']) expect(names).not.toContain(name);
    expect(Object.keys(product.record.labels).some((k) => k.startsWith('/numerics/'))).toBe(false);
  });
});
