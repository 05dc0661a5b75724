// One writer per dataset folder. A run (generate, resume, merge, an app export) creates
// `.pliant-lock` in the folder with O_CREAT|O_EXCL — atomic on local file systems (open(2)) —
// holding its process id, host and start time, and deletes it when it ends. A second run finds
// the file and stops with a message saying who holds the folder, instead of two runs renaming
// files over each other. A lock left by a run that died (kill -9, power cut) is recognised when
// it names this host and a process that no longer exists (kill(2) with signal 0 fails with
// ESRCH) and is taken over; a lock from another host cannot be checked from here and is reported
// with how to remove it.
import { closeSync, openSync, readFileSync, rmSync, writeSync } from 'node:fs';
import { hostname } from 'node:os';
import { join } from 'node:path';

import { DatasetRequestError } from '../formats/dataset-request-error.ts';
import { toDatasetWriteError } from '../formats/dataset-write-error.ts';
import { systemErrorCode } from '../formats/read-file-bytes.ts';
import { LOCK_FILE } from '../manifest/dataset-files.ts';

export interface LockHolder {
  pid: number;
  host: string;
  since: string;
  /** What the holder is doing, e.g. "pliant generate". */
  purpose: string;
}

export interface FolderLock {
  readonly path: string;
  release(): void;
}

function processExists(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (error) {
    // EPERM: the process exists but belongs to someone else.
    return systemErrorCode(error) === 'EPERM';
  }
}

function readHolder(path: string): LockHolder | null {
  try {
    const parsed = JSON.parse(readFileSync(path, 'utf8')) as Partial<LockHolder>;
    if (typeof parsed.pid !== 'number' || typeof parsed.host !== 'string') return null;
    return { pid: parsed.pid, host: parsed.host, since: String(parsed.since ?? ''), purpose: String(parsed.purpose ?? '') };
  } catch {
    return null;
  }
}

function tryCreate(path: string, holder: LockHolder): boolean {
  let fd: number;
  try {
    fd = openSync(path, 'wx');
  } catch (error) {
    if (systemErrorCode(error) === 'EEXIST') return false;
    throw toDatasetWriteError(error, path);
  }
  try {
    writeSync(fd, `${JSON.stringify(holder)}\n`);
  } finally {
    closeSync(fd);
  }
  return true;
}

/** Takes the folder's lock (the folder must exist) or throws a DatasetRequestError naming the holder. */
export function lockFolder(dir: string, purpose: string): FolderLock {
  const path = join(dir, LOCK_FILE);
  const me: LockHolder = { pid: process.pid, host: hostname(), since: new Date().toISOString(), purpose };
  for (let attempt = 0; attempt < 2; attempt++) {
    if (tryCreate(path, me)) {
      let released = false;
      return {
        path,
        release() {
          if (released) return;
          released = true;
          rmSync(path, { force: true });
        },
      };
    }
    const holder = readHolder(path);
    // A lock being written this instant has no content yet; treat it as held.
    if (holder && holder.host === me.host && !processExists(holder.pid)) {
      rmSync(path, { force: true });
      continue;
    }
    const who = holder ? `${holder.purpose || 'a Pliant run'}, process ${holder.pid} on ${holder.host}, since ${holder.since}` : 'a Pliant run';
    const fix = holder && holder.host !== me.host
      ? `wait for it to finish; if that run is no longer going, delete ${path} and start again`
      : 'wait for it to finish, or stop it and start again';
    throw new DatasetRequestError(`another run is using this folder (${dir}): ${who}. Two runs cannot write one folder; ${fix}`);
  }
  throw new DatasetRequestError(`another run is using this folder (${dir}); wait for it to finish and start again`);
}
