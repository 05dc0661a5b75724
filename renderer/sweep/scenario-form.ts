// The scenario as a form, generated from SCENARIO_SCHEMA: nested objects become sections, enums
// become selects, every numeric physical value gets a fixed-or-distribution editor with its unit
// and a histogram, optional members can be added and removed, and anything without a dedicated
// editor (material maps) is edited as a small JSON box. Problems from the checker appear at the
// field their JSON pointer names, or at its nearest shown ancestor. Every section folds, and a
// navigation column jumps to the top-level ones and counts their problems. Labels are the
// schema's words with the unit ("Length, m"); the key shows on hover.
import { button, h, select } from '../ui/element.ts';
import { fieldLabel } from './field-label.ts';
import { pointerAncestry, pointerOf, setValueAt } from './json-pointer.ts';
import type { FieldKind, SchemaObject } from './schema-shape.ts';
import { SchemaReader } from './schema-shape.ts';
import type { SectionEntry } from './section-nav.ts';
import { SectionNav } from './section-nav.ts';
import { unitOfField } from './unit-from-key.ts';
import { numberInput, valueSpecEditor } from './value-spec-editor.ts';

export interface ScenarioFormEvents {
  /** The document was changed in place; `structural` when members or forms came or went (the form is then rebuilt). */
  changed(structural: boolean): void;
  masterSeed(): number | string;
}

export interface PlacedProblem {
  pointer: string;
  /** The problem as `pliant validate` prints it. */
  text: string;
}

const AXIS_NAMES = ['x', 'y', 'z'];

export class ScenarioForm {
  readonly root = h('div', { className: 'scenario-form', attrs: { 'data-role': 'scenario-form' } });
  private readonly reader: SchemaReader;
  private readonly slots = new Map<string, HTMLElement>();
  readonly nav = new SectionNav((pointer) => this.reveal(pointer));
  /** Pointers of the sections the person folded; kept when the form is built again. */
  private readonly folded = new Set<string>();
  private readonly sections = new Map<string, HTMLElement>();
  private document: Record<string, unknown> = {};

  constructor(schema: SchemaObject, private readonly events: ScenarioFormEvents) {
    this.reader = new SchemaReader(schema);
  }

  render(document: Record<string, unknown>): void {
    this.document = document;
    this.slots.clear();
    this.sections.clear();
    const scroll = this.root.scrollTop;
    const rootSlot = h('div', { className: 'field-problems', attrs: { 'data-problems-for': '' } });
    this.slots.set('', rootSlot);
    this.root.replaceChildren(rootSlot, this.objectBody(this.reader.root, document, ''));
    this.root.scrollTop = scroll;
    this.nav.show(this.sectionEntries());
  }

  /** Unfolds the field a problem at `pointer` is shown at (its nearest shown ancestor) and scrolls to it. */
  revealProblem(pointer: string): void {
    const home = pointerAncestry(pointer).find((p) => this.slots.has(p)) ?? '';
    const slot = this.slots.get(home);
    this.reveal(home, slot?.closest<HTMLElement>('.field') ?? undefined);
  }

  /** Unfolds the section at pointer (and every section around it) and scrolls it into view. */
  reveal(pointer: string, element?: HTMLElement): void {
    const target = element ?? (pointer === '' ? this.root : this.sections.get(pointer));
    if (!target) return;
    for (let section: HTMLElement | null = target; section; section = section.parentElement?.closest<HTMLElement>('.section') ?? null) {
      const at = section.getAttribute('data-pointer');
      if (at !== null && this.folded.has(at)) this.setFolded(section, at, false);
    }
    target.scrollIntoView({ block: 'start' });
    target.querySelector<HTMLElement>('.fold-toggle, input, select, textarea')?.focus({ preventScroll: true });
  }

