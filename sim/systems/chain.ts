// Chains: ropes, cables and tethers made of equal parts. Part j is the segment between nodes
// j and j+1; its mass is lumped half to each end node. Structural springs join neighbours with
// k = EA / segment length. Bending rigidity EI acts through a hinge at every interior node,
// k = EI / ℓ (ℓ the segment length, which is the node's Voronoi length), and through a clamp
// of k = 2·EI / ℓ at a clamped end (its Voronoi length is half a segment), see
// sim/core/bending-forces.ts. Second-neighbour springs (i, i+2), a fraction of the structural
// stiffness, remain as an option: they resist folding but add no bending stiffness about a
// straight line.
import { NODE_PINNED, RELATION_SECOND_NEIGHBOUR, RELATION_STRUCTURAL } from '../core/model.ts';
import { ModelBuilder } from '../core/model-builder.ts';
import type { BuiltSystem } from './built-system.ts';
import type { ControlChannelInfo } from './control-channel.ts';
import { dampingFromRatio } from './spring-damping.ts';

export type ChainAnchor = 'top-pinned' | 'both-pinned' | 'free' | 'top-driven';
export type Axis = 'x' | 'y' | 'z';
/** A chain end: 'top' is node 0, 'bottom' the last node. */
export type ChainEnd = 'top' | 'bottom';

export interface ChainParameters {
  partCount: number;
  lengthM: number;
  /** Mass of the whole chain, kg. */
  totalMassKg: number;
  /** Axial rigidity EA, N. */
  axialStiffnessN: number;
  /** Stiffness of the (i, i+2) springs over the structural one, dimensionless (0: none). */
  secondNeighbourSpringRatio: number;
  /** Bending rigidity EI, N·m² (0 or absent: none). */
  bendingStiffnessNm2?: number;
  /**
   * Damping ratio of each hinge's middle node moving across the line of its two neighbours
   * (a clamp's: its free node across the clamp direction), dimensionless.
   */
  bendingDampingRatio?: number;
  /** Ends whose position and direction are held; needs bendingStiffnessNm2 > 0. */
  clampedEnds?: ChainEnd[];
  /** Further pinned nodes; negative indices count from the free end (−1: the tip). */
  pinnedNodes?: number[];
  /**
   * Further nodes moved by control channels along drivenAxes, like a driven top; negative
   * indices count from the free end. Channels "<node label>-offset-<axis>" ("tip-offset-x").
   */
  drivenNodes?: number[];
  /** Damping ratio of each spring's two-mass oscillator, dimensionless. */
  dampingRatio: number;
  /** Outer diameter, m: sets the fluid panel width and the displaced volume. */
  diameterM: number;
  anchor: ChainAnchor;
  /** Position of node 0 (the top), m. */
  originM: [number, number, number];
  /** Direction the chain is laid out in from node 0, unit vector. */
  directionUnit: [number, number, number];
  /** Nodes pushed by control forces; negative indices count from the free end (−1: the tip). */
  forceHandles: number[];
  /** Axes along which each handle is pushed (one control channel each). */
  forceAxes: Axis[];
  /** Axes along which a driven top and the drivenNodes follow their control channels. */
  drivenAxes: Axis[];
}

const AXIS_INDEX: Record<Axis, number> = { x: 0, y: 1, z: 2 };

