// The window's frame: the product name, one navigation button per screen, and the screen on
// show. Switching screens tells the old one it is hidden (it pauses) and the new one it is shown.
import { button, h } from '../ui/element.ts';
import type { Screen } from '../ui/screen.ts';
import { ShortcutList } from './shortcut-list.ts';

export class AppShell {
  readonly root: HTMLElement;
  private readonly nav: HTMLElement;
  private readonly main: HTMLElement;
  private current: Screen | null = null;
  private readonly screens: Screen[] = [];

  constructor(modeNote: string) {
    this.nav = h('nav', { className: 'screen-nav', attrs: { 'aria-label': 'Screens' } });
    this.main = h('main', { className: 'screen-host' });
    const shortcuts = new ShortcutList();
    this.root = h('div', { className: 'app' }, h('header', { className: 'app-bar' }, h('h1', { className: 'app-name', text: 'Pliant' }), this.nav, h('span', { className: 'app-mode', text: modeNote }), shortcuts.opener), this.main, shortcuts.dialog);
  }

  add(screen: Screen): void {
    this.screens.push(screen);
    screen.root.hidden = true;
    this.main.append(screen.root);
    this.nav.append(button(screen.title, () => this.show(screen.id), { className: 'nav-button', attrs: { 'data-nav': screen.id } }));
  }

  show(id: string): void {
    const next = this.screens.find((s) => s.id === id);
    if (!next || next === this.current) return;
    if (this.current) {
      this.current.root.hidden = true;
      this.current.hidden?.();
    }
    this.current = next;
    next.root.hidden = false;
    for (const b of this.nav.querySelectorAll('button')) {
      b.classList.toggle('is-active', b.getAttribute('data-nav') === id);
      if (b.getAttribute('data-nav') === id) b.setAttribute('aria-current', 'page');
      else b.removeAttribute('aria-current');
    }
    next.shown?.();
  }
}
