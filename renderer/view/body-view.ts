// The drawn body: nodes as one InstancedMesh of spheres, springs as one LineSegments, the skin
// of the cells as one flat-shaded triangle mesh. Every buffer is sized once for the topology;
// showing a frame writes positions and colours into those buffers in place, so playing back a
// large lattice allocates nothing per frame.
import * as THREE from 'three';

import type { BodyTopology, NodeSpringIncidence, SurfaceQuads } from './body-topology.ts';
import { nodeSpringIncidence, surfaceQuads } from './body-topology.ts';
import { materialPalette, writeDivergingColour, writeMaterialColour, writeSequentialColour } from './colour-scale.ts';

/** 'error' colours a predicted body by each node's distance from the recorded one. */
export type ColourMode = 'material' | 'actuator' | 'strain' | 'error';

export interface BodyBounds {
  minM: [number, number, number];
  maxM: [number, number, number];
}

const SUPPORT_COLOUR = [0.15, 0.15, 0.18] as const;
const GHOST_COLOUR = 0x6b7480;
const LARGE_BODY_NODES = 1000;

export class BodyView {
  readonly group = new THREE.Group();
  readonly topology: BodyTopology;
  readonly nodeRadiusM: number;
  private readonly quads: SurfaceQuads;
  private readonly incidence: NodeSpringIncidence;
  private readonly nodes: THREE.InstancedMesh;
  private readonly nodeMatrix: Float32Array;
  private readonly nodeColour: Float32Array;
  private readonly springs: THREE.LineSegments;
  private readonly springPosition: Float32Array;
  private readonly springColour: Float32Array;
  private readonly faces: THREE.Mesh;
  private readonly facePosition: Float32Array;
  private readonly faceColour: Float32Array;
  private readonly springStrain: Float32Array;
  private readonly nodeStrain: Float32Array;
  private readonly scratch = new Float32Array(3);

  /**
   * A ghost body is drawn as a thin, see-through grey outline under another body (the recorded
   * motion under a model's prediction), so both can be told apart while they overlap.
   */
  /** Materials the palette tells apart: every named one and every index a node or cell uses. */
  get materialCount(): number {
    if (this.materialCountCache < 0) {
      let count = this.topology.materialNames.length;
      for (const m of this.topology.nodeMaterial) if (m + 1 > count) count = m + 1;
      for (const m of this.topology.cellMaterial) if (m + 1 > count) count = m + 1;
      this.materialCountCache = count;
    }
    return this.materialCountCache;
  }

  private materialCountCache = -1;

  constructor(topology: BodyTopology, options: { ghost?: boolean } = {}) {
    this.topology = topology;
    this.quads = surfaceQuads(topology);
    this.incidence = nodeSpringIncidence(topology);
    this.nodeRadiusM = typicalNodeRadiusM(topology);
    const n = topology.nodeCount;
    const e = topology.springCount;
    const q = this.quads.quadCount;

    // Large bodies get 20-sided spheres: at their size on screen the facets do not show, and
    // the triangle count stays within what software rendering draws at frame rate.
    const sphere = new THREE.IcosahedronGeometry(1, n > LARGE_BODY_NODES ? 0 : 1);
    this.nodes = new THREE.InstancedMesh(sphere, new THREE.MeshLambertMaterial({ color: 0xffffff }), n);
    this.nodeMatrix = this.nodes.instanceMatrix.array as Float32Array;
    const r = this.nodeRadiusM;
    for (let i = 0; i < n; i++) {
      const o = 16 * i;
      this.nodeMatrix.fill(0, o, o + 16);
      this.nodeMatrix[o] = r;
      this.nodeMatrix[o + 5] = r;
      this.nodeMatrix[o + 10] = r;
      this.nodeMatrix[o + 15] = 1;
    }
    this.nodeColour = new Float32Array(3 * n);
    this.nodes.instanceColor = new THREE.InstancedBufferAttribute(this.nodeColour, 3);
    this.nodes.instanceMatrix.setUsage(THREE.DynamicDrawUsage);
    this.nodes.instanceColor.setUsage(THREE.DynamicDrawUsage);
    // Bounds change every frame; culling against stale bounds would hide the body.
    this.nodes.frustumCulled = false;

    this.springPosition = new Float32Array(6 * e);
    this.springColour = new Float32Array(6 * e);
    const springGeometry = new THREE.BufferGeometry();
    springGeometry.setAttribute('position', new THREE.BufferAttribute(this.springPosition, 3).setUsage(THREE.DynamicDrawUsage));
    springGeometry.setAttribute('color', new THREE.BufferAttribute(this.springColour, 3).setUsage(THREE.DynamicDrawUsage));
    this.springs = new THREE.LineSegments(springGeometry, new THREE.LineBasicMaterial({ vertexColors: true }));
    this.springs.frustumCulled = false;

    this.facePosition = new Float32Array(18 * q);
    this.faceColour = new Float32Array(18 * q);
    const faceGeometry = new THREE.BufferGeometry();
    faceGeometry.setAttribute('position', new THREE.BufferAttribute(this.facePosition, 3).setUsage(THREE.DynamicDrawUsage));
    faceGeometry.setAttribute('color', new THREE.BufferAttribute(this.faceColour, 3).setUsage(THREE.DynamicDrawUsage));
    const faceMaterial = new THREE.MeshBasicMaterial({
      vertexColors: true,
      side: THREE.DoubleSide,
      transparent: true,
      opacity: 0.85,
      // Push the faces back so the springs on the skin stay visible instead of flickering.
      polygonOffset: true,
      polygonOffsetFactor: 1,
      polygonOffsetUnits: 1,
    });
    this.faces = new THREE.Mesh(faceGeometry, faceMaterial);
    this.faces.frustumCulled = false;

    this.springStrain = new Float32Array(e);
    this.nodeStrain = new Float32Array(n);
    this.group.add(this.faces, this.springs, this.nodes);
    if (options.ghost) this.makeGhost();
  }

