// measureEnergies against values worked out by hand from the definitions: kinetic ½·m·v²,
// elastic ½·k·(L − L0)² per spring, gravitational −m·g·x for free nodes (Halliday & Resnick,
// Fundamentals of Physics, work and energy). Lengths use 3-4-5 triangles so every number is
// exact in decimal.
import { describe, expect, it } from 'vitest';

import { ENERGY_BASE_COUNT, ENERGY_NAMES, measureEnergies } from '../sim/core/energy.ts';
import { NODE_PINNED, RELATION_SECOND_NEIGHBOUR, RELATION_STRUCTURAL } from '../sim/core/model.ts';
import { ModelBuilder } from '../sim/core/model-builder.ts';
import { defaultWorld } from '../sim/core/world.ts';

describe('energies of a three-node system, worked by hand (Halliday & Resnick)', () => {
  // Node 0 pinned at (0, 0, 0), 2 kg, moving at 5 m/s (a support: no energy counted).
  // Node 1 free at (3, 4, 0), 0.5 kg, velocity (1, 2, 2) → |v|² = 9 → KE = ½·0.5·9 = 2.25 J.
  // Node 2 free at (3, 4, 12), 0.2 kg, velocity (0, −3, 4) → |v|² = 25 → KE = ½·0.2·25 = 2.5 J.
  // Spring 0–1: L = 5, L0 = 4, k = 10 → ½·10·1² = 5 J.
  // Spring 1–2: L = 12, L0 = 12.5, k = 40 → ½·40·0.25 = 5 J.
  // Spring 0–2: L = 13, L0 = 13, k = 7 → 0 J.
  // Gravity (0, −10, 0): −m·g·x = m·10·y: node 1 → 0.5·10·4 = 20 J, node 2 → 0.2·10·4 = 8 J.
  function tinySystem() {
    const builder = new ModelBuilder(8, 2, 0);
    builder.addNode({ positionM: [0, 0, 0], massKg: 2, flags: NODE_PINNED, velocityMPerS: [5, 0, 0] });
    builder.addNode({ positionM: [3, 4, 0], massKg: 0.5, velocityMPerS: [1, 2, 2] });
    builder.addNode({ positionM: [3, 4, 12], massKg: 0.2, velocityMPerS: [0, -3, 4] });
    builder.addSpring(0, 1, 10, 0.3, RELATION_STRUCTURAL, 4);
    builder.addSpring(1, 2, 40, 0.1, RELATION_STRUCTURAL, 12.5);
    builder.addSpring(0, 2, 7, 0, RELATION_SECOND_NEIGHBOUR);
    return builder.build();
  }

  it('kinetic 4.75 J, elastic 10 J, gravitational 28 J', () => {
    const model = tinySystem();
    expect(model.restLengthM[2]).toBe(13); // rest length defaults to the built distance
    const world = defaultWorld();
    world.gravityMPerS2 = [0, -10, 0];
    const out = new Float64Array(8).fill(Number.NaN);
    measureEnergies(model, world, out, 1);
    expect(ENERGY_NAMES).toEqual(['kinetic', 'elastic', 'gravitational', 'bending', 'buoyancy', 'support_kinetic']);
    expect(out[1]).toBeCloseTo(4.75, 14);
    expect(out[2]).toBeCloseTo(10, 13);
    expect(out[3]).toBeCloseTo(28, 13);
    // No hinges or clamps: no bending energy.
    expect(out[4]).toBe(0);
    // No fluid: no buoyancy energy.
    expect(out[5]).toBe(0);
    // The pinned node's ½·2·5² = 25 J is reported as support kinetic energy, apart from the rest.
    expect(out[6]).toBeCloseTo(25, 13);
    // Writes exactly its six slots at the offset.
    expect(Number.isNaN(out[0]) && Number.isNaN(out[7])).toBe(true);
    // With a count, only the first columns (the layout recorded without energy accounting).
    const base = new Float64Array(5).fill(Number.NaN);
    measureEnergies(model, world, base, 0, ENERGY_BASE_COUNT);
    expect(base[2]).toBeCloseTo(28, 13);
    expect(Number.isNaN(base[4])).toBe(true);
  });

  it('buoyancy +ρ·V·(g·x) of free nodes: 1000·(1e-4 + 2e-4)·(−10·4) = −12 J (Archimedes; Halliday & Resnick, fluids)', () => {
    const builder = new ModelBuilder(8, 2, 0);
    builder.addNode({ positionM: [0, 0, 0], massKg: 2, volumeM3: 5e-4, flags: NODE_PINNED });
    builder.addNode({ positionM: [3, 4, 0], massKg: 0.5, volumeM3: 1e-4 });
    builder.addNode({ positionM: [3, 4, 12], massKg: 0.2, volumeM3: 2e-4 });
    const model = builder.build();
    const world = defaultWorld();
    world.gravityMPerS2 = [0, -10, 0];
    world.fluid = { ...world.fluid, enabled: true, densityKgPerM3: 1000, buoyancy: true };
    const out = new Float64Array(6);
    measureEnergies(model, world, out, 0);
    expect(out[4]).toBeCloseTo(-12, 12);
    // Gravitational energy still counts the full mass: (0.5 + 0.2)·10·4 = 28 J.
    expect(out[2]).toBeCloseTo(28, 13);
    world.fluid.buoyancy = false;
    measureEnergies(model, world, out, 0);
    expect(out[4]).toBe(0);
  });

  it('tilted gravity (3, 0, −4) m/s²: gravitational −m·g·x = −(0.5·9) − (0.2·(9 − 48)) = 3.3 J', () => {
    const model = tinySystem();
    const world = defaultWorld();
    world.gravityMPerS2 = [3, 0, -4];
    const out = new Float64Array(3);
    measureEnergies(model, world, out, 0);
    expect(out[2]).toBeCloseTo(3.3, 13);
  });

  it('elastic energy is measured from the current (actuated) rest length, not the built one', () => {
    const model = tinySystem();
    // A rest length of 5 for spring 0–1 (as the actuation would set) removes its 5 J.
    model.restLengthM[0] = 5;
    const out = new Float64Array(3);
    measureEnergies(model, defaultWorld(), out, 0);
    expect(out[1]).toBeCloseTo(5, 13);
  });
});
