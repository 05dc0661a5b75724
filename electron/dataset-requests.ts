// Handlers for reading written datasets and seed files. Paths are resolved against the allowed
// folders here, so the pipeline's reader only ever sees real paths the person opened.
import type { HandlerTable } from './handler-table.ts';
import type { RequestServices } from './request-services.ts';

type DatasetRequests = Pick<
  HandlerTable,
  'dataset.summary' | 'dataset.episodes' | 'dataset.episodeArrays' | 'dataset.verify' | 'dataset.compare' | 'seed.read'
>;

export function datasetRequests(services: RequestServices): DatasetRequests {
  const { folders, datasetReader, seedReader } = services;
  return {
    'dataset.summary': async ({ path }) => datasetReader.summary(await folders.resolve(path, 'read')),

    'dataset.episodes': async ({ path, ...query }) => datasetReader.episodes(await folders.resolve(path, 'read'), query),

    'dataset.episodeArrays': async ({ path, episodeId }) =>
      datasetReader.episodeArrays(await folders.resolve(path, 'read'), episodeId),

    'dataset.verify': async ({ path }) => datasetReader.verify(await folders.resolve(path, 'read')),

    'dataset.compare': async ({ originalPath, regeneratedPath }) =>
      datasetReader.compare(await folders.resolve(originalPath, 'read'), await folders.resolve(regeneratedPath, 'read')),

    'seed.read': async ({ path }) => seedReader.read(await folders.resolve(path, 'read')),
  };
}
