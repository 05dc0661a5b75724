// Ground plane y = h with a normal response and Coulomb friction, applied as a velocity
// projection after the velocity update of semi-implicit Euler. A node that would pass below
// the plane in this step gets exactly the normal velocity that lands it on the plane (no
// penalty spring, so no stiffness to limit the time step and no bounce); the normal velocity
// change Δv_n then bounds friction: the node sticks if |v_t| ≤ μ_s·Δv_n, otherwise its
// tangential speed drops by μ_k·Δv_n. Over a step this is the impulse form of Coulomb's law.
import type { Model } from './model.ts';
import type { GroundSettings } from './world.ts';

/** normalDv and frictionDv, when given, receive the velocity changes (added, 3 per node) for the energy ledger. */
export function projectGroundContact(
  model: Model,
  ground: GroundSettings,
  dtS: number,
  normalDv: Float64Array | null = null,
  frictionDv: Float64Array | null = null,
): void {
  const x = model.positionM;
  const v = model.velocityMPerS;
  const invM = model.inverseMassPerKg;
  const h = ground.heightM;
  const muS = ground.staticFriction;
  const muK = ground.kineticFriction;
  const n = model.nodeCount;
  for (let i = 0; i < n; i++) {
    if (invM[i] === 0) continue;
    const o = 3 * i;
    const y = x[o + 1];
    const vy = v[o + 1];
    if (y + dtS * vy >= h) continue;
    // Land on the plane; a node already below it is lifted no faster than to the plane.
    const landing = y < h ? 0 : (h - y) / dtS;
    const dvn = landing - vy;
    v[o + 1] = landing;
    const vx = v[o];
    const vz = v[o + 2];
    const speed = Math.sqrt(vx * vx + vz * vz);
    if (speed <= muS * dvn) {
      v[o] = 0;
      v[o + 2] = 0;
    } else {
      // Kinetic friction can stop a sliding node but never reverse it (matters when μ_k > μ_s).
      const scale = Math.max(0, 1 - (muK * dvn) / speed);
      v[o] = vx * scale;
      v[o + 2] = vz * scale;
    }
    if (normalDv !== null && frictionDv !== null) {
      normalDv[o + 1] += dvn;
      frictionDv[o] += v[o] - vx;
      frictionDv[o + 2] += v[o + 2] - vz;
    }
    if (y < h) x[o + 1] = h;
  }
}
