// The JSON text view of the Sweep screen: a CodeMirror 6 editor with line numbers, JSON
// highlighting, folding, and the checker's problems as marks in the gutter and underlines at
// their line and column, so "korrin-tether.json:12:5" can be found at a glance and jumped to.
//
// The editor lives in a shadow root of its host element. CodeMirror writes its styles with
// style-mod, which on a shadow root uses a constructed style sheet (adoptedStyleSheets) instead
// of a <style> element; the page's Content-Security-Policy (style-src 'self', no inline styles)
// blocks the element but not the sheet, so the policy needs no loosening and no nonce. The
// colours are Pliant's own: custom properties of pliant.css inherit into the shadow tree.
import { json } from '@codemirror/lang-json';
import { HighlightStyle, syntaxHighlighting } from '@codemirror/language';
import type { Diagnostic } from '@codemirror/lint';
import { lintGutter, setDiagnostics } from '@codemirror/lint';
import { Annotation, EditorState } from '@codemirror/state';
import { EditorView } from '@codemirror/view';
import { tags } from '@lezer/highlight';
import { basicSetup } from 'codemirror';

import { h } from '../ui/element.ts';

/** A problem at a 1-based line and column, with the words shown on hover. */
export interface EditorProblem {
  line: number;
  column: number;
  message: string;
}

/** Marks a change made by the program (a new file, a form edit), not typed by the person. */
const fromProgram = Annotation.define<boolean>();

const pliantTheme = EditorView.theme({
  '&': { height: '60vh', backgroundColor: '#fff', color: 'var(--ink)', border: '1px solid var(--line)', borderRadius: '4px', fontSize: '13px' },
  '&.cm-focused': { outline: '2px solid var(--accent)', outlineOffset: '1px' },
  '.cm-scroller': { fontFamily: 'var(--mono)', lineHeight: '1.4', overflow: 'auto' },
  '.cm-gutters': { backgroundColor: 'var(--paper-deep)', color: 'var(--muted)', borderRight: '1px solid var(--line)' },
  '.cm-activeLine': { backgroundColor: 'rgba(47, 127, 140, 0.07)' },
  '.cm-activeLineGutter': { backgroundColor: 'rgba(47, 127, 140, 0.18)', color: 'var(--ink)' },
  '.cm-cursor': { borderLeftColor: 'var(--ink)' },
  '&.cm-focused .cm-selectionBackground, .cm-selectionBackground, ::selection': { backgroundColor: 'rgba(47, 127, 140, 0.25)' },
  '.cm-lintRange-error': { backgroundImage: 'none', textDecoration: 'underline wavy var(--warn)', textUnderlineOffset: '3px' },
  '.cm-tooltip': { backgroundColor: 'var(--card)', border: '1px solid var(--line)', color: 'var(--ink)', fontFamily: 'var(--sans)' },
  '.cm-diagnostic-error': { borderLeftColor: 'var(--warn)' },
  '.cm-foldPlaceholder': { backgroundColor: 'var(--paper-deep)', border: '1px solid var(--line)', color: 'var(--muted)' },
});

const pliantHighlight = HighlightStyle.define([
  { tag: tags.propertyName, color: '#2f6f7c' },
  { tag: tags.string, color: '#7a4a1d' },
  { tag: tags.number, color: '#3f6f3a' },
  { tag: [tags.bool, tags.null], color: '#8a3f8c' },
  { tag: [tags.brace, tags.squareBracket, tags.separator, tags.punctuation], color: 'var(--muted)' },
]);

export class JsonEditor {
  /** The host; its shadow root holds the editor. `value` reads the text as from a text box. */
  readonly root: HTMLElement;
  private readonly view: EditorView;

  constructor(label: string, private readonly typed: (text: string) => void) {
    this.root = h('div', { className: 'json-editor', attrs: { 'data-role': 'json-text' } });
    const shadow = this.root.attachShadow({ mode: 'open' });
    this.view = new EditorView({
      root: shadow,
      parent: shadow,
      state: EditorState.create({
        doc: '',
        extensions: [
          basicSetup,
          json(),
          lintGutter(),
          syntaxHighlighting(pliantHighlight),
          pliantTheme,
          // Long description lines wrap rather than run off the right edge; line numbers stay the file's.
          EditorView.lineWrapping,
          EditorView.contentAttributes.of({ 'aria-label': label, spellcheck: 'false' }),
          // Typing over a selection that spans highlighted text makes Chromium's own editing keep
          // the old text's colour with an inline style attribute, which the CSP refuses (and logs).
          // Replacing the selection here instead leaves nothing for the browser to restyle.
          EditorView.domEventHandlers({
            beforeinput: (event, view) => {
              if (event.inputType !== 'insertText' || event.data === null || view.state.selection.main.empty || view.composing) return false;
              event.preventDefault();
              view.dispatch(view.state.replaceSelection(event.data), { scrollIntoView: true, userEvent: 'input.type' });
              return true;
            },
          }),
          EditorView.updateListener.of((update) => {
            if (update.docChanged && !update.transactions.some((t) => t.annotation(fromProgram))) this.typed(update.state.doc.toString());
          }),
        ],
      }),
    });
    Object.defineProperty(this.root, 'value', { get: () => this.text, configurable: true });
  }

  get text(): string {
    return this.view.state.doc.toString();
  }

  get hasFocus(): boolean {
    return this.view.hasFocus;
  }

  /** Replaces the whole text: a new file (cursor to the start), or an edit made in the form (the cursor stays near where it was). */
  setText(text: string, keepCursor: boolean): void {
    if (text === this.text) return;
    const head = keepCursor ? Math.min(this.view.state.selection.main.head, text.length) : 0;
    this.view.dispatch({ changes: { from: 0, to: this.view.state.doc.length, insert: text }, selection: { anchor: head }, annotations: fromProgram.of(true) });
  }

  /** Shows the problems as gutter marks and underlines; problems without a line go to line 1. */
  showProblems(problems: readonly EditorProblem[]): void {
    const doc = this.view.state.doc;
    const diagnostics: Diagnostic[] = problems.map((p) => {
      const from = this.offsetOf(p.line, p.column);
      const line = doc.lineAt(from);
      // Underline the token the problem names: to the end of the value or key on that line.
      const rest = doc.sliceString(from, line.to);
      const token = /^("(?:[^"\\]|\\.)*"|[^\s,\]}]+|[[{])/.exec(rest);
      const to = Math.min(line.to, from + (token ? token[0].length : 1));
      return { from, to: Math.max(to, Math.min(from + 1, doc.length)), severity: 'error', message: p.message };
    });
    this.view.dispatch(setDiagnostics(this.view.state, diagnostics));
  }

  /** Puts the cursor at the 1-based line and column, scrolls it into view and focuses the editor. */
  jumpTo(line: number, column: number): void {
    const at = this.offsetOf(line, column);
    this.view.dispatch({ selection: { anchor: at }, effects: EditorView.scrollIntoView(at, { y: 'center' }) });
    this.view.focus();
  }

  /** Draws again after the host was hidden (CodeMirror measures nothing while hidden). */
  refresh(): void {
    this.view.requestMeasure();
  }

  private offsetOf(line: number, column: number): number {
    const doc = this.view.state.doc;
    const at = doc.line(Math.min(Math.max(1, line), doc.lines));
    return Math.min(at.to, at.from + Math.max(0, column - 1));
  }
}
