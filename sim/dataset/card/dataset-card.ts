// Writes CARD.md, the human-readable description of a dataset: what the systems are, how every
// sampled parameter is spread (with text histograms), the splits, the arrays, how to load them
// in Python (by hand and with the Pliant loader), which episodes were rejected and why, and the hardware-safety caution. It is made
// from the manifest's content alone (never the run metadata), so every copy of a dataset made
// from the same seed file has the same card, byte for byte. The episodes arrive as a CardTally,
// gathered one record at a time, so a card for a large sweep needs little memory.
import { describeCompression } from '../../scenario/export-compression.ts';
import { SAFETY_CAUTION } from '../../scenario/safety-caution.ts';
import { valueAtPointer } from '../formats/json-pointer-lookup.ts';
import { CARD_FILE, MANIFEST_FILE, SEED_FILE } from '../manifest/dataset-files.ts';
import type { ManifestHead } from '../manifest/dataset-manifest.ts';
import { EPISODE_ARRAYS } from '../manifest/episode-array-catalogue.ts';
import { unitOfLabel } from '../manifest/label-units.ts';
import { SHEET_EPISODES } from './card-contact-sheet.ts';
import { SCATTER_POINTS_PER_SPLIT } from './card-parameter-pictures.ts';
import type { CardTally, ScalarLabel } from './card-tally.ts';
import { REJECTED_LISTED } from './card-tally.ts';
import { designCardSection } from './design-card-section.ts';
import { PYTHON_LOADER_FILE_NAME } from './python-loader-source.ts';
import { categoricalHistogram, formatLabelNumber, numericHistogram } from './text-histogram.ts';

export interface CardSource extends ManifestHead {
  /** The folder's episodes, gathered in index order. */
  tally: CardTally;
  /** Whether the folder has one NPZ file per recorded episode. */
  episodeNpz: boolean;
  /** The split HDF5 files, in manifest order. */
  splitFiles: { path: string; split: string }[];
  /** The card's SVG pictures (card-pictures.ts), linked from the card by their relative paths. */
  pictures?: { path: string; alt: string }[];
}

function picturesSection(source: CardSource): string[] {
  const pictures = source.pictures ?? [];
  if (pictures.length === 0) return [];
  return [
    '',
    '## Pictures',
    '',
    `Drawn from this folder's files, SVG, listed with their checksums in \`${MANIFEST_FILE}\`. Per split, every sampled parameter in the bins of the text histograms below (the same bins in every split, every episode of the split counted, held-out ranges shaded); the two or three parameters with the largest standard deviation relative to their range against each other (the first ${SCATTER_POINTS_PER_SPLIT} episodes of each split in index order); and the first and last recorded frame of the first recorded episode of each split (at most ${SHEET_EPISODES}), from above and from the side.`,
    ...pictures.flatMap((p) => ['', `![${p.alt}](${p.path})`]),
  ];
}

/** The `export.compression` choice and its levels, so a reader knows how the files were written. */
function compressionSentence(source: CardSource): string {
  const choice = source.export.compression;
  if (choice === undefined) return '';
  return `Compression "${describeCompression(choice).replace(': ', '": ')} (\`export.compression\`; every choice loads with numpy.load and h5py). `;
}

function fence(language: string, lines: string[]): string[] {
  return ['```' + language, ...lines, '```'];
}

function range(count: number, min: number, max: number): string {
  return count === 0 ? 'none' : min === max ? String(min) : `${min} to ${max}`;
}

