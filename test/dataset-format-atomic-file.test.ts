// Atomic file writes: a failure at any step (simulated full disk, refused permission, a real
// unwritable or missing folder) leaves no file under the final name, keeps an older file there
// intact, removes the temporary file and gives a one-line message. The guarantee rests on
// POSIX rename(): the new name refers either to the old file or to the new one, never to
// neither (POSIX.1-2017, rename(), from memory); errno meanings as in POSIX <errno.h>.
import { spawnSync } from 'node:child_process';
import * as fs from 'node:fs';
import { chmodSync, existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';

import { afterAll, describe, expect, it } from 'vitest';

import { type AtomicFileSystem,isTemporaryName, writeFileAtomic, writeFileAtomicVia } from '../sim/dataset/formats/atomic-file.ts';
import { DatasetWriteError } from '../sim/dataset/formats/dataset-write-error.ts';

const root = mkdtempSync(join(tmpdir(), 'pliant-atomic-'));
afterAll(() => {
  chmodAll(root);
  rmSync(root, { recursive: true, force: true });
});
const REPO = resolve(import.meta.dirname, '..');
let folderCount = 0;
function freshFolder(): string {
  folderCount += 1;
  const folder = join(root, `case-${folderCount}`);
  fs.mkdirSync(folder);
  return folder;
}

function chmodAll(folder: string): void {
  for (const entry of readdirSync(folder, { withFileTypes: true })) {
    if (entry.isDirectory()) {
      chmodSync(join(folder, entry.name), 0o755);
      chmodAll(join(folder, entry.name));
    }
  }
}

function systemError(code: string, syscall: string): NodeJS.ErrnoException {
  return Object.assign(new Error(`${code}: simulated failure, ${syscall}`), { code, syscall });
}

/** The real file system, except that the named call (if any) fails with `code` (after `bytesBeforeFailure` bytes for writes). */
function failingFs(failAt: keyof AtomicFileSystem | null, code: string, bytesBeforeFailure = 0): AtomicFileSystem & { opened: string[] } {
  let written = 0;
  const opened: string[] = [];
  return {
    opened,
    openSync(path, flags, mode) {
      opened.push(path);
      if (failAt === 'openSync' && flags === 'wx') throw systemError(code, 'open');
      return fs.openSync(path, flags, mode);
    },
    writeSync(fd, buffer, offset, length, position) {
      if (failAt === 'writeSync') {
        const room = bytesBeforeFailure - written;
        if (room <= 0) throw systemError(code, 'write');
        const count = fs.writeSync(fd, buffer, offset, Math.min(length, room), position);
        written += count;
        return count;
      }
      return fs.writeSync(fd, buffer, offset, length, position);
    },
    fsyncSync(fd) {
      if (failAt === 'fsyncSync') throw systemError(code, 'fsync');
      fs.fsyncSync(fd);
    },
    closeSync: (fd) => fs.closeSync(fd),
    renameSync(from, to) {
      if (failAt === 'renameSync') throw systemError(code, 'rename');
      fs.renameSync(from, to);
    },
    unlinkSync: (path) => fs.unlinkSync(path),
  };
}

function caught(action: () => void): DatasetWriteError {
  try {
    action();
  } catch (error) {
    expect(error).toBeInstanceOf(DatasetWriteError);
    return error as DatasetWriteError;
  }
  throw new Error('the write did not fail');
}

const TETHER_LOG = new TextEncoder().encode('Korrin Bay tank, tether run 7: '.repeat(4000));

describe('successful writes', () => {
  it('put the whole content under the final name through a hidden temporary name in the same folder', () => {
    const folder = freshFolder();
    const target = join(folder, 'episode_000000.npz');
    const recorder = failingFs(null, '');
    writeFileAtomic(target, [TETHER_LOG.subarray(0, 10), TETHER_LOG.subarray(10)], { fs: recorder });
    expect(readFileSync(target).equals(Buffer.from(TETHER_LOG))).toBe(true);
    expect(readdirSync(folder)).toEqual(['episode_000000.npz']);
    const temporary = recorder.opened[0];
    expect(resolve(temporary, '..')).toBe(folder);
    expect(isTemporaryName(temporary.slice(folder.length + 1))).toBe(true);
    expect(temporary).toMatch(new RegExp(`/\\.episode_000000\\.npz\\.partial-${process.pid}-\\d+$`));
  });

  it('replace an existing file', () => {
    const folder = freshFolder();
    const target = join(folder, 'manifest.json');
    writeFileSync(target, 'old');
    writeFileAtomic(target, new TextEncoder().encode('new'));
    expect(readFileSync(target, 'utf8')).toBe('new');
    expect(readdirSync(folder)).toEqual(['manifest.json']);
  });

  it('writeFileAtomicVia lets a library fill the temporary file by path', () => {
    const folder = freshFolder();
    const target = join(folder, 'split-train.h5');
    writeFileAtomicVia(target, (temporaryPath) => writeFileSync(temporaryPath, TETHER_LOG));
    expect(readFileSync(target).equals(Buffer.from(TETHER_LOG))).toBe(true);
    expect(readdirSync(folder)).toEqual(['split-train.h5']);
  });
});

describe('a full disk (simulated ENOSPC)', () => {
  const FULL = (target: string) => `the disk is full while writing ${target}; free space and run again with --resume`;

  for (const [step, bytes] of [['writeSync', 0], ['writeSync', 5000], ['fsyncSync', 0]] as const) {
    it(`at ${step}${bytes ? ` after ${bytes} bytes` : ''}: no file under the final name, temporary removed, clear message`, () => {
      const folder = freshFolder();
      const target = join(folder, 'episode_000003.npz');
      const error = caught(() => writeFileAtomic(target, TETHER_LOG, { fs: failingFs(step, 'ENOSPC', bytes) }));
      expect(error.message).toBe(FULL(target));
      expect(error.failure).toBe('disk-full');
      expect(error.errno).toBe('ENOSPC');
      expect(error.code).toBe('ENOSPC');
      expect(error.path).toBe(target);
      expect(readdirSync(folder)).toEqual([]);
    });
  }

  it('an older file under the final name stays whole', () => {
    const folder = freshFolder();
    const target = join(folder, 'manifest.json');
    writeFileSync(target, '{"version": 1}');
    caught(() => writeFileAtomic(target, TETHER_LOG, { fs: failingFs('writeSync', 'ENOSPC', 100) }));
    expect(readFileSync(target, 'utf8')).toBe('{"version": 1}');
    expect(readdirSync(folder)).toEqual(['manifest.json']);
  });

  it('a quota limit (EDQUOT) reads the same way', () => {
    const folder = freshFolder();
    const target = join(folder, 'episode_000004.npz');
    expect(caught(() => writeFileAtomic(target, TETHER_LOG, { fs: failingFs('writeSync', 'EDQUOT', 10) })).message).toBe(FULL(target));
  });

  it('writeFileAtomicVia: a filler that hits a full disk leaves nothing behind', () => {
    const folder = freshFolder();
    const target = join(folder, 'split-train.h5');
    const error = caught(() =>
      writeFileAtomicVia(target, (temporaryPath) => {
        writeFileSync(temporaryPath, TETHER_LOG.subarray(0, 1000));
        throw systemError('ENOSPC', 'write');
      }),
    );
    expect(error.message).toBe(FULL(target));
    expect(readdirSync(folder)).toEqual([]);
  });

  it('a write that makes no progress is an error, not an endless loop', () => {
    const folder = freshFolder();
    const target = join(folder, 'stuck.npz');
    const stuck: AtomicFileSystem = { ...fs, writeSync: () => 0 };
    expect(caught(() => writeFileAtomic(target, TETHER_LOG, { fs: stuck })).failure).toBe('failed');
    expect(readdirSync(folder)).toEqual([]);
  });
});

describe('folders that cannot be written', () => {
  for (const [code, reason] of [
    ['EACCES', 'permission denied'],
    ['EPERM', 'the operation is not permitted'],
    ['EROFS', 'the file system is read-only'],
  ] as const) {
    it(`simulated ${code}: names the folder and says how to fix it`, () => {
      const folder = freshFolder();
      const target = join(folder, 'episode_000000.npz');
      const error = caught(() => writeFileAtomic(target, TETHER_LOG, { fs: failingFs('openSync', code) }));
      expect(error.message).toBe(`cannot write to ${folder}: ${reason}; make the folder writable or choose another output folder`);
      expect(error.failure).toBe('not-writable');
      expect(existsSync(target)).toBe(false);
    });
  }

  it('a real read-only folder (mode 0555, as an unprivileged user) gives the same message', () => {
    const folder = freshFolder();
    chmodSync(folder, 0o555);
    const target = join(folder, 'episode_000000.npz');
    const expected = `cannot write to ${folder}: permission denied; make the folder writable or choose another output folder`;
    if (process.getuid?.() === 0) {
      // Root ignores permission bits, so the write runs in a child process as the 'nobody' user.
      chmodSync(root, 0o755);
      const script = join(root, 'unprivileged-write.mjs');
      writeFileSync(script, `
import { writeFileAtomic } from ${JSON.stringify(join(REPO, 'sim/dataset/formats/atomic-file.ts'))};
try { writeFileAtomic(process.argv[2], new Uint8Array(8)); console.log(JSON.stringify({ written: true })); }
catch (error) { console.log(JSON.stringify({ name: error.name, message: error.message })); }
`);
      const result = spawnSync(process.execPath, ['--import', 'tsx', script, target], { cwd: REPO, encoding: 'utf8', uid: 65534, gid: 65534, timeout: 60_000 });
      expect(result.status, result.stderr).toBe(0);
      expect(JSON.parse(result.stdout)).toEqual({ name: 'DatasetWriteError', message: expected });
    } else {
      expect(caught(() => writeFileAtomic(target, TETHER_LOG)).message).toBe(expected);
    }
    expect(readdirSync(folder)).toEqual([]);
  });

  it('a missing folder (real ENOENT) and a file where a folder should be (real ENOTDIR)', () => {
    const folder = freshFolder();
    const missing = join(folder, 'not-yet', 'episode_000000.npz');
    expect(caught(() => writeFileAtomic(missing, TETHER_LOG)).message)
      .toBe(`cannot write ${missing}: the folder ${join(folder, 'not-yet')} does not exist; create it or choose another output folder`);
    writeFileSync(join(folder, 'episodes'), 'a file, not a folder');
    const blocked = join(folder, 'episodes', 'episode_000000.npz');
    expect(caught(() => writeFileAtomic(blocked, TETHER_LOG)).failure).toBe('not-a-folder');
    expect(readdirSync(folder)).toEqual(['episodes']);
  });

  it('a folder standing under the final name (real EISDIR at rename) is reported and the temporary file removed', () => {
    const folder = freshFolder();
    fs.mkdirSync(join(folder, 'manifest.json'));
    const target = join(folder, 'manifest.json');
    const error = caught(() => writeFileAtomic(target, TETHER_LOG));
    expect(error.failure).toBe('in-the-way');
    expect(readdirSync(folder)).toEqual(['manifest.json']);
  });
});
