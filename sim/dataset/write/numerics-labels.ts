// The numerical-error estimates of one episode as manifest labels under /numerics/: the energy
// balance (when energy accounting is on) and the Richardson estimate (for the episodes drawn
// for a rerun). Units follow the key suffix rule of label-units.ts.
import type { RecordedTrajectory } from '../../episode/record-episode.ts';
import type { RichardsonEstimate } from '../../episode/richardson-estimate.ts';
import type { LabelValue } from '../../scenario/sampled-episode.ts';

export const NUMERICS_LABELS = {
  '/numerics/energyBalanceResidualMaxJ': 'largest |energy balance residual| over the record times: energy the integrator created or lost, J',
  '/numerics/energyBalanceResidualFinalJ': 'energy balance residual at the last record time, J',
  '/numerics/energyScaleJ': 'largest kinetic + elastic energy over the record times, a scale for the residuals, J',
  '/numerics/workBalanceResidualMaxJ': 'largest |work balance residual| (bookkeeping check; rounding only), J',
  '/numerics/richardsonSubstepCount': 'sub-steps per record interval of the half-step rerun',
  '/numerics/richardsonPositionErrorMaxM': 'Richardson estimate of the largest node position error of the recorded run, 2·|x_h − x_{h/2}|, m',
  '/numerics/richardsonPositionErrorRmsM': 'Richardson estimate of the root-mean-square node position error of the recorded run, m',
} as const;

export function numericsLabels(trajectory: RecordedTrajectory, richardson: RichardsonEstimate | null): Record<string, LabelValue> {
  const labels: Record<string, LabelValue> = {};
  const balance = trajectory.balance;
  if (balance !== null) {
    labels['/numerics/energyBalanceResidualMaxJ'] = balance.energyResidualMaxAbsJ;
    labels['/numerics/energyBalanceResidualFinalJ'] = balance.energyResidualFinalJ;
    labels['/numerics/energyScaleJ'] = balance.scaleJ;
    labels['/numerics/workBalanceResidualMaxJ'] = balance.workResidualMaxAbsJ;
  }
  if (richardson !== null) {
    labels['/numerics/richardsonSubstepCount'] = richardson.substepCount;
    labels['/numerics/richardsonPositionErrorMaxM'] = richardson.positionErrorMaxM;
    labels['/numerics/richardsonPositionErrorRmsM'] = richardson.positionErrorRmsM;
  }
  return labels;
}
