// `pliant render`: an episode's GIF and PNG pictures decode in Pillow (Debian's python3-pil, a
// reference decoder) to the frame count, size and timing asked for; the PNG writer's CRC-32
// matches the published check value and Python's zlib.crc32; the hanging tether's pinned top
// is drawn at the top of the side view. Bad requests exit 2 with a message.
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { runCli } from '../sim/cli/main.ts';
import { crc32 } from '../sim/render/crc32.ts';
import { checkScenarioText } from '../sim/scenario/check-scenario.ts';
import { withOverrides } from '../sim/scenario/scenario-overrides.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

const ROOT = resolve(import.meta.dirname, '..');
const python = referencePythonAvailability();
const work = mkdtempSync(join(tmpdir(), 'pliant-render-'));
const dataset = join(work, 'tether');
afterAll(() => rmSync(work, { recursive: true, force: true }));

async function cli(args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  let stdout = '';
  let stderr = '';
  const code = await runCli(args, { stdout: (t) => void (stdout += t), stderr: (t) => void (stderr += t), isTerminal: false, env: {}, cwd: work });
  return { code, stdout, stderr };
}

beforeAll(async () => {
  const checked = checkScenarioText(readFileSync(join(ROOT, 'scenarios/korrin-tether.json'), 'utf8'), 'korrin-tether.json');
  if (!checked.ok) throw new Error(JSON.stringify(checked.problems));
  writeFileSync(join(work, 'tether.json'), JSON.stringify(withOverrides(checked.scenario, { episodes: 2 }), null, 2));
  const made = await cli(['generate', 'tether.json', '--out', dataset, '--workers', '1']);
  expect(made.code, made.stderr).toBe(0);
});

describe('CRC-32 of PNG chunks', () => {
  it('gives the published check value of "123456789" (CRC-32/ISO-HDLC, 0xCBF43926; Greg Cook, Catalogue of parametrised CRC algorithms)', () => {
    expect(crc32(new TextEncoder().encode('123456789'))).toBe(0xcbf43926);
  });
  it.runIf(python.available)('equals Python zlib.crc32 on arbitrary bytes, also when continued piece by piece', () => {
    const bytes = Uint8Array.from({ length: 3001 }, (_, i) => (i * 7919 + 13) % 256);
    const want = runReferencePython<number>('import sys, json, zlib\nprint(zlib.crc32(bytes(json.load(sys.stdin))))', Array.from(bytes));
    expect(crc32(bytes)).toBe(want);
    expect(crc32(bytes.subarray(1000), crc32(bytes.subarray(0, 1000)))).toBe(want);
  });
});

describe.runIf(python.available)('pliant render (decoded with Pillow)', () => {
  it('writes a looping GIF with one picture per 0.02 s of the episode at real speed', async () => {
    const result = await cli(['render', dataset, '--episode', 'ep-000000', '--out', 'tether.gif', '--size', '320x160']);
    expect(result.stderr).toBe('');
    expect(result.code).toBe(0);
    const gif = runReferencePython<{ size: number[]; frames: number; durations: number[]; loop: number }>(`
import sys, json
from PIL import Image
path = json.load(sys.stdin)
image = Image.open(path)
durations = []
for i in range(image.n_frames):
    image.seek(i)
    durations.append(image.info.get('duration'))
print(json.dumps({'size': list(image.size), 'frames': image.n_frames, 'durations': durations, 'loop': image.info.get('loop')}))
`, join(work, 'tether.gif'));
    // 150 recorded steps every 0.02 s give 151 frames; the 0.02 s floor keeps every one.
    expect(gif.size).toEqual([320, 160]);
    expect(gif.frames).toBe(151);
    expect(gif.durations.slice(0, 150).every((d) => d === 20)).toBe(true);
    expect(gif.loop).toBe(0); // 0 = loop for ever (GIF89a NETSCAPE2.0 extension)
  });

  it('at double speed keeps every other frame and the same 0.02 s delay', async () => {
    const result = await cli(['render', dataset, '--episode', 'ep-000001', '--out', 'fast.gif', '--speed', '2', '--view', 'side']);
    expect(result.code, result.stderr).toBe(0);
    const frames = runReferencePython<number>('import sys, json\nfrom PIL import Image\nprint(Image.open(json.load(sys.stdin)).n_frames)', join(work, 'fast.gif'));
    expect(frames).toBe(76); // frames 0, 2, …, 150
  });

  it('writes a PNG sequence whose first picture shows the pinned top at the top of the side view', async () => {
    const result = await cli(['render', dataset, '--episode', 'ep-000000', '--frames', 'pictures', '--every', '50', '--view', 'side', '--size', '200x300']);
    expect(result.code, result.stderr).toBe(0);
    const names = readdirSync(join(work, 'pictures')).sort();
    expect(names).toEqual(['frame-00000.png', 'frame-00001.png', 'frame-00002.png', 'frame-00003.png']);
    const first = runReferencePython<{ size: number[]; redRows: number[]; darkRows: number[] }>(`
import sys, json
from PIL import Image
image = Image.open(json.load(sys.stdin)).convert('RGB')
w, h = image.size
red, dark = [], []
for y in range(h):
    for x in range(w):
        p = image.getpixel((x, y))
        if p == (200, 62, 48): red.append(y)
        if p == (28, 36, 48): dark.append(y)
print(json.dumps({'size': [w, h], 'redRows': red, 'darkRows': dark}))
`, join(work, 'pictures', 'frame-00000.png'));
    expect(first.size).toEqual([200, 300]);
    expect(first.redRows.length).toBeGreaterThan(0);
    expect(first.darkRows.length).toBeGreaterThan(0);
    // The pinned top node hangs above every other node of the tether.
    expect(Math.max(...first.redRows)).toBeLessThan(Math.min(...first.darkRows) + 3);
  });

  it('refuses what it cannot do with exit 2 and a message', async () => {
    const missing = await cli(['render', dataset, '--episode', 'ep-999999', '--out', 'x.gif']);
    expect(missing.code).toBe(2);
    expect(missing.stderr).toContain('ep-999999');
    expect(missing.stderr).not.toMatch(/\n\s+at /);
    expect((await cli(['render', dataset, '--episode', 'ep-000000', '--out', 'x.png'])).stderr).toContain('--frames DIR');
    expect((await cli(['render', dataset, '--episode', 'ep-000000', '--out', 'x.gif', '--size', '10x10'])).code).toBe(2);
    expect((await cli(['render', dataset, '--out', 'x.gif'])).stderr).toContain('--episode');
  });
});
