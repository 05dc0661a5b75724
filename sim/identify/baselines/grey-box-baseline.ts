// Grey-box identification over the chosen episodes of a dataset: one identification per
// episode (every episode has its own sampled parameters), a summary of the relative errors per
// parameter, and the reasons the estimates may not be trusted.
import type { EpisodeRecord } from '../../dataset/manifest/dataset-manifest.ts';
import type { GreyBoxModelPart, ParameterSummary } from './baseline-model.ts';
import type { EpisodeTrajectory } from './episode-trajectory.ts';
import { type EpisodeIdentification,identifyEpisode } from './grey-box-identify.ts';

/** ω_max·Δt above which the one-interval regression is no longer a fair picture of the force. */
const COARSE_RECORDING = 0.1;

export function greyBoxWarnings(record: EpisodeRecord, scenario: unknown, exportDtype: string): string[] {
  const warnings: string[] = [];
  const sim = record.simulation;
  if (sim.substeps > 1) {
    // Semi-implicit Euler is stable for ω·dt < 2, so ω_max ≈ 2/dt_critical (README, integrator).
    const omegaDt = (2 * sim.recordIntervalS) / sim.criticalDtS;
    if (omegaDt > COARSE_RECORDING) {
      warnings.push(`episode ${record.id}: recorded every ${sim.substeps} integration steps; the fastest spring mode turns ω·Δt ≈ ${omegaDt.toPrecision(2)} rad per record interval, too coarse for accelerations from velocity differences — expect large errors; record with "time": {"substeps": 1} (see scenarios/identification/) or calibrate by simulation instead`);
    }
  }
  const world = scenario !== null && typeof scenario === 'object' ? (scenario as { world?: { fluid?: unknown } }).world : undefined;
  if (world?.fluid && record.systemKind === 'lattice') {
    warnings.push(`episode ${record.id}: fluid drag on lattice faces is not in the grey-box model, so its estimates absorb it`);
  }
  if (exportDtype === 'float32') warnings.push('float32 export: positions keep about 7 digits, so the stretches of stiff springs, and their stiffness estimates, carry rounding error; export float64 for identification');
  return warnings;
}

export function summariseParameters(identifications: readonly EpisodeIdentification[]): ParameterSummary[] {
  const names = new Map<string, { unit: string; errors: number[]; absolute: number[]; episodes: number }>();
  for (const id of identifications) {
    for (const p of id.parameters) {
      const entry = names.get(p.name) ?? { unit: p.unit, errors: [], absolute: [], episodes: 0 };
      entry.episodes++;
      if (p.relativeError !== null) entry.errors.push(p.relativeError);
      if (p.absoluteError !== null) entry.absolute.push(p.absoluteError);
      names.set(p.name, entry);
    }
  }
  return [...names].map(([name, e]) => {
    const sorted = [...e.errors].sort((a, b) => a - b);
    return {
      name,
      unit: e.unit,
      episodes: e.episodes,
      medianRelativeError: sorted.length ? sorted[sorted.length >> 1] : null,
      maxRelativeError: sorted.length ? sorted[sorted.length - 1] : null,
      maxAbsoluteError: e.absolute.length ? Math.max(...e.absolute) : null,
    };
  });
}

export function fitGreyBox(
  episodes: readonly { trajectory: EpisodeTrajectory; record: EpisodeRecord }[],
  scenario: unknown,
  exportDtype: string,
): GreyBoxModelPart {
  const identifications = episodes.map(({ trajectory, record }) => identifyEpisode(trajectory, record, scenario));
  const warnings = [...new Set(episodes.flatMap(({ record }) => greyBoxWarnings(record, scenario, exportDtype)))];
  return { episodes: identifications, summary: summariseParameters(identifications), warnings };
}
