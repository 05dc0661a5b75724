// One episode of a sweep from (scenario, master seed, episode index) alone: every parameter
// drawn from the stream of its JSON pointer, the system built by the real builders, the start
// state set (curve, pose, settling, mode, motion, noise in that order), the observation
// settings resolved, the controls generated per channel and the split assigned.
import type { StepKernel } from '../core/step-kernel-choice.ts';
import type { SpecProblem } from '../random/spec-problem.ts';
import { SpecError } from '../random/spec-problem.ts';
import type { BuiltSystem } from '../systems/built-system.ts';
import { buildChain } from '../systems/chain.ts';
import { buildLattice, latticeDimension } from '../systems/lattice.ts';
import type { ReplayReader } from './control-sampling.ts';
import { sampleControls } from './control-sampling.ts';
import { designCoordinates } from './design/scenario-design.ts';
import { EpisodeDraws } from './episode-draws.ts';
import { applyInitialStateNoise } from './initial-state-noise.ts';
import { latticeBody } from './lattice-shape.ts';
import { scenarioForEpisode } from './linked-parameters.ts';
import { applyModeStart } from './mode-start.ts';
import { INITIAL_POSITION_SUB_STREAM, INITIAL_VELOCITY_SUB_STREAM, initialStateStream, richardsonStream, shapeStream, splitStream } from './parameter-streams.ts';
import { resolveChainParameters } from './resolve-chain.ts';
import { resolveLatticeParameters } from './resolve-lattice.ts';
import { resolveObservation } from './resolve-observation.ts';
import { resolveStartState } from './resolve-start-state.ts';
import { resolveWorld } from './resolve-world.ts';
import type { SampledEpisode } from './sampled-episode.ts';
import type { ScenarioProblem } from './scenario-problem.ts';
import { ScenarioProblemError } from './scenario-problem.ts';
import type { Scenario } from './scenario-types.ts';
import { settleStart } from './settle-start.ts';
import { assignSplit } from './split-assignment.ts';
import { plannedSplit, scenarioSplitPlan, usesPlannedSplits } from './splits/planned-splits.ts';
import { applyStartCurve } from './start-curve.ts';
import { applyStartPose, applyStartVelocity } from './start-pose.ts';

export interface SampleEpisodeOptions {
  /** Reads a replay table (a .npy file named in a "replay" control spec). */
  replay?: ReplayReader;
  /** Step kernel of the settling run (initialState.settleS); never changes a result. */
  kernel?: StepKernel;
}

/**
 * Samples episode `episodeIndex` of a checked scenario. Throws ScenarioProblemError (pointers
 * into the scenario) when a replay file is missing or too short.
 */
export function sampleEpisode(scenario: Scenario, episodeIndex: number, options: SampleEpisodeOptions = {}): SampledEpisode {
  if (!Number.isSafeInteger(episodeIndex) || episodeIndex < 0 || episodeIndex >= scenario.episodes) {
    throw new RangeError(`episode index ${episodeIndex} is outside the scenario's ${scenario.episodes} episodes (0 to ${scenario.episodes - 1})`);
  }
  try {
    return drawEpisode(scenario, episodeIndex, options);
  } catch (error) {
    if (error instanceof SpecError) throw new ScenarioProblemError(error.problems.map(fromSpecProblem));
    throw error;
  }
}

