// The start-state specs of a scenario to numbers, one per parameter from the resolver (drawn
// per episode, or at the demanding end for the checks), under their JSON pointers.
import type { ParameterResolver } from './parameter-resolver.ts';
import { resolveVector3 } from './resolve-chain.ts';
import type { InitialStateSpec } from './scenario-types.ts';
import type { StartMotion } from './start-pose.ts';

export interface ResolvedStartState {
  motion: StartMotion;
  settleS: number;
  settleDragPerS: number;
}

export function resolveStartState(spec: InitialStateSpec, resolver: ParameterResolver): ResolvedStartState {
  const base = '/initialState';
  return {
    motion: {
      rotationRad: resolver.value(spec.rotationRad, `${base}/rotationRad`, 'none'),
      rotationAxisUnit: resolveVector3(spec.rotationAxisUnit, `${base}/rotationAxisUnit`, resolver),
      translationM: resolveVector3(spec.translationM, `${base}/translationM`, resolver),
      velocityMPerS: resolveVector3(spec.velocityMPerS, `${base}/velocityMPerS`, resolver),
      spinRadPerS: resolveVector3(spec.spinRadPerS, `${base}/spinRadPerS`, resolver),
    },
    settleS: resolver.value(spec.settleS, `${base}/settleS`, 'none'),
    settleDragPerS: resolver.value(spec.settleDragPerS, `${base}/settleDragPerS`, 'none'),
  };
}
