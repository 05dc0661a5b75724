// Turns a recorded trajectory and the graph labels of its model into the named, shaped arrays
// an episode file stores, in the order and with the dtypes of the catalogue. Floating-point
// arrays are narrowed to float32 unless float64 was asked for; narrowing rounds to nearest, so
// it is the same on every machine.
import type { ObservedTrajectory } from '../../episode/observe-trajectory.ts';
import type { RecordedTrajectory } from '../../episode/record-episode.ts';
import type { GraphLabels } from '../../systems/graph-labels.ts';
import { NODE_FEATURE_NAMES } from '../../systems/graph-labels.ts';
import type { NamedArray } from '../formats/named-array.ts';
import { namedArray } from '../formats/named-array.ts';
import type { ExportDtype } from '../manifest/dataset-manifest.ts';
import { EPISODE_ARRAYS } from '../manifest/episode-array-catalogue.ts';

type StoredArrayData = Float32Array | Float64Array | Int32Array | Uint8Array | Int16Array;

/** An episode's arrays carry their catalogue unit and meaning, which HDF5 keeps as attributes. */
export type EpisodeArray = NamedArray;

function floats(values: Float64Array, dtype: ExportDtype): Float32Array | Float64Array {
  return dtype === 'float64' ? values.slice() : Float32Array.from(values);
}

/** `observed` is null for a scenario without an observation block: then no observed arrays are stored. */
export function episodeArrays(trajectory: RecordedTrajectory, graph: GraphLabels, cellCornerCount: number, dtype: ExportDtype, observed: ObservedTrajectory | null = null): EpisodeArray[] {
  const t = trajectory.steps;
  const n = trajectory.nodeCount;
  const c = trajectory.channelCount;
  const e = graph.edgeRelation.length;
  const k = graph.cellMaterial.length;
  const h = graph.hingeStiffnessNm.length;
  const q = graph.clampStiffnessNm.length;
  const data: Record<string, { shape: number[]; data: StoredArrayData }> = {
    time: { shape: [t + 1], data: floats(trajectory.timeS, dtype) },
    positions: { shape: [t + 1, n, 3], data: floats(trajectory.positionM, dtype) },
    velocities: { shape: [t + 1, n, 3], data: floats(trajectory.velocityMPerS, dtype) },
    controls: { shape: [t, c], data: floats(trajectory.controls, dtype) },
    energies: { shape: [t + 1, trajectory.energiesJ.length / (t + 1)], data: floats(trajectory.energiesJ, dtype) },
    node_features: { shape: [n, NODE_FEATURE_NAMES.length], data: floats(graph.nodeFeatures, dtype) },
    edges: { shape: [e, 2], data: Int32Array.from(graph.edges) },
    edge_relation: { shape: [e], data: graph.edgeRelation.slice() },
    edge_rest_length: { shape: [e], data: floats(graph.edgeRestLengthM, dtype) },
    edge_stiffness: { shape: [e], data: floats(graph.edgeStiffnessNPerM, dtype) },
    edge_damping: { shape: [e], data: floats(graph.edgeDampingNsPerM, dtype) },
    cells: { shape: [k, cellCornerCount], data: Int32Array.from(graph.cells) },
    cell_material: { shape: [k], data: graph.cellMaterial.slice() },
    cell_channel: { shape: [k], data: graph.cellChannel.slice() },
    hinges: { shape: [h, 3], data: Int32Array.from(graph.hinges) },
    hinge_stiffness: { shape: [h], data: floats(graph.hingeStiffnessNm, dtype) },
    hinge_damping: { shape: [h], data: floats(graph.hingeDampingNms, dtype) },
    clamps: { shape: [q, 2], data: Int32Array.from(graph.clamps) },
    clamp_direction: { shape: [q, 3], data: floats(graph.clampDirectionUnit, dtype) },
    clamp_stiffness: { shape: [q], data: floats(graph.clampStiffnessNm, dtype) },
    clamp_damping: { shape: [q], data: floats(graph.clampDampingNms, dtype) },
  };
  if (observed !== null) {
    const frames = observed.frameCount;
    const markers = observed.markerCount;
    data.observed_time = { shape: [frames], data: floats(observed.timeS, dtype) };
    data.observed_positions = { shape: [frames, markers, 3], data: floats(observed.positionM, dtype) };
    data.observed_mask = { shape: [frames, markers], data: observed.seen.slice() };
    data.observed_nodes = { shape: [markers], data: observed.markerNodes.slice() };
  }
  if (trajectory.energyFlowsJ !== null) {
    data.energy_flows = { shape: [t + 1, trajectory.energyFlowsJ.length / (t + 1)], data: floats(trajectory.energyFlowsJ, dtype) };
  }
  const forces = trajectory.forces;
  if (forces !== null) {
    data.edge_tension = { shape: [t, e], data: floats(forces.edgeTensionN, dtype) };
    data.contact_normal_force = { shape: [t, n, 3], data: floats(forces.contactNormalForceN, dtype) };
    data.contact_friction_force = { shape: [t, n, 3], data: floats(forces.contactFrictionForceN, dtype) };
    data.fluid_force = { shape: [t, n, 3], data: floats(forces.fluidForceN, dtype) };
  }
  const arrays: EpisodeArray[] = [];
  for (const description of EPISODE_ARRAYS) {
    if (description.latticeOnly && k === 0) continue;
    if (description.observationOnly && observed === null) continue;
    if (description.chainOnly && k > 0) continue;
    const entry = data[description.name];
    if (entry === undefined && description.onlyWith !== undefined) continue;
    // namedArray takes the dtype from the typed array, so it cannot disagree with the data.
    arrays.push(namedArray(description.name, entry.shape, entry.data, { unit: description.unit, description: description.meaning }) as NamedArray);
  }
  return arrays;
}
