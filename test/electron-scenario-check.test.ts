// scenario.check through the request registry with the scenario pipeline's checker plugged into
// its seam. Locations are worked examples counted by hand in the submitted text (1-based line and
// column, as editors count): in '{\n  "nonsense": 1\n}' the key starts on line 2, column 3; in
// '{ "a": ' the missing value is at the end of the text, line 1, column 8 (ECMA-404: a member
// needs a value after its colon).
import { tmpdir } from 'node:os';

import { describe, expect, it } from 'vitest';

import { createDefaultServices } from '../electron/default-services.ts';
import { createRequestHandlers } from '../electron/request-handlers.ts';
import { SIM_SCENARIO_CHECKER } from '../electron/sim-scenario-checker.ts';

async function registry() {
  const services = await createDefaultServices({
    mode: 'web',
    version: '0.1.0',
    bundledScenariosDir: '/nonexistent-pliant-scenarios',
    folderChooser: { mode: 'in-page', rootDir: tmpdir() },
    pipeline: { scenarioChecker: SIM_SCENARIO_CHECKER },
  });
  return createRequestHandlers(services);
}

describe('scenario.check with the pipeline checker', () => {
  it('places an unknown key at its line and column', async () => {
    const reply = await (await registry()).handle('scenario.check', { text: '{\n  "nonsense": 1\n}', fileName: 'korrin-bay-tether.json' });
    expect(reply.ok).toBe(true);
    if (!reply.ok) return;
    const result = reply.result as { ok: boolean; problems: { pointer: string; message: string; line?: number; column?: number }[] };
    expect(result.ok).toBe(false);
    const unknown = result.problems.find((p) => p.pointer === '/nonsense');
    expect(unknown).toMatchObject({ line: 2, column: 3 });
    expect(unknown?.message).toMatch(/nonsense/);
    for (const problem of result.problems) expect(problem.message).not.toMatch(/\n\s+at\s/);
  });

  it('places a JSON syntax error at the end of the text', async () => {
    const reply = await (await registry()).handle('scenario.check', { text: '{ "a": ', fileName: 'korrin-bay-fin.json' });
    expect(reply).toMatchObject({ ok: true, result: { ok: false, problems: [{ pointer: '', line: 1, column: 8 }] } });
  });

  it('still refuses hostile arguments before the checker runs', async () => {
    const reply = await (await registry()).handle('scenario.check', { text: 42, fileName: 'a.json' });
    expect(reply).toMatchObject({ ok: false, error: { code: 'invalid-arguments' } });
  });
});
