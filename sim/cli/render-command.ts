// `pliant render DATASET --episode ID --out FILE.gif | --frames DIR`: pictures of one recorded
// episode from its files — a looping GIF, or a numbered PNG sequence — seen from the side,
// from above or both.
import { mkdir } from 'node:fs/promises';
import { join, resolve } from 'node:path';

import { writeFileAtomic } from '../dataset/formats/atomic-file.ts';
import type { PictureView } from '../render/episode-picture.ts';
import { renderedGif, renderedPngs,renderEpisode } from '../render/render-episode.ts';
import type { CliCommand } from './command.ts';
import { CliUsageError } from './command.ts';
import { parseArguments, wholeNumberOption } from './command-arguments.ts';
import { withCliFailures } from './dataset-failure.ts';

const VIEWS: readonly PictureView[] = ['side', 'above', 'both'];
const MAX_SIDE_PX = 4096;

function sizeOption(text: string): { widthPx: number; heightPx: number } {
  const match = /^([1-9][0-9]*)x([1-9][0-9]*)$/.exec(text);
  if (!match) throw new CliUsageError(`--size "${text}" is not WIDTHxHEIGHT in pixels; write for example --size 640x320`);
  const widthPx = Number(match[1]);
  const heightPx = Number(match[2]);
  if (widthPx < 32 || heightPx < 32 || widthPx > MAX_SIDE_PX || heightPx > MAX_SIDE_PX) {
    throw new CliUsageError(`--size ${text} is out of range; each side must be from 32 to ${MAX_SIDE_PX} pixels`);
  }
  return { widthPx, heightPx };
}

function speedOption(text: string): number {
  const speed = Number(text);
  if (!/^[0-9.eE+-]+$/.test(text) || !Number.isFinite(speed) || speed <= 0 || speed > 1000) {
    throw new CliUsageError(`--speed "${text}" is not a positive number up to 1000; 1 plays in real time, 0.5 at half speed`);
  }
  return speed;
}

export const renderCommand: CliCommand = {
  name: 'render',
  usage: [
    'Usage: pliant render DATASET --episode ID (--out FILE.gif | --frames DIR)',
    '                     [--view side|above|both] [--size WxH] [--speed S] [--every K]',
    '',
    'Draws the recorded episode from its own files: springs as lines, nodes as dots (pinned and',
    'driven nodes in red), one framing fitted to the whole episode, and a bar that shows time.',
    '',
    '  --episode ID   the episode, e.g. ep-000003 (see `pliant inspect DATASET`)',
    '  --out FILE     write a looping GIF',
    '  --frames DIR   write frame-00000.png, frame-00001.png, … into DIR',
    '  --view         side (x right, y up), above (x right, z down) or both side by side; default both',
    '  --size WxH     picture size in pixels; default 640x320',
    '  --speed S      GIF playback speed, 1 = real time (default)',
    '  --every K      draw every K-th recorded frame; default: as few as keep GIF delays at 0.02 s or more',
  ].join('\n'),
  async run(args, io) {
    const parsed = parseArguments('render', args, { valued: ['--episode', '--out', '--frames', '--view', '--size', '--speed', '--every'], switches: [] });
    if (parsed.positionals.length !== 1) throw new CliUsageError('give exactly one dataset folder: pliant render DATASET --episode ID --out FILE.gif');
    const episodeId = parsed.values.get('--episode');
    if (!episodeId) throw new CliUsageError('say which episode to draw: --episode ep-000000 (ids are listed by `pliant inspect`)');
    const out = parsed.values.get('--out');
    const framesDir = parsed.values.get('--frames');
    if ((out === undefined) === (framesDir === undefined)) throw new CliUsageError('give one of --out FILE.gif (an animation) or --frames DIR (a PNG sequence)');
    if (out !== undefined && !out.toLowerCase().endsWith('.gif')) throw new CliUsageError(`--out ${out} should end in .gif; for PNG pictures use --frames DIR`);
    const viewText = parsed.values.get('--view') ?? 'both';
    if (!VIEWS.includes(viewText as PictureView)) throw new CliUsageError(`--view "${viewText}" is not one of ${VIEWS.join(', ')}`);
    const { widthPx, heightPx } = sizeOption(parsed.values.get('--size') ?? '640x320');
    const speed = speedOption(parsed.values.get('--speed') ?? '1');
    const everyText = parsed.values.get('--every');
    const frameStride = everyText === undefined ? 'auto' as const : wholeNumberOption('--every', everyText, 1, 1_000_000);

    const dir = resolve(io.cwd, parsed.positionals[0]);
    const rendered = await withCliFailures('', async () => renderEpisode(dir, episodeId, { view: viewText as PictureView, widthPx, heightPx, speed, frameStride }));
    if (out !== undefined) {
      const bytes = renderedGif(rendered, speed);
      await withCliFailures('', async () => writeFileAtomic(resolve(io.cwd, out), bytes));
      io.stdout(`${out}: ${rendered.frames.length} frames of ${episodeId} (${rendered.strideUsed === 1 ? 'every recorded frame' : `one recorded frame in ${rendered.strideUsed}`}), ${widthPx}×${heightPx} px, ${bytes.length} bytes\n`);
    } else {
      const target = resolve(io.cwd, framesDir!);
      await withCliFailures('', async () => {
        await mkdir(target, { recursive: true });
        const pngs = renderedPngs(rendered);
        for (let i = 0; i < pngs.length; i++) await writeFileAtomic(join(target, `frame-${String(i).padStart(5, '0')}.png`), pngs[i]);
      });
      io.stdout(`${framesDir}: ${rendered.frames.length} PNG pictures of ${episodeId}, ${widthPx}×${heightPx} px\n`);
    }
    return 0;
  },
};
