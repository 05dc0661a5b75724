// Expands a lattice's material templates into plain materials, in place: a material written as
// {"name": ..., "template": "segment", ...} takes every member of /system/materialTemplates/segment
// and then its own members on top. Runs right after the schema check (which has already checked
// each member on its own) and before the text maps are drawn, in the checker and in the page's
// preview worker alike, so every later check, the sampler and the seed file see full materials.
// Members a material gets from neither its template nor itself take the plain material's
// defaults: the caller fills the schema's defaults once more after expanding (ajv in the
// checker, the schema walk in the page), since a templated material has none of its own.
import { closestName } from './closest-name.ts';
import type { ScenarioProblem } from './scenario-problem.ts';

const REQUIRED_MEMBERS = ['youngsModulusPa', 'densityKgPerM3', 'dampingRatio'] as const;

type JsonObject = Record<string, unknown>;

function isObject(value: unknown): value is JsonObject {
  return value !== null && typeof value === 'object' && !Array.isArray(value);
}

/** True when the scenario still holds templates or templated materials to expand. */
export function hasMaterialTemplates(scenario: unknown): boolean {
  const system = isObject(scenario) ? scenario.system : undefined;
  if (!isObject(system) || system.kind !== 'lattice') return false;
  if (system.materialTemplates !== undefined) return true;
  return Array.isArray(system.materials) && system.materials.some((m) => isObject(m) && m.template !== undefined);
}

/**
 * Replaces every templated material of a schema-checked scenario by the plain material it
 * stands for and removes /system/materialTemplates. Returns the problems found (an unknown
 * template, a required member given nowhere); the scenario is then left partly expanded.
 */
export function expandMaterialTemplates(scenario: unknown): ScenarioProblem[] {
  const system = isObject(scenario) ? scenario.system : undefined;
  if (!isObject(system) || system.kind !== 'lattice' || !Array.isArray(system.materials)) return [];
  const templates = isObject(system.materialTemplates) ? system.materialTemplates : {};
  const templateNames = Object.keys(templates);
  const problems: ScenarioProblem[] = [];
  const usedTemplates = new Set<string>();
  system.materials = system.materials.map((material: unknown, index: number) => {
    if (!isObject(material) || typeof material.template !== 'string') return material;
    const pointer = `/system/materials/${index}`;
    const templateName = material.template;
    // Object.hasOwn, so a template named like an Object.prototype member is not found by accident.
    if (!Object.hasOwn(templates, templateName)) {
      const near = closestName(templateName, templateNames);
      const fix = templateNames.length === 0
        ? 'add it under /system/materialTemplates, or remove "template" and give the members here'
        : near !== undefined
          ? `did you mean "${near}"?`
          : `the templates are ${templateNames.map((n) => `"${n}"`).join(', ')}`;
      problems.push({ pointer: `${pointer}/template`, message: `names no template in /system/materialTemplates (got "${templateName}"): ${fix}` });
      return material;
    }
    usedTemplates.add(templateName);
    const template = templates[templateName] as JsonObject;
    const expanded: JsonObject = { name: material.name };
    for (const [key, value] of Object.entries(template)) expanded[key] = structuredCopy(value);
    for (const [key, value] of Object.entries(material)) if (key !== 'name' && key !== 'template') expanded[key] = value;
    for (const member of REQUIRED_MEMBERS) {
      if (expanded[member] === undefined) {
        problems.push({ pointer, message: `material "${String(material.name)}" has no ${member}: give it here or in template "${templateName}"` });
      }
    }
    return expanded;
  });
  if (problems.length > 0) return problems;
  delete system.materialTemplates;
  return [];
}

// Each material gets its own copy of the template's distributions, so a later in-place change
// to one material (defaults, overrides) cannot reach another.
function structuredCopy(value: unknown): unknown {
  if (Array.isArray(value)) return value.map(structuredCopy);
  if (isObject(value)) {
    const out: JsonObject = {};
    for (const [key, inner] of Object.entries(value)) out[key] = structuredCopy(inner);
    return out;
  }
  return value;
}
