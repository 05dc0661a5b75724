// Checks a dataset folder against its manifest: the manifest against its schema, every listed
// file for presence, size and SHA-256, and the cross references between episodes and files.
// Any problem makes the report fail; nothing is repaired.
import { join } from 'node:path';
import { readFolderState } from './dataset-folder-state.ts';
import { describeUnhashed, digestFile } from './file-digest.ts';
import type { FileRecord } from './dataset-manifest.ts';

export interface VerifyReport {
  dir: string;
  ok: boolean;
  /** Files whose bytes matched the manifest. */
  verifiedFiles: string[];
  problems: string[];
}

export async function checkFileRecord(dir: string, record: FileRecord): Promise<string | null> {
  const digest = await digestFile(join(dir, record.path));
  if (digest.kind !== 'hashed') return describeUnhashed(digest, record.path);
  if (digest.sizeBytes !== record.sizeBytes) return `size mismatch: ${record.path} has ${digest.sizeBytes} bytes, the manifest says ${record.sizeBytes}`;
  if (digest.sha256 !== record.sha256) return `checksum mismatch: ${record.path} has SHA-256 ${digest.sha256}, the manifest says ${record.sha256}`;
  return null;
}

export async function verifyDataset(dir: string): Promise<VerifyReport> {
  const state = await readFolderState(dir);
  const problems = [...state.manifestProblems];
  const verified: string[] = [];
  // Without a manifest the message above already says the run has not finished.
  if (state.inProgress && state.manifestText !== null) problems.push('the folder still holds .pliant-work: the run that writes it has not finished; resume it with `pliant generate … --resume`');
  const manifest = state.manifest;
  if (manifest) {
    for (const record of [...manifest.documents, ...manifest.files]) {
      const problem = await checkFileRecord(dir, record);
      if (problem) problems.push(problem);
      else verified.push(record.path);
    }
    const listed = new Map(manifest.files.map((f) => [f.path, f]));
    const ids = new Set(manifest.episodes.map((e) => e.id));
    for (const episode of manifest.episodes) {
      for (const path of episode.files) {
        const file = listed.get(path);
        if (!file) problems.push(`episode ${episode.id} names ${path}, which the manifest's files do not list`);
        else if (!file.episodes.includes(episode.id)) problems.push(`episode ${episode.id} names ${path}, but that file does not list the episode`);
      }
    }
    for (const file of manifest.files) {
      for (const id of file.episodes) if (!ids.has(id)) problems.push(`${file.path} lists episode ${id}, which the manifest does not have`);
    }
    for (const [split, counts] of Object.entries(manifest.splits)) {
      const members = manifest.episodes.filter((e) => e.split === split);
      const ok = members.filter((e) => e.status === 'ok').length;
      if (ok !== counts.ok || members.length - ok !== counts.rejected) problems.push(`split ${split}: the counts (${counts.ok} ok, ${counts.rejected} rejected) disagree with the episode list (${ok} ok, ${members.length - ok} rejected)`);
    }
    if (state.seedText === null) problems.push('seed.json is missing: the dataset cannot be regenerated');
  }
  return { dir, ok: problems.length === 0, verifiedFiles: verified, problems };
}
