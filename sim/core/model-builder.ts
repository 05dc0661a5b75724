// Assembles a Model from nodes, springs, cells and panels added one at a time. Builders of
// systems (chains, lattices) use it once per episode; the result is a set of fixed typed arrays.
import type { Model } from './model.ts';
import { NODE_DRIVEN, NODE_HANDLE, NODE_PINNED } from './model.ts';

export interface NodeInit {
  positionM: [number, number, number];
  massKg: number;
  volumeM3?: number;
  flags?: number;
  material?: number;
  channel?: number;
  velocityMPerS?: [number, number, number];
}

export class ModelBuilder {
  private readonly positions: number[] = [];
  private readonly velocities: number[] = [];
  private readonly masses: number[] = [];
  private readonly volumes: number[] = [];
  private readonly flags: number[] = [];
  private readonly materials: number[] = [];
  private readonly channels: number[] = [];
  private readonly springA: number[] = [];
  private readonly springB: number[] = [];
  private readonly springRest: number[] = [];
  private readonly springK: number[] = [];
  private readonly springC: number[] = [];
  private readonly springRel: number[] = [];
  private readonly springIndexByPair = new Map<number, number>();
  private readonly actSpring: number[] = [];
  private readonly actChannel: number[] = [];
  private readonly actGain: number[] = [];
  private readonly cells: number[] = [];
  private readonly cellMaterials: number[] = [];
  private readonly cellChannels: number[] = [];
  private readonly panels: number[] = [];
  private readonly handleNodes: number[] = [];
  private readonly handleChannels: number[] = [];
  private readonly drivenNodes: number[] = [];
  private readonly drivenChannels: number[] = [];
  private controlChannels = 0;
  private readonly hinges: number[] = [];
  private readonly hingeK: number[] = [];
  private readonly hingeC: number[] = [];
  private readonly clamps: number[] = [];
  private readonly clampDirections: number[] = [];
  private readonly clampK: number[] = [];
  private readonly clampC: number[] = [];

  constructor(
    readonly cellCornerCount: number = 8,
    readonly panelNodeCount: number = 4,
    readonly panelWidthM: number = 0,
  ) {}

  get nodeCount(): number {
    return this.masses.length;
  }

  addNode(init: NodeInit): number {
    if (!(init.massKg >= 0) || !Number.isFinite(init.massKg)) {
      throw new RangeError(`node mass must be a finite number of kg ≥ 0, got ${init.massKg}`);
    }
    const index = this.masses.length;
    this.positions.push(init.positionM[0], init.positionM[1], init.positionM[2]);
    const v = init.velocityMPerS ?? [0, 0, 0];
    this.velocities.push(v[0], v[1], v[2]);
    this.masses.push(init.massKg);
    this.volumes.push(init.volumeM3 ?? 0);
    this.flags.push(init.flags ?? 0);
    this.materials.push(init.material ?? -1);
    this.channels.push(init.channel ?? -1);
    return index;
  }

  addMass(node: number, massKg: number, volumeM3 = 0): void {
    this.masses[node] += massKg;
    this.volumes[node] += volumeM3;
  }

  setNodeMaterial(node: number, material: number, channel: number): void {
    if (this.materials[node] < 0) this.materials[node] = material;
    if (this.channels[node] < 0) this.channels[node] = channel;
  }

  setFlag(node: number, flag: number): void {
    this.flags[node] |= flag;
  }

  /** The rest position of a node as built, m. */
  position(node: number): [number, number, number] {
    const o = 3 * node;
    return [this.positions[o], this.positions[o + 1], this.positions[o + 2]];
  }

