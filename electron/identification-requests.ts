// Handlers of the identification workbench: start a score job (a model's predictions against a
// dataset, in a worker thread), read a written score or calibration report, and one episode of
// a predictions folder for the overlay in the 3-D view. Paths are resolved against the allowed
// folders here, so the readers only ever see real paths the person opened.
import type { HandlerTable } from './handler-table.ts';
import type { RequestServices } from './request-services.ts';

type IdentificationRequests = Pick<HandlerTable, 'score.begin' | 'score.read' | 'predictions.episodeArrays' | 'calibration.read'>;

export function identificationRequests(services: RequestServices): IdentificationRequests {
  const { folders, jobRunner, identificationReader } = services;
  return {
    'score.begin': async ({ datasetPath, predictionsPath, outDir, allowMissing }) => {
      const datasetDir = await folders.resolve(datasetPath, 'read');
      const predictionsDir = await folders.resolve(predictionsPath, 'read');
      const realOut = await folders.resolve(outDir, 'write');
      return jobRunner.begin({ kind: 'score', datasetDir, predictionsDir, outDir: realOut, allowMissing: allowMissing === true });
    },

    'score.read': async ({ path }) => identificationReader.score(await folders.resolve(path, 'read')),

    'predictions.episodeArrays': async ({ path, episodeId }) => identificationReader.predictionArrays(await folders.resolve(path, 'read'), episodeId),

    'calibration.read': async ({ path }) => identificationReader.calibration(await folders.resolve(path, 'read')),
  };
}