function describeSystem(scenario: Record<string, unknown>, tally: CardTally): string[] {
  const system = (scenario.system ?? {}) as Record<string, unknown>;
  const lines: string[] = [];
  if (system.kind === 'chain') {
    lines.push(`Each episode is a **chain** (rope, cable or tether) of equal parts: point masses joined by structural springs${chainBendingWords(system)}, simulated by semi-implicit Euler.`);
  } else if (system.kind === 'lattice') {
    lines.push('Each episode is a **voxel lattice**: a soft body of cells of one or more materials whose corner nodes are joined by edge and diagonal springs; cells of actuated materials change their rest lengths with their control channel. Simulated by semi-implicit Euler.');
  } else {
    lines.push(`Each episode is a system of kind ${JSON.stringify(system.kind)}.`);
  }
  lines.push('', `Nodes per episode: ${range(tally.episodes, tally.nodeCountMin, tally.nodeCountMax)}; springs per episode: ${range(tally.episodes, tally.springCountMin, tally.springCountMax)}.`);
  const steps = tally.firstSimulation;
  if (steps) {
    lines.push(`Recorded: ${steps.recordedSteps} steps of ${formatLabelNumber(steps.recordIntervalS)} s (${formatLabelNumber(steps.recordedSteps * steps.recordIntervalS)} s) per episode; sub-steps per record vary from ${tally.substepsMin} to ${tally.substepsMax} (chosen from the stability bound when "auto").`);
  }
  lines.push(rampInWords(scenario));
  return lines;
}

function chainBendingWords(system: Record<string, unknown>): string {
  const parts: string[] = [];
  const rigidity = system.bendingStiffnessNm2;
  if (rigidity !== undefined && rigidity !== 0) parts.push('bending rigidity EI through a turning-angle hinge at every interior node (arrays `hinges`, `hinge_stiffness`, `hinge_damping`; energy column `bending`)');
  const clamped = Array.isArray(system.clampedEnds) ? system.clampedEnds : [];
  if (clamped.length > 0) parts.push(`clamped ${clamped.join(' and ')} end${clamped.length > 1 ? 's' : ''} (arrays \`clamps\`, \`clamp_direction\`)`);
  const ratio = system.secondNeighbourSpringRatio;
  if (ratio !== undefined && ratio !== 0) parts.push('second-neighbour springs from node i to i + 2 (edge relation 1), which resist folding but not small bends');
  return parts.length === 0 ? ' and no bending stiffness' : `, with ${parts.join(', ')}`;
}

function rampInWords(scenario: Record<string, unknown>): string {
  const controls = (scenario.controls ?? {}) as Record<string, unknown>;
  const rampInS = typeof controls.rampInS === 'number' ? controls.rampInS : 0;
  if (rampInS > 0) {
    return `Control signals ramp in: every channel's signal is multiplied by the raised-cosine window ½(1 − cos(π·t/${formatLabelNumber(rampInS)} s)) for the first ${formatLabelNumber(rampInS)} s of each episode, so the recorded \`controls\` start at 0 and episodes start without a jolt. Replayed tables are used as written, without the ramp.`;
  }
  return 'Control signals start at full strength (no ramp-in: `controls.rampInS` is 0), so an episode may begin with a jump of its driven nodes or actuators.';
}

/** Most distinct non-numeric values a card shows one row each for. */
const CATEGORY_ROWS = 12;

/**
 * The spec a label was drawn from. Control labels are keyed by channel name
 * (/controls/<channel>/<member>), so they are looked up in the spec that drives that channel.
 */
function specOfLabel(source: CardSource, pointer: string): unknown {
  const direct = valueAtPointer(source.scenario, pointer);
  if (direct !== undefined) return direct;
  const match = /^\/controls\/([^/]+)(\/.*)?$/.exec(pointer);
  if (!match) return undefined;
  const channel = match[1].replace(/~1/g, '/').replace(/~0/g, '~');
  const rest = match[2] ?? '';
  const controls = ((source.scenario as Record<string, unknown>).controls ?? {}) as { default?: unknown; channels?: Record<string, unknown> };
  const index = source.tally.channelIndex.get(channel);
  const spec = controls.channels?.[channel] ?? (index === undefined ? undefined : controls.channels?.[String(index)]) ?? controls.default;
  return valueAtPointer(spec, rest);
}

// Math.min(...values) would overflow the call stack for sweeps of a few hundred thousand episodes.
function smallest(values: readonly number[]): number {
  let min = Infinity;
  for (const v of values) min = Math.min(min, v);
  return min;
}