  /**
   * Adds a spring between a and b, or adds stiffness and damping to the one already there
   * (cells sharing an edge each contribute their share). Returns the spring's index.
   */
  addSpring(a: number, b: number, stiffnessNPerM: number, dampingNsPerM: number, relation: number, restLengthM?: number): number {
    const lo = Math.min(a, b);
    const hi = Math.max(a, b);
    const key = lo * 0x200000 + hi;
    const existing = this.springIndexByPair.get(key);
    if (existing !== undefined) {
      this.springK[existing] += stiffnessNPerM;
      this.springC[existing] += dampingNsPerM;
      return existing;
    }
    const pa = this.position(a);
    const pb = this.position(b);
    const rest = restLengthM ?? Math.hypot(pb[0] - pa[0], pb[1] - pa[1], pb[2] - pa[2]);
    const index = this.springA.length;
    this.springA.push(a);
    this.springB.push(b);
    this.springRest.push(rest);
    this.springK.push(stiffnessNPerM);
    this.springC.push(dampingNsPerM);
    this.springRel.push(relation);
    this.springIndexByPair.set(key, index);
    return index;
  }

  stiffnessOf(spring: number): number {
    return this.springK[spring];
  }

  setDamping(spring: number, dampingNsPerM: number): void {
    this.springC[spring] = dampingNsPerM;
  }

  get springCount(): number {
    return this.springA.length;
  }

  springNodes(spring: number): [number, number] {
    return [this.springA[spring], this.springB[spring]];
  }

  massOf(node: number): number {
    return this.masses[node];
  }

  /** Registers that `stiffnessShareNPerM` of spring s contracts/extends with channel. */
  addActuation(spring: number, channel: number, stiffnessShareNPerM: number, strainMax: number): void {
    this.actSpring.push(spring);
    this.actChannel.push(channel);
    this.actGain.push(stiffnessShareNPerM * strainMax); // normalised by total stiffness in build()
    this.useChannel(channel);
  }

  addCell(corners: readonly number[], material: number, channel: number): void {
    if (corners.length !== this.cellCornerCount) {
      throw new RangeError(`a cell needs ${this.cellCornerCount} corners, got ${corners.length}`);
    }
    this.cells.push(...corners);
    this.cellMaterials.push(material);
    this.cellChannels.push(channel);
  }

  addPanel(nodes: readonly number[]): void {
    if (nodes.length !== this.panelNodeCount) {
      throw new RangeError(`a panel needs ${this.panelNodeCount} nodes, got ${nodes.length}`);
    }
    this.panels.push(...nodes);
  }

  /** Makes node a handle pushed by channels (one per axis, -1 for none). */
  addHandle(node: number, channels: [number, number, number]): void {
    this.setFlag(node, NODE_HANDLE);
    this.handleNodes.push(node);
    for (const c of channels) {
      this.handleChannels.push(c);
      if (c >= 0) this.useChannel(c);
    }
  }

  /** Makes node driven: its position is its built position plus per-axis channel offsets. */
  addDriven(node: number, channels: [number, number, number]): void {
    this.setFlag(node, NODE_DRIVEN);
    this.drivenNodes.push(node);
    for (const c of channels) {
      this.drivenChannels.push(c);
      if (c >= 0) this.useChannel(c);
    }
  }

  /** Adds a bending hinge at `middle` between the segments to `previous` and `next`. */
  addHinge(previous: number, middle: number, next: number, stiffnessNm: number, dampingNms: number): void {
    if (!(stiffnessNm >= 0) || !(dampingNms >= 0)) throw new RangeError(`hinge stiffness and damping must be ≥ 0, got ${stiffnessNm} N·m and ${dampingNms} N·m·s`);
    this.hinges.push(previous, middle, next);
    this.hingeK.push(stiffnessNm);
    this.hingeC.push(dampingNms);
  }

  /** Holds the segment from `held` to `neighbour` along its built direction. */
  addClamp(held: number, neighbour: number, stiffnessNm: number, dampingNms: number): void {
    if (!(stiffnessNm >= 0) || !(dampingNms >= 0)) throw new RangeError(`clamp stiffness and damping must be ≥ 0, got ${stiffnessNm} N·m and ${dampingNms} N·m·s`);
    const a = this.position(held);
    const b = this.position(neighbour);
    const length = Math.hypot(b[0] - a[0], b[1] - a[1], b[2] - a[2]);
    if (!(length > 0)) throw new RangeError(`clamp nodes ${held} and ${neighbour} coincide, so the clamp has no direction`);
    this.clamps.push(held, neighbour);
    this.clampDirections.push((b[0] - a[0]) / length, (b[1] - a[1]) / length, (b[2] - a[2]) / length);
    this.clampK.push(stiffnessNm);
    this.clampC.push(dampingNms);
  }

