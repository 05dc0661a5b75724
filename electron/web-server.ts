// Web mode: the same renderer and the same request handlers as the desktop app, served to a
// browser on this machine by node:http. Listens on 127.0.0.1 only; every request passes the
// host/origin guard, API requests and the event stream need the per-start session token, and
// static files come only from the built renderer folder.
//
// Routes:  GET|HEAD /...                  renderer files (no token: they hold nothing private)
//          POST /api/request/<name>       JSON argument object in, RequestReply out
//          GET  /api/events?session=...   Server-Sent Events, one `job.progress` event per update
import { randomBytes } from 'node:crypto';
import { readFile,realpath } from 'node:fs/promises';
import type { IncomingMessage, ServerResponse } from 'node:http';
import { createServer } from 'node:http';
import type { AddressInfo } from 'node:net';

import type { RequestErrorCode } from '../sim/bridge/bridge-contract.ts';
import { BRIDGE_LIMITS, WEB_EVENTS_PATH, WEB_REQUEST_PREFIX, WEB_TOKEN_HEADER, WEB_TOKEN_PARAM } from '../sim/bridge/bridge-contract.ts';
import { CONTENT_SECURITY_POLICY } from './content-security-policy.ts';
import { contentTypeFor } from './content-types.ts';
import { checkHostAndOrigin, checkToken } from './request-guard.ts';
import type { RequestHandlers } from './request-handlers.ts';
import { resolveStaticFile } from './static-file-resolver.ts';

export const WEB_HOST = '127.0.0.1';

export interface WebServerOptions {
  handlers: RequestHandlers;
  /** The built renderer (dist/renderer). */
  rendererDir: string;
  /** 0 (the default) lets the system pick a free port. */
  port?: number;
  /** Keep-alive comment interval on event streams. */
  heartbeatMs?: number;
  /** Receives unexpected server errors, for the developer's log. */
  reportError?: (error: unknown) => void;
}

export interface RunningWebServer {
  port: number;
  token: string;
  /** The address to open: carries the token in its fragment. */
  url: string;
  close(): Promise<void>;
}

export const STATUS_BY_CODE: Partial<Record<RequestErrorCode, number>> = {
  'unknown-request': 404,
  'invalid-arguments': 400,
  'path-refused': 403,
  'not-found': 404,
  'already-exists': 409,
  'permission-denied': 403,
  'too-large': 413,
  'not-available': 501,
  'unsupported-in-mode': 400,
  // RFC 9110 section 15.5.21: understood, but the folder's content cannot be processed.
  'invalid-dataset': 422,
  'refused-sender': 403,
  'io-error': 500,
  internal: 500,
};

const BASE_HEADERS = {
  'content-security-policy': CONTENT_SECURITY_POLICY,
  'x-content-type-options': 'nosniff',
  'referrer-policy': 'no-referrer',
  'x-frame-options': 'DENY',
  'cross-origin-opener-policy': 'same-origin',
  'cross-origin-resource-policy': 'same-origin',
};

