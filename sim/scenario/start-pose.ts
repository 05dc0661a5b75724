// An episode's start pose and start motion, applied to the built rest shape before any noise:
// a rigid rotation (Rodrigues' formula, common practice, no source) about the first held node
// (pinned or driven: a chain's top, so a chain can start at an angle) or, for a free body,
// about its centre of mass; a translation of a free body; and a uniform velocity plus a spin
// ω × (x − pivot). Held nodes never move, so a held node away from the pivot is only allowed
// a zero rotation (checked in start-state-checks.ts). 2-D lattices keep to their x-y plane.
import type { Model } from '../core/model.ts';
import { NODE_DRIVEN, NODE_PINNED } from '../core/model.ts';

export interface StartMotion {
  translationM: [number, number, number];
  rotationAxisUnit: [number, number, number];
  rotationRad: number;
  velocityMPerS: [number, number, number];
  spinRadPerS: [number, number, number];
}

/** The node a start pose turns about: the first held node, else null (the centre of mass). */
export function firstHeldNode(model: Model): number | null {
  for (let i = 0; i < model.nodeCount; i++) if (model.nodeFlags[i] & (NODE_PINNED | NODE_DRIVEN)) return i;
  return null;
}

export function startPivotM(model: Model): [number, number, number] {
  const held = firstHeldNode(model);
  const x = model.positionM;
  if (held !== null) return [x[3 * held], x[3 * held + 1], x[3 * held + 2]];
  const centre: [number, number, number] = [0, 0, 0];
  let mass = 0;
  for (let i = 0; i < model.nodeCount; i++) {
    mass += model.massKg[i];
    for (let k = 0; k < 3; k++) centre[k] += model.massKg[i] * x[3 * i + k];
  }
  return [centre[0] / mass, centre[1] / mass, centre[2] / mass];
}

/** Rotates and translates the free nodes (positions only). */
export function applyStartPose(model: Model, dimensions: 2 | 3, motion: StartMotion): void {
  const pivot = startPivotM(model);
  const axis = dimensions === 2 ? [0, 0, Math.sign(motion.rotationAxisUnit[2]) || 1] : normalised(motion.rotationAxisUnit);
  const cos = Math.cos(motion.rotationRad);
  const sin = Math.sin(motion.rotationRad);
  const shift = [motion.translationM[0], motion.translationM[1], dimensions === 2 ? 0 : motion.translationM[2]];
  const x = model.positionM;
  for (let i = 0; i < model.nodeCount; i++) {
    if (model.nodeFlags[i] & (NODE_PINNED | NODE_DRIVEN)) continue;
    const r = [x[3 * i] - pivot[0], x[3 * i + 1] - pivot[1], x[3 * i + 2] - pivot[2]];
    const along = axis[0] * r[0] + axis[1] * r[1] + axis[2] * r[2];
    const cross = [axis[1] * r[2] - axis[2] * r[1], axis[2] * r[0] - axis[0] * r[2], axis[0] * r[1] - axis[1] * r[0]];
    for (let k = 0; k < 3; k++) x[3 * i + k] = pivot[k] + r[k] * cos + cross[k] * sin + axis[k] * along * (1 - cos) + shift[k];
  }
}

/** Sets every free node's velocity to v + ω × (x − pivot). */
export function applyStartVelocity(model: Model, dimensions: 2 | 3, motion: StartMotion): void {
  const pivot = startPivotM(model);
  const w = dimensions === 2 ? [0, 0, motion.spinRadPerS[2]] : motion.spinRadPerS;
  const v0 = [motion.velocityMPerS[0], motion.velocityMPerS[1], dimensions === 2 ? 0 : motion.velocityMPerS[2]];
  const x = model.positionM;
  const v = model.velocityMPerS;
  for (let i = 0; i < model.nodeCount; i++) {
    if (model.nodeFlags[i] & (NODE_PINNED | NODE_DRIVEN)) continue;
    const r = [x[3 * i] - pivot[0], x[3 * i + 1] - pivot[1], x[3 * i + 2] - pivot[2]];
    v[3 * i] = v0[0] + w[1] * r[2] - w[2] * r[1];
    v[3 * i + 1] = v0[1] + w[2] * r[0] - w[0] * r[2];
    v[3 * i + 2] = v0[2] + w[0] * r[1] - w[1] * r[0];
  }
}

function normalised(v: [number, number, number]): number[] {
  const length = Math.hypot(v[0], v[1], v[2]);
  return length > 0 ? [v[0] / length, v[1] / length, v[2] / length] : [0, 0, 1];
}
