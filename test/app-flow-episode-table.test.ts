// The episode table behind dataset.episodes (sim/dataset/read/episode-listing.ts): sorting, filtering
// and paging of manifest records, checked against Debian Python's sorted() with the ordering the
// contract states (numbers, then text, then booleans, missing values last, ties by episode index;
// descending reverses the whole order) and Python's str.lower() for the case-insensitive text
// filter. The records are invented Korrin Bay eel-swimmer episodes, made up for this test only.
import { describe, expect, it } from 'vitest';

import type { EpisodeRecord } from '../sim/dataset/manifest/dataset-manifest.ts';
import type { EpisodeListQuery } from '../sim/dataset/read/episode-listing.ts';
import { EpisodeListing, UnknownSortKeyError } from '../sim/dataset/read/episode-listing.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

const python = referencePythonAvailability();

type Labels = Record<string, number | string | boolean | number[]>;

function record(index: number, split: string, status: 'ok' | 'rejected', labels: Labels): EpisodeRecord {
  return { id: `ep-${String(index).padStart(6, '0')}`, index, split, status, labels } as unknown as EpisodeRecord;
}

/** A few thousand eel episodes with ties, gaps, mixed types and list-valued labels (made-up values). */
function eelEpisodes(count: number): EpisodeRecord[] {
  const splits = ['train', 'train', 'train', 'validation', 'test', 'held-out'];
  return Array.from({ length: count }, (_, i) => {
    const labels: Labels = {
      '/system/segmentCount': 6 + ((i * 7) % 11),
      '/world/fluid/normalDragNsPerM3': Math.round((800 + ((i * 37) % 997) * 0.8) * 1000) / 1000,
      '/controls/tail/kind': i % 3 === 0 ? 'Band-Limited' : 'sine',
      '/controls/tail/componentFrequenciesHz': [0.5, 1.0],
      '/world/tankDepthM': 2.75,
    };
    if (i % 4 !== 1) labels['/controls/tail/amplitudeM'] = Math.round(((i * 13) % 29) * 10) / 1000;
    labels['/system/finTag'] = i % 5 === 0 ? `KB-${i % 17}` : i % 5 === 1 ? 3 : i % 5 === 2 ? true : i % 5 === 3 ? false : 'kb-fin';
    return record(i, splits[(i * 5) % splits.length], i % 23 === 7 ? 'rejected' : 'ok', labels);
  });
}

const PYTHON_PAGE = `import json, sys
d = json.load(sys.stdin)
rank = lambda v: 0 if isinstance(v, bool) is False and isinstance(v, (int, float)) else (1 if isinstance(v, str) else 2)
def value(e, key):
    if key == "episodeId": return e["index"]
    if key in ("split", "status"): return e[key]
    return e["labels"].get(key)
def sort_key(e, key):
    v = value(e, key)
    if v is None or isinstance(v, list): return (1, 0, 0, e["index"])
    return (0, rank(v), v, e["index"])
out = []
for q in d["queries"]:
    rows = d["episodes"]
    f = q.get("filter", {})
    if "split" in f: rows = [e for e in rows if e["split"] == f["split"]]
    t = f.get("text", "").strip().lower()
    if t: rows = [e for e in rows if t in e["id"].lower() or t in e["status"] or any(isinstance(v, str) and t in v.lower() for v in e["labels"].values())]
    for r in f.get("ranges", []):
        num = lambda v: isinstance(v, (int, float)) and not isinstance(v, bool)
        rows = [e for e in rows if num(e["labels"].get(r["key"])) and ("min" not in r or e["labels"][r["key"]] >= r["min"]) and ("max" not in r or e["labels"][r["key"]] <= r["max"])]
    rows = sorted(rows, key=lambda e: sort_key(e, q.get("sortKey", "episodeId")))
    if q.get("descending"): rows = rows[::-1]
    out.append({"total": len(rows), "ids": [e["id"] for e in rows[q["offset"]:q["offset"] + q["limit"]]]})
print(json.dumps(out))`;

