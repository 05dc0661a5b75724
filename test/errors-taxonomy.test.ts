// The one error taxonomy (sim/errors): every error class Pliant throws on purpose has a kind and
// a stable code, an operating-system error is classified by its errno code and never by its
// message, and each boundary maps every kind once: the command line to an exit code, the app's
// reply to a contract code, the web server to an HTTP status. A full disk is never a usage
// mistake. Exit 2 for usage mistakes is the convention of POSIX utilities (common practice, no
// source); 70 is EX_SOFTWARE of BSD's sysexits.h; HTTP statuses per RFC 9110 section 15; the
// real ENOSPC comes from Linux's /dev/full, which "returns ENOSPC on write" (full(4) man page).
import { writeFileSync } from 'node:fs';

import { describe, expect, it } from 'vitest';

import { toRequestErrorInfo } from '../electron/request-error.ts';
import { STATUS_BY_CODE } from '../electron/web-server.ts';
import { CliUsageError } from '../sim/cli/command.ts';
import { cliFailureOf, EXIT_CODE_BY_KIND } from '../sim/cli/exit-codes.ts';
import { SimulationBlowUpError } from '../sim/core/simulation-error.ts';
import { DatasetNotFoundError } from '../sim/dataset/formats/dataset-not-found-error.ts';
import { DatasetReadError } from '../sim/dataset/formats/dataset-read-error.ts';
import { DatasetRequestError } from '../sim/dataset/formats/dataset-request-error.ts';
import { DatasetWriteError, datasetWriteErrorFromErrno } from '../sim/dataset/formats/dataset-write-error.ts';
import { JsonStreamError } from '../sim/dataset/formats/json-stream-scanner.ts';
import { NpzTooLargeError } from '../sim/dataset/formats/npz.ts';
import { UnknownSortKeyError } from '../sim/dataset/read/episode-listing.ts';
import { EpisodeWorkerError } from '../sim/dataset/write/episode-pool.ts';
import { EpisodeBuildError } from '../sim/dataset/write/episode-product.ts';
import { RejectionLimitError } from '../sim/dataset/write/rejection-limit.ts';
import { ShardPlanError } from '../sim/dataset/write/shard-plan.ts';
import { ReportedError,reportOf } from '../sim/errors/error-report.ts';
import { ERROR_KINDS, type ErrorKind,PliantError } from '../sim/errors/pliant-error.ts';
import { systemErrorKind } from '../sim/errors/system-error-kind.ts';
import { BaselineInputError } from '../sim/identify/baselines/baseline-input-error.ts';
import { CalibrationInputError } from '../sim/identify/calibration/calibration-input-error.ts';
import { PredictionsError } from '../sim/identify/predictions/predictions-error.ts';
import { SpecError } from '../sim/random/spec-problem.ts';
import { MissingPictureArrayError } from '../sim/render/render-episode.ts';
import { ScenarioProblemError } from '../sim/scenario/scenario-problem.ts';

const TANK = '/korrin-bay/tether-sweep';

