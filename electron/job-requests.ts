// Handlers that start and cancel long jobs (dataset export, regeneration from a seed). They only
// check paths and hand the job to the job runner, which keeps the work off the main thread.
import type { HandlerTable } from './handler-table.ts';
import type { RequestServices } from './request-services.ts';

type JobRequests = Pick<HandlerTable, 'export.begin' | 'export.cancel' | 'reproduce.begin'>;

export function jobRequests(services: RequestServices): JobRequests {
  const { folders, jobRunner } = services;
  return {
    'export.begin': async ({ scenarioText, outDir, format, workers, resume }) => {
      const realOut = await folders.resolve(outDir, 'write');
      return jobRunner.begin({ kind: 'export', scenarioText, outDir: realOut, format, workers, resume });
    },

    'export.cancel': async ({ jobId }) => ({ cancelled: jobRunner.cancel(jobId) }),

    'reproduce.begin': async ({ seedPath, outDir }) => {
      const realSeed = await folders.resolve(seedPath, 'read');
      const realOut = await folders.resolve(outDir, 'write');
      return jobRunner.begin({ kind: 'reproduce', seedPath: realSeed, outDir: realOut });
    },
  };
}
