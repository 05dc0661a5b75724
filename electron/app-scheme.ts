// The custom URL scheme the desktop app serves its renderer from, instead of file://. A page on
// file:// may read any other local file through the browser engine; a page on pliant://app has an
// origin of its own, so the same-origin policy and our CSP fence it in (Electron's security
// checklist, items 1 and 7; API: protocol.registerSchemesAsPrivileged, protocol.handle).
import type { CustomScheme } from 'electron';

export const APP_SCHEME = 'pliant';
export const APP_HOST = 'app';
export const APP_ENTRY_URL = `${APP_SCHEME}://${APP_HOST}/index.html`;

/**
 * Registered before the app's ready event (registerSchemesAsPrivileged may only be called then).
 * standard: relative URLs resolve and the page gets a real origin; secure: it counts as a secure
 * context like https; supportFetchAPI: the renderer may fetch its own assets; codeCache: faster
 * start. bypassCSP stays false so our policy applies. corsEnabled stays false so no other origin
 * can read our files; our own module scripts still load, being same-origin on a standard scheme.
 * Nothing else is granted.
 */
export const APP_SCHEME_REGISTRATION: CustomScheme = {
  scheme: APP_SCHEME,
  privileges: {
    standard: true,
    secure: true,
    supportFetchAPI: true,
    codeCache: true,
    bypassCSP: false,
    corsEnabled: false,
    allowServiceWorkers: false,
    stream: false,
  },
};

/** True for a URL of our own app origin. Parsed, never prefix-matched (checklist item 13 warns why). */
export function isAppUrl(url: string): boolean {
  let parsed: URL;
  try {
    parsed = new URL(url);
  } catch {
    return false;
  }
  // Node's URL gives non-special schemes an opaque origin ("null"), so compare the parts instead.
  return parsed.protocol === `${APP_SCHEME}:` && parsed.host === APP_HOST && parsed.username === '' && parsed.password === '';
}
