// The forces of a step as a list of named terms for the energy ledger: what each force is, how
// its work is booked (a conservative force's work pairs with a potential-energy column, a
// control's work is an input, a dissipative force's negative work is energy dissipated), and
// a writer that produces the term's force alone at the start-of-step state. The hot step sums
// the same forces without this list; the ledger uses it only when accounting is on.
//
// To add a force: append one entry per part here (bending has two: its elastic part and its
// damping), with
// `potential` naming its column in energy.ts when it is conservative. The ledger, the
// `energy_flows` columns and both balances pick it up from this list.
import { BENDING_PART_DAMPING, BENDING_PART_ELASTIC, writeBendingForcePart } from './bending-force-parts.ts';
import { buoyantDensityKgPerM3 } from './energy.ts';
import { accumulateFluidDrag } from './fluid-drag.ts';
import type { Model } from './model.ts';
import { SPRING_PART_DAMPING, SPRING_PART_ELASTIC, writeSpringForcePart } from './spring-force-parts.ts';
import type { World } from './world.ts';

export type ForceRole = 'conservative' | 'input' | 'dissipative';

export interface ForceTermContext {
  model: Model;
  world: World;
  /** Per handle and axis, the control force of the current interval, N. */
  handleForceN: Float64Array;
}

export interface ForceTerm {
  /** Column name in `energy_flows`: "<name>_work" or "<name>_dissipated" by role. */
  readonly name: string;
  readonly role: ForceRole;
  /** Energy column this conservative force's work pairs with. */
  readonly potential?: string;
  readonly counts: string;
  /** Writes (not adds) the term's force on every node, N, 3 per node. */
  readonly write: (context: ForceTermContext, forceN: Float64Array) => void;
  /** False when the term is zero throughout for this model and world; the ledger then skips it. */
  readonly acts: (model: Model, world: World) => boolean;
}

const always = (): boolean => true;

function anyPositive(values: Float64Array): boolean {
  for (let j = 0; j < values.length; j++) if (values[j] !== 0) return true;
  return false;
}

function writeBodyTerm(context: ForceTermContext, forceN: Float64Array, kind: 0 | 1 | 2): void {
  const { model, world } = context;
  const g = world.gravityMPerS2;
  const v = model.velocityMPerS;
  const density = buoyantDensityKgPerM3(world);
  for (let i = 0; i < model.nodeCount; i++) {
    const o = 3 * i;
    if (model.inverseMassPerKg[i] === 0) {
      forceN[o] = 0; forceN[o + 1] = 0; forceN[o + 2] = 0;
      continue;
    }
    if (kind === 0) {
      const m = model.massKg[i];
      forceN[o] = m * g[0]; forceN[o + 1] = m * g[1]; forceN[o + 2] = m * g[2];
    } else if (kind === 1) {
      const w = -density * model.nodeVolumeM3[i];
      forceN[o] = w * g[0]; forceN[o + 1] = w * g[1]; forceN[o + 2] = w * g[2];
    } else {
      const c = -model.massKg[i] * world.airDragPerS;
      forceN[o] = c * v[o]; forceN[o + 1] = c * v[o + 1]; forceN[o + 2] = c * v[o + 2];
    }
  }
}

function writeHandleTerm(context: ForceTermContext, forceN: Float64Array): void {
  forceN.fill(0);
  const handles = context.model.handleNodes;
  for (let h = 0; h < handles.length; h++) {
    for (let k = 0; k < 3; k++) forceN[3 * handles[h] + k] += context.handleForceN[3 * h + k];
  }
}

function writeFluidTerm(context: ForceTermContext, forceN: Float64Array): void {
  forceN.fill(0);
  if (context.world.fluid.enabled && context.model.panelCount > 0) accumulateFluidDrag(context.model, context.world.fluid, forceN);
}

export const FORCE_TERMS: readonly ForceTerm[] = [
  {
    name: 'elastic', role: 'conservative', potential: 'elastic',
    counts: 'Hooke part k·(L − L0) of every spring force',
    write: (context, out) => writeSpringForcePart(context.model, SPRING_PART_ELASTIC, out),
    acts: (model) => model.springCount > 0,
  },
  {
    name: 'gravity', role: 'conservative', potential: 'gravitational',
    counts: 'm·g on every free node',
    write: (context, out) => writeBodyTerm(context, out, 0),
    acts: always,
  },
  {
    name: 'buoyancy', role: 'conservative', potential: 'buoyancy',
    counts: '−ρ_fluid·V·g on every free node when buoyancy acts',
    write: (context, out) => writeBodyTerm(context, out, 1),
    acts: (model, world) => buoyantDensityKgPerM3(world) > 0 && anyPositive(model.nodeVolumeM3),
  },
  {
    name: 'bending', role: 'conservative', potential: 'bending',
    counts: 'elastic part k·∂(½|w|²)/∂x of every hinge and clamp force (k = EI/ℓ, bending-forces.ts)',
    write: (context, out) => writeBendingForcePart(context.model, BENDING_PART_ELASTIC, out),
    acts: (model) => anyPositive(model.hingeStiffnessNm) || anyPositive(model.clampStiffnessNm),
  },
  {
    name: 'handle', role: 'input',
    counts: 'control forces on handle nodes',
    write: writeHandleTerm,
    acts: (model) => model.handleNodes.length > 0,
  },
  {
    name: 'spring_damping', role: 'dissipative',
    counts: 'damping part c·(Δv·n) of every spring force',
    write: (context, out) => writeSpringForcePart(context.model, SPRING_PART_DAMPING, out),
    acts: (model) => anyPositive(model.dampingNsPerM),
  },
  {
    name: 'bending_damping', role: 'dissipative',
    counts: 'damping part η·(w·ẇ)/|w|²·∂(½|w|²)/∂x of every hinge and clamp force (its power is bendingDissipationW)',
    write: (context, out) => writeBendingForcePart(context.model, BENDING_PART_DAMPING, out),
    acts: (model) => anyPositive(model.hingeDampingNms) || anyPositive(model.clampDampingNms),
  },
  {
    name: 'air_drag', role: 'dissipative',
    counts: 'mass-proportional drag −m·c·v on every free node',
    write: (context, out) => writeBodyTerm(context, out, 2),
    acts: (_model, world) => world.airDragPerS > 0,
  },
  {
    name: 'fluid_drag', role: 'dissipative',
    counts: 'resistive-force drag of the fluid on the surface panels',
    write: writeFluidTerm,
    acts: (model, world) => world.fluid.enabled && model.panelCount > 0,
  },
];

/** Column name of a force term in `energy_flows`. */
export function flowColumnName(term: ForceTerm): string {
  return term.role === 'dissipative' ? `${term.name}_dissipated` : `${term.name}_work`;
}
