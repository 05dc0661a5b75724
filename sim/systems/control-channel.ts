// Describes one control channel of a built system: what it pushes, in which unit, with which
// natural range, and where it acts (axis, node or clamp) as fields for programs. Recorded in every dataset so a learner knows what each column of controls is.

export type ControlChannelKind = 'handle-force' | 'driven-offset' | 'actuator';

export interface ControlChannelInfo {
  index: number;
  name: string;
  kind: ControlChannelKind;
  /** 'N' for forces, 'm' for displacements, '1' (dimensionless, −1…1) for actuators. */
  unit: 'N' | 'm' | '1';
  description: string;
  /** The axis a force or offset acts along; null for actuators. */
  axis: 'x' | 'y' | 'z' | null;
  /** The one node a force or a chain's driven offset acts on; null for actuators and lattice clamps. */
  node: number | null;
  /** The lattice clamp whose held nodes the offset moves; null otherwise. */
  clamp: string | null;
}
