// The Content-Security-Policy, parsed directive by directive with the algorithm of W3C Content
// Security Policy Level 3, section 2.2.1 "Parse a serialized CSP" (split on ";", trim ASCII
// whitespace, lower-case the directive name, ignore a repeated directive, split values on ASCII
// whitespace), then checked against Electron's security checklist item 7 ("Define a Content
// Security Policy ... restrictive rules (i.e. script-src 'self')").
import { mkdtempSync, realpathSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import { describe, expect, it } from 'vitest';

import { createAppProtocolHandler } from '../electron/app-protocol.ts';
import { CONTENT_SECURITY_POLICY } from '../electron/content-security-policy.ts';

function parseSerializedCsp(serialized: string): { directives: Map<string, string[]>; repeated: string[] } {
  const directives = new Map<string, string[]>();
  const repeated: string[] = [];
  for (const token of serialized.split(';')) {
    const trimmed = token.replace(/^[\t\n\f\r ]+|[\t\n\f\r ]+$/g, '');
    if (trimmed === '') continue;
    const [rawName, ...values] = trimmed.split(/[\t\n\f\r ]+/);
    const name = rawName.toLowerCase();
    if (directives.has(name)) {
      repeated.push(name);
      continue;
    }
    directives.set(name, values);
  }
  return { directives, repeated };
}

describe('content security policy (CSP Level 3 parsing; Electron checklist item 7)', () => {
  const { directives, repeated } = parseSerializedCsp(CONTENT_SECURITY_POLICY);

  it('has no repeated directive (a repeat would be silently ignored by the browser)', () => {
    expect(repeated).toEqual([]);
  });

  it('falls back to nothing: default-src none', () => expect(directives.get('default-src')).toEqual(["'none'"]));
  it('runs scripts from our own origin only, with no inline code and no eval; compiles WebAssembly', () => {
    // 'wasm-unsafe-eval' (CSP Level 3 keyword-source; from memory) allows
    // WebAssembly compilation only; 'unsafe-eval' would also allow eval() and new Function().
    expect(directives.get('script-src')).toEqual(["'self'", "'wasm-unsafe-eval'"]);
  });
  it('loads styles from our own origin only', () => expect(directives.get('style-src')).toEqual(["'self'"]));
  it('allows images from our origin and data: URLs', () => expect(directives.get('img-src')).toEqual(["'self'", 'data:']));
  it('allows fonts from our origin only', () => expect(directives.get('font-src')).toEqual(["'self'"]));
  it('connects (fetch, EventSource) to our origin only', () => expect(directives.get('connect-src')).toEqual(["'self'"]));
  it('allows workers from our origin and blob:', () => expect(directives.get('worker-src')).toEqual(["'self'", 'blob:']));
  it('allows no plugins, frames, base-URL changes or form posts, and may not be framed', () => {
    expect(directives.get('object-src')).toEqual(["'none'"]);
    expect(directives.get('frame-src')).toEqual(["'none'"]);
    expect(directives.get('base-uri')).toEqual(["'none'"]);
    expect(directives.get('form-action')).toEqual(["'none'"]);
    expect(directives.get('frame-ancestors')).toEqual(["'none'"]);
  });
  it('has exactly these directives', () => {
    expect([...directives.keys()].sort()).toEqual(
      ['base-uri', 'connect-src', 'default-src', 'font-src', 'form-action', 'frame-ancestors', 'frame-src', 'img-src', 'object-src', 'script-src', 'style-src', 'worker-src'],
    );
  });
  it('names no remote content, wildcard or unsafe keyword anywhere, other than WebAssembly compilation in script-src', () => {
    for (const [name, sources] of directives) {
      for (const source of sources) {
        expect(source).not.toMatch(/^(https?|wss?|ftp):/);
        expect(source).not.toContain('*');
        if (name === 'script-src' && source === "'wasm-unsafe-eval'") continue;
        expect(source, `${name} ${source}`).not.toMatch(/unsafe/);
        expect(["'self'", "'none'", 'data:', 'blob:']).toContain(source);
      }
    }
    expect(CONTENT_SECURITY_POLICY).not.toContain("'unsafe-eval'");
    expect(CONTENT_SECURITY_POLICY.split("'wasm-unsafe-eval'")).toHaveLength(2);
  });

  it('is sent on every response of the app protocol, files and refusals alike', async () => {
    const dir = realpathSync(mkdtempSync(join(tmpdir(), 'pliant-csp-')));
    try {
      writeFileSync(join(dir, 'index.html'), '<!doctype html><title>t</title>');
      const handler = createAppProtocolHandler(dir);
      const ok = await handler(new Request('pliant://app/index.html'));
      const missing = await handler(new Request('pliant://app/none.js'));
      expect(ok.status).toBe(200);
      expect(missing.status).toBe(404);
      expect(ok.headers.get('content-security-policy')).toBe(CONTENT_SECURITY_POLICY);
      expect(missing.headers.get('content-security-policy')).toBe(CONTENT_SECURITY_POLICY);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
