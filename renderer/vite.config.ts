// Builds the renderer into dist/renderer. Asset URLs are relative ("./assets/..."), so the same
// build works under the desktop app's pliant://app/ origin and behind the web-mode server.
// Run from the repository root (npm scripts do): `vite build --config renderer/vite.config.ts`.
//
// Deliberately imports nothing, not even Vite's types: renderer/tsconfig.json type-checks this
// file with the page's DOM-only settings, and Vite's type declarations would pull Node's types
// into every renderer file with it.
export default {
  root: 'renderer',
  base: './',
  build: {
    outDir: '../dist/renderer',
    emptyOutDir: true,
    target: 'es2022',
    // No data: URLs for fonts or scripts: the CSP allows data: for images only.
    assetsInlineLimit: 0,
    // Chromium supports modulepreload natively; the polyfill would only add code.
    modulePreload: { polyfill: false },
    sourcemap: true,
    // The page is one bundle of about 750 kB, most of it three.js, and the app loads it from disk
    // or 127.0.0.1, so the 500 kB warning (written with slow networks in mind) says nothing here.
    // 1200 kB leaves room to grow while still flagging a bundle that has really ballooned. In kB.
    chunkSizeWarningLimit: 1200,
  },
};
