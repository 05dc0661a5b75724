// What each array of an episode holds: its name in the files, its shape in symbols, its unit
// and its meaning. The manifest, the dataset card and LAYOUT.md all quote this one table, so a
// learner reading any of them gets the same description of every column.
import { ENERGY_BASE_COUNT, ENERGY_TERMS } from '../../core/energy.ts';
import { FLOW_COLUMNS } from '../../core/energy-flows.ts';
import { RELATION_NAMES } from '../../core/model.ts';
import { NODE_FEATURE_NAMES } from '../../systems/graph-labels.ts';

/** 'float' arrays take the dataset's export dtype (float32 or float64); the rest are fixed. */
export type CatalogueDtype = 'float' | 'int32' | 'uint8' | 'int16';

export interface ArrayDescription {
  name: string;
  dtype: CatalogueDtype;
  /** Shape in symbols: T recorded steps, N nodes, C control channels, E springs, K cells, H hinges, Q clamps, T_obs observed frames, M markers. */
  shape: string[];
  unit: string;
  meaning: string;
  /** Only lattices have cells. */
  latticeOnly?: boolean;
  /** Only scenarios with an `observation` block have observed arrays. */
  observationOnly?: boolean;
  /** Only chains have hinges and clamps (H or Q may be 0: no bending rigidity, no clamped end). */
  chainOnly?: boolean;
  /** Stored only when the scenario asks: numerics.energyBalance or export.forces. */
  onlyWith?: 'energyBalance' | 'forces';
}

export const ENERGY_COLUMNS: readonly string[] = ENERGY_TERMS.map((term) => term.name);
export const FLOW_COLUMN_NAMES: readonly string[] = FLOW_COLUMNS.map((column) => column.name);

const FORCE_TIME = 'averaged over the record interval from time[t] to time[t+1] (impulse / interval, the force that explains the velocity change between two records)';

