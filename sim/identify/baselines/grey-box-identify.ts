// Grey-box identification of one episode: builds the regression of grey-box-design.ts, solves
// it and sets each estimate beside the true value the dataset recorded (edge labels, the
// episode's sampled labels and its scenario), with absolute and relative errors.
import { RELATION_NAMES } from '../../core/model.ts';
import type { EpisodeRecord } from '../../dataset/manifest/dataset-manifest.ts';
import type { EpisodeTrajectory } from './episode-trajectory.ts';
import { buildGreyBoxDesign, type GreyBoxColumn, type GreyBoxDesign } from './grey-box-design.ts';
import { solveLeastSquares } from './grey-box-solve.ts';
import { episodeNumber, type GreyBoxStructure,structureOf } from './grey-box-structure.ts';

export interface IdentifiedParameter {
  /** "stiffness.structural", "damping.second-neighbour", "gravity.y", "air-drag", "fluid-normal", … */
  name: string;
  unit: string;
  estimate: number | null;
  standardError: number | null;
  truth: number | null;
  /** Smallest and largest true value where the springs of one relation differ. */
  truthRange: [number, number] | null;
  absoluteError: number | null;
  relativeError: number | null;
}

export interface EpisodeIdentification {
  episode: string;
  split: string;
  rows: number;
  freeNodes: number;
  excludedNodes: number;
  contactExclusions: number;
  /** Null when the design has too few rows or no identifiable column. */
  condition: number | null;
  /** RMS of m·Δv/Δt − A·θ over the rows, N. */
  residualRmsN: number | null;
  parameters: IdentifiedParameter[];
}

const AXES = ['x', 'y', 'z'];

export function columnName(column: GreyBoxColumn): string {
  if (column.term === 'stiffness' || column.term === 'damping') return `${column.term}.${RELATION_NAMES[column.relation!] ?? `relation-${column.relation}`}`;
  if (column.term === 'gravity') return `gravity.${AXES[column.axis!]}`;
  return column.term;
}

export function identifyEpisode(trajectory: EpisodeTrajectory, record: EpisodeRecord, scenario: unknown, structure: GreyBoxStructure = structureOf(scenario, record)): EpisodeIdentification {
  const design = buildGreyBoxDesign(trajectory, structure);
  const solved = solveLeastSquares(design.matrix, design.target, design.rowCount, design.columns.length);
  const parameters = design.columns.map((column, j): IdentifiedParameter => {
    const { truth, range } = trueValue(column, trajectory, design, record, scenario);
    const estimate = solved.estimate[j];
    const absoluteError = estimate !== null && truth !== null ? Math.abs(estimate - truth) : null;
    return {
      name: columnName(column),
      unit: column.unit,
      estimate,
      standardError: solved.standardError[j],
      truth,
      truthRange: range,
      absoluteError,
      relativeError: absoluteError !== null && truth !== null && truth !== 0 ? absoluteError / Math.abs(truth) : null,
    };
  });
  return {
    episode: trajectory.id,
    split: trajectory.split,
    rows: design.rowCount,
    freeNodes: design.freeNodeCount,
    excludedNodes: design.excludedNodeCount,
    contactExclusions: design.contactExclusions,
    condition: Number.isFinite(solved.condition) ? solved.condition : null,
    residualRmsN: Number.isFinite(solved.residualRms) ? solved.residualRms : null,
    parameters,
  };
}

function median(values: number[]): { truth: number | null; range: [number, number] | null } {
  if (values.length === 0) return { truth: null, range: null };
  const sorted = [...values].sort((a, b) => a - b);
  const low = sorted[0];
  const high = sorted[sorted.length - 1];
  // Springs of one relation that agree to rounding have one true value, not a range.
  const spread = high - low > 1e-12 * Math.max(Math.abs(high), Math.abs(low));
  return { truth: sorted[sorted.length >> 1], range: spread ? [low, high] : null };
}

function trueValue(column: GreyBoxColumn, trajectory: EpisodeTrajectory, design: GreyBoxDesign, record: EpisodeRecord, scenario: unknown): { truth: number | null; range: [number, number] | null } {
  // The truth of a relation is that of the springs the fit sees (those acting on a used node).
  const springs = [...trajectory.edgeRelation.keys()].filter((s) => trajectory.edgeRelation[s] === column.relation && design.springSeen[s] === 1);
  if (column.term === 'stiffness') return median(springs.map((s) => trajectory.edgeStiffnessNPerM[s]));
  if (column.term === 'damping') {
    const mu = design.medianReducedMassKg.get(column.relation!) ?? 0;
    return median(springs.map((s) => {
      const ma = trajectory.nodeFeatures[6 * trajectory.edges[2 * s]];
      const mb = trajectory.nodeFeatures[6 * trajectory.edges[2 * s + 1]];
      const reduced = (ma * mb) / (ma + mb);
      return trajectory.edgeDampingNsPerM[s] * Math.sqrt(mu / reduced);
    }));
  }
  if (column.term === 'gravity') {
    const g = episodeNumber(scenario, record, `/world/gravityMPerS2/${column.axis}`);
    if (g === undefined) return { truth: null, range: null };
    const ratio = buoyancyRatio(scenario, record);
    return { truth: ratio === null ? null : g * (1 - ratio), range: null };
  }
  if (column.term === 'air-drag') return { truth: episodeNumber(scenario, record, '/world/airDragPerS') ?? null, range: null };
  const coefficient = episodeNumber(scenario, record, column.term === 'fluid-normal' ? '/world/fluid/normalDragNsPerM3' : '/world/fluid/tangentialDragNsPerM3');
  const width = episodeNumber(scenario, record, '/system/diameterM');
  return { truth: coefficient !== undefined && width !== undefined ? coefficient * width : null, range: null };
}

/**
 * Displaced fluid mass over node mass, ρ_f·V/m: 0 without buoyancy; for a chain V/m is the same
 * at every node (both are shared out per segment), π·d²·L/(4·M); null for lattices in a
 * buoyant fluid, whose nodes differ.
 */
function buoyancyRatio(scenario: unknown, record: EpisodeRecord): number | null {
  const fluid = scenario !== null && typeof scenario === 'object' ? (scenario as { world?: { fluid?: { buoyancy?: boolean } } }).world?.fluid : undefined;
  if (!fluid || !fluid.buoyancy) return 0;
  if (record.systemKind !== 'chain') return null;
  const rho = episodeNumber(scenario, record, '/world/fluid/densityKgPerM3');
  const d = episodeNumber(scenario, record, '/system/diameterM');
  const length = episodeNumber(scenario, record, '/system/lengthM');
  const mass = episodeNumber(scenario, record, '/system/totalMassKg');
  if (rho === undefined || d === undefined || length === undefined || mass === undefined) return null;
  return (rho * Math.PI * d * d * length) / (4 * mass);
}
