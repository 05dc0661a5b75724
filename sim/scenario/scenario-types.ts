// The shape of a checked scenario: one JSON file that describes a family of systems (a sweep),
// the world they move in, how they are driven and recorded, how many episodes to draw and how
// to split them. SI units throughout, named in the keys. Every numeric physical parameter is a
// NumericValueSpec: a plain number for a fixed value or a distribution drawn once per episode.
// Defaults named in the schema are filled in by checking, so every member below is present.
import type { ControlSpec } from '../controls/control-spec.ts';
import type { NumericValueSpec } from '../random/distribution.ts';
import type { Axis, ChainAnchor } from '../systems/chain.ts';
import type { LatticeBase, MaterialMap2D, MaterialMap3D } from '../systems/lattice.ts';

export type Vector3Spec = [NumericValueSpec, NumericValueSpec, NumericValueSpec];

export interface ChainSystemSpec {
  kind: 'chain';
  partCount: NumericValueSpec;
  lengthM: NumericValueSpec;
  totalMassKg: NumericValueSpec;
  axialStiffnessN: NumericValueSpec;
  bendingStiffnessRatio: NumericValueSpec;
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

export interface LatticeSystemSpec {
  kind: 'lattice';
  cellSizeM: NumericValueSpec;
  shape: LatticeShapeSpec;
  materials: LatticeMaterialSpec[];
  base: LatticeBase;
  originM: Vector3Spec;
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
}

export interface TimeSpec {
  recordIntervalS: number;
  recordedSteps: number;
  /** A count, "auto", or {accuracy: ε}: "auto" plus enough sub-steps for a relative energy band ε. */
  substeps: number | 'auto' | { accuracy: number };
  /** Fraction of the critical step that "auto" sub-steps stay within. */
  autoSafety: number;
}

export interface InitialStateSpec {
  /** Standard deviation of the normal noise added to each coordinate of every free node, m. */
  positionNoiseM: NumericValueSpec;
  /** Standard deviation of the normal noise given to each velocity component of every free node, m/s. */
  velocityNoiseMPerS: NumericValueSpec;
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

export interface SplitsSpec {
  fractions: Record<SplitName, number>;
  /** Checked in order before the fractions; the first matching rule decides. */
  heldOut: HeldOutRule[];
}

export interface ExportSpec {
  format: 'npz' | 'hdf5' | 'both';
  dtype: 'float32' | 'float64';
  /** Also store impulse-averaged forces: edge_tension, contact_normal_force, contact_friction_force, fluid_force. */
  forces: boolean;
}

export interface NumericsSpec {
  /** Book every force's work (energy_flows array, balance labels). */
  energyBalance: boolean;
  /** Share of episodes rerun at half the sub-step for a Richardson error estimate, 0 to 1. */
  richardsonShare: number;
}

export interface Scenario {
  $schema?: string;
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
  numerics: NumericsSpec;
}
