// The desktop app (electron/main.ts) and web mode (electron/web-cli.ts) answer requests with the
// same code: each builds its services once with createDefaultServices and its handlers with
// createRequestHandlers, and neither replaces a pipeline part, so a request cannot behave
// differently in the two shells. (Project rule, DEVELOPERS.md "Commands"; common practice, no
// source.) main.ts cannot run here without the Electron binary, so its source is what is checked;
// web-cli.ts also runs for real in web-server-cli.test.ts. Which modules the shells import (the
// shared services and handlers, nothing of sim/ but the bridge contract) is checked with the
// other import rules in architecture-layering.test.ts.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';

import { describe, expect, it } from 'vitest';

import { REPO_ROOT } from './support/app-flow-session.ts';

const SHELLS = ['electron/main.ts', 'electron/web-cli.ts'];

function count(text: string, pattern: RegExp): number {
  return [...text.matchAll(pattern)].length;
}

describe('both shells use one set of services and handlers', () => {
  for (const shell of SHELLS) {
    it(`${shell} builds its services and handlers once, with every pipeline part left to the defaults`, () => {
      const text = readFileSync(join(REPO_ROOT, shell), 'utf8');
      expect(count(text, /createDefaultServices\(/g)).toBe(1);
      expect(count(text, /createRequestHandlers\(/g)).toBe(1);
      expect(text).not.toMatch(/\bpipeline\s*:/);
    });
  }
});
