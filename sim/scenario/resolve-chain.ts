// Chain specs to the chain builder's parameters, one number per parameter from the resolver.
import type { ChainParameters } from '../systems/chain.ts';
import type { ParameterResolver } from './parameter-resolver.ts';
import type { DemandingEnd } from './parameter-resolver.ts';
import type { ChainSystemSpec, Vector3Spec } from './scenario-types.ts';

export function resolveVector3(spec: Vector3Spec, pointer: string, resolver: ParameterResolver, demanding: DemandingEnd = 'none'): [number, number, number] {
  return [
    resolver.value(spec[0], `${pointer}/0`, demanding),
    resolver.value(spec[1], `${pointer}/1`, demanding),
    resolver.value(spec[2], `${pointer}/2`, demanding),
  ];
}

export function resolveChainParameters(spec: ChainSystemSpec, resolver: ParameterResolver): ChainParameters {
  // k = EA·n/L and m = M/n, so ω² grows with EA and n and falls with L and M.
  return {
    partCount: resolver.value(spec.partCount, '/system/partCount', 'high'),
    lengthM: resolver.value(spec.lengthM, '/system/lengthM', 'low'),
    totalMassKg: resolver.value(spec.totalMassKg, '/system/totalMassKg', 'low'),
    axialStiffnessN: resolver.value(spec.axialStiffnessN, '/system/axialStiffnessN', 'high'),
    secondNeighbourSpringRatio: resolver.value(spec.secondNeighbourSpringRatio, '/system/secondNeighbourSpringRatio', 'high'),
    bendingStiffnessNm2: resolver.value(spec.bendingStiffnessNm2, '/system/bendingStiffnessNm2', 'high'),
    bendingDampingRatio: resolver.value(spec.bendingDampingRatio, '/system/bendingDampingRatio', 'high'),
    clampedEnds: [...spec.clampedEnds],
    pinnedNodes: spec.pinnedNodes.map((node, i) => resolver.value(node, `/system/pinnedNodes/${i}`, 'none')),
    drivenNodes: spec.drivenNodes.map((node, i) => resolver.value(node, `/system/drivenNodes/${i}`, 'none')),
    dampingRatio: resolver.value(spec.dampingRatio, '/system/dampingRatio', 'high'),
    diameterM: resolver.value(spec.diameterM, '/system/diameterM', 'none'),
    anchor: spec.anchor,
    originM: resolveVector3(spec.originM, '/system/originM', resolver),
    directionUnit: resolveVector3(spec.directionUnit, '/system/directionUnit', resolver),
    forceHandles: spec.forceHandles.map((handle, i) => resolver.value(handle, `/system/forceHandles/${i}`, 'none')),
    forceAxes: [...spec.forceAxes],
    drivenAxes: [...spec.drivenAxes],
  };
}
