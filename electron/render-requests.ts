// The handler that starts a render job: one recorded episode drawn from its files as a GIF or a
// folder of PNG pictures, by the same code as `pliant render`, in a worker thread. It checks
// what the person can fix before any work starts — the dataset is readable, the target lies in
// a folder chosen for writing, is not there yet and has a folder to go into — and hands the rest
// to the job runner.
import { lstat } from 'node:fs/promises';
import { dirname } from 'node:path';

import { shown } from './allowed-folders.ts';
import type { HandlerTable } from './handler-table.ts';
import { RequestError } from './request-error.ts';
import type { RequestServices } from './request-services.ts';

type RenderRequests = Pick<HandlerTable, 'render.begin'>;

/** The pictures `pliant render` draws when no option says otherwise. */
export const DEFAULT_PICTURE = { view: 'both', widthPx: 640, heightPx: 320, speed: 1 } as const;

export function renderRequests(services: RequestServices): RenderRequests {
  const { folders, files, jobRunner } = services;
  return {
    'render.begin': async ({ datasetPath, episodeId, output, outPath, view, widthPx, heightPx, speed }) => {
      if (output === 'gif' && !outPath.toLowerCase().endsWith('.gif')) {
        throw new RequestError('invalid-arguments', `${shown(outPath)} does not end in .gif. Name the animation NAME.gif, or save the pictures as PNG frames instead.`);
      }
      const datasetDir = await folders.resolve(datasetPath, 'read');
      const realOut = await folders.resolve(outPath, 'write');
      if (await lstat(realOut).then(() => true, () => false)) {
        const what = output === 'gif' ? 'A file' : 'Something';
        throw new RequestError('already-exists', `${what} named ${shown(realOut)} is already there. Pictures never replace a file; choose another name or folder.`);
      }
      if (!(await files.isFolder(dirname(realOut)))) {
        throw new RequestError('not-found', `The folder ${shown(dirname(realOut))} does not exist. Choose an existing folder to save the pictures into.`);
      }
      return jobRunner.begin({
        kind: 'render',
        datasetDir,
        episodeId,
        output,
        outPath: realOut,
        view: view ?? DEFAULT_PICTURE.view,
        widthPx: widthPx ?? DEFAULT_PICTURE.widthPx,
        heightPx: heightPx ?? DEFAULT_PICTURE.heightPx,
        speed: speed ?? DEFAULT_PICTURE.speed,
      });
    },
  };
}
