// The checker every front end uses: scenario text (or an already parsed value) in, either the
// checked Scenario with its defaults filled in, or every problem found, each with its JSON
// pointer and, for text, its line and column. Nothing here throws for a user's mistake.
import { drawTextMaps } from './draw-text-maps.ts';
import { parseJsonText, placeProblems } from './json-source-map.ts';
import { checkLinks } from './linked-parameters.ts';
import { expandMaterialTemplates, hasMaterialTemplates } from './material-templates.ts';
import { findPhysicalProblems } from './physical-checks.ts';
import { findRangeProblemsBesideSchema } from './range-checks-beside-schema.ts';
import type { ScenarioProblem } from './scenario-problem.ts';
import type { Scenario } from './scenario-types.ts';
import { findSchemaProblems } from './schema-problems.ts';

export type ScenarioCheck = { ok: true; scenario: Scenario } | { ok: false; problems: ScenarioProblem[] };

/** `fileName` is named in the message for an empty file; formatProblems prints it before every line. */
export function checkScenarioText(text: string, fileName: string): ScenarioCheck {
  const parsed = parseJsonText(text, fileName);
  if (!parsed.ok) return parsed;
  const checked = checkScenarioValue(parsed.value);
  if (checked.ok) return checked;
  const placed = placeProblems(checked.problems, parsed.sourceMap);
  placed.sort((a, b) => (a.line ?? 0) - (b.line ?? 0) || (a.column ?? 0) - (b.column ?? 0));
  return { ok: false, problems: placed };
}

export function checkScenarioValue(value: unknown): ScenarioCheck {
  // Defaults are filled into a copy, so the caller's value stays as written.
  const copy = copyJson(value);
  const schemaProblems = findSchemaProblems(copy);
  // The parts the schema accepts are checked further right away, so every problem shows at once.
  if (schemaProblems.length > 0) return { ok: false, problems: [...schemaProblems, ...findRangeProblemsBesideSchema(copy, schemaProblems)] };
  if (hasMaterialTemplates(copy)) {
    const expanded = expandMaterialTemplates(copy);
    if (expanded.length > 0) return { ok: false, problems: expanded };
    // Once more over the plain materials: fills the defaults a templated material had none of.
    const again = findSchemaProblems(copy);
    if (again.length > 0) return { ok: false, problems: again };
  }
  const scenario = copy as Scenario;
  const drawn = drawTextMaps(scenario);
  if (drawn.length > 0) return { ok: false, problems: drawn };
  // Named parameters: names, syntax, cycles and each linked place's range against its limits;
  // the other checks read the range view, where each linked place stands as the range it reaches.
  const linked = checkLinks(scenario, findSchemaProblems);
  if (!linked.ok) return { ok: false, problems: linked.problems };
  const physical = findPhysicalProblems(linked.view, scenario);
  if (physical.length > 0) return { ok: false, problems: physical };
  return { ok: true, scenario };
}

// A plain recursive copy: a JSON round trip would turn an overflowing 1e400 (Infinity) into null.
function copyJson(value: unknown): unknown {
  if (Array.isArray(value)) return value.map(copyJson);
  if (value !== null && typeof value === 'object') {
    const out: Record<string, unknown> = {};
    // defineProperty, because assigning a "__proto__" key would replace the prototype instead.
    for (const [key, inner] of Object.entries(value)) Object.defineProperty(out, key, { value: copyJson(inner), enumerable: true, writable: true, configurable: true });
    return out;
  }
  return value;
}
