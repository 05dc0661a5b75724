// The editor of one numeric scenario value: a fixed number or a distribution drawn once per
// episode (uniform, log-uniform, normal, integer, categorical), each member with its unit, and a
// histogram of the draws the sweep will make; or a named parameter ({"ref"}) or a value derived
// from named parameters ({"expr"}), written as text and judged by the checker.
import type { ValueSpec } from '../../sim/random/distribution.ts';
import { specBounds } from '../../sim/random/distribution.ts';
import { h, select } from '../ui/element.ts';
import { parameterDraws } from './parameter-draws.ts';
import { formatValue, renderHistogram } from './sample-histogram.ts';

const FIXED = 'fixed';

const KIND_LABELS: Record<string, string> = {
  fixed: 'fixed value',
  uniform: 'uniform',
  'log-uniform': 'log-uniform',
  normal: 'normal (truncated)',
  integer: 'whole numbers',
  categorical: 'categorical (one of listed values)',
  ref: 'named parameter (/params/…)',
  expr: 'derived from named parameters',
};

/** The linked forms every value spec also takes (sim/scenario/linked-parameters.ts). */
const LINKED_KINDS = ['ref', 'expr'] as const;

const MEMBERS: Record<string, string[]> = {
  uniform: ['min', 'max'],
  'log-uniform': ['min', 'max'],
  normal: ['mean', 'std', 'min', 'max'],
  integer: ['min', 'max'],
  categorical: ['values', 'weights'],
};

export interface ValueSpecEditorOptions {
  pointer: string;
  unit: string | null;
  integer: boolean;
  kinds: string[];
  value: unknown;
  masterSeed: () => number | string;
  onValue: (value: unknown) => void;
}

export function valueSpecEditor(options: ValueSpecEditorOptions): HTMLElement {
  const root = h('div', { className: 'value-spec', attrs: { 'data-pointer': options.pointer } });
  let value = options.value;
  const kindSelect = select([[FIXED, KIND_LABELS.fixed], ...[...options.kinds, ...LINKED_KINDS].map((k) => [k, KIND_LABELS[k] ?? k] as const)], kindOf(value), {
    'aria-label': `${options.pointer} is`,
    'data-role': 'spec-kind',
  });
  const members = h('span', { className: 'spec-members' });
  const histogramSlot = h('div', { className: 'histogram-slot' });
  root.append(kindSelect, members, histogramSlot);

  const emit = (next: unknown): void => {
    value = next;
    options.onValue(next);
    drawHistogram();
  };

  const renderMembers = (): void => {
    members.replaceChildren();
    const kind = kindOf(value);
    if (kind === FIXED) {
      members.append(numberInput(options.pointer, value, options.unit, (v) => emit(v)));
      return;
    }
    if (kind === 'ref' || kind === 'expr') {
      const text = (value as Record<string, unknown>)[kind];
      const input = h('input', {
        className: 'expression-input',
        attrs: {
          type: 'text',
          spellcheck: 'false',
          value: typeof text === 'string' ? text : '',
          placeholder: kind === 'ref' ? '/params/stiffnessPa' : '2 * /params/stiffnessPa',
          'data-pointer': `${options.pointer}/${kind}`,
          'aria-label': `${options.pointer}/${kind}`,
        },
      });
      input.addEventListener('change', () => emit({ [kind]: input.value.trim() }));
      members.append(h('span', { className: 'number-with-unit' }, input, options.unit ? h('span', { className: 'unit', text: options.unit }) : null));
      return;
    }
    const spec = value as Record<string, unknown>;
    for (const member of MEMBERS[kind] ?? []) {
      const memberPointer = `${options.pointer}/${member}`;
      if (member === 'values' || member === 'weights') {
        members.append(listInput(member, memberPointer, spec[member], member === 'values' ? options.unit : null, (list) => emit(withMember(spec, member, list))));
      } else {
        members.append(h('label', { className: 'spec-member' }, h('span', { className: 'field-caption', text: member }), numberInput(memberPointer, spec[member], options.unit, (v) => emit(withMember(spec, member, v)))));
      }
    }
  };

  const drawHistogram = (): void => {
    histogramSlot.replaceChildren();
    const kind = kindOf(value);
    // A linked value's draws come from its parameters: their own editors under /params show them.
    if (kind === FIXED || kind === 'ref' || kind === 'expr') return;
    const draws = parameterDraws(value as ValueSpec, options.pointer, options.masterSeed());
    if (!draws) return;
    const bounds = specBounds(value as ValueSpec);
    if (!bounds || !(bounds.max >= bounds.min)) return;
    histogramSlot.append(renderHistogram(draws, bounds.min, bounds.max, kind === 'integer' || options.integer, options.unit, options.pointer));
  };

  kindSelect.addEventListener('change', () => {
    value = convertSpec(value, kindSelect.value, options.integer);
    renderMembers();
    emit(value);
  });
  renderMembers();
  drawHistogram();
  return root;
}

