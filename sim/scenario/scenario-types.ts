// The shape of a checked scenario: one JSON file that describes a family of systems (a sweep),
// the world they move in, how they are driven and recorded, how many episodes to draw and how
// to split them. SI units throughout, named in the keys. Every numeric physical parameter is a
// NumericValueSpec: a plain number for a fixed value or a distribution drawn once per episode.
// Defaults named in the schema are filled in by checking, so every member below is present.
import type { ControlSpec } from '../controls/control-spec.ts';
import type { DesignSpec } from '../design/design-spec.ts';
import type { NumericValueSpec } from '../random/distribution.ts';
import type { Axis, ChainAnchor, ChainEnd } from '../systems/chain.ts';
import type { LatticeBase, LatticeFace, MaterialMap2D, MaterialMap3D } from '../systems/lattice.ts';
import type { ExportCompression } from './export-compression.ts';

export type Vector3Spec = [NumericValueSpec, NumericValueSpec, NumericValueSpec];

export interface ChainSystemSpec {
  kind: 'chain';
  partCount: NumericValueSpec;
  lengthM: NumericValueSpec;
  totalMassKg: NumericValueSpec;
  axialStiffnessN: NumericValueSpec;
  secondNeighbourSpringRatio: NumericValueSpec;
  /** Bending rigidity EI, N·m². */
  bendingStiffnessNm2: NumericValueSpec;
  bendingDampingRatio: NumericValueSpec;
  clampedEnds: ChainEnd[];
  /** Node indices; negative ones count from the free end (−1: the tip). */
  pinnedNodes: NumericValueSpec[];
  drivenNodes: NumericValueSpec[];
  dampingRatio: NumericValueSpec;
  diameterM: NumericValueSpec;
  anchor: ChainAnchor;
  originM: Vector3Spec;
  directionUnit: Vector3Spec;
  /** Node indices; negative ones count from the free end (−1: the tip). */
  forceHandles: NumericValueSpec[];
  forceAxes: Axis[];
  drivenAxes: Axis[];
}

export interface LatticeMaterialSpec {
  name: string;
  youngsModulusPa: NumericValueSpec;
  densityKgPerM3: NumericValueSpec;
  dampingRatio: NumericValueSpec;
  actuatorChannel: number | null;
  actuationStrainMax: NumericValueSpec;
}

export type MaterialMap = MaterialMap2D | MaterialMap3D;

/** One of the listed material maps per episode, equally likely or by `weights`. */
export interface MapListShapeSpec {
  maps: MaterialMap[];
  weights?: number[];
}

/** A random face-connected body grown cell by cell inside a box of cells. */
export interface ShapeGeneratorSpec {
  dimension: 2 | 3;
  /** Box the body grows in, cells along x, y (and z in 3-D). */
  boundsCells: NumericValueSpec[];
  /** Cells of the body; at most the box's cell count. */
  cellCount: NumericValueSpec;
  /** Relative chance of each material per cell, one per material. */
  materialWeights: NumericValueSpec[];
  /**
   * When given, every cell of an actuated material is driven by one of this many channels,
   * each equally likely; otherwise cells keep their material's own channel.
   */
  actuatedChannelCount?: NumericValueSpec;
}

export interface GeneratedShapeSpec {
  generator: ShapeGeneratorSpec;
}

export type LatticeShapeSpec = MapListShapeSpec | GeneratedShapeSpec;

export interface LatticeClampSpec {
  name?: string;
  face?: LatticeFace;
  cells?: number[][];
  boxM?: { min: Vector3Spec; max: Vector3Spec };
  drivenAxes: Axis[];
}

export interface LatticeSystemSpec {
  kind: 'lattice';
  cellSizeM: NumericValueSpec;
  shape: LatticeShapeSpec;
  materials: LatticeMaterialSpec[];
  base: LatticeBase;
  originM: Vector3Spec;
  clamps: LatticeClampSpec[];
}

export type SystemSpec = ChainSystemSpec | LatticeSystemSpec;

