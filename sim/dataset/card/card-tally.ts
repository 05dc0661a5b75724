// What the dataset card says about a folder's episodes, gathered one manifest record at a time.
// A sweep's records (each with every sampled label, control-signal frequencies and phases
// included) can take far more memory than the run itself, so the card keeps only what it
// prints: counts, ranges, the first rows of a few tables, the scalar label values its
// histograms need (nothing for a label while it keeps one value, 8 bytes per episode while it
// is a number, and 2 bytes per value for the split it came from, which the SVG pictures count
// by), and one SHA-256 digest per distinct list-valued label.
import type { LabelValue } from '../../scenario/sampled-episode.ts';
import { Sha256Stream } from '../formats/file-digest.ts';
import type { EpisodeRecord, EpisodeRejection, EpisodeSimulation } from '../manifest/dataset-manifest.ts';

/** How many rejected episodes the card lists one by one; the manifest lists them all. */
export const REJECTED_LISTED = 50;

export type ScalarLabel = number | string | boolean | null;

/** The scalar values of one label, in episode order, stored compactly. */
export class ScalarColumn {
  private count = 0;
  private first: ScalarLabel = null;
  private firstText = '';
  /** True while every value has had the first value's JSON text: then nothing else is stored. */
  private uniform = true;
  private numbers: Float64Array | null = null;
  private numberCount = 0;
  private mixed: ScalarLabel[] | null = null;

  push(value: ScalarLabel): void {
    if (this.count === 0) {
      this.first = value;
      this.firstText = JSON.stringify(value);
      this.count = 1;
      return;
    }
    if (this.uniform) {
      if (JSON.stringify(value) === this.firstText) {
        this.count++;
        return;
      }
      this.uniform = false;
      if (typeof this.first === 'number') {
        this.numbers = new Float64Array(Math.max(64, 2 * this.count)).fill(this.first, 0, this.count);
        this.numberCount = this.count;
      } else {
        this.mixed = new Array<ScalarLabel>(this.count).fill(this.first);
      }
    }
    this.append(value);
  }

  private append(value: ScalarLabel): void {
    if (this.numbers !== null) {
      if (typeof value === 'number') {
        if (this.numberCount === this.numbers.length) {
          const grown = new Float64Array(2 * this.numbers.length);
          grown.set(this.numbers);
          this.numbers = grown;
        }
        this.numbers[this.numberCount++] = value;
        this.count++;
        return;
      }
      this.mixed = Array.from(this.numbers.subarray(0, this.numberCount));
      this.numbers = null;
    }
    this.mixed!.push(value);
    this.count++;
  }

  /** Every value, in episode order. */
  values(): ScalarLabel[] {
    if (this.uniform) return new Array<ScalarLabel>(this.count).fill(this.first);
    if (this.numbers !== null) return Array.from(this.numbers.subarray(0, this.numberCount));
    return [...this.mixed!];
  }

  /** How many values the column holds. */
  get size(): number {
    return this.count;
  }

  /** How many different JSON texts the values have. */
  distinctCount(): number {
    if (this.uniform) return this.count === 0 ? 0 : 1;
    return new Set(this.values().map((v) => JSON.stringify(v))).size;
  }
}

/** A growing column of small whole numbers (split codes), 2 bytes each. */
export class SplitCodeColumn {
  private codes = new Uint16Array(64);
  private count = 0;

  push(code: number): void {
    if (this.count === this.codes.length) {
      const grown = new Uint16Array(2 * this.codes.length);
      grown.set(this.codes);
      this.codes = grown;
    }
    this.codes[this.count++] = code;
  }

  get size(): number {
    return this.count;
  }

  at(position: number): number {
    return this.codes[position];
  }
}

