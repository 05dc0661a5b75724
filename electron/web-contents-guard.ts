// Refuses navigation and new windows for every web contents the app creates (Electron's security
// checklist, items 12-14). Pliant is a single page that never needs to go anywhere else, so every
// navigation is refused rather than checked against a list.
import type { WebContents } from 'electron';

export function guardWebContents(contents: WebContents): void {
  contents.on('will-navigate', (event) => event.preventDefault());
  contents.on('will-redirect', (event) => event.preventDefault());
  contents.on('will-attach-webview', (event) => event.preventDefault());
  contents.setWindowOpenHandler(() => ({ action: 'deny' }));
}