export interface GroundSpec {
  heightM: NumericValueSpec;
  staticFriction: NumericValueSpec;
  kineticFriction: NumericValueSpec;
}

export interface FluidSpec {
  densityKgPerM3: NumericValueSpec;
  normalDragNsPerM3: NumericValueSpec;
  tangentialDragNsPerM3: NumericValueSpec;
  flowVelocityMPerS: Vector3Spec;
  buoyancy: boolean;
}

/** A static rigid obstacle; sizes by shape (box: sizeM; sphere: radiusM; cylinder: radiusM, lengthM, axis). */
export interface ObstacleSpec {
  shape: 'box' | 'sphere' | 'cylinder';
  centerM: Vector3Spec;
  sizeM?: Vector3Spec;
  radiusM?: NumericValueSpec;
  lengthM?: NumericValueSpec;
  axis?: Axis;
  staticFriction: NumericValueSpec;
  kineticFriction: NumericValueSpec;
}

export interface WorldSpec {
  gravityMPerS2: Vector3Spec;
  airDragPerS: NumericValueSpec;
  /** Absent: no ground plane. */
  ground?: GroundSpec;
  /** Absent: no surrounding fluid. */
  fluid?: FluidSpec;
  /** Static rigid obstacles (none by default). */
  obstacles: ObstacleSpec[];
}

export interface ControlsSpec {
  /** Signal of every channel not named in `channels`. */
  default: ControlSpec;
  /** Per channel, by its name (e.g. "top-offset-x") or its index as a string ("0"). */
  channels: Record<string, ControlSpec>;
  /** Every channel's signal is multiplied by a raised-cosine ramp from 0 to 1 over this long, s (0: none). */
  rampInS: number;
}

export interface TimeSpec {
  recordIntervalS: number;
  recordedSteps: number;
  /** A count, "auto", or {accuracy: ε}: "auto" plus enough sub-steps for a relative energy band ε. */
  substeps: number | 'auto' | { accuracy: number };
  /** Fraction of the critical step that "auto" sub-steps stay within. */
  autoSafety: number;
}

/** A chain's start shape as a planar curve (start-curve.ts); absent: the built straight line. */
export type StartCurveSpec =
  | { kind: 'arc'; curvaturePerM: NumericValueSpec; bendDirectionUnit: Vector3Spec }
  | { kind: 'sine'; amplitudeM: NumericValueSpec; wavelengthM: NumericValueSpec; phaseRad: NumericValueSpec; bendDirectionUnit: Vector3Spec };

/** A start displaced along one of the model's own normal modes (mode-start.ts). */
export interface ModeStartSpec {
  /** 1 = the slowest mode with a restoring stiffness. */
  index: NumericValueSpec;
  /** Largest node displacement, m; the sign chooses the direction. */
  amplitudeM: NumericValueSpec;
  /** Coordinates that take part; the others are held while linearising. */
  axes: Axis[];
}

export interface InitialStateSpec {
  /** Absent: the chain starts along its straight line. Chains only. */
  curve?: StartCurveSpec;
  /** Absent: no mode displacement. */
  mode?: ModeStartSpec;
  rotationRad: NumericValueSpec;
  rotationAxisUnit: Vector3Spec;
  translationM: Vector3Spec;
  settleS: NumericValueSpec;
  settleDragPerS: NumericValueSpec;
  velocityMPerS: Vector3Spec;
  spinRadPerS: Vector3Spec;
  /** Standard deviation of the normal noise added to each coordinate of every free node, m. */
  positionNoiseM: NumericValueSpec;
  /** Standard deviation of the normal noise given to each velocity component of every free node, m/s. */
  velocityNoiseMPerS: NumericValueSpec;
}

/** Which nodes a sensor sees: listed ones (negative indices count from the last node) or every k-th from node 0. */
export type MarkerSpec = { nodes: number[] } | { everyNth: number };

/**
 * What a sensor records beside the ground truth. Absent: no observed arrays. At most one of
 * frameStride and rateHz is given; neither means every record is observed.
 */