function largest(values: readonly number[]): number {
  let max = -Infinity;
  for (const v of values) max = Math.max(max, v);
  return max;
}

/** Where a label's values come from, in one sentence. */
function originWords(spec: unknown): string {
  const record = typeof spec === 'object' && spec !== null ? (spec as Record<string, unknown>) : undefined;
  if (typeof record?.ref === 'string') return `Takes the named parameter \`${record.ref}\`.`;
  if (typeof record?.expr === 'string') return `Derived from named parameters: \`${record.expr}\`.`;
  if (spec === undefined || (record !== undefined && !('kind' in record))) return 'Derived by the sampler from other draws.';
  return `Sampled from \`${JSON.stringify(spec)}\`.`;
}

function parameterSections(source: CardSource): string[] {
  const lines: string[] = [];
  const fixed: string[] = [];
  const lists: string[] = [];
  for (const [pointer, label] of source.tally.labels) {
    const unit = unitOfLabel(pointer, source.tally.channelUnits);
    // Distinct as JSON text, like the manifest stores them; lists and objects count by digest.
    const distinctCount = label.scalars.distinctCount() + label.compoundDigests.size;
    if (distinctCount === 1) {
      fixed.push(`| \`${pointer}\` | ${JSON.stringify(label.first)} | ${unit || '—'} |`);
      continue;
    }
    if (label.compoundDigests.size > 0) {
      lists.push(`- \`${pointer}\`${unit ? ` (${unit})` : ''}: a list per episode, ${distinctCount} distinct`);
      continue;
    }
    const values: ScalarLabel[] = label.scalars.values();
    const spec = specOfLabel(source, pointer);
    const origin = originWords(spec);
    lines.push('', `### \`${pointer}\`${unit ? ` (${unit})` : ''}`, '', origin);
    const numbers = values.filter((v): v is number => typeof v === 'number');
    if (numbers.length === values.length) {
      lines.push(`Range over ${numbers.length} episodes: ${formatLabelNumber(smallest(numbers))} to ${formatLabelNumber(largest(numbers))}.`, '');
      lines.push(...fence('text', numericHistogram(numbers)));
    } else if (distinctCount <= CATEGORY_ROWS) {
      lines.push('', ...fence('text', categoricalHistogram(values)));
    } else {
      lines.push(`${distinctCount} distinct values over ${values.length} episodes.`);
    }
  }
  if (fixed.length > 0) {
    lines.push('', '### Fixed values', '', 'Labels that took the same value in every episode:', '', '| label | value | unit |', '| --- | --- | --- |', ...fixed);
  }
  if (lists.length > 0) {
    lines.push('', '### Per-episode lists', '', 'Labels whose value is a list (for example the frequencies and phases a control signal drew); see each episode\'s `labels` in the manifest:', '', ...lists);
  }
  return lines;
}

function splitSection(source: CardSource): string[] {
  const lines = ['| split | good episodes | rejected |', '| --- | --- | --- |'];
  for (const [split, counts] of Object.entries(source.splits)) lines.push(`| ${split} | ${counts.ok} | ${counts.rejected} |`);
  const splits = ((source.scenario as Record<string, unknown>).splits ?? {}) as Record<string, unknown>;
  const heldOut = Array.isArray(splits.heldOut) ? splits.heldOut : [];
  if (splits.counts !== undefined || splits.stratify !== undefined) {
    lines.push('', plannedSplitWords(splits));
  } else if (splits.fractions !== undefined) {
    lines.push('', `Episodes outside every held-out range are assigned to splits with the fractions \`${JSON.stringify(splits.fractions)}\`, drawn from each episode's own random stream (so the assignment does not depend on how many episodes there are or how they are sharded).`);
  }
  for (const rule of heldOut) {
    lines.push(`- Held-out rule: \`${JSON.stringify(rule)}\` — episodes whose sampled value matches go to that split whatever the fractions say, for testing generalisation beyond the training range.`);
  }
  return lines;
}

