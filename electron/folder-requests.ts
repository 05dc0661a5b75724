// Handlers for choosing folders. In the desktop app the system dialog picks (a scenario as its
// file, in one step, whose folder is then allowed) and every pick is
// added to the allowed folders. In web mode there is no dialog: the page browses subfolder names
// with folder.browse and confirms one with folder.allow; the session token already proves the
// caller is the person who started the server, and both stay inside the root folder the server
// was started with (allowed-folders.ts), so a compromised page cannot allow `/` for itself.
import { realpath } from 'node:fs/promises';
import { basename, dirname, join } from 'node:path';

import type { FolderListing } from '../sim/bridge/bridge-contract.ts';
import { refuseUnsafeSpelling, shown } from './allowed-folders.ts';
import type { HandlerTable } from './handler-table.ts';
import { RequestError } from './request-error.ts';
import type { RequestServices } from './request-services.ts';

type FolderRequests = Pick<HandlerTable, 'folder.choose' | 'folder.browse' | 'folder.allow' | 'folder.listJson'>;

/** Enough for any real folder; a listing of a huge one is cut rather than held in full. */
const MAX_LISTED_FOLDERS = 2000;

export function folderRequests(services: RequestServices): FolderRequests {
  const { folderChooser, folders, files } = services;
  const inPageOnly = (name: string): void => {
    if (folderChooser.mode !== 'in-page') {
      throw new RequestError('unsupported-in-mode', `${name} is for the web-mode page only. In the desktop app, use folder.choose, which opens the system folder dialog.`);
    }
  };

  const jsonFileNames = async (folder: string): Promise<string[]> => (await files.listFiles(folder, '')).filter((name) => /\.json$/i.test(name));

  return {
    'folder.choose': async ({ purpose }) => {
      if (folderChooser.mode !== 'native') {
        throw new RequestError('unsupported-in-mode', 'In web mode the page chooses folders itself: list them with folder.browse and confirm one with folder.allow.');
      }
      const picked = await folderChooser.choose(purpose);
      if (picked === null) return null;
      // A scenario is picked as a file in one step: its folder is what the session may then use.
      if (purpose === 'scenario' && !(await files.isFolder(picked))) {
        return { path: await folders.allow(dirname(picked), purpose), file: basename(picked) };
      }
      return { path: await folders.allow(picked, purpose) };
    },

    'folder.browse': async ({ path, jsonFiles }) => {
      inPageOnly('folder.browse');
      const root = folders.confinedTo;
      const requested = path === '' ? (root ?? files.homeFolder()) : path;
      refuseUnsafeSpelling(requested);
      const real = await realpath(requested);
      folders.refuseOutsideConfinement(requested, real);
      if (!(await files.isFolder(real))) {
        throw new RequestError('path-refused', `${shown(path)} is a file, not a folder.`);
      }
      const { names, truncated } = await files.listFolders(real, MAX_LISTED_FOLDERS);
      const parent = dirname(real);
      const listing: FolderListing = {
        path: real,
        parent: parent === real || real === root ? null : parent,
        folders: names.map((name) => ({ name, path: join(real, name) })),
        truncated,
      };
      // Names of .json files only, as the folder names above are: opening one still goes through
      // folder.allow of its folder, so nothing is read before the person picks it.
      if (jsonFiles === true) listing.jsonFiles = (await jsonFileNames(real)).map((name) => ({ name, path: join(real, name) }));
      return listing;
    },

    // Both modes: a scenario is opened by picking it from this list rather than typing its name.
    // Unlike folder.browse it reveals file names, so only folders chosen in this session (and the
    // bundled examples) may be listed.
    'folder.listJson': async ({ path }) => {
      const real = await folders.resolve(path, 'read');
      if (!(await files.isFolder(real))) {
        throw new RequestError('path-refused', `${shown(path)} is a file, not a folder. List the folder that holds it.`);
      }
      const names = await jsonFileNames(real);
      return { path: real, files: names.map((name) => ({ name, path: join(real, name) })) };
    },

    'folder.allow': async ({ path, purpose }) => {
      inPageOnly('folder.allow');
      return { path: await folders.allow(path, purpose) };
    },
  };
}