export const EPISODE_ARRAYS: readonly ArrayDescription[] = [
  { name: 'time', dtype: 'float', shape: ['T+1'], unit: 's', meaning: 'record times from the start of the episode; row t of positions, velocities and energies is the state at time[t]' },
  { name: 'positions', dtype: 'float', shape: ['T+1', 'N', '3'], unit: 'm', meaning: 'node positions (x, y, z) at each record time; y is up' },
  { name: 'velocities', dtype: 'float', shape: ['T+1', 'N', '3'], unit: 'm/s', meaning: 'node velocities at each record time' },
  { name: 'controls', dtype: 'float', shape: ['T', 'C'], unit: 'per channel (see controlChannels: N, m or 1)', meaning: 'control applied from time[t] to time[t+1]; column c is control channel c' },
  { name: 'energies', dtype: 'float', shape: ['T+1', `${ENERGY_BASE_COUNT} (${ENERGY_TERMS.length} with numerics.energyBalance)`], unit: 'J', meaning: `energies at each record time, columns: ${ENERGY_TERMS.map((term, i) => `${term.name} (${term.counts})${i >= ENERGY_BASE_COUNT ? ' [only with numerics.energyBalance]' : ''}`).join('; ')}` },
  { name: 'energy_flows', dtype: 'float', shape: ['T+1', String(FLOW_COLUMNS.length)], unit: 'J', onlyWith: 'energyBalance', meaning: `energy that crossed into or out of the free nodes from time 0 to time[t], cumulative; Δx is (v + v*)/2·dt per sub-step for free nodes (v* the velocity after the force update, before contact) and the actual displacement for driven nodes; columns: ${FLOW_COLUMNS.map((column) => `${column.name} (${column.counts})`).join('; ')}` },
  { name: 'node_features', dtype: 'float', shape: ['N', String(NODE_FEATURE_NAMES.length)], unit: 'kg for mass_kg, else 1', meaning: `per-node features, columns ${NODE_FEATURE_NAMES.join(', ')} (flags are 0/1; material and channel are indices, -1 for none)` },
  { name: 'edges', dtype: 'int32', shape: ['E', '2'], unit: '1', meaning: 'node indices (a, b) of each spring' },
  { name: 'edge_relation', dtype: 'uint8', shape: ['E'], unit: '1', meaning: `relation type of each spring: ${RELATION_NAMES.map((name, i) => `${i} ${name}`).join(', ')}` },
  { name: 'edge_rest_length', dtype: 'float', shape: ['E'], unit: 'm', meaning: 'rest length of each spring without actuation' },
  { name: 'edge_stiffness', dtype: 'float', shape: ['E'], unit: 'N/m', meaning: 'stiffness k of each spring: force k·(L − rest length) along the spring' },
  { name: 'edge_damping', dtype: 'float', shape: ['E'], unit: 'N·s/m', meaning: 'damping c of each spring along its axis: force c·(relative velocity · unit axis)' },
  { name: 'edge_tension', dtype: 'float', shape: ['T', 'E'], unit: 'N', onlyWith: 'forces', meaning: `axial force of each spring, k·(L − rest length) + c·(relative velocity · unit axis), positive in tension, ${FORCE_TIME}` },
  { name: 'contact_normal_force', dtype: 'float', shape: ['T', 'N', '3'], unit: 'N', onlyWith: 'forces', meaning: `force of the ground and obstacles on each node along the contact normal, ${FORCE_TIME}; zero without contact` },
  { name: 'contact_friction_force', dtype: 'float', shape: ['T', 'N', '3'], unit: 'N', onlyWith: 'forces', meaning: `Coulomb friction force of the ground and obstacles on each node, ${FORCE_TIME}` },
  { name: 'fluid_force', dtype: 'float', shape: ['T', 'N', '3'], unit: 'N', onlyWith: 'forces', meaning: `resistive-force drag of the fluid on each node (buoyancy not included: it is ρ·V·(−g) per node), ${FORCE_TIME}` },
  { name: 'cells', dtype: 'int32', shape: ['K', 'corners'], unit: '1', meaning: 'corner node indices of each cell (8 for voxels, 4 for squares; corner bit 0 = +x, bit 1 = +y, bit 2 = +z)', latticeOnly: true },
  { name: 'cell_material', dtype: 'int16', shape: ['K'], unit: '1', meaning: 'material index of each cell (into the scenario\'s materials)', latticeOnly: true },
  { name: 'hinges', dtype: 'int32', shape: ['H', '3'], unit: '1', meaning: 'node indices (previous, middle, next) of each bending hinge: energy k·(1 − cos φ) in the turning angle φ between the segments previous→middle and middle→next', chainOnly: true },
  { name: 'hinge_stiffness', dtype: 'float', shape: ['H'], unit: 'N·m', meaning: 'bending stiffness k of each hinge, EI over the middle node\'s Voronoi length', chainOnly: true },
  { name: 'hinge_damping', dtype: 'float', shape: ['H'], unit: 'N·m·s', meaning: 'bending damping η of each hinge: dissipated power η·(d|t_b − t_a|/dt)², t_a and t_b the unit tangents of its segments', chainOnly: true },
  { name: 'clamps', dtype: 'int32', shape: ['Q', '2'], unit: '1', meaning: 'node indices (held end, neighbour) of each clamped end: energy k·(1 − cos φ), φ the angle between the segment and clamp_direction', chainOnly: true },
  { name: 'clamp_direction', dtype: 'float', shape: ['Q', '3'], unit: '1', meaning: 'unit vector each clamp holds its segment (held end → neighbour) along', chainOnly: true },
  { name: 'clamp_stiffness', dtype: 'float', shape: ['Q'], unit: 'N·m', meaning: 'bending stiffness k of each clamp, EI over half a segment', chainOnly: true },
  { name: 'clamp_damping', dtype: 'float', shape: ['Q'], unit: 'N·m·s', meaning: 'bending damping η of each clamp, as for hinges with t_a the clamp direction', chainOnly: true },
  { name: 'cell_channel', dtype: 'int16', shape: ['K'], unit: '1', meaning: 'actuator channel of each cell, -1 for passive cells', latticeOnly: true },
  { name: 'observed_time', dtype: 'float', shape: ['T_obs'], unit: 's', meaning: 'time at which each observed frame is reported: time[j·frameStride]', observationOnly: true },
  { name: 'observed_positions', dtype: 'float', shape: ['T_obs', 'M', '3'], unit: 'm', meaning: 'marker positions as the sensor reports them: the state at observed_time[j] − latencyS plus Gaussian noise; NaN where observed_mask is 0', observationOnly: true },
  { name: 'observed_mask', dtype: 'uint8', shape: ['T_obs', 'M'], unit: '1', meaning: '1 where the marker was seen, 0 where it dropped out or the delayed state is before the start', observationOnly: true },
  { name: 'observed_nodes', dtype: 'int32', shape: ['M'], unit: '1', meaning: 'node index of each marker (column m of the observed arrays)', observationOnly: true },
];

export function describeArray(name: string): ArrayDescription {
  const found = EPISODE_ARRAYS.find((a) => a.name === name);
  if (!found) throw new RangeError(`no array named ${name} in the episode catalogue`);
  return found;
}
