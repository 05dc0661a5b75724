// Turns one exported episode's arrays (dataset.episodeArrays) into what the 3-D view plays: the
// topology from the graph arrays (edges, rest lengths, node features, cells) and the frames from
// positions, time, energies and controls. Array names and layouts are those of the dataset's
// episode catalogue (sim/dataset/manifest/episode-array-catalogue.ts).
import type { EpisodeArrays } from '../../sim/bridge/bridge-contract.ts';
import { ENERGY_NAMES, ENERGY_TERM_COUNT } from '../../sim/core/energy.ts';
import { NODE_FEATURE_NAMES } from '../../sim/systems/graph-labels.ts';
import type { DecodedArray } from '../bridge/decode-array.ts';
import { decodeArray } from '../bridge/decode-array.ts';
import { TrajectoryFrames } from '../playback/trajectory-frames.ts';

const BENDING = ENERGY_NAMES.indexOf('bending');
import type { BodyTopology } from '../view/body-topology.ts';

export interface PlayableEpisode {
  topology: BodyTopology;
  frames: TrajectoryFrames;
  frameIntervalS: number;
  channelCount: number;
}

const FEATURE = {
  pinned: NODE_FEATURE_NAMES.indexOf('pinned'),
  driven: NODE_FEATURE_NAMES.indexOf('driven'),
  material: NODE_FEATURE_NAMES.indexOf('material'),
  channel: NODE_FEATURE_NAMES.indexOf('channel'),
};

export function playableEpisode(episode: EpisodeArrays): PlayableEpisode {
  const arrays = new Map<string, { data: DecodedArray; shape: number[] }>();
  for (const encoded of episode.arrays) arrays.set(encoded.name, { data: decodeArray(encoded), shape: encoded.shape });
  const need = (name: string): { data: DecodedArray; shape: number[] } => {
    const found = arrays.get(name);
    if (!found) throw new Error(`Episode ${episode.episodeId} has no "${name}" array, which playback needs. Check the dataset with Verify; it may be damaged or from another tool.`);
    return found;
  };
  const positions = need('positions');
  const [frameCount, nodeCount] = positions.shape;
  const time = need('time').data;
  const edges = need('edges');
  const rest = need('edge_rest_length').data;
  const features = need('node_features');
  const featureWidth = features.shape[1];
  const controls = arrays.get('controls');
  const channelCount = controls && controls.shape.length === 2 ? controls.shape[1] : 0;

  const nodeMaterial = new Int16Array(nodeCount);
  const nodeChannel = new Int16Array(nodeCount);
  const nodeFixed = new Uint8Array(nodeCount);
  for (let i = 0; i < nodeCount; i++) {
    const o = i * featureWidth;
    nodeMaterial[i] = features.data[o + FEATURE.material];
    nodeChannel[i] = features.data[o + FEATURE.channel];
    nodeFixed[i] = features.data[o + FEATURE.pinned] > 0 || features.data[o + FEATURE.driven] > 0 ? 1 : 0;
  }
  const cells = arrays.get('cells');
  const cellCount = cells ? cells.shape[0] : 0;
  const cellMaterial = arrays.get('cell_material');
  const cellChannel = arrays.get('cell_channel');
  let materialCount = 0;
  for (let i = 0; i < nodeCount; i++) materialCount = Math.max(materialCount, nodeMaterial[i] + 1);
  const topology: BodyTopology = {
    nodeCount,
    nodeMaterial,
    nodeChannel,
    nodeFixed,
    springCount: edges.shape[0],
    springNodes: Uint32Array.from(edges.data),
    springRestLengthM: Float64Array.from(rest),
    cellCornerCount: cells ? cells.shape[1] : 0,
    cellCount,
    cellCorners: cells ? Uint32Array.from(cells.data) : new Uint32Array(0),
    cellMaterial: cellMaterial ? Int16Array.from(cellMaterial.data) : new Int16Array(cellCount),
    cellChannel: cellChannel ? Int16Array.from(cellChannel.data) : new Int16Array(cellCount).fill(-1),
    // The dataset names materials only in its scenario; the legend numbers them as the map does.
    materialNames: Array.from({ length: materialCount }, (_, m) => `material ${m + 1}`),
  };
  const frames = new TrajectoryFrames(nodeCount, channelCount, frameCount);
  const energies = arrays.get('energies');
  frames.receive(
    0,
    frameCount,
    positions.data instanceof Float32Array ? positions.data : Float32Array.from(positions.data),
    Float64Array.from(time),
    energies ? energyRows(energies) : null,
    controls ? Float64Array.from(controls.data) : null,
  );
  const frameIntervalS = frameCount > 1 ? (time[frameCount - 1] - time[0]) / (frameCount - 1) : 1;
  return { topology, frames, frameIntervalS, channelCount };
}

/**
 * The file's energy columns in this version's layout (ENERGY_TERMS). Datasets made before
 * bending had no bending column, and no bending, so it reads 0; buoyancy and support_kinetic,
 * recorded only with numerics.energyBalance, stay NaN where a file lacks them.
 */
function energyRows(energies: { data: DecodedArray; shape: number[] }): Float64Array {
  const width = energies.shape[1] ?? ENERGY_TERM_COUNT;
  if (width === ENERGY_TERM_COUNT) return Float64Array.from(energies.data);
  const rows = energies.shape[0];
  const out = new Float64Array(rows * ENERGY_TERM_COUNT).fill(Number.NaN);
  const shared = Math.min(width, ENERGY_TERM_COUNT);
  for (let r = 0; r < rows; r++) {
    for (let c = 0; c < shared; c++) out[r * ENERGY_TERM_COUNT + c] = Number(energies.data[r * width + c]);
    if (width <= BENDING) out[r * ENERGY_TERM_COUNT + BENDING] = 0;
  }
  return out;
}