  private makeGhost(): void {
    (this.springs.material as THREE.LineBasicMaterial).setValues({ vertexColors: false, color: GHOST_COLOUR, transparent: true, opacity: 0.55, depthWrite: false });
    this.nodes.material = new THREE.MeshBasicMaterial({ color: GHOST_COLOUR, transparent: true, opacity: 0.45, depthWrite: false });
    for (let i = 0; i < this.topology.nodeCount; i++) {
      const o = 16 * i;
      this.nodeMatrix[o] *= 0.6;
      this.nodeMatrix[o + 5] *= 0.6;
      this.nodeMatrix[o + 10] *= 0.6;
      this.nodeColour.fill(1, 3 * i, 3 * i + 3);
    }
    this.faces.visible = false;
    this.nodes.renderOrder = -1;
    this.springs.renderOrder = -1;
  }

  /**
   * Colours nodes by a non-negative value per node (the prediction error, m) on the sequential
   * scale up to limitM; a spring takes the mean of its ends, a skin face the mean of its corners.
   */
  showNodeMagnitudes(valueM: Float32Array, limitM: number): void {
    const t = this.topology;
    const nc = this.nodeColour;
    for (let i = 0; i < t.nodeCount; i++) writeSequentialColour(valueM[i], limitM, nc, 3 * i);
    this.nodes.instanceColor!.needsUpdate = true;
    const ends = t.springNodes;
    const sc = this.springColour;
    const c = this.scratch;
    for (let s = 0; s < t.springCount; s++) {
      writeSequentialColour(0.5 * (valueM[ends[2 * s]] + valueM[ends[2 * s + 1]]), limitM, c, 0);
      const o = 6 * s;
      for (let v = 0; v < 2; v++) {
        sc[o + 3 * v] = 0.8 * c[0];
        sc[o + 3 * v + 1] = 0.8 * c[1];
        sc[o + 3 * v + 2] = 0.8 * c[2];
      }
    }
    (this.springs.geometry.getAttribute('color') as THREE.BufferAttribute).needsUpdate = true;
    const quadNodes = this.quads.quadNodes;
    const fc = this.faceColour;
    for (let f = 0; f < this.quads.quadCount; f++) {
      const mean = 0.25 * (valueM[quadNodes[4 * f]] + valueM[quadNodes[4 * f + 1]] + valueM[quadNodes[4 * f + 2]] + valueM[quadNodes[4 * f + 3]]);
      writeSequentialColour(mean, limitM, fc, 18 * f);
      for (let v = 1; v < 6; v++) fc.copyWithin(18 * f + 3 * v, 18 * f, 18 * f + 3);
    }
    if (this.quads.quadCount > 0) (this.faces.geometry.getAttribute('color') as THREE.BufferAttribute).needsUpdate = true;
  }

  setVisibility(parts: { nodes: boolean; springs: boolean; faces: boolean }): void {
    this.nodes.visible = parts.nodes;
    this.springs.visible = parts.springs;
    this.faces.visible = parts.faces && this.quads.quadCount > 0;
  }

  get hasFaces(): boolean {
    return this.quads.quadCount > 0;
  }