export function buildChain(p: ChainParameters): BuiltSystem<ChainParameters> {
  if (!Number.isInteger(p.partCount) || p.partCount < 1) throw new RangeError(`partCount must be an integer ≥ 1, got ${p.partCount}`);
  const nodeCount = p.partCount + 1;
  const segmentM = p.lengthM / p.partCount;
  const partMassKg = p.totalMassKg / p.partCount;
  const partVolumeM3 = Math.PI * 0.25 * p.diameterM * p.diameterM * segmentM;
  const dir = normalised(p.directionUnit);
  const builder = new ModelBuilder(8, 2, p.diameterM);
  for (let i = 0; i < nodeCount; i++) {
    const share = i === 0 || i === nodeCount - 1 ? 0.5 : 1;
    builder.addNode({
      positionM: [p.originM[0] + dir[0] * segmentM * i, p.originM[1] + dir[1] * segmentM * i, p.originM[2] + dir[2] * segmentM * i],
      massKg: partMassKg * share,
      volumeM3: partVolumeM3 * share,
    });
  }
  const structuralK = p.axialStiffnessN / segmentM;
  for (let i = 0; i + 1 < nodeCount; i++) {
    const c = dampingFromRatio(p.dampingRatio, structuralK, builder.massOf(i), builder.massOf(i + 1));
    builder.addSpring(i, i + 1, structuralK, c, RELATION_STRUCTURAL);
    builder.addPanel([i, i + 1]);
  }
  const secondNeighbourK = structuralK * p.secondNeighbourSpringRatio;
  if (secondNeighbourK > 0) {
    for (let i = 0; i + 2 < nodeCount; i++) {
      const c = dampingFromRatio(p.dampingRatio, secondNeighbourK, builder.massOf(i), builder.massOf(i + 2));
      builder.addSpring(i, i + 2, secondNeighbourK, c, RELATION_SECOND_NEIGHBOUR);
    }
  }
  const rigidityNm2 = p.bendingStiffnessNm2 ?? 0;
  const bendingZeta = p.bendingDampingRatio ?? 0;
  if (!(rigidityNm2 >= 0)) throw new RangeError(`bendingStiffnessNm2 must be ≥ 0 N·m², got ${rigidityNm2}`);
  const clampedEnds = p.clampedEnds ?? [];
  if (clampedEnds.length > 0 && !(rigidityNm2 > 0)) {
    throw new RangeError('a clamped end needs bending rigidity: give bendingStiffnessNm2 > 0 (EI, N·m²)');
  }
  if (rigidityNm2 > 0) {
    const hingeK = rigidityNm2 / segmentM;
    for (let i = 1; i + 1 < nodeCount; i++) {
      // η = ζ·ℓ·√(k·m): the middle node's transverse stiffness is 4k/ℓ² and damping 4η/ℓ².
      builder.addHinge(i - 1, i, i + 1, hingeK, bendingZeta * segmentM * Math.sqrt(hingeK * builder.massOf(i)));
    }
    const clampK = (2 * rigidityNm2) / segmentM;
    for (const end of clampedEnds) {
      const held = end === 'top' ? 0 : nodeCount - 1;
      const neighbour = end === 'top' ? 1 : nodeCount - 2;
      // The free node's transverse stiffness is k/ℓ² and damping η/ℓ², so η = 2ζ·ℓ·√(k·m).
      builder.addClamp(held, neighbour, clampK, 2 * bendingZeta * segmentM * Math.sqrt(clampK * builder.massOf(neighbour)));
    }
  }
  if (p.anchor === 'top-pinned' || p.anchor === 'both-pinned') builder.setFlag(0, NODE_PINNED);
  if (p.anchor === 'both-pinned') builder.setFlag(nodeCount - 1, NODE_PINNED);
  for (const end of clampedEnds) {
    const held = end === 'top' ? 0 : nodeCount - 1;
    // A driven top stays driven: the clamp then holds its direction while it moves.
    if (!(held === 0 && p.anchor === 'top-driven')) builder.setFlag(held, NODE_PINNED);
  }
  for (const index of p.pinnedNodes ?? []) builder.setFlag(nodeIndex(index, nodeCount, 'pinned node'), NODE_PINNED);

  const channels: ControlChannelInfo[] = [];
  if (p.anchor === 'top-driven') {
    const axes: [number, number, number] = [-1, -1, -1];
    for (const axis of p.drivenAxes) {
      axes[AXIS_INDEX[axis]] = channels.length;
      channels.push({ index: channels.length, name: `top-offset-${axis}`, kind: 'driven-offset', unit: 'm', description: `displacement of the driven top along ${axis} from its start, reached at the end of each control interval`, axis, node: 0, clamp: null });
    }
    builder.addDriven(0, axes);
  }
  for (const index of p.drivenNodes ?? []) {
    const node = nodeIndex(index, nodeCount, 'driven node');
    const label = handleLabel(index);
    const axes: [number, number, number] = [-1, -1, -1];
    for (const axis of p.drivenAxes) {
      axes[AXIS_INDEX[axis]] = channels.length;
      channels.push({ index: channels.length, name: `${label}-offset-${axis}`, kind: 'driven-offset', unit: 'm', description: `displacement of node ${node} (${label}) along ${axis} from its start, reached at the end of each control interval`, axis, node, clamp: null });
    }
    builder.addDriven(node, axes);
  }
  for (const handle of p.forceHandles) {
    const node = nodeIndex(handle, nodeCount, 'force handle');
    const axes: [number, number, number] = [-1, -1, -1];
    const label = handleLabel(handle);
    for (const axis of p.forceAxes) {
      axes[AXIS_INDEX[axis]] = channels.length;
      channels.push({ index: channels.length, name: `force-${label}-${axis}`, kind: 'handle-force', unit: 'N', description: `external force on node ${node} (${label}) along ${axis}`, axis, node, clamp: null });
    }
    builder.addHandle(node, axes);
  }
  return { kind: 'chain', model: builder.build(), parameters: p, controlChannels: channels };
}

/**
 * Channel names follow the handle as the scenario gives it, not the resolved node, so they
 * stay the same across episodes with different part counts: "tip" for −1, "tip-2" for −3
 * (two before the tip), "node4" for 4.
 */
function handleLabel(handle: number): string {
  if (handle === -1) return 'tip';
  if (handle < -1) return `tip-${-handle - 1}`;
  return `node${handle}`;
}

function nodeIndex(index: number, nodeCount: number, what: string): number {
  const node = index < 0 ? nodeCount + index : index;
  if (!Number.isInteger(node) || node < 0 || node >= nodeCount) throw new RangeError(`${what} ${index} is outside the chain's ${nodeCount} nodes`);
  return node;
}

function normalised(v: [number, number, number]): [number, number, number] {
  const length = Math.hypot(v[0], v[1], v[2]);
  if (!(length > 0)) throw new RangeError('chain direction must be a non-zero vector');
  return [v[0] / length, v[1] / length, v[2] / length];
}
