// Hashing files of any size and telling "missing" from "unreadable". A sparse file larger than
// 2 GiB (Node's whole-file readFile refuses anything over 2 GiB, ERR_FS_FILE_TOO_LARGE) must be
// hashed by streaming, and its SHA-256 must equal what GNU coreutils' `sha256sum` and Python's
// hashlib (Debian's /usr/bin/python3) compute for the same file. A folder where a file should
// be (open(2) succeeds read-only, read(2) fails with EISDIR) and a FIFO (fifo(7)) are there but
// cannot be hashed: they must be reported as unreadable, never as missing. Only ENOENT
// (open(2)) means missing.
import { spawnSync } from 'node:child_process';
import { closeSync, ftruncateSync, mkdirSync, mkdtempSync, openSync, rmSync, writeSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import { afterAll, describe, expect, it } from 'vitest';

import { digestFile } from '../sim/dataset/formats/file-digest.ts';
import { checkFileRecord } from '../sim/dataset/read/verify-dataset.ts';
import { REFERENCE_PYTHON, referencePythonAvailability } from './support/reference-python.ts';

const work = mkdtempSync(join(tmpdir(), 'pliant-digest-'));
afterAll(() => rmSync(work, { recursive: true, force: true }));

const BIG_BYTES = 2 ** 31 + 12_345;

function sparseFile(path: string): void {
  const fd = openSync(path, 'w');
  ftruncateSync(fd, BIG_BYTES);
  // A few written bytes so the digest is not that of zeros alone, one of them past 2 GiB.
  writeSync(fd, Buffer.from('Korrin Bay tether, split train'), 0, 30, 0);
  writeSync(fd, Buffer.from('past two gibibytes'), 0, 18, 2 ** 31 + 100);
  closeSync(fd);
}

describe('digestFile', () => {
  it('hashes a sparse file over 2 GiB by streaming, as sha256sum and Python hashlib do', async () => {
    const path = join(work, 'big.h5');
    sparseFile(path);
    const ours = await digestFile(path);
    expect(ours.kind).toBe('hashed');
    if (ours.kind !== 'hashed') return;
    expect(ours.sizeBytes).toBe(BIG_BYTES);

    // GNU coreutils sha256sum (FIPS 180-4 SHA-256).
    const coreutils = spawnSync('sha256sum', [path], { encoding: 'utf8' });
    expect(coreutils.status).toBe(0);
    expect(ours.sha256).toBe(coreutils.stdout.split(' ')[0]);

    if (referencePythonAvailability().available) {
      const script = 'import hashlib,sys\nh=hashlib.sha256()\nf=open(sys.argv[1],"rb")\nwhile True:\n  b=f.read(1<<24)\n  if not b: break\n  h.update(b)\nprint(h.hexdigest())';
      const python = spawnSync(REFERENCE_PYTHON, ['-c', script, path], { encoding: 'utf8' });
      expect(python.status).toBe(0);
      expect(ours.sha256).toBe(python.stdout.trim());
    }

    // verify's check of the same file against a record of its true size and digest passes.
    expect(await checkFileRecord(work, { path: 'big.h5', sha256: ours.sha256, sizeBytes: BIG_BYTES })).toBeNull();
    rmSync(path);
  }, 120_000);

  it('calls a folder in the place of a file unreadable (EISDIR), not missing', async () => {
    mkdirSync(join(work, 'episodes', 'ep-000000.npz'), { recursive: true });
    expect(await digestFile(join(work, 'episodes', 'ep-000000.npz'))).toEqual({ kind: 'unreadable', reason: 'EISDIR' });
    const problem = await checkFileRecord(work, { path: 'episodes/ep-000000.npz', sha256: '0'.repeat(64), sizeBytes: 10 });
    expect(problem).toMatch(/^unreadable file: episodes\/ep-000000\.npz \(EISDIR\)/);
  });

  it('calls a FIFO unreadable without waiting for a writer', async () => {
    const fifo = join(work, 'CARD.md');
    expect(spawnSync('mkfifo', [fifo]).status).toBe(0);
    expect(await digestFile(fifo)).toEqual({ kind: 'unreadable', reason: 'not a regular file' });
  });

  it('calls only an absent file missing', async () => {
    expect(await digestFile(join(work, 'no-such.npz'))).toEqual({ kind: 'missing' });
    expect(await checkFileRecord(work, { path: 'no-such.npz', sha256: '0'.repeat(64), sizeBytes: 1 })).toBe('missing file: no-such.npz');
  });
});