function plannedSplitWords(splits: Record<string, unknown>): string {
  const share = splits.counts !== undefined ? `the exact counts \`${JSON.stringify(splits.counts)}\` (a split left out takes the rest)` : `the fractions \`${JSON.stringify(splits.fractions)}\` rounded to whole episodes by largest remainders`;
  const stratify = splits.stratify as { parameters?: string[]; bins?: number } | undefined;
  const strata = stratify !== undefined
    ? ` They are dealt stratum by stratum: ${(stratify.parameters ?? []).map((p) => `\`${p}\``).join(', ')} each cut into ${stratify.bins ?? 4} strata of equal episode counts, so every split spans those ranges.`
    : '';
  return `Episodes outside every held-out range are assigned to splits in ${share}, planned over the whole sweep from the seed (so the assignment does not depend on sharding or on which episodes were rejected; rejected ones keep their split).${strata}`;
}

function arraySection(source: CardSource): string[] {
  const float = source.export.dtype;
  const lattice = source.tally.hasLattice;
  const observed = observationOf(source) !== undefined;
  const lines = ['| array | dtype | shape | unit | meaning |', '| --- | --- | --- | --- | --- |'];
  for (const a of EPISODE_ARRAYS) {
    if (a.latticeOnly && !lattice) continue;
    if (a.observationOnly && !observed) continue;
    if (a.chainOnly && !source.tally.hasChain) continue;
    const when = a.onlyWith === 'energyBalance' ? ' (only with numerics.energyBalance)' : a.onlyWith === 'forces' ? ' (only with export.forces)' : '';
    lines.push(`| \`${a.name}\` | ${a.dtype === 'float' ? float : a.dtype} | (${a.shape.join(', ')}) | ${a.unit} | ${a.meaning}${when} |`);
  }
  lines.push('', `T is the number of recorded steps, N nodes, C control channels, E springs, K cells, H bending hinges, Q clamps${observed ? ', T_obs observed frames, M markers' : ''}. The control channels of each episode (name, kind, unit) are listed under \`controlChannels\` in its manifest record; its sampled parameters under \`labels\`.`);
  return lines;
}

function observationOf(source: CardSource): Record<string, unknown> | undefined {
  const block = (source.scenario as Record<string, unknown>).observation;
  return typeof block === 'object' && block !== null ? (block as Record<string, unknown>) : undefined;
}

function everyNthWords(step: number): string {
  return step === 1 ? 'every node' : `every ${step} nodes from node 0 (nodes 0, ${step}, ${2 * step}, …)`;
}

function observationSection(source: CardSource): string[] {
  const block = observationOf(source);
  if (block === undefined) return [];
  const markers = block.markers as { nodes?: number[]; everyNth?: number } | undefined;
  const which = markers?.nodes !== undefined
    ? `nodes ${markers.nodes.join(', ')} (negative indices count from the last node)`
    : everyNthWords(markers?.everyNth ?? 1);
  const stride = typeof block.frameStride === 'number' ? block.frameStride : 1;
  const rate = block.rateHz !== undefined ? `${String(block.rateHz)} Hz` : stride === 1 ? 'every record' : `every ${stride} records`;
  return [
    '',
    '## Observations',
    '',
    'Beside the ground truth (which is stored unchanged), each episode holds what a position sensor would report, in the `observed_*` arrays. They are simulated: a model of a sensor, not a measurement.',
    '',
    `- Markers: ${which}; \`observed_nodes\` gives the node of each column.`,
    `- Frames: ${rate}; \`observed_time\` is a subset of \`time\`.`,
    `- Latency: ${String(block.latencyS ?? 0)} s: the frame reported at \`observed_time[j]\` shows the state at \`observed_time[j]\` − latency; frames before that state exists are marked unseen.`,
    `- Position noise: \`${JSON.stringify(block.positionNoiseM ?? 0)}\` m standard deviation on each coordinate, Gaussian, drawn per sample (label \`/observation/positionNoiseM\`).`,
    `- Dropouts: probability \`${JSON.stringify(block.dropoutProbability ?? 0)}\` per frame and marker (label \`/observation/dropoutProbability\`); a missing sample is NaN in \`observed_positions\` and 0 in \`observed_mask\`.`,
    '',
    'Noise and dropouts come from each episode\'s own random streams, so regenerating the dataset gives the same observations bit for bit.',
  ];
}

