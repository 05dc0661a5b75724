// Energy diagnostics recorded at every record time, as a list of named terms (one column each
// of the `energies` array). Each term says exactly what it counts. The balance in
// energy-balance.ts adds the 'kinetic' and 'potential' terms and leaves the 'support' ones out:
// pinned and driven nodes move as prescribed, so their kinetic energy is supplied by the
// driver and is reported only for completeness.
//
// The first ENERGY_BASE_COUNT terms (kinetic, elastic, gravitational, bending) are the columns
// every dataset has carried since bending came in; the later ones (buoyancy, support_kinetic)
// are recorded only with numerics.energyBalance, so files made without it keep their bytes.
// To add a term: append one entry below with its own measure function; a potential energy
// must also have a force term in force-terms.ts whose work it pairs with.
import { bendingEnergyJ } from './bending-energy.ts';
import type { Model } from './model.ts';
import type { World } from './world.ts';

export type EnergyRole = 'kinetic' | 'potential' | 'support';

export interface EnergyTerm {
  /** Column name in the `energies` array. */
  readonly name: string;
  readonly unit: 'J';
  readonly role: EnergyRole;
  /** What exactly the term counts, quoted in LAYOUT.md, the manifest and the card. */
  readonly counts: string;
  /** The term's value for the model's current state, J. Not on the hot path (once per record). */
  readonly measure: (model: Model, world: World) => number;
}

function kineticJ(model: Model, supports: boolean): number {
  const v = model.velocityMPerS;
  const m = model.massKg;
  const invM = model.inverseMassPerKg;
  let kinetic = 0;
  for (let i = 0; i < model.nodeCount; i++) {
    if ((invM[i] === 0) !== supports) continue;
    const o = 3 * i;
    kinetic += 0.5 * m[i] * (v[o] * v[o] + v[o + 1] * v[o + 1] + v[o + 2] * v[o + 2]);
  }
  return kinetic;
}

function elasticJ(model: Model): number {
  const x = model.positionM;
  const a = model.springNodeA;
  const b = model.springNodeB;
  let elastic = 0;
  for (let s = 0; s < model.springCount; s++) {
    const ia = 3 * a[s];
    const ib = 3 * b[s];
    const dx = x[ib] - x[ia];
    const dy = x[ib + 1] - x[ia + 1];
    const dz = x[ib + 2] - x[ia + 2];
    const stretch = Math.sqrt(dx * dx + dy * dy + dz * dz) - model.restLengthM[s];
    elastic += 0.5 * model.stiffnessNPerM[s] * stretch * stretch;
  }
  return elastic;
}

/** −Σ w_i·(g·x_i) over free nodes, with w_i the mass (gravity) or −ρ_f·V_i (buoyancy). */
function heightPotentialJ(model: Model, world: World, buoyancy: boolean): number {
  const x = model.positionM;
  const m = model.massKg;
  const volume = model.nodeVolumeM3;
  const invM = model.inverseMassPerKg;
  const gx = world.gravityMPerS2[0];
  const gy = world.gravityMPerS2[1];
  const gz = world.gravityMPerS2[2];
  const density = buoyancy ? buoyantDensityKgPerM3(world) : 0;
  if (buoyancy && density === 0) return 0;
  let potential = 0;
  for (let i = 0; i < model.nodeCount; i++) {
    if (invM[i] === 0) continue;
    const o = 3 * i;
    const weightKg = buoyancy ? -density * volume[i] : m[i];
    potential -= weightKg * (gx * x[o] + gy * x[o + 1] + gz * x[o + 2]);
  }
  return potential;
}

/** Density of the fluid whose buoyancy acts, kg/m³; 0 when there is none. */
export function buoyantDensityKgPerM3(world: World): number {
  return world.fluid.enabled && world.fluid.buoyancy ? world.fluid.densityKgPerM3 : 0;
}

export const ENERGY_TERMS: readonly EnergyTerm[] = [
  {
    name: 'kinetic', unit: 'J', role: 'kinetic',
    counts: '½·m·|v|² summed over free nodes (pinned and driven nodes are in support_kinetic)',
    measure: (model) => kineticJ(model, false),
  },
  {
    name: 'elastic', unit: 'J', role: 'potential',
    counts: '½·k·(L − L0)² summed over every spring, L0 the current (actuated) rest length; springs to pinned or driven nodes included',
    measure: elasticJ,
  },
  {
    name: 'gravitational', unit: 'J', role: 'potential',
    counts: '−m·(g·x) summed over free nodes, the full node mass (buoyancy is its own column); zero at x = 0',
    measure: (model, world) => heightPotentialJ(model, world, false),
  },
  {
    name: 'bending', unit: 'J', role: 'potential',
    counts: '½·k·|w|² = k·(1 − cos φ) summed over hinges (w the change of unit tangent, φ the turning angle) and clamps (angle to the clamped direction), k = EI/ℓ (bending-energy.ts); 0 for chains without bending rigidity and for lattices',
    measure: (model) => (model.hingeCount + model.clampCount > 0 ? bendingEnergyJ(model, model.positionM) : 0),
  },
  {
    name: 'buoyancy', unit: 'J', role: 'potential',
    counts: '+ρ_fluid·V·(g·x) summed over free nodes, V the displaced volume per node; 0 without a fluid or with buoyancy off',
    measure: (model, world) => heightPotentialJ(model, world, true),
  },
  {
    name: 'support_kinetic', unit: 'J', role: 'support',
    counts: '½·m·|v|² summed over pinned and driven nodes (prescribed motion; not part of the energy balance)',
    measure: (model) => kineticJ(model, true),
  },
];

export const ENERGY_NAMES: readonly string[] = ENERGY_TERMS.map((term) => term.name);
export const ENERGY_TERM_COUNT = ENERGY_TERMS.length;
/** Columns recorded without numerics.energyBalance: kinetic, elastic, gravitational, bending. */
export const ENERGY_BASE_COUNT = 4;

/** Writes the first `count` terms of ENERGY_TERMS (all by default), in order, in J, into out at offset. */
export function measureEnergies(model: Model, world: World, out: Float64Array, offset: number, count: number = ENERGY_TERM_COUNT): void {
  for (let t = 0; t < count; t++) out[offset + t] = ENERGY_TERMS[t].measure(model, world);
}
