// Chains: ropes, cables and tethers made of equal parts. Part j is the segment between nodes
// j and j+1; its mass is lumped half to each end node. Structural springs join neighbours with
// k = EA / segment length; bending springs join every second node (i, i+2) with a stiffness
// given as a fraction of the structural one (the usual mass-spring bending model; it resists
// folding but adds no linear bending stiffness to a straight chain).
import { ModelBuilder } from '../core/model-builder.ts';
import { NODE_PINNED, RELATION_BENDING, RELATION_STRUCTURAL } from '../core/model.ts';
import type { BuiltSystem } from './built-system.ts';
import type { ControlChannelInfo } from './control-channel.ts';
import { dampingFromRatio } from './spring-damping.ts';

export type ChainAnchor = 'top-pinned' | 'both-pinned' | 'free' | 'top-driven';
export type Axis = 'x' | 'y' | 'z';

export interface ChainParameters {
  partCount: number;
  lengthM: number;
  /** Mass of the whole chain, kg. */
  totalMassKg: number;
  /** Axial rigidity EA, N. */
  axialStiffnessN: number;
  /** Bending spring stiffness over structural spring stiffness, dimensionless (0: none). */
  bendingStiffnessRatio: number;
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
  /** Axes along which a driven top follows its control channels (top-driven only). */
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
  const bendingK = structuralK * p.bendingStiffnessRatio;
  if (bendingK > 0) {
    for (let i = 0; i + 2 < nodeCount; i++) {
      const c = dampingFromRatio(p.dampingRatio, bendingK, builder.massOf(i), builder.massOf(i + 2));
      builder.addSpring(i, i + 2, bendingK, c, RELATION_BENDING);
    }
  }
  if (p.anchor === 'top-pinned' || p.anchor === 'both-pinned') builder.setFlag(0, NODE_PINNED);
  if (p.anchor === 'both-pinned') builder.setFlag(nodeCount - 1, NODE_PINNED);

  const channels: ControlChannelInfo[] = [];
  if (p.anchor === 'top-driven') {
    const axes: [number, number, number] = [-1, -1, -1];
    for (const axis of p.drivenAxes) {
      axes[AXIS_INDEX[axis]] = channels.length;
      channels.push({ index: channels.length, name: `top-offset-${axis}`, kind: 'driven-offset', unit: 'm', description: `displacement of the driven top along ${axis} from its start, reached at the end of each control interval` });
    }
    builder.addDriven(0, axes);
  }
  for (const handle of p.forceHandles) {
    const node = handle < 0 ? nodeCount + handle : handle;
    if (node < 0 || node >= nodeCount) throw new RangeError(`force handle ${handle} is outside the chain's ${nodeCount} nodes`);
    const axes: [number, number, number] = [-1, -1, -1];
    const label = handleLabel(handle);
    for (const axis of p.forceAxes) {
      axes[AXIS_INDEX[axis]] = channels.length;
      channels.push({ index: channels.length, name: `force-${label}-${axis}`, kind: 'handle-force', unit: 'N', description: `external force on node ${node} (${label}) along ${axis}` });
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

function normalised(v: [number, number, number]): [number, number, number] {
  const length = Math.hypot(v[0], v[1], v[2]);
  if (!(length > 0)) throw new RangeError('chain direction must be a non-zero vector');
  return [v[0] / length, v[1] / length, v[2] / length];
}
