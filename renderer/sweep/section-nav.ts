// The column beside the scenario form: one entry per section of the form (system, materials,
// world, controls, time, start state, splits, export, …), each with the number of problems
// inside it. A click unfolds the section and scrolls it into view, so a 20,000 px form of a
// large lattice is a few clicks from any part.
import { button, h } from '../ui/element.ts';
import type { SectionEntry } from './section-of.ts';
import { sectionOf } from './section-of.ts';

export type { SectionEntry };

export class SectionNav {
  readonly root = h('nav', { className: 'section-nav', attrs: { 'aria-label': 'Sections of the scenario', 'data-role': 'section-nav' } });
  private entries: SectionEntry[] = [];

  constructor(private readonly go: (pointer: string) => void) {}

  show(entries: SectionEntry[]): void {
    this.entries = entries;
    this.root.replaceChildren(
      h('ul', {}, ...entries.map((entry) => h('li', { className: entry.nested ? 'is-nested' : '' },
        button(entry.label, () => this.go(entry.pointer), { className: 'section-link', attrs: { 'data-section-link': entry.pointer } }),
      ))),
    );
    this.root.hidden = entries.length === 0;
  }

  /** Counts each problem in the innermost listed section its pointer lies in. */
  showProblems(pointers: readonly string[]): void {
    const counts = new Map<string, number>();
    for (const pointer of pointers) {
      const home = sectionOf(pointer, this.entries);
      counts.set(home, (counts.get(home) ?? 0) + 1);
    }
    for (const link of this.root.querySelectorAll<HTMLButtonElement>('[data-section-link]')) {
      const pointer = link.getAttribute('data-section-link') ?? '';
      const count = counts.get(pointer) ?? 0;
      link.querySelector('.problem-count')?.remove();
      link.classList.toggle('has-problem', count > 0);
      link.setAttribute('data-problem-count', String(count));
      if (count > 0) link.append(h('span', { className: 'problem-count', text: String(count), title: `${count} problem${count === 1 ? '' : 's'} in this section` }));
    }
  }
}
