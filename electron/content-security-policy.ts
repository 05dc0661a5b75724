// The Content-Security-Policy for every renderer page, in the desktop app (set on each response of
// our app protocol) and in web mode (an HTTP header). Electron's security checklist, item 7
// "Define a Content Security Policy", recommends restrictive rules such as script-src 'self'; this
// one starts from default-src 'none' and opens only what the renderer uses:
// - scripts, styles, fonts and fetches from our own origin only ('self'), no inline code, no eval;
// - workers from 'self' or blob: (the viewer may build a worker from a generated module);
// - images from 'self' or data: URLs (small generated icons and canvas snapshots).
// No 'wasm-unsafe-eval': the renderer runs no WebAssembly. Datasets are read by the main process
// (or the web server) and reach the page as decoded arrays through the bridge, so h5wasm never
// loads in the page. Add it here, with the reason, only if that changes.
// No remote origin appears anywhere: Pliant shows nothing from the network.

export const CSP_DIRECTIVES: Readonly<Record<string, readonly string[]>> = {
  'default-src': ["'none'"],
  'script-src': ["'self'"],
  'style-src': ["'self'"],
  'img-src': ["'self'", 'data:'],
  'font-src': ["'self'"],
  'connect-src': ["'self'"],
  'worker-src': ["'self'", 'blob:'],
  'object-src': ["'none'"],
  'frame-src': ["'none'"],
  'base-uri': ["'none'"],
  'form-action': ["'none'"],
  'frame-ancestors': ["'none'"],
};

export const CONTENT_SECURITY_POLICY = Object.entries(CSP_DIRECTIVES)
  .map(([name, sources]) => `${name} ${sources.join(' ')}`)
  .join('; ');
