// The checks the web-mode server runs on every HTTP request before anything else, as pure
// functions of the request headers. The server listens on 127.0.0.1 only, but a web page the
// person has open elsewhere can still reach that address, so:
// - Host must name our loopback address and port exactly. A DNS-rebinding page reaches us under
//   its own host name, which is refused here (OWASP: validate the Host header against an allow
//   list; NCC Group's "Preventing DNS Rebinding Attacks" gives the 127.0.0.1:PORT / localhost:PORT
//   rule used here).
// - Origin, when a browser sends one, must be our own; any other site is refused (OWASP CSRF
//   Prevention Cheat Sheet: verify the origin with standard headers). Sec-Fetch-Site:
//   cross-site is refused as well, for browsers that send it.
// - API requests must carry the per-start session token, compared in constant time.
import { timingSafeEqual } from 'node:crypto';

import type { RequestErrorCode } from '../sim/bridge/bridge-contract.ts';

export type GuardVerdict = { ok: true } | { ok: false; status: 401 | 403; code: RequestErrorCode; message: string };

export interface RequestHeadersLike {
  host?: string | undefined;
  origin?: string | undefined;
  'sec-fetch-site'?: string | string[] | undefined;
}

export function allowedHosts(port: number): string[] {
  return [`127.0.0.1:${port}`, `localhost:${port}`];
}

export function allowedOrigins(port: number): string[] {
  return allowedHosts(port).map((host) => `http://${host}`);
}

export function checkHostAndOrigin(headers: RequestHeadersLike, port: number): GuardVerdict {
  const host = (headers.host ?? '').toLowerCase();
  if (!allowedHosts(port).includes(host)) {
    return {
      ok: false,
      status: 403,
      code: 'refused-host',
      message: `Refused: this server answers only to 127.0.0.1:${port} or localhost:${port}. Open the address Pliant printed when it started.`,
    };
  }
  const origin = headers.origin;
  if (origin !== undefined && !allowedOrigins(port).includes(origin.toLowerCase())) {
    return { ok: false, status: 403, code: 'refused-origin', message: 'Refused: the request came from another web site.' };
  }
  if (headers['sec-fetch-site'] === 'cross-site') {
    return { ok: false, status: 403, code: 'refused-origin', message: 'Refused: the request came from another web site.' };
  }
  return { ok: true };
}

export function checkToken(presented: string | string[] | undefined | null, expected: string): GuardVerdict {
  const refused: GuardVerdict = {
    ok: false,
    status: 401,
    code: 'refused-token',
    message: 'Refused: the session key is missing or wrong. Open the full address Pliant printed when it started; it carries the key.',
  };
  if (typeof presented !== 'string') return refused;
  const a = Buffer.from(presented, 'utf8');
  const b = Buffer.from(expected, 'utf8');
  if (a.length !== b.length) return refused;
  return timingSafeEqual(a, b) ? { ok: true } : refused;
}
