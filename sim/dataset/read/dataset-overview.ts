// What a dataset's summary adds beyond names and counts, read from its manifest alone: the control
// channels its episodes record (name, kind, SI unit, description, so every plotted control value
// can carry its unit) and the folder's size in bytes as the manifest accounts for it.
import { stat } from 'node:fs/promises';
import { join } from 'node:path';

import type { ControlChannelInfo } from '../../systems/control-channel.ts';
import { MANIFEST_FILE } from '../manifest/dataset-files.ts';
import type { DatasetManifest } from '../manifest/dataset-manifest.ts';

export interface DatasetOverview {
  /** The first episode's channels; every episode of one scenario builds the same ones unless `controlChannelsVary`. */
  controlChannels: ControlChannelInfo[];
  /** True when some episode records other channels than the first (then read each episode's own). */
  controlChannelsVary: boolean;
  /** Data files, documents (seed file, card, copied inputs) and manifest.json itself, in bytes. */
  sizeBytes: number;
}

export async function readDatasetOverview(dir: string, manifest: DatasetManifest): Promise<DatasetOverview> {
  const first = manifest.episodes[0]?.controlChannels ?? [];
  const signature = channelSignature(first);
  const controlChannelsVary = manifest.episodes.some((e) => channelSignature(e.controlChannels) !== signature);
  let sizeBytes = 0;
  for (const file of manifest.files) sizeBytes += file.sizeBytes;
  for (const document of manifest.documents) sizeBytes += document.sizeBytes;
  // The manifest cannot record its own size; it is measured, as it lies on disk now.
  sizeBytes += (await stat(join(dir, MANIFEST_FILE))).size;
  return { controlChannels: first.map((c) => ({ ...c })), controlChannelsVary, sizeBytes };
}

function channelSignature(channels: readonly ControlChannelInfo[]): string {
  return channels.map((c) => `${c.index}|${c.name}|${c.kind}|${c.unit}`).join('\n');
}
