// The Sweep screen: open a demo scenario or a scenario file, edit it as a form generated from the
// schema or as JSON in a code editor, see every problem at its field (and at its line) in the
// words `pliant validate` uses, and save it. Edits in either view go through the shared SweepDocument, so the other screens always
// work on what is shown here.
import type { ExampleScenario } from '../../sim/bridge/bridge-contract.ts';
import type { ScenarioProblem } from '../../sim/scenario/scenario-problem.ts';
import { formatProblems } from '../../sim/scenario/scenario-problem.ts';
import { SCENARIO_SCHEMA } from '../../sim/scenario/scenario-schema.ts';
import type { SweepDocument, SweepState } from '../app/sweep-document.ts';
import type { PliantBridge } from '../bridge/pliant-bridge.ts';
import { button, h, select } from '../ui/element.ts';
import { rememberFolder, suggestFolder } from '../ui/folder-picker-dialog.ts';
import { insideFolder } from '../ui/new-folder-name.ts';
import type { Screen } from '../ui/screen.ts';
import { StatusLine } from '../ui/status-line.ts';
import { JsonEditor } from './json-editor.ts';
import { ScenarioForm } from './scenario-form.ts';
import type { SchemaObject } from './schema-shape.ts';

const TEXT_EDIT_SETTLE_MS = 350;

export class SweepScreen implements Screen {
  readonly id = 'sweep';
  readonly title = 'Sweep';
  readonly root: HTMLElement;
  private readonly status = new StatusLine('sweep-status');
  private readonly examples: HTMLSelectElement;
  private readonly fileLabel: HTMLElement;
  private readonly summary: HTMLElement;
  private readonly form: ScenarioForm;
  private readonly formPane: HTMLElement;
  private readonly textPane: HTMLElement;
  private readonly text: JsonEditor;
  private readonly textProblems: HTMLElement;
  private readonly fileRow: HTMLElement;
  private readonly saveButton: HTMLButtonElement;
  private exampleList: ExampleScenario[] = [];
  private textTimer: ReturnType<typeof setTimeout> | null = null;
  private formNeedsRender = true;
  private formDocument: Record<string, unknown> | null = null;

  constructor(private readonly bridge: PliantBridge, private readonly sweep: SweepDocument) {
    this.examples = select([], '', { 'aria-label': 'Demo scenario', 'data-role': 'example-list' });
    const openExample = button('Open demo', () => void this.openExample(), { attrs: { 'data-role': 'open-example' } });
    const openFile = button('Open file…', () => void this.chooseFile('open'), { attrs: { 'data-role': 'open-file' } });
    this.saveButton = button('Save', () => void this.save(), { attrs: { 'data-role': 'save' } });
    const saveAs = button('Save as…', () => void this.chooseFile('save'), { attrs: { 'data-role': 'save-as' } });
    this.fileLabel = h('div', { className: 'file-label', attrs: { 'data-role': 'file-label' } });
    this.fileRow = h('div', { className: 'file-row', attrs: { hidden: '' } });
    this.summary = h('div', { className: 'problem-summary', attrs: { 'data-role': 'problem-summary', 'aria-live': 'polite' } });

    this.form = new ScenarioForm(SCENARIO_SCHEMA as SchemaObject, {
      changed: (structural) => this.formChanged(structural),
      masterSeed: () => {
        const seed = this.formDocument?.seed;
        return typeof seed === 'number' || typeof seed === 'string' ? seed : 0;
      },
    });
    this.formPane = h('div', { className: 'pane form-pane', attrs: { 'data-role': 'form-pane' } }, this.form.nav.root, this.form.root);
    this.text = new JsonEditor('Scenario JSON text', () => this.textTyped());
    this.textProblems = h('div', { className: 'text-problems', attrs: { 'data-role': 'text-problems' } });
    this.textPane = h('div', { className: 'pane text-pane', attrs: { hidden: '', 'data-role': 'text-pane' } }, this.text.root, this.textProblems);

    const formTab = button('Form', () => this.showPane('form'), { className: 'tab is-active', attrs: { 'data-role': 'tab-form' } });
    const textTab = button('JSON text', () => this.showPane('text'), { className: 'tab', attrs: { 'data-role': 'tab-text' } });
    this.root = h(
      'section',
      { className: 'screen sweep-screen', attrs: { 'data-screen': 'sweep' } },
      h('header', { className: 'screen-head' }, h('h2', { text: 'Sweep' }), this.fileLabel),
      h('div', { className: 'toolbar' }, this.examples, openExample, openFile, this.saveButton, saveAs),
      this.fileRow,
      this.status.root,
      this.summary,
      h('div', { className: 'tabs', attrs: { role: 'tablist' } }, formTab, textTab),
      this.formPane,
      this.textPane,
    );
    sweep.subscribe((change, state) => this.render(change, state));
    this.render('loaded', sweep.current);
  }

