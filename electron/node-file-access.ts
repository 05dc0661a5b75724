// FileAccess on the real disk through node:fs. Paths arrive already resolved and allowed; this
// file only adds size limits and crash-safe writes.
import { randomBytes } from 'node:crypto';
import { readdir, readFile, rename, stat, unlink, writeFile } from 'node:fs/promises';
import { homedir } from 'node:os';
import { basename, dirname, join } from 'node:path';

import { shown } from './allowed-folders.ts';
import { RequestError } from './request-error.ts';
import type { FileAccess } from './request-services.ts';

export function createNodeFileAccess(): FileAccess {
  return {
    async readText(path, maxBytes) {
      const info = await stat(path);
      if (!info.isFile()) throw new RequestError('io-error', `${shown(path)} is not a file.`);
      if (info.size > maxBytes) {
        throw new RequestError('too-large', `${shown(path)} is ${info.size} bytes; at most ${maxBytes} are read. Check that it is the file you meant.`);
      }
      return readFile(path, 'utf8');
    },

    async writeTextAtomic(path, text) {
      // Same folder as the target, so the rename cannot cross file systems and stays atomic.
      const temporary = join(dirname(path), `.${basename(path)}.${randomBytes(6).toString('hex')}.partial`);
      try {
        await writeFile(temporary, text, { encoding: 'utf8', flag: 'wx' });
        await rename(temporary, path);
      } catch (error) {
        await unlink(temporary).catch(() => undefined);
        // The error names the temporary file, which the person never asked for; name the folder.
        if ((error as { code?: string }).code === 'ENOENT') {
          throw new RequestError('not-found', `The folder ${shown(dirname(path))} does not exist. Create it first, or save in a folder that exists.`);
        }
        throw error;
      }
      return Buffer.byteLength(text, 'utf8');
    },

    async listFolders(path, max) {
      const entries = await readdir(path, { withFileTypes: true });
      const names = entries.filter((e) => e.isDirectory()).map((e) => e.name).sort(byName);
      return { names: names.slice(0, max), truncated: names.length > max };
    },

    async listFiles(path, extension) {
      const entries = await readdir(path, { withFileTypes: true });
      return entries.filter((e) => e.isFile() && e.name.endsWith(extension)).map((e) => e.name).sort(byName);
    },

    async isFolder(path) {
      return (await stat(path)).isDirectory();
    },

    homeFolder: () => homedir(),
  };
}

function byName(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0;
}
