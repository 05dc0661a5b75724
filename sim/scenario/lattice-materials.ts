// Lattice material specs to the builder's materials, and the per-channel copies that let a
// generated shape drive each actuated cell by a channel of its own.
import type { LatticeMaterial } from '../systems/lattice.ts';
import type { ParameterResolver } from './parameter-resolver.ts';
import type { LatticeSystemSpec } from './scenario-types.ts';

/** One material per spec material, in order. */
export function resolveLatticeMaterials(spec: LatticeSystemSpec, resolver: ParameterResolver): LatticeMaterial[] {
  // Spring k ∝ E·a and node mass ∝ ρ·a³: the stiffest, lightest cells have high E, low ρ.
  return spec.materials.map((m, i) => ({
    name: m.name,
    youngsModulusPa: resolver.value(m.youngsModulusPa, `/system/materials/${i}/youngsModulusPa`, 'high'),
    densityKgPerM3: resolver.value(m.densityKgPerM3, `/system/materials/${i}/densityKgPerM3`, 'low'),
    dampingRatio: resolver.value(m.dampingRatio, `/system/materials/${i}/dampingRatio`, 'high'),
    actuatorChannel: m.actuatorChannel,
    actuationStrainMax: resolver.value(m.actuationStrainMax, `/system/materials/${i}/actuationStrainMax`, 'none'),
  }));
}

export interface ChannelledMaterials {
  materials: LatticeMaterial[];
  /** Index into `materials` of spec material `material` driven by `channel` (ignored for passive ones). */
  indexOf(material: number, channel: number): number;
}

/**
 * With `channelCount` given, each actuated material becomes one copy per channel ("fin@0",
 * "fin@1", …) so cells of it can be driven separately; with 0 channels it turns passive.
 * Without `channelCount` the materials are used as written.
 */
export function channelledMaterials(materials: readonly LatticeMaterial[], channelCount: number | undefined): ChannelledMaterials {
  if (channelCount === undefined) return { materials: [...materials], indexOf: (material) => material };
  const expanded: LatticeMaterial[] = [];
  const first: number[] = [];
  for (const m of materials) {
    first.push(expanded.length);
    if (m.actuatorChannel === null) {
      expanded.push(m);
    } else if (channelCount === 0) {
      expanded.push({ ...m, actuatorChannel: null });
    } else {
      for (let c = 0; c < channelCount; c++) expanded.push({ ...m, name: `${m.name}@${c}`, actuatorChannel: c });
    }
  }
  return {
    materials: expanded,
    indexOf: (material, channel) => (materials[material].actuatorChannel === null || channelCount === 0 ? first[material] : first[material] + channel),
  };
}
