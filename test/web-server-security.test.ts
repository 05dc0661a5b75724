// Web mode's HTTP server, started on port 0 inside the test and stopped after it. Refusals are
// checked against: OWASP's guidance on DNS rebinding and Host-header validation (accept only the
// exact loopback host names and port; NCC Group, "Preventing DNS Rebinding Attacks", gives the
// 127.0.0.1:PORT / localhost:PORT rule), OWASP CSRF Prevention Cheat Sheet (verify Origin; refuse
// cross-site Sec-Fetch-Site), OWASP Path Traversal (encoded dot-dot, backslashes, symlinks), and
// RFC 9110 section 15.5.6 (405 must carry an Allow header). Requests are sent with node:http so
// the raw path reaches the server exactly as written (fetch would normalise "%2e%2e" away).
import { mkdirSync, mkdtempSync, realpathSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import type { IncomingHttpHeaders } from 'node:http';
import { request } from 'node:http';
import { connect } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { CONTENT_SECURITY_POLICY } from '../electron/content-security-policy.ts';
import { createDefaultServices } from '../electron/default-services.ts';
import { createRequestHandlers } from '../electron/request-handlers.ts';
import type { RunningWebServer } from '../electron/web-server.ts';
import { startWebServer } from '../electron/web-server.ts';

interface RawResponse {
  status: number;
  headers: IncomingHttpHeaders;
  body: string;
}

let root: string;
let server: RunningWebServer;
let port: number;

function send(options: { method?: string; path?: string; headers?: Record<string, string>; body?: string | Buffer; host?: string | null }): Promise<RawResponse> {
  return new Promise((resolve, reject) => {
    const headers: Record<string, string> = { ...(options.headers ?? {}) };
    if (options.host !== null) headers.host = options.host ?? `127.0.0.1:${port}`;
    const req = request({ host: '127.0.0.1', port, method: options.method ?? 'GET', path: options.path ?? '/', headers, agent: false, setHost: false }, (res) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body: Buffer.concat(chunks).toString('utf8') }));
    });
    req.on('error', reject);
    if (options.body !== undefined) req.write(options.body);
    req.end();
  });
}

const api = (name: string, args: unknown, headers: Record<string, string> = {}) =>
  send({ method: 'POST', path: `/api/request/${name}`, headers: { 'content-type': 'application/json', 'x-pliant-session': server.token, ...headers }, body: JSON.stringify(args) });

const errorCode = (response: RawResponse): string => (JSON.parse(response.body) as { error: { code: string } }).error.code;

beforeAll(async () => {
  root = realpathSync(mkdtempSync(join(tmpdir(), 'pliant-web-')));
  const rendererDir = join(root, 'renderer');
  mkdirSync(join(rendererDir, 'assets'), { recursive: true });
  mkdirSync(join(root, 'scenarios'));
  mkdirSync(join(root, 'korrin-bay'));
  writeFileSync(join(rendererDir, 'index.html'), '<!doctype html><title>Pliant</title>');
  writeFileSync(join(rendererDir, 'assets', 'app.js'), 'console.log("Korrin Bay")');
  writeFileSync(join(rendererDir, '.env'), 'KEY=1');
  writeFileSync(join(root, 'secret.txt'), 'not part of the app');
  symlinkSync(root, join(rendererDir, 'escape'));
  const services = await createDefaultServices({ mode: 'web', version: '0.1.0', bundledScenariosDir: join(root, 'scenarios'), folderChooser: { mode: 'in-page', rootDir: root } });
  server = await startWebServer({ handlers: createRequestHandlers(services), rendererDir });
  port = server.port;
});

afterAll(async () => {
  await server.close();
  rmSync(root, { recursive: true, force: true });
});

describe('binding and session key', () => {
  it('prints an address on 127.0.0.1 with a 32-byte hex session key in the fragment', () => {
    expect(port).toBeGreaterThan(0);
    expect(server.token).toMatch(/^[0-9a-f]{64}$/);
    expect(server.url).toBe(`http://127.0.0.1:${port}/#session=${server.token}`);
  });

  it('is bound to 127.0.0.1 only: another loopback address on the same port refuses the connection', async () => {
    const outcome = await new Promise<string>((resolve) => {
      const socket = connect({ host: '127.0.0.2', port });
      socket.on('connect', () => {
        socket.destroy();
        resolve('connected');
      });
      socket.on('error', (error: NodeJS.ErrnoException) => resolve(error.code ?? 'error'));
    });
    expect(outcome).toBe('ECONNREFUSED');
  });

  it('draws a new key on every start', async () => {
    const services = await createDefaultServices({ mode: 'web', version: '0.1.0', bundledScenariosDir: join(root, 'scenarios'), folderChooser: { mode: 'in-page', rootDir: root } });
    const second = await startWebServer({ handlers: createRequestHandlers(services), rendererDir: join(root, 'renderer') });
    try {
      expect(second.token).toMatch(/^[0-9a-f]{64}$/);
      expect(second.token).not.toBe(server.token);
      expect(second.port).not.toBe(port);
    } finally {
      await second.close();
    }
  });
});

