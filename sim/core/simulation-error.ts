// The typed error a run stops with when the numbers stop meaning anything: it says which
// episode, step and node, what was seen, and the likely cause, so a sweep can list the episode
// as rejected instead of writing garbage.
import { PliantError } from '../errors/pliant-error.ts';

export type BlowUpKind = 'non-finite' | 'over-stretch' | 'over-speed';

export interface BlowUpDetails {
  kind: BlowUpKind;
  /** Recorded step at which it was seen (0 = initial state). */
  step: number;
  node: number;
  /** The spring involved, for over-stretch. */
  spring?: number;
  /** The offending value (stretch ratio L/L0, speed in m/s, or NaN). */
  value: number;
  /** The sub-step length that was used, s. */
  dtS: number;
  criticalDtS: number;
}

export class SimulationBlowUpError extends PliantError {
  episode: number | undefined;

  constructor(readonly details: BlowUpDetails, episode?: number) {
    super('user', 'simulation-blow-up', describeBlowUp(details, episode));
    this.name = 'SimulationBlowUpError';
    this.episode = episode;
  }

  /** Same error, now knowing which episode it belongs to. */
  inEpisode(episode: number): SimulationBlowUpError {
    return new SimulationBlowUpError(this.details, episode);
  }
}

export function likelyCause(d: BlowUpDetails): string {
  if (d.dtS > d.criticalDtS) {
    return `the sub-step ${d.dtS.toExponential(3)} s exceeds the stability limit ${d.criticalDtS.toExponential(3)} s; use "substeps": "auto" or more sub-steps`;
  }
  if (d.kind === 'over-stretch') {
    return 'a spring stretched or compressed far beyond its rest length: control forces or actuation too large for the stiffness, or stiffness too low to hold the load';
  }
  if (d.kind === 'over-speed') {
    return 'a node reached an implausible speed: control forces too large for the masses, or an unstable step near the stability limit';
  }
  return 'a value became NaN or infinite: usually an unstable time step, a zero-length spring, or a non-finite input';
}

function describeBlowUp(d: BlowUpDetails, episode?: number): string {
  const where = `${episode === undefined ? '' : `episode ${episode}, `}recorded step ${d.step}, node ${d.node}${d.spring === undefined ? '' : `, spring ${d.spring}`}`;
  const what = d.kind === 'non-finite'
    ? 'non-finite position or velocity'
    : d.kind === 'over-stretch'
      ? `spring ${d.value < 1 ? 'compressed' : 'stretched'} to ${d.value.toFixed(2)}× its rest length`
      : `speed ${d.value.toExponential(3)} m/s`;
  return `simulation became unstable at ${where}: ${what}; likely cause: ${likelyCause(d)}`;
}