function loadingSection(source: CardSource): string[] {
  const firstSplit = source.tally.firstOkSplit;
  const npz = source.episodeNpz;
  const h5 = source.splitFiles;
  const lines: string[] = ['Run these from inside the dataset folder.'];
  if (firstSplit === null) return [...lines, '', 'No episode of this folder was recorded successfully, so there is nothing to load.'];
  if (npz) {
    lines.push('', 'With NumPy (one `.npz` file per episode):', '');
    lines.push(...fence('python', [
      'import json',
      'import numpy as np',
      '',
      `with open("${MANIFEST_FILE}") as f:`,
      '    manifest = json.load(f)',
      'good = [e for e in manifest["episodes"] if e["status"] == "ok"]',
      'episode = good[0]',
      'with np.load(f"episodes/{episode[\'id\']}.npz") as arrays:',
      '    positions = arrays["positions"]    # (T+1, N, 3), m',
      '    controls = arrays["controls"]      # (T, C), per channel unit',
      '    edges = arrays["edges"]            # (E, 2) node indices',
      'print(episode["id"], episode["split"], positions.shape, controls.shape, edges.shape)',
      'print("sampled parameters:", episode["labels"])',
    ]));
  }
  if (h5.length > 0) {
    const file = h5.find((f) => f.split === firstSplit) ?? h5[0];
    lines.push('', 'With h5py (one `.h5` file per split, one group per episode):', '');
    lines.push(...fence('python', [
      'import h5py',
      '',
      `with h5py.File("${file.path}", "r") as f:`,
      '    for episode_id in sorted(f.keys())[:3]:',
      '        group = f[episode_id]',
      '        positions = group["positions"][...]    # (T+1, N, 3), m',
      '        print(episode_id, positions.shape, group["controls"].shape)',
    ]));
  }
  return lines;
}

/** The Pliant loader (pliant_data.py) in use: windows, a padded batch and the PyTorch Dataset. */
function trainingLoopSection(source: CardSource): string[] {
  const split = source.tally.firstOkSplit;
  const steps = source.tally.firstSimulation?.recordedSteps ?? 0;
  if (split === null || steps < 1) return ['No episode of this folder was recorded successfully, so there is nothing to load.'];
  // Window lengths that fit any episode of this folder: every episode has the same record count.
  const states = steps + 1;
  const history = Math.max(1, Math.min(10, Math.floor(states / 2)));
  const horizon = Math.min(10, states - history);
  const module = PYTHON_LOADER_FILE_NAME.replace(/\.py$/, '');
  return [
    `Pliant ships a one-file Python loader, \`${PYTHON_LOADER_FILE_NAME}\` (NumPy only; h5py when it reads the split HDF5 files, PyTorch when torch is installed). Write it next to your training code with the command below; keep it out of this folder, because \`pliant verify\` reports any file the manifest does not list.`,
    '',
    ...fence('sh', [`npx pliant loader --out path/to/your/training/code/`]),
    '',
    `It lists each split's recorded episodes from \`${MANIFEST_FILE}\`, cuts windows of \`history\` states in and \`horizon\` states to predict (with the controls between them), pads a batch of episodes with different node counts and marks the real nodes in \`node_mask\`, and normalises each coordinate and control channel by the split's mean and standard deviation. Run from inside this folder, with the loader's folder on \`PYTHONPATH\`:`,
    '',
    ...fence('python', [
      `import ${module}`,
      '',
      `dataset = ${module}.PliantDataset(".")`,
      `windows = list(dataset.windows("${split}", history=${history}, horizon=${horizon}, stride=${history}, normalise=True))`,
      `batch = ${module}.collate_windows(windows[:8])`,
      'print(windows[0]["episode_id"], len(windows), batch["history_positions"].shape, batch["node_mask"].sum(axis=1))',
      '',
      '# With PyTorch: a map-style Dataset and a collate function that returns tensors.',
      '# import torch',
      `# train = ${module}.PliantWindowDataset(".", "${split}", history=${history}, horizon=${horizon}, normalise=True)`,
      `# loader = torch.utils.data.DataLoader(train, batch_size=32, shuffle=True, collate_fn=${module}.torch_collate)`,
    ]),
  ];
}

