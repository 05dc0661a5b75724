// Describes one control channel of a built system: what it pushes, in which unit, with which
// natural range. Recorded in every dataset so a learner knows what each column of controls is.

export type ControlChannelKind = 'handle-force' | 'driven-offset' | 'actuator';

export interface ControlChannelInfo {
  index: number;
  name: string;
  kind: ControlChannelKind;
  /** 'N' for forces, 'm' for displacements, '1' (dimensionless, −1…1) for actuators. */
  unit: 'N' | 'm' | '1';
  description: string;
}
