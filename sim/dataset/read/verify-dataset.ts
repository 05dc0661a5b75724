// Checks a dataset folder against its manifest: the manifest against its schema, every listed
// file for presence, size and SHA-256, the episode records (labels, splits, statuses) against
// the SHA-256 written beside them, the cross references between episodes and files, and that
// the folder holds no file the manifest does not list. Any problem makes the report fail;
// nothing is repaired.
//
// The manifest is read as a stream (manifest-stream.ts), so a manifest of any size is checked
// in memory that does not grow with it beyond two bytes per episode of the sweep (which
// episodes were seen, their status and split, and which of their files are listed).
import { readdir, stat } from 'node:fs/promises';
import { join } from 'node:path';

import { containedPathSync } from '../formats/contained-path.ts';
import { DatasetReadError } from '../formats/dataset-read-error.ts';
import { DatasetRequestError } from '../formats/dataset-request-error.ts';
import { describeUnhashed, digestFile } from '../formats/file-digest.ts';
import { say } from '../formats/run-words.ts';
import { episodeNpzPath, LOCK_FILE, MANIFEST_FILE, SEED_FILE, splitHdf5Path,WORK_FOLDER } from '../manifest/dataset-files.ts';
import type { FileRecord, ManifestHead } from '../manifest/dataset-manifest.ts';
import { EPISODE_RECORDS_DIGEST_MEMBER, EpisodeRecordsDigest } from '../manifest/episode-records-digest.ts';
import { readManifestStream } from '../manifest/manifest-stream.ts';

export interface VerifyFinding {
  /** Path relative to the dataset folder; "" when the problem is about the folder as a whole. */
  file: string;
  message: string;
}

export interface VerifyReport {
  dir: string;
  ok: boolean;
  /** How many listed files (documents and data files) were hashed and matched. */
  verifiedFileCount: number;
  /** How many listed files were checked. */
  checkedFileCount: number;
  /** At most MAX_LISTED_PROBLEMS lines, then one that counts the rest. */
  problems: string[];
  /** How many problems there are in all. */
  problemCount: number;
  /** The same problems, each beside the file it is about. */
  findings: VerifyFinding[];
  /**
   * Whether the episode records were checked against their SHA-256; false for manifests
   * written before Pliant recorded one (their labels and splits are then not covered).
   */
  episodeRecordsChecked: boolean;
}

/** A folder with more files than this is not searched for unlisted ones (the listed paths are held in memory). */
const MAX_UNLISTED_SEARCH_FILES = 10_000_000;

/** Beyond this many, problems are counted, not listed: a wholly wrong folder of 10^8 episodes must not fill memory with lines. */
export const MAX_LISTED_PROBLEMS = 1000;

export async function checkFileRecord(dir: string, record: FileRecord): Promise<string | null> {
  let path: string;
  try {
    path = containedPathSync(dir, record.path);
  } catch (error) {
    if (error instanceof DatasetRequestError) return `${record.path} leads outside the dataset folder through a symbolic link; replace the link with the file itself`;
    // Any other failure (no permission on a folder) is what reading the file reports below.
    path = join(dir, record.path);
  }
  const digest = await digestFile(path);
  if (digest.kind !== 'hashed') return describeUnhashed(digest, record.path);
  if (digest.sizeBytes !== record.sizeBytes) return `size mismatch: ${record.path} has ${digest.sizeBytes} bytes, the manifest says ${record.sizeBytes}`;
  if (digest.sha256 !== record.sha256) return `checksum mismatch: ${record.path} has SHA-256 ${digest.sha256}, the manifest says ${record.sha256}`;
  return null;
}

const SEEN = 1;
const OK = 2;
const NAMES_NPZ = 4;
const NPZ_LISTED = 8;
const NAMES_SPLIT_FILE = 16;
const SPLIT_FILE_LISTED = 32;
/** More episodes than this are not cross-checked (the per-episode table would not fit). */
const MAX_CROSS_CHECKED_EPISODES = 2 ** 30;

class Findings {
  readonly listed: VerifyFinding[] = [];
  unlisted = 0;
  add(file: string, message: string): void {
    if (this.listed.length < MAX_LISTED_PROBLEMS) this.listed.push({ file, message });
    else this.unlisted++;
  }
  get count(): number {
    return this.listed.length + this.unlisted;
  }
}

function indexOfId(id: string): number {
  return Number(id.slice(3));
}

