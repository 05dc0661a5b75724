// The episode table of a dataset as the app pages through it: one row per manifest record (id,
// split, status and its scalar labels), sorted by any column, filtered by split, text and numeric ranges, and cut
// into pages. Built once per manifest from the records alone, so listing never opens a data file;
// each column's sort order is computed the first time it is asked for and kept, so turning pages
// of a large dataset costs a filter pass, not a sort.
import { PliantError } from '../../errors/pliant-error.ts';
import type { EpisodeRecord } from '../manifest/dataset-manifest.ts';

export type ScalarLabel = number | string | boolean;

export interface ListedEpisode {
  id: string;
  index: number;
  split: string;
  status: 'ok' | 'rejected';
  /** Scalar labels keyed by JSON pointer, plus `status`; list-valued labels are left out (they have no order). */
  labels: Record<string, ScalarLabel>;
}

export interface EpisodeListQuery {
  offset: number;
  limit: number;
  sortKey?: string;
  descending?: boolean;
  filter?: { split?: string; text?: string; ranges?: readonly LabelRange[] };
}

/** Keeps rows whose numeric label `key` lies in [min, max] (either end may be left open); a row without a number there is left out. */
export interface LabelRange {
  key: string;
  min?: number;
  max?: number;
}

export interface EpisodeListPage {
  /** Rows matching the filter, before offset and limit. */
  total: number;
  offset: number;
  rows: ListedEpisode[];
}

/** Columns every dataset has besides its labels. */
export const FIXED_SORT_KEYS = ['episodeId', 'split', 'status'] as const;

/** A sort key the dataset has no column for; the message names the columns it does have. */
export class UnknownSortKeyError extends PliantError {
  constructor(key: string, known: readonly string[]) {
    const shownKeys = known.length > 12 ? `${known.slice(0, 12).join(', ')} and ${known.length - 12} more label keys` : known.join(', ');
    super('user', 'unknown-sort-key', `this dataset has no column "${key}" to sort by; use one of ${shownKeys}`);
    this.name = 'UnknownSortKeyError';
  }
}

export class EpisodeListing {
  readonly rows: readonly ListedEpisode[];
  /** Scalar label keys whose value differs between episodes, in first-seen order: the columns worth showing. */
  readonly labelKeys: readonly string[];
  /** Every key `page` can sort by. */
  readonly sortKeys: readonly string[];
  private readonly sortKeySet: Set<string>;
  private readonly orders = new Map<string, Int32Array>();

  constructor(episodes: readonly EpisodeRecord[]) {
    const rows: ListedEpisode[] = [];
    const firstValue = new Map<string, ScalarLabel>();
    const varying = new Set<string>();
    const seen: string[] = [];
    for (const episode of episodes) {
      const labels: Record<string, ScalarLabel> = {};
      for (const [key, value] of Object.entries(episode.labels)) {
        if (typeof value !== 'number' && typeof value !== 'string' && typeof value !== 'boolean') continue;
        labels[key] = value;
        if (!firstValue.has(key)) {
          firstValue.set(key, value);
          seen.push(key);
          // A key missing from earlier episodes already differs from them.
          if (rows.length > 0) varying.add(key);
        } else if (firstValue.get(key) !== value) {
          varying.add(key);
        }
      }
      for (const key of seen) if (!(key in labels)) varying.add(key);
      labels.status = episode.status;
      rows.push({ id: episode.id, index: episode.index, split: episode.split, status: episode.status, labels });
    }
    this.rows = rows;
    // With a single episode nothing varies, and an empty table would hide what it has.
    this.labelKeys = rows.length <= 1 ? seen : seen.filter((key) => varying.has(key));
    this.sortKeys = [...FIXED_SORT_KEYS, ...seen];
    this.sortKeySet = new Set(this.sortKeys);
  }

  page(query: EpisodeListQuery): EpisodeListPage {
    const order = this.orderBy(query.sortKey ?? 'episodeId');
    const split = query.filter?.split;
    const text = query.filter?.text?.trim().toLowerCase() ?? '';
    const ranges = query.filter?.ranges ?? [];
    const matches = (row: ListedEpisode): boolean => (split === undefined || row.split === split) && (text === '' || rowHasText(row, text)) && ranges.every((r) => inRange(row.labels[r.key], r));
    const picked: ListedEpisode[] = [];
    let total = 0;
    const count = order.length;
    for (let k = 0; k < count; k += 1) {
      const row = this.rows[order[query.descending === true ? count - 1 - k : k]];
      if (!matches(row)) continue;
      if (total >= query.offset && picked.length < query.limit) picked.push(row);
      total += 1;
    }
    return { total, offset: query.offset, rows: picked };
  }

  /** Row positions in ascending order of `key` (ties by index, episodes without the key last); descending pages read it backwards. */
  private orderBy(key: string): Int32Array {
    const cached = this.orders.get(key);
    if (cached) return cached;
    if (!this.sortKeySet.has(key)) throw new UnknownSortKeyError(key, this.sortKeys);
    const rows = this.rows;
    const value = (row: ListedEpisode): ScalarLabel | undefined =>
      key === 'episodeId' ? row.index : key === 'split' ? row.split : key === 'status' ? row.status : row.labels[key];
    const order = Int32Array.from(rows.keys());
    order.sort((a, b) => compareLabels(value(rows[a]), value(rows[b])) || rows[a].index - rows[b].index);
    this.orders.set(key, order);
    return order;
  }
}

function inRange(value: ScalarLabel | undefined, range: LabelRange): boolean {
  if (typeof value !== 'number') return false;
  return (range.min === undefined || value >= range.min) && (range.max === undefined || value <= range.max);
}

function rowHasText(row: ListedEpisode, lowerText: string): boolean {
  if (row.id.toLowerCase().includes(lowerText)) return true;
  for (const value of Object.values(row.labels)) {
    if (typeof value === 'string' && value.toLowerCase().includes(lowerText)) return true;
  }
  return false;
}

const TYPE_RANK = { number: 0, string: 1, boolean: 2 } as const;

/** Numbers by value, text by code point, false before true; a missing value after everything. */
function compareLabels(a: ScalarLabel | undefined, b: ScalarLabel | undefined): number {
  if (a === undefined || b === undefined) return a === b ? 0 : a === undefined ? 1 : -1;
  const ta = typeof a as keyof typeof TYPE_RANK;
  const tb = typeof b as keyof typeof TYPE_RANK;
  if (ta !== tb) return TYPE_RANK[ta] - TYPE_RANK[tb];
  if (a === b) return 0;
  return a < b ? -1 : 1;
}
