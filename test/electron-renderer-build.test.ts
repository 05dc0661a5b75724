// renderer/vite.config.ts produces a build whose asset URLs are relative, so the same files load
// under the desktop app's pliant://app/ origin and behind the web-mode server. Vite's documented
// behaviour for `base: './'` (Vite docs, "Public Base Path": a relative base makes all asset URLs
// relative to the page) is checked on a small fixture page built with the real config, and each
// emitted URL is then resolved against pliant://app/index.html and fetched through the app
// protocol handler. The build must also need no inline script, which the CSP forbids.
import { mkdirSync, mkdtempSync, readFileSync, realpathSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import { build } from 'vite';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { createAppProtocolHandler } from '../electron/app-protocol.ts';

let root: string;
let outDir: string;
let html: string;

beforeAll(async () => {
  root = realpathSync(mkdtempSync(join(tmpdir(), 'pliant-vite-')));
  const src = join(root, 'src');
  outDir = join(root, 'out');
  mkdirSync(src);
  writeFileSync(
    join(src, 'index.html'),
    '<!doctype html><html><head><meta charset="utf-8"><title>Pliant</title></head><body><div id="pliant-app"></div><script type="module" src="./main.ts"></script></body></html>',
  );
  writeFileSync(join(src, 'main.ts'), "import './tank.css';\nimport finUrl from './fin.svg';\ndocument.getElementById('pliant-app')!.dataset.fin = finUrl;\nexport const tank = 'Korrin Bay';\n");
  writeFileSync(join(src, 'tank.css'), 'body { background: #10161c; }\n');
  writeFileSync(join(src, 'fin.svg'), '<svg xmlns="http://www.w3.org/2000/svg" width="4" height="4"/>');
  await build({ configFile: join(process.cwd(), 'renderer', 'vite.config.ts'), root: src, build: { outDir, emptyOutDir: true }, logLevel: 'silent' });
  html = readFileSync(join(outDir, 'index.html'), 'utf8');
});

afterAll(() => rmSync(root, { recursive: true, force: true }));

describe('renderer build (renderer/vite.config.ts)', () => {
  it('references its script and stylesheet with relative ./assets/ URLs', () => {
    const urls = [...html.matchAll(/(?:src|href)="([^"]+)"/g)].map((m) => m[1]);
    expect(urls.length).toBeGreaterThanOrEqual(2);
    for (const url of urls) expect(url).toMatch(/^\.\/assets\/[\w.-]+\.(js|css)$/);
  });

  it('has no inline script for the CSP to block', () => {
    for (const tag of html.match(/<script\b[^>]*>/g) ?? []) expect(tag).toMatch(/\ssrc="/);
    expect(html).not.toMatch(/<script\b[^>]*>[^<]+<\/script>/);
  });

  it('emits small assets as files, not data: URLs (the CSP allows data: for images only)', () => {
    const script = [...html.matchAll(/src="\.\/(assets\/[^"]+\.js)"/g)].map((m) => m[1])[0];
    const code = readFileSync(join(outDir, script), 'utf8');
    expect(code).not.toContain('data:image/svg+xml');
    expect(code).toMatch(/fin-[\w-]+\.svg/);
  });

  it('loads every referenced file through the app protocol at pliant://app/', async () => {
    const handler = createAppProtocolHandler(outDir);
    const urls = [...html.matchAll(/(?:src|href)="([^"]+)"/g)].map((m) => new URL(m[1], 'pliant://app/index.html').href);
    for (const url of urls) {
      expect(url).toMatch(/^pliant:\/\/app\/assets\//);
      const response = await handler(new Request(url));
      expect(response.status).toBe(200);
    }
  });
});