async function isThere(path: string): Promise<boolean> {
  return stat(path).then(() => true, () => false);
}

export async function verifyDataset(dir: string): Promise<VerifyReport> {
  const info = await stat(dir).catch(() => null);
  if (!info) throw new DatasetRequestError(`${dir} does not exist; give the folder a Pliant run wrote`);
  if (!info.isDirectory()) throw new DatasetRequestError(`${dir} is a file; give the dataset folder that holds ${MANIFEST_FILE}`);
  const findings = new Findings();
  const inProgress = await stat(join(dir, WORK_FOLDER)).then((s) => s.isDirectory(), () => false);
  const manifestPath = join(dir, MANIFEST_FILE);
  let verified = 0;
  let checked = 0;
  if (!(await isThere(manifestPath))) {
    findings.add(MANIFEST_FILE, `${MANIFEST_FILE} is missing${inProgress ? `: the run that writes this folder has not finished; ${say('finish-unfinished')}` : ''}`);
    return report(dir, findings, 0, 0);
  }
  if (inProgress) findings.add(WORK_FOLDER, `the folder still holds .pliant-work: the run that writes it has not finished; ${say('finish-unfinished')}`);

  const check = async (record: FileRecord): Promise<void> => {
    checked++;
    const problem = await checkFileRecord(dir, record);
    if (problem) findings.add(record.path, problem);
    else verified++;
  };
  let head: ManifestHead | null = null;
  let flags: Uint8Array | null = null;
  let splitOf: Uint8Array | null = null;
  const splitNames: string[] = [];
  const splitCode = new Map<string, number>();
  const tally = new Map<string, { ok: number; rejected: number }>();
  let schemaFailed = false;
  const digest = new EpisodeRecordsDigest();
  let recordsChecked = false;
  const listedPaths = new Set<string>([MANIFEST_FILE]);
  const track = (path: unknown): void => {
    if (typeof path === 'string' && listedPaths.size <= MAX_UNLISTED_SEARCH_FILES) listedPaths.add(path);
  };
  try {
    for (const event of readManifestStream(manifestPath)) {
      switch (event.kind) {
        case 'problem':
          schemaFailed = true;
          findings.add(MANIFEST_FILE, event.message);
          break;
        case 'head':
          head = event.head;
          if (Number.isInteger(head.episodeCount) && head.episodeCount > 0 && head.episodeCount <= MAX_CROSS_CHECKED_EPISODES) {
            flags = new Uint8Array(head.episodeCount);
            splitOf = new Uint8Array(head.episodeCount);
          }
          break;
        case 'episode': {
          const e = event.record;
          digest.add(e);
          const counts = tally.get(e.split) ?? { ok: 0, rejected: 0 };
          tally.set(e.split, counts);
          if (e.status === 'ok') counts.ok++;
          else counts.rejected++;
          if (!flags || !splitOf) break;
          if (e.index >= flags.length || indexOfId(e.id) !== e.index) {
            findings.add(MANIFEST_FILE, `${MANIFEST_FILE} /episodes/${event.position}: episode ${e.id} has index ${e.index}, which does not fit its id or the sweep of ${flags.length} episodes`);
            break;
          }
          if (flags[e.index] & SEEN) {
            findings.add(MANIFEST_FILE, `${MANIFEST_FILE} /episodes/${event.position}: episode ${e.id} is listed twice`);
            break;
          }
          let code = splitCode.get(e.split);
          if (code === undefined && splitNames.length < 255) {
            code = splitNames.length;
            splitNames.push(e.split);
            splitCode.set(e.split, code);
          }
          let bits = SEEN | (e.status === 'ok' ? OK : 0);
          for (const path of e.files) {
            if (path === episodeNpzPath(e.id)) bits |= NAMES_NPZ;
            else if (path === splitHdf5Path(e.split)) bits |= NAMES_SPLIT_FILE;
            else findings.add(MANIFEST_FILE, `episode ${e.id} names ${path}, which is neither its NPZ file (${episodeNpzPath(e.id)}) nor its split's HDF5 file (${splitHdf5Path(e.split)})`);
          }
          flags[e.index] = bits;
          splitOf[e.index] = code ?? 255;
          break;
        }
        case 'file-episode': {
          if (!flags || !splitOf) break;
          const index = indexOfId(event.id);
          const path = typeof event.file.path === 'string' ? event.file.path : '(a file record)';
          if (!(index < flags.length) || !(flags[index] & SEEN)) {
            findings.add(path, `${path} lists episode ${event.id}, which the manifest does not have`);
            break;
          }
          if (event.file.kind === 'episode-npz' && path === episodeNpzPath(event.id)) flags[index] |= NPZ_LISTED;
          else if (event.file.kind === 'split-hdf5' && path === splitHdf5Path(splitNames[splitOf[index]] ?? '')) flags[index] |= SPLIT_FILE_LISTED;
          break;
        }
        case 'episode-digest':
          recordsChecked = true;
          if (!schemaFailed && digest.hex() !== event.sha256) {
            findings.add(MANIFEST_FILE, `${MANIFEST_FILE} /${EPISODE_RECORDS_DIGEST_MEMBER}: the episode records do not match the SHA-256 written beside them: a label, split, status or other member of an episode record was changed after the run; ${say('reproduce-seed')}`);
          }
          break;
        case 'file':
          track(event.record.path);
          await check(event.record);
          break;
        case 'documents':
          for (const document of event.documents) {
            track(document.path);
            await check(document);
          }
          break;
        case 'run':
          break;
      }
    }
  } catch (error) {
    if (!(error instanceof DatasetReadError)) throw error;
    findings.add(MANIFEST_FILE, error.message);
    return report(dir, findings, verified, checked);
  }
  if (flags && splitOf && !schemaFailed) {
    for (let index = 0; index < flags.length; index++) {
      const bits = flags[index];
      if (!(bits & SEEN)) continue;
      const id = `ep-${String(index).padStart(Math.max(6, String(flags.length - 1).length), '0')}`;
      if (bits & NAMES_NPZ && !(bits & NPZ_LISTED)) findings.add(MANIFEST_FILE, `episode ${id} names ${episodeNpzPath(id)}, which the manifest's files do not list (or that file does not list the episode)`);
      if (bits & NAMES_SPLIT_FILE && !(bits & SPLIT_FILE_LISTED)) {
        const path = splitHdf5Path(splitNames[splitOf[index]] ?? '');
        findings.add(MANIFEST_FILE, `episode ${id} names ${path}, which the manifest's files do not list (or that file does not list the episode)`);
      }
    }
  }
  if (head && !schemaFailed) {
    for (const [split, counts] of Object.entries(head.splits)) {
      const found = tally.get(split) ?? { ok: 0, rejected: 0 };
      if (found.ok !== counts.ok || found.rejected !== counts.rejected) {
        findings.add(MANIFEST_FILE, `split ${split}: the counts (${counts.ok} ok, ${counts.rejected} rejected) disagree with the episode list (${found.ok} ok, ${found.rejected} rejected)`);
      }
    }
  }
  if (head && !(await isThere(join(dir, SEED_FILE)))) findings.add(SEED_FILE, 'seed.json is missing: the dataset cannot be regenerated');
  if (listedPaths.size <= MAX_UNLISTED_SEARCH_FILES) {
    for (const path of await folderFiles(dir)) {
      if (!listedPaths.has(path)) findings.add(path, `${path} is in the folder but not in the manifest: it is not part of the dataset; move it elsewhere (or, if it should be, regenerate the folder)`);
    }
  }
  return report(dir, findings, verified, checked, recordsChecked);
}

/**
 * Every file below `dir`, as paths relative to it with "/" between parts, in sorted order; the
 * run's own work folder and lock file are not the dataset's and are left out. Links are listed,
 * not followed.
 */
async function folderFiles(dir: string): Promise<string[]> {
  const found: string[] = [];
  const walk = async (relative: string): Promise<void> => {
    const entries = await readdir(join(dir, relative), { withFileTypes: true }).catch(() => []);
    for (const entry of entries) {
      const path = relative === '' ? entry.name : `${relative}/${entry.name}`;
      if (path === WORK_FOLDER || path === LOCK_FILE) continue;
      if (entry.isDirectory()) await walk(path);
      else found.push(path);
    }
  };
  await walk('');
  return found.sort();
}

function report(dir: string, findings: Findings, verifiedFileCount: number, checkedFileCount: number, episodeRecordsChecked = false): VerifyReport {
  const listed = [...findings.listed];
  if (findings.unlisted > 0) listed.push({ file: '', message: `… and ${findings.unlisted} more problems` });
  return { dir, ok: findings.count === 0, verifiedFileCount, checkedFileCount, problems: listed.map((f) => f.message), problemCount: findings.count, findings: listed, episodeRecordsChecked };
}
