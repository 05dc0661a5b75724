// World specs to the simulator's World: a ground or fluid section that is present is enabled.
import { defaultWorld } from '../core/world.ts';
import type { World } from '../core/world.ts';
import type { ParameterResolver } from './parameter-resolver.ts';
import { resolveVector3 } from './resolve-chain.ts';
import type { WorldSpec } from './scenario-types.ts';

export function resolveWorld(spec: WorldSpec, resolver: ParameterResolver): World {
  const world = defaultWorld();
  world.gravityMPerS2 = resolveVector3(spec.gravityMPerS2, '/world/gravityMPerS2', resolver);
  world.airDragPerS = resolver.value(spec.airDragPerS, '/world/airDragPerS', 'high');
  if (spec.ground !== undefined) {
    world.ground = {
      enabled: true,
      heightM: resolver.value(spec.ground.heightM, '/world/ground/heightM', 'none'),
      staticFriction: resolver.value(spec.ground.staticFriction, '/world/ground/staticFriction', 'none'),
      kineticFriction: resolver.value(spec.ground.kineticFriction, '/world/ground/kineticFriction', 'none'),
    };
  }
  if (spec.fluid !== undefined) {
    world.fluid = {
      enabled: true,
      densityKgPerM3: resolver.value(spec.fluid.densityKgPerM3, '/world/fluid/densityKgPerM3', 'none'),
      normalDragNsPerM3: resolver.value(spec.fluid.normalDragNsPerM3, '/world/fluid/normalDragNsPerM3', 'high'),
      tangentialDragNsPerM3: resolver.value(spec.fluid.tangentialDragNsPerM3, '/world/fluid/tangentialDragNsPerM3', 'high'),
      flowVelocityMPerS: resolveVector3(spec.fluid.flowVelocityMPerS, '/world/fluid/flowVelocityMPerS', resolver),
      buoyancy: spec.fluid.buoyancy,
    };
  }
  return world;
}
