// Handler for app.info: what the renderer needs to know about the shell it runs in.
import { availableParallelism } from 'node:os';

import { SAFETY_CAUTION } from '../sim/scenario/safety-caution.ts';
import type { HandlerTable } from './handler-table.ts';
import type { RequestServices } from './request-services.ts';

export function appRequests(services: RequestServices): Pick<HandlerTable, 'app.info'> {
  return {
    'app.info': async () => ({
      name: services.app.name,
      version: services.app.version,
      mode: services.app.mode,
      folderChoice: services.folderChooser.mode,
      platform: services.app.platform,
      // As `pliant generate` counts them for its default --workers (sim/cli/generate-options.ts).
      cpuCount: Math.max(1, availableParallelism()),
      safetyNotice: SAFETY_CAUTION,
      jobLimits: { ...services.jobRunner.limits },
    }),
  };
}
