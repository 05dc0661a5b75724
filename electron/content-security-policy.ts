// The Content-Security-Policy for every renderer page, in the desktop app (set on each response of
// our app protocol) and in web mode (an HTTP header). Electron's security checklist, item 7
// "Define a Content Security Policy", recommends restrictive rules such as script-src 'self'; this
// one starts from default-src 'none' and opens only what the renderer uses:
// - scripts, styles, fonts and fetches from our own origin only ('self'), no inline code, no eval;
// - WebAssembly compilation ('wasm-unsafe-eval' in script-src, the CSP Level 3 keyword-source
//   for it; from memory), because the preview's Web Worker steps episodes with the WebAssembly
//   kernel of sim/core/wasm/. It is the narrowest source that allows it: it permits compiling
//   WebAssembly and nothing else, where 'unsafe-eval' would also allow eval() and new
//   Function(). The kernel's bytes come inside our own script bundle; nothing is fetched.
//   Workers get this policy too (their script responses carry the same header); without it the
//   worker would fall back to the JavaScript kernel;
// - workers from 'self' or blob: (the viewer may build a worker from a generated module);
// - images from 'self' or data: URLs (small generated icons and canvas snapshots).
// Datasets are read by the main process (or the web server) and reach the page as decoded arrays
// through the bridge, so h5wasm never loads in the page.
// No remote origin appears anywhere: Pliant shows nothing from the network.

export const CSP_DIRECTIVES: Readonly<Record<string, readonly string[]>> = {
  'default-src': ["'none'"],
  'script-src': ["'self'", "'wasm-unsafe-eval'"],
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