  useChannel(channel: number): void {
    this.controlChannels = Math.max(this.controlChannels, channel + 1);
  }

  build(): Model {
    const n = this.masses.length;
    for (let i = 0; i < n; i++) {
      if (!(this.masses[i] > 0)) throw new RangeError(`node ${i} has no mass; every node needs a positive mass in kg`);
    }
    const flags = Uint8Array.from(this.flags);
    const mass = Float64Array.from(this.masses);
    const inverseMass = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      inverseMass[i] = flags[i] & (NODE_PINNED | NODE_DRIVEN) ? 0 : 1 / mass[i];
    }
    const stiffness = Float64Array.from(this.springK);
    const gains = Float64Array.from(this.actGain);
    for (let e = 0; e < gains.length; e++) gains[e] /= stiffness[this.actSpring[e]];
    const drivenNodes = Uint32Array.from(this.drivenNodes);
    const drivenOrigin = new Float64Array(3 * drivenNodes.length);
    for (let d = 0; d < drivenNodes.length; d++) {
      for (let k = 0; k < 3; k++) drivenOrigin[3 * d + k] = this.positions[3 * drivenNodes[d] + k];
    }
    const baseRest = Float64Array.from(this.springRest);
    return {
      nodeCount: n,
      positionM: Float64Array.from(this.positions),
      velocityMPerS: Float64Array.from(this.velocities),
      massKg: mass,
      inverseMassPerKg: inverseMass,
      nodeVolumeM3: Float64Array.from(this.volumes),
      nodeFlags: flags,
      nodeMaterial: Int16Array.from(this.materials),
      nodeChannel: Int16Array.from(this.channels),
      springCount: this.springA.length,
      springNodeA: Uint32Array.from(this.springA),
      springNodeB: Uint32Array.from(this.springB),
      restLengthM: Float64Array.from(baseRest),
      baseRestLengthM: baseRest,
      stiffnessNPerM: stiffness,
      dampingNsPerM: Float64Array.from(this.springC),
      springRelation: Uint8Array.from(this.springRel),
      actuationEntryCount: this.actSpring.length,
      actuationSpring: Uint32Array.from(this.actSpring),
      actuationChannel: Uint16Array.from(this.actChannel),
      actuationGain: gains,
      cellCornerCount: this.cellCornerCount,
      cellCount: this.cellMaterials.length,
      cellCorners: Uint32Array.from(this.cells),
      cellMaterial: Int16Array.from(this.cellMaterials),
      cellChannel: Int16Array.from(this.cellChannels),
      panelNodeCount: this.panelNodeCount,
      panelCount: this.panels.length / this.panelNodeCount,
      panelNodes: Uint32Array.from(this.panels),
      panelWidthM: this.panelWidthM,
      handleNodes: Uint32Array.from(this.handleNodes),
      handleForceChannel: Int32Array.from(this.handleChannels),
      drivenNodes,
      drivenOriginM: drivenOrigin,
      drivenOffsetChannel: Int32Array.from(this.drivenChannels),
      controlChannelCount: this.controlChannels,
      hingeCount: this.hingeK.length,
      hingeNodes: Uint32Array.from(this.hinges),
      hingeStiffnessNm: Float64Array.from(this.hingeK),
      hingeDampingNms: Float64Array.from(this.hingeC),
      clampCount: this.clampK.length,
      clampNodes: Uint32Array.from(this.clamps),
      clampDirectionUnit: Float64Array.from(this.clampDirections),
      clampStiffnessNm: Float64Array.from(this.clampK),
      clampDampingNms: Float64Array.from(this.clampC),
    };
  }
}
