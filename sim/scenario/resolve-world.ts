// World specs to the simulator's World: a ground or fluid section that is present is enabled.
import type { World } from '../core/world.ts';
import type { Obstacle } from '../core/world.ts';
import { defaultWorld } from '../core/world.ts';
import type { ParameterResolver } from './parameter-resolver.ts';
import { resolveVector3 } from './resolve-chain.ts';
import type { ObstacleSpec, WorldSpec } from './scenario-types.ts';

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
  world.obstacles = (spec.obstacles ?? []).map((obstacle, index) => resolveObstacle(obstacle, `/world/obstacles/${index}`, resolver));
  return world;
}

const AXIS_INDEX = { x: 0, y: 1, z: 2 } as const;

function resolveObstacle(spec: ObstacleSpec, pointer: string, resolver: ParameterResolver): Obstacle {
  const obstacle: Obstacle = {
    shape: spec.shape,
    centerM: resolveVector3(spec.centerM, `${pointer}/centerM`, resolver),
    halfSizeM: [0, 0, 0],
    radiusM: 0,
    halfLengthM: 0,
    axis: AXIS_INDEX[spec.axis ?? 'y'],
    staticFriction: resolver.value(spec.staticFriction, `${pointer}/staticFriction`, 'none'),
    kineticFriction: resolver.value(spec.kineticFriction, `${pointer}/kineticFriction`, 'none'),
  };
  if (spec.shape === 'box' && spec.sizeM !== undefined) {
    const size = resolveVector3(spec.sizeM, `${pointer}/sizeM`, resolver);
    obstacle.halfSizeM = [0.5 * size[0], 0.5 * size[1], 0.5 * size[2]];
  }
  if (spec.radiusM !== undefined) obstacle.radiusM = resolver.value(spec.radiusM, `${pointer}/radiusM`, 'none');
  if (spec.shape === 'cylinder' && spec.lengthM !== undefined) obstacle.halfLengthM = 0.5 * resolver.value(spec.lengthM, `${pointer}/lengthM`, 'none');
  return obstacle;
}
