// A chain's start shape as a planar curve instead of the built straight line: node 0 stays
// where it is (pinned, driven or free) and every further node is placed on the curve one
// structural rest length (a chord) from the one before, so every structural spring starts at
// its rest length. Second-neighbour springs, bending hinges and clamps start strained: that
// is what a bent start is for. The curve lies in the plane of the chain's direction d (node 0
// to node 1 of the built line) and the bend direction p (bendDirectionUnit made perpendicular
// to d), in local coordinates u along d and w along p:
// - arc: a circle of curvature κ (1/m, negative bends towards −p) tangent to d at node 0, so
//   node j lies at turning angle j·Δ with Δ = 2·asin(a·|κ|/2) (the chord of a circle; common
//   geometry, no source): needs a·|κ| ≤ 2, checked; a chain longer than the circle winds round
//   it again (there is no self-contact);
// - sine: w(u) = A·(sin(2π·u/λ + φ) − sin φ), so w(0) = 0; node j + 1 is the point of the curve
//   at distance a from node j with u between u_j and u_j + a, found by bisection (the distance
//   is −a short of it at u_j and at least 0 past it at u_j + a, so a root lies between).
import type { Model } from '../core/model.ts';
import { RELATION_STRUCTURAL } from '../core/model.ts';
import { ScenarioProblemError } from './scenario-problem.ts';

export type ResolvedStartCurve =
  | { kind: 'arc'; curvaturePerM: number; bendDirectionUnit: [number, number, number] }
  | { kind: 'sine'; amplitudeM: number; wavelengthM: number; phaseRad: number; bendDirectionUnit: [number, number, number] };

/** Bend directions closer than this (sine of the angle) to the chain's direction have no plane. */
const PARALLEL_SINE = 1e-9;
const BISECTION_STEPS = 200;

/** The chain's unit direction and its structural rest length, from nodes 0 and 1 of the built line. */
export function chainLine(model: Model): { directionUnit: number[]; segmentM: number } {
  const x = model.positionM;
  const d = [x[3] - x[0], x[4] - x[1], x[5] - x[2]];
  const length = Math.hypot(d[0], d[1], d[2]);
  let segmentM = length;
  for (let s = 0; s < model.springCount; s++) {
    if (model.springRelation[s] !== RELATION_STRUCTURAL) continue;
    if (Math.min(model.springNodeA[s], model.springNodeB[s]) === 0 && Math.max(model.springNodeA[s], model.springNodeB[s]) === 1) segmentM = model.restLengthM[s];
  }
  return { directionUnit: d.map((c) => c / length), segmentM };
}

/** The bend direction made perpendicular to d and normalised, or null when it is along d. */
export function bendPlaneUnit(directionUnit: readonly number[], bend: readonly number[]): number[] | null {
  const along = bend[0] * directionUnit[0] + bend[1] * directionUnit[1] + bend[2] * directionUnit[2];
  const p = [0, 1, 2].map((k) => bend[k] - along * directionUnit[k]);
  const length = Math.hypot(p[0], p[1], p[2]);
  const bendLength = Math.hypot(bend[0], bend[1], bend[2]);
  if (!(bendLength > 0) || !(length > PARALLEL_SINE * bendLength)) return null;
  return p.map((c) => c / length);
}

/** Lays a chain's nodes 1 … N on the curve (node 0 and the node order stay). */
export function applyStartCurve(model: Model, curve: ResolvedStartCurve): void {
  const { directionUnit: d, segmentM: a } = chainLine(model);
  const p = bendPlaneUnit(d, curve.bendDirectionUnit);
  if (p === null) {
    throw new ScenarioProblemError([{ pointer: '/initialState/curve/bendDirectionUnit', message: `is along the chain's direction (${d.map((c) => Number(c.toPrecision(6))).join(', ')}), so it gives no plane to bend in; give a direction across the chain, e.g. [1, 0, 0] for a chain hanging along y` }]);
  }
  const x = model.positionM;
  const origin = [x[0], x[1], x[2]];
  const place = (j: number, u: number, w: number): void => {
    for (let k = 0; k < 3; k++) x[3 * j + k] = origin[k] + u * d[k] + w * p[k];
  };
  if (curve.kind === 'arc') {
    const kappa = curve.curvaturePerM;
    for (let j = 1; j < model.nodeCount; j++) {
      if (kappa === 0) {
        place(j, j * a, 0);
        continue;
      }
      const radius = 1 / Math.abs(kappa);
      const angle = j * 2 * Math.asin(Math.min(1, (a * Math.abs(kappa)) / 2));
      place(j, radius * Math.sin(angle), Math.sign(kappa) * radius * (1 - Math.cos(angle)));
    }
    return;
  }
  const { amplitudeM, wavelengthM, phaseRad } = curve;
  const offset = (u: number): number => amplitudeM * (Math.sin((2 * Math.PI * u) / wavelengthM + phaseRad) - Math.sin(phaseRad));
  let u0 = 0;
  let w0 = 0;
  for (let j = 1; j < model.nodeCount; j++) {
    let low = u0;
    let high = u0 + a;
    for (let step = 0; step < BISECTION_STEPS; step++) {
      const middle = 0.5 * (low + high);
      if (middle === low || middle === high) break;
      if (Math.hypot(middle - u0, offset(middle) - w0) < a) low = middle;
      else high = middle;
    }
    u0 = high;
    w0 = offset(high);
    place(j, u0, w0);
  }
}
