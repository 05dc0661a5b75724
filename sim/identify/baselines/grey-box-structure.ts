// What the grey-box model takes as known about an episode besides its graph: which force terms
// act (air drag, fluid drag on the segments of a chain, a ground plane) and the fluid's flow
// velocity. On Pliant's own data it comes from the episode's resolved scenario and labels;
// the force laws themselves are those of sim/core (body-forces.ts, spring-forces.ts,
// fluid-drag.ts, ground-contact.ts). The unknown coefficients are estimated, never read here.
import { valueAtPointer } from '../../dataset/formats/json-pointer-lookup.ts';
import type { EpisodeRecord } from '../../dataset/manifest/dataset-manifest.ts';
import { BaselineInputError } from './baseline-input-error.ts';

export interface GreyBoxStructure {
  airDrag: boolean;
  /** Resistive-force drag on the structural segments of a chain (its fluid panels). */
  fluidDrag: boolean;
  flowVelocityMPerS: [number, number, number];
  /** Height of the ground plane, m, or null without ground. */
  groundHeightM: number | null;
}

/** A number the episode used at `pointer`: its sampled label, else the scenario's constant. */
export function episodeNumber(scenario: unknown, episode: EpisodeRecord, pointer: string): number | undefined {
  const label = episode.labels[pointer];
  if (typeof label === 'number') return label;
  const value = valueAtPointer(scenario, pointer);
  return typeof value === 'number' ? value : undefined;
}

export function structureOf(scenario: unknown, episode: EpisodeRecord): GreyBoxStructure {
  // The model's forces are springs, gravity and drag; hinge bending would be absorbed into the
  // spring coefficients and reported as if it were theirs, so such episodes are refused.
  const bendingNm2 = episode.systemKind === 'chain' ? episodeNumber(scenario, episode, '/system/bendingStiffnessNm2') ?? 0 : 0;
  if (bendingNm2 > 0) {
    throw new BaselineInputError(`episode ${episode.id} has bending rigidity (/system/bendingStiffnessNm2 = ${bendingNm2} N·m²), which the grey-box model does not include (springs, gravity and drag only); fit it on a scenario with bendingStiffnessNm2 0, such as scenarios/identification/korrin-tether-fine.json`);
  }
  const fluid = valueAtPointer(scenario, '/world/fluid');
  const ground = valueAtPointer(scenario, '/world/ground');
  const airDragPerS = episodeNumber(scenario, episode, '/world/airDragPerS');
  const flow: [number, number, number] = [0, 0, 0];
  for (let k = 0; k < 3; k++) flow[k] = episodeNumber(scenario, episode, `/world/fluid/flowVelocityMPerS/${k}`) ?? 0;
  const airDragConstant = valueAtPointer(scenario, '/world/airDragPerS');
  return {
    // A term is left out only when the scenario fixes it at zero: a sampled rate is estimated.
    airDrag: !(airDragConstant === undefined || airDragConstant === 0) || (airDragPerS !== undefined && airDragPerS !== 0),
    fluidDrag: fluid !== undefined && fluid !== null && episode.systemKind === 'chain',
    flowVelocityMPerS: flow,
    groundHeightM: ground !== undefined && ground !== null ? episodeNumber(scenario, episode, '/world/ground/heightM') ?? 0 : null,
  };
}
