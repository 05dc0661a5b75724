// The bridge in web mode: requests are POSTed as JSON to the local Pliant server with the
// session token in a header; events arrive over one Server-Sent Events stream, opened while
// someone listens. Browser APIs are passed in (fetch, EventSource) so this runs under test too.
//
// There is no system folder dialog in a browser, so `folder.choose` is answered by the page's own
// folder picker (passed in by the screens), which browses with folder.browse; the chosen folder
// is then granted to the session with folder.allow.
import type { BridgeEvent, FolderListing, FolderPurpose, RequestArgs, RequestName, RequestResult } from '../../sim/bridge/bridge-contract.ts';
import { EVENT_NAMES, WEB_EVENTS_PATH, WEB_REQUEST_PREFIX, WEB_TOKEN_HEADER, WEB_TOKEN_PARAM } from '../../sim/bridge/bridge-contract.ts';
import { BridgeRequestError } from './bridge-request-error.ts';
import type { PliantBridge } from './pliant-bridge.ts';
import { unwrapReply } from './unwrap-reply.ts';

/**
 * The page's own folder chooser: browses with `browse` (asking for the .json files too where it
 * lists them) and resolves with the chosen folder and, when one was clicked, a file in it; or null.
 */
export type InPageFolderPicker = (purpose: FolderPurpose, browse: (path: string, jsonFiles: boolean) => Promise<FolderListing>) => Promise<{ path: string; file?: string } | null>;

export type FetchLike = (
  url: string,
  init: { method: 'POST'; headers: Record<string, string>; body: string; credentials: 'omit'; cache: 'no-store' },
) => Promise<{ status: number; json(): Promise<unknown> }>;

export interface EventSourceLike {
  addEventListener(type: string, listener: (event: { data: string }) => void): void;
  close(): void;
}

export interface WebBridgeOptions {
  /** The server's origin, e.g. "http://127.0.0.1:41234". */
  origin: string;
  token: string;
  fetch: FetchLike;
  createEventSource: (url: string) => EventSourceLike;
  pickFolderInPage?: InPageFolderPicker;
}

const TOKEN_SHAPE = /^[0-9a-f]{64}$/;

/** Reads the session token from the page URL's fragment ("#session=<64 hex digits>"); null if absent. */
export function readSessionToken(fragment: string): string | null {
  const token = new URLSearchParams(fragment.replace(/^#/, '')).get(WEB_TOKEN_PARAM);
  return token !== null && TOKEN_SHAPE.test(token) ? token : null;
}

export function createWebBridge(options: WebBridgeOptions): PliantBridge {
  const listeners = new Set<(event: BridgeEvent) => void>();
  let source: EventSourceLike | null = null;

  const post = async <K extends RequestName>(name: K, args: RequestArgs<K>): Promise<RequestResult<K>> => {
    let response: { status: number; json(): Promise<unknown> };
    try {
      response = await options.fetch(`${options.origin}${WEB_REQUEST_PREFIX}${name}`, {
        method: 'POST',
        headers: { 'content-type': 'application/json', [WEB_TOKEN_HEADER]: options.token },
        body: JSON.stringify(args),
        credentials: 'omit',
        cache: 'no-store',
      });
    } catch {
      throw new BridgeRequestError('shell-unreachable', `Pliant's web server did not answer ${name}. Is it still running? Start it again with "npm run web".`);
    }
    let body: unknown;
    try {
      body = await response.json();
    } catch {
      throw new BridgeRequestError('shell-unreachable', `Pliant's web server answered ${name} with status ${response.status} and no reply.`);
    }
    return unwrapReply(name, body);
  };

  const chooseFolder = async (purpose: FolderPurpose): Promise<RequestResult<'folder.choose'>> => {
    if (!options.pickFolderInPage) {
      throw new BridgeRequestError('not-available', 'This page has no folder chooser for web mode yet.');
    }
    const picked = await options.pickFolderInPage(purpose, (path, jsonFiles) => post('folder.browse', jsonFiles ? { path, jsonFiles } : { path }));
    if (picked === null) return null;
    const allowed = await post('folder.allow', { path: picked.path, purpose });
    return picked.file === undefined ? allowed : { ...allowed, file: picked.file };
  };

  const openStream = (): EventSourceLike => {
    const stream = options.createEventSource(`${options.origin}${WEB_EVENTS_PATH}?${WEB_TOKEN_PARAM}=${encodeURIComponent(options.token)}`);
    for (const name of EVENT_NAMES) {
      stream.addEventListener(name, (message) => {
        let payload: unknown;
        try {
          payload = JSON.parse(message.data);
        } catch {
          return; // A torn or foreign message carries nothing a screen could use.
        }
        const event = { name, payload } as BridgeEvent;
        for (const listener of listeners) listener(event);
      });
    }
    return stream;
  };

  return {
    transport: 'web',
    invoke<K extends RequestName>(name: K, args: RequestArgs<K>): Promise<RequestResult<K>> {
      if (name === 'folder.choose') {
        return chooseFolder((args as RequestArgs<'folder.choose'>).purpose) as Promise<RequestResult<K>>;
      }
      return post(name, args);
    },
    onEvent(listener) {
      listeners.add(listener);
      source ??= openStream();
      return () => {
        listeners.delete(listener);
        if (listeners.size === 0 && source) {
          source.close();
          source = null;
        }
      };
    },
  };
}