/** One of each of Pliant's error classes, with the kind it must have. */
const ONE_OF_EACH: Array<[PliantError, ErrorKind]> = [
  [new CliUsageError('--workers "many" is not a whole number'), 'user'],
  [new SpecError([{ pointer: '/system/axialStiffnessN', message: 'min above max', fix: 'swap them' }]), 'user'],
  [new ScenarioProblemError([{ pointer: '/episodes', message: 'must be ≥ 1 (got 0)' }]), 'user'],
  [new SimulationBlowUpError({ kind: 'non-finite', step: 3, node: 1, value: Number.NaN, dtS: 1e-3, criticalDtS: 1e-4 }), 'user'],
  [new UnknownSortKeyError('fin_area', ['episodeId', 'split', 'status']), 'user'],
  [new DatasetRequestError(`${TANK} is not empty`), 'user'],
  [new RejectionLimitError('too many rejected episodes'), 'user'],
  [new DatasetNotFoundError('no episode ep-000404'), 'user'],
  [new ShardPlanError('--shard 3/2: index not below count'), 'user'],
  [new EpisodeBuildError('episode 2 could not be built'), 'user'],
  [new NpzTooLargeError(2 ** 32), 'user'],
  [new MissingPictureArrayError('ep-000001', 'positions'), 'user'],
  [new BaselineInputError('no training split'), 'user'],
  [new PredictionsError('predictions.json is missing'), 'user'],
  [new CalibrationInputError('the bench table has no time column'), 'user'],
  [new JsonStreamError(4, 'unexpected end'), 'environment'],
  [new DatasetReadError(`${TANK}/ep-000001.npz`, 'header', 'not an NPY header', 'regenerate the file'), 'environment'],
  [datasetWriteErrorFromErrno('ENOSPC', `${TANK}/split-train.h5`, 'no space'), 'environment'],
  [datasetWriteErrorFromErrno('EACCES', `${TANK}/manifest.json`, 'denied'), 'environment'],
  [new EpisodeWorkerError('a worker thread exited early (code 1)'), 'bug'],
];

/** A real ENOSPC from the operating system: writing to /dev/full. */
function realDiskFull(): Error {
  try {
    writeFileSync('/dev/full', 'tether log');
  } catch (error) {
    return error as Error;
  }
  throw new Error('writing /dev/full succeeded; this machine has no /dev/full');
}

describe('every error class has a kind and a stable code', () => {
  it('each class has the kind it should, and a lower-case code of its own', () => {
    for (const [error, kind] of ONE_OF_EACH) {
      expect(error, error.constructor.name).toBeInstanceOf(PliantError);
      expect(error.kind, error.constructor.name).toBe(kind);
      expect(error.errorCode, error.constructor.name).toMatch(/^[a-z][a-z0-9-]*$/);
    }
    const codes = ONE_OF_EACH.map(([e]) => e.errorCode);
    expect(new Set(codes).size).toBe(codes.length);
    // A read-only disk is refused permission like EACCES: the same failure, the same code.
    const readOnly = datasetWriteErrorFromErrno('EROFS', `${TANK}/manifest.json`, 'read-only');
    expect([readOnly.kind, readOnly.errorCode]).toEqual(['environment', 'write-not-writable']);
  });

  it('errno codes are classified by code (POSIX errno.h), never by message text', () => {
    for (const code of ['ENOSPC', 'EDQUOT', 'EACCES', 'EPERM', 'EROFS', 'EIO']) expect(systemErrorKind(code), code).toBe('environment');
    for (const code of ['ENOENT', 'ENOTDIR', 'EISDIR', 'EEXIST']) expect(systemErrorKind(code), code).toBe('user');
    // A message that reads like a full disk but carries no errno code is a bug, not the environment.
    expect(reportOf(new Error('ENOSPC: no space left on device')).kind).toBe('bug');
    expect(reportOf(Object.assign(new Error('whatever the text'), { code: 'ENOSPC' }))).toEqual({ kind: 'environment', errorCode: 'system-enospc', message: 'whatever the text' });
  });

  it('a real ENOSPC from /dev/full is the environment\'s, not a usage mistake', () => {
    const error = realDiskFull();
    expect((error as NodeJS.ErrnoException).code).toBe('ENOSPC');
    expect(reportOf(error).kind).toBe('environment');
  });

  it('a report crosses a thread as plain data and comes back with the same kind and code', () => {
    for (const [error] of ONE_OF_EACH) {
      const crossed = new ReportedError(structuredClone(reportOf(error)));
      expect(reportOf(crossed)).toEqual(reportOf(error));
    }
    expect(ERROR_KINDS).toEqual(['user', 'environment', 'bug']);
  });
});

