// The Sweep screen as a practitioner uses it, in headless Chromium through web mode: the form
// fits the window at 1440 and 800 px, its navigation column jumps to and unfolds each section
// and counts the problems in it, labels read as words and units, the JSON view is a code editor
// whose gutter marks the line each problem names and whose problem list moves the cursor there,
// a reversed range is reported together with a schema problem, and the file chooser is titled
// for what it opens and counts what it lists. The expected problems, lines and counts come from
// outside the page: `pliant validate` run on the same text, and the demo files themselves.
import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readFileSync, realpathSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import type { Browser, Page } from 'playwright-core';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';

import { launchChromium, openApp, saveScreenshot } from './support/e2e-browser.ts';
import { waitInPage } from './support/e2e-page-condition.ts';
import { openDemo, replaceScenarioText, scenarioText } from './support/e2e-screen-steps.ts';
import type { PliantWebApp } from './support/e2e-web-app.ts';
import { REPO_ROOT, SCENARIOS_DIR, startPliantWebApp } from './support/e2e-web-app.ts';
import { chromiumAvailability } from './support/reference-chromium.ts';

const chromium = chromiumAvailability();

interface CliProblem {
  line: number;
  column: number;
  pointer: string;
  text: string;
}

/** What `pliant validate` prints for `text` saved as korrin-tether.json, one entry per problem line. */
function validate(text: string, fileName = 'korrin-tether.json'): CliProblem[] {
  const folder = mkdtempSync(join(tmpdir(), 'pliant-e2e-sweep-validate-'));
  try {
    writeFileSync(join(folder, fileName), text);
    const cli = spawnSync(process.execPath, [join(REPO_ROOT, 'sim/cli/pliant-launcher.mjs'), 'validate', fileName], { cwd: folder, encoding: 'utf8' });
    const lines = cli.stderr.split('\n').map((l) => l.trim()).filter((l) => l.startsWith(`${fileName}:`));
    return lines.map((l) => {
      const match = /^[^:]+:(\d+):(\d+) (\S+):/.exec(l);
      if (!match) throw new Error(`unexpected validate line: ${l}`);
      return { line: Number(match[1]), column: Number(match[2]), pointer: match[3], text: l };
    });
  } finally {
    rmSync(folder, { recursive: true, force: true });
  }
}

function tetherWith(edit: (scenario: Record<string, any>) => void): string {
  const scenario = JSON.parse(readFileSync(join(SCENARIOS_DIR, 'korrin-tether.json'), 'utf8'));
  edit(scenario);
  return `${JSON.stringify(scenario, null, 2)}\n`;
}

async function horizontalOverflow(page: Page): Promise<number> {
  return page.evaluate('document.documentElement.scrollWidth - document.documentElement.clientWidth') as Promise<number>;
}

