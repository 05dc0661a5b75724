// The Scores screen end to end in headless Chromium through web mode, over the real pipeline: a
// small tether dataset and the persistence baseline's predictions are scored by a score job, the
// screen's tables show what NumPy computes from the same NPZ files (the one-step RMSE of
// persistence per split), an episode plays with its prediction drawn over the recording (the
// legend's largest error as NumPy finds it), and a calibration report of the invented Korrin Bay
// bench measurement opens with its fitted values and the parameter it cannot identify; a folder
// short of one episode is scored with "only the episodes that have a prediction" ticked.
import { cpSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, realpathSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import type { Browser, Page } from 'playwright-core';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';

import { runCli } from '../sim/cli/main.ts';
import { chooseFolderInPage, launchChromium, openApp, saveScreenshot } from './support/e2e-browser.ts';
import { waitInPage } from './support/e2e-page-condition.ts';
import type { PliantWebApp } from './support/e2e-web-app.ts';
import { SCENARIOS_DIR, startPliantWebApp } from './support/e2e-web-app.ts';
import { chromiumAvailability } from './support/reference-chromium.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

const chromium = chromiumAvailability();
const python = referencePythonAvailability();

async function cli(args: string[], cwd: string): Promise<{ code: number; stderr: string }> {
  let stderr = '';
  const code = await runCli(args, { stdout: () => undefined, stderr: (t) => void (stderr += t), isTerminal: false, env: {}, cwd });
  return { code, stderr };
}

describe.runIf(chromium.available && python.available)('Scores screen', () => {
  let app: PliantWebApp;
  let browser: Browser;
  let page: Page;
  let folder: string;

  beforeAll(async () => {
    folder = realpathSync(mkdtempSync(join(tmpdir(), 'pliant-e2e-scores-')));
    const scenario = JSON.parse(readFileSync(join(SCENARIOS_DIR, 'korrin-tether.json'), 'utf8'));
    scenario.episodes = 12;
    scenario.time.recordedSteps = 40;
    writeFileSync(join(folder, 'tether.json'), JSON.stringify(scenario, null, 2));
    for (const args of [
      ['generate', 'tether.json', '--out', 'tether', '--workers', '1'],
      ['baseline', 'predict', '--model', 'persistence', 'tether', '--out', 'persistence'],
      ['calibrate', join(SCENARIOS_DIR, 'korrin-tether.json'), join(SCENARIOS_DIR, 'bench', 'korrin-tether-bench.json'), '--out', join(folder, 'fitted.json')],
    ]) {
      const result = await cli(args, folder);
      expect(result.code, `${args.join(' ')}: ${result.stderr}`).toBe(0);
    }
    mkdirSync(join(folder, 'report'));
    app = await startPliantWebApp();
    browser = await launchChromium();
    ({ page } = await openApp(browser, app.server.url));
  }, 600_000);

  afterEach(async (context) => {
    if (context.task.result?.state === 'fail' && page) await saveScreenshot(page, `failed-${context.task.name.replace(/[^A-Za-z0-9]+/g, '-').slice(0, 60)}`);
  });

  afterAll(async () => {
    await browser?.close();
    await app?.close();
    rmSync(folder, { recursive: true, force: true });
  });

  it('shows the hardware-testing caution on the Scores screen', async () => {
    await page.click('[data-nav="scores"]');
    const caution = await page.textContent('[data-screen="scores"] [data-role="safety-caution"]');
    expect(caution).toContain('does not replace hardware testing');
  });

  it('scores the persistence predictions in a job and shows the per-split one-step error NumPy computes', async () => {
    await page.click('[data-role="score-dataset"]');
    await chooseFolderInPage(page, join(folder, 'tether'));
    await page.click('[data-role="score-predictions"]');
    await chooseFolderInPage(page, join(folder, 'persistence'));
    await page.click('[data-role="score-begin"]');
    await chooseFolderInPage(page, join(folder, 'report'));
    await waitInPage(page, `document.querySelector('[data-role="score-report"]')?.getAttribute('data-loaded') === ${JSON.stringify(join(folder, 'report'))}`, 180_000);
    await saveScreenshot(page, 'scores');

    // One-step RMSE of persistence, mean over each split's episodes: sqrt(mean over nodes of
    // |p(1) − p(0)|²), recomputed from the dataset's and the prediction folder's NPZ files.
    const want = runReferencePython<Record<string, number>>(`
import json, sys, os, numpy as np
d = json.load(sys.stdin)
m = json.load(open(os.path.join(d, 'tether', 'manifest.json')))
per = {}
for e in m['episodes']:
    # pliant score's default splits: test and the held-out splits (train and validation are for fitting).
    if e['status'] != 'ok' or e['split'] in ('train', 'validation'):
        continue
    p = np.load(os.path.join(d, 'tether', 'episodes', e['id'] + '.npz'))['positions'].astype(np.float64)
    q = np.load(os.path.join(d, 'persistence', e['id'] + '.npz'))['positions'].astype(np.float64)
    per.setdefault(e['split'], []).append(float(np.sqrt(np.mean(np.sum((q[1] - p[1]) ** 2, axis=1)))))
print(json.dumps({k: float(np.mean(v)) for k, v in per.items()}))
`, folder);
    const rows = await page.$$eval('[data-role="score-splits"] tbody tr', (trs) => trs.map((tr) => [...tr.children].map((c) => c.textContent ?? '')));
    const scoredSplits = Object.keys(want);
    expect(scoredSplits.length).toBeGreaterThan(0);
    for (const split of scoredSplits) {
      const row = rows.find((r) => r[0] === split);
      expect(row, `row for ${split}`).toBeDefined();
      const shown = Number(row![2].split(' ')[0]);
      expect(shown).toBeCloseTo(want[split], Math.max(0, -Math.floor(Math.log10(want[split]))) + 2);
    }
    expect(await page.isVisible('[data-role="score-gap"]')).toBe(true);
  });

  it('plays the worst episode with its prediction over the recording, coloured by its error', async () => {
    const worst = await page.getAttribute('[data-role="score-episodes"] tbody tr', 'data-episode');
    expect(worst).toMatch(/^ep-\d{6}$/);
    await page.click('[data-role="score-episodes"] tbody tr [data-role="score-play"]');
    await page.waitForSelector(`[data-role="score-playing"][data-episode="${worst}"]`);
    expect(await page.getAttribute('[data-screen="scores"] .player', 'data-comparison')).toBe('on');
    expect(await page.getAttribute('[data-screen="scores"] [data-role="legend"]', 'data-mode')).toBe('error');
    const largest = runReferencePython<number>(`
import json, sys, os, numpy as np
d, ep = json.load(sys.stdin)
p = np.load(os.path.join(d, 'tether', 'episodes', ep + '.npz'))['positions'].astype(np.float32)
q = np.load(os.path.join(d, 'persistence', ep + '.npz'))['positions'].astype(np.float32)
print(float(np.max(np.linalg.norm(q.astype(np.float64) - p.astype(np.float64), axis=2))))
`, [folder, worst]);
    const text = (await page.textContent('[data-role="score-playing"]')) ?? '';
    const shownLargest = Number(/largest error ([0-9.e-]+) m/.exec(text)?.[1]);
    // The line shows three significant digits.
    expect(Math.abs(shownLargest - largest)).toBeLessThanOrEqual(0.5e-2 * largest);
    await saveScreenshot(page, 'scores-playback');
  });

  it('opens the calibration report with fitted values and says which parameter is not identifiable', async () => {
    await page.click('[data-role="calibration-open"]');
    await chooseFolderInPage(page, join(folder, 'fitted-report'));
    await page.waitForSelector('[data-role="calibration-report"][data-loaded]');
    const calibration = JSON.parse(readFileSync(join(folder, 'fitted-report', 'calibration.json'), 'utf8')) as { parameters: { pointer: string; identifiable: boolean }[] };
    const shown = await page.$$eval('[data-role="calibration-parameters"] tbody tr', (trs) => trs.map((tr) => ({ pointer: tr.getAttribute('data-pointer'), identifiable: tr.getAttribute('data-identifiable'), value: tr.children[1].textContent })));
    expect(shown.map((s) => s.pointer)).toEqual(calibration.parameters.map((p) => p.pointer));
    for (const [i, p] of calibration.parameters.entries()) {
      expect(shown[i].identifiable).toBe(String(p.identifiable));
      if (!p.identifiable) expect(shown[i].value).toBe('not identifiable');
    }
    expect(calibration.parameters.some((p) => !p.identifiable)).toBe(true);
  });

  it('scores a folder short of one episode when asked to, and names the episode left out', async () => {
    const partial = join(folder, 'partial');
    cpSync(join(folder, 'persistence'), partial, { recursive: true });
    const dropped = readdirSync(partial).filter((f) => f.endsWith('.npz')).sort()[0].slice(0, -4);
    rmSync(join(partial, `${dropped}.npz`));
    mkdirSync(join(folder, 'report-partial'));
    await page.click('[data-role="score-predictions"]');
    await chooseFolderInPage(page, partial);
    await page.check('[data-role="score-allow-missing"]');
    await page.click('[data-role="score-begin"]');
    await chooseFolderInPage(page, join(folder, 'report-partial'));
    await waitInPage(page, `document.querySelector('[data-role="score-report"]')?.getAttribute('data-loaded') === ${JSON.stringify(join(folder, 'report-partial'))}`, 180_000);
    const score = JSON.parse(readFileSync(join(folder, 'report-partial', 'score.json'), 'utf8')) as { predictions: { missing: { id: string }[] } };
    expect(score.predictions.missing.map((m) => m.id)).toEqual([dropped]);
    const facts = (await page.textContent('[data-role="score-report"] dl.facts')) ?? '';
    expect(facts).toContain(`not predicted1 episode has no prediction file and is left out: ${dropped}`);
  });
});
