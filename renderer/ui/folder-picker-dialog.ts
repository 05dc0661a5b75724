// The folder chooser of web mode, where a browser page has no system folder dialog: a modal that
// lists subfolders through folder.browse, lets the person walk up and down or type a path, and
// answers with the folder they confirm (the bridge then grants it with folder.allow). It is
// titled for what is being opened, starts in the folder last used for that purpose (or a folder
// the screen suggests, such as the demo scenarios), counts only what it lists, and for scenario
// files lists the folder's .json files too, so a file is picked with one click.
import type { FolderListing, FolderPurpose } from '../../sim/bridge/bridge-contract.ts';
import { button, h } from './element.ts';

const PURPOSE_WORDS: Record<FolderPurpose, string> = {
  dataset: 'Choose a dataset folder to open',
  export: 'Choose the folder to export into',
  scenario: 'Open a scenario file',
  'scenario-save': 'Choose the folder to save the scenario in',
  seed: 'Open a seed file: choose the dataset folder that holds seed.json',
  predictions: "Choose a model's predictions folder",
  report: 'Choose a report folder',
  pictures: "Choose the folder for the episode's pictures",
};

/** Purposes whose chooser also lists .json files, and picks one when it is clicked. */
const LISTS_JSON_FILES: ReadonlySet<FolderPurpose> = new Set(['scenario', 'scenario-save']);

/** Scenario files are opened and saved in the same places. */
const FOLDER_MEMORY_KEY: Partial<Record<FolderPurpose, FolderPurpose>> = { 'scenario-save': 'scenario' };
const lastFolders = new Map<FolderPurpose, string>();
const suggestedFolders = new Map<FolderPurpose, string>();

/** Notes a folder the person worked in (a file opened or saved there); the next chooser starts in it. */
export function rememberFolder(purpose: FolderPurpose, path: string): void {
  lastFolders.set(FOLDER_MEMORY_KEY[purpose] ?? purpose, path);
}

/** Where the chooser starts before anything was used for this purpose (e.g. the demo scenarios). */
export function suggestFolder(purpose: FolderPurpose, path: string): void {
  suggestedFolders.set(FOLDER_MEMORY_KEY[purpose] ?? purpose, path);
}

function startFolder(purpose: FolderPurpose): string {
  const key = FOLDER_MEMORY_KEY[purpose] ?? purpose;
  return lastFolders.get(key) ?? suggestedFolders.get(key) ?? '';
}

export interface PickedFolder {
  path: string;
  /** The .json file clicked in it, when the chooser lists files. */
  file?: string;
}

export type FolderBrowser = (path: string, jsonFiles: boolean) => Promise<FolderListing>;