  /** Moves every part to the frame starting at positionsM[offset] (3 per node, m). */
  showPositions(positionsM: Float32Array, offset: number): void {
    const n = this.topology.nodeCount;
    const m = this.nodeMatrix;
    for (let i = 0; i < n; i++) {
      const p = offset + 3 * i;
      const o = 16 * i;
      m[o + 12] = positionsM[p];
      m[o + 13] = positionsM[p + 1];
      m[o + 14] = positionsM[p + 2];
    }
    this.nodes.instanceMatrix.needsUpdate = true;

    const ends = this.topology.springNodes;
    const sp = this.springPosition;
    for (let s = 0; s < this.topology.springCount; s++) {
      const a = offset + 3 * ends[2 * s];
      const b = offset + 3 * ends[2 * s + 1];
      const o = 6 * s;
      sp[o] = positionsM[a];
      sp[o + 1] = positionsM[a + 1];
      sp[o + 2] = positionsM[a + 2];
      sp[o + 3] = positionsM[b];
      sp[o + 4] = positionsM[b + 1];
      sp[o + 5] = positionsM[b + 2];
    }
    (this.springs.geometry.getAttribute('position') as THREE.BufferAttribute).needsUpdate = true;

    const quadNodes = this.quads.quadNodes;
    const fp = this.facePosition;
    for (let f = 0; f < this.quads.quadCount; f++) {
      const o = 18 * f;
      // Two triangles (0, 1, 2) and (0, 2, 3) of the cyclic quad.
      writeVertex(fp, o, positionsM, offset, quadNodes[4 * f]);
      writeVertex(fp, o + 3, positionsM, offset, quadNodes[4 * f + 1]);
      writeVertex(fp, o + 6, positionsM, offset, quadNodes[4 * f + 2]);
      writeVertex(fp, o + 9, positionsM, offset, quadNodes[4 * f]);
      writeVertex(fp, o + 12, positionsM, offset, quadNodes[4 * f + 2]);
      writeVertex(fp, o + 15, positionsM, offset, quadNodes[4 * f + 3]);
    }
    if (this.quads.quadCount > 0) (this.faces.geometry.getAttribute('position') as THREE.BufferAttribute).needsUpdate = true;
  }

  /**
   * Colours every part. `controls` holds the frame's control vector from `controlOffset` (one
   * value per channel) and is read in 'actuator' mode; strain is measured from the positions
   * of the frame and shown against ±strainLimit.
   */
  showColours(mode: ColourMode, positionsM: Float32Array, offset: number, controls: Float64Array | null, controlOffset: number, strainLimit: number): void {
    const t = this.topology;
    if (mode === 'error') return; // coloured by showNodeMagnitudes, which has the error
    if (mode === 'strain') this.measureStrain(positionsM, offset);
    const nc = this.nodeColour;
    const palette = materialPalette(this.materialCount);
    for (let i = 0; i < t.nodeCount; i++) {
      if (t.nodeFixed[i]) {
        nc[3 * i] = SUPPORT_COLOUR[0];
        nc[3 * i + 1] = SUPPORT_COLOUR[1];
        nc[3 * i + 2] = SUPPORT_COLOUR[2];
      } else if (mode === 'material') writeMaterialColour(t.nodeMaterial[i], palette, nc, 3 * i);
      else if (mode === 'strain') writeDivergingColour(this.nodeStrain[i], strainLimit, nc, 3 * i);
      else writeDivergingColour(channelValue(t.nodeChannel[i], controls, controlOffset), 1, nc, 3 * i);
    }
    this.nodes.instanceColor!.needsUpdate = true;

    const ends = t.springNodes;
    const sc = this.springColour;
    const c = this.scratch;
    for (let s = 0; s < t.springCount; s++) {
      const a = ends[2 * s];
      const b = ends[2 * s + 1];
      if (mode === 'strain') writeDivergingColour(this.springStrain[s], strainLimit, c, 0);
      else if (mode === 'material') {
        // A spring takes its material only when both ends agree; mixed springs stay plain.
        writeMaterialColour(t.nodeMaterial[a] === t.nodeMaterial[b] ? t.nodeMaterial[a] : -1, palette, c, 0);
        c[0] *= 0.7;
        c[1] *= 0.7;
        c[2] *= 0.7;
      } else {
        const u = 0.5 * (channelValue(t.nodeChannel[a], controls, controlOffset) + channelValue(t.nodeChannel[b], controls, controlOffset));
        writeDivergingColour(u, 1, c, 0);
      }
      const o = 6 * s;
      sc[o] = c[0];
      sc[o + 1] = c[1];
      sc[o + 2] = c[2];
      sc[o + 3] = c[0];
      sc[o + 4] = c[1];
      sc[o + 5] = c[2];
    }
    (this.springs.geometry.getAttribute('color') as THREE.BufferAttribute).needsUpdate = true;

    const quadNodes = this.quads.quadNodes;
    const quadCell = this.quads.quadCell;
    const fc = this.faceColour;
    for (let f = 0; f < this.quads.quadCount; f++) {
      const o = 18 * f;
      if (mode === 'strain') {
        // Per-corner strain, so the skin shows where within a cell the stretch is.
        const n0 = quadNodes[4 * f];
        const n1 = quadNodes[4 * f + 1];
        const n2 = quadNodes[4 * f + 2];
        const n3 = quadNodes[4 * f + 3];
        writeDivergingColour(this.nodeStrain[n0], strainLimit, fc, o);
        writeDivergingColour(this.nodeStrain[n1], strainLimit, fc, o + 3);
        writeDivergingColour(this.nodeStrain[n2], strainLimit, fc, o + 6);
        writeDivergingColour(this.nodeStrain[n0], strainLimit, fc, o + 9);
        writeDivergingColour(this.nodeStrain[n2], strainLimit, fc, o + 12);
        writeDivergingColour(this.nodeStrain[n3], strainLimit, fc, o + 15);
        continue;
      }
      const cell = quadCell[f];
      if (mode === 'material') writeMaterialColour(t.cellMaterial[cell], palette, fc, o);
      else writeDivergingColour(channelValue(t.cellChannel[cell], controls, controlOffset), 1, fc, o);
      for (let v = 1; v < 6; v++) {
        fc[o + 3 * v] = fc[o];
        fc[o + 3 * v + 1] = fc[o + 1];
        fc[o + 3 * v + 2] = fc[o + 2];
      }
    }
    if (this.quads.quadCount > 0) (this.faces.geometry.getAttribute('color') as THREE.BufferAttribute).needsUpdate = true;
  }