function kindOf(v: unknown): string {
  if (typeof v !== 'object' || v === null) return FIXED;
  const record = v as Record<string, unknown>;
  if (typeof record.kind === 'string') return record.kind;
  for (const linked of LINKED_KINDS) if (typeof record[linked] === 'string') return linked;
  return FIXED;
}

/** Carries the current value over to a new kind, so switching kinds keeps the number's scale. */
function convertSpec(value: unknown, kind: string, integer: boolean): unknown {
  const linkedText = (['ref', 'expr'] as const).map((k) => (value as Record<string, unknown> | null)?.[k]).find((t) => typeof t === 'string') as string | undefined;
  if (kind === 'ref') return { ref: linkedText !== undefined && /^\/params\/[A-Za-z][A-Za-z0-9_]*$/.test(linkedText) ? linkedText : '/params/' };
  const bounds = typeof value === 'number' ? { min: value, max: value } : safeBounds(value);
  const centre = bounds ? 0.5 * (bounds.min + bounds.max) : 0;
  if (kind === 'expr') return { expr: linkedText ?? String(tidy(centre)) };
  const spread = bounds && bounds.max > bounds.min ? bounds.max - bounds.min : Math.abs(centre) * 0.2 || 1;
  const lo = bounds && bounds.max > bounds.min ? bounds.min : centre - 0.5 * spread;
  const hi = bounds && bounds.max > bounds.min ? bounds.max : centre + 0.5 * spread;
  switch (kind) {
    case FIXED:
      return integer ? Math.round(centre) : Number(centre.toPrecision(6));
    case 'uniform':
      return { kind, min: tidy(lo), max: tidy(hi) };
    case 'log-uniform':
      return { kind, min: tidy(lo > 0 ? lo : Math.max(1e-6, hi / 10)), max: tidy(hi > 0 ? hi : 1) };
    case 'normal':
      return { kind, mean: tidy(centre), std: tidy(spread / 4), min: tidy(lo), max: tidy(hi) };
    case 'integer':
      return { kind, min: Math.floor(lo), max: Math.max(Math.floor(lo) + 1, Math.ceil(hi)) };
    case 'categorical':
      return { kind, values: lo === hi ? [tidy(lo)] : [tidy(lo), tidy(hi)] };
    default:
      return value;
  }
}

function safeBounds(value: unknown): { min: number; max: number } | null {
  try {
    const bounds = specBounds(value as ValueSpec);
    // A {"ref"} or {"expr"} has no bounds of its own.
    return bounds !== null && Number.isFinite(bounds.min) && Number.isFinite(bounds.max) ? bounds : null;
  } catch {
    return null;
  }
}

function tidy(v: number): number {
  return Number(v.toPrecision(6));
}

function withMember(spec: Record<string, unknown>, member: string, v: unknown): Record<string, unknown> {
  const next = { ...spec };
  if (v === undefined) delete next[member];
  else next[member] = v;
  return next;
}

/**
 * A text box for a number: what is typed is kept, so a typo reaches the checker and is reported
 * there. A word such as "auto" shows as the word, without its JSON quotes.
 */
export function numberInput(pointer: string, value: unknown, unit: string | null, onValue: (v: unknown) => void): HTMLElement {
  const input = h('input', {
    className: 'number-input',
    attrs: { type: 'text', inputmode: 'decimal', spellcheck: 'false', value: value === undefined ? '' : typeof value === 'number' || typeof value === 'string' ? String(value) : JSON.stringify(value), 'data-pointer': pointer, 'aria-label': pointer },
  });
  input.addEventListener('change', () => onValue(parseTyped(input.value)));
  return h('span', { className: 'number-with-unit' }, input, unit ? h('span', { className: 'unit', text: unit }) : null);
}

function listInput(member: string, pointer: string, value: unknown, unit: string | null, onValue: (v: unknown) => void): HTMLElement {
  const text = Array.isArray(value) ? value.map((v) => (typeof v === 'number' ? formatValue(v) : JSON.stringify(v))).join(', ') : '';
  const input = h('input', { className: 'list-input', attrs: { type: 'text', spellcheck: 'false', value: text, 'data-pointer': pointer, 'aria-label': pointer, placeholder: member === 'weights' ? 'equal chances' : '1, 2, 3' } });
  input.addEventListener('change', () => {
    const trimmed = input.value.trim();
    if (trimmed === '' && member === 'weights') return onValue(undefined);
    onValue(trimmed === '' ? [] : trimmed.split(',').map((part) => parseTyped(part.trim())));
  });
  return h('label', { className: 'spec-member' }, h('span', { className: 'field-caption', text: member }), input, unit ? h('span', { className: 'unit', text: unit }) : null);
}

/** A number where the text is one; else the text itself (or null for "null"), for the checker to judge. */
export function parseTyped(text: string): unknown {
  const trimmed = text.trim();
  if (trimmed === 'null') return null;
  if (trimmed === 'true' || trimmed === 'false') return trimmed === 'true';
  if (trimmed !== '' && Number.isFinite(Number(trimmed))) return Number(trimmed);
  return trimmed;
}