describe('refusals', () => {
  it('refuses API requests without the session key, or with a wrong one (401)', async () => {
    const wrongSameLength = server.token.replace(/^./, (c) => (c === '0' ? '1' : '0'));
    for (const headers of [{ 'x-pliant-session': '' }, { 'x-pliant-session': wrongSameLength }, { 'x-pliant-session': 'abc' }]) {
      const response = await api('app.info', {}, headers);
      expect(response.status).toBe(401);
      expect(errorCode(response)).toBe('refused-token');
    }
    const noHeader = await send({ method: 'POST', path: '/api/request/app.info', headers: { 'content-type': 'application/json' }, body: '{}' });
    expect(noHeader.status).toBe(401);
    // The key in the query string is accepted only by the event stream, never by requests.
    const inQuery = await send({ method: 'POST', path: `/api/request/app.info?session=${server.token}`, headers: { 'content-type': 'application/json' }, body: '{}' });
    expect(inQuery.status).toBe(401);
  });

  it('refuses the event stream without the key or with a wrong one (401)', async () => {
    expect((await send({ path: '/api/events' })).status).toBe(401);
    expect((await send({ path: `/api/events?session=${'0'.repeat(64)}` })).status).toBe(401);
    expect((await send({ path: '/api/events', headers: { 'x-pliant-session': server.token } })).status).toBe(401);
  });

  it.each([
    ['a rebinding attacker\'s host name', 'attacker.example'],
    ['an attacker\'s host name with our port', 'attacker.example:PORT'],
    ['a look-alike of localhost', 'localhost.attacker.example:PORT'],
    ['our address on another port', '127.0.0.1:1'],
    ['our address without a port', '127.0.0.1'],
    ['another loopback address', '127.0.0.2:PORT'],
    ['the IPv6 loopback', '[::1]:PORT'],
    ['0.0.0.0', '0.0.0.0:PORT'],
  ])('refuses Host: %s (403), for pages and requests alike', async (_label, host) => {
    const hostHeader = host.replace('PORT', String(port));
    const page = await send({ path: '/', host: hostHeader });
    expect(page.status).toBe(403);
    expect(errorCode(page)).toBe('refused-host');
    const call = await send({ method: 'POST', path: '/api/request/app.info', host: hostHeader, headers: { 'content-type': 'application/json', 'x-pliant-session': server.token }, body: '{}' });
    expect(call.status).toBe(403);
    expect(page.body).not.toContain('<title>Pliant');
  });

  it('refuses a request with no Host header at all', async () => {
    const response = await send({ path: '/', host: null });
    expect([400, 403]).toContain(response.status);
  });

  it.each([
    ['another site', 'http://attacker.example'],
    ['an opaque origin', 'null'],
    ['our host on another port', 'http://127.0.0.1:1'],
    ['our host over https', 'https://127.0.0.1:PORT'],
  ])('refuses Origin: %s (403) even with the right key', async (_label, origin) => {
    const response = await api('app.info', {}, { origin: origin.replace('PORT', String(port)) });
    expect(response.status).toBe(403);
    expect(errorCode(response)).toBe('refused-origin');
  });

  it('refuses Sec-Fetch-Site: cross-site (403)', async () => {
    const response = await api('app.info', {}, { 'sec-fetch-site': 'cross-site' });
    expect(response.status).toBe(403);
  });

  it.each([
    '/../secret.txt',
    '/%2e%2e/secret.txt',
    '/%2E%2E/secret.txt',
    '/%2e%2e%2fsecret.txt',
    '/assets/..%2f..%2fsecret.txt',
    '/assets/%2e%2e/%2e%2e/secret.txt',
    '/..%5csecret.txt',
    '/assets/.%2e/.%2e/secret.txt',
    '/assets/app.js%00.html',
    '/%ZZ',
  ])('refuses the traversal path %s with 400 and never serves the file', async (path) => {
    const response = await send({ path });
    expect(response.status).toBe(400);
    expect(response.body).not.toContain('not part of the app');
  });

  it('refuses a symlink out of the renderer folder (403) and dot files (404)', async () => {
    const escape = await send({ path: '/escape/secret.txt' });
    expect(escape.status).toBe(403);
    expect(escape.body).not.toContain('not part of the app');
    expect((await send({ path: '/.env' })).status).toBe(404);
    expect((await send({ path: '/missing.js' })).status).toBe(404);
  });

  it('refuses wrong methods with 405 and an Allow header (RFC 9110 15.5.6)', async () => {
    const getApi = await send({ path: '/api/request/app.info', headers: { 'x-pliant-session': server.token } });
    expect(getApi.status).toBe(405);
    expect(getApi.headers.allow).toBe('POST');
    for (const method of ['PUT', 'DELETE', 'POST', 'OPTIONS']) {
      const response = await send({ method, path: '/index.html', body: method === 'POST' ? 'x' : undefined });
      expect(response.status).toBe(405);
      expect(response.headers.allow).toBe('GET, HEAD');
    }
    const postEvents = await send({ method: 'POST', path: `/api/events?session=${server.token}`, body: '' });
    expect(postEvents.status).toBe(405);
    expect(postEvents.headers.allow).toBe('GET');
  });

  it('refuses a non-JSON content type (415), a broken body (400) and an oversized one (413)', async () => {
    const formPost = await send({ method: 'POST', path: '/api/request/app.info', headers: { 'content-type': 'application/x-www-form-urlencoded', 'x-pliant-session': server.token }, body: 'a=1' });
    expect(formPost.status).toBe(415);
    const broken = await send({ method: 'POST', path: '/api/request/app.info', headers: { 'content-type': 'application/json', 'x-pliant-session': server.token }, body: '{"path":' });
    expect(broken.status).toBe(400);
    expect(errorCode(broken)).toBe('invalid-arguments');
    const huge = await send({ method: 'POST', path: '/api/request/scenario.check', headers: { 'content-type': 'application/json', 'x-pliant-session': server.token }, body: Buffer.alloc(5 * 1024 * 1024, 0x20) });
    expect(huge.status).toBe(413);
  });

  it('passes the registry\'s refusals on with a fitting status and no stack', async () => {
    const extraKey = await api('scenario.read', { path: '/etc/passwd', mode: 'w' });
    expect(extraKey.status).toBe(400);
    expect(JSON.parse(extraKey.body)).toEqual({ ok: false, error: { code: 'invalid-arguments', message: 'Unexpected key "mode" in the arguments of scenario.read. It accepts only: path.' } });
    const outside = await api('scenario.read', { path: join(root, 'secret.txt.json') });
    expect(outside.status).toBe(403);
    expect(errorCode(outside)).toBe('path-refused');
    const unknown = await api('shell.exec', { command: 'ls' });
    expect(unknown.status).toBe(404);
    expect(errorCode(unknown)).toBe('unknown-request');
    for (const response of [extraKey, outside, unknown]) expect(response.body).not.toMatch(/\n\s+at\s|\\n\s+at\s/);
  });
});