function drawEpisode(written: Scenario, episodeIndex: number, options: SampleEpisodeOptions): SampledEpisode {
  const seed = written.seed;
  const draws = new EpisodeDraws(seed, episodeIndex, designCoordinates(written, episodeIndex));
  // Named parameters first (labelled under /params/<name>), then every place that uses them
  // holds its number; without /params this is `written` itself.
  const scenario = scenarioForEpisode(written, draws, (pointer, value) => draws.record(pointer, value));
  const spec = scenario.system;
  let system: BuiltSystem;
  let dimensions: 2 | 3 = 3;
  if (spec.kind === 'chain') {
    system = buildChain(resolveChainParameters(spec, draws));
  } else {
    const lattice = resolveLatticeParameters(spec, draws);
    const body = latticeBody(spec.shape, lattice.shape, lattice.materials, spec.base === 'clamped', shapeStream(seed, episodeIndex));
    dimensions = latticeDimension(body.materialMap);
    system = buildLattice({ cellSizeM: lattice.cellSizeM, materialMap: body.materialMap, materials: body.materials, base: spec.base, originM: lattice.originM, clamps: lattice.clamps });
  }
  const world = resolveWorld(scenario.world, draws);
  const start = resolveStartState(scenario.initialState, draws);
  if (start.curve !== null) applyStartCurve(system.model, start.curve);
  applyStartPose(system.model, dimensions, start.motion);
  settleStart(system.model, world, start.settleS, start.settleDragPerS, scenario.time.recordIntervalS, scenario.time.autoSafety, options.kernel);
  if (start.mode !== null) {
    const mode = applyModeStart(system.model, { ...start.mode, axes: start.mode.axes.filter((axis) => axis < dimensions) });
    // Derived, not drawn: the frequency of the mode the episode starts in.
    draws.labels['/initialState/mode/frequencyHz'] = mode.frequencyHz;
  }
  applyStartVelocity(system.model, dimensions, start.motion);
  const positionStdM = draws.value(scenario.initialState.positionNoiseM, '/initialState/positionNoiseM', 'none');
  const velocityStdMPerS = draws.value(scenario.initialState.velocityNoiseMPerS, '/initialState/velocityNoiseMPerS', 'none');
  applyInitialStateNoise(
    system.model,
    dimensions,
    positionStdM,
    velocityStdMPerS,
    initialStateStream(seed, episodeIndex, INITIAL_POSITION_SUB_STREAM),
    initialStateStream(seed, episodeIndex, INITIAL_VELOCITY_SUB_STREAM),
  );
  // Only a scenario with an observation block draws (and labels) these, so scenarios without
  // one keep exactly the labels they had.
  const observation = scenario.observation === undefined ? null : resolveObservation(scenario.observation, scenario.time, system.model.nodeCount, draws);
  const parameterLabels = { ...draws.labels };
  const { recordIntervalS, recordedSteps, substeps, autoSafety } = scenario.time;
  const controls = sampleControls(scenario.controls, system.controlChannels, seed, episodeIndex, recordIntervalS, recordedSteps, draws.labels, options.replay);
  const planned = scenarioSplitPlan(written);
  if (planned === null && usesPlannedSplits(scenario.splits)) {
    throw new ScenarioProblemError([{ pointer: '/splits/counts', message: 'cannot be met by this scenario\'s episodes; run `pliant validate` on it to see the numbers' }]);
  }
  const split = planned !== null ? plannedSplit(planned, episodeIndex) : assignSplit(
    scenario.splits,
    (pointer) => {
      const value = parameterLabels[pointer];
      return typeof value === 'number' ? value : undefined;
    },
    splitStream(seed, episodeIndex),
  );
  const numerics = scenario.numerics ?? { energyBalance: false, richardsonShare: 0 };
  // Episode i is rerun when its own uniform draw falls below the share: deterministic from
  // (seed, i) alone, independent of every other draw and of the episode count.
  const richardson = numerics.richardsonShare > 0 && richardsonStream(seed, episodeIndex).nextFloat64() < numerics.richardsonShare;
  return {
    index: episodeIndex,
    masterSeed: String(seed),
    split,
    system,
    world,
    recording: {
      recordIntervalS,
      recordedSteps,
      substeps,
      autoSafety,
      energyAccounting: numerics.energyBalance,
      recordForces: scenario.export?.forces ?? false,
    },
    controls,
    observation,
    labels: draws.labels,
    richardson,
  };
}

function fromSpecProblem(problem: SpecProblem): ScenarioProblem {
  return { pointer: problem.pointer, message: `${problem.message}; ${problem.fix}` };
}
