// A one-line message area for a screen: what just happened, or what went wrong and what to do
// about it. Errors from the bridge already say what, where and how to fix; they are shown as is.

export type StatusTone = 'info' | 'ok' | 'error' | 'busy';

export class StatusLine {
  readonly root: HTMLElement;

  constructor(role: string) {
    this.root = document.createElement('div');
    this.root.className = 'status-line';
    this.root.setAttribute('role', 'status');
    this.root.setAttribute('data-role', role);
  }

  show(tone: StatusTone, message: string): void {
    this.root.textContent = message;
    this.root.setAttribute('data-tone', tone);
  }

  /** Shows an error's message (never its stack). */
  error(prefix: string, error: unknown): void {
    const message = error instanceof Error ? error.message : String(error);
    this.show('error', `${prefix}: ${message}`);
  }

  clear(): void {
    this.root.textContent = '';
    this.root.removeAttribute('data-tone');
  }
}
