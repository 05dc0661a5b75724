// The Datasets screen draws an episode's obstacles from the seed file's scenario and the
// episode's labels alone (the episode arrays hold no scene). Checked against the simulator's
// own world for the same episode: what is drawn is where the nodes collided (common practice,
// no source: the view must show the scene that was simulated). Pointers follow RFC 6901.
import { describe, expect, it } from 'vitest';

import { datasetScene, episodeWorld } from '../renderer/datasets/dataset-scene.ts';
import { checkScenarioValue } from '../sim/scenario/check-scenario.ts';
import { sampleEpisode } from '../sim/scenario/sample-episode.ts';

describe('dataset scene: obstacles rebuilt from the seed scenario and the labels', () => {
  it('three obstacles with drawn centres and sizes equal the simulated world\'s, number for number', () => {
    const checked = checkScenarioValue({
      formatVersion: 1, name: 'korrin-eel-reef', episodes: 3, seed: 5,
      system: { kind: 'chain', partCount: 4, lengthM: 0.5, totalMassKg: 0.1, axialStiffnessN: 50, dampingRatio: 0.1, diameterM: 0.01, anchor: 'free', originM: [0, 1, 0] },
      world: {
        ground: { heightM: { kind: 'uniform', min: -0.1, max: 0 }, staticFriction: 0.5, kineticFriction: 0.4 },
        obstacles: [
          { shape: 'box', centerM: [{ kind: 'uniform', min: 0, max: 1 }, 0.1, 0], sizeM: [0.2, { kind: 'uniform', min: 0.1, max: 0.3 }, 0.2], staticFriction: 0.5, kineticFriction: 0.4 },
          { shape: 'sphere', centerM: [0, 0.2, 0.4], radiusM: { kind: 'log-uniform', min: 0.05, max: 0.2 }, staticFriction: 0.5, kineticFriction: 0.4 },
          { shape: 'cylinder', centerM: [0.3, 0.1, -0.3], radiusM: 0.05, lengthM: 0.6, axis: 'x', staticFriction: 0.5, kineticFriction: 0.4 },
        ],
      },
      time: { recordIntervalS: 0.01, recordedSteps: 1 },
    });
    if (!checked.ok) throw new Error(JSON.stringify(checked.problems));
    const scene = datasetScene(JSON.stringify(checked.scenario));
    for (let i = 0; i < 3; i++) {
      const episode = sampleEpisode(checked.scenario, i);
      const labels = episode.labels as Record<string, number>;
      const stage = episodeWorld(scene, labels);
      expect(stage.obstacles).toEqual(episode.world.obstacles);
      expect(stage.ground.heightM).toBe(episode.world.ground.heightM);
    }
  });

  it('a seed scenario without obstacles draws none', () => {
    const stage = episodeWorld(datasetScene('{"world": {}}'), {});
    expect(stage.obstacles).toEqual([]);
  });
});
