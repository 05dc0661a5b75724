// The folder chooser of web mode, where a browser page has no system folder dialog: a modal that
// lists subfolders through folder.browse, lets the person walk up and down or type a path, and
// answers with the folder they confirm (the bridge then grants it with folder.allow).
import type { FolderListing, FolderPurpose } from '../../sim/bridge/bridge-contract.ts';
import { button, h } from './element.ts';

const PURPOSE_WORDS: Record<FolderPurpose, string> = {
  dataset: 'Choose a dataset folder to open',
  export: 'Choose the folder to export into',
  scenario: 'Choose the folder of the scenario file',
  predictions: "Choose a model's predictions folder",
  report: 'Choose a report folder',
  pictures: "Choose the folder for the episode's pictures",
};

export function pickFolderInPage(purpose: FolderPurpose, browse: (path: string) => Promise<FolderListing>): Promise<string | null> {
  return new Promise((resolve) => {
    const dialog = h('dialog', { className: 'folder-picker', attrs: { 'data-role': 'folder-picker', 'aria-label': PURPOSE_WORDS[purpose] } });
    const pathInput = h('input', { className: 'folder-path', attrs: { type: 'text', spellcheck: 'false', 'aria-label': 'Folder path', 'data-role': 'folder-path' } });
    const list = h('ul', { className: 'folder-list', attrs: { 'data-role': 'folder-list' } });
    const note = h('div', { className: 'folder-note', attrs: { role: 'status' } });
    const showHidden = h('input', { attrs: { type: 'checkbox', 'data-role': 'folder-show-hidden' } });
    let current: FolderListing | null = null;
    // A slow listing must not overwrite a newer one the person asked for meanwhile, nor a path
    // they have started typing.
    let generation = 0;
    let typedSinceListing = false;
    pathInput.addEventListener('input', () => (typedSinceListing = true));

    const finish = (result: string | null): void => {
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
        listing = await browse(path);
      } catch (error) {
        if (asked === generation) {
          note.textContent = `${(error as Error).message}`;
          dialog.setAttribute('data-listing', 'failed');
        }
        return;
      }
      if (asked !== generation) return;
      current = listing;
      // The person may be in the field about to type: leave it to them.
      if (!typedSinceListing && document.activeElement !== pathInput) pathInput.value = current.path;
      dialog.setAttribute('data-listing', 'ready');
      dialog.setAttribute('data-path', current.path);
      note.textContent = current.truncated ? 'Only the first folders are listed; type a path to go deeper.' : `${current.folders.length} folder${current.folders.length === 1 ? '' : 's'}`;
      const up = current.parent;
      // Dot folders hold settings, not datasets; they stay out of the way unless asked for.
      const shown = showHidden.checked ? current.folders : current.folders.filter((f) => !f.name.startsWith('.'));
      list.replaceChildren(
        ...(up ? [h('li', {}, button('↑ parent folder', () => void show(up), { className: 'folder-up', attrs: { 'data-role': 'folder-up' } }))] : []),
        ...shown.map((f) => h('li', {}, button(`${f.name}/`, () => void show(f.path), { className: 'folder-entry', attrs: { 'data-folder': f.name } }))),
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
    dialog.append(
      h('h3', { text: PURPOSE_WORDS[purpose] }),
      h('div', { className: 'folder-path-row' }, pathInput, button('Go', () => void show(pathInput.value.trim()), { attrs: { 'data-role': 'folder-go' } })),
      list,
      h('div', { className: 'folder-note-row' }, note, h('label', { className: 'field-inline' }, showHidden, h('span', { text: 'show hidden folders' }))),
      h(
        'div',
        { className: 'dialog-buttons' },
        button('Choose this folder', () => current && finish(current.path), { className: 'primary', attrs: { 'data-role': 'folder-confirm' } }),
        button('Cancel', () => finish(null), { attrs: { 'data-role': 'folder-cancel' } }),
      ),
    );
    document.body.append(dialog);
    dialog.showModal();
    // Focus the list, not the path field, so the home folder's path can fill the field.
    list.tabIndex = -1;
    list.focus();
    void show('');
  });
}
