// Which section of the scenario form a problem belongs to, by its JSON pointer: the innermost
// listed section holding it, so the navigation column can count each section's problems.

export interface SectionEntry {
  /** JSON pointer of the section; "" for the scenario's own top-level values. */
  pointer: string;
  label: string;
  /** Nested entries (materials under system) are indented. */
  nested: boolean;
}

/** The innermost entry whose pointer is the problem's or an ancestor of it; "" when none is. */
export function sectionOf(pointer: string, entries: readonly SectionEntry[]): string {
  let best = '';
  for (const entry of entries) {
    if (entry.pointer === '') continue;
    if ((pointer === entry.pointer || pointer.startsWith(`${entry.pointer}/`)) && entry.pointer.length > best.length) best = entry.pointer;
  }
  return best;
}
