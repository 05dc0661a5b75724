// What a dataset's own scenario (inside its seed file) says about the scene an episode played in:
// whether there was a ground plane and where, whether a fluid surrounded the body, which static
// obstacles stood where (numbers drawn per episode come from its labels), and what the
// materials are called. The episode arrays hold none of this; without a seed file the Datasets
// screen plays the body alone.
import type { Obstacle } from '../../sim/core/world.ts';
import type { StageWorld } from '../view/stage-world.ts';

export interface DatasetScene {
  hasGround: boolean;
  /** The plane's height, m, when fixed; null when drawn per episode (read it from the labels). */
  groundHeightM: number | null;
  hasFluid: boolean;
  /** The scenario's obstacle entries as written (numbers or distributions). */
  obstacleSpecs: Record<string, unknown>[];
  materialNames: string[];
}

const GROUND_HEIGHT_LABEL = '/world/ground/heightM';

export function datasetScene(scenarioText: string): DatasetScene | null {
  let scenario: unknown;
  try {
    scenario = JSON.parse(scenarioText);
  } catch {
    return null;
  }
  const s = scenario as { world?: { ground?: { heightM?: unknown }; fluid?: unknown; obstacles?: unknown }; system?: { materials?: { name?: unknown }[] } };
  const obstacles = s.world?.obstacles;
  const ground = s.world?.ground;
  const height = ground?.heightM;
  return {
    hasGround: ground !== undefined,
    // Absent means the schema's default, 0 m.
    groundHeightM: height === undefined ? 0 : typeof height === 'number' ? height : null,
    hasFluid: s.world?.fluid !== undefined,
    obstacleSpecs: Array.isArray(obstacles) ? obstacles.filter((o): o is Record<string, unknown> => typeof o === 'object' && o !== null) : [],
    materialNames: Array.isArray(s.system?.materials) ? s.system.materials.map((m, i) => (typeof m?.name === 'string' ? m.name : `material ${i + 1}`)) : [],
  };
}

/** The stage for one episode: its own drawn ground height when the sweep varied it. */
export function episodeWorld(scene: DatasetScene | null, labels: Record<string, number | string | boolean>): StageWorld {
  if (!scene) return { ground: { enabled: false, heightM: 0 }, fluid: { enabled: false } };
  const drawn = labels[GROUND_HEIGHT_LABEL];
  const heightM = scene.groundHeightM ?? (typeof drawn === 'number' ? drawn : 0);
  const obstacles = scene.obstacleSpecs.map((spec, i) => obstacleOf(spec, `/world/obstacles/${i}`, labels));
  return { ground: { enabled: scene.hasGround, heightM }, fluid: { enabled: scene.hasFluid }, obstacles };
}

/** A number written in the scenario, or the value the episode drew for it (0 if neither). */
function numberAt(spec: unknown, pointer: string, labels: Record<string, number | string | boolean>): number {
  if (typeof spec === 'number') return spec;
  const drawn = labels[pointer];
  return typeof drawn === 'number' ? drawn : 0;
}

function vectorAt(spec: unknown, pointer: string, labels: Record<string, number | string | boolean>): [number, number, number] {
  const parts = Array.isArray(spec) ? spec : [];
  return [0, 1, 2].map((k) => numberAt(parts[k], `${pointer}/${k}`, labels)) as [number, number, number];
}

function obstacleOf(spec: Record<string, unknown>, pointer: string, labels: Record<string, number | string | boolean>): Obstacle {
  const shape = spec.shape === 'sphere' || spec.shape === 'cylinder' ? spec.shape : 'box';
  const size = shape === 'box' ? vectorAt(spec.sizeM, `${pointer}/sizeM`, labels) : [0, 0, 0];
  return {
    shape,
    centerM: vectorAt(spec.centerM, `${pointer}/centerM`, labels),
    halfSizeM: [0.5 * size[0], 0.5 * size[1], 0.5 * size[2]],
    radiusM: numberAt(spec.radiusM, `${pointer}/radiusM`, labels),
    halfLengthM: 0.5 * numberAt(spec.lengthM, `${pointer}/lengthM`, labels),
    axis: spec.axis === 'x' ? 0 : spec.axis === 'z' ? 2 : 1,
    staticFriction: numberAt(spec.staticFriction, `${pointer}/staticFriction`, labels),
    kineticFriction: numberAt(spec.kineticFriction, `${pointer}/kineticFriction`, labels),
  };
}
