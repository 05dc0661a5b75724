// The app's render job (render.begin): an episode saved from the Datasets screen's request as a
// GIF or as PNG frames decodes in Pillow (Debian's python3-pil, a reference decoder) to the frame
// count and size asked for, and the GIF is byte for byte the one `pliant render` writes for the
// same episode. Targets outside the folders chosen for writing, files already there and unknown
// episodes are refused in the app's words.
import { existsSync, mkdtempSync, readdirSync, readFileSync, realpathSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import type { RenderJobMessage } from '../sim/render/render-job.ts';
import { runRenderJob } from '../sim/render/render-job.ts';
import type { AppSession } from './support/app-flow-session.ts';
import { cutDownScenario, runPliant, startDesktopSession } from './support/app-flow-session.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

const python = referencePythonAvailability();
const RECORDED_STEPS = 40;

/** Pillow's view of a GIF: size, frame count and per-frame delays (ms). */
const READ_GIF_WITH_PILLOW = `
import sys, json
from PIL import Image
image = Image.open(json.load(sys.stdin))
durations = []
for i in range(image.n_frames):
    image.seek(i)
    durations.append(image.info.get('duration'))
print(json.dumps({'format': image.format, 'size': list(image.size), 'frames': image.n_frames, 'durations': durations}))
`;

interface GifSeen {
  format: string;
  size: number[];
  frames: number;
  durations: number[];
}

describe.runIf(python.available)('render.begin: saving an episode as pictures', () => {
  let work: string;
  let dataset: string;
  let outside: string;
  let session: AppSession;

  beforeAll(async () => {
    work = realpathSync(mkdtempSync(join(tmpdir(), 'pliant-app-render-')));
    outside = realpathSync(mkdtempSync(join(tmpdir(), 'pliant-app-render-outside-')));
    dataset = join(work, 'tether');
    writeFileSync(join(work, 'tether.json'), cutDownScenario('korrin-tether.json', 2, RECORDED_STEPS));
    const made = runPliant(['generate', join(work, 'tether.json'), '--out', dataset, '--workers', '1', '--progress', 'none']);
    if (made.status !== 0) throw new Error(`pliant generate failed (${made.status}): ${made.stderr}`);
    session = await startDesktopSession();
    await session.choose(work);
  }, 300_000);

  afterAll(() => {
    rmSync(work, { recursive: true, force: true });
    rmSync(outside, { recursive: true, force: true });
  });

  it('writes a GIF Pillow decodes to one frame per recorded step at 640×320, identical to `pliant render`', async () => {
    const gifPath = join(work, 'ep-000001.gif');
    const events = await session.runJob(() => session.call('render.begin', { datasetPath: dataset, episodeId: 'ep-000001', output: 'gif', outPath: gifPath }));
    const last = events[events.length - 1];
    expect(last.state, last.message).toBe('done');
    expect(last.kind).toBe('render');
    // Recorded steps every 0.02 s (korrin-tether.json) give RECORDED_STEPS + 1 frames; the 0.02 s
    // floor on GIF delays (common practice, no source) keeps every one at real speed.
    expect(last.done).toBe(RECORDED_STEPS + 1);
    expect(last.total).toBe(RECORDED_STEPS + 1);
    const seen = runReferencePython<GifSeen>(READ_GIF_WITH_PILLOW, gifPath);
    expect(seen.format).toBe('GIF');
    expect(seen.size).toEqual([640, 320]);
    expect(seen.frames).toBe(RECORDED_STEPS + 1);
    expect(seen.durations.slice(0, RECORDED_STEPS).every((d) => d === 20)).toBe(true);
    const bytes = readFileSync(gifPath);
    expect(last.message).toContain(gifPath);
    expect(last.message).toContain(`${bytes.length} bytes`);

    const cliGif = join(work, 'from-cli.gif');
    const cli = runPliant(['render', dataset, '--episode', 'ep-000001', '--out', cliGif]);
    expect(cli.status, cli.stderr).toBe(0);
    expect(Buffer.compare(bytes, readFileSync(cliGif))).toBe(0);
  }, 300_000);

  it('writes PNG frames into a new folder, as many as the GIF has, each decoding at the size asked for', async () => {
    const framesDir = join(work, 'ep-000000-frames');
    const events = await session.runJob(() =>
      session.call('render.begin', { datasetPath: dataset, episodeId: 'ep-000000', output: 'frames', outPath: framesDir, view: 'side', widthPx: 200, heightPx: 120 }),
    );
    const last = events[events.length - 1];
    expect(last.state, last.message).toBe('done');
    const names = readdirSync(framesDir).sort();
    expect(names.length).toBe(RECORDED_STEPS + 1);
    expect(names[0]).toBe('frame-00000.png');
    expect(names[names.length - 1]).toBe(`frame-${String(RECORDED_STEPS).padStart(5, '0')}.png`);
    const sizes = runReferencePython<{ format: string; size: number[] }[]>(
      'import sys, json, os\nfrom PIL import Image\nd = json.load(sys.stdin)\nout = []\nfor n in sorted(os.listdir(d)):\n    im = Image.open(os.path.join(d, n)); im.load()\n    out.append({"format": im.format, "size": list(im.size)})\nprint(json.dumps(out))',
      framesDir,
    );
    expect(sizes.every((s) => s.format === 'PNG' && s.size[0] === 200 && s.size[1] === 120)).toBe(true);
  }, 300_000);

  it('refuses an output outside the folders chosen in this session, before any job starts', async () => {
    const refused = await session.refusal('render.begin', { datasetPath: dataset, episodeId: 'ep-000000', output: 'gif', outPath: join(outside, 'escape.gif') });
    expect(refused.code).toBe('path-refused');
    expect(refused.message).toContain('outside the folders chosen');
    expect(existsSync(join(outside, 'escape.gif'))).toBe(false);
  });

  it('never replaces a file already there, asks for .gif and keeps sizes within bounds', async () => {
    const taken = join(work, 'taken.gif');
    writeFileSync(taken, 'keep me');
    const refused = await session.refusal('render.begin', { datasetPath: dataset, episodeId: 'ep-000000', output: 'gif', outPath: taken });
    expect(refused.code).toBe('already-exists');
    expect(readFileSync(taken, 'utf8')).toBe('keep me');
    const wrongName = await session.refusal('render.begin', { datasetPath: dataset, episodeId: 'ep-000000', output: 'gif', outPath: join(work, 'picture.png') });
    expect(wrongName.code).toBe('invalid-arguments');
    expect(wrongName.message).toContain('.gif');
    // The same picture-size bounds as `pliant render --size` (32 to 4096 pixels a side).
    const huge = await session.refusal('render.begin', { datasetPath: dataset, episodeId: 'ep-000000', output: 'gif', outPath: join(work, 'huge.gif'), widthPx: 4097 });
    expect(huge.code).toBe('invalid-arguments');
  });

  it('an unknown episode ends the job with the app\'s words, no command-line flags, and writes nothing', async () => {
    const gifPath = join(work, 'nobody.gif');
    const events = await session.runJob(() => session.call('render.begin', { datasetPath: dataset, episodeId: 'ep-999999', output: 'gif', outPath: gifPath }));
    const last = events[events.length - 1];
    expect(last.state).toBe('failed');
    expect(last.message).toContain('ep-999999');
    expect(last.message).not.toMatch(/--|pliant /);
    expect(existsSync(gifPath)).toBe(false);
  }, 120_000);

  it('a render job cancelled while drawing says how far it got and writes no GIF', async () => {
    const gifPath = join(work, 'cancelled.gif');
    const messages: RenderJobMessage[] = [];
    let asked = 0;
    // Cancelled once the tenth picture is drawn: the job stops before the eleventh.
    await runRenderJob(
      { kind: 'render', datasetDir: dataset, episodeId: 'ep-000000', output: 'gif', outPath: gifPath, view: 'both', widthPx: 64, heightPx: 32, speed: 1 },
      (m) => messages.push(m),
      () => ++asked >= 10,
    );
    expect(messages[messages.length - 1]).toEqual({ type: 'cancelled', done: 10, total: RECORDED_STEPS + 1 });
    expect(existsSync(gifPath)).toBe(false);
  });
});