export function pickFolderInPage(purpose: FolderPurpose, browse: FolderBrowser): Promise<PickedFolder | null> {
  return new Promise((resolve) => {
    const title = PURPOSE_WORDS[purpose];
    const withFiles = LISTS_JSON_FILES.has(purpose);
    const dialog = h('dialog', { className: 'folder-picker', attrs: { 'data-role': 'folder-picker', 'data-purpose': purpose, 'aria-label': title } });
    const pathInput = h('input', { className: 'folder-path', attrs: { type: 'text', spellcheck: 'false', 'aria-label': 'Folder path', 'data-role': 'folder-path' } });
    const list = h('ul', { className: 'folder-list', attrs: { 'data-role': 'folder-list' } });
    const note = h('div', { className: 'folder-note', attrs: { role: 'status', 'data-role': 'folder-note' } });
    const showHidden = h('input', { attrs: { type: 'checkbox', 'data-role': 'folder-show-hidden' } });
    let current: FolderListing | null = null;
    // A slow listing must not overwrite a newer one the person asked for meanwhile, nor a path
    // they have started typing.
    let generation = 0;
    let typedSinceListing = false;
    pathInput.addEventListener('input', () => (typedSinceListing = true));

    const finish = (result: PickedFolder | null): void => {
      if (result) rememberFolder(purpose, result.path);
      dialog.close();
      dialog.remove();
      resolve(result);
    };

    const show = async (path: string): Promise<void> => {
      const asked = ++generation;
      typedSinceListing = false;
      dialog.setAttribute('data-listing', 'busy');
      note.textContent = 'Listing…';
      let listing: FolderListing;
      try {
        listing = await browse(path, withFiles);
      } catch (error) {
        if (asked !== generation) return;
        // A remembered folder may since have gone: start from the home folder instead.
        if (path !== '' && path === startFolder(purpose) && current === null) {
          void show('');
          return;
        }
        note.textContent = `${(error as Error).message}`;
        dialog.setAttribute('data-listing', 'failed');
        return;
      }
      if (asked !== generation) return;
      current = listing;
      // The person may be in the field about to type: leave it to them.
      if (!typedSinceListing && document.activeElement !== pathInput) pathInput.value = current.path;
      dialog.setAttribute('data-listing', 'ready');
      dialog.setAttribute('data-path', current.path);
      const up = current.parent;
      // Dot folders and files hold settings, not datasets or scenarios; they stay out of the way unless asked for.
      const visible = (name: string): boolean => showHidden.checked || !name.startsWith('.');
      const folders = current.folders.filter((f) => visible(f.name));
      const files = (current.jsonFiles ?? []).filter((f) => visible(f.name));
      const hidden = current.folders.length - folders.length + (current.jsonFiles?.length ?? 0) - files.length;
      const counted = [plural(folders.length, 'folder')];
      if (withFiles) counted.push(plural(files.length, '.json file'));
      note.textContent = `${counted.join(', ')}${hidden > 0 ? ` (${hidden} hidden not shown)` : ''}${current.truncated ? '; only the first folders are listed: type a path to go deeper' : ''}`;
      list.replaceChildren(
        ...(up ? [h('li', {}, button('↑ parent folder', () => void show(up), { className: 'folder-up', attrs: { 'data-role': 'folder-up' } }))] : []),
        ...folders.map((f) => h('li', {}, button(`${f.name}/`, () => void show(f.path), { className: 'folder-entry', attrs: { 'data-folder': f.name } }))),
        ...files.map((f) => h('li', {}, button(f.name, () => current && finish({ path: current.path, file: f.name }), { className: 'file-entry', title: `${purpose === 'scenario' ? 'Open' : 'Save over'} ${f.path}`, attrs: { 'data-file': f.name } }))),
      );
    };

    showHidden.addEventListener('change', () => current && void show(current.path));
    pathInput.addEventListener('keydown', (event) => {
      if (event.key === 'Enter') {
        event.preventDefault();
        void show(pathInput.value.trim());
      }
    });
    dialog.addEventListener('cancel', (event) => {
      event.preventDefault();
      finish(null);
    });
    const confirmWords = purpose === 'scenario' ? 'List the files of this folder' : 'Choose this folder';
    dialog.append(h('h3', { text: title }));
    if (purpose === 'scenario') dialog.append(h('p', { className: 'folder-hint', text: 'Click a .json file to open it.' }));
    dialog.append(
      h('div', { className: 'folder-path-row' }, pathInput, button('Go', () => void show(pathInput.value.trim()), { attrs: { 'data-role': 'folder-go' } })),
      list,
      h('div', { className: 'folder-note-row' }, note, h('label', { className: 'field-inline' }, showHidden, h('span', { text: 'show hidden' }))),
      h(
        'div',
        { className: 'dialog-buttons' },
        button(confirmWords, () => current && finish({ path: current.path }), { className: 'primary', attrs: { 'data-role': 'folder-confirm' } }),
        button('Cancel', () => finish(null), { attrs: { 'data-role': 'folder-cancel' } }),
      ),
    );
    document.body.append(dialog);
    dialog.showModal();
    // Focus the list, not the path field, so the start folder's path can fill the field.
    list.tabIndex = -1;
    list.focus();
    void show(startFolder(purpose));
  });
}

function plural(count: number, noun: string): string {
  return `${count} ${noun}${count === 1 ? '' : 's'}`;
}
