// What the dataset card says about a folder's episodes, gathered one manifest record at a time.
// A sweep's records (each with every sampled label, control-signal frequencies and phases
// included) can take far more memory than the run itself, so the card keeps only what it
// prints: counts, ranges, the first rows of a few tables, the scalar label values its
// histograms need, and one SHA-256 digest per distinct list-valued label.
import { createHash } from 'node:crypto';
import type { LabelValue } from '../scenario/sampled-episode.ts';
import type { EpisodeRecord, EpisodeRejection, EpisodeSimulation } from './dataset-manifest.ts';

/** How many rejected episodes the card lists one by one; the manifest lists them all. */
export const REJECTED_LISTED = 50;

export type ScalarLabel = number | string | boolean | null;

/** Everything the card needs about one label pointer, over the episodes that have it. */
export interface LabelTally {
  /** The value of the first episode (in index order) that has the label. */
  readonly first: LabelValue;
  /** The scalar values, in episode order. */
  readonly scalars: ScalarLabel[];
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
  nodeCountMin = Infinity;
  nodeCountMax = -Infinity;
  springCountMin = Infinity;
  springCountMax = -Infinity;
  substepsMin = Infinity;
  substepsMax = -Infinity;
  /** The first REJECTED_LISTED rejected episodes. */
  readonly rejectedRows: RejectedRow[] = [];
  /** Label pointers in the order they first appear. */
  readonly labels = new Map<string, LabelTally>();
  /** Unit of each control channel by name; a later episode's unit replaces an earlier one. */
  readonly channelUnits = new Map<string, string>();
  /** Index of each control channel by name, from the first episode that has the channel. */
  readonly channelIndex = new Map<string, number>();

  /** Adds one episode; episodes must come in index order. */
  add(record: EpisodeRecord): void {
    this.episodes++;
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
        tally = { first: value, scalars: [], compoundDigests: new Set() };
        this.labels.set(pointer, tally);
      }
      if (isScalar(value)) tally.scalars.push(value);
      else tally.compoundDigests.add(createHash('sha256').update(JSON.stringify(value)).digest('base64'));
    }
  }
}
