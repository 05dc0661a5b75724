// The linear regression of the grey-box model for one episode. Newton's law for free node i,
// integrated by semi-implicit Euler (sim/core/simulator.ts), gives per interval
//   m_i·(v_{t+1} − v_t)/Δt = Σ_s k_r(s)·(L_s − L0_s)·n_s + Σ_s c_r(s)·√(μ_s/μ̄_r)·(Δv_s·n_s)·n_s
//                            + m_i·g − λ·m_i·v_i + (fluid drag on the node's segments),
// every term linear in one unknown coefficient: per spring relation r a stiffness k_r and a
// damping c_r (the damping of a spring of that relation with the relation's median reduced
// mass μ̄_r; Pliant sets c = 2ζ√(kμ), so spring dampings scale with √μ), the apparent gravity
// g (weight net of buoyancy, per unit mass), the air-drag rate λ and, for chains in a fluid,
// the resistive-force coefficients times the chain's width, C_n·w and C_t·w. With one sub-step
// per record interval the forces are those of the recorded state at t, exactly. With s > 1
// sub-steps, Δv is dt·Σ_j F_j/m over sub-step states at t + j·dt (j = 0 … s−1), whose mean time
// is t + w·Δt with w = (s−1)/(2s); the regressors are interpolated there between the recorded
// rows t and t+1, (1−w)·R_t + w·R_{t+1}, which leaves an O(Δt²) error instead of O(Δt).
// Rows are left out where the law above does not hold: pinned, driven and handle nodes (their
// motion or force is prescribed), nodes on a spring an actuator may stretch, and nodes near the
// ground plane in that interval (the contact projection changes their velocity).
import { type EpisodeTrajectory,NODE_FEATURE_COUNT } from './episode-trajectory.ts';
import type { GreyBoxStructure } from './grey-box-structure.ts';

export type GreyBoxTerm = 'stiffness' | 'damping' | 'gravity' | 'air-drag' | 'fluid-normal' | 'fluid-tangential';

export interface GreyBoxColumn {
  term: GreyBoxTerm;
  /** Spring relation for stiffness and damping. */
  relation: number | null;
  /** Axis 0, 1, 2 for gravity. */
  axis: number | null;
  unit: string;
}

export interface GreyBoxDesign {
  columns: GreyBoxColumn[];
  rowCount: number;
  /** rowCount × columns, row-major. */
  matrix: Float64Array;
  target: Float64Array;
  /** Median reduced mass per relation present, kg (relation → μ̄). */
  medianReducedMassKg: Map<number, number>;
  /** 1 for springs acting on at least one node whose rows are used: the springs the fit sees. */
  springSeen: Uint8Array;
  freeNodeCount: number;
  excludedNodeCount: number;
  /** Node-interval pairs left out for ground contact. */
  contactExclusions: number;
}

const STRUCTURAL = 0;

