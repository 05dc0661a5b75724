// Handlers for the scenario requests: list the bundled examples, read and write scenario files
// in allowed folders, and check scenario text with the pipeline's checker.
import { join } from 'node:path';

import { BRIDGE_LIMITS } from '../sim/bridge/bridge-contract.ts';
import { shown } from './allowed-folders.ts';
import type { HandlerTable } from './handler-table.ts';
import { RequestError } from './request-error.ts';
import type { RequestServices } from './request-services.ts';

type ScenarioRequests = Pick<HandlerTable, 'scenario.listExamples' | 'scenario.read' | 'scenario.write' | 'scenario.check'>;

/** UTF-8 needs at most 4 bytes per character, so this many bytes can still fit the character limit. */
const MAX_SCENARIO_BYTES = BRIDGE_LIMITS.scenarioTextChars * 4;

export function scenarioRequests(services: RequestServices): ScenarioRequests {
  const { files, folders } = services;
  return {
    'scenario.listExamples': async () => {
      let names: string[];
      try {
        names = await files.listFiles(services.bundledScenariosDir, '.json');
      } catch (error) {
        // A build without bundled examples is valid; it simply has none to offer.
        if ((error as { code?: string }).code === 'ENOENT') return [];
        throw error;
      }
      return names.map((fileName) => ({ fileName, path: join(services.bundledScenariosDir, fileName) }));
    },

    'scenario.read': async ({ path }) => {
      requireJson(path);
      const real = await folders.resolve(path, 'read');
      const text = await files.readText(real, MAX_SCENARIO_BYTES);
      if (text.length > BRIDGE_LIMITS.scenarioTextChars) {
        throw new RequestError('too-large', `${shown(path)} holds more than ${BRIDGE_LIMITS.scenarioTextChars} characters, more than a scenario can be. Check that it is a scenario file.`);
      }
      return { path: real, text };
    },

    'scenario.write': async ({ path, text }) => {
      requireJson(path);
      const real = await folders.resolve(path, 'write');
      const bytes = await files.writeTextAtomic(real, text);
      return { path: real, bytes };
    },

    'scenario.check': ({ text, fileName }) => services.scenarioChecker.check(text, fileName),
  };
}

function requireJson(path: string): void {
  if (!path.toLowerCase().endsWith('.json')) {
    throw new RequestError('path-refused', `${shown(path)} is not a .json file. Scenario files end in .json.`);
  }
}
