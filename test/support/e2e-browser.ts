// Drives the web-mode page in Debian's headless Chromium for the end-to-end suites: launches it
// with the reference flags, opens the app at the server's session address, saves screenshots
// under test-output/, and measures what the 3-D view really drew by reading its pixels.
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';

import type { Browser, Page } from 'playwright-core';
import { chromium } from 'playwright-core';

import { waitInPage } from './e2e-page-condition.ts';
import { REPO_ROOT } from './e2e-web-app.ts';
import { CHROMIUM_ARGS, CHROMIUM_PATH } from './reference-chromium.ts';

export const SCREENSHOT_DIR = join(REPO_ROOT, 'test-output', 'screens');

/** Background of the 3-D stage, renderer/view/scene-view.ts STAGE_BACKGROUND (0xf4f1ea). */
export const STAGE_BACKGROUND_RGB = [0xf4, 0xf1, 0xea] as const;

export async function launchChromium(): Promise<Browser> {
  return chromium.launch({ executablePath: CHROMIUM_PATH, args: CHROMIUM_ARGS });
}

/** Opens the app and waits until the shell has connected and shown its first screen. */
export async function openApp(browser: Browser, url: string): Promise<{ page: Page; errors: string[] }> {
  const page = await browser.newPage({ viewport: { width: 1400, height: 1000 } });
  const errors: string[] = [];
  page.on('pageerror', (error) => errors.push(`page error: ${error.message}`));
  page.on('console', (message) => {
    if (message.type() === 'error') errors.push(`console: ${message.text()}`);
  });
  await page.goto(url);
  await page.waitForSelector('html[data-pliant-ready="true"]', { timeout: 30_000 });
  return { page, errors };
}

export async function saveScreenshot(page: Page, name: string): Promise<string> {
  mkdirSync(SCREENSHOT_DIR, { recursive: true });
  const path = join(SCREENSHOT_DIR, `${name}.png`);
  await page.screenshot({ path });
  return path;
}

export interface CanvasCoverage {
  width: number;
  height: number;
  /** Pixels differing from the stage background by more than the tolerance in any channel. */
  drawnPixels: number;
  /** A cheap fingerprint of the image, to see it change between frames. */
  fingerprint: number;
}

// Page-side code is passed as text: the test runner's transform may wrap named functions in
// helpers that do not exist inside the page.
const READ_STAGE = `(screen) => {
  const canvas = document.querySelector('[data-screen="' + screen + '"] canvas.stage-canvas');
  if (!canvas) throw new Error('no stage canvas on the ' + screen + ' screen');
  const copy = document.createElement('canvas');
  copy.width = canvas.width;
  copy.height = canvas.height;
  const ctx = copy.getContext('2d');
  ctx.drawImage(canvas, 0, 0);
  return ctx.getImageData(0, 0, copy.width, copy.height).data;
}`;

/**
 * Reads the stage canvas of a screen back through a 2-D canvas and counts the pixels that are
 * not the stage background. The WebGL canvas keeps its drawing buffer, so this reads what is on
 * screen rather than a cleared buffer.
 */
export async function measureStage(page: Page, screen: string, tolerance = 6): Promise<CanvasCoverage> {
  return page.evaluate(
    `(() => {
      const data = (${READ_STAGE})(${JSON.stringify(screen)});
      const background = ${JSON.stringify(STAGE_BACKGROUND_RGB)};
      const canvas = document.querySelector('[data-screen="${screen}"] canvas.stage-canvas');
      let drawn = 0;
      let fingerprint = 0;
      for (let i = 0; i < data.length; i += 4) {
        if (Math.abs(data[i] - background[0]) > ${tolerance} || Math.abs(data[i + 1] - background[1]) > ${tolerance} || Math.abs(data[i + 2] - background[2]) > ${tolerance}) drawn++;
        fingerprint = (fingerprint + (data[i] + 3 * data[i + 1] + 7 * data[i + 2]) * ((i >> 2) % 9973)) % 2147483647;
      }
      return { width: canvas.width, height: canvas.height, drawnPixels: drawn, fingerprint };
    })()`,
  );
}

/**
 * Pixels of the stage that belong to the body: the image with nodes, springs and cell skin shown
 * against the same image with all three hidden (the ground and the fluid stay in both).
 */
export async function bodyPixels(page: Page, screen: string): Promise<number> {
  await page.evaluate(`window.__pliantStageBefore = (${READ_STAGE})(${JSON.stringify(screen)})`);
  const boxes = ['show-nodes', 'show-springs', 'show-faces'].map((role) => `[data-screen="${screen}"] input[data-role="${role}"]`);
  const toggle = async (checked: boolean): Promise<void> => {
    for (const box of boxes) if (await page.isEnabled(box)) await page.setChecked(box, checked);
    await page.evaluate('new Promise((done) => requestAnimationFrame(() => requestAnimationFrame(done)))');
  };
  await toggle(false);
  const differing = await page.evaluate(`(() => {
    const before = window.__pliantStageBefore;
    const after = (${READ_STAGE})(${JSON.stringify(screen)});
    let count = 0;
    for (let i = 0; i < after.length; i += 4) {
      if (Math.abs(after[i] - before[i]) + Math.abs(after[i + 1] - before[i + 1]) + Math.abs(after[i + 2] - before[i + 2]) > 12) count++;
    }
    return count;
  })()`);
  await toggle(true);
  return differing as number;
}

/** Answers the in-page folder chooser (web mode): goes to `path`, waits for its listing, confirms it. */
export async function chooseFolderInPage(page: Page, path: string): Promise<void> {
  const dialog = 'dialog[data-role="folder-picker"][open]';
  await page.waitForSelector(dialog);
  // The chooser first lists the home folder; typing before that lands would race it.
  await waitInPage(page, `['ready', 'failed'].includes(document.querySelector('${dialog}')?.getAttribute('data-listing'))`);
  await page.fill('[data-role="folder-path"]', path);
  await page.click('[data-role="folder-go"]');
  await waitInPage(page, `document.querySelector('${dialog}')?.getAttribute('data-listing') === 'ready' && document.querySelector('${dialog}')?.getAttribute('data-path') === ${JSON.stringify(path)}`);
  await page.click('[data-role="folder-confirm"]');
  await page.waitForSelector('dialog[data-role="folder-picker"]', { state: 'detached' });
}
