// Media types for the files of the built renderer, served by the app protocol and the web-mode
// server. Unknown extensions are sent as opaque bytes, and every response also carries
// "X-Content-Type-Options: nosniff", so a browser never guesses a script out of a data file.
import { extname } from 'node:path';

const BY_EXTENSION: Readonly<Record<string, string>> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.mjs': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.json': 'application/json; charset=utf-8',
  '.map': 'application/json; charset=utf-8',
  '.txt': 'text/plain; charset=utf-8',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
  '.jpg': 'image/jpeg',
  '.jpeg': 'image/jpeg',
  '.webp': 'image/webp',
  '.ico': 'image/vnd.microsoft.icon',
  '.woff2': 'font/woff2',
  '.wasm': 'application/wasm',
};

export function contentTypeFor(filePath: string): string {
  return BY_EXTENSION[extname(filePath).toLowerCase()] ?? 'application/octet-stream';
}
