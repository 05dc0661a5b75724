// The default world with gravity switched off: the setting of the free-body, oscillator and
// swimming checks, where any weight would hide what is being measured.
import type { World } from '../../sim/core/world.ts';
import { defaultWorld } from '../../sim/core/world.ts';

export function zeroGravityWorld(): World {
  const world = defaultWorld();
  world.gravityMPerS2 = [0, 0, 0];
  return world;
}
