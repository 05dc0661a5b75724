// Limits that keep one episode within a laptop's memory and time, shared by the schema, the
// physical checks and their messages so the number a user is told is the number enforced.

/** Nodes of one system. */
export const MAX_NODES = 100_000;
/** Chain parts (a chain of n parts has n + 1 nodes). */
export const MAX_CHAIN_PARTS = MAX_NODES - 1;
/** Cells of one lattice body, from a map or a generator. */
export const MAX_LATTICE_CELLS = 50_000;
/** Records of one episode. */
export const MAX_RECORDED_STEPS = 1_000_000;
/**
 * Node states recorded in one episode, (recordedSteps + 1) × nodes: positions and velocities
 * in float64 take 48 bytes each, so this caps one episode's arrays near 480 MB.
 */
export const MAX_RECORDED_NODE_STATES = 10_000_000;
/** Record intervals a settled start may run before recording (settleS / recordIntervalS). */
export const MAX_SETTLE_INTERVALS = MAX_RECORDED_STEPS;
/**
 * Coordinates a normal-mode start (/initialState/mode) may decompose, per episode: the modes
 * of a free 150-node lattice block (450 coordinates) took 1.9 to 2.7 s on the shared 2-core
 * development machine (ml-matrix 6.15, measured under a load average near 17; 300 coordinates
 * took 0.8 to 1.4 s), and the time grows as n³.
 */
export const MAX_MODE_COORDINATES = 450;
/** Sub-steps per record interval, fixed or chosen by "auto". */
export const MAX_SUBSTEPS = 100_000;
/** Episodes of one scenario. */
export const MAX_EPISODES = 100_000_000;
/** Largest seed a JSON number carries exactly: 2^53 − 1. */
export const MAX_NUMBER_SEED = Number.MAX_SAFE_INTEGER;
/** Largest seed at all: 2^64 − 1, written as a decimal string. */
export const MAX_STRING_SEED = 18446744073709551615n;
/** Sum of split fractions may differ from 1 by this much (rounding in hand-written decimals). */
export const FRACTION_SUM_TOLERANCE = 1e-9;
/** Materials of one lattice body. */
export const MAX_LATTICE_MATERIALS = 64;
/** Material templates of one scenario. */
export const MAX_MATERIAL_TEMPLATES = 64;
/** Characters of a material's name. */
export const MAX_MATERIAL_NAME_CHARS = 64;
/** Control channels that actuate lattice cells; channels are numbered 0 to this − 1. */
export const MAX_ACTUATOR_CHANNELS = 64;
/** Static obstacles besides the ground plane. */
export const MAX_OBSTACLES = 64;
/** Longest time between records, s (one hour). */
export const MAX_RECORD_INTERVAL_S = 3600;
/** Longest ramp-in of the control signals, s. */
export const MAX_RAMP_IN_S = 3600;
/** Longest settling before recording, s. */
export const MAX_SETTLE_S = 600;
/** Strata per parameter of a stratified design. */
export const MAX_DESIGN_BINS = 1000;
/** Characters of a scenario's description. */
export const MAX_DESCRIPTION_CHARS = 4000;
/** Markers listed by node index in an observation block. */
export const MAX_OBSERVATION_MARKERS = MAX_NODES;
/**
 * How far an observation rate or latency may be from a whole number of record intervals and
 * still count as one, relative: decimal fractions like 0.02 s are not exact in binary.
 */
export const OBSERVATION_TIMING_TOLERANCE = 1e-9;

/**
 * Lightest node mass a scenario may give, kg (1 µg): far below any tether or fin of the trade,
 * far above the point where a mass divided over nodes rounds to 0 or the step bound overflows.
 */
export const MIN_NODE_MASS_KG = 1e-9;

/** Most named parameters under /params: enough for a gradient per segment, few enough to read. */
export const MAX_NAMED_PARAMETERS = 256;