  /** The scenario's own values, each top-level section, and the materials of a lattice. */
  private sectionEntries(): SectionEntry[] {
    const entries: SectionEntry[] = [{ pointer: '', label: 'General', nested: false }];
    for (const [pointer, section] of this.sections) {
      const depth = pointer.split('/').length - 1;
      const name = section.getAttribute('data-section-label') ?? pointer;
      if (depth === 1) entries.push({ pointer, label: name, nested: false });
      else if (pointer === '/system/materials' || pointer === '/system/materialTemplates') entries.push({ pointer, label: name, nested: true });
    }
    return entries;
  }

  private setFolded(section: HTMLElement, pointer: string, folded: boolean): void {
    if (folded) this.folded.add(pointer);
    else this.folded.delete(pointer);
    section.classList.toggle('is-folded', folded);
    const toggle = section.querySelector(':scope > legend .fold-toggle');
    toggle?.setAttribute('aria-expanded', String(!folded));
    toggle?.setAttribute('title', folded ? 'Show this section' : 'Fold this section away');
  }

  /** Shows each problem at its field; returns how many found no closer home than the whole document. */
  showProblems(problems: PlacedProblem[]): number {
    for (const slot of this.slots.values()) {
      slot.replaceChildren();
      slot.closest('.field')?.classList.remove('has-problem');
    }
    this.nav.showProblems(problems.map((p) => p.pointer));
    let atRoot = 0;
    for (const problem of problems) {
      const home = pointerAncestry(problem.pointer).find((p) => this.slots.has(p)) ?? '';
      if (home === '') atRoot++;
      const slot = this.slots.get(home)!;
      slot.append(h('div', { className: 'problem', text: problem.text, attrs: { 'data-problem-pointer': problem.pointer, role: 'alert' } }));
      slot.closest('.field')?.classList.add('has-problem');
    }
    return atRoot;
  }

  private set(pointer: string, value: unknown, structural: boolean): void {
    setValueAt(this.document, pointer, value);
    this.events.changed(structural);
  }

  private objectBody(schema: unknown, value: unknown, pointer: string): HTMLElement {
    const kind = this.reader.classify(schema, value);
    if (kind.kind !== 'object') return this.editor(kind, schema, value, pointer, '');
    const body = h('div', { className: 'section-body' });
    const current = (value ?? {}) as Record<string, unknown>;
    const addable: HTMLElement[] = [];
    for (const [key, sub] of Object.entries(kind.properties)) {
      const childPointer = pointerOf(pointer, key);
      if (key === '$schema') continue;
      if (kind.discriminator && key === kind.discriminator.key) {
        body.append(this.discriminatorField(kind.discriminator.values, schema, current, pointer, key));
        continue;
      }
      const present = key in current;
      const optional = !kind.required.includes(key);
      if (!present) {
        if (optional) addable.push(button(`+ ${fieldLabel(key, this.reader.resolve(sub).title, null)}`, () => this.set(childPointer, this.reader.defaultValue(sub), true), { className: 'add-member', title: `${key}: ${describe(this.reader.resolve(sub))}`, attrs: { 'data-add': childPointer } }));
        else body.append(this.field(key, sub, undefined, childPointer, false));
        continue;
      }
      body.append(this.field(key, sub, current[key], childPointer, optional));
    }
    if (addable.length > 0) body.append(h('div', { className: 'add-row' }, h('span', { className: 'add-caption', text: 'Add:' }), ...addable));
    return body;
  }

  private discriminatorField(values: string[], schema: unknown, current: Record<string, unknown>, pointer: string, key: string): HTMLElement {
    const childPointer = pointerOf(pointer, key);
    const chooser = select(values.map((v) => [v, v] as const), String(current[key] ?? values[0]), { 'data-pointer': childPointer, 'aria-label': childPointer });
    chooser.addEventListener('change', () => {
      // A new kind has other members: start it from the schema's defaults for that kind.
      const branch = this.reader.effective(schema, { [key]: chooser.value });
      const fresh = this.reader.defaultValue(branch) as Record<string, unknown>;
      fresh[key] = chooser.value;
      if (pointer === '') throw new RangeError('the document itself has no kind');
      this.set(pointer, fresh, true);
    });
    const member = this.reader.resolve((this.reader.effective(schema, current).properties as SchemaObject)?.[key]);
    return this.wrapField(key, childPointer, null, describe(member), chooser, false, fieldLabel(key, member.title, null));
  }

