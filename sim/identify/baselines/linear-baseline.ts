// The linear baseline over a dataset: episodes grouped by state size (node and channel count,
// which fix the size of the operator), one operator fitted per group on its fit-split episodes.
import type { EpisodeRecord } from '../../dataset/manifest/dataset-manifest.ts';
import { BaselineInputError } from './baseline-input-error.ts';
import type { LinearGroup, LinearModelPart } from './baseline-model.ts';
import type { EpisodeTrajectory } from './episode-trajectory.ts';
import { fitLinearOperator } from './linear-fit.ts';
import { buildSnapshots, snapshotCount } from './linear-snapshots.ts';
import type { LinearLayout, LinearStateForm } from './linear-state.ts';
import { type RankChoice,rankChoiceText } from './rank-rule.ts';

export interface LinearOptions {
  delays: number;
  affine: boolean;
  stateForm: LinearStateForm;
  rank: RankChoice;
}

export function groupKey(nodeCount: number, channelCount: number): string {
  return `${nodeCount} nodes, ${channelCount} channels`;
}

export function groupKeyOfRecord(record: EpisodeRecord): string {
  return groupKey(record.simulation.nodeCount, record.controlChannels.length);
}

export function layoutOf(part: Pick<LinearModelPart, 'delays' | 'affine' | 'stateForm'>, nodeCount: number, channelCount: number): LinearLayout {
  return { nodeCount, channelCount, delays: part.delays, affine: part.affine, stateForm: part.stateForm };
}

export function fitLinearBaseline(trajectories: readonly EpisodeTrajectory[], options: LinearOptions): LinearModelPart {
  const groups = new Map<string, EpisodeTrajectory[]>();
  for (const t of trajectories) {
    const key = groupKey(t.nodeCount, t.channelCount);
    groups.set(key, [...(groups.get(key) ?? []), t]);
  }
  const fitted: LinearGroup[] = [];
  for (const members of [...groups.values()].sort((a, b) => a[0].nodeCount - b[0].nodeCount || a[0].channelCount - b[0].channelCount)) {
    const layout = layoutOf(options, members[0].nodeCount, members[0].channelCount);
    if (snapshotCount(layout, members) === 0) {
      throw new BaselineInputError(`episodes ${members.map((m) => m.id).join(', ')} have no more recorded steps than --delays ${options.delays}; give fewer delays`);
    }
    const fit = fitLinearOperator(buildSnapshots(layout, members), options.rank, options.delays);
    fitted.push({
      nodeCount: layout.nodeCount,
      channelCount: layout.channelCount,
      episodes: members.map((m) => m.id),
      snapshotCount: fit.snapshotCount,
      singularValues: fit.singularValues,
      rank: fit.rank,
      rankTolerance: fit.rankTolerance,
      spectralRadius: fit.spectralRadius,
      oneStepRms: fit.oneStepRms,
      operator: { rows: fit.stateSize, columns: fit.snapshotSize, data: Array.from(fit.operator) },
    });
  }
  return { delays: options.delays, affine: options.affine, stateForm: options.stateForm, rankRule: rankChoiceText(options.rank), groups: fitted };
}