describe.runIf(python.available)('episode table: sort, filter and page like Python sorted()', () => {
  const episodes = eelEpisodes(2400);
  const listing = new EpisodeListing(episodes);

  it('orders every column the way Python does, in both directions, across pages', () => {
    const queries: EpisodeListQuery[] = [];
    for (const sortKey of ['episodeId', 'split', 'status', '/system/segmentCount', '/world/fluid/normalDragNsPerM3', '/controls/tail/amplitudeM', '/system/finTag', '/controls/tail/kind']) {
      for (const descending of [false, true]) {
        queries.push({ offset: 0, limit: 1000, sortKey, descending });
        queries.push({ offset: 1000, limit: 1000, sortKey, descending });
        queries.push({ offset: 2000, limit: 1000, sortKey, descending });
      }
    }
    const want = runReferencePython<{ total: number; ids: string[] }[]>(PYTHON_PAGE, { episodes, queries });
    queries.forEach((query, q) => {
      const page = listing.page(query);
      expect({ total: page.total, ids: page.rows.map((r) => r.id) }, JSON.stringify(query)).toEqual(want[q]);
    });
  });

  it('filters by any split name, by text (case-insensitively) and by numeric ranges, before paging', () => {
    const queries: EpisodeListQuery[] = [
      { offset: 0, limit: 50, filter: { split: 'held-out' } },
      { offset: 37, limit: 20, sortKey: '/system/segmentCount', filter: { split: 'validation' } },
      { offset: 0, limit: 1000, filter: { text: 'band-limited' } },
      { offset: 5, limit: 30, filter: { text: 'KB-1' }, sortKey: '/system/finTag', descending: true },
      { offset: 0, limit: 100, filter: { text: 'EP-0012' } },
      { offset: 0, limit: 100, filter: { text: 'rejected', split: 'train' } },
      { offset: 0, limit: 10, filter: { split: 'no-such-split' } },
      // Numeric ranges: closed, open at either end, two at once, on a column of numbers and text (text values never match).
      { offset: 0, limit: 1000, filter: { ranges: [{ key: '/system/segmentCount', min: 5, max: 7 }] } },
      { offset: 10, limit: 40, sortKey: '/controls/tail/amplitudeM', filter: { ranges: [{ key: '/controls/tail/amplitudeM', min: 0.01 }] } },
      { offset: 0, limit: 1000, filter: { split: 'train', ranges: [{ key: '/world/fluid/normalDragNsPerM3', max: 900 }, { key: '/system/segmentCount', min: 6 }] } },
      { offset: 0, limit: 10, filter: { ranges: [{ key: '/system/finTag', min: 0 }] } },
    ];
    const want = runReferencePython<{ total: number; ids: string[] }[]>(PYTHON_PAGE, { episodes, queries });
    queries.forEach((query, q) => {
      const page = listing.page(query);
      expect({ total: page.total, ids: page.rows.map((r) => r.id) }, JSON.stringify(query)).toEqual(want[q]);
      expect(page.offset).toBe(query.offset);
    });
    expect(want[0].total).toBeGreaterThan(0);
    expect(want[5].total).toBeGreaterThan(0);
    // The ranges keep some episodes and leave some out, or they would check nothing.
    for (const q of [7, 8, 9]) expect(want[q].total, JSON.stringify(queries[q])).toBeGreaterThan(0);
    expect(want[7].total).toBeLessThan(episodes.length);
    expect(want[10].total).toBeLessThan(episodes.length);
  });

  it('shows the labels that vary as columns; constants and list-valued labels stay out of rows and columns', () => {
    expect(listing.labelKeys).toEqual(['/system/segmentCount', '/world/fluid/normalDragNsPerM3', '/controls/tail/kind', '/controls/tail/amplitudeM', '/system/finTag']);
    const row = listing.page({ offset: 0, limit: 1 }).rows[0];
    expect(row.labels).toEqual({
      '/system/segmentCount': 6,
      '/world/fluid/normalDragNsPerM3': 800,
      '/controls/tail/kind': 'Band-Limited',
      '/world/tankDepthM': 2.75,
      '/controls/tail/amplitudeM': 0,
      '/system/finTag': 'KB-0',
      status: 'ok',
    });
    // Constant labels can still be sorted by; a single episode shows all its scalar labels.
    expect(listing.sortKeys).toContain('/world/tankDepthM');
    expect(new EpisodeListing(episodes.slice(0, 1)).labelKeys).toContain('/world/tankDepthM');
  });

  it('refuses a sort key the dataset has no column for', () => {
    expect(() => listing.page({ offset: 0, limit: 5, sortKey: '/controls/tail/componentFrequenciesHz' })).toThrow(UnknownSortKeyError);
    expect(() => listing.page({ offset: 0, limit: 5, sortKey: '/system/partCount' })).toThrow(/no column "\/system\/partCount"/);
  });
});