  /** `named`: the key is a name the person chose (a material, a channel), shown as written. */
  private field(key: string, schema: unknown, value: unknown, pointer: string, optional: boolean, named = false): HTMLElement {
    const resolved = this.reader.resolve(schema);
    const kind = this.reader.classify(schema, value);
    const unit = unitOfField(key, typeof resolved.description === 'string' ? resolved.description : undefined);
    const title = named ? undefined : resolved.title;
    if (kind.kind === 'object' || kind.kind === 'record' || kind.kind === 'variants' || (kind.kind === 'array' && !this.isInlineArray(kind))) {
      const label = fieldLabel(key, title, null);
      const section = h('fieldset', { className: 'field section', attrs: { 'data-pointer': pointer, 'data-section-label': label } });
      const toggle = button('▾', () => this.setFolded(section, pointer, !section.classList.contains('is-folded')), { className: 'fold-toggle', attrs: { 'aria-expanded': 'true', 'aria-label': `Fold ${label}`, 'data-fold': pointer } });
      const legend = h('legend', {}, toggle, h('span', { className: 'section-name', text: label, title: key }));
      if (optional) legend.append(button('remove', () => this.set(pointer, undefined, true), { className: 'remove-member', attrs: { 'data-remove': pointer } }));
      const slot = h('div', { className: 'field-problems', attrs: { 'data-problems-for': pointer } });
      this.slots.set(pointer, slot);
      this.sections.set(pointer, section);
      section.append(legend, h('p', { className: 'field-help', text: firstSentence(describe(resolved)) }), slot, this.editor(kind, schema, value, pointer, key, null, label));
      if (this.folded.has(pointer)) this.setFolded(section, pointer, true);
      return section;
    }
    return this.wrapField(key, pointer, unit, describe(resolved), this.editor(kind, schema, value, pointer, key, unit), optional, fieldLabel(key, title, unit));
  }

  private wrapField(key: string, pointer: string, unit: string | null, description: string, editor: HTMLElement, optional: boolean, label = key): HTMLElement {
    const slot = h('div', { className: 'field-problems', attrs: { 'data-problems-for': pointer } });
    this.slots.set(pointer, slot);
    const caption = h('div', { className: 'field-head' }, h('span', { className: 'field-name', text: label, title: key }), unit === '1' ? h('span', { className: 'unit-badge', text: 'dimensionless' }) : null);
    if (optional) caption.append(button('remove', () => this.set(pointer, undefined, true), { className: 'remove-member', attrs: { 'data-remove': pointer } }));
    return h('div', { className: 'field', attrs: { 'data-pointer': pointer } }, caption, editor, h('p', { className: 'field-help', text: firstSentence(description) }), slot);
  }

  private isInlineArray(kind: Extract<FieldKind, { kind: 'array' }>): boolean {
    const item = this.reader.resolve(kind.itemSchema);
    return kind.fixedLength !== null || Array.isArray(item.enum) || this.reader.classify(item, undefined).kind === 'json' || isArrayType(item);
  }

