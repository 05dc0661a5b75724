// Bending of chains by the turning angle between neighbouring segments: the discrete curvature
// of a polyline (as in discrete elastic rods, Bergou et al., SIGGRAPH 2008, with the simpler
// 2(1 − cos φ) measure of curvature squared). A hinge at node m between segments
// e_a = x_m − x_p and e_b = x_n − x_m, unit tangents t_a, t_b and w = t_b − t_a, stores
//   E = ½·k·|w|² = k·(1 − cos φ),   k = EI / ℓ̄  (ℓ̄ the Voronoi length of node m),
// which is ½·EI·κ²·ℓ̄ with κ² = 2(1 − cos φ)/ℓ̄² → (φ/ℓ̄)² for small angles (Euler–Bernoulli).
// With u_a = (t_b − cos φ·t_a)/|e_a| and u_b = (t_a − cos φ·t_b)/|e_b|, ∂|w|²/2 ∂x is u_a at p,
// u_b − u_a at m and −u_b at n, so the elastic force is −k times that.
//
// Damping is a Rayleigh dissipation D = ½·η·(d|w|/dt)²: it damps the rate at which the bend
// opens or closes and nothing else, so rigid motion (translation, rotation of a bent hinge) is
// never damped. Its force is along the same vector as the elastic one, so the total is
//   F = −s·(∂|w|²/2 ∂x),   s = k + η·(w·ẇ)/|w|²,   w·ẇ = −(u_a·ė_a + u_b·ė_b),
// and the power it dissipates is η·(w·ẇ)²/|w|² (bendingDissipationW in bending-energy.ts).
//
// A clamp holds one segment e = x_b − x_a along a fixed unit vector d the same way, with
// w = t − d, u = (d − cos φ·t)/|e|: elastic gradient −u at b and u at a.
//
// Hot loop: flat arrays, no allocation; the operation order is plain so a WebAssembly kernel
// can repeat it bit for bit.
import type { Model } from './model.ts';

/**
 * Below this |w|² (turning angle about 1e-14 rad) w is rounding noise and its direction
 * meaningless, so the damping term is left out; the elastic force there is zero anyway.
 */
export const STRAIGHT_HINGE_W2 = 1e-28;

export function accumulateBendingForces(model: Model, forceN: Float64Array): void {
  const x = model.positionM;
  const v = model.velocityMPerS;
  const nodes = model.hingeNodes;
  const k = model.hingeStiffnessNm;
  const eta = model.hingeDampingNms;
  const count = model.hingeCount;
  for (let h = 0; h < count; h++) {
    const ip = (3 * nodes[3 * h]) | 0;
    const im = (3 * nodes[3 * h + 1]) | 0;
    const iN = (3 * nodes[3 * h + 2]) | 0;
    const eax = x[im] - x[ip];
    const eay = x[im + 1] - x[ip + 1];
    const eaz = x[im + 2] - x[ip + 2];
    const ebx = x[iN] - x[im];
    const eby = x[iN + 1] - x[im + 1];
    const ebz = x[iN + 2] - x[im + 2];
    const la = Math.sqrt(eax * eax + eay * eay + eaz * eaz);
    const lb = Math.sqrt(ebx * ebx + eby * eby + ebz * ebz);
    if (la === 0 || lb === 0) continue; // no tangent; the blow-up check reports coincident nodes
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
    let s = k[h];
    const damping = eta[h];
    if (damping > 0) {
      const wx = tbx - tax;
      const wy = tby - tay;
      const wz = tbz - taz;
      const w2 = wx * wx + wy * wy + wz * wz;
      if (w2 > STRAIGHT_HINGE_W2) {
        const wDot =
          -(uax * (v[im] - v[ip]) + uay * (v[im + 1] - v[ip + 1]) + uaz * (v[im + 2] - v[ip + 2]) +
            (ubx * (v[iN] - v[im]) + uby * (v[iN + 1] - v[im + 1]) + ubz * (v[iN + 2] - v[im + 2])));
        s += (damping * wDot) / w2;
      }
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
}

export function accumulateClampForces(model: Model, forceN: Float64Array): void {
  const x = model.positionM;
  const v = model.velocityMPerS;
  const nodes = model.clampNodes;
  const d = model.clampDirectionUnit;
  const k = model.clampStiffnessNm;
  const eta = model.clampDampingNms;
  const count = model.clampCount;
  for (let q = 0; q < count; q++) {
    const ia = (3 * nodes[2 * q]) | 0;
    const ib = (3 * nodes[2 * q + 1]) | 0;
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
    let s = k[q];
    const damping = eta[q];
    if (damping > 0) {
      const wx = tx - dx;
      const wy = ty - dy;
      const wz = tz - dz;
      const w2 = wx * wx + wy * wy + wz * wz;
      if (w2 > STRAIGHT_HINGE_W2) {
        const wDot = -(ux * (v[ib] - v[ia]) + uy * (v[ib + 1] - v[ia + 1]) + uz * (v[ib + 2] - v[ia + 2]));
        s += (damping * wDot) / w2;
      }
    }
    forceN[ia] -= s * ux;
    forceN[ia + 1] -= s * uy;
    forceN[ia + 2] -= s * uz;
    forceN[ib] += s * ux;
    forceN[ib + 1] += s * uy;
    forceN[ib + 2] += s * uz;
  }
}