/** Everything the card needs about one label pointer, over the episodes that have it. */
export interface LabelTally {
  /** The value of the first episode (in index order) that has the label. */
  readonly first: LabelValue;
  readonly scalars: ScalarColumn;
  /** Split code (CardTally.splitNames) of the episode of each scalar value, in the same order. */
  readonly scalarSplits: SplitCodeColumn;
  /**
   * Digests of the JSON text of each distinct list or object value. The card only counts
   * these, and a digest stands in for the text: two different texts with one SHA-256 digest
   * are not known to exist.
   */
  readonly compoundDigests: Set<string>;
}

export interface RejectedRow {
  readonly id: string;
  readonly split: string;
  readonly rejection: EpisodeRejection;
}

function isScalar(value: LabelValue): value is ScalarLabel {
  return value === null || typeof value !== 'object';
}

export class CardTally {
  episodes = 0;
  ok = 0;
  rejected = 0;
  /** The first episode's simulation facts (it may be a rejected one). */
  firstSimulation: EpisodeSimulation | null = null;
  /** Split of the first episode that was recorded, or null when none was. */
  firstOkSplit: string | null = null;
  hasLattice = false;
  hasChain = false;
  nodeCountMin = Infinity;
  nodeCountMax = -Infinity;
  springCountMin = Infinity;
  springCountMax = -Infinity;
  substepsMin = Infinity;
  substepsMax = -Infinity;
  /** The first REJECTED_LISTED rejected episodes. */
  readonly rejectedRows: RejectedRow[] = [];
  /** Split names in the order they first appear; a split's code is its position here. */
  readonly splitNames: string[] = [];
  /** Episodes (recorded and rejected) of each split, by split code. */
  readonly splitEpisodes: number[] = [];
  /** Label pointers in the order they first appear. */
  readonly labels = new Map<string, LabelTally>();
  /** Unit of each control channel by name; a later episode's unit replaces an earlier one. */
  readonly channelUnits = new Map<string, string>();
  /** Index of each control channel by name, from the first episode that has the channel. */
  readonly channelIndex = new Map<string, number>();

  /** Adds one episode; episodes must come in index order. */
  add(record: EpisodeRecord): void {
    this.episodes++;
    let splitCode = this.splitNames.indexOf(record.split);
    if (splitCode < 0) {
      splitCode = this.splitNames.length;
      this.splitNames.push(record.split);
      this.splitEpisodes.push(0);
    }
    this.splitEpisodes[splitCode]++;
    if (record.status === 'ok') {
      this.ok++;
      if (this.firstOkSplit === null) this.firstOkSplit = record.split;
    } else {
      this.rejected++;
      if (this.rejectedRows.length < REJECTED_LISTED) {
        this.rejectedRows.push({ id: record.id, split: record.split, rejection: record.rejection! });
      }
    }
    if (record.systemKind === 'lattice') this.hasLattice = true;
    if (record.systemKind === 'chain') this.hasChain = true;
    const s = record.simulation;
    this.firstSimulation ??= s;
    this.nodeCountMin = Math.min(this.nodeCountMin, s.nodeCount);
    this.nodeCountMax = Math.max(this.nodeCountMax, s.nodeCount);
    this.springCountMin = Math.min(this.springCountMin, s.springCount);
    this.springCountMax = Math.max(this.springCountMax, s.springCount);
    this.substepsMin = Math.min(this.substepsMin, s.substeps);
    this.substepsMax = Math.max(this.substepsMax, s.substeps);
    for (const channel of record.controlChannels) {
      this.channelUnits.set(channel.name, channel.unit);
      if (!this.channelIndex.has(channel.name)) this.channelIndex.set(channel.name, channel.index);
    }
    for (const [pointer, value] of Object.entries(record.labels)) {
      let tally = this.labels.get(pointer);
      if (tally === undefined) {
        tally = { first: value, scalars: new ScalarColumn(), scalarSplits: new SplitCodeColumn(), compoundDigests: new Set() };
        this.labels.set(pointer, tally);
      }
      if (isScalar(value)) {
        tally.scalars.push(value);
        tally.scalarSplits.push(splitCode);
      }
      else tally.compoundDigests.add(new Sha256Stream().update(JSON.stringify(value)).hex());
    }
  }
}
