// Recorded control tables that a scenario replays ("kind": "replay"): which files a scenario
// names, and the table of their contents the sampler reads from. The table is plain data so it
// can be posted to worker threads unchanged.
import type { Scenario } from '../../scenario/scenario-types.ts';

export interface ReplayData {
  /** Row-major rows × columns, one row per recorded step. */
  data: Float64Array;
  rows: number;
  columns: number;
}

export interface ReplayReference {
  file: string;
  /** JSON pointer of the first "file" member naming it. */
  pointer: string;
}

/** Every distinct replay file a scenario names, sorted by file name. */
export function replayFilesOf(scenario: Scenario): ReplayReference[] {
  const found = new Map<string, string>();
  const visit = (node: unknown, pointer: string): void => {
    if (Array.isArray(node)) {
      node.forEach((item, i) => visit(item, `${pointer}/${i}`));
    } else if (node !== null && typeof node === 'object') {
      const record = node as Record<string, unknown>;
      if (record.kind === 'replay' && typeof record.file === 'string' && !found.has(record.file)) found.set(record.file, `${pointer}/file`);
      for (const [key, value] of Object.entries(record)) visit(value, `${pointer}/${key.replace(/~/g, '~0').replace(/\//g, '~1')}`);
    }
  };
  visit(scenario.controls, '/controls');
  return [...found.entries()].sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0)).map(([file, pointer]) => ({ file, pointer }));
}

export class ReplayTable {
  constructor(readonly entries: ReadonlyArray<readonly [string, ReplayData]> = []) {}

  lookup(file: string): ReplayData {
    const found = this.entries.find(([name]) => name === file);
    // The command line reads every named file before sampling, so this means a file was named
    // only in a sampled choice the reader did not see; say which.
    if (!found) throw new RangeError(`replay file "${file}" was not read before sampling; name it directly in a "replay" control`);
    return found[1];
  }

  /** The plain form structured clone keeps intact (for worker threads). */
  toTransfer(): Array<[string, ReplayData]> {
    return this.entries.map(([name, data]) => [name, data]);
  }

  static fromTransfer(entries: Array<[string, ReplayData]>): ReplayTable {
    return new ReplayTable(entries);
  }
}
