// The SeedReader seam filled with the dataset pipeline's seed reader (sim/dataset/read/seed-reader.ts),
// which checks a seed file exactly as `pliant reproduce` does.
import { readSeedSummary } from '../sim/dataset/read/seed-reader.ts';
import { translateDatasetError } from './dataset-error-translation.ts';
import type { SeedReader } from './request-services.ts';

export const SIM_SEED_READER: SeedReader = {
  async read(seedPath) {
    try {
      const seed = await readSeedSummary(seedPath);
      return { path: seed.path, scenarioText: seed.scenarioText, toolVersion: seed.pliantVersion, episodeCount: seed.episodeCount, expectedFiles: seed.expectedFiles };
    } catch (error) {
      throw translateDatasetError(error);
    }
  },
};
