// The version written into every seed file and manifest must be the package's version
// (project rule: a dataset names the Pliant that made it).
import { readFileSync } from 'node:fs';

import { describe, expect, it } from 'vitest';

import { PLIANT_VERSION } from '../sim/scenario/pliant-version.ts';

describe('Pliant version', () => {
  it('sim/scenario/pliant-version.ts agrees with package.json', () => {
    const pkg = JSON.parse(readFileSync(new URL('../package.json', import.meta.url), 'utf8')) as { version: string };
    expect(PLIANT_VERSION).toBe(pkg.version);
  });
});
