// The simulation model: every node, spring, cell and fluid panel of one system, stored as flat
// typed arrays (structure of arrays). Topology is fixed once built; stepping only writes into
// the state arrays, so the integrator never allocates.

/** Node flag bits. A node without PINNED or DRIVEN is integrated freely. */
export const NODE_PINNED = 1;
/** Position prescribed over time by a control channel (e.g. the driven top of a tether). */
export const NODE_DRIVEN = 2;
/** Receives external control forces. */
export const NODE_HANDLE = 4;

/** Spring relation types, stored per spring and exported as edge labels for graph models. */
export const RELATION_STRUCTURAL = 0;
/** Springs from node i to node i + 2 of a chain: they resist folding, not small bends. */
export const RELATION_SECOND_NEIGHBOUR = 1;
export const RELATION_CELL_EDGE = 2;
export const RELATION_FACE_DIAGONAL = 3;
export const RELATION_BODY_DIAGONAL = 4;
export const RELATION_NAMES = ['structural', 'second-neighbour', 'cell-edge', 'face-diagonal', 'body-diagonal'] as const;

export interface Model {
  readonly nodeCount: number;
  /** Positions, 3 per node, m. */
  readonly positionM: Float64Array;
  /** Velocities, 3 per node, m/s. */
  readonly velocityMPerS: Float64Array;
  readonly massKg: Float64Array;
  /** 1/m for free nodes, 0 for pinned and driven nodes (their motion is prescribed). */
  readonly inverseMassPerKg: Float64Array;
  /** Displaced volume per node, m³ (for buoyancy). */
  readonly nodeVolumeM3: Float64Array;
  readonly nodeFlags: Uint8Array;
  /** Material index per node (-1 where none), the material of the first cell that owns it. */
  readonly nodeMaterial: Int16Array;
  /** Actuator channel per node (-1 where none). */
  readonly nodeChannel: Int16Array;

  readonly springCount: number;
  readonly springNodeA: Uint32Array;
  readonly springNodeB: Uint32Array;
  /** Rest lengths with actuation applied, m. Recomputed from baseRestLengthM by the actuation. */
  readonly restLengthM: Float64Array;
  /** Rest lengths of the unactuated system, m. */
  readonly baseRestLengthM: Float64Array;
  readonly stiffnessNPerM: Float64Array;
  /** Damping along the spring axis, N·s/m. */
  readonly dampingNsPerM: Float64Array;
  readonly springRelation: Uint8Array;

  /**
   * Sparse actuation table: rest length of spring s = base·(1 + Σ gain·u[channel]) over the
   * entries naming s. gain = strainMax · (share of the spring's stiffness from that cell).
   */
  readonly actuationEntryCount: number;
  readonly actuationSpring: Uint32Array;
  readonly actuationChannel: Uint16Array;
  readonly actuationGain: Float64Array;

  /** Corner nodes per cell: 8 for 3-D voxels, 4 for 2-D squares. */
  readonly cellCornerCount: number;
  readonly cellCount: number;
  readonly cellCorners: Uint32Array;
  readonly cellMaterial: Int16Array;
  readonly cellChannel: Int16Array;

  /** Nodes per fluid panel: 2 for segments (chains, 2-D outlines), 4 for quad faces. */
  readonly panelNodeCount: number;
  readonly panelCount: number;
  readonly panelNodes: Uint32Array;
  /** Out-of-plane width of segment panels, m (chain diameter or 2-D lattice thickness). */
  readonly panelWidthM: number;

  /** Handle nodes and, per handle and axis, the control channel that pushes it (-1: none). */
  readonly handleNodes: Uint32Array;
  readonly handleForceChannel: Int32Array;
  /** Driven nodes, their reference positions (m) and per axis the offset channel (-1: none). */
  readonly drivenNodes: Uint32Array;
  readonly drivenOriginM: Float64Array;
  readonly drivenOffsetChannel: Int32Array;

  /** Number of control channels this model reads from the control vector. */
  readonly controlChannelCount: number;

  /**
   * Bending hinges (see bending-forces.ts): node triples (previous, middle, next), 3 per hinge,
   * each with energy ½·k·|t_b − t_a|² = k·(1 − cos φ) in the turning angle φ between the unit
   * tangents of its two segments. k = EI / Voronoi length, N·m; damping η, N·m·s.
   */
  readonly hingeCount: number;
  readonly hingeNodes: Uint32Array;
  readonly hingeStiffnessNm: Float64Array;
  readonly hingeDampingNms: Float64Array;

  /**
   * Clamps: the direction of one segment held along a fixed unit vector d (a clamped end).
   * Node pairs (held node, its neighbour), 2 per clamp; energy ½·k·|t − d|², N·m; damping η.
   */
  readonly clampCount: number;
  readonly clampNodes: Uint32Array;
  readonly clampDirectionUnit: Float64Array;
  readonly clampStiffnessNm: Float64Array;
  readonly clampDampingNms: Float64Array;
}
