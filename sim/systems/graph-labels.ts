// Graph labels of a built system for graph-network learners: per-node features, the edge
// list with relation types and edge attributes, and the cell list. Derived from the model so
// they can never disagree with what was simulated.
import type { Model } from '../core/model.ts';
import { NODE_DRIVEN, NODE_HANDLE, NODE_PINNED } from '../core/model.ts';

export const NODE_FEATURE_NAMES = ['mass_kg', 'pinned', 'driven', 'handle', 'material', 'channel'] as const;

export interface GraphLabels {
  /** N × 6, columns NODE_FEATURE_NAMES. */
  nodeFeatures: Float64Array;
  /** E × 2 node indices. */
  edges: Uint32Array;
  edgeRelation: Uint8Array;
  edgeRestLengthM: Float64Array;
  edgeStiffnessNPerM: Float64Array;
  edgeDampingNsPerM: Float64Array;
  /** C × corners node indices. */
  cells: Uint32Array;
  cellMaterial: Int16Array;
  cellChannel: Int16Array;
  /** H × 3 node indices (previous, middle, next) of the bending hinges. */
  hinges: Uint32Array;
  hingeStiffnessNm: Float64Array;
  hingeDampingNms: Float64Array;
  /** Q × 2 node indices (held end, neighbour) of the clamps. */
  clamps: Uint32Array;
  /** Q × 3 unit vectors. */
  clampDirectionUnit: Float64Array;
  clampStiffnessNm: Float64Array;
  clampDampingNms: Float64Array;
}

export function graphLabels(model: Model): GraphLabels {
  const n = model.nodeCount;
  const features = new Float64Array(n * NODE_FEATURE_NAMES.length);
  for (let i = 0; i < n; i++) {
    const o = i * NODE_FEATURE_NAMES.length;
    const flags = model.nodeFlags[i];
    features[o] = model.massKg[i];
    features[o + 1] = flags & NODE_PINNED ? 1 : 0;
    features[o + 2] = flags & NODE_DRIVEN ? 1 : 0;
    features[o + 3] = flags & NODE_HANDLE ? 1 : 0;
    features[o + 4] = model.nodeMaterial[i];
    features[o + 5] = model.nodeChannel[i];
  }
  const edges = new Uint32Array(2 * model.springCount);
  for (let s = 0; s < model.springCount; s++) {
    edges[2 * s] = model.springNodeA[s];
    edges[2 * s + 1] = model.springNodeB[s];
  }
  return {
    nodeFeatures: features,
    edges,
    edgeRelation: model.springRelation.slice(),
    edgeRestLengthM: model.baseRestLengthM.slice(),
    edgeStiffnessNPerM: model.stiffnessNPerM.slice(),
    edgeDampingNsPerM: model.dampingNsPerM.slice(),
    cells: model.cellCorners.slice(),
    cellMaterial: model.cellMaterial.slice(),
    cellChannel: model.cellChannel.slice(),
    hinges: model.hingeNodes.slice(),
    hingeStiffnessNm: model.hingeStiffnessNm.slice(),
    hingeDampingNms: model.hingeDampingNms.slice(),
    clamps: model.clampNodes.slice(),
    clampDirectionUnit: model.clampDirectionUnit.slice(),
    clampStiffnessNm: model.clampStiffnessNm.slice(),
    clampDampingNms: model.clampDampingNms.slice(),
  };
}
