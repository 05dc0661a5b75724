// One recorded episode in the form the baselines compute with: every float array widened to
// float64 and checked against the shapes the dataset layout promises (LAYOUT.md, "Arrays of an
// episode"), so the fitting code never meets a wrong shape or a NaN half-way through a matrix.
import type { NamedArray } from '../../dataset/formats/named-array.ts';
import { BaselineInputError } from './baseline-input-error.ts';

export interface EpisodeTrajectory {
  id: string;
  split: string;
  /** Recorded steps T; positions hold T+1 rows. */
  steps: number;
  nodeCount: number;
  channelCount: number;
  recordIntervalS: number;
  substeps: number;
  /** (T+1)·N·3, m. */
  positionM: Float64Array;
  /** (T+1)·N·3, m/s. */
  velocityMPerS: Float64Array;
  /** T·C, each channel's unit. */
  controls: Float64Array;
  /** N·6: mass_kg, pinned, driven, handle, material, channel. */
  nodeFeatures: Float64Array;
  /** E·2 node indices. */
  edges: Int32Array;
  edgeRelation: Uint8Array;
  edgeRestLengthM: Float64Array;
  /** True labels, used only to report against; the fits never read them. */
  edgeStiffnessNPerM: Float64Array;
  edgeDampingNsPerM: Float64Array;
  /** K·corners, or empty for chains. */
  cells: Int32Array;
  cellCornerCount: number;
  cellChannel: Int16Array;
}

export const NODE_FEATURE_COUNT = 6;

export interface TrajectoryPlace {
  id: string;
  split: string;
  /** The file the arrays came from, for messages. */
  file: string;
  recordIntervalS: number;
  substeps: number;
}

export function trajectoryFromArrays(arrays: readonly NamedArray[], place: TrajectoryPlace): EpisodeTrajectory {
  const where = `${place.file} (episode ${place.id})`;
  const byName = new Map(arrays.map((a) => [a.name, a]));
  const need = (name: string): NamedArray => {
    const array = byName.get(name);
    if (!array) throw new BaselineInputError(`${where}: the array "${name}" is missing; regenerate the dataset from its seed.json`);
    return array;
  };
  const positions = need('positions');
  if (positions.shape.length !== 3 || positions.shape[2] !== 3 || positions.shape[0] < 2) {
    throw new BaselineInputError(`${where}: "positions" has shape [${positions.shape.join(', ')}], expected (T+1, N, 3) with T ≥ 1`);
  }
  const steps = positions.shape[0] - 1;
  const nodeCount = positions.shape[1];
  const velocities = need('velocities');
  expectShape(where, velocities, [steps + 1, nodeCount, 3], '(T+1, N, 3)');
  const controls = need('controls');
  if (controls.shape.length !== 2 || controls.shape[0] !== steps) {
    throw new BaselineInputError(`${where}: "controls" has shape [${controls.shape.join(', ')}], expected (T, C) with T = ${steps}`);
  }
  const nodeFeatures = need('node_features');
  expectShape(where, nodeFeatures, [nodeCount, NODE_FEATURE_COUNT], '(N, 6)');
  const edges = need('edges');
  if (edges.shape.length !== 2 || edges.shape[1] !== 2) throw new BaselineInputError(`${where}: "edges" has shape [${edges.shape.join(', ')}], expected (E, 2)`);
  const edgeCount = edges.shape[0];
  const relation = need('edge_relation');
  expectShape(where, relation, [edgeCount], '(E)');
  const rest = need('edge_rest_length');
  expectShape(where, rest, [edgeCount], '(E)');
  const stiffness = need('edge_stiffness');
  expectShape(where, stiffness, [edgeCount], '(E)');
  const damping = need('edge_damping');
  expectShape(where, damping, [edgeCount], '(E)');
  const cells = byName.get('cells');
  const cellChannel = byName.get('cell_channel');
  const edgeData = Int32Array.from(edges.data as ArrayLike<number>);
  for (let i = 0; i < edgeData.length; i++) {
    if (!(edgeData[i] >= 0 && edgeData[i] < nodeCount)) {
      throw new BaselineInputError(`${where}: "edges" row ${i >> 1} names node ${edgeData[i]}, but the episode has nodes 0 to ${nodeCount - 1}`);
    }
  }
  return {
    id: place.id,
    split: place.split,
    steps,
    nodeCount,
    channelCount: controls.shape[1],
    recordIntervalS: place.recordIntervalS,
    substeps: place.substeps,
    positionM: finiteFloat64(where, positions),
    velocityMPerS: finiteFloat64(where, velocities),
    controls: finiteFloat64(where, controls),
    nodeFeatures: finiteFloat64(where, nodeFeatures),
    edges: edgeData,
    edgeRelation: Uint8Array.from(relation.data as ArrayLike<number>),
    edgeRestLengthM: finiteFloat64(where, rest),
    edgeStiffnessNPerM: finiteFloat64(where, stiffness),
    edgeDampingNsPerM: finiteFloat64(where, damping),
    cells: cells ? Int32Array.from(cells.data as ArrayLike<number>) : new Int32Array(0),
    cellCornerCount: cells && cells.shape.length === 2 ? cells.shape[1] : 0,
    cellChannel: cellChannel ? Int16Array.from(cellChannel.data as ArrayLike<number>) : new Int16Array(0),
  };
}

function expectShape(where: string, array: NamedArray, shape: number[], written: string): void {
  if (array.shape.length !== shape.length || array.shape.some((n, i) => n !== shape[i])) {
    throw new BaselineInputError(`${where}: "${array.name}" has shape [${array.shape.join(', ')}], expected ${written} = [${shape.join(', ')}]`);
  }
}

function finiteFloat64(where: string, array: NamedArray): Float64Array {
  const out = Float64Array.from(array.data as ArrayLike<number>);
  for (let i = 0; i < out.length; i++) {
    if (!Number.isFinite(out[i])) {
      throw new BaselineInputError(`${where}: "${array.name}" holds a non-finite value (${out[i]}) at flat index ${i}; a recorded episode must be finite — regenerate it or drop the episode`);
    }
  }
  return out;
}
