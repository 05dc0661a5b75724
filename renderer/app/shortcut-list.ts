// The app's keyboard shortcuts, listed in a dialog that "?" (or the Keys button) opens and Escape
// closes, so every action a mouse reaches is known to reach from the keyboard too.
import { button, h } from '../ui/element.ts';

const SHORTCUTS: readonly (readonly [string, string])[] = [
  ['Tab / Shift+Tab', 'move to the next / previous control; the focused one is ringed'],
  ['Enter or Space', 'press the focused button, tick the focused box'],
  ['Space', 'play or pause the 3-D view of the screen on show (when no button or text field has focus)'],
  ['← / →', 'step one frame back / on'],
  ['Shift+← / Shift+→', 'step ten frames'],
  ['A / D, W / S on the 3-D view', 'turn the camera round the body / tilt it (or drag with the mouse)'],
  ['+ / − on the 3-D view', 'zoom in / out (or the mouse wheel)'],
  ['?', 'show this list'],
  ['Escape', 'close this list or a folder chooser'],
];

export class ShortcutList {
  readonly dialog: HTMLDialogElement;
  readonly opener: HTMLButtonElement;

  constructor() {
    this.dialog = h(
      'dialog',
      { className: 'shortcut-list', attrs: { 'data-role': 'shortcut-list', 'aria-labelledby': 'shortcut-title' } },
      h('h2', { text: 'Keyboard shortcuts', attrs: { id: 'shortcut-title' } }),
      h('table', {}, h('tbody', {}, ...SHORTCUTS.map(([keys, what]) => h('tr', {}, h('th', { attrs: { scope: 'row' } }, h('kbd', { text: keys })), h('td', { text: what }))))),
      h('div', { className: 'dialog-buttons' }, button('Close', () => this.dialog.close(), { attrs: { 'data-role': 'shortcut-close' } })),
    );
    this.opener = button('Keys ?', () => this.open(), { className: 'nav-button keys-button', attrs: { 'data-role': 'shortcut-open', 'aria-label': 'Keyboard shortcuts', 'aria-keyshortcuts': 'Shift+Slash' } });
    document.addEventListener('keydown', (event) => {
      if (event.key !== '?' || isTyping(event.target) || this.dialog.open) return;
      if (document.querySelector('dialog[open]')) return;
      event.preventDefault();
      this.open();
    });
  }

  open(): void {
    if (!this.dialog.open) this.dialog.showModal();
  }
}

function isTyping(target: EventTarget | null): boolean {
  if (!(target instanceof HTMLElement)) return false;
  if (target instanceof HTMLTextAreaElement || target instanceof HTMLSelectElement || target.isContentEditable) return true;
  return target instanceof HTMLInputElement && !['checkbox', 'radio', 'range', 'button'].includes(target.type);
}
