// The cells of one episode's lattice body: one of the listed material maps, or a generated
// face-connected shape with materials and actuator channels drawn per cell. The numbers that
// shape the draw (map choice, box, cell count, weights) go through the parameter resolver; the
// growth and the per-cell draws use the episode's shape stream.
import type { RandomStream } from '../random/random-stream.ts';
import type { LatticeMaterial, MaterialMap2D, MaterialMap3D } from '../systems/lattice.ts';
import { growFaceConnectedShape } from './grow-shape.ts';
import { channelledMaterials } from './lattice-materials.ts';
import type { ParameterResolver } from './parameter-resolver.ts';
import type { LatticeShapeSpec, MaterialMap, ShapeGeneratorSpec } from './scenario-types.ts';

export type ShapeParameters =
  | { kind: 'map'; mapIndex: number }
  | { kind: 'generated'; dimension: 2 | 3; boundsCells: [number, number, number]; cellCount: number; materialWeights: number[]; actuatedChannelCount: number | undefined };

export function isGeneratedShape(shape: LatticeShapeSpec): shape is { generator: ShapeGeneratorSpec } {
  return 'generator' in shape;
}

export function resolveShapeParameters(shape: LatticeShapeSpec, resolver: ParameterResolver): ShapeParameters {
  if (!isGeneratedShape(shape)) {
    const values = shape.maps.map((_, i) => i);
    const mapIndex = resolver.value({ kind: 'categorical', values, ...(shape.weights ? { weights: shape.weights } : {}) }, '/system/shape/maps', 'none');
    return { kind: 'map', mapIndex };
  }
  const g = shape.generator;
  const base = '/system/shape/generator';
  const bound = (i: number): number => (i < g.boundsCells.length ? resolver.value(g.boundsCells[i], `${base}/boundsCells/${i}`, 'high') : 1);
  return {
    kind: 'generated',
    dimension: g.dimension,
    boundsCells: [bound(0), bound(1), g.dimension === 3 ? bound(2) : 1],
    cellCount: resolver.value(g.cellCount, `${base}/cellCount`, 'high'),
    materialWeights: g.materialWeights.map((w, i) => resolver.value(w, `${base}/materialWeights/${i}`, 'none')),
    actuatedChannelCount: g.actuatedChannelCount === undefined ? undefined : resolver.value(g.actuatedChannelCount, `${base}/actuatedChannelCount`, 'high'),
  };
}

export interface LatticeBody {
  materialMap: MaterialMap;
  materials: LatticeMaterial[];
}

export function latticeBody(shape: LatticeShapeSpec, parameters: ShapeParameters, materials: LatticeMaterial[], seedOnBottom: boolean, stream: RandomStream): LatticeBody {
  if (parameters.kind === 'map') {
    if (isGeneratedShape(shape)) throw new Error('shape parameters do not match the shape spec');
    return { materialMap: shape.maps[parameters.mapIndex], materials };
  }
  const [nx, ny, nz] = parameters.boundsCells;
  const grown = growFaceConnectedShape(nx, ny, nz, parameters.cellCount, seedOnBottom, stream);
  const channelled = channelledMaterials(materials, parameters.actuatedChannelCount);
  const weights = parameters.materialWeights;
  let totalWeight = 0;
  for (const w of weights) totalWeight += w;
  const values = new Int32Array(nx * ny * nz);
  // Materials first for every cell, then channels, so a change of channel count never
  // changes which material a cell gets.
  const materialOfCell = new Int32Array(grown.cells.length);
  for (let i = 0; i < grown.cells.length; i++) materialOfCell[i] = weightedIndex(weights, totalWeight, stream);
  for (let i = 0; i < grown.cells.length; i++) {
    const material = materialOfCell[i];
    const count = parameters.actuatedChannelCount;
    const channel = count !== undefined && count > 0 && materials[material].actuatorChannel !== null ? stream.nextIntInclusive(0, count - 1) : 0;
    values[grown.cells[i]] = channelled.indexOf(material, channel) + 1;
  }
  return { materialMap: toMaterialMap(values, nx, ny, nz, parameters.dimension), materials: channelled.materials };
}

function weightedIndex(weights: readonly number[], total: number, stream: RandomStream): number {
  if (!(total > 0)) return stream.nextIntInclusive(0, weights.length - 1);
  const target = stream.nextFloat64() * total;
  let cumulative = 0;
  let last = 0;
  for (let i = 0; i < weights.length; i++) {
    if (!(weights[i] > 0)) continue;
    cumulative += weights[i];
    last = i;
    if (target < cumulative) return i;
  }
  return last;
}

function toMaterialMap(values: Int32Array, nx: number, ny: number, nz: number, dimension: 2 | 3): MaterialMap {
  if (dimension === 2) {
    const map: MaterialMap2D = [];
    for (let y = 0; y < ny; y++) map.push(Array.from(values.subarray(y * nx, (y + 1) * nx)));
    return map;
  }
  const map: MaterialMap3D = [];
  for (let y = 0; y < ny; y++) {
    const layer: number[][] = [];
    for (let z = 0; z < nz; z++) {
      const row: number[] = [];
      for (let x = 0; x < nx; x++) row.push(values[x + nx * (y + ny * z)]);
      layer.push(row);
    }
    map.push(layer);
  }
  return map;
}
