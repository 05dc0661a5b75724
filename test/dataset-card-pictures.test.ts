// The dataset card's SVG pictures, read back with outside tools: Python's xml.etree.ElementTree
// parses every picture (an XML parser, so a malformed document fails), NumPy recomputes what the
// pictures must show from the folder's own files: the bar heights from numpy.histogram over the
// labels in manifest.json, the scatter points from the same labels, the contact sheet's spring
// segments from the positions numpy.load reads from the episode NPZ files. Pixel coordinates
// are mapped back to values by least-squares lines (numpy.polyfit); the pictures round every
// coordinate to 0.01 px, so a fitted point may be off by at most about 0.005 px (0.01 allowed).
// The contact sheet's pictures state their scale ("1 m = s px"); every drawn end point must sit
// at that scale from the positions in both directions of both views (equal aspect).
// numpy.histogram's bins for bins=8, range=(min, max): equal width, each [low, high) and the
// last one closed (NumPy reference, numpy.histogram). `pliant verify` must pass the folder and
// must catch an edited picture, like any other listed file.
import { appendFileSync, cpSync,mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { runCli } from '../sim/cli/main.ts';
import type { DatasetManifest } from '../sim/dataset/manifest/dataset-manifest.ts';
import { checkScenarioText } from '../sim/scenario/check-scenario.ts';
import { withOverrides } from '../sim/scenario/scenario-overrides.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

const ROOT = resolve(import.meta.dirname, '..');
const python = referencePythonAvailability();
const work = mkdtempSync(join(tmpdir(), 'pliant-card-pictures-'));
const dataset = join(work, 'tether');
const fin = join(work, 'fin');

async function cli(args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  let stdout = '';
  let stderr = '';
  const code = await runCli(args, { stdout: (t) => void (stdout += t), stderr: (t) => void (stderr += t), isTerminal: false, env: {}, cwd: work });
  return { code, stdout, stderr };
}

async function generate(scenarioFile: string, out: string, episodes: number): Promise<void> {
  const checked = checkScenarioText(readFileSync(join(ROOT, 'scenarios', scenarioFile), 'utf8'), scenarioFile);
  if (!checked.ok) throw new Error(JSON.stringify(checked.problems));
  const path = join(work, `${scenarioFile}`);
  writeFileSync(path, JSON.stringify(withOverrides(checked.scenario, { episodes, format: 'npz' })));
  const made = await cli(['generate', path, '--out', out, '--workers', '1']);
  expect(made.stderr).toBe('');
  expect(made.code).toBe(0);
}

function manifestOf(dir: string): DatasetManifest {
  return JSON.parse(readFileSync(join(dir, 'manifest.json'), 'utf8')) as DatasetManifest;
}

beforeAll(async () => {
  // Fourteen tethers: train, validation, test and the held-out split (over 21 parts) all occur.
  await generate('korrin-tether.json', dataset, 14);
  // A few fins: a lattice, whose contact sheet draws cell edges.
  await generate('korrin-fin.json', fin, 3);
}, 600_000);

afterAll(() => rmSync(work, { recursive: true, force: true }));

// Shared by the checks below: parse an SVG strictly and refuse anything active or external.
const PARSE = String.raw`
import json, sys, re, os
import xml.etree.ElementTree as ET
import numpy as np
NS = "{http://www.w3.org/2000/svg}"

def parse(path):
    root = ET.parse(path).getroot()
    assert root.tag == NS + "svg", root.tag
    for el in root.iter():
        tag = el.tag.replace(NS, "")
        assert tag in ("svg", "rect", "text", "line", "g", "path", "circle"), tag
        for name in el.attrib:
            assert "href" not in name and not name.startswith("on"), name
    return root

def cls(root, name):
    return [el for el in root.iter() if el.get("class") == name]

def title_pointer(text):
    return re.sub(r" \([^()]*\)$", "", text)

def fit(pixels, values):
    # Least-squares line pixel = a + b * value and the largest miss.
    b, a = np.polyfit(np.asarray(values, float), np.asarray(pixels, float), 1)
    miss = float(np.max(np.abs(a + b * np.asarray(values, float) - np.asarray(pixels, float))))
    return float(a), float(b), miss
`;

describe.runIf(python.available)('dataset card pictures against NumPy and an XML parser', () => {
  it('lists every picture in the manifest, links it from CARD.md, and passes verify', async () => {
    const m = manifestOf(dataset);
    const pictures = m.documents.map((d) => d.path).filter((p) => p.startsWith('card/'));
    const splits = Object.keys(m.splits).filter((s) => m.splits[s].ok + m.splits[s].rejected > 0);
    expect(splits).toEqual(['train', 'validation', 'test', 'held-out']);
    expect(pictures).toEqual([...splits.map((s) => `card/params-${s}.svg`), 'card/scatter.svg', 'card/episodes.svg']);
    const card = readFileSync(join(dataset, 'CARD.md'), 'utf8');
    for (const p of pictures) expect(card).toContain(`](${p})`);
    const outcome = await cli(['verify', dataset]);
    expect(outcome.stderr).toBe('');
    expect(outcome.code).toBe(0);
  });

  it('verify catches an edited picture', async () => {
    const copy = join(work, 'edited');
    cpSync(dataset, copy, { recursive: true });
    appendFileSync(join(copy, 'card/scatter.svg'), ' ');
    const outcome = await cli(['verify', copy]);
    expect(outcome.code).toBe(1);
    expect(outcome.stderr).toContain('card/scatter.svg');
  });

  it('bar heights are proportional to numpy.histogram counts of each split, held-out range shaded at its value', () => {
    const result = runReferencePython<{ panels: number; worstMiss: number; bandChecked: number; bandMiss: number; problems: string[] }>(PARSE + String.raw`
d = json.load(sys.stdin)["dir"]
m = json.load(open(os.path.join(d, "manifest.json")))
episodes = m["episodes"]
rules = m["scenario"]["splits"]["heldOut"]
problems, worst, panels, band_checked, band_miss = [], 0.0, 0, 0, 0.0
for split, c in m["splits"].items():
    if c["ok"] + c["rejected"] == 0:
        continue
    root = parse(os.path.join(d, "card", f"params-{split}.svg"))
    for panel in cls(root, "panel"):
        pointer = title_pointer(cls(panel, "panel-title")[0].text)
        every = [e["labels"][pointer] for e in episodes if pointer in e["labels"]]
        mine = np.array([e["labels"][pointer] for e in episodes if e["split"] == split and pointer in e["labels"]], float)
        every = np.array(every, float)
        distinct = np.unique(every)
        if len(distinct) <= 8 and np.all(distinct == np.round(distinct)):
            counts = np.array([np.sum(mine == v) for v in distinct])
            centres_values = distinct
        else:
            counts, edges = np.histogram(mine, bins=8, range=(every.min(), every.max()))
            centres_values = (edges[:-1] + edges[1:]) / 2
        bars = cls(panel, "bar")
        if len(bars) != len(counts):
            problems.append(f"{split} {pointer}: {len(bars)} bars, numpy has {len(counts)} bins")
            continue
        heights = np.array([float(b.get("height")) for b in bars])
        k = float(np.dot(heights, counts) / np.dot(counts, counts)) if counts.sum() > 0 else 0.0
        if counts.sum() > 0 and k <= 0:
            problems.append(f"{split} {pointer}: bars not growing with counts")
        worst = max(worst, float(np.max(np.abs(heights - k * counts))))
        bottoms = [float(b.get("y")) + float(b.get("height")) for b in bars]
        if max(bottoms) - min(bottoms) > 0.02:
            problems.append(f"{split} {pointer}: bars do not stand on one axis")
        centres = [float(b.get("x")) + float(b.get("width")) / 2 for b in bars]
        a, b, miss = fit(centres, centres_values)
        worst = max(worst, miss)
        panels += 1
        for rule in [r for r in rules if r["parameter"] == pointer]:
            low = max(rule.get("above", -np.inf), rule.get("inside", [-np.inf])[0])
            bands = cls(panel, "band")
            labels = [t.text for t in cls(panel, "band-label")]
            if len(bands) != 1 or not labels[0].startswith(rule["split"]):
                problems.append(f"{split} {pointer}: band {len(bands)} {labels}")
                continue
            band_checked += 1
            band_miss = max(band_miss, abs(float(bands[0].get("x")) - (a + b * low)))
print(json.dumps({"panels": panels, "worstMiss": worst, "bandChecked": band_checked, "bandMiss": band_miss, "problems": problems}))
`, { dir: dataset });
    expect(result.problems).toEqual([]);
    // Four splits, each with the tether's non-constant scalar labels (at least the eight system and world ones).
    expect(result.panels).toBeGreaterThanOrEqual(4 * 8);
    expect(result.worstMiss).toBeLessThan(0.01);
    // The held-out rule /system/partCount > 21 in every split's partCount panel.
    expect(result.bandChecked).toBe(4);
    expect(result.bandMiss).toBeLessThan(0.02);
  });

  it('the scatter shows the parameters numpy ranks widest and maps every point back to its labels', () => {
    const result = runReferencePython<{ expected: string[]; shownPointers: string[][]; counts: Record<string, number[]>; wantCounts: Record<string, number>; worstMiss: number; problems: string[] }>(PARSE + String.raw`
d = json.load(sys.stdin)["dir"]
m = json.load(open(os.path.join(d, "manifest.json")))
episodes = m["episodes"]
order = []
for e in episodes:
    for k in e["labels"]:
        if k not in order:
            order.append(k)
ranked = []
for i, k in enumerate(order):
    vals = [e["labels"].get(k) for e in episodes]
    if any(isinstance(v, (list, dict, str, bool)) or v is None for v in vals) or k not in episodes[0]["labels"]:
        continue
    if not all(k in e["labels"] for e in episodes):
        continue
    v = np.array(vals, float)
    if np.ptp(v) == 0:
        continue
    ranked.append((-np.std(v) / np.ptp(v), i, k))
ranked.sort()
expected = [k for _, _, k in ranked[:3]]
root = parse(os.path.join(d, "card", "scatter.svg"))
colour_of = {}
for mark, text in zip(cls(root, "legend-mark"), cls(root, "legend")):
    colour_of[mark.get("fill")] = re.sub(r" \(\d+ shown\)$", "", text.text)
problems, shown, counts, worst = [], [], {}, 0.0
want = {}
for split in colour_of.values():
    want[split] = [e for e in episodes if e["split"] == split][:500]
for panel in cls(root, "panel"):
    xp = title_pointer(cls(panel, "x-label")[0].text)
    yp = title_pointer(cls(panel, "y-label")[0].text)
    shown.append([xp, yp])
    points = cls(panel, "point")
    for colour, split in colour_of.items():
        mine = [p for p in points if p.get("fill") == colour]
        counts.setdefault(split, []).append(len(mine))
        rows = want[split]
        if len(mine) != len(rows):
            problems.append(f"{split}: {len(mine)} points, {len(rows)} episodes")
            continue
        xs = [float(p.get("cx")) for p in mine]
        ys = [float(p.get("cy")) for p in mine]
        if len(rows) >= 2:
            for pix, ptr, sign in ((xs, xp, 1), (ys, yp, -1)):
                a, b, miss = fit(pix, [r["labels"][ptr] for r in rows])
                worst = max(worst, miss)
                if np.sign(b) != sign:
                    problems.append(f"{ptr}: axis runs the wrong way")
# The fits above are per split; the axes are one line for all splits together.
for panel in cls(root, "panel"):
    xp = title_pointer(cls(panel, "x-label")[0].text)
    pts = [(float(p.get("cx")), p.get("fill")) for p in cls(panel, "point")]
    allx, allv = [], []
    for colour, split in colour_of.items():
        mine = [x for x, f in pts if f == colour]
        allx += mine
        allv += [r["labels"][xp] for r in want[split]][:len(mine)]
    worst = max(worst, fit(allx, allv)[2])
print(json.dumps({"expected": expected, "shownPointers": shown, "counts": counts, "wantCounts": {s: len(r) for s, r in want.items()}, "worstMiss": worst, "problems": problems}))
`, { dir: dataset });
    expect(result.problems).toEqual([]);
    expect(result.expected.length).toBe(3);
    // Three parameters make three pairs: (a, b), (a, c), (b, c).
    const [a, b, c] = result.expected;
    expect(result.shownPointers).toEqual([[a, b], [a, c], [b, c]]);
    expect(Object.keys(result.counts).sort()).toEqual(['held-out', 'test', 'train', 'validation']);
    for (const [split, perPanel] of Object.entries(result.counts)) expect(perPanel).toEqual([1, 2, 3].map(() => result.wantCounts[split]));
    expect(result.worstMiss).toBeLessThan(0.01);
  });

  for (const [name, dir, relations] of [['tether', dataset, [0]], ['fin', fin, [2]]] as const) {
    it(`the ${name}'s contact sheet draws the springs of numpy.load's first and last frames at one scale`, () => {
      const result = runReferencePython<{ rows: string[]; wantRows: string[]; segments: number[]; worstMiss: number; scaleSpread: number; problems: string[] }>(PARSE + String.raw`
inp = json.load(sys.stdin)
d, relations = inp["dir"], inp["relations"]
m = json.load(open(os.path.join(d, "manifest.json")))
want_rows = []
for split in m["splits"]:
    firsts = [e for e in m["episodes"] if e["split"] == split and e["status"] == "ok"]
    if firsts and len(want_rows) < 4:
        want_rows.append(firsts[0]["id"])
root = parse(os.path.join(d, "card", "episodes.svg"))
problems, rows, segments, worst, spread = [], [], [], 0.0, 0.0
for row in cls(root, "row"):
    label = cls(row, "row-label")[0].text
    ident = label.split(",")[0]
    rows.append(ident)
    stated = float(re.search(r"1 m = ([0-9.]+) px", label).group(1))
    with np.load(os.path.join(d, "episodes", ident + ".npz")) as z:
        pos = z["positions"].astype(float)
        edges = z["edges"]
        rel = z["edge_relation"]
    keep = edges[np.isin(rel, relations)]
    if len(keep) == 0:
        keep = edges
    frames = [pos[0], pos[-1], pos[0], pos[-1]]
    # Above: x across, z down the page; side: x across, y up (pixel y grows downward).
    axes = [(0, 2, 1), (0, 2, 1), (0, 1, -1), (0, 1, -1)]
    scales = []
    for panel, frame, (ua, va, vsign) in zip(cls(row, "panel"), frames, axes):
        d_attr = cls(panel, "edges")[0].get("d")
        nums = np.array([float(t) for t in re.findall(r"-?[0-9.]+", d_attr)]).reshape(-1, 4)
        segments.append(len(nums))
        if len(nums) != len(keep):
            problems.append(f"{ident}: {len(nums)} segments, {len(keep)} springs")
            continue
        us = np.concatenate([frame[keep[:, 0], ua], frame[keep[:, 1], ua]])
        vs = np.concatenate([frame[keep[:, 0], va], frame[keep[:, 1], va]])
        pu = np.concatenate([nums[:, 0], nums[:, 2]])
        pv = np.concatenate([nums[:, 1], nums[:, 3]])
        # At the stated scale, pixel minus scale times coordinate is one number per axis; the
        # rounding of pixels (0.005) and of the stated scale (0.005 px per m) bound its spread.
        for pix, coord, sign in ((pu, us, 1), (pv, vs, vsign)):
            rest = pix - sign * stated * coord
            worst = max(worst, float(np.ptp(rest)) - 0.005 * float(np.ptp(coord)))
        scales.append(stated)
    spread = max(spread, (max(scales) - min(scales)) / max(scales))
print(json.dumps({"rows": rows, "wantRows": want_rows, "segments": segments, "worstMiss": worst, "scaleSpread": spread, "problems": problems}))
`, { dir, relations });
      expect(result.problems).toEqual([]);
      expect(result.rows).toEqual(result.wantRows);
      expect(result.rows.length).toBeGreaterThanOrEqual(name === 'tether' ? 4 : 1);
      expect(result.segments.every((n) => n > 0)).toBe(true);
      expect(result.worstMiss).toBeLessThan(0.01);
      expect(result.scaleSpread).toBeLessThan(1e-3);
    });
  }
});
