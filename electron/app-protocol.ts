// The handler behind protocol.handle('pliant', ...): serves the built renderer's files for
// pliant://app/..., read-only, with our CSP on every response. It takes a fetch Request and
// returns a fetch Response, so it runs (and is tested) without Electron.
import { readFile } from 'node:fs/promises';

import { APP_HOST } from './app-scheme.ts';
import { CONTENT_SECURITY_POLICY } from './content-security-policy.ts';
import { contentTypeFor } from './content-types.ts';
import { resolveStaticFile } from './static-file-resolver.ts';

/** Reads only the method and the URL, so it also takes raw URLs no fetch Request would carry unnormalised. */
export function createAppProtocolHandler(rendererDirReal: string): (request: Pick<Request, 'method' | 'url'>) => Promise<Response> {
  return async (request) => {
    if (request.method !== 'GET' && request.method !== 'HEAD') return refusal(405, 'Only GET and HEAD are served.');
    // Split the raw URL by hand: new URL() would resolve %2e%2e before we could refuse it.
    const afterScheme = request.url.replace(/^[a-z][a-z0-9+.-]*:\/\//i, '');
    const slash = afterScheme.indexOf('/');
    const host = slash < 0 ? afterScheme : afterScheme.slice(0, slash);
    if (host.toLowerCase() !== APP_HOST) return refusal(404, 'Unknown host.');
    const rawPath = (slash < 0 ? '/' : afterScheme.slice(slash)).split(/[?#]/)[0];
    const lookup = await resolveStaticFile(rendererDirReal, rawPath);
    if (!lookup.ok) return refusal(lookup.status, lookup.reason);
    const body = request.method === 'HEAD' ? null : await readFile(lookup.filePath);
    return new Response(body, { status: 200, headers: { ...securityHeaders(), 'content-type': contentTypeFor(lookup.filePath) } });
  };
}

function securityHeaders(): Record<string, string> {
  return {
    'content-security-policy': CONTENT_SECURITY_POLICY,
    'x-content-type-options': 'nosniff',
  };
}

function refusal(status: number, reason: string): Response {
  return new Response(reason, { status, headers: { ...securityHeaders(), 'content-type': 'text/plain; charset=utf-8' } });
}