  async shown(): Promise<void> {
    if (this.exampleList.length > 0) return;
    try {
      this.exampleList = await this.bridge.invoke('scenario.listExamples', {});
      this.examples.replaceChildren(...this.exampleList.map((e) => h('option', { text: e.fileName, attrs: { value: e.path } })));
      if (this.exampleList.length === 0) this.status.show('info', 'This build has no demo scenarios. Open a scenario file instead.');
      // Until a file is opened or saved, the file chooser starts among the demo scenarios.
      else suggestFolder('scenario', folderOf(this.exampleList[0].path));
    } catch (error) {
      this.status.error('Could not list the demo scenarios', error);
    }
  }

  /** Opens a demo by file name (e.g. "korrin-tether.json"). */
  async openExampleNamed(fileName: string): Promise<void> {
    if (this.exampleList.length === 0) await this.shown();
    const example = this.exampleList.find((e) => e.fileName === fileName);
    if (!example) throw new Error(`no demo scenario named ${fileName}`);
    this.examples.value = example.path;
    await this.openExample();
  }

  private async openExample(): Promise<void> {
    const example = this.exampleList.find((e) => e.path === this.examples.value);
    if (!example) return;
    await this.openPath(example.path, true);
  }

  private async openPath(path: string, readOnly: boolean): Promise<void> {
    try {
      const read = await this.bridge.invoke('scenario.read', { path });
      this.formNeedsRender = true;
      await this.sweep.load(read.text, baseName(read.path), read.path, readOnly);
      if (!readOnly) rememberFolder('scenario', folderOf(read.path));
      this.status.show('ok', `Opened ${read.path}${readOnly ? ' (a demo: Save as… to keep your changes)' : ''}.`);
    } catch (error) {
      this.status.error(`Could not open ${path}`, error);
    }
  }

  /**
   * Folders are chosen with the shell's chooser. In web mode the chooser lists .json files too and
   * a click picks one; otherwise opening picks one of the folder's .json files from a list next.
   * Saving types the new file's name (a file clicked in the chooser fills it in).
   */
  private async chooseFile(mode: 'open' | 'save'): Promise<void> {
    let folder: string;
    let file: string | undefined;
    try {
      const chosen = await this.bridge.invoke('folder.choose', { purpose: mode === 'open' ? 'scenario' : 'scenario-save' });
      if (!chosen) return;
      folder = chosen.path;
      file = chosen.file;
    } catch (error) {
      this.status.error('Could not choose a folder', error);
      return;
    }
    if (mode === 'open') {
      if (file !== undefined) await this.openPath(insideFolder(folder, file), false);
      else await this.pickFileIn(folder);
      return;
    }
    const name = h('input', { attrs: { type: 'text', value: file ?? this.sweep.current.fileName, placeholder: 'name.json', 'aria-label': 'File name', 'data-role': 'file-name' } });
    const confirm = button('Save', () => {
      const fileName = name.value.trim();
      if (!/^[^/\\]+\.json$/i.test(fileName)) {
        this.status.show('error', `"${fileName}" is not a file name ending in .json. Type a name like tank-sweep.json.`);
        return;
      }
      this.fileRow.hidden = true;
      void this.writeTo(insideFolder(folder, fileName));
    }, { attrs: { 'data-role': 'file-confirm' } });
    const cancel = button('Cancel', () => (this.fileRow.hidden = true));
    this.fileRow.replaceChildren(h('span', { className: 'file-row-folder', text: `In ${folder}` }), name, confirm, cancel);
    this.fileRow.hidden = false;
    name.focus();
  }

  private async pickFileIn(folder: string): Promise<void> {
    let files: { name: string; path: string }[];
    try {
      files = (await this.bridge.invoke('folder.listJson', { path: folder })).files;
    } catch (error) {
      this.status.error(`Could not list the files in ${folder}`, error);
      return;
    }
    const cancel = button('Cancel', () => (this.fileRow.hidden = true));
    if (files.length === 0) {
      this.fileRow.replaceChildren(h('span', { className: 'file-row-folder', text: `${folder} holds no .json files. Choose the folder your scenario is in.` }), cancel);
      this.fileRow.hidden = false;
      return;
    }
    const list = select(files.map((f) => [f.path, f.name] as const), files[0].path, { 'aria-label': 'Scenario file', 'data-role': 'file-list' });
    const confirm = button('Open', () => {
      this.fileRow.hidden = true;
      void this.openPath(list.value, false);
    }, { attrs: { 'data-role': 'file-confirm' } });
    this.fileRow.replaceChildren(h('span', { className: 'file-row-folder', text: `In ${folder}` }), list, confirm, cancel);
    this.fileRow.hidden = false;
    list.focus();
  }

  private async save(): Promise<void> {
    const state = this.sweep.current;
    if (!state.path || state.readOnly) {
      await this.chooseFile('save');
      return;
    }
    await this.writeTo(state.path);
  }

  private async writeTo(path: string): Promise<void> {
    try {
      const written = await this.bridge.invoke('scenario.write', { path, text: this.sweep.current.text });
      this.sweep.saved(written.path, baseName(written.path));
      rememberFolder('scenario', folderOf(written.path));
      this.status.show('ok', `Saved ${written.path} (${written.bytes} bytes).`);
    } catch (error) {
      this.status.error(`Could not save ${path}`, error);
    }
  }

