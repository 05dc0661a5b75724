#!/usr/bin/env node
// `npm run screenshots`: runs the end-to-end screen suite (which saves a screenshot of every
// screen it drives under test-output/screens/) and copies the ones the README shows into
// build/screenshots/, which is kept in the repository. Needs Debian's Chromium.
import { spawnSync } from 'node:child_process';
import { copyFileSync, existsSync, mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('..', import.meta.url));
const from = join(root, 'test-output', 'screens');
const to = join(root, 'build', 'screenshots');

/** README picture ← screenshot the suite takes. */
const PICTURES = {
  'sweep.png': 'sweep-korrin-tether.png',
  'sweep-problem.png': 'sweep-problem-inline.png',
  'sweep-json.png': 'sweep-json-problem-mark.png',
  'sweep-open.png': 'sweep-open-file-chooser.png',
  'preview-tether.png': 'preview-korrin-tether.png',
  'preview-fin-strain.png': 'preview-strain.png',
  'preview-eel.png': 'preview-korrin-eel.png',
  'export.png': 'export-ready.png',
  'export-done.png': 'export-done.png',
  'datasets.png': 'datasets-playback.png',
  'seed-file.png': 'seed-file.png',
  'preview-large-lattice.png': 'preview-large-lattice.png',
};

const run = spawnSync(process.execPath, [join(root, 'node_modules', 'vitest', 'vitest.mjs'), 'run', 'test/e2e-screens.test.ts', 'test/e2e-sweep.test.ts', 'test/e2e-datasets.test.ts'], {
  cwd: root,
  stdio: 'inherit',
  env: { ...process.env, CI: process.env.CI ?? 'true' },
});
if (run.status !== 0) {
  console.error('The end-to-end suite failed, so the screenshots were not refreshed. Fix the failures above and run npm run screenshots again.');
  process.exit(run.status ?? 1);
}
mkdirSync(to, { recursive: true });
const missing = [];
for (const [picture, shot] of Object.entries(PICTURES)) {
  const source = join(from, shot);
  if (!existsSync(source)) {
    missing.push(shot);
    continue;
  }
  copyFileSync(source, join(to, picture));
  console.log(`build/screenshots/${picture} ← test-output/screens/${shot}`);
}
if (missing.length > 0) {
  console.error(`The suite passed but took no screenshot named ${missing.join(', ')} in test-output/screens/; the others were copied.`);
  process.exit(1);
}