  /** Axis-aligned bounds of one frame, m. */
  static frameBounds(positionsM: Float32Array, offset: number, nodeCount: number): BodyBounds {
    const minM: [number, number, number] = [Infinity, Infinity, Infinity];
    const maxM: [number, number, number] = [-Infinity, -Infinity, -Infinity];
    for (let i = 0; i < nodeCount; i++) {
      for (let k = 0; k < 3; k++) {
        const v = positionsM[offset + 3 * i + k];
        if (v < minM[k]) minM[k] = v;
        if (v > maxM[k]) maxM[k] = v;
      }
    }
    return { minM, maxM };
  }

  dispose(): void {
    this.nodes.geometry.dispose();
    (this.nodes.material as THREE.Material).dispose();
    this.nodes.dispose();
    this.springs.geometry.dispose();
    (this.springs.material as THREE.Material).dispose();
    this.faces.geometry.dispose();
    (this.faces.material as THREE.Material).dispose();
  }

  private measureStrain(positionsM: Float32Array, offset: number): void {
    const t = this.topology;
    const ends = t.springNodes;
    const rest = t.springRestLengthM;
    const strain = this.springStrain;
    for (let s = 0; s < t.springCount; s++) {
      const a = offset + 3 * ends[2 * s];
      const b = offset + 3 * ends[2 * s + 1];
      const dx = positionsM[b] - positionsM[a];
      const dy = positionsM[b + 1] - positionsM[a + 1];
      const dz = positionsM[b + 2] - positionsM[a + 2];
      strain[s] = rest[s] > 0 ? Math.sqrt(dx * dx + dy * dy + dz * dz) / rest[s] - 1 : 0;
    }
    const start = this.incidence.start;
    const springs = this.incidence.springs;
    for (let i = 0; i < t.nodeCount; i++) {
      let sum = 0;
      for (let k = start[i]; k < start[i + 1]; k++) sum += strain[springs[k]];
      const count = start[i + 1] - start[i];
      this.nodeStrain[i] = count > 0 ? sum / count : 0;
    }
  }
}

function writeVertex(out: Float32Array, o: number, positionsM: Float32Array, offset: number, node: number): void {
  const p = offset + 3 * node;
  out[o] = positionsM[p];
  out[o + 1] = positionsM[p + 1];
  out[o + 2] = positionsM[p + 2];
}

function channelValue(channel: number, controls: Float64Array | null, controlOffset: number): number {
  return channel >= 0 && controls !== null ? controls[controlOffset + channel] : 0;
}

/**
 * A fraction of the median rest length: big enough to see, small enough not to merge
 * neighbours. Lattices count their diagonals in the median and pack nodes densely, so they get
 * smaller spheres than chains.
 */
function typicalNodeRadiusM(topology: BodyTopology): number {
  const rest = topology.springRestLengthM;
  if (rest.length === 0) return 0.01;
  const sample = Array.from(rest.subarray(0, Math.min(rest.length, 512))).sort((a, b) => a - b);
  const median = sample[sample.length >> 1];
  return median > 0 ? (topology.cellCount > 0 ? 0.14 : 0.3) * median : 0.01;
}