export interface ObservationSpec {
  markers: MarkerSpec;
  /** Standard deviation of the Gaussian noise on each observed coordinate, m. */
  positionNoiseM: NumericValueSpec;
  /** Records per observed frame. */
  frameStride?: number;
  /** Observed frames per second; the record rate divided by a whole number. */
  rateHz?: number;
  /** Delay of every observation, s; a whole number of record intervals. */
  latencyS: number;
  /** Chance that a marker is missing from a frame. */
  dropoutProbability: NumericValueSpec;
}

export type SplitName = 'train' | 'validation' | 'test';

export interface HeldOutRule {
  /** Split the matching episodes go to. */
  split: string;
  /** JSON pointer of a sampled parameter, e.g. "/system/partCount". */
  parameter: string;
  /** Matches values strictly above. */
  above?: number;
  /** Matches values strictly below. */
  below?: number;
  /** Matches values in [a, b], both ends included. */
  inside?: [number, number];
}

/** Stratified assignment: each listed parameter cut into `bins` equal-count strata. */
export interface StratifySpec {
  /** JSON pointers of distributed parameters. */
  parameters: string[];
  /** Strata per parameter; absent: 4 (DEFAULT_STRATA_BINS). */
  bins?: number;
}

export interface SplitsSpec {
  fractions: Record<SplitName, number>;
  /** Checked in order before the fractions; the first matching rule decides. */
  heldOut: HeldOutRule[];
  /**
   * Exact numbers of the episodes not held out, per split; at most one split may be left out
   * and takes the rest. Given: replaces the fractions.
   */
  counts?: Partial<Record<SplitName, number>>;
  /** Given: splits are dealt stratum by stratum over these parameters (counts, or fractions rounded). */
  stratify?: StratifySpec;
}

export interface ExportSpec {
  format: 'npz' | 'hdf5' | 'both';
  dtype: 'float32' | 'float64';
  /** Also store impulse-averaged forces: edge_tension, contact_normal_force, contact_friction_force, fluid_force. */
  forces: boolean;
  /** Deflate levels of the data files; see export-compression.ts. */
  compression: ExportCompression;
}

export interface NumericsSpec {
  /** Book every force's work (energy_flows array, balance labels). */
  energyBalance: boolean;
  /** Share of episodes rerun at half the sub-step for a Richardson error estimate, 0 to 1. */
  richardsonShare: number;
}

/**
 * A value given by name instead of by number: {"ref": "/params/<name>"} or {"expr": "<arithmetic>"}
 * (sim/random/derived-expression.ts). Any place of a checked scenario may hold one in place of
 * its NumericValueSpec; sim/scenario/linked-parameters.ts replaces them (by each episode's
 * values for sampling, by the range they reach for the checks) before anything reads the places,
 * so code below that sees NumericValueSpec only.
 */
export type LinkedValueSpec = { ref: string } | { expr: string };

export interface Scenario {
  $schema?: string;
  /** Named parameters by name; absent when the scenario names none. */
  params?: Record<string, NumericValueSpec | LinkedValueSpec>;
  formatVersion: 1;
  name: string;
  description: string;
  system: SystemSpec;
  world: WorldSpec;
  controls: ControlsSpec;
  time: TimeSpec;
  initialState: InitialStateSpec;
  episodes: number;
  /** Master seed: a whole number up to 2^53 − 1, or a decimal string up to 2^64 − 1. */
  seed: number | string;
  splits: SplitsSpec;
  export: ExportSpec;
  /** Absent: the dataset holds the ground truth only. */
  observation?: ObservationSpec;
  /** Absent: every parameter of every episode is drawn independently (as "independent"). */
  design?: DesignSpec;
  /**
   * Largest share of a run's episodes that may be rejected before generation stops with an
   * error naming the parameter ranges that fail; absent: DEFAULT_MAX_REJECTED_FRACTION (0.5).
   */
  maxRejectedFraction?: number;
  numerics: NumericsSpec;
}
