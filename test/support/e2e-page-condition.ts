// Waiting for a condition inside the page. The condition is written as JavaScript text and made
// into a function here in Node, so that (1) Node's type check, which has no DOM, never sees the
// page's `document`, and (2) Playwright sends it as a function: a condition given to it as a
// string would be run with eval inside the page, which the app's Content-Security-Policy
// forbids, as it should.
import type { Page } from 'playwright-core';

export async function waitInPage(page: Page, condition: string, timeoutMs = 30_000): Promise<void> {
  const predicate = new Function(`return (${condition});`) as () => unknown;
  await page.waitForFunction(predicate, undefined, { timeout: timeoutMs });
}
