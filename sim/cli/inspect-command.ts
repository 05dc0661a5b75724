// `pliant inspect DIR`: what a dataset folder holds — episodes per split, parameter ranges,
// file sizes and the rejected episodes — for a person deciding whether it is the one they want.
import { resolve } from 'node:path';

import { inspectDataset } from '../dataset/read/inspect-dataset.ts';
import type { CliCommand } from './command.ts';
import { CliUsageError } from './command.ts';
import { parseArguments } from './command-arguments.ts';
import { withCliFailures } from './dataset-failure.ts';

/** Version of the --json document; raised when a member changes meaning or goes away. */
export const INSPECT_JSON_FORMAT = 1;

function bytes(n: number): string {
  if (n < 1024) return `${n} B`;
  if (n < 1024 ** 2) return `${(n / 1024).toFixed(1)} KiB`;
  if (n < 1024 ** 3) return `${(n / 1024 ** 2).toFixed(1)} MiB`;
  return `${(n / 1024 ** 3).toFixed(2)} GiB`;
}

function table(rows: string[][]): string[] {
  const widths = rows[0].map((_, c) => Math.max(...rows.map((r) => r[c].length)));
  return rows.map((r) => `  ${r.map((cell, c) => cell.padEnd(widths[c])).join('  ').trimEnd()}`);
}

export const inspectCommand: CliCommand = {
  name: 'inspect',
  usage: [
    'Usage: pliant inspect DIR [--json]',
    '',
    'Prints episodes per split, the range of every sampled parameter, file sizes and rejected episodes.',
    '',
    `  --json   print the same as one JSON document (inspectFormat ${INSPECT_JSON_FORMAT}) for scripts; see sim/dataset/LAYOUT.md`,
  ].join('\n'),
  async run(args, io) {
    const parsed = parseArguments('inspect', args, { valued: [], switches: ['--json'] });
    if (parsed.positionals.length !== 1) throw new CliUsageError('give exactly one dataset folder: pliant inspect DIR');
    const dir = parsed.positionals[0];
    const r = await withCliFailures('', () => inspectDataset(resolve(io.cwd, dir)));
    if (parsed.switches.has('--json')) {
      io.stdout(`${JSON.stringify({ inspectFormat: INSPECT_JSON_FORMAT, ...r }, null, 2)}\n`);
      return 0;
    }
    const lines: string[] = [];
    lines.push(`${dir}: ${r.name || 'dataset'} (${r.state}${r.shard ? `, shard ${r.shard.index}/${r.shard.count}` : ''}), ${r.listedEpisodes} of ${r.episodeCount} episodes`);
    lines.push('', 'Splits:', ...table([['split', 'ok', 'rejected'], ...r.splits.map((s) => [s.split, String(s.ok), String(s.rejected)])]));
    if (r.parameters.length > 0) {
      lines.push('', 'Sampled parameters:', ...table([['parameter', 'unit', 'values'], ...r.parameters.map((p) => [p.pointer, p.unit || '—', p.summary])]));
    }
    if (r.sizes.length > 0) {
      const total = r.sizes.reduce((sum, s) => sum + s.bytes, 0);
      lines.push('', 'Files:', ...table([['kind', 'files', 'size'], ...r.sizes.map((s) => [s.kind, String(s.files), bytes(s.bytes)]), ['total', String(r.sizes.reduce((n, s) => n + s.files, 0)), bytes(total)]]));
    }
    lines.push('', r.rejectedCount === 0 ? 'Rejected episodes: none' : `Rejected episodes (${r.rejectedCount}):`);
    if (r.rejected.length > 0) lines.push(...table([['episode', 'split', 'step', 'node', 'what happened'], ...r.rejected.map((e) => [e.id, e.split, String(e.step), String(e.node), `${e.kind}: ${e.cause}`])]));
    if (r.rejectedCount > r.rejected.length) lines.push(`  … and ${r.rejectedCount - r.rejected.length} more (the manifest lists every one)`);
    io.stdout(`${lines.join('\n')}\n`);
    return 0;
  },
};