  private showPane(which: 'form' | 'text'): void {
    this.formPane.hidden = which !== 'form';
    this.textPane.hidden = which !== 'text';
    this.root.querySelector('[data-role="tab-form"]')?.classList.toggle('is-active', which === 'form');
    this.root.querySelector('[data-role="tab-text"]')?.classList.toggle('is-active', which === 'text');
    if (which === 'form' && this.formNeedsRender) this.renderForm(this.sweep.current);
    if (which === 'text') this.text.refresh();
  }

  private formChanged(structural: boolean): void {
    if (!this.formDocument) return;
    if (structural) this.formNeedsRender = true;
    void this.sweep.edit(`${JSON.stringify(this.formDocument, null, 2)}\n`);
  }

  private textTyped(): void {
    if (this.textTimer !== null) clearTimeout(this.textTimer);
    this.textTimer = setTimeout(() => {
      this.textTimer = null;
      this.formNeedsRender = true;
      void this.sweep.edit(this.text.text);
    }, TEXT_EDIT_SETTLE_MS);
  }

  private render(change: string, state: SweepState): void {
    const where = state.path ?? 'not saved yet';
    this.fileLabel.textContent = `${state.fileName} · ${where}${state.readOnly ? ' · demo (read-only)' : ''}${state.dirty ? ' · unsaved changes' : ''}`;
    this.saveButton.disabled = state.text === '';
    if (change === 'loaded') this.text.setText(state.text, false);
    else if (change === 'edited' && !this.text.hasFocus) this.text.setText(state.text, true);
    if ((change === 'loaded' || this.formNeedsRender) && !this.formPane.hidden) this.renderForm(state);
    if (change === 'checked' || change === 'loaded') this.renderProblems(state);
  }

  private renderForm(state: SweepState): void {
    this.formNeedsRender = false;
    if (!state.document) {
      this.formDocument = null;
      this.form.nav.show([]);
      this.form.root.replaceChildren(h('p', { className: 'form-note', text: state.text === '' ? 'Open a demo scenario or a scenario file to begin.' : 'The text is not a JSON object yet, so there is no form to show. Fix it in the JSON text view; the problem list says where.' }));
      return;
    }
    // The form edits its own copy; every edit is written back as text.
    this.formDocument = structuredClone(state.document);
    this.form.render(this.formDocument);
    this.renderProblems(state);
  }

  /** In the form: unfold and scroll to the field; in the JSON view: the cursor to its line. */
  private goToProblem(problem: ScenarioProblem): void {
    if (this.textPane.hidden && this.formDocument) this.form.revealProblem(problem.pointer);
    else {
      this.showPane('text');
      this.text.jumpTo(problem.line ?? 1, problem.column ?? 1);
    }
  }

  private textProblem(problem: ScenarioProblem, text: string): HTMLElement {
    return problemButton(text, () => this.text.jumpTo(problem.line ?? 1, problem.column ?? 1), problem.line);
  }

  private renderProblems(state: SweepState): void {
    const lines = state.problems.map((p) => ({ pointer: p.pointer, text: formatProblems([p], state.fileName) }));
    if (this.formDocument) this.form.showProblems(lines);
    this.textProblems.replaceChildren(...state.problems.map((p, i) => this.textProblem(p, lines[i].text)));
    // Marks belong to the text they were found in; a newer text waits for its own check.
    if (!state.checking && this.text.text === state.text) this.text.showProblems(state.problems.map((p, i) => ({ line: p.line ?? 1, column: p.column ?? 1, message: lines[i].text })));
    if (state.checking) {
      this.summary.textContent = 'Checking…';
      this.summary.setAttribute('data-state', 'checking');
    } else if (state.text === '') {
      this.summary.textContent = '';
      this.summary.removeAttribute('data-state');
    } else if (lines.length === 0) {
      this.summary.textContent = 'No problems: this sweep is ready to preview and export.';
      this.summary.setAttribute('data-state', 'ok');
    } else {
      this.summary.replaceChildren(h('strong', { text: `${lines.length} problem${lines.length === 1 ? '' : 's'}` }), h('span', { text: ' — each is also shown at its field:' }), h('ul', {}, ...lines.map((l, i) => h('li', {}, button(l.text, () => this.goToProblem(state.problems[i]), { className: 'problem-jump', title: 'Show this problem where it is', attrs: { 'data-role': 'summary-problem' } })))));
      this.summary.setAttribute('data-state', 'problems');
    }
  }
}

/** One problem under the editor; a click puts the cursor at its line and column. */
function problemButton(text: string, onClick: () => void, line: number | undefined): HTMLElement {
  return button(text, onClick, { className: 'problem problem-jump', title: line === undefined ? 'Go to the start of the text' : `Go to line ${line}`, attrs: { 'data-role': 'jump-to-problem', 'data-line': String(line ?? 1) } });
}

function folderOf(path: string): string {
  const cut = Math.max(path.lastIndexOf('/'), path.lastIndexOf('\\'));
  return cut > 0 ? path.slice(0, cut) : path;
}

function baseName(path: string): string {
  const parts = path.split(/[/\\]/);
  return parts[parts.length - 1] || path;
}