function rejectedSection(source: CardSource): string[] {
  const rejected = source.tally.rejected;
  const lines = [
    'An episode whose simulation becomes unstable (non-finite values, a spring stretched beyond the limit, an implausible speed) is never written as if it were good: it gets no data files, its manifest record has `"status": "rejected"` and the reason (step, node, cause), and the sweep moves on to the next episode. Which episodes are rejected depends only on the seed file, so every regeneration rejects the same ones.',
    '',
  ];
  if (rejected === 0) return [...lines, 'No episode was rejected.'];
  lines.push(`${rejected} episode${rejected === 1 ? ' was' : 's were'} rejected:`, '', '| episode | split | step | node | what happened |', '| --- | --- | --- | --- | --- |');
  for (const e of source.tally.rejectedRows) {
    const r = e.rejection;
    lines.push(`| ${e.id} | ${e.split} | ${r.step} | ${r.node} | ${r.kind}: ${r.likelyCause} |`);
  }
  if (rejected > REJECTED_LISTED) lines.push('', `…and ${rejected - REJECTED_LISTED} more; see \`${MANIFEST_FILE}\`.`);
  return lines;
}

export function renderDatasetCard(source: CardSource): string {
  const { ok, rejected } = source.tally;
  const scenario = source.scenario as Record<string, unknown>;
  const scope = source.shard
    ? `This folder is shard ${source.shard.index} of ${source.shard.count} of a sweep of ${source.episodeCount} episodes: it holds ${source.tally.episodes} of them. Merge all shards with \`pliant merge\` to get the whole dataset.`
    : `The sweep has ${source.episodeCount} episodes.`;
  const lines = [
    `# ${source.name || 'Pliant dataset'}`,
    '',
    source.description || 'A simulated trajectory dataset made by Pliant.',
    '',
    `> **Caution.** ${SAFETY_CAUTION}`,
    '',
    '## What is in it',
    '',
    ...describeSystem(scenario, source.tally),
    '',
    `${scope} ${ok} recorded, ${rejected} rejected. Master seed ${source.masterSeed}; floating-point arrays are ${source.export.dtype}; files: ${source.export.format === 'both' ? 'NPZ per episode and HDF5 per split' : source.export.format === 'npz' ? 'NPZ per episode' : 'HDF5 per split'}. ${compressionSentence(source)}Written by Pliant ${source.pliantVersion}.`,
    '',
    'Every file is listed with its SHA-256 in `manifest.json`; check them with `pliant verify .`.',
    '',
    '## Splits',
    '',
    ...splitSection(source),
    ...designCardSection(source.scenario),
    '',
    ...picturesSection(source),
    '',
    '## Sampled parameters',
    '',
    'Every sampled value is stored per episode under `labels` in the manifest, keyed by the JSON pointer of its place in the scenario. Units follow the scenario key names (SI).',
    ...parameterSections(source),
    '',
    '## Arrays of each episode',
    '',
    ...arraySection(source),
    ...observationSection(source),
    '',
    '## Loading in Python',
    '',
    ...loadingSection(source),
    '',
    '## Training with the Pliant loader',
    '',
    ...trainingLoopSection(source),
    '',
    '## Rejected episodes',
    '',
    ...rejectedSection(source),
    '',
    '## Regenerating',
    '',
    `\`${SEED_FILE}\` holds everything needed to regenerate this dataset bit for bit:`,
    '',
    ...fence('sh', [`npx pliant reproduce ${SEED_FILE} --out regenerated`]),
    '',
    `(\`${CARD_FILE}\` is written from the manifest; it is not a source of truth.)`,
    '',
  ];
  return lines.join('\n');
}
