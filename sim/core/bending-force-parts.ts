// The bending force of bending-forces.ts taken apart for the energy ledger: the elastic part
// (s = k, conservative, its work pairs with the `bending` energy) and the damping part
// (s = η·(w·ẇ)/|w|², whose negative work is the dissipation bendingDissipationW measures), for
// hinges and clamps together. Same geometry and operation order as the hot loop, so the two
// parts add up to the summed force to rounding. Runs only when energy accounting is on.
import { STRAIGHT_HINGE_W2 } from './bending-forces.ts';
import type { Model } from './model.ts';

export const BENDING_PART_ELASTIC = 0;
export const BENDING_PART_DAMPING = 1;

/** Writes (not adds) the chosen part of every hinge's and clamp's force on its nodes, N, 3 per node. */
export function writeBendingForcePart(model: Model, part: number, forceN: Float64Array): void {
  forceN.fill(0);
  const x = model.positionM;
  const v = model.velocityMPerS;
  const nodes = model.hingeNodes;
  for (let h = 0; h < model.hingeCount; h++) {
    const ip = 3 * nodes[3 * h];
    const im = 3 * nodes[3 * h + 1];
    const iN = 3 * nodes[3 * h + 2];
    const eax = x[im] - x[ip];
    const eay = x[im + 1] - x[ip + 1];
    const eaz = x[im + 2] - x[ip + 2];
    const ebx = x[iN] - x[im];
    const eby = x[iN + 1] - x[im + 1];
    const ebz = x[iN + 2] - x[im + 2];
    const la = Math.sqrt(eax * eax + eay * eay + eaz * eaz);
    const lb = Math.sqrt(ebx * ebx + eby * eby + ebz * ebz);
    if (la === 0 || lb === 0) continue;
    const ila = 1 / la;
    const ilb = 1 / lb;
    const tax = eax * ila;
    const tay = eay * ila;
    const taz = eaz * ila;
    const tbx = ebx * ilb;
    const tby = eby * ilb;
    const tbz = ebz * ilb;
    const cosPhi = tax * tbx + tay * tby + taz * tbz;
    const uax = (tbx - cosPhi * tax) * ila;
    const uay = (tby - cosPhi * tay) * ila;
    const uaz = (tbz - cosPhi * taz) * ila;
    const ubx = (tax - cosPhi * tbx) * ilb;
    const uby = (tay - cosPhi * tby) * ilb;
    const ubz = (taz - cosPhi * tbz) * ilb;
    let s: number;
    if (part === BENDING_PART_ELASTIC) {
      s = model.hingeStiffnessNm[h];
    } else {
      const damping = model.hingeDampingNms[h];
      const wx = tbx - tax;
      const wy = tby - tay;
      const wz = tbz - taz;
      const w2 = wx * wx + wy * wy + wz * wz;
      if (damping === 0 || w2 <= STRAIGHT_HINGE_W2) continue;
      const wDot =
        -(uax * (v[im] - v[ip]) + uay * (v[im + 1] - v[ip + 1]) + uaz * (v[im + 2] - v[ip + 2]) +
          (ubx * (v[iN] - v[im]) + uby * (v[iN + 1] - v[im + 1]) + ubz * (v[iN + 2] - v[im + 2])));
      s = (damping * wDot) / w2;
    }
    forceN[ip] -= s * uax;
    forceN[ip + 1] -= s * uay;
    forceN[ip + 2] -= s * uaz;
    forceN[im] += s * (uax - ubx);
    forceN[im + 1] += s * (uay - uby);
    forceN[im + 2] += s * (uaz - ubz);
    forceN[iN] += s * ubx;
    forceN[iN + 1] += s * uby;
    forceN[iN + 2] += s * ubz;
  }
  const clamps = model.clampNodes;
  const d = model.clampDirectionUnit;
  for (let q = 0; q < model.clampCount; q++) {
    const ia = 3 * clamps[2 * q];
    const ib = 3 * clamps[2 * q + 1];
    const ex = x[ib] - x[ia];
    const ey = x[ib + 1] - x[ia + 1];
    const ez = x[ib + 2] - x[ia + 2];
    const length = Math.sqrt(ex * ex + ey * ey + ez * ez);
    if (length === 0) continue;
    const il = 1 / length;
    const tx = ex * il;
    const ty = ey * il;
    const tz = ez * il;
    const dx = d[3 * q];
    const dy = d[3 * q + 1];
    const dz = d[3 * q + 2];
    const cosPhi = tx * dx + ty * dy + tz * dz;
    const ux = (dx - cosPhi * tx) * il;
    const uy = (dy - cosPhi * ty) * il;
    const uz = (dz - cosPhi * tz) * il;
    let s: number;
    if (part === BENDING_PART_ELASTIC) {
      s = model.clampStiffnessNm[q];
    } else {
      const damping = model.clampDampingNms[q];
      const wx = tx - dx;
      const wy = ty - dy;
      const wz = tz - dz;
      const w2 = wx * wx + wy * wy + wz * wz;
      if (damping === 0 || w2 <= STRAIGHT_HINGE_W2) continue;
      const wDot = -(ux * (v[ib] - v[ia]) + uy * (v[ib + 1] - v[ia + 1]) + uz * (v[ib + 2] - v[ia + 2]));
      s = (damping * wDot) / w2;
    }
    forceN[ia] -= s * ux;
    forceN[ia + 1] -= s * uy;
    forceN[ia + 2] -= s * uz;
    forceN[ib] += s * ux;
    forceN[ib + 1] += s * uy;
    forceN[ib + 2] += s * uz;
  }
}