describe('accepted requests', () => {
  it('serves the page with the CSP and the other protective headers', async () => {
    const page = await send({ path: '/' });
    expect(page.status).toBe(200);
    expect(page.body).toBe('<!doctype html><title>Pliant</title>');
    expect(page.headers['content-type']).toBe('text/html; charset=utf-8');
    expect(page.headers['content-security-policy']).toBe(CONTENT_SECURITY_POLICY);
    expect(page.headers['x-content-type-options']).toBe('nosniff');
    expect(page.headers['referrer-policy']).toBe('no-referrer');
    expect(page.headers['x-frame-options']).toBe('DENY');
    expect(page.headers['access-control-allow-origin']).toBeUndefined();
  });

  it('serves assets, answers HEAD without a body, and accepts localhost:PORT', async () => {
    const script = await send({ path: '/assets/app.js?cache=1', host: `localhost:${port}` });
    expect(script.status).toBe(200);
    expect(script.headers['content-type']).toBe('text/javascript; charset=utf-8');
    expect(script.body).toBe('console.log("Korrin Bay")');
    const head = await send({ method: 'HEAD', path: '/assets/app.js' });
    expect(head.status).toBe(200);
    expect(head.body).toBe('');
  });

  it('answers a request with the right key and our own Origin', async () => {
    const response = await api('app.info', {}, { origin: `http://127.0.0.1:${port}`, 'sec-fetch-site': 'same-origin' });
    expect(response.status).toBe(200);
    expect(response.headers['cache-control']).toBe('no-store');
    const reply = JSON.parse(response.body) as { ok: boolean; result: Record<string, unknown> };
    expect(reply.ok).toBe(true);
    expect(reply.result).toMatchObject({ name: 'Pliant', mode: 'web', folderChoice: 'in-page' });
  });

  it('browses folders in the page, allows one, then reads and writes scenarios inside it only', async () => {
    const listing = JSON.parse((await api('folder.browse', { path: root })).body) as { result: { folders: { name: string }[] } };
    expect(listing.result.folders.map((f) => f.name)).toEqual(['korrin-bay', 'renderer', 'scenarios']);
    const target = join(root, 'korrin-bay', 'eel-swimmer.json');
    expect(errorCode(await api('scenario.write', { path: target, text: '{}' }))).toBe('path-refused');
    expect(JSON.parse((await api('folder.allow', { path: join(root, 'korrin-bay'), purpose: 'scenario' })).body)).toEqual({ ok: true, result: { path: join(root, 'korrin-bay') } });
    const text = '{"name":"korrin-bay-eel"}'; // 25 ASCII characters, so 25 UTF-8 bytes
    const written = await api('scenario.write', { path: target, text });
    expect(JSON.parse(written.body)).toEqual({ ok: true, result: { path: target, bytes: 25 } });
    expect(JSON.parse((await api('scenario.read', { path: target })).body)).toEqual({ ok: true, result: { path: target, text } });
    expect(errorCode(await api('folder.choose', { purpose: 'dataset' }))).toBe('unsupported-in-mode');
  });

  it('keeps the page inside the root folder it was started with: no folder outside it can be allowed, browsed or read', async () => {
    // The root is the temporary folder `root`; its parent and `/` lie outside it.
    const outside = join(root, '..');
    const parent = realpathSync(outside);
    symlinkSync(parent, join(root, 'korrin-bay', 'link-out'));
    expect(errorCode(await api('folder.allow', { path: '/', purpose: 'scenario' }))).toBe('path-refused');
    expect(errorCode(await api('folder.allow', { path: parent, purpose: 'dataset' }))).toBe('path-refused');
    // A link inside the root that leads out of it is judged by where it leads.
    expect(errorCode(await api('folder.allow', { path: join(root, 'korrin-bay', 'link-out'), purpose: 'dataset' }))).toBe('path-refused');
    expect(errorCode(await api('folder.browse', { path: '/' }))).toBe('path-refused');
    expect(errorCode(await api('folder.browse', { path: join(root, 'korrin-bay', 'link-out') }))).toBe('path-refused');
    const refusal = JSON.parse((await api('folder.allow', { path: '/', purpose: 'scenario' })).body) as { error: { message: string } };
    expect(refusal.error.message).toContain('root folder this web-mode server was started with');
    expect(refusal.error.message).toContain(JSON.stringify(root));
    // Browsing starts at the root, and the root has no parent to climb to.
    const start = JSON.parse((await api('folder.browse', { path: '' })).body) as { result: { path: string; parent: string | null } };
    expect(start.result).toMatchObject({ path: root, parent: null });
    expect(errorCode(await api('scenario.read', { path: join(parent, 'anything.json') }))).toBe('path-refused');
    expect(errorCode(await api('folder.listJson', { path: parent }))).toBe('path-refused');
  });

  it('opens the event stream with the key as text/event-stream', async () => {
    const first = await new Promise<{ status: number; type: string | undefined; chunk: string }>((resolve, reject) => {
      const req = request({ host: '127.0.0.1', port, path: `/api/events?session=${server.token}`, agent: false }, (res) => {
        res.once('data', (chunk: Buffer) => {
          resolve({ status: res.statusCode ?? 0, type: res.headers['content-type'], chunk: chunk.toString('utf8') });
          req.destroy();
        });
      });
      req.on('error', reject);
      req.end();
    });
    expect(first).toEqual({ status: 200, type: 'text/event-stream; charset=utf-8', chunk: ': connected\n\n' });
  });
});