  private editor(kind: FieldKind, schema: unknown, value: unknown, pointer: string, key: string, unit: string | null = null, label = key): HTMLElement {
    switch (kind.kind) {
      case 'value-spec':
        return valueSpecEditor({
          pointer,
          unit,
          integer: kind.integer,
          kinds: kind.distributionKinds,
          value: value ?? this.reader.defaultValue(schema),
          masterSeed: () => this.events.masterSeed(),
          onValue: (v) => this.set(pointer, v, false),
        });
      case 'enum': {
        const values = kind.values;
        const chooser = select(values.map((v, i) => [String(i), String(v)] as const), String(Math.max(0, values.indexOf(value as never))), { 'data-pointer': pointer, 'aria-label': pointer });
        if (value === undefined) chooser.selectedIndex = -1;
        chooser.addEventListener('change', () => this.set(pointer, values[Number(chooser.value)], false));
        return chooser;
      }
      case 'const':
        return h('span', { className: 'const-value', text: JSON.stringify(kind.value) });
      case 'boolean': {
        const box = h('input', { attrs: { type: 'checkbox', 'data-pointer': pointer, 'aria-label': pointer } });
        box.checked = value === true;
        box.addEventListener('change', () => this.set(pointer, box.checked, false));
        return box;
      }
      case 'number':
        return numberInput(pointer, value, unit, (v) => this.set(pointer, v, false));
      case 'scalar':
        return numberInput(pointer, value, unit, (v) => this.set(pointer, v === '' && kind.types.includes('null') ? null : v, false));
      case 'string': {
        const text = kind.multiline && key === 'description' ? h('textarea', { attrs: { rows: '3', 'data-pointer': pointer, 'aria-label': pointer } }) : h('input', { attrs: { type: 'text', 'data-pointer': pointer, 'aria-label': pointer, spellcheck: 'false' } });
        text.value = typeof value === 'string' ? value : value === undefined ? '' : JSON.stringify(value);
        text.addEventListener('change', () => this.set(pointer, text.value, false));
        return text;
      }
      case 'object':
        return this.objectBody(schema, value, pointer);
      case 'variants':
        return this.variantsEditor(kind.variants, value, pointer);
      case 'record':
        return this.recordEditor(kind.valueSchema, value, pointer);
      case 'array':
        return this.arrayEditor(kind, value, pointer, key, unit, label);
      case 'json':
        return this.jsonBox(value, pointer);
    }
  }

  private variantsEditor(variants: { label: string; schema: SchemaObject }[], value: unknown, pointer: string): HTMLElement {
    const index = this.reader.matchingVariant(variants, value);
    const chooser = select(variants.map((v, i) => [String(i), v.label] as const), String(index), { 'data-pointer': `${pointer}#form`, 'aria-label': `${pointer} form` });
    chooser.addEventListener('change', () => this.set(pointer, this.reader.defaultValue(variants[Number(chooser.value)].schema), true));
    return h('div', { className: 'variants' }, h('label', { className: 'field-inline' }, h('span', { className: 'field-caption', text: 'form' }), chooser), this.objectBody(variants[index].schema, value, pointer));
  }

  private recordEditor(valueSchema: SchemaObject, value: unknown, pointer: string): HTMLElement {
    const entries = Object.entries((value ?? {}) as Record<string, unknown>);
    const list = h('div', { className: 'record-entries' });
    for (const [name, entry] of entries) {
      const entryPointer = pointerOf(pointer, name);
      list.append(this.field(name, valueSchema, entry, entryPointer, true, true));
    }
    const nameInput = h('input', { attrs: { type: 'text', placeholder: 'name, e.g. actuator-0', 'aria-label': `new member of ${pointer}`, 'data-role': 'record-new-name' } });
    const add = button('+ add', () => {
      const name = nameInput.value.trim();
      if (name === '') return;
      this.set(pointerOf(pointer, name), this.reader.defaultValue(valueSchema), true);
    }, { className: 'add-member' });
    list.append(h('div', { className: 'add-row' }, nameInput, add));
    return list;
  }

