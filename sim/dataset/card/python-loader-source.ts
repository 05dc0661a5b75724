// Where the Python loader shipped with Pliant (python/pliant_data.py) lives and how to read its
// text, for `pliant loader` and the dataset card. Resolved next to this module, like the worker
// entry points, so the file is read from the checkout as it is, never from a copy in TypeScript.
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

/** The loader's file name, which is also the Python module name users import. */
export const PYTHON_LOADER_FILE_NAME = 'pliant_data.py';

export const PYTHON_LOADER_URL = new URL(`./python/${PYTHON_LOADER_FILE_NAME}`, import.meta.url);

/** The loader's source text, exactly as shipped. */
export function pythonLoaderSource(): string {
  return readFileSync(fileURLToPath(PYTHON_LOADER_URL), 'utf8');
}
