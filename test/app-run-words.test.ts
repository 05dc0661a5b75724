// The dataset run's refusals name its settings in a neutral form (sim/dataset/formats/run-words.ts) that
// each shell words for itself: the app's export failures speak of the Export screen's tick box
// and the dataset folder name, never of `--resume` or `--force`, which the app does not have; the
// command line's same refusals keep their flags. Checked through the app's real handlers and
// export worker, and through `pliant generate` in-process, on real temporary folders.
import { mkdirSync, mkdtempSync, realpathSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { APP_RUN_WORDS, inAppWords } from '../electron/app-run-words.ts';
import { runCli } from '../sim/cli/main.ts';
import { DatasetRequestError } from '../sim/dataset/formats/dataset-request-error.ts';
import { COMMAND_LINE_WORDS, say, wordRun } from '../sim/dataset/formats/run-words.ts';
import type { AppSession } from './support/app-flow-session.ts';
import { cutDownScenario, startDesktopSession } from './support/app-flow-session.ts';

const work = realpathSync(mkdtempSync(join(tmpdir(), 'pliant-run-words-')));
const scenarioText = cutDownScenario('korrin-tether.json', 2, 10);
let session: AppSession;

async function cli(args: string[]): Promise<{ code: number; stderr: string }> {
  let stderr = '';
  const code = await runCli(args, { stdout: () => {}, stderr: (t) => void (stderr += t), isTerminal: false, env: {}, cwd: work });
  return { code, stderr };
}

beforeAll(async () => {
  session = await startDesktopSession();
  await session.choose(work);
  writeFileSync(join(work, 'tether.json'), scenarioText);
});
afterAll(() => rmSync(work, { recursive: true, force: true }));

describe('run settings in each shell\'s words', () => {
  it('every phrase has words in both shells, and the app\'s words name no flag', () => {
    expect(Object.keys(APP_RUN_WORDS).sort()).toEqual(Object.keys(COMMAND_LINE_WORDS).sort());
    for (const [phrase, words] of Object.entries(APP_RUN_WORDS)) {
      if (phrase === 'same-shard') continue; // a sharded folder can only be finished by the command line
      expect(words, phrase).not.toMatch(/--[a-z]/);
    }
    const error = new DatasetRequestError(`${say('out')} /tank is not empty; ${say('resume-or-replace')}`);
    expect(error.message).toBe('--out /tank is not empty; give --resume to finish the run that started there, --force to replace it, or an empty folder');
    expect(inAppWords(error.neutralMessage)).toBe('the dataset folder /tank is not empty; tick "Resume a cancelled export in this folder" to finish the export that started there, or choose another dataset folder name');
    // An unknown mark stays visible rather than vanishing.
    expect(wordRun('\u27e6nonsense\u27e7', COMMAND_LINE_WORDS)).toBe('\u27e6nonsense\u27e7');
  });

  it('an export into a folder that is not empty fails in the app\'s words', async () => {
    const dir = join(work, 'not-empty');
    mkdirSync(dir);
    writeFileSync(join(dir, 'notes.txt'), 'tank log\n');
    const events = await session.runJob(() => session.call('export.begin', { scenarioText, outDir: dir, format: 'npz', workers: 1, resume: false }));
    const last = events.at(-1)!;
    expect(last.state).toBe('failed');
    expect(last.message).toBe(`the dataset folder ${dir} is not empty; tick "Resume a cancelled export in this folder" to finish the export that started there, or choose another dataset folder name`);
    const resumed = await session.runJob(() => session.call('export.begin', { scenarioText, outDir: dir, format: 'npz', workers: 1, resume: true }));
    expect(resumed.at(-1)!.message).toBe(`cannot resume: ${dir} is not empty and has no seed.json, so it is not a Pliant dataset; choose another dataset folder name`);
    for (const p of [last, resumed.at(-1)!]) expect(p.message).not.toMatch(/--[a-z]|\u27e6/);
  });

  it('the command line keeps its flags for the same refusals', async () => {
    const dir = join(work, 'not-empty-cli');
    mkdirSync(dir);
    writeFileSync(join(dir, 'notes.txt'), 'tank log\n');
    const plain = await cli(['generate', 'tether.json', '--out', dir, '--progress', 'none']);
    expect(plain.code).toBe(2);
    expect(plain.stderr).toContain(`--out ${dir} is not empty; give --resume to finish the run that started there, --force to replace it, or an empty folder`);
    const resumed = await cli(['generate', 'tether.json', '--out', dir, '--resume', '--progress', 'none']);
    expect(resumed.stderr).toContain(`--resume: ${dir} is not empty and has no seed.json, so it is not a Pliant dataset; choose another --out folder`);
    expect(plain.stderr + resumed.stderr).not.toContain('\u27e6');
  });
});
