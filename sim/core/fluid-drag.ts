// Resistive-force drag on the body's outer surface (Gray & Hancock 1955, resistive-force
// theory): each panel feels −A·(C_n·v_n + C_t·v_t), with v_n and v_t the normal and tangential
// parts of its velocity relative to the flow. C_n > C_t is what lets an undulating body swim.
// Segment panels (chains, 2-D outlines) use their axis: tangential is along the segment and
// A = length × width. Quad panels use their normal: A is the quad's area.
import type { Model } from './model.ts';
import type { FluidSettings } from './world.ts';

export function accumulateFluidDrag(model: Model, fluid: FluidSettings, forceN: Float64Array): void {
  if (model.panelNodeCount === 2) accumulateSegmentDrag(model, fluid, forceN);
  else accumulateQuadDrag(model, fluid, forceN);
}

function accumulateSegmentDrag(model: Model, fluid: FluidSettings, forceN: Float64Array): void {
  const x = model.positionM;
  const v = model.velocityMPerS;
  const p = model.panelNodes;
  const cn = fluid.normalDragNsPerM3;
  const ct = fluid.tangentialDragNsPerM3;
  const fx0 = fluid.flowVelocityMPerS[0];
  const fy0 = fluid.flowVelocityMPerS[1];
  const fz0 = fluid.flowVelocityMPerS[2];
  const width = model.panelWidthM;
  const count = model.panelCount;
  for (let q = 0; q < count; q++) {
    const ia = 3 * p[2 * q];
    const ib = 3 * p[2 * q + 1];
    const dx = x[ib] - x[ia];
    const dy = x[ib + 1] - x[ia + 1];
    const dz = x[ib + 2] - x[ia + 2];
    const length = Math.sqrt(dx * dx + dy * dy + dz * dz);
    if (length === 0) continue;
    const tx = dx / length;
    const ty = dy / length;
    const tz = dz / length;
    const ux = 0.5 * (v[ia] + v[ib]) - fx0;
    const uy = 0.5 * (v[ia + 1] + v[ib + 1]) - fy0;
    const uz = 0.5 * (v[ia + 2] + v[ib + 2]) - fz0;
    const ut = ux * tx + uy * ty + uz * tz;
    const area = length * width;
    // −A·(C_t·v_t + C_n·(v − v_t)), shared equally by the two end nodes.
    const half = 0.5 * area;
    const fx = -half * (ct * ut * tx + cn * (ux - ut * tx));
    const fy = -half * (ct * ut * ty + cn * (uy - ut * ty));
    const fz = -half * (ct * ut * tz + cn * (uz - ut * tz));
    forceN[ia] += fx;
    forceN[ia + 1] += fy;
    forceN[ia + 2] += fz;
    forceN[ib] += fx;
    forceN[ib + 1] += fy;
    forceN[ib + 2] += fz;
  }
}

function accumulateQuadDrag(model: Model, fluid: FluidSettings, forceN: Float64Array): void {
  const x = model.positionM;
  const v = model.velocityMPerS;
  const p = model.panelNodes;
  const cn = fluid.normalDragNsPerM3;
  const ct = fluid.tangentialDragNsPerM3;
  const fx0 = fluid.flowVelocityMPerS[0];
  const fy0 = fluid.flowVelocityMPerS[1];
  const fz0 = fluid.flowVelocityMPerS[2];
  const count = model.panelCount;
  for (let q = 0; q < count; q++) {
    const i0 = 3 * p[4 * q];
    const i1 = 3 * p[4 * q + 1];
    const i2 = 3 * p[4 * q + 2];
    const i3 = 3 * p[4 * q + 3];
    // Normal and area from the cross product of the diagonals (exact for planar quads).
    const ax = x[i2] - x[i0];
    const ay = x[i2 + 1] - x[i0 + 1];
    const az = x[i2 + 2] - x[i0 + 2];
    const bx = x[i3] - x[i1];
    const by = x[i3 + 1] - x[i1 + 1];
    const bz = x[i3 + 2] - x[i1 + 2];
    const cx = ay * bz - az * by;
    const cy = az * bx - ax * bz;
    const cz = ax * by - ay * bx;
    const cross = Math.sqrt(cx * cx + cy * cy + cz * cz);
    if (cross === 0) continue;
    const area = 0.5 * cross;
    const nx = cx / cross;
    const ny = cy / cross;
    const nz = cz / cross;
    const ux = 0.25 * (v[i0] + v[i1] + v[i2] + v[i3]) - fx0;
    const uy = 0.25 * (v[i0 + 1] + v[i1 + 1] + v[i2 + 1] + v[i3 + 1]) - fy0;
    const uz = 0.25 * (v[i0 + 2] + v[i1 + 2] + v[i2 + 2] + v[i3 + 2]) - fz0;
    const un = ux * nx + uy * ny + uz * nz;
    const quarter = 0.25 * area;
    const fx = -quarter * (cn * un * nx + ct * (ux - un * nx));
    const fy = -quarter * (cn * un * ny + ct * (uy - un * ny));
    const fz = -quarter * (cn * un * nz + ct * (uz - un * nz));
    forceN[i0] += fx; forceN[i0 + 1] += fy; forceN[i0 + 2] += fz;
    forceN[i1] += fx; forceN[i1 + 1] += fy; forceN[i1 + 2] += fz;
    forceN[i2] += fx; forceN[i2 + 1] += fy; forceN[i2 + 2] += fz;
    forceN[i3] += fx; forceN[i3 + 1] += fy; forceN[i3 + 2] += fz;
  }
}