export function buildGreyBoxDesign(episode: EpisodeTrajectory, structure: GreyBoxStructure): GreyBoxDesign {
  const n = episode.nodeCount;
  const massKg = new Float64Array(n);
  for (let i = 0; i < n; i++) massKg[i] = episode.nodeFeatures[i * NODE_FEATURE_COUNT];
  const edgeCount = episode.edgeRelation.length;
  const relations = [...new Set(episode.edgeRelation)].sort((a, b) => a - b);
  const columns: GreyBoxColumn[] = [];
  const stiffnessColumn = new Map<number, number>();
  const dampingColumn = new Map<number, number>();
  for (const r of relations) {
    stiffnessColumn.set(r, columns.length);
    columns.push({ term: 'stiffness', relation: r, axis: null, unit: 'N/m' });
    dampingColumn.set(r, columns.length);
    columns.push({ term: 'damping', relation: r, axis: null, unit: 'N·s/m' });
  }
  const gravityColumn = columns.length;
  for (let k = 0; k < 3; k++) columns.push({ term: 'gravity', relation: null, axis: k, unit: 'm/s²' });
  const airColumn = structure.airDrag ? columns.length : -1;
  if (structure.airDrag) columns.push({ term: 'air-drag', relation: null, axis: null, unit: '1/s' });
  const fluidColumn = structure.fluidDrag ? columns.length : -1;
  if (structure.fluidDrag) {
    columns.push({ term: 'fluid-normal', relation: null, axis: null, unit: 'N·s/m²' });
    columns.push({ term: 'fluid-tangential', relation: null, axis: null, unit: 'N·s/m²' });
  }
  const p = columns.length;

  // Damping weights √(μ_s/μ̄_r).
  const reduced = new Float64Array(edgeCount);
  for (let s = 0; s < edgeCount; s++) {
    const ma = massKg[episode.edges[2 * s]];
    const mb = massKg[episode.edges[2 * s + 1]];
    reduced[s] = ma + mb > 0 ? (ma * mb) / (ma + mb) : 0;
  }
  const medianReducedMassKg = new Map<number, number>();
  for (const r of relations) {
    const values = [...reduced.filter((_, s) => episode.edgeRelation[s] === r)].sort((a, b) => a - b);
    medianReducedMassKg.set(r, values[values.length >> 1]);
  }
  const dampingWeight = new Float64Array(edgeCount);
  for (let s = 0; s < edgeCount; s++) {
    const median = medianReducedMassKg.get(episode.edgeRelation[s]) ?? 0;
    dampingWeight[s] = median > 0 ? Math.sqrt(reduced[s] / median) : 0;
  }

  const included = includedNodes(episode, massKg);
  let freeNodeCount = 0;
  for (let i = 0; i < n; i++) if (included[i]) freeNodeCount++;
  const springSeen = new Uint8Array(edgeCount);
  for (let s = 0; s < edgeCount; s++) springSeen[s] = included[episode.edges[2 * s]] | included[episode.edges[2 * s + 1]];

  const block = 3 * n * p;
  let current = new Float64Array(block);
  let following = new Float64Array(block);
  const averaged = new Float64Array(block);
  const interpolated = episode.substeps > 1;
  const w = (episode.substeps - 1) / (2 * episode.substeps);
  const context = { episode, structure, massKg, dampingWeight, stiffnessColumn, dampingColumn, gravityColumn, airColumn, fluidColumn, p };
  writeRegressors(context, 0, current);

  const maxRows = 3 * freeNodeCount * episode.steps;
  const matrix = new Float64Array(maxRows * p);
  const target = new Float64Array(maxRows);
  let rows = 0;
  let contactExclusions = 0;
  const dtS = episode.recordIntervalS;
  const x = episode.positionM;
  const v = episode.velocityMPerS;
  for (let t = 0; t < episode.steps; t++) {
    let used = current;
    if (interpolated) {
      writeRegressors(context, t + 1, following);
      for (let j = 0; j < block; j++) averaged[j] = (1 - w) * current[j] + w * following[j];
      used = averaged;
    }
    const now = t * 3 * n;
    const next = (t + 1) * 3 * n;
    for (let i = 0; i < n; i++) {
      if (!included[i]) continue;
      if (structure.groundHeightM !== null) {
        const h = structure.groundHeightM;
        const margin = dtS * (Math.abs(v[now + 3 * i + 1]) + Math.abs(v[next + 3 * i + 1])) + 1e-9;
        if (x[now + 3 * i + 1] < h + margin || x[next + 3 * i + 1] < h + margin) {
          contactExclusions++;
          continue;
        }
      }
      for (let k = 0; k < 3; k++) {
        matrix.set(used.subarray((3 * i + k) * p, (3 * i + k + 1) * p), rows * p);
        target[rows] = (massKg[i] * (v[next + 3 * i + k] - v[now + 3 * i + k])) / dtS;
        rows++;
      }
    }
    if (interpolated) [current, following] = [following, current];
    else if (t + 1 < episode.steps) writeRegressors(context, t + 1, current);
  }
  return {
    columns,
    rowCount: rows,
    matrix: matrix.subarray(0, rows * p),
    target: target.subarray(0, rows),
    medianReducedMassKg,
    springSeen,
    freeNodeCount,
    excludedNodeCount: n - freeNodeCount,
    contactExclusions,
  };
}

/** Free nodes whose every force follows the law above. */
function includedNodes(episode: EpisodeTrajectory, massKg: Float64Array): Uint8Array {
  const n = episode.nodeCount;
  const included = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    const o = i * NODE_FEATURE_COUNT;
    const pinned = episode.nodeFeatures[o + 1] !== 0;
    const driven = episode.nodeFeatures[o + 2] !== 0;
    const handle = episode.nodeFeatures[o + 3] !== 0;
    included[i] = !pinned && !driven && !handle && massKg[i] > 0 ? 1 : 0;
  }
  // A spring whose two ends are corners of one actuated cell may have its rest length changed
  // by the controls through a gain the dataset does not export: its nodes are left out.
  const corners = episode.cellCornerCount;
  if (corners > 0) {
    const actuatedCellsOf: number[][] = Array.from({ length: n }, () => []);
    for (let cell = 0; cell < episode.cellChannel.length; cell++) {
      if (episode.cellChannel[cell] < 0) continue;
      for (let c = 0; c < corners; c++) actuatedCellsOf[episode.cells[cell * corners + c]].push(cell);
    }
    for (let s = 0; s < episode.edgeRelation.length; s++) {
      const a = episode.edges[2 * s];
      const b = episode.edges[2 * s + 1];
      if (actuatedCellsOf[a].some((cell) => actuatedCellsOf[b].includes(cell))) {
        included[a] = 0;
        included[b] = 0;
      }
    }
  }
  return included;
}

