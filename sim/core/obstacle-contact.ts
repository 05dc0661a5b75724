// Contact with static rigid obstacles (axis-aligned boxes, spheres, cylinders along an axis),
// the same velocity projection and Coulomb friction as ground-contact.ts, with the plane taken
// tangent to the obstacle at the point of its surface nearest the node: a node whose next
// position x + dt·v would cross that plane gets exactly the normal velocity that lands it on
// it, and the normal velocity change bounds friction (stick if |v_t| ≤ μ_s·Δv_n, else slow
// by μ_k·Δv_n, never reverse). A node found inside is lifted no faster than to the surface and
// put on it. Nodes do not collide with each other (no self-contact) and obstacles do not move.
import type { Model } from './model.ts';
import type { Obstacle } from './world.ts';

/**
 * Writes into out[0..3] the outward unit normal at the surface point nearest p and returns the
 * signed distance of p from the surface (negative inside), m.
 */
export function obstacleDistanceM(obstacle: Obstacle, px: number, py: number, pz: number, out: Float64Array): number {
  const c = obstacle.centerM;
  const dx = px - c[0];
  const dy = py - c[1];
  const dz = pz - c[2];
  if (obstacle.shape === 'sphere') {
    const r = Math.sqrt(dx * dx + dy * dy + dz * dz);
    if (r === 0) {
      out[0] = 0; out[1] = 1; out[2] = 0;
    } else {
      out[0] = dx / r; out[1] = dy / r; out[2] = dz / r;
    }
    return r - obstacle.radiusM;
  }
  if (obstacle.shape === 'box') {
    const h = obstacle.halfSizeM;
    const qx = Math.abs(dx) - h[0];
    const qy = Math.abs(dy) - h[1];
    const qz = Math.abs(dz) - h[2];
    if (qx > 0 || qy > 0 || qz > 0) {
      const ox = qx > 0 ? qx * Math.sign(dx) : 0;
      const oy = qy > 0 ? qy * Math.sign(dy) : 0;
      const oz = qz > 0 ? qz * Math.sign(dz) : 0;
      const d = Math.sqrt(ox * ox + oy * oy + oz * oz);
      out[0] = ox / d; out[1] = oy / d; out[2] = oz / d;
      return d;
    }
    // Inside: out through the nearest face (ties go to y, then x, so a top face wins).
    out[0] = 0; out[1] = 0; out[2] = 0;
    if (qy >= qx && qy >= qz) {
      out[1] = dy >= 0 ? 1 : -1;
      return qy;
    }
    if (qx >= qz) {
      out[0] = dx >= 0 ? 1 : -1;
      return qx;
    }
    out[2] = dz >= 0 ? 1 : -1;
    return qz;
  }
  // Cylinder: a 2-D box in (radial distance, axial distance).
  const axis = obstacle.axis;
  const along = axis === 0 ? dx : axis === 1 ? dy : dz;
  const ux = axis === 0 ? 0 : dx;
  const uy = axis === 1 ? 0 : dy;
  const uz = axis === 2 ? 0 : dz;
  const rho = Math.sqrt(ux * ux + uy * uy + uz * uz);
  const qr = rho - obstacle.radiusM;
  const qa = Math.abs(along) - obstacle.halfLengthM;
  const rx = rho > 0 ? ux / rho : axis === 1 ? 1 : 0;
  const ry = rho > 0 ? uy / rho : axis === 1 ? 0 : 1;
  const rz = rho > 0 ? uz / rho : 0;
  const sa = along >= 0 ? 1 : -1;
  const ax = axis === 0 ? sa : 0;
  const ay = axis === 1 ? sa : 0;
  const az = axis === 2 ? sa : 0;
  if (qr > 0 || qa > 0) {
    const or = qr > 0 ? qr : 0;
    const oa = qa > 0 ? qa : 0;
    const d = Math.sqrt(or * or + oa * oa);
    out[0] = (or * rx + oa * ax) / d;
    out[1] = (or * ry + oa * ay) / d;
    out[2] = (or * rz + oa * az) / d;
    return d;
  }
  if (qa >= qr) {
    out[0] = ax; out[1] = ay; out[2] = az;
    return qa;
  }
  out[0] = rx; out[1] = ry; out[2] = rz;
  return qr;
}

/**
 * Projects every free node's velocity against every obstacle. normalDv and frictionDv, when
 * given, receive the velocity changes (added, 3 per node) for the energy ledger.
 */
export function projectObstacleContact(
  model: Model,
  obstacles: readonly Obstacle[],
  dtS: number,
  normal: Float64Array,
  normalDv: Float64Array | null = null,
  frictionDv: Float64Array | null = null,
): void {
  const x = model.positionM;
  const v = model.velocityMPerS;
  const invM = model.inverseMassPerKg;
  for (let b = 0; b < obstacles.length; b++) {
    const obstacle = obstacles[b];
    const muS = obstacle.staticFriction;
    const muK = obstacle.kineticFriction;
    for (let i = 0; i < model.nodeCount; i++) {
      if (invM[i] === 0) continue;
      const o = 3 * i;
      const gap = obstacleDistanceM(obstacle, x[o], x[o + 1], x[o + 2], normal);
      const nx = normal[0];
      const ny = normal[1];
      const nz = normal[2];
      const vn = v[o] * nx + v[o + 1] * ny + v[o + 2] * nz;
      if (gap + dtS * vn >= 0) continue;
      const landing = gap < 0 ? 0 : -gap / dtS;
      const dvn = landing - vn;
      const tx = v[o] - vn * nx;
      const ty = v[o + 1] - vn * ny;
      const tz = v[o + 2] - vn * nz;
      const speed = Math.sqrt(tx * tx + ty * ty + tz * tz);
      const scale = speed <= muS * dvn ? 0 : Math.max(0, 1 - (muK * dvn) / speed);
      const nvx = landing * nx + scale * tx;
      const nvy = landing * ny + scale * ty;
      const nvz = landing * nz + scale * tz;
      if (normalDv !== null && frictionDv !== null) {
        normalDv[o] += dvn * nx;
        normalDv[o + 1] += dvn * ny;
        normalDv[o + 2] += dvn * nz;
        frictionDv[o] += (scale - 1) * tx;
        frictionDv[o + 1] += (scale - 1) * ty;
        frictionDv[o + 2] += (scale - 1) * tz;
      }
      v[o] = nvx;
      v[o + 1] = nvy;
      v[o + 2] = nvz;
      if (gap < 0) {
        x[o] -= gap * nx;
        x[o + 1] -= gap * ny;
        x[o + 2] -= gap * nz;
      }
    }
  }
}
