// Builds DOM elements from a tag, properties and children in one expression. The page's
// Content-Security-Policy forbids inline style attributes and inline scripts, so the screens
// are made from elements and classes rather than from HTML strings.

type Child = Node | string | null | undefined | false;

export interface ElementOptions {
  className?: string;
  text?: string;
  title?: string;
  /** Plain attributes (id, type, name, aria-*, data-*, for, …). */
  attrs?: Record<string, string>;
}

export function h<K extends keyof HTMLElementTagNameMap>(tag: K, options: ElementOptions = {}, ...children: Child[]): HTMLElementTagNameMap[K] {
  const element = document.createElement(tag);
  if (options.className) element.className = options.className;
  if (options.text !== undefined) element.textContent = options.text;
  if (options.title) element.title = options.title;
  if (options.attrs) for (const [name, value] of Object.entries(options.attrs)) element.setAttribute(name, value);
  for (const child of children) {
    if (child === null || child === undefined || child === false) continue;
    element.append(child);
  }
  return element;
}

/** A button that runs `onClick`; the label says what it does. */
export function button(label: string, onClick: () => void, options: ElementOptions = {}): HTMLButtonElement {
  const element = h('button', { ...options, text: label, attrs: { type: 'button', ...options.attrs } });
  element.addEventListener('click', onClick);
  return element;
}

/** A select of (value, label) pairs. */
export function select(options: readonly (readonly [string, string])[], selected: string, attrs: Record<string, string> = {}): HTMLSelectElement {
  const element = h('select', { attrs });
  for (const [value, label] of options) {
    const option = h('option', { text: label, attrs: { value } });
    if (value === selected) option.selected = true;
    element.append(option);
  }
  return element;
}

/** A label wrapping a caption and a control, so clicking the caption focuses the control. */
export function labelled(caption: string, control: HTMLElement, unit?: string): HTMLLabelElement {
  return h('label', { className: 'field-inline' }, h('span', { className: 'field-caption', text: caption }), control, unit ? h('span', { className: 'unit', text: unit }) : null);
}
