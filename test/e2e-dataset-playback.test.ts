// Playback on the Datasets screen reads an episode from the arrays the bridge delivers
// (dataset.episodeArrays: base64 of little-endian C-order bytes, by name). Here the arrays come
// from Debian's NumPy (/usr/bin/python3) reading NPZ files that `pliant generate` wrote — the
// encoding the contract names, produced by the reference library — and the playable episode
// the screen builds from them must hold exactly what NumPy found.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { playableEpisode } from '../renderer/datasets/episode-playback.ts';
import { surfaceQuads } from '../renderer/view/body-topology.ts';
import type { EncodedArray, EpisodeArrays } from '../sim/bridge/bridge-contract.ts';
import { REPO_ROOT, SCENARIOS_DIR } from './support/e2e-web-app.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

const python = referencePythonAvailability();

const ENCODE_WITH_NUMPY = [
  'import base64, json, sys, numpy',
  'path = json.load(sys.stdin)',
  'out = []',
  'with numpy.load(path) as z:',
  '    for name in z.files:',
  '        a = numpy.ascontiguousarray(z[name])',
  '        little = a.astype(a.dtype.newbyteorder("<"), copy=False)',
  '        out.append({"name": name, "dtype": str(a.dtype), "shape": list(a.shape), "unit": "", "base64": base64.b64encode(little.tobytes()).decode("ascii"),',
  '                    "first": a.ravel()[:12].astype(numpy.float64).tolist(), "last": a.ravel()[-12:].astype(numpy.float64).tolist()})',
  'print(json.dumps(out))',
].join('\n');

type NumpyArray = EncodedArray & { first: number[]; last: number[] };

describe.runIf(python.available)('an exported episode as the Datasets screen plays it', () => {
  let folder: string;

  beforeAll(() => {
    folder = mkdtempSync(join(tmpdir(), 'pliant-e2e-playback-'));
    for (const demo of ['korrin-tether', 'korrin-fin']) {
      const cli = spawnSync(
        process.execPath,
        [join(REPO_ROOT, 'sim/cli/pliant-launcher.mjs'), 'generate', join(SCENARIOS_DIR, `${demo}.json`), '--out', join(folder, demo), '--episodes', '1', '--workers', '1', '--format', 'npz', '--progress', 'none'],
        { encoding: 'utf8', timeout: 240_000 },
      );
      if (cli.status !== 0) throw new Error(`pliant generate ${demo} failed (${cli.status}): ${cli.stderr}`);
    }
  });

  afterAll(() => rmSync(folder, { recursive: true, force: true }));

  function episodeFromNumpy(demo: string): { arrays: Map<string, NumpyArray>; episode: ReturnType<typeof playableEpisode> } {
    const encoded = runReferencePython<NumpyArray[]>(ENCODE_WITH_NUMPY, join(folder, demo, 'episodes', 'ep-000000.npz'));
    // Playback builds the episode from its arrays alone; channel names come from the manifest.
    const delivered: EpisodeArrays = { episodeId: 'ep-000000', arrays: encoded.map(({ first: _f, last: _l, ...array }) => array), controlChannels: [] };
    return { arrays: new Map(encoded.map((a) => [a.name, a])), episode: playableEpisode(delivered) };
  }

  it('the tether: nodes, springs, frames and their positions as NumPy reads them', () => {
    const { arrays, episode } = episodeFromNumpy('korrin-tether');
    const positions = arrays.get('positions')!;
    const [frames, nodes] = positions.shape;
    expect(episode.topology.nodeCount).toBe(nodes);
    expect(episode.frames.frameCount).toBe(frames);
    expect(episode.topology.springCount).toBe(arrays.get('edges')!.shape[0]);
    expect(episode.topology.cellCount).toBe(0);
    const shown = episode.frames.positionsM;
    expect(Array.from(shown.subarray(0, 12))).toEqual(positions.first);
    expect(Array.from(shown.subarray(shown.length - 12))).toEqual(positions.last);
    // Record interval of the tether demo (scenarios/korrin-tether.json: 0.02 s).
    expect(episode.frameIntervalS).toBeCloseTo(0.02, 12);
    // The driven top of the tether is drawn as a support.
    expect(episode.topology.nodeFixed[0]).toBe(1);
    expect(episode.channelCount).toBe(arrays.get('controls')!.shape[1]);
  });

  it('the fin: cells, their materials and the skin drawn from them', () => {
    const { arrays, episode } = episodeFromNumpy('korrin-fin');
    const cells = arrays.get('cells')!;
    expect(episode.topology.cellCount).toBe(cells.shape[0]);
    expect(episode.topology.cellCornerCount).toBe(cells.shape[1]);
    expect(Array.from(episode.topology.cellCorners.subarray(0, 12))).toEqual(cells.first);
    expect(Array.from(episode.topology.cellMaterial.subarray(0, Math.min(12, cells.shape[0])))).toEqual(arrays.get('cell_material')!.first.slice(0, Math.min(12, cells.shape[0])));
    // Skin faces = 6 per cube less 2 per face two cubes share; NumPy counts the shared faces as
    // the pairs of cells with four corners in common.
    const shared = runReferencePython<number>(
      'import json, sys, itertools, numpy\n' +
        'c = numpy.load(json.load(sys.stdin))["cells"]\n' +
        'print(sum(1 for a, b in itertools.combinations([set(r.tolist()) for r in c], 2) if len(a & b) == 4))',
      join(folder, 'korrin-fin', 'episodes', 'ep-000000.npz'),
    );
    expect(surfaceQuads(episode.topology).quadCount).toBe(6 * cells.shape[0] - 2 * shared);
  });
});
