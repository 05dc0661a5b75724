// Saving the episode being played as pictures for a paper or a review: a looping GIF, or a
// folder of numbered PNG frames, drawn from the episode's own files by a render job (the same
// pictures `pliant render` draws). The person picks the folder, names the result, and follows
// the job's progress; at the end the line says where the pictures went and how large they are.
import type { JobProgress, PictureOutput, PictureView } from '../../sim/bridge/bridge-contract.ts';
import type { PliantBridge } from '../bridge/pliant-bridge.ts';
import { JobProgressView } from '../export/job-progress-view.ts';
import { button, h, labelled, select } from '../ui/element.ts';
import { insideFolder, newFolderNameProblem } from '../ui/new-folder-name.ts';
import { StatusLine } from '../ui/status-line.ts';

export class EpisodePictureSaver {
  readonly root: HTMLElement;
  private readonly status = new StatusLine('picture-status');
  private readonly nameInput: HTMLInputElement;
  private readonly view: HTMLSelectElement;
  private readonly gifButton: HTMLButtonElement;
  private readonly framesButton: HTMLButtonElement;
  private readonly cancelButton: HTMLButtonElement;
  private readonly progress: JobProgressView;
  private readonly result: HTMLElement;
  private episode: { datasetPath: string; episodeId: string } | null = null;
  private jobId: string | null = null;
  private pendingPath: string | null = null;

  constructor(private readonly bridge: PliantBridge) {
    this.nameInput = h('input', { attrs: { type: 'text', spellcheck: 'false', 'aria-label': 'Name of the saved pictures', 'data-role': 'picture-name' } });
    this.view = select([['both', 'side and above'], ['side', 'from the side'], ['above', 'from above']], 'both', { 'data-role': 'picture-view' });
    this.gifButton = button('Save as GIF…', () => void this.save('gif'), { attrs: { 'data-role': 'save-gif' } });
    this.framesButton = button('Save frames…', () => void this.save('frames'), { attrs: { 'data-role': 'save-frames' } });
    this.cancelButton = button('Cancel', () => void this.cancel(), { attrs: { 'data-role': 'picture-cancel' } });
    this.progress = new JobProgressView(bridge, 'picture', (p) => this.ended(p));
    this.result = h('p', { className: 'picture-result', attrs: { 'data-role': 'picture-result' } });
    this.root = h(
      'div',
      { className: 'picture-saver', attrs: { 'data-role': 'picture-saver' } },
      h('div', { className: 'toolbar' }, labelled('Pictures named', this.nameInput), labelled('Seen', this.view), this.gifButton, this.framesButton, this.cancelButton),
      this.status.root,
      this.progress.bar,
      this.progress.text,
      this.result,
    );
    this.enable();
  }

  /** The episode now playing is the one a save draws. */
  episodeLoaded(datasetPath: string, episodeId: string): void {
    this.episode = { datasetPath, episodeId };
    this.nameInput.value = episodeId;
    this.enable();
  }

  /** A new dataset is open and nothing of it plays yet. */
  forget(): void {
    this.episode = null;
    this.enable();
  }

  private enable(): void {
    const idle = this.jobId === null && this.pendingPath === null;
    this.gifButton.disabled = !this.episode || !idle;
    this.framesButton.disabled = !this.episode || !idle;
    this.cancelButton.disabled = this.jobId === null;
  }

  private async save(output: PictureOutput): Promise<void> {
    const episode = this.episode;
    if (!episode) return;
    const name = this.nameInput.value.trim().replace(/\.gif$/i, '');
    const problem = newFolderNameProblem(name, output === 'gif' ? 'file' : 'folder');
    if (problem) {
      this.status.show('error', problem);
      return;
    }
    let folder: string;
    try {
      const chosen = await this.bridge.invoke('folder.choose', { purpose: 'pictures' });
      if (!chosen) return;
      folder = chosen.path;
    } catch (error) {
      this.status.error('Could not choose a folder', error);
      return;
    }
    const outPath = insideFolder(folder, output === 'gif' ? `${name}.gif` : `${name}-frames`);
    this.pendingPath = outPath;
    this.result.textContent = '';
    this.result.removeAttribute('data-path');
    this.root.setAttribute('data-picture-state', 'running');
    this.progress.reset('Starting…');
    this.enable();
    this.status.show('busy', `Drawing episode ${episode.episodeId} into ${outPath}…`);
    try {
      const started = await this.bridge.invoke('render.begin', { datasetPath: episode.datasetPath, episodeId: episode.episodeId, output, outPath, view: this.view.value as PictureView });
      this.jobId = started.jobId;
      this.progress.follow(started.jobId);
    } catch (error) {
      this.pendingPath = null;
      this.root.setAttribute('data-picture-state', 'refused');
      this.progress.reset('');
      this.status.error('The pictures were not saved', error);
    }
    this.enable();
  }

  private async cancel(): Promise<void> {
    if (!this.jobId) return;
    this.cancelButton.disabled = true;
    try {
      await this.bridge.invoke('export.cancel', { jobId: this.jobId });
    } catch (error) {
      this.status.error('Could not cancel', error);
    }
  }

  private ended(p: JobProgress): void {
    const outPath = this.pendingPath;
    this.jobId = null;
    this.pendingPath = null;
    this.root.setAttribute('data-picture-state', p.state);
    if (p.state === 'done') {
      this.status.show('ok', 'Pictures saved.');
      this.result.textContent = p.message ?? `Saved into ${outPath}.`;
      if (outPath) this.result.setAttribute('data-path', outPath);
    } else if (p.state === 'cancelled') {
      this.status.show('info', `Cancelled after ${p.done} of ${p.total} pictures; a GIF is written only when every picture is drawn.`);
    } else {
      this.status.show('error', `The pictures were not saved: ${p.message ?? 'no reason given'}`);
    }
    this.enable();
  }
}
