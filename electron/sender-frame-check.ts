// Decides whether an IPC message comes from Pliant's own page. Electron's security checklist,
// item 17 "Validate the sender of all IPC messages": any frame can send IPC, so the main process
// checks the sending frame's URL with a URL parser before acting on a request.
import { isAppUrl } from './app-scheme.ts';

/** The parts of Electron's WebFrameMain this check reads. */
export interface SenderFrame {
  readonly url: string;
  readonly parent: unknown;
}

/**
 * Trusted only when the frame still exists (Electron gives null once it has navigated away or
 * been destroyed), is a top-level frame (we create no iframes, so a child frame is foreign
 * content), and shows a pliant://app page.
 */
export function isTrustedSenderFrame(frame: SenderFrame | null | undefined): boolean {
  if (!frame) return false;
  if (frame.parent !== null) return false;
  return isAppUrl(frame.url);
}
