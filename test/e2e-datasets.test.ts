// Export, Datasets and Seed file end to end in headless Chromium through web mode: a small export
// into a temporary folder runs to its last episode and verifies; a cancelled export is finished
// by a resumed one; the dataset opens, lists its episodes and plays one from its own files; its
// seed file previews any episode again. The files themselves are read by Debian's NumPy
// (/usr/bin/python3), the reference for what the screens report about them.
import { mkdtempSync, readFileSync, realpathSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import type { Browser, Page } from 'playwright-core';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';

import { defaultJobLimits } from '../electron/job-limits.ts';
import { bodyPixels, chooseFolderInPage, launchChromium, measureStage, openApp, saveScreenshot } from './support/e2e-browser.ts';
import { waitInPage } from './support/e2e-page-condition.ts';
import { openDemo, replaceScenarioText, waitForPreviewFinished } from './support/e2e-screen-steps.ts';
import type { PliantWebApp } from './support/e2e-web-app.ts';
import { SCENARIOS_DIR, startPliantWebApp } from './support/e2e-web-app.ts';
import { chromiumAvailability } from './support/reference-chromium.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

const chromium = chromiumAvailability();
const python = referencePythonAvailability();

/** The tether demo cut down to a few short episodes, so the export takes seconds. */
function smallTetherText(episodes: number, recordedSteps: number): string {
  const scenario = JSON.parse(readFileSync(join(SCENARIOS_DIR, 'korrin-tether.json'), 'utf8'));
  scenario.episodes = episodes;
  scenario.time.recordedSteps = recordedSteps;
  return `${JSON.stringify(scenario, null, 2)}\n`;
}

async function exportInto(page: Page, folder: string, name: string, workers: number): Promise<void> {
  await page.click('[data-nav="export"]');
  await page.click('[data-role="export-choose"]');
  await chooseFolderInPage(page, folder);
  await page.fill('[data-role="export-name"]', name);
  await page.fill('[data-role="export-workers"]', String(workers));
  await page.click('[data-role="export-start"]');
}

async function waitForExportState(page: Page, states: string[], timeoutMs = 180_000): Promise<string> {
  await waitInPage(page, `${JSON.stringify(states)}.includes(document.querySelector('[data-screen="export"]')?.getAttribute('data-export-state') ?? '')`, timeoutMs);
  return (await page.getAttribute('[data-screen="export"]', 'data-export-state')) ?? '';
}

describe.runIf(chromium.available && python.available)('Export, Datasets and Seed file screens', () => {
  let app: PliantWebApp;
  let browser: Browser;
  let page: Page;
  let folder: string;
  const episodes = 6;
  const recordedSteps = 40;

  beforeAll(async () => {
    folder = realpathSync(mkdtempSync(join(tmpdir(), 'pliant-e2e-export-')));
    app = await startPliantWebApp();
    browser = await launchChromium();
    ({ page } = await openApp(browser, app.server.url));
  });

  // A failed step leaves the page as it was: keep a picture of it for whoever reads the log.
  afterEach(async (context) => {
    if (context.task.result?.state === 'fail' && page) await saveScreenshot(page, `failed-${context.task.name.replace(/[^A-Za-z0-9]+/g, '-').slice(0, 60)}`);
  });

  afterAll(async () => {
    await browser?.close();
    await app?.close();
    rmSync(folder, { recursive: true, force: true });
  });

  it('shows the hardware-testing caution prominently on the Export screen', async () => {
    await page.click('[data-nav="export"]');
    const caution = await page.textContent('[data-screen="export"] [data-role="safety-caution"]');
    expect(caution).toContain('does not replace hardware testing');
    expect(caution).toContain('conservative limits');
    expect(await page.isVisible('[data-screen="export"] [data-role="safety-caution"]')).toBe(true);
  });

  it('states the job limits the shell applies: jobs at once, the queue, worker threads up to the core count', async () => {
    await page.click('[data-nav="export"]');
    const limits = defaultJobLimits();
    expect(await page.textContent('[data-role="export-job-limits"]')).toBe(
      `At most ${limits.runningJobs} jobs (exports, regenerations, scores, pictures) run at once; later ones wait in a queue of up to ${limits.queuedJobs}, in the order they were started, and the progress line shows their place.`,
    );
    expect(await page.getAttribute('[data-role="export-workers"]', 'max')).toBe(String(limits.workerThreadsPerJob));
    // The default is the cap, the core count, as `pliant generate` defaults to all cores.
    expect(await page.inputValue('[data-role="export-workers"]')).toBe(String(limits.workerThreadsPerJob));
    expect(await page.textContent('[data-screen="export"] .form-grid')).toContain(`1 to ${limits.workerThreadsPerJob}, the cores of the computer it runs on (as pliant generate's default)`);
  });

  it('a small export reaches its last episode and every checksum verifies', async () => {
    await openDemo(page, 'korrin-tether.json');
    await replaceScenarioText(page, smallTetherText(episodes, recordedSteps));
    expect(await page.getAttribute('[data-role="problem-summary"]', 'data-state')).toBe('ok');
    await exportInto(page, folder, 'tank-tether', 2);
    expect(await waitForExportState(page, ['done', 'failed', 'cancelled'])).toBe('done');
    const progress = '[data-role="export-progress-text"]';
    expect(await page.getAttribute(progress, 'data-done')).toBe(String(episodes));
    expect(await page.getAttribute(progress, 'data-total')).toBe(String(episodes));
    await page.waitForSelector('[data-role="verify-result"]');
    expect(await page.getAttribute('[data-role="verify-result"]', 'data-ok')).toBe('true');
    // The folder's size, as os.path.getsize measures the files the manifest lists and the manifest.
    const measured = runReferencePython<number>(
      'import json, sys, os\nd = json.load(sys.stdin)\nm = json.load(open(os.path.join(d, "manifest.json")))\n' +
        'print(sum(os.path.getsize(os.path.join(d, f["path"])) for f in m["documents"] + m["files"]) + os.path.getsize(os.path.join(d, "manifest.json")))',
      join(folder, 'tank-tether'),
    );
    expect(await page.getAttribute('[data-role="export-size"]', 'data-bytes')).toBe(String(measured));
    expect(await page.textContent('[data-role="export-size"]')).toContain(`${measured.toLocaleString('en')} bytes`);
    await saveScreenshot(page, 'export-done');

    // What NumPy finds in the folder: one NPZ per episode, positions (T + 1) × N × 3.
    const found = runReferencePython<{ files: number; shape: number[] }>(
      'import json, sys, glob, os, numpy\n' +
        'd = json.load(sys.stdin)\n' +
        'files = sorted(glob.glob(os.path.join(d, "episodes", "*.npz")))\n' +
        'a = numpy.load(files[0])["positions"]\n' +
        'print(json.dumps({"files": len(files), "shape": list(a.shape)}))',
      join(folder, 'tank-tether'),
    );
    expect(found.files).toBe(episodes);
    expect(found.shape[0]).toBe(recordedSteps + 1);
    expect(found.shape[2]).toBe(3);
  });

  it('a cancelled export leaves a folder that a resumed export finishes and verifies', async () => {
    await replaceScenarioText(page, smallTetherText(24, 150));
    await exportInto(page, folder, 'tank-resumed', 1);
    await waitInPage(page, `Number(document.querySelector('[data-role="export-progress-text"]')?.getAttribute('data-done') ?? '0') >= 1`, 120_000);
    await page.click('[data-role="export-cancel"]');
    const state = await waitForExportState(page, ['cancelled', 'done', 'failed']);
    // A machine fast enough to finish before the cancel arrives has nothing left to resume.
    if (state === 'cancelled') {
      expect(await page.isChecked('[data-role="export-resume"]')).toBe(true);
      await page.click('[data-role="export-start"]');
      expect(await waitForExportState(page, ['done', 'failed', 'cancelled'])).toBe('done');
    } else {
      expect(state).toBe('done');
    }
    await page.waitForSelector('[data-role="verify-result"]');
    expect(await page.getAttribute('[data-role="verify-result"]', 'data-ok')).toBe('true');
    const files = runReferencePython<number>('import json, sys, glob, os\nprint(len(glob.glob(os.path.join(json.load(sys.stdin), "episodes", "*.npz"))))', join(folder, 'tank-resumed'));
    expect(files).toBe(24);
  });

  it('the exported dataset lists its episodes a page at a time and plays one from its files', async () => {
    await page.click('[data-nav="datasets"]');
    await page.click('[data-role="open-dataset"]');
    await chooseFolderInPage(page, join(folder, 'tank-tether'));
    await page.waitForSelector('[data-role="episode-table"] tbody tr');
    expect(await page.textContent('[data-role="page-label"]')).toContain(`of ${episodes}`);
    expect(await page.$$eval('[data-role="episode-table"] tbody tr', (rows) => rows.length)).toBe(episodes);

    // Sorting by a sampled parameter orders the rows by it (ascending, then descending on a
    // second click), as the definition of a sort; the split filter keeps only that split.
    const column = '/system/lengthM';
    const valuesOf = async (): Promise<number[]> => {
      const heads = await page.$$eval('[data-role="episode-table"] thead th', (ths) => ths.map((th) => th.querySelector('[data-sort]')?.getAttribute('data-sort') ?? ''));
      const index = heads.indexOf(column);
      expect(index).toBeGreaterThan(-1);
      return page.$$eval('[data-role="episode-table"] tbody tr', (rows, i) => rows.map((r) => Number(r.children[i as number].textContent)), index);
    };
    await page.click(`[data-role="episode-table"] [data-sort="${column}"]`);
    await waitInPage(page, `(document.querySelector('[data-sort="${column}"]')?.textContent ?? '').includes('▲')`);
    const ascending = await valuesOf();
    expect(ascending).toEqual([...ascending].sort((a, b) => a - b));
    await page.click(`[data-role="episode-table"] [data-sort="${column}"]`);
    await waitInPage(page, `(document.querySelector('[data-sort="${column}"]')?.textContent ?? '').includes('▼')`);
    expect(await valuesOf()).toEqual([...ascending].sort((a, b) => b - a));
    await page.selectOption('[data-role="filter-split"]', 'train');
    await waitInPage(page, `[...document.querySelectorAll('[data-role="episode-table"] tbody tr .split-badge')].every((b) => b.textContent === 'train')`);
    const trainRows = await page.$$eval('[data-role="episode-table"] tbody tr', (rows) => rows.length);
    const summary = (await page.textContent('[data-role="dataset-summary"]')) ?? '';
    expect(summary).toContain(`train ${trainRows}`);
    await page.selectOption('[data-role="filter-split"]', '');
    await waitInPage(page, `document.querySelectorAll('[data-role="episode-table"] tbody tr').length === ${episodes}`);

    await page.click('[data-role="episode-table"] tbody tr:first-child [data-role="play-episode"]');
    await page.waitForSelector('[data-role="playing-episode"][data-episode]');
    const player = '[data-screen="datasets"] .player';
    // Pause at the first frame, then play: the frame count and the picture must move on.
    await waitInPage(page, `document.querySelector('[data-screen="datasets"] [data-role="play"]')?.textContent === 'Pause'`);
    await page.locator('[data-screen="datasets"] canvas.stage-canvas').focus();
    await page.keyboard.press('Space');
    await page.fill(`${player} [data-role="timeline"]`, '0');
    expect(Number(await page.getAttribute(player, 'data-frame'))).toBe(0);
    await page.evaluate('new Promise((done) => requestAnimationFrame(() => requestAnimationFrame(done)))');
    const first = await measureStage(page, 'datasets');
    await page.keyboard.press('Space');
    await waitInPage(page, `Number(document.querySelector(${JSON.stringify(player)})?.getAttribute('data-frame')) >= 10`, 20_000);
    const later = await measureStage(page, 'datasets');
    // The picture itself changes as the tether moves, not only the frame counter.
    expect(later.fingerprint).not.toBe(first.fingerprint);
    await page.keyboard.press('Space');
    expect(await bodyPixels(page, 'datasets')).toBeGreaterThan(200);
    expect(await page.textContent('[data-role="playing-episode"]')).toContain(`${recordedSteps + 1} frames`);
    // The controls chart names each channel with its unit as manifest.json records them.
    const channels = runReferencePython<{ name: string; unit: string }[]>(
      'import json, sys, os\nm = json.load(open(os.path.join(json.load(sys.stdin), "manifest.json")))\nprint(json.dumps(m["episodes"][0]["controlChannels"]))',
      join(folder, 'tank-tether'),
    );
    expect(channels.length).toBeGreaterThan(0);
    const controls = '[data-screen="datasets"] [data-plot="Controls"]';
    expect(await page.textContent(`${controls} figcaption`)).toBe(`Controls, ${[...new Set(channels.map((c) => c.unit))].join(' or ')}`);
    const legend = (await page.textContent(controls)) ?? '';
    for (const c of channels) expect(legend).toContain(`${c.name}, ${c.unit}`);
    expect(legend).not.toContain('per channel');
    const summaryText = (await page.textContent('[data-role="dataset-summary"]')) ?? '';
    for (const c of channels) expect(summaryText).toContain(`${c.name}, ${c.unit}`);
    // The scene comes from the dataset's seed file: the tether demo hangs in water, with no ground.
    const demo = JSON.parse(readFileSync(join(SCENARIOS_DIR, 'korrin-tether.json'), 'utf8'));
    expect(await page.getAttribute('[data-screen="datasets"] [data-role="stage"]', 'data-fluid')).toBe(String(demo.world.fluid !== undefined));
    expect(await page.getAttribute('[data-screen="datasets"] [data-role="stage"]', 'data-ground')).toBe(demo.world.ground === undefined ? 'none' : String(demo.world.ground.heightM ?? 0));
    await saveScreenshot(page, 'datasets-playback');
  });

  it("the dataset's seed file regenerates it file for file and previews any of its episodes again", async () => {
    await page.click('[data-role="open-seed"]');
    await page.waitForSelector('[data-role="seed-summary"] dd');
    expect(await page.textContent('[data-role="seed-summary"]')).toContain(String(episodes));
    // Regenerating it into a new folder reproduces every file the seed file lists.
    await page.click('[data-role="seed-choose-out"]');
    await chooseFolderInPage(page, folder);
    await page.fill('[data-role="seed-out-name"]', 'tank-tether-again');
    await page.click('[data-role="seed-regenerate"]');
    await waitInPage(page, `['done', 'failed', 'cancelled'].includes(document.querySelector('[data-screen="seed"]')?.getAttribute('data-seed-state'))`, 180_000);
    expect(await page.getAttribute('[data-screen="seed"]', 'data-seed-state')).toBe('done');
    await waitInPage(page, `document.querySelectorAll('[data-role="seed-files"] tr[data-result="identical"]').length > 0`);
    const rows = await page.$$eval('[data-role="seed-files"] tbody tr', (trs) => trs.map((r) => ({ file: r.getAttribute('data-file'), result: r.getAttribute('data-result') })));
    // Every file the original manifest lists, then manifest.json, compared with the original folder.
    const listed = runReferencePython<string[]>(
      'import json, sys, os\nm = json.load(open(os.path.join(json.load(sys.stdin), "manifest.json")))\nprint(json.dumps([f["path"] for f in m["documents"] + m["files"]]))',
      join(folder, 'tank-tether'),
    );
    expect(rows).toEqual([...listed, 'manifest.json'].map((file) => ({ file, result: 'identical' })));
    await saveScreenshot(page, 'seed-file');
    // NumPy finds the regenerated positions identical to the exported ones.
    const same = runReferencePython<boolean>(
      'import json, sys, os, numpy\n' +
        'a, b = json.load(sys.stdin)\n' +
        'print(json.dumps(all(numpy.array_equal(numpy.load(os.path.join(a, "episodes", f))["positions"], numpy.load(os.path.join(b, "episodes", f))["positions"]) for f in sorted(os.listdir(os.path.join(a, "episodes"))))))',
      [join(folder, 'tank-tether'), join(folder, 'tank-tether-again')],
    );
    expect(same).toBe(true);
    await page.fill('[data-role="seed-index"]', '3');
    await page.click('[data-role="seed-preview"]');
    await waitForPreviewFinished(page);
    const facts = await page.$$eval('[data-role="episode-facts"] dd', (dd) => dd.map((d) => d.textContent));
    expect(facts[0]).toBe('3');
  });
});
