// Symbolic links inside a chosen dataset folder must not reach outside it. The request handlers
// resolve the folder itself; these checks cover the files opened and written inside it, with real
// temporary folders and real links (fs.symlinkSync) through the app's own handlers and job
// workers: a CARD.md linked to an outside file is not served as the card, an episode file linked
// to an outside copy (same bytes, so its checksum matches) is not read, verify names the link,
// a resumed export whose episodes/ links elsewhere fails before writing there, and a score
// report's REPORT.md or a predicted episode linked outside is refused too. A link whose
// target stays inside the folder is allowed. Containment after following links is common
// practice (no source): a path is judged by where it leads, not by how it is spelled.
import { cpSync, existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, realpathSync, renameSync, rmSync, symlinkSync, unlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { runCli } from '../sim/cli/main.ts';
import type { DatasetJobMessage } from '../sim/dataset/jobs/dataset-job.ts';
import { runDatasetJob } from '../sim/dataset/jobs/dataset-job.ts';
import type { AppSession } from './support/app-flow-session.ts';
import { cutDownScenario, startDesktopSession } from './support/app-flow-session.ts';
import { generateScoreDataset, runPliant, writePersistencePredictions } from './support/score-fixture.ts';

const work = realpathSync(mkdtempSync(join(tmpdir(), 'pliant-links-')));
const chosen = join(work, 'chosen');
const outside = join(work, 'outside');
const reference = join(chosen, 'reference');
const scenarioText = cutDownScenario('korrin-tether.json', 3, 10);
let session: AppSession;

function copyOfReference(name: string): string {
  const dir = join(chosen, name);
  cpSync(reference, dir, { recursive: true });
  return dir;
}

beforeAll(async () => {
  mkdirSync(chosen);
  mkdirSync(outside);
  writeFileSync(join(outside, 'secret.md'), 'a file outside the chosen folder\n');
  const scenarioPath = join(work, 'tether.json');
  writeFileSync(scenarioPath, scenarioText);
  let stderr = '';
  const code = await runCli(['generate', scenarioPath, '--out', reference, '--format', 'npz', '--workers', '1'], { stdout: () => {}, stderr: (t) => void (stderr += t), isTerminal: false, env: {}, cwd: work });
  expect(stderr).toBe('');
  expect(code).toBe(0);
  session = await startDesktopSession();
  expect(await session.choose(chosen)).toBe(chosen);
});

afterAll(() => rmSync(work, { recursive: true, force: true }));

describe('links inside a chosen dataset folder', () => {
  it('serves the real card, but refuses a CARD.md that links to a file outside the folder', async () => {
    const summary = await session.call('dataset.summary', { path: reference });
    expect(summary.cardMarkdown).toBe(readFileSync(join(reference, 'CARD.md'), 'utf8'));
    const dir = copyOfReference('linked-card');
    unlinkSync(join(dir, 'CARD.md'));
    symlinkSync(join(outside, 'secret.md'), join(dir, 'CARD.md'));
    const refusal = await session.refusal('dataset.summary', { path: dir });
    expect(refusal.code).toBe('invalid-dataset');
    expect(refusal.message).toContain(`${join(dir, 'CARD.md')} is a symbolic link`);
    expect(refusal.message).toContain(`that leads outside ${dir}, to ${join(outside, 'secret.md')}`);
    expect(refusal.message).not.toContain('a file outside the chosen folder');
  });

  it('allows a CARD.md that links to a file inside the folder', async () => {
    const dir = copyOfReference('inner-link');
    renameSync(join(dir, 'CARD.md'), join(dir, 'card', 'CARD-copy.md'));
    symlinkSync(join(dir, 'card', 'CARD-copy.md'), join(dir, 'CARD.md'));
    const summary = await session.call('dataset.summary', { path: dir });
    expect(summary.cardMarkdown).toBe(readFileSync(join(reference, 'CARD.md'), 'utf8'));
  });

  it('refuses an episode file that links outside, even when its bytes match the checksum', async () => {
    const dir = copyOfReference('linked-episode');
    const file = join(dir, 'episodes', 'ep-000001.npz');
    renameSync(file, join(outside, 'ep-000001.npz'));
    symlinkSync(join(outside, 'ep-000001.npz'), file);
    // The episode beside it, not behind a link, still opens.
    expect((await session.call('dataset.episodeArrays', { path: dir, episodeId: 'ep-000000' })).episodeId).toBe('ep-000000');
    const refusal = await session.refusal('dataset.episodeArrays', { path: dir, episodeId: 'ep-000001' });
    expect(refusal.code).toBe('invalid-dataset');
    expect(refusal.message).toContain(`${file} is a symbolic link`);
    const report = await session.call('dataset.verify', { path: dir });
    expect(report.ok).toBe(false);
    expect(report.problems.map((p) => p.message)).toContain('episodes/ep-000001.npz leads outside the dataset folder through a symbolic link; replace the link with the file itself');
  });

  it('refuses a score report\'s REPORT.md and a predicted episode that link outside their folders', async () => {
    const dataset = await generateScoreDataset(chosen, 'score-tether');
    const predictions = join(chosen, 'predictions');
    writePersistencePredictions(dataset, predictions);
    const report = join(chosen, 'score-report');
    const scored = await runPliant(['score', dataset, predictions, '--out', report], work);
    expect(scored.stderr).toBe('');
    expect((await session.call('score.read', { path: report })).reportMarkdown).toBe(readFileSync(join(report, 'REPORT.md'), 'utf8'));
    unlinkSync(join(report, 'REPORT.md'));
    symlinkSync(join(outside, 'secret.md'), join(report, 'REPORT.md'));
    const refusal = await session.refusal('score.read', { path: report });
    expect(refusal.code).toBe('invalid-dataset');
    expect(refusal.message).toContain(`${join(report, 'REPORT.md')} is a symbolic link`);
    const episode = readdirSync(predictions).find((n) => n.endsWith('.npz'))!;
    renameSync(join(predictions, episode), join(outside, episode));
    symlinkSync(join(outside, episode), join(predictions, episode));
    const predicted = await session.refusal('predictions.episodeArrays', { path: predictions, episodeId: episode.replace(/\.npz$/, '') });
    expect(predicted.code).toBe('invalid-dataset');
    expect(predicted.message).toContain(`that leads outside ${predictions}`);
  });

  it('fails a resumed export whose episodes/ links outside, writing nothing there', async () => {
    const dir = join(chosen, 'resumed');
    const messages: DatasetJobMessage[] = [];
    let clockMs = 0;
    // Stops after the first episode, as a cancelled export does.
    await runDatasetJob({ kind: 'export', scenarioText, outDir: dir, format: 'npz', workers: 1, resume: false }, (m) => messages.push(m), () => messages.filter((m) => m.type === 'progress').length > 1, '0.1.0', () => (clockMs += 1000));
    expect(messages.at(-1)).toMatchObject({ type: 'cancelled' });
    const elsewhere = join(outside, 'episodes-elsewhere');
    renameSync(join(dir, 'episodes'), elsewhere);
    symlinkSync(elsewhere, join(dir, 'episodes'));
    const before = readdirSync(elsewhere).sort();
    expect(before.length).toBeGreaterThan(0);
    const events = await session.runJob(() => session.call('export.begin', { scenarioText, outDir: dir, format: 'npz', workers: 1, resume: true }));
    const last = events.at(-1)!;
    expect(last.state).toBe('failed');
    expect(last.message).toContain(`${join(dir, 'episodes')} is a symbolic link`);
    expect(readdirSync(elsewhere).sort()).toEqual(before);
    expect(existsSync(join(dir, 'manifest.json'))).toBe(false);
  });
});
