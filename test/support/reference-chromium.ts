// Locates Debian's Chromium for the end-to-end suites and gives the launch flags that work in
// this sandbox (software WebGL 2 through SwiftShader, no background network traffic).
import { existsSync } from 'node:fs';

export const CHROMIUM_PATH = '/usr/bin/chromium';

export const CHROMIUM_ARGS = [
  '--headless',
  '--no-sandbox',
  '--use-angle=swiftshader',
  '--enable-unsafe-swiftshader',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--no-first-run',
];

export function chromiumAvailability(): { available: boolean; reason: string } {
  const available = existsSync(CHROMIUM_PATH);
  const reason = available ? '' : `${CHROMIUM_PATH} not found (apt-get install chromium)`;
  if (!available && process.env.CI === 'true') {
    throw new Error(`Chromium is required under CI=true: ${reason}`);
  }
  if (!available) console.warn(`[skip] browser checks skipped: ${reason}`);
  return { available, reason };
}
