// The control sequence of one episode: for every channel of the built system, its spec (by
// name, by index, or the default), its own stream, and its drawn parameters as labels under
// "/controls/<channel name>/…". Replay specs read their column through the caller's reader.
import { generateControlSignal } from '../controls/control-signal.ts';
import type { ControlSpec } from '../controls/control-spec.ts';
import { childPointer } from '../random/spec-problem.ts';
import type { ControlChannelInfo } from '../systems/control-channel.ts';
import { controlStream } from './parameter-streams.ts';
import type { LabelValue } from './sampled-episode.ts';
import { ScenarioProblemError } from './scenario-problem.ts';
import type { ControlsSpec } from './scenario-types.ts';

export interface ReplayTable {
  /** Row-major rows × columns. */
  data: Float64Array;
  rows: number;
  columns: number;
}

export type ReplayReader = (file: string) => ReplayTable;

/** The spec that drives `channel` and the pointer it is written at. */
export function channelSpec(controls: ControlsSpec, channel: ControlChannelInfo): { spec: ControlSpec; pointer: string } {
  for (const key of [channel.name, String(channel.index)]) {
    const spec = controls.channels[key];
    if (spec !== undefined) return { spec, pointer: childPointer('/controls/channels', key) };
  }
  return { spec: controls.default, pointer: '/controls/default' };
}

export function sampleControls(
  controls: ControlsSpec,
  channels: readonly ControlChannelInfo[],
  seed: number | string,
  episodeIndex: number,
  recordIntervalS: number,
  recordedSteps: number,
  labels: Record<string, LabelValue>,
  replay: ReplayReader | undefined,
): Float64Array {
  const out = new Float64Array(recordedSteps * channels.length);
  const tables = new Map<string, ReplayTable>();
  for (const channel of channels) {
    const { spec, pointer } = channelSpec(controls, channel);
    const labelPointer = childPointer('/controls', channel.name);
    const column = spec.kind === 'replay' ? replayColumn(spec.file, spec.column, pointer, replay, tables) : undefined;
    const sampled = generateControlSignal(spec, controlStream(seed, episodeIndex, labelPointer), recordIntervalS, recordedSteps, out, channel.index, channels.length, {
      pointer,
      rampInS: controls.rampInS,
      ...(column ? { replay: column } : {}),
    });
    addLabels(labels, labelPointer, sampled);
  }
  return out;
}

function replayColumn(file: string, column: number, pointer: string, replay: ReplayReader | undefined, tables: Map<string, ReplayTable>): Float64Array {
  if (replay === undefined) {
    throw new ScenarioProblemError([
      {
        pointer: `${pointer}/file`,
        message: `replays "${file}", but no replay files can be read here; run it with the pliant command line, which reads .npy tables next to the scenario`,
      },
    ]);
  }
  let table = tables.get(file);
  if (table === undefined) {
    table = replay(file);
    tables.set(file, table);
  }
  if (column >= table.columns) {
    throw new ScenarioProblemError([
      { pointer: `${pointer}/column`, message: `asks for column ${column} of "${file}", which has ${table.columns} column${table.columns === 1 ? '' : 's'} (counting from 0); pick a column below ${table.columns}` },
    ]);
  }
  const values = new Float64Array(table.rows);
  for (let r = 0; r < table.rows; r++) values[r] = table.data[r * table.columns + column];
  return values;
}

function addLabels(labels: Record<string, LabelValue>, pointer: string, value: LabelValue): void {
  if (value !== null && typeof value === 'object' && !Array.isArray(value)) {
    for (const [member, inner] of Object.entries(value)) addLabels(labels, childPointer(pointer, member), inner);
    return;
  }
  labels[pointer] = value;
}
