// Steps the end-to-end suites take on Pliant's screens, written once: open a demo scenario on
// the Sweep screen and wait for its check, wait for a preview to finish simulating.
import type { Page } from 'playwright-core';

import { waitInPage } from './e2e-page-condition.ts';

export async function openDemo(page: Page, fileName: string): Promise<void> {
  await page.click('[data-nav="sweep"]');
  // The form is built only while its tab is shown.
  await page.click('[data-role="tab-form"]');
  await page.waitForSelector('[data-role="example-list"] option', { state: 'attached' });
  const options = await page.$$eval('[data-role="example-list"] option', (all) => all.map((o) => [o.getAttribute('value') ?? '', o.textContent ?? '']));
  const found = options.find(([, text]) => text === fileName);
  if (!found) throw new Error(`the Sweep screen lists no demo named ${fileName}; it lists ${options.map(([, t]) => t).join(', ')}`);
  await page.selectOption('[data-role="example-list"]', found[0]);
  // Opening the scenario that is already open changes no label: mark the form shown now, and
  // wait for the form of the fresh load to replace it.
  await page.evaluate(`document.querySelectorAll('[data-role="scenario-form"] > *').forEach((e) => e.setAttribute('data-e2e-stale', ''))`);
  await page.click('[data-role="open-example"]');
  await waitInPage(page, `document.querySelector('[data-e2e-stale]') === null &&
     (document.querySelector('[data-role="file-label"]')?.textContent ?? '').startsWith(${JSON.stringify(fileName)}) &&
     ['ok', 'problems'].includes(document.querySelector('[data-role="problem-summary"]')?.getAttribute('data-state'))`, 30_000);
}

/** Waits until the Preview screen has simulated every frame of its episode (or failed). */
export async function waitForPreviewFinished(page: Page, timeoutMs = 90_000): Promise<void> {
  await waitInPage(page, `['finished', 'failed'].includes(document.querySelector('[data-role="sim-progress"]')?.getAttribute('data-state')) &&
     document.querySelector('[data-screen="preview"] .player')?.getAttribute('data-frame') !== null`, timeoutMs);
  const state = await page.getAttribute('[data-role="sim-progress"]', 'data-state');
  if (state !== 'finished') throw new Error(`the preview did not finish: ${await page.textContent('[data-role="preview-status"]')}`);
}

/** The text in the JSON view's editor, whole (the editor draws only the lines on screen). */
export async function scenarioText(page: Page): Promise<string> {
  return page.$eval('[data-role="json-text"]', (host) => String((host as unknown as { value: string }).value));
}

/** Replaces the scenario through the JSON text view and waits for the check of the new text. */
export async function replaceScenarioText(page: Page, text: string): Promise<void> {
  await page.click('[data-nav="sweep"]');
  await page.click('[data-role="tab-text"]');
  // The JSON view is a CodeMirror editor: select everything with the editor's own Ctrl+A (so the
  // editor knows the selection before the text arrives), then type the text over it, as a person
  // would. (A fill selects through the DOM, which the editor learns of only on the next
  // selectionchange; text arriving before that is edited by the browser itself.)
  await page.click('[data-role="json-text"] .cm-content');
  await page.keyboard.press('Control+A');
  await page.keyboard.insertText(text);
  await waitInPage(page, `['ok', 'problems'].includes(document.querySelector('[data-role="problem-summary"]')?.getAttribute('data-state'))`, 30_000);
  // The settle delay passes before the check starts; wait for the check of this text.
  await page.waitForTimeout(500);
  await waitInPage(page, `document.querySelector('[data-role="problem-summary"]')?.getAttribute('data-state') !== 'checking'`, 30_000);
  await page.click('[data-role="tab-form"]');
}
