// Saving an episode as a GIF from the Datasets screen, end to end in headless Chromium through
// web mode: the tether demo (cut down to two short episodes) is opened, its second episode
// played and saved as a GIF into a folder chosen in the in-page chooser; Pillow (Debian's
// python3-pil, a reference decoder) then reads the file to the frame count and size the screen
// promised, and os.path.getsize to the size the screen reports.
import { existsSync, mkdirSync, mkdtempSync, readFileSync, realpathSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import type { Browser, Page } from 'playwright-core';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';

import { cutDownScenario, runPliant } from './support/app-flow-session.ts';
import { chooseFolderInPage, launchChromium, openApp, saveScreenshot } from './support/e2e-browser.ts';
import { waitInPage } from './support/e2e-page-condition.ts';
import type { PliantWebApp } from './support/e2e-web-app.ts';
import { startPliantWebApp } from './support/e2e-web-app.ts';
import { chromiumAvailability } from './support/reference-chromium.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

const chromium = chromiumAvailability();
const python = referencePythonAvailability();
const RECORDED_STEPS = 30;

describe.runIf(chromium.available && python.available)('Datasets screen: Save as GIF…', () => {
  let app: PliantWebApp;
  let browser: Browser;
  let page: Page;
  let work: string;
  let dataset: string;
  let pictures: string;

  beforeAll(async () => {
    work = realpathSync(mkdtempSync(join(tmpdir(), 'pliant-e2e-render-')));
    dataset = join(work, 'korrin-tether');
    pictures = join(work, 'pictures');
    writeFileSync(join(work, 'tether.json'), cutDownScenario('korrin-tether.json', 2, RECORDED_STEPS));
    const made = runPliant(['generate', join(work, 'tether.json'), '--out', dataset, '--workers', '1', '--progress', 'none']);
    if (made.status !== 0) throw new Error(`pliant generate failed (${made.status}): ${made.stderr}`);
    mkdirSync(pictures);
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
    rmSync(work, { recursive: true, force: true });
  });

  it('saves the episode playing as a GIF that decodes to every recorded frame, and says where and how large', async () => {
    await page.click('[data-nav="datasets"]');
    expect(await page.isDisabled('[data-role="save-gif"]')).toBe(true);
    await page.click('[data-role="open-dataset"]');
    await chooseFolderInPage(page, dataset);
    await page.waitForSelector('[data-role="episode-table"] tbody tr');
    await page.click('[data-role="episode-table"] tbody tr:nth-child(2) [data-role="play-episode"]');
    await waitInPage(page, `document.querySelector('[data-role="playing-episode"]')?.getAttribute('data-episode') === 'ep-000001'`, 120_000);
    expect(await page.inputValue('[data-role="picture-name"]')).toBe('ep-000001');

    await page.click('[data-role="save-gif"]');
    await chooseFolderInPage(page, pictures);
    await waitInPage(page, `['done', 'failed', 'cancelled', 'refused'].includes(document.querySelector('[data-role="picture-saver"]')?.getAttribute('data-picture-state') ?? '')`, 300_000);
    const state = await page.getAttribute('[data-role="picture-saver"]', 'data-picture-state');
    expect(state, (await page.textContent('[data-role="picture-status"]')) ?? '').toBe('done');
    await saveScreenshot(page, 'datasets-saved-gif');

    const gifPath = join(pictures, 'ep-000001.gif');
    expect(existsSync(gifPath)).toBe(true);
    expect(await page.getAttribute('[data-role="picture-result"]', 'data-path')).toBe(gifPath);
    expect(await page.getAttribute('[data-role="picture-progress-text"]', 'data-done')).toBe(String(RECORDED_STEPS + 1));
    expect(await page.textContent('[data-role="picture-progress-text"]')).toContain(`${RECORDED_STEPS + 1} of ${RECORDED_STEPS + 1} pictures · done`);
    const seen = runReferencePython<{ format: string; size: number[]; frames: number; bytes: number }>(
      'import sys, json, os\nfrom PIL import Image\np = json.load(sys.stdin)\nim = Image.open(p)\nprint(json.dumps({"format": im.format, "size": list(im.size), "frames": im.n_frames, "bytes": os.path.getsize(p)}))',
      gifPath,
    );
    expect(seen.format).toBe('GIF');
    // One picture per recorded step at 0.02 s (korrin-tether.json), 640×320 as `pliant render` draws by default.
    expect(seen.frames).toBe(RECORDED_STEPS + 1);
    expect(seen.size).toEqual([640, 320]);
    const result = (await page.textContent('[data-role="picture-result"]')) ?? '';
    expect(result).toContain(gifPath);
    expect(result).toContain(`${seen.bytes} bytes`);
    expect(result).toContain(`${RECORDED_STEPS + 1} frames`);
  }, 600_000);

  it('a second save under the same name is refused and leaves the first GIF as it was', async () => {
    const gifPath = join(pictures, 'ep-000001.gif');
    const before = readFileSync(gifPath);
    await page.click('[data-role="save-gif"]');
    await chooseFolderInPage(page, pictures);
    await waitInPage(page, `document.querySelector('[data-role="picture-saver"]')?.getAttribute('data-picture-state') === 'refused'`, 60_000);
    expect(await page.textContent('[data-role="picture-status"]')).toContain('already there');
    expect(Buffer.compare(readFileSync(gifPath), before)).toBe(0);
  }, 120_000);
});