interface RegressorContext {
  episode: EpisodeTrajectory;
  structure: GreyBoxStructure;
  massKg: Float64Array;
  dampingWeight: Float64Array;
  stiffnessColumn: Map<number, number>;
  dampingColumn: Map<number, number>;
  gravityColumn: number;
  airColumn: number;
  fluidColumn: number;
  p: number;
}

/** out[(3i + axis)·p + column]: the force on node i along axis per unit of each coefficient, at record row t. */
function writeRegressors(ctx: RegressorContext, t: number, out: Float64Array): void {
  const { episode, structure, massKg, dampingWeight, p } = ctx;
  const n = episode.nodeCount;
  const x = episode.positionM;
  const v = episode.velocityMPerS;
  const row = t * 3 * n;
  out.fill(0);
  for (let s = 0; s < episode.edgeRelation.length; s++) {
    const a = episode.edges[2 * s];
    const b = episode.edges[2 * s + 1];
    const ia = row + 3 * a;
    const ib = row + 3 * b;
    const dx = x[ib] - x[ia];
    const dy = x[ib + 1] - x[ia + 1];
    const dz = x[ib + 2] - x[ia + 2];
    const length = Math.sqrt(dx * dx + dy * dy + dz * dz);
    if (length === 0) continue;
    const nx = dx / length;
    const ny = dy / length;
    const nz = dz / length;
    const dvn = (v[ib] - v[ia]) * nx + (v[ib + 1] - v[ia + 1]) * ny + (v[ib + 2] - v[ia + 2]) * nz;
    const stretch = length - episode.edgeRestLengthM[s];
    const relation = episode.edgeRelation[s];
    const kc = ctx.stiffnessColumn.get(relation)!;
    const dc = ctx.dampingColumn.get(relation)!;
    const damp = dampingWeight[s] * dvn;
    for (let k = 0; k < 3; k++) {
      const nk = k === 0 ? nx : k === 1 ? ny : nz;
      out[(3 * a + k) * p + kc] += stretch * nk;
      out[(3 * b + k) * p + kc] -= stretch * nk;
      out[(3 * a + k) * p + dc] += damp * nk;
      out[(3 * b + k) * p + dc] -= damp * nk;
    }
    if (ctx.fluidColumn >= 0 && relation === STRUCTURAL) {
      // Segment drag of fluid-drag.ts per unit of C·w: −½·L·(C_t·u_t·t̂ + C_n·(u − u_t·t̂)) on each end.
      const flow = structure.flowVelocityMPerS;
      const ux = 0.5 * (v[ia] + v[ib]) - flow[0];
      const uy = 0.5 * (v[ia + 1] + v[ib + 1]) - flow[1];
      const uz = 0.5 * (v[ia + 2] + v[ib + 2]) - flow[2];
      const ut = ux * nx + uy * ny + uz * nz;
      const half = 0.5 * length;
      for (let k = 0; k < 3; k++) {
        const nk = k === 0 ? nx : k === 1 ? ny : nz;
        const uk = k === 0 ? ux : k === 1 ? uy : uz;
        const normal = -half * (uk - ut * nk);
        const tangential = -half * ut * nk;
        out[(3 * a + k) * p + ctx.fluidColumn] += normal;
        out[(3 * b + k) * p + ctx.fluidColumn] += normal;
        out[(3 * a + k) * p + ctx.fluidColumn + 1] += tangential;
        out[(3 * b + k) * p + ctx.fluidColumn + 1] += tangential;
      }
    }
  }
  for (let i = 0; i < n; i++) {
    for (let k = 0; k < 3; k++) {
      out[(3 * i + k) * p + ctx.gravityColumn + k] = massKg[i];
      if (ctx.airColumn >= 0) out[(3 * i + k) * p + ctx.airColumn] = -massKg[i] * v[row + 3 * i + k];
    }
  }
}
