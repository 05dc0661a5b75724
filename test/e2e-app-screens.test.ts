// The Preview, Export and Datasets screens as a laptop shows them, end to end in headless
// Chromium through web mode: nothing runs past the window's edge at 1440 and 800 px, nothing
// covers the 3-D view, the frame timing is a toggle, drawn parameters read as words with units,
// material colours stay apart, sixteen control channels get sixteen small charts, the Datasets
// screen says what to do before a folder is open, shapes that vary show their range, the id and
// action columns stay in view, range filters and the compare view work, the Export screen
// estimates before it starts, and axe-core finds no contrast or label violations.
// Outside references: Debian's NumPy reads the exported files for the shapes, the manifest the
// export writes gives the expected filter counts and split sizes, os.availableParallelism() is
// what `pliant generate` defaults to, and axe-core (Deque's rules for WCAG 2 AA) judges
// contrast and labels.
import { mkdtempSync, readFileSync, realpathSync, rmSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { availableParallelism } from 'node:os';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import type { Browser, Page } from 'playwright-core';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';

import { cutDownScenario, runPliant } from './support/app-flow-session.ts';
import { chooseFolderInPage, launchChromium, measureStage, openApp, saveScreenshot } from './support/e2e-browser.ts';
import { waitInPage } from './support/e2e-page-condition.ts';
import { openDemo, replaceScenarioText, waitForPreviewFinished } from './support/e2e-screen-steps.ts';
import type { PliantWebApp } from './support/e2e-web-app.ts';
import { SCENARIOS_DIR, startPliantWebApp } from './support/e2e-web-app.ts';
import { chromiumAvailability } from './support/reference-chromium.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

const chromium = chromiumAvailability();
const python = referencePythonAvailability();

/** Widths the screens must fit: a desktop monitor and a small laptop window. */
const WIDTHS = [1440, 800] as const;

/**
 * Smallest CIE 1976 colour difference ΔE*ab two material colours may have. About 2.3 is the
 * just-noticeable difference (Sharma and Trussell, 1997, from memory); 10 keeps two swatches
 * plainly different side by side (common practice, no source).
 */
const MIN_MATERIAL_DELTA_E = 10;

/** sRGB 0…255 to CIELAB (D65), the IEC 61966-2-1 and CIE 15:2004 formulas (from memory). */
function srgbToLab([r, g, b]: number[]): [number, number, number] {
  const linear = (c: number): number => {
    const v = c / 255;
    return v <= 0.04045 ? v / 12.92 : ((v + 0.055) / 1.055) ** 2.4;
  };
  const [R, G, B] = [linear(r), linear(g), linear(b)];
  const x = (0.4124 * R + 0.3576 * G + 0.1805 * B) / 0.95047;
  const y = 0.2126 * R + 0.7152 * G + 0.0722 * B;
  const z = (0.0193 * R + 0.1192 * G + 0.9505 * B) / 1.08883;
  const f = (t: number): number => (t > (6 / 29) ** 3 ? Math.cbrt(t) : t / (3 * (6 / 29) ** 2) + 4 / 29);
  return [116 * f(y) - 16, 500 * (f(x) - f(y)), 200 * (f(y) - f(z))];
}

function parseRgb(css: string): number[] {
  const match = /rgba?\(([\d.]+),\s*([\d.]+),\s*([\d.]+)/.exec(css);
  if (!match) throw new Error(`not an rgb() colour: ${css}`);
  return [Number(match[1]), Number(match[2]), Number(match[3])];
}

async function setWidth(page: Page, width: number): Promise<void> {
  await page.setViewportSize({ width, height: 900 });
  await page.evaluate('new Promise((done) => requestAnimationFrame(() => requestAnimationFrame(done)))');
  await page.waitForTimeout(150);
}

/** How far the page runs past the window's right edge, px (0: no horizontal scrolling). */
async function horizontalOverflowPx(page: Page): Promise<number> {
  const overflow = (await page.evaluate('document.documentElement.scrollWidth - document.documentElement.clientWidth')) as number;
  if (overflow > 0) {
    const culprits = await page.evaluate(`[...document.querySelectorAll('body *')].filter((e) => e.getBoundingClientRect().right > document.documentElement.clientWidth + 0.5 && e.getClientRects().length > 0)
      .slice(0, 8).map((e) => e.tagName + '.' + e.className + '[' + (e.getAttribute('data-role') || '') + '] right ' + Math.round(e.getBoundingClientRect().right))`);
    console.info(`[e2e] wider than the window: ${JSON.stringify(culprits)}`);
  }
  return overflow;
}

/**
 * What covers the 3-D view of a screen: samples a 12 × 12 grid over the stage's visible part and
 * returns the elements found on top that are not its canvas.
 */
async function stageCoverers(page: Page, screen: string): Promise<string[]> {
  await page.locator(`[data-screen="${screen}"] canvas.stage-canvas`).first().scrollIntoViewIfNeeded();
  return page.evaluate(`(() => {
    const canvas = document.querySelector('[data-screen="${screen}"] canvas.stage-canvas');
    const r = canvas.getBoundingClientRect();
    const top = Math.max(r.top, 0), bottom = Math.min(r.bottom, window.innerHeight);
    const found = new Set();
    for (let i = 0; i < 12; i++) for (let j = 0; j < 12; j++) {
      const x = r.left + (i + 0.5) * r.width / 12;
      const y = top + (j + 0.5) * (bottom - top) / 12;
      const hit = document.elementFromPoint(x, y);
      if (hit !== canvas) found.add(hit ? (hit.getAttribute('data-role') || hit.className || hit.tagName) : 'nothing');
    }
    return [...found];
  })()`) as Promise<string[]>;
}

async function stageWidthPx(page: Page, screen: string): Promise<number> {
  const box = await page.locator(`[data-screen="${screen}"] canvas.stage-canvas`).first().boundingBox();
  return box?.width ?? 0;
}

describe.runIf(chromium.available && python.available)('Preview, Export and Datasets on a laptop screen', () => {
  let app: PliantWebApp;
  let browser: Browser;
  let page: Page;
  let work: string;
  let dataset: string;
  let manifest: { episodes: { id: string; split: string; status: string; labels: Record<string, unknown> }[] };
  const datasetEpisodes = 12;
  const datasetSteps = 10;

  beforeAll(async () => {
    work = realpathSync(mkdtempSync(join(tmpdir(), 'pliant-e2e-screens-')));
    const scenario = join(work, 'korrin-tether.json');
    writeFileSync(scenario, cutDownScenario('korrin-tether.json', datasetEpisodes, datasetSteps));
    dataset = join(work, 'tether-small');
    const generated = runPliant(['generate', scenario, '--out', dataset, '--progress', 'none']);
    expect(generated.status, generated.stderr).toBe(0);
    manifest = JSON.parse(readFileSync(join(dataset, 'manifest.json'), 'utf8'));
    app = await startPliantWebApp();
    browser = await launchChromium();
    ({ page } = await openApp(browser, app.server.url));
  });

  afterEach(async (context) => {
    if (context.task.result?.state === 'fail' && page) await saveScreenshot(page, `failed-${context.task.name.replace(/[^A-Za-z0-9]+/g, '-').slice(0, 60)}`);
  });

  afterAll(async () => {
    await browser?.close();
    await app?.close();
    if (work) rmSync(work, { recursive: true, force: true });
  });

  it('Datasets before a folder is open: says what to do, with no empty 3-D view or chart frames', async () => {
    await page.click('[data-nav="datasets"]');
    expect(await page.isVisible('[data-role="datasets-empty"]')).toBe(true);
    expect(await page.textContent('[data-role="datasets-empty"]')).toContain('Open dataset folder');
    const shown = await page.evaluate(`[...document.querySelectorAll('[data-screen="datasets"] canvas, [data-screen="datasets"] figure')].filter((e) => e.getClientRects().length > 0).length`);
    expect(shown).toBe(0);
    await saveScreenshot(page, 'datasets-empty');
  });

  it('the eel preview fits 1440 and 800 px, keeps its 3-D view wide and uncovered, and the frame timing is a toggle', async () => {
    await openDemo(page, 'korrin-eel.json');
    await page.click('[data-nav="preview"]');
    await waitForPreviewFinished(page);
    await page.keyboard.press('Space'); // pause: one frame for the captures
    const rate = '[data-screen="preview"] [data-role="draw-rate"]';
    for (const width of WIDTHS) {
      await setWidth(page, width);
      expect(await horizontalOverflowPx(page), `overflow at ${width} px`).toBeLessThanOrEqual(0);
      // Usable on a laptop: the view keeps most of the window's width (at 800 px it was 220 px).
      expect(await stageWidthPx(page, 'preview'), `3-D view width at ${width} px`).toBeGreaterThanOrEqual(width === 800 ? 0.8 * (width - 40) : 600);
      expect(await page.isVisible(rate)).toBe(false);
      expect(await stageCoverers(page, 'preview'), `elements over the 3-D view at ${width} px`).toEqual([]);
      await saveScreenshot(page, `preview-eel-${width}`);
    }
    await page.check('[data-screen="preview"] [data-role="show-timing"]');
    expect(await page.isVisible(rate)).toBe(true);
    await page.uncheck('[data-screen="preview"] [data-role="show-timing"]');
    expect(await page.isVisible(rate)).toBe(false);
    await setWidth(page, 1440);
  });

  it('drawn parameters read as words with units in tables; lists are summarised and the panel stays short', async () => {
    // Units as our key naming rule spells them (DEVELOPERS.md): M → m, Pa, KgPerM3 → kg/m³, a
    // ratio has none.
    const expectedUnits: Record<string, string> = { cellSizeM: 'm', youngsModulusPa: 'Pa', densityKgPerM3: 'kg/m³', dampingRatio: '–' };
    const cards = await page.$$eval('[data-role="preview-episodes"] [data-role="card-parameters"] tbody tr', (rows) =>
      rows.map((r) => ({ pointer: r.getAttribute('data-pointer') ?? '', name: r.children[0].textContent ?? '', unit: r.children[2].textContent ?? '' })));
    expect(cards.length).toBeGreaterThan(0);
    for (const row of cards) {
      expect(row.name, row.pointer).not.toContain('/');
      expect(row.name, row.pointer).toMatch(/^[a-z0-9 ·'–-]+$/);
      const key = row.pointer.split('/').pop() ?? '';
      if (key in expectedUnits) expect(row.unit, row.pointer).toBe(expectedUnits[key]);
    }
    expect(cards.some((r) => r.name === 'cell size' && r.unit === 'm')).toBe(true);
    const facts = page.locator('[data-role="episode-facts"]');
    const texts = await facts.locator('[data-role="episode-parameters"] td').allTextContents();
    // No raw float arrays: a cell with more than four commas would be one.
    for (const text of texts) expect(text.split(',').length, text).toBeLessThanOrEqual(5);
    const height = (await facts.boundingBox())?.height ?? Infinity;
    expect(height).toBeLessThan(1500); // it was about 2,900 px
    // And the side column ends no lower than the charts beside it: no blank area under them.
    // (A grid cell stretched to its row would pass this by itself; the main column's content is
    // measured, and the side column must not be stretched.)
    await page.evaluate('window.scrollTo(0, 0)');
    const ends = (await page.evaluate(`[document.querySelector('[data-screen="preview"] .preview-side'), document.querySelector('[data-screen="preview"] .preview-main').lastElementChild].map((e) => e.getBoundingClientRect().bottom)`)) as number[];
    console.info(`[e2e] This episode ${Math.round(height)} px; the side column ends at ${Math.round(ends[0])} px, the charts at ${Math.round(ends[1])} px`);
    expect(ends[0]).toBeLessThanOrEqual(ends[1] + 50);
    await saveScreenshot(page, 'preview-eel-parameters');
  });

  it(`the eel's materials get pairwise distinct colours (CIE 1976 ΔE*ab ≥ ${MIN_MATERIAL_DELTA_E})`, async () => {
    const eel = JSON.parse(readFileSync(join(SCENARIOS_DIR, 'korrin-eel.json'), 'utf8'));
    const materials = (eel.system.materials as { name: string }[]).map((m) => m.name);
    await page.selectOption('[data-screen="preview"] [data-role="colour-mode"]', 'material');
    const swatches = (await page.evaluate(`[...document.querySelectorAll('[data-screen="preview"] [data-role="legend"] .legend-swatches li')].map((li) => ({
      name: li.textContent || '', colour: getComputedStyle(li.querySelector('.swatch')).backgroundColor }))`)) as { name: string; colour: string }[];
    const shown = swatches.filter((s) => materials.includes(s.name));
    expect(shown.map((s) => s.name)).toEqual(materials);
    const labs = shown.map((s) => srgbToLab(parseRgb(s.colour)));
    let smallest = Infinity;
    for (let i = 0; i < labs.length; i++) for (let j = i + 1; j < labs.length; j++) smallest = Math.min(smallest, Math.hypot(labs[i][0] - labs[j][0], labs[i][1] - labs[j][1], labs[i][2] - labs[j][2]));
    console.info(`[e2e] ${labs.length} eel materials: smallest pairwise ΔE*ab ${smallest.toFixed(1)}`);
    expect(smallest).toBeGreaterThanOrEqual(MIN_MATERIAL_DELTA_E);
  });

  it('sixteen control channels are sixteen small charts, dimensionless written out', async () => {
    const eel = JSON.parse(readFileSync(join(SCENARIOS_DIR, 'korrin-eel.json'), 'utf8'));
    const channels = Object.keys(eel.controls.channels).length;
    const charts = page.locator('[data-screen="preview"] [data-role="control-multiples"] figure.plot');
    expect(await charts.count()).toBe(channels);
    const captions = await charts.locator('figcaption').allTextContents();
    expect(captions.every((c) => c.endsWith('(dimensionless)'))).toBe(true);
    expect(await page.locator('[data-screen="preview"] figcaption', { hasText: /, 1$/ }).count()).toBe(0);
    await page.locator('[data-role="control-multiples"]').scrollIntoViewIfNeeded();
    await saveScreenshot(page, 'preview-eel-controls');
  });

  it('Datasets: varying shapes show their range, measured with NumPy from the files', async () => {
    await page.click('[data-nav="datasets"]');
    await page.click('[data-role="open-dataset"]');
    await chooseFolderInPage(page, dataset);
    await page.waitForSelector('[data-role="episode-table"] tbody tr');
    const shapes = runReferencePython<{ frames: number[]; nodes: [number, number] }>(`
import json, glob, numpy as np
nodes = []
for path in glob.glob(${JSON.stringify(join(dataset, '**', '*.npz'))}, recursive=True):
    with np.load(path) as z:
        nodes.append(z['positions'].shape)
print(json.dumps({'frames': sorted({s[0] for s in nodes}), 'nodes': [min(s[1] for s in nodes), max(s[1] for s in nodes)]}))
`, null);
    expect(shapes.frames).toEqual([datasetSteps + 1]);
    expect(shapes.nodes[0]).toBeLessThan(shapes.nodes[1]); // the tether's part count varies
    const summary = (await page.textContent('[data-role="dataset-summary"] dl')) ?? '';
    expect(summary).toContain(`positions [${datasetSteps + 1}×${shapes.nodes[0]}–${shapes.nodes[1]}×3]`);
    expect(summary).not.toMatch(/\[[^\]]*-1/);
  });

  it('the id and action columns stay in view after Play and however far the table scrolls', async () => {
    for (const width of WIDTHS) {
      await setWidth(page, width);
      expect(await horizontalOverflowPx(page), `overflow at ${width} px`).toBeLessThanOrEqual(0);
      const row = '[data-role="episode-table"] tbody tr:nth-child(2)';
      await page.click(`${row} [data-role="play-episode"]`);
      await waitInPage(page, `document.querySelector('[data-role="playing-episode"]')?.getAttribute('data-episode') === ${JSON.stringify(manifest.episodes[1].id)}`, 60_000);
      for (const scroll of ['start', 'end', 'after-play']) {
        if (scroll !== 'after-play') await page.evaluate(`(() => { const s = document.querySelector('[data-role="episode-scroll"]'); s.scrollLeft = ${scroll === 'start' ? 0 : 's.scrollWidth'}; })()`);
        const inView = await page.evaluate(`(() => {
          const box = document.querySelector('[data-role="episode-scroll"]').getBoundingClientRect();
          const inside = (el) => { const r = el.getBoundingClientRect(); return r.left >= box.left - 1 && r.right <= box.right + 1 && r.width > 0; };
          const tr = document.querySelector(${JSON.stringify(row)});
          return { id: inside(tr.querySelector('.sticky-start')), play: inside(tr.querySelector('[data-role="play-episode"]')), text: tr.querySelector('.sticky-start').textContent };
        })()`);
        expect(inView, `${width} px, scrolled to ${scroll}`).toEqual({ id: true, play: true, text: manifest.episodes[1].id });
      }
      expect(await stageCoverers(page, 'datasets'), `elements over the 3-D view at ${width} px`).toEqual([]);
      await saveScreenshot(page, `datasets-${width}`);
    }
    await setWidth(page, 1440);
  });

  it('a range filter lists exactly the episodes the manifest has in that range', async () => {
    const key = '/system/lengthM';
    const lengths = manifest.episodes.map((e) => e.labels[key] as number).sort((a, b) => a - b);
    const low = lengths[2];
    const high = lengths[lengths.length - 3];
    const expected = manifest.episodes.filter((e) => (e.labels[key] as number) >= low && (e.labels[key] as number) <= high).length;
    expect(expected).toBeLessThan(manifest.episodes.length);
    await page.selectOption('[data-role="range-key"]', key);
    await page.fill('[data-role="range-min"]', String(low));
    await page.fill('[data-role="range-max"]', String(high));
    await page.click('[data-role="range-add"]');
    await waitInPage(page, `document.querySelectorAll('[data-role="episode-table"] tbody tr').length === ${expected}`);
    expect(await page.textContent('[data-role="page-label"]')).toContain(`of ${expected}`);
    expect(await page.textContent('[data-role="range-list"]')).toContain('length');
    await page.click('[data-role="range-remove"]');
    await waitInPage(page, `document.querySelectorAll('[data-role="episode-table"] tbody tr').length === ${manifest.episodes.length}`);
  });

  it('Compare plays a second episode beside the first, both drawn', async () => {
    await page.click('[data-role="episode-table"] tbody tr:nth-child(1) [data-role="play-episode"]');
    await waitInPage(page, `document.querySelector('[data-role="playing-episode"]')?.getAttribute('data-episode') === ${JSON.stringify(manifest.episodes[0].id)}`, 60_000);
    await page.click('[data-role="episode-table"] tbody tr:nth-child(3) [data-role="compare-episode"]');
    await waitInPage(page, `document.querySelector('[data-role="compare-episode-line"]')?.getAttribute('data-episode') === ${JSON.stringify(manifest.episodes[2].id)}`, 60_000);
    expect(await page.isVisible('[data-role="compare-pane"]')).toBe(true);
    const stages = page.locator('[data-screen="datasets"] canvas.stage-canvas');
    expect(await stages.count()).toBe(2);
    const boxes = [await stages.nth(0).boundingBox(), await stages.nth(1).boundingBox()];
    // Side by side: same row, the second to the right of the first, neither overlapping.
    expect(boxes[0] && boxes[1] && boxes[1].x >= boxes[0].x + boxes[0].width && Math.abs(boxes[1].y - boxes[0].y) < 40).toBe(true);
    const drawn = (await page.evaluate(`[...document.querySelectorAll('[data-screen="datasets"] canvas.stage-canvas')].map((canvas) => {
      const copy = document.createElement('canvas'); copy.width = canvas.width; copy.height = canvas.height;
      const ctx = copy.getContext('2d'); ctx.drawImage(canvas, 0, 0);
      const d = ctx.getImageData(0, 0, copy.width, copy.height).data; let n = 0;
      for (let i = 0; i < d.length; i += 4) if (Math.abs(d[i] - 0xf4) + Math.abs(d[i + 1] - 0xf1) + Math.abs(d[i + 2] - 0xea) > 18) n++;
      return n;
    })`)) as number[];
    expect(drawn[0]).toBeGreaterThan(200);
    expect(drawn[1]).toBeGreaterThan(200);
    // Both play: their frames move on (the wait fails the test after 20 s otherwise). It is not
    // read again afterwards: a short episode loops, so a later read may find a player back at 0.
    await waitInPage(page, `[...document.querySelectorAll('[data-screen="datasets"] .player')].every((p) => Number(p.getAttribute('data-frame')) > 0)`, 20_000);
    expect(await horizontalOverflowPx(page)).toBeLessThanOrEqual(0);
    await saveScreenshot(page, 'datasets-compare');
    await page.click('[data-role="compare-close"]');
    expect(await page.isVisible('[data-role="compare-pane"]')).toBe(false);
  });

  it('Export: workers default to the cores (as pliant generate), the folder is named for the scenario, and it estimates splits, size and time first', async () => {
    const cores = Math.max(1, Math.min(64, availableParallelism()));
    await openDemo(page, 'korrin-eel.json');
    await page.click('[data-nav="export"]');
    expect(await page.inputValue('[data-role="export-workers"]')).toBe(String(cores));
    expect(await page.getAttribute('[data-role="export-workers"]', 'max')).toBe(String(cores));
    expect(await page.inputValue('[data-role="export-name"]')).toBe('korrin-eel');
    await openDemo(page, 'korrin-tether.json');
    await replaceScenarioText(page, cutDownScenario('korrin-tether.json', datasetEpisodes, datasetSteps));
    await page.click('[data-nav="export"]');
    expect(await page.inputValue('[data-role="export-name"]')).toBe('korrin-tether');
    await page.waitForSelector('[data-role="export-estimate"][data-state="ready"]', { timeout: 60_000 });
    expect(await page.getAttribute('[data-role="estimate-episodes"]', 'data-episodes')).toBe(String(datasetEpisodes));
    const estimateSplits = page.locator('[data-role="estimate-splits"]');
    // The same scenario, exported by the command line above: its manifest's split sizes.
    const counted: Record<string, number> = {};
    for (const e of manifest.episodes) counted[e.split] = (counted[e.split] ?? 0) + 1;
    for (const [split, n] of Object.entries(counted)) expect(await estimateSplits.getAttribute(`data-split-${split}`), split).toBe(String(n));
    const estimatedBytes = Number(await page.getAttribute('[data-role="estimate-size"]', 'data-bytes'));
    const seconds = Number(await page.getAttribute('[data-role="estimate-time"]', 'data-seconds'));
    expect(seconds).toBeGreaterThan(0);
    // The arrays' bytes before compression against the folder's real files (NumPy sums the
    // arrays it reads from the NPZ files: the estimate leaves out only small tables).
    const stored = runReferencePython<number>(`
import glob, numpy as np
total = 0
for path in glob.glob(${JSON.stringify(join(dataset, '**', '*.npz'))}, recursive=True):
    with np.load(path) as z:
        total += sum(z[name].nbytes for name in z.files)
print(total)
`, null);
    console.info(`[e2e] export estimate ${estimatedBytes} B of arrays; NumPy reads ${stored} B`);
    expect(estimatedBytes).toBeGreaterThan(0.7 * stored);
    expect(estimatedBytes).toBeLessThanOrEqual(1.05 * stored);
    await saveScreenshot(page, 'export-estimate');
    await setWidth(page, 800);
    expect(await horizontalOverflowPx(page), 'Export at 800 px').toBeLessThanOrEqual(0);
    await setWidth(page, 1440);
  });

  it('keyboard: Tab reaches every screen button with a visible focus ring, and ? lists the shortcuts', async () => {
    await page.click('[data-nav="preview"]');
    // Tabbing starts after the last place clicked: the product name, before the navigation.
    await page.click('.app-name');
    const seen: { role: string; ring: boolean }[] = [];
    for (let i = 0; i < 12; i++) {
      await page.keyboard.press('Tab');
      seen.push(await page.evaluate(`(() => {
        const el = document.activeElement; const s = getComputedStyle(el);
        return { role: el.getAttribute('data-nav') || el.getAttribute('data-role') || el.tagName, ring: (s.outlineStyle !== 'none' && parseFloat(s.outlineWidth) >= 2) || s.boxShadow !== 'none' };
      })()`));
    }
    for (const nav of ['sweep', 'preview', 'export', 'datasets']) expect(seen.map((s) => s.role)).toContain(nav);
    expect(seen.filter((s) => !s.ring)).toEqual([]);
    await page.keyboard.press('Escape');
    await page.evaluate('document.activeElement && document.activeElement.blur()');
    await page.keyboard.press('Shift+Slash');
    await page.waitForSelector('[data-role="shortcut-list"][open]');
    const listed = (await page.textContent('[data-role="shortcut-list"]')) ?? '';
    for (const key of ['Space', '←', '→', 'Tab', '?']) expect(listed).toContain(key);
    for (const key of ['A', 'D', 'W', 'S', '+', '−']) expect(listed).toContain(key);
    await saveScreenshot(page, 'shortcut-list');
    await page.keyboard.press('Escape');
    await page.waitForSelector('[data-role="shortcut-list"]', { state: 'hidden' });
    // The camera turns and zooms from the keyboard: the drawn picture changes with each key.
    await page.locator('[data-screen="preview"] canvas.stage-canvas').focus();
    let before = (await measureStage(page, 'preview')).fingerprint;
    for (const key of ['d', 'w', '-']) {
      await page.keyboard.press(key);
      await page.evaluate('new Promise((done) => requestAnimationFrame(() => requestAnimationFrame(done)))');
      const after = (await measureStage(page, 'preview')).fingerprint;
      expect(after, `key ${key}`).not.toBe(before);
      before = after;
    }
  });
});

describe.runIf(chromium.available)('axe-core on every screen (WCAG 2 AA contrast and labels)', () => {
  const RULES = ['color-contrast', 'label', 'button-name', 'select-name', 'aria-input-field-name', 'image-alt', 'link-name', 'document-title'];
  let app: PliantWebApp;
  let browser: Browser;

  beforeAll(async () => {
    app = await startPliantWebApp();
    browser = await launchChromium();
  });
  afterAll(async () => {
    await browser?.close();
    await app?.close();
  });

  it(`finds no violations of ${RULES.join(', ')}`, async () => {
    // axe-core runs inside the page; the app's Content-Security-Policy rightly refuses injected
    // scripts, so this one context (for the check only) bypasses it.
    const context = await browser.newContext({ bypassCSP: true, viewport: { width: 1440, height: 900 } });
    const page = await context.newPage();
    await page.goto(app.server.url);
    await page.waitForSelector('html[data-pliant-ready="true"]', { timeout: 30_000 });
    const axeSource = readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8');
    await page.addScriptTag({ content: axeSource });
    await openDemo(page, 'korrin-eel.json');
    const violations: string[] = [];
    for (const screen of ['sweep', 'preview', 'export', 'datasets', 'seed', 'scores']) {
      await page.click(`[data-nav="${screen}"]`);
      if (screen === 'preview') await waitForPreviewFinished(page);
      const result = (await page.evaluate(`axe.run(document, { runOnly: { type: 'rule', values: ${JSON.stringify(RULES)} }, resultTypes: ['violations'] })
        .then((r) => r.violations.map((v) => v.id + ': ' + v.nodes.slice(0, 4).map((n) => n.target.join(' ') + ' (' + (n.failureSummary || '').split('\\n').slice(1, 2).join('') + ')').join('; ')))`)) as string[];
      violations.push(...result.map((v) => `${screen}: ${v}`));
    }
    // The harness can fail: an unlabelled field and pale text added for the purpose are found.
    const planted = (await page.evaluate(`(() => {
      const probe = document.createElement('div');
      probe.id = 'axe-probe';
      probe.innerHTML = '<input type="text"><p style="color:#ddd;background:#fff">faint words</p>';
      document.body.append(probe);
      return axe.run('#axe-probe', { runOnly: { type: 'rule', values: ['label', 'color-contrast'] } }).then((r) => { probe.remove(); return r.violations.map((v) => v.id).sort(); });
    })()`)) as string[];
    await context.close();
    expect(planted).toEqual(['color-contrast', 'label']);
    expect(violations).toEqual([]);
  }, 240_000);
});
