// Naming something inside a folder the person chose: the name of a folder Pliant is about to
// create there (an export, a regenerated dataset, an episode's pictures), checked before any request is sent so the
// person hears what to change right away, and the path it makes.

const USABLE = /^[A-Za-z0-9][A-Za-z0-9._-]{0,127}$/;

/** Null when usable; else what is wrong and how to fix it. `what` names the thing being named. */
export function newFolderNameProblem(name: string, what: 'folder' | 'file' = 'folder'): string | null {
  if (USABLE.test(name)) return null;
  return `"${name}" is not usable as a ${what} name: use 1 to 128 letters, digits, ".", "_" and "-", starting with a letter or digit.`;
}

/** `name` inside `parent`, with one separator between them. */
export function insideFolder(parent: string, name: string): string {
  return `${parent.replace(/[/\\]$/, '')}/${name}`;
}