describe('the command line maps every kind to its exit code once', () => {
  it('user 2, environment 1, bug 70', () => {
    expect(EXIT_CODE_BY_KIND).toEqual({ user: 2, environment: 1, bug: 70 });
    for (const [error, kind] of ONE_OF_EACH) expect(cliFailureOf(error).exitCode, error.constructor.name).toBe(EXIT_CODE_BY_KIND[kind]);
  });

  it('a full disk exits with 1 and its message, never with the usage code 2', () => {
    const written = datasetWriteErrorFromErrno('ENOSPC', `${TANK}/split-train.h5`, 'no space');
    expect(written).toBeInstanceOf(DatasetWriteError);
    expect(written).not.toBeInstanceOf(CliUsageError);
    expect(cliFailureOf(written)).toEqual({ exitCode: 1, text: `the disk is full while writing ${TANK}/split-train.h5; free space and run again with --resume\n` });
    const raw = cliFailureOf(realDiskFull());
    expect(raw.exitCode).toBe(1);
    expect(raw.text).not.toMatch(/\n\s+at /);
  });

  it('user mistakes and the environment print no stack trace; a bug prints its trace', () => {
    expect(cliFailureOf(new CliUsageError('give exactly one dataset folder')).text).toBe('give exactly one dataset folder\n');
    const bug = cliFailureOf(new TypeError('cannot read properties of undefined'));
    expect(bug.exitCode).toBe(70);
    expect(bug.text).toMatch(/bug in Pliant/);
    expect(bug.text).toMatch(/\n\s+at /);
  });
});

describe('the app\'s reply and the web server\'s HTTP status map every kind once', () => {
  it('user mistakes are 4xx contract codes, the environment\'s io-error or permission-denied, bugs internal 500', () => {
    for (const [error, kind] of ONE_OF_EACH) {
      const info = toRequestErrorInfo(error, 'datasets.open');
      const status = STATUS_BY_CODE[info.code];
      if (kind === 'bug') {
        expect(info.code, error.constructor.name).toBe('internal');
        expect(status).toBe(500);
      } else {
        expect(info.code, error.constructor.name).not.toBe('internal');
        expect(info.message.startsWith(error.message.charAt(0).toUpperCase()), error.constructor.name).toBe(true);
      }
      if (kind === 'user') expect(status, error.constructor.name).toBeGreaterThanOrEqual(400);
      if (kind === 'user') expect(status, error.constructor.name).toBeLessThan(500);
    }
  });

  it('the codes the renderer tells apart stay as they were: not-found, invalid-dataset, invalid-arguments', () => {
    expect(toRequestErrorInfo(new DatasetNotFoundError('no episode ep-000404'), 'episodes.read')).toEqual({ code: 'not-found', message: 'No episode ep-000404.' });
    expect(toRequestErrorInfo(new DatasetRequestError(`${TANK} has no manifest.json`), 'datasets.open').code).toBe('invalid-dataset');
    expect(toRequestErrorInfo(new DatasetReadError(`${TANK}/manifest.json`, 'line 3', 'not JSON', 'restore it'), 'datasets.open').code).toBe('invalid-dataset');
    expect(toRequestErrorInfo(new UnknownSortKeyError('fin_area', ['episodeId']), 'episodes.list').code).toBe('invalid-arguments');
    expect(STATUS_BY_CODE['not-found']).toBe(404);
    expect(STATUS_BY_CODE['invalid-arguments']).toBe(400);
  });

  it('a full disk is io-error (HTTP 500), not invalid-arguments (400)', () => {
    const written = toRequestErrorInfo(datasetWriteErrorFromErrno('ENOSPC', `${TANK}/split-train.h5`, 'no space'), 'jobs.export');
    expect(written.code).toBe('io-error');
    expect(STATUS_BY_CODE[written.code]).toBe(500);
    expect(toRequestErrorInfo(realDiskFull(), 'jobs.export').code).toBe('io-error');
    expect(toRequestErrorInfo(datasetWriteErrorFromErrno('EACCES', `${TANK}/manifest.json`, 'denied'), 'jobs.export').code).toBe('permission-denied');
  });
});
