// The start-state specs of a scenario to numbers, one per parameter from the resolver (drawn
// per episode, or at the demanding end for the checks), under their JSON pointers. The curve
// and the mode are resolved (and so labelled) only when the scenario gives them, so scenarios
// without them keep exactly the labels they had.
import type { Axis } from '../systems/chain.ts';
import type { ResolvedModeStart } from './mode-start.ts';
import type { ParameterResolver } from './parameter-resolver.ts';
import { resolveVector3 } from './resolve-chain.ts';
import type { InitialStateSpec, ModeStartSpec, StartCurveSpec } from './scenario-types.ts';
import type { ResolvedStartCurve } from './start-curve.ts';
import type { StartMotion } from './start-pose.ts';

export interface ResolvedStartState {
  curve: ResolvedStartCurve | null;
  motion: StartMotion;
  settleS: number;
  settleDragPerS: number;
  mode: ResolvedModeStart | null;
}

const AXIS_INDEX: Record<Axis, number> = { x: 0, y: 1, z: 2 };

export function resolveStartState(spec: InitialStateSpec, resolver: ParameterResolver): ResolvedStartState {
  const base = '/initialState';
  return {
    curve: spec.curve === undefined ? null : resolveStartCurve(spec.curve, resolver),
    motion: {
      rotationRad: resolver.value(spec.rotationRad, `${base}/rotationRad`, 'none'),
      rotationAxisUnit: resolveVector3(spec.rotationAxisUnit, `${base}/rotationAxisUnit`, resolver),
      translationM: resolveVector3(spec.translationM, `${base}/translationM`, resolver),
      velocityMPerS: resolveVector3(spec.velocityMPerS, `${base}/velocityMPerS`, resolver),
      spinRadPerS: resolveVector3(spec.spinRadPerS, `${base}/spinRadPerS`, resolver),
    },
    settleS: resolver.value(spec.settleS, `${base}/settleS`, 'none'),
    settleDragPerS: resolver.value(spec.settleDragPerS, `${base}/settleDragPerS`, 'none'),
    mode: spec.mode === undefined ? null : resolveModeStart(spec.mode, resolver),
  };
}

function resolveStartCurve(spec: StartCurveSpec, resolver: ParameterResolver): ResolvedStartCurve {
  const base = '/initialState/curve';
  const bendDirectionUnit = resolveVector3(spec.bendDirectionUnit, `${base}/bendDirectionUnit`, resolver);
  if (spec.kind === 'arc') return { kind: 'arc', curvaturePerM: resolver.value(spec.curvaturePerM, `${base}/curvaturePerM`, 'none'), bendDirectionUnit };
  return {
    kind: 'sine',
    amplitudeM: resolver.value(spec.amplitudeM, `${base}/amplitudeM`, 'none'),
    wavelengthM: resolver.value(spec.wavelengthM, `${base}/wavelengthM`, 'none'),
    phaseRad: resolver.value(spec.phaseRad, `${base}/phaseRad`, 'none'),
    bendDirectionUnit,
  };
}

function resolveModeStart(spec: ModeStartSpec, resolver: ParameterResolver): ResolvedModeStart {
  return {
    index: resolver.value(spec.index, '/initialState/mode/index', 'none'),
    amplitudeM: resolver.value(spec.amplitudeM, '/initialState/mode/amplitudeM', 'none'),
    axes: spec.axes.map((axis) => AXIS_INDEX[axis]).sort((a, b) => a - b),
  };
}
