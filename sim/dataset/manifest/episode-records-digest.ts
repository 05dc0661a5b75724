// A SHA-256 over a manifest's episode records, written beside them, so that `pliant verify`
// notices an edited label, split or status: the data files have checksums of their own, the
// records that describe them had none. Each record is hashed as JSON.stringify gives it plus a
// line feed, in list order; JSON.parse then JSON.stringify gives the same text back for every
// record Pliant writes (finite numbers, strings, booleans, null), so a reader recomputes the
// digest from the parsed records without keeping the file's text.
import { Sha256Stream } from '../formats/file-digest.ts';

/** The manifest member, placed right after `episodes`. Absent in manifests of Pliant 0.1.0 before it. */
export const EPISODE_RECORDS_DIGEST_MEMBER = 'episodeRecordsSha256';

export class EpisodeRecordsDigest {
  private readonly hash = new Sha256Stream();

  add(record: unknown): void {
    this.hash.update(JSON.stringify(record));
    this.hash.update('\n');
  }

  hex(): string {
    return this.hash.hex();
  }
}
