// What of the world the 3-D stage draws around the body: plain data, free of DOM types, so the
// screens that compute it (and their tests) need no browser.
import type { Obstacle } from '../../sim/core/world.ts';

export interface StageWorld {
  ground: { enabled: boolean; heightM: number };
  fluid: { enabled: boolean };
  /** Static obstacles besides the ground plane (none when absent). */
  obstacles?: readonly Obstacle[];
}
