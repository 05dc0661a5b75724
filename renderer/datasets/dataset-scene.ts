// What a dataset's own scenario (inside its seed file) says about the scene an episode played in:
// whether there was a ground plane and where, whether a fluid surrounded the body, and what the
// materials are called. The episode arrays hold none of this; without a seed file the Datasets
// screen plays the body alone.
import type { StageWorld } from '../view/scene-view.ts';

export interface DatasetScene {
  hasGround: boolean;
  /** The plane's height, m, when fixed; null when drawn per episode (read it from the labels). */
  groundHeightM: number | null;
  hasFluid: boolean;
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
  const s = scenario as { world?: { ground?: { heightM?: unknown }; fluid?: unknown }; system?: { materials?: { name?: unknown }[] } };
  const ground = s.world?.ground;
  const height = ground?.heightM;
  return {
    hasGround: ground !== undefined,
    // Absent means the schema's default, 0 m.
    groundHeightM: height === undefined ? 0 : typeof height === 'number' ? height : null,
    hasFluid: s.world?.fluid !== undefined,
    materialNames: Array.isArray(s.system?.materials) ? s.system.materials.map((m, i) => (typeof m?.name === 'string' ? m.name : `material ${i + 1}`)) : [],
  };
}

/** The stage for one episode: its own drawn ground height when the sweep varied it. */
export function episodeWorld(scene: DatasetScene | null, labels: Record<string, number | string | boolean>): StageWorld {
  if (!scene) return { ground: { enabled: false, heightM: 0 }, fluid: { enabled: false } };
  const drawn = labels[GROUND_HEIGHT_LABEL];
  const heightM = scene.groundHeightM ?? (typeof drawn === 'number' ? drawn : 0);
  return { ground: { enabled: scene.hasGround, heightM }, fluid: { enabled: scene.hasFluid } };
}