  private arrayEditor(kind: Extract<FieldKind, { kind: 'array' }>, value: unknown, pointer: string, key: string, unit: string | null, words = key): HTMLElement {
    const items = Array.isArray(value) ? value : [];
    const item = this.reader.resolve(kind.itemSchema);
    if (Array.isArray(item.enum)) return this.enumSetEditor(item.enum as string[], items, pointer);
    if (isArrayType(item) || this.reader.classify(item, undefined).kind === 'json') return this.jsonBox(value, pointer);
    const list = h('div', { className: kind.fixedLength !== null ? 'array-inline' : 'array-items' });
    items.forEach((entry, i) => {
      const itemPointer = pointerOf(pointer, i);
      const itemKind = this.reader.classify(item, entry);
      // An item with a name (a material) shows it; others their place, counted from 1 as people do.
      const named = typeof entry === 'object' && entry !== null && typeof (entry as { name?: unknown }).name === 'string' ? (entry as { name: string }).name : null;
      const label = kind.fixedLength === 3 ? AXIS_NAMES[i] : named ?? `${words} ${i + 1}`;
      if (itemKind.kind === 'object' || itemKind.kind === 'variants') {
        const section = this.field(label, item, entry, itemPointer, false, true);
        if (kind.fixedLength === null) section.querySelector('legend')?.append(button('remove', () => this.set(itemPointer, undefined, true), { className: 'remove-member', attrs: { 'data-remove': itemPointer } }));
        list.append(section);
        return;
      }
      const slot = h('div', { className: 'field-problems', attrs: { 'data-problems-for': itemPointer } });
      this.slots.set(itemPointer, slot);
      const row = h('div', { className: 'field array-item', attrs: { 'data-pointer': itemPointer } }, h('span', { className: 'field-caption', text: label }), this.editor(itemKind, item, entry, itemPointer, key, unit));
      if (kind.fixedLength === null) row.append(button('remove', () => this.set(itemPointer, undefined, true), { className: 'remove-member', attrs: { 'data-remove': itemPointer } }));
      row.append(slot);
      list.append(row);
    });
    if (kind.fixedLength === null) {
      list.append(button(`+ ${key} entry`, () => this.set(pointerOf(pointer, items.length), this.reader.defaultValue(item), true), { className: 'add-member', attrs: { 'data-add': pointerOf(pointer, items.length) } }));
    }
    return list;
  }

  private enumSetEditor(options: string[], items: unknown[], pointer: string): HTMLElement {
    const row = h('div', { className: 'enum-set' });
    for (const option of options) {
      const box = h('input', { attrs: { type: 'checkbox', 'aria-label': `${pointer} ${option}` } });
      box.checked = items.includes(option);
      box.addEventListener('change', () => {
        const chosen = options.filter((o) => (o === option ? box.checked : items.includes(o)));
        this.set(pointer, chosen, true);
      });
      row.append(h('label', { className: 'field-inline' }, box, h('span', { text: option })));
    }
    return row;
  }

  private jsonBox(value: unknown, pointer: string): HTMLElement {
    const box = h('textarea', { className: 'json-box', attrs: { rows: String(Math.min(12, Math.max(2, compactJson(value).split('\n').length))), spellcheck: 'false', 'data-pointer': pointer, 'aria-label': pointer } });
    box.value = compactJson(value);
    const note = h('div', { className: 'json-box-note' });
    box.addEventListener('change', () => {
      try {
        const parsed = box.value.trim() === '' ? undefined : JSON.parse(box.value);
        note.textContent = '';
        this.set(pointer, parsed, false);
      } catch (error) {
        note.textContent = `Not JSON yet: ${(error as Error).message}. Fix the text; the scenario keeps its previous value here until then.`;
      }
    });
    return h('div', { className: 'json-box-wrap' }, box, note);
  }
}

function isArrayType(s: SchemaObject): boolean {
  return s.type === 'array' || (Array.isArray(s.type) && (s.type as string[]).includes('array'));
}

function describe(s: SchemaObject | undefined): string {
  return s && typeof s.description === 'string' ? s.description : '';
}

/** Short descriptions whole; long ones up to the end of their first sentence (the title shows all). */
function firstSentence(text: string): string {
  if (text.length <= 160) return text;
  const match = /^(.+?\.)(\s|$)/.exec(text);
  return match ? match[1] : text;
}

/** JSON with the innermost arrays of numbers on one line, so material maps read as grids. */
export function compactJson(value: unknown): string {
  if (value === undefined) return '';
  const text = JSON.stringify(value, null, 1);
  return text.replace(/\[\s*((?:-?[0-9.eE+-]+,?\s*)+)\]/g, (_, inner: string) => `[${inner.replace(/\s+/g, ' ').trim()}]`).replace(/\n\s+/g, (m) => `\n${' '.repeat(Math.max(0, m.length - 1))}`);
}

