// The columns of `energy_flows`: energy that crossed into or out of the moving nodes since the
// start of the episode, J, cumulative. One column per force term of force-terms.ts, then the
// work of the supports (driven nodes) and the kinetic energy the contact projections removed.
import type { ForceRole } from './force-terms.ts';
import { flowColumnName,FORCE_TERMS } from './force-terms.ts';

export interface FlowColumn {
  readonly name: string;
  readonly role: ForceRole;
  readonly counts: string;
}

/** Index of the first column after the force terms. */
export const SUPPORT_WORK_COLUMN = FORCE_TERMS.length;
export const CONTACT_NORMAL_COLUMN = FORCE_TERMS.length + 1;
export const CONTACT_FRICTION_COLUMN = FORCE_TERMS.length + 2;

export const FLOW_COLUMNS: readonly FlowColumn[] = [
  ...FORCE_TERMS.map((term): FlowColumn => ({
    name: flowColumnName(term),
    role: term.role,
    counts: term.role === 'dissipative'
      ? `energy removed by ${term.counts}: −Σ F·Δx`
      : `work of ${term.counts}: Σ F·Δx`,
  })),
  { name: 'support_work', role: 'input', counts: 'work the driven nodes do on the rest of the system: −Σ F·Δx over driven nodes, F every force the step computed on them' },
  { name: 'contact_normal_dissipated', role: 'dissipative', counts: 'kinetic energy removed by the normal velocity projection of ground and obstacle contact' },
  { name: 'contact_friction_dissipated', role: 'dissipative', counts: 'kinetic energy removed by Coulomb friction at ground and obstacle contact' },
];

export const FLOW_NAMES: readonly string[] = FLOW_COLUMNS.map((c) => c.name);
export const FLOW_COLUMN_COUNT = FLOW_COLUMNS.length;