export async function startWebServer(options: WebServerOptions): Promise<RunningWebServer> {
  const rendererReal = await realpath(options.rendererDir);
  const token = randomBytes(32).toString('hex');
  const heartbeatMs = options.heartbeatMs ?? 15_000;
  const streams = new Set<ServerResponse>();
  let port = 0;

  const server = createServer((req, res) => {
    route(req, res).catch((error: unknown) => {
      options.reportError?.(error);
      if (!res.headersSent) sendJson(res, 500, { ok: false, error: { code: 'internal', message: 'The server failed to answer this request.' } });
      else res.destroy();
    });
  });
  server.headersTimeout = 20_000;
  server.requestTimeout = 120_000;

  async function route(req: IncomingMessage, res: ServerResponse): Promise<void> {
    const guard = checkHostAndOrigin(req.headers, port);
    if (!guard.ok) return sendRefusal(res, guard.status, guard.code, guard.message);

    const raw = req.url ?? '';
    const query = raw.indexOf('?');
    const rawPath = query < 0 ? raw : raw.slice(0, query);
    const search = new URLSearchParams(query < 0 ? '' : raw.slice(query + 1));

    if (rawPath.startsWith(WEB_REQUEST_PREFIX)) return apiRequest(req, res, rawPath.slice(WEB_REQUEST_PREFIX.length));
    if (rawPath === WEB_EVENTS_PATH) return eventStream(req, res, search.get(WEB_TOKEN_PARAM));
    if (rawPath.startsWith('/api/')) return sendRefusal(res, 404, 'not-found', 'No such API route.');
    return staticFile(req, res, rawPath);
  }

  async function apiRequest(req: IncomingMessage, res: ServerResponse, name: string): Promise<void> {
    if (req.method !== 'POST') return sendRefusal(res, 405, 'method-not-allowed', 'Requests are sent with POST.', { allow: 'POST' });
    const tokenVerdict = checkToken(req.headers[WEB_TOKEN_HEADER], token);
    if (!tokenVerdict.ok) return sendRefusal(res, tokenVerdict.status, tokenVerdict.code, tokenVerdict.message);
    // A JSON content type cannot be sent by a plain HTML form, so a forged cross-site form post fails here too.
    const type = (req.headers['content-type'] ?? '').split(';')[0].trim().toLowerCase();
    if (type !== 'application/json') return sendRefusal(res, 415, 'unsupported-media-type', 'Send the arguments as application/json.');
    const body = await readBody(req, BRIDGE_LIMITS.webBodyBytes);
    if (body === null) return sendRefusal(res, 413, 'too-large', `The request body is larger than ${BRIDGE_LIMITS.webBodyBytes} bytes.`);
    let args: unknown;
    try {
      args = JSON.parse(body.toString('utf8'));
    } catch {
      return sendRefusal(res, 400, 'invalid-arguments', 'The request body is not valid JSON.');
    }
    const reply = await options.handlers.handle(name, args);
    sendJson(res, reply.ok ? 200 : (STATUS_BY_CODE[reply.error.code] ?? 400), reply);
  }

  function eventStream(req: IncomingMessage, res: ServerResponse, presented: string | null): void {
    if (req.method !== 'GET') return sendRefusal(res, 405, 'method-not-allowed', 'The event stream is read with GET.', { allow: 'GET' });
    const tokenVerdict = checkToken(presented, token);
    if (!tokenVerdict.ok) return sendRefusal(res, tokenVerdict.status, tokenVerdict.code, tokenVerdict.message);
    res.writeHead(200, { ...BASE_HEADERS, 'content-type': 'text/event-stream; charset=utf-8', 'cache-control': 'no-store', connection: 'keep-alive' });
    res.write(': connected\n\n');
    streams.add(res);
    const unsubscribe = options.handlers.onEvent((event) => {
      res.write(`event: ${event.name}\ndata: ${JSON.stringify(event.payload)}\n\n`);
    });
    const heartbeat = setInterval(() => res.write(': still here\n\n'), heartbeatMs);
    const stop = (): void => {
      clearInterval(heartbeat);
      unsubscribe();
      streams.delete(res);
    };
    req.on('close', stop);
    res.on('close', stop);
  }

  async function staticFile(req: IncomingMessage, res: ServerResponse, rawPath: string): Promise<void> {
    if (req.method !== 'GET' && req.method !== 'HEAD') {
      return sendRefusal(res, 405, 'method-not-allowed', 'Files are read with GET or HEAD.', { allow: 'GET, HEAD' });
    }
    const lookup = await resolveStaticFile(rendererReal, rawPath);
    if (!lookup.ok) return sendRefusal(res, lookup.status, lookup.status === 400 ? 'bad-path' : 'not-found', lookup.reason);
    const body = await readFile(lookup.filePath);
    res.writeHead(200, { ...BASE_HEADERS, 'content-type': contentTypeFor(lookup.filePath), 'content-length': body.length, 'cache-control': 'no-cache' });
    res.end(req.method === 'HEAD' ? undefined : body);
  }

  await new Promise<void>((resolveListen, rejectListen) => {
    server.once('error', rejectListen);
    server.listen(options.port ?? 0, WEB_HOST, () => {
      server.off('error', rejectListen);
      resolveListen();
    });
  });
  port = (server.address() as AddressInfo).port;

  return {
    port,
    token,
    url: `http://${WEB_HOST}:${port}/#${WEB_TOKEN_PARAM}=${token}`,
    close: () =>
      new Promise<void>((resolveClose) => {
        for (const stream of streams) stream.end();
        server.close(() => resolveClose());
        server.closeAllConnections();
      }),
  };
}

/** Reads at most `limit` bytes; null when the body is larger (the rest is not buffered). */
function readBody(req: IncomingMessage, limit: number): Promise<Buffer | null> {
  return new Promise((resolveBody, rejectBody) => {
    const declared = Number(req.headers['content-length']);
    if (Number.isFinite(declared) && declared > limit) {
      req.resume();
      resolveBody(null);
      return;
    }
    const chunks: Buffer[] = [];
    let size = 0;
    let tooLarge = false;
    req.on('data', (chunk: Buffer) => {
      if (tooLarge) return;
      size += chunk.length;
      if (size > limit) {
        tooLarge = true;
        chunks.length = 0;
        return;
      }
      chunks.push(chunk);
    });
    req.on('end', () => resolveBody(tooLarge ? null : Buffer.concat(chunks)));
    req.on('error', rejectBody);
  });
}

function sendJson(res: ServerResponse, status: number, body: unknown, extra: Record<string, string> = {}): void {
  const text = JSON.stringify(body);
  res.writeHead(status, {
    ...BASE_HEADERS,
    ...extra,
    'content-type': 'application/json; charset=utf-8',
    'content-length': Buffer.byteLength(text),
    'cache-control': 'no-store',
  });
  res.end(text);
}

function sendRefusal(res: ServerResponse, status: number, code: RequestErrorCode, message: string, extra: Record<string, string> = {}): void {
  sendJson(res, status, { ok: false, error: { code, message } }, extra);
}
