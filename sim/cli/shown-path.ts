// How a folder is named in messages: relative to where the command was run when it lies below
// it, absolute otherwise (a path full of "../" helps nobody).
import { isAbsolute, relative } from 'node:path';

export function shownPath(cwd: string, path: string): string {
  const r = relative(cwd, path);
  if (r === '') return '.';
  return r.startsWith('..') || isAbsolute(r) ? path : r;
}