describe.runIf(chromium.available)('the Sweep screen in headless Chromium through web mode', () => {
  let app: PliantWebApp;
  let browser: Browser;
  let page: Page;
  let pageErrors: string[];

  beforeAll(async () => {
    app = await startPliantWebApp();
    browser = await launchChromium();
    ({ page, errors: pageErrors } = await openApp(browser, app.server.url));
  });

  afterEach(async (context) => {
    if (context.task.result?.state === 'fail' && page) await saveScreenshot(page, `failed-sweep-${context.task.name.replace(/[^A-Za-z0-9]+/g, '-').slice(0, 60)}`);
    await page.setViewportSize({ width: 1400, height: 1000 });
  });

  afterAll(async () => {
    await browser?.close();
    await app?.close();
  });

  for (const demo of ['korrin-tether.json', 'korrin-eel.json']) {
    it(`${demo}: form and JSON view have no horizontal overflow at 1440 and 800 px`, async () => {
      await openDemo(page, demo);
      for (const width of [1440, 800]) {
        await page.setViewportSize({ width, height: 900 });
        await page.click('[data-role="tab-form"]');
        expect(await horizontalOverflow(page), `form at ${width} px`).toBeLessThanOrEqual(0);
        const height = (await page.evaluate('document.documentElement.scrollHeight')) as number;
        console.info(`[e2e] ${demo} form at ${width} px: ${height} px tall`);
        await saveScreenshot(page, `sweep-form-${demo.replace('.json', '')}-${width}`);
        await page.click('[data-role="tab-text"]');
        await page.waitForSelector('[data-role="json-text"] .cm-lineNumbers');
        expect(await horizontalOverflow(page), `JSON view at ${width} px`).toBeLessThanOrEqual(0);
        await saveScreenshot(page, `sweep-json-${demo.replace('.json', '')}-${width}`);
      }
      await page.click('[data-role="tab-form"]');
      expect(pageErrors).toEqual([]);
    });
  }

  it('the navigation column lists the sections, jumps to each and unfolds a folded one', async () => {
    await openDemo(page, 'korrin-eel.json');
    const links = await page.$$eval('[data-section-link]', (all) => all.map((l) => [l.getAttribute('data-section-link'), l.textContent]));
    const pointers = links.map(([p]) => p);
    for (const expected of ['/system', '/system/materials', '/world', '/controls', '/time', '/initialState', '/splits', '/export']) expect(pointers).toContain(expected);
    expect(links.find(([p]) => p === '/initialState')?.[1]).toBe('Start state');

    // Jump: the section's top comes to the top of the window (the last one as far as the page scrolls).
    const viewport = page.viewportSize()!;
    for (const pointer of ['/export', '/system/materials', '/world']) {
      await page.click(`[data-section-link="${pointer}"]`);
      const top = (await page.evaluate(`document.querySelector('.section[data-pointer="${pointer}"]').getBoundingClientRect().top`)) as number;
      const atBottom = (await page.evaluate('Math.abs(window.scrollY + window.innerHeight - document.documentElement.scrollHeight) < 2')) as boolean;
      if (pointer === '/export' && atBottom) expect(top, pointer).toBeLessThan(viewport.height - 40);
      else expect(Math.abs(top), pointer).toBeLessThan(40);
      expect(top, pointer).toBeGreaterThanOrEqual(-1);
    }

    // Fold the world away: its fields disappear, the legend stays; the nav unfolds it again.
    const field = '.section[data-pointer="/world"] [data-pointer="/world/gravityMPerS2"]';
    expect(await page.isVisible(field)).toBe(true);
    await page.click('[data-fold="/world"]');
    expect(await page.isVisible(field)).toBe(false);
    expect(await page.isVisible('.section[data-pointer="/world"] > legend')).toBe(true);
    await saveScreenshot(page, 'sweep-world-folded');
    await page.click('[data-section-link="/time"]');
    await page.click('[data-section-link="/world"]');
    expect(await page.isVisible(field)).toBe(true);
    expect(await page.getAttribute('[data-fold="/world"]', 'aria-expanded')).toBe('true');
  });

  it('labels are words and units with the key on hover; "auto" shows without quotes', async () => {
    await openDemo(page, 'korrin-tether.json');
    const head = (pointer: string): string => `.field[data-pointer="${pointer}"] > .field-head .field-name`;
    expect(await page.textContent(head('/system/lengthM'))).toBe('Length, m');
    expect(await page.getAttribute(head('/system/lengthM'), 'title')).toBe('lengthM');
    expect(await page.textContent(head('/system/totalMassKg'))).toBe('Total mass, kg');
    expect(await page.textContent(head('/system/axialStiffnessN'))).toBe('Axial stiffness EA, N');
    // Sub-steps are "auto", a target accuracy or a whole number: a choice of forms, worded without JSON quotes.
    const form = 'select[data-pointer="/time/substeps#form"]';
    expect(await page.$eval(form, (el) => (el as unknown as { selectedOptions: { textContent: string }[] }).selectedOptions[0]?.textContent)).toBe('auto');
    expect(await page.$$eval(`${form} option`, (all) => all.map((o) => o.textContent))).toEqual(['auto', 'Sub-steps for a target accuracy', 'a whole number']);
    await page.selectOption(form, { label: 'a whole number' });
    await page.waitForSelector('input[data-pointer="/time/substeps"]');
    expect(await page.inputValue('input[data-pointer="/time/substeps"]')).toBe('1');
    await openDemo(page, 'korrin-fin.json');
    expect(await page.textContent(head('/system/materials/0/youngsModulusPa'))).toBe("Young's modulus, Pa");
    expect(await page.getAttribute(head('/system/materials/0/youngsModulusPa'), 'title')).toBe('youngsModulusPa');
    expect(await page.textContent(head('/system/materials/0/densityKgPerM3'))).toBe('Density, kg/m³');
  });

  it('a reversed range is reported with a schema problem; each section counts its problems as pliant validate places them', async () => {
    await openDemo(page, 'korrin-tether.json');
    const text = tetherWith((s) => {
      s.system.lengthM = { kind: 'uniform', min: 2.5, max: 1.5 };
      s.system.dampingRatio = 'soft';
      s.time.recordIntervalS = -1;
    });
    const expected = validate(text);
    // The checker's own output has both kinds at once: a schema problem and the reversed range.
    expect(expected.map((p) => p.pointer)).toEqual(expect.arrayContaining(['/system/dampingRatio', '/system/lengthM/max', '/time/recordIntervalS']));
    await replaceScenarioText(page, text);
    const summary = (await page.$$eval('[data-role="problem-summary"] li', (items) => items.map((i) => (i.textContent ?? '').trim())));
    expect(summary).toEqual(expected.map((p) => p.text));

    const countOf = async (pointer: string): Promise<number> => Number(await page.getAttribute(`[data-section-link="${pointer}"]`, 'data-problem-count'));
    const under = (section: string): number => expected.filter((p) => p.pointer === section || p.pointer.startsWith(`${section}/`)).length;
    expect(await countOf('/system')).toBe(under('/system'));
    expect(await countOf('/time')).toBe(under('/time'));
    expect(await countOf('/world')).toBe(0);
    expect(await page.textContent('[data-section-link="/system"] .problem-count')).toBe(String(under('/system')));
    await saveScreenshot(page, 'sweep-problem-counts');

    // A problem in the list at the top leads to its field, unfolding the section it is in.
    await page.click('[data-fold="/system"]');
    const field = '.field[data-pointer="/system/lengthM"]';
    expect(await page.isVisible(field)).toBe(false);
    await page.click('[data-role="summary-problem"]:has-text("/system/lengthM/max")');
    expect(await page.isVisible(field)).toBe(true);
    const top = (await page.evaluate(`document.querySelector('${field}').getBoundingClientRect().top`)) as number;
    expect(top).toBeGreaterThanOrEqual(-1);
    expect(top).toBeLessThan(page.viewportSize()!.height);
  });

  it('the JSON view numbers its lines, marks each problem\'s line in the gutter and jumps to it', async () => {
    await openDemo(page, 'korrin-tether.json');
    const text = tetherWith((s) => (s.time.recordedSteps = 0));
    const [problem] = validate(text);
    expect(problem.pointer).toBe('/time/recordedSteps');
    await replaceScenarioText(page, text);
    await page.click('[data-role="tab-text"]');
    await page.waitForSelector('[data-role="json-text"] .cm-lint-marker-error');
    // CodeMirror's styles and ours were applied under the page's CSP (style-src 'self'): the gutter
    // has pliant.css's --paper-deep (#e9e4d8), and no refusal was logged.
    const gutter = await page.evaluate(`getComputedStyle(document.querySelector('[data-role="json-text"]').shadowRoot.querySelector('.cm-gutters')).backgroundColor`);
    expect(gutter).toBe('rgb(233, 228, 216)');
    expect(pageErrors).toEqual([]);

    // The gutter mark sits on the row of the line number pliant validate names.
    const rows = (await page.evaluate(`(() => {
      const root = document.querySelector('[data-role="json-text"]').shadowRoot;
      const numbers = [...root.querySelectorAll('.cm-lineNumbers .cm-gutterElement')].map((e) => ({ text: e.textContent, top: e.getBoundingClientRect().top }));
      const marks = [...root.querySelectorAll('.cm-gutter-lint .cm-gutterElement')].filter((e) => e.querySelector('.cm-lint-marker-error')).map((e) => e.getBoundingClientRect().top);
      return { numbers, marks };
    })()`)) as { numbers: { text: string; top: number }[]; marks: number[] };
    const numbered = rows.numbers.find((n) => n.text === String(problem.line));
    expect(numbered).toBeDefined();
    expect(rows.marks).toHaveLength(1);
    expect(Math.abs(rows.marks[0] - numbered!.top)).toBeLessThan(2);
    await saveScreenshot(page, 'sweep-json-problem-mark');

    // Move the cursor elsewhere, then jump back through the problem list.
    await page.click('[data-role="json-text"] .cm-content');
    await page.keyboard.press('Control+Home');
    const activeLine = async (): Promise<string | null> => page.textContent('[data-role="json-text"] .cm-lineNumbers .cm-activeLineGutter');
    expect(await activeLine()).toBe('1');
    await page.click(`[data-role="jump-to-problem"][data-line="${problem.line}"]`);
    expect(await activeLine()).toBe(String(problem.line));
    // The cursor is at the column too: a character typed now lands there.
    const lineText = text.split('\n')[problem.line - 1];
    await page.keyboard.type('§');
    const typed = (await scenarioText(page)).split('\n')[problem.line - 1];
    expect(typed).toBe(`${lineText.slice(0, problem.column - 1)}§${lineText.slice(problem.column - 1)}`);
    await page.keyboard.press('Control+z');
    expect((await scenarioText(page)).split('\n')[problem.line - 1]).toBe(lineText);
    await page.click('[data-role="tab-form"]');
  });

  it('the file chooser is titled for what it opens, starts among the demos, counts what it lists, and opens a file in one click', async () => {
    const folder = realpathSync(mkdtempSync(join(tmpdir(), 'pliant-e2e-sweep-open-')));
    try {
      for (const hidden of ['.cache', '.git']) mkdirSync(join(folder, hidden));
      mkdirSync(join(folder, 'older-sweeps'));
      writeFileSync(join(folder, 'tank-tether-b.json'), readFileSync(join(SCENARIOS_DIR, 'korrin-tether.json')));
      writeFileSync(join(folder, 'notes.txt'), 'not a scenario\n');
      writeFileSync(join(folder, '.draft.json'), '{}');

      await openDemo(page, 'korrin-fin.json');
      const dialog = 'dialog[data-role="folder-picker"][open]';
      const ready = async (path: string): Promise<void> => waitInPage(page, `document.querySelector('${dialog}')?.getAttribute('data-listing') === 'ready' && document.querySelector('${dialog}')?.getAttribute('data-path') === ${JSON.stringify(path)}`);
      await page.click('[data-role="open-file"]');
      await page.waitForSelector(dialog);
      expect(await page.textContent(`${dialog} h3`)).toBe('Open a scenario file');
      // Nothing opened from a folder yet: it starts among the demo scenarios.
      await ready(realpathSync(SCENARIOS_DIR));
      const demoFiles = await page.$$eval(`${dialog} [data-file]`, (all) => all.map((e) => e.getAttribute('data-file')));
      expect(demoFiles.sort()).toEqual(['korrin-eel.json', 'korrin-fin.json', 'korrin-tether.json']);

      await page.fill('[data-role="folder-path"]', folder);
      await page.click('[data-role="folder-go"]');
      await ready(folder);
      const folders = await page.$$eval(`${dialog} [data-folder]`, (all) => all.map((e) => e.getAttribute('data-folder')));
      const files = await page.$$eval(`${dialog} [data-file]`, (all) => all.map((e) => e.getAttribute('data-file')));
      expect(folders).toEqual(['older-sweeps']);
      expect(files).toEqual(['tank-tether-b.json']);
      // The count is of what is listed; the hidden ones are named as left out.
      expect(await page.textContent('[data-role="folder-note"]')).toBe('1 folder, 1 .json file (3 hidden not shown)');
      await saveScreenshot(page, 'sweep-open-file-chooser');
      await page.check('[data-role="folder-show-hidden"]');
      await waitInPage(page, `document.querySelectorAll('${dialog} [data-folder]').length === 3`);
      expect(await page.textContent('[data-role="folder-note"]')).toBe('3 folders, 2 .json files');

      await page.click(`${dialog} [data-file="tank-tether-b.json"]`);
      await page.waitForSelector('dialog[data-role="folder-picker"]', { state: 'detached' });
      await page.waitForSelector('[data-role="file-label"]:has-text("tank-tether-b.json")');
      expect(await page.textContent('[data-role="file-label"]')).toContain(join(folder, 'tank-tether-b.json'));

      // The next chooser starts where the last file came from.
      await page.click('[data-role="open-file"]');
      await ready(folder);
      await page.click('[data-role="folder-cancel"]');
      await page.click('[data-role="save-as"]');
      await page.waitForSelector(dialog);
      expect(await page.textContent(`${dialog} h3`)).toBe('Choose the folder to save the scenario in');
      await ready(folder);
      await page.click('[data-role="folder-cancel"]');

      // The seed file's chooser says it opens a seed file, not a dataset.
      await page.click('[data-nav="seed"]');
      await page.click('[data-role="open-seed-file"]');
      await page.waitForSelector(dialog);
      expect(await page.textContent(`${dialog} h3`)).toBe('Open a seed file: choose the dataset folder that holds seed.json');
      await page.click('[data-role="folder-cancel"]');
      await page.click('[data-nav="sweep"]');
      expect(pageErrors).toEqual([]);
    } finally {
      rmSync(folder, { recursive: true, force: true });
    }
  });
});
