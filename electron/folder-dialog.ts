// The desktop app's folder chooser: the system's folder dialog, worded for what the folder is
// for. Whatever the person picks here is what the allowed-folder list then lets requests touch;
// the dialog function is injected so this runs without Electron.
import { dirname } from 'node:path';

import type { OpenDialogOptions, OpenDialogReturnValue } from 'electron';

import type { FolderPurpose } from '../sim/bridge/bridge-contract.ts';
import type { FolderChooser } from './request-services.ts';

const WORDING: Readonly<Record<FolderPurpose, { title: string; buttonLabel: string; message: string }>> = {
  dataset: { title: 'Open a dataset', buttonLabel: 'Open dataset', message: 'Pick the folder of a dataset Pliant wrote.' },
  seed: { title: 'Open a seed file', buttonLabel: 'Open seed file', message: 'Pick the dataset folder whose seed.json to open.' },
  export: { title: 'Where should the dataset go?', buttonLabel: 'Write here', message: 'Pick or create the folder the new dataset is written into.' },
  'scenario-save': { title: 'Where should the scenario go?', buttonLabel: 'Save here', message: 'Pick or create the folder the scenario file is saved into; the next step asks its name.' },
  scenario: { title: 'Open a scenario file', buttonLabel: 'Open', message: 'Pick the scenario file to open; its folder is then allowed for this session.' },
  predictions: { title: 'Open a predictions folder', buttonLabel: 'Open predictions', message: "Pick the folder of a model's predictions: one <episode id>.npz per episode." },
  pictures: { title: 'Where should the pictures go?', buttonLabel: 'Save here', message: "Pick or create the folder the episode's GIF or PNG pictures are saved into." },
  report: { title: 'Report folder', buttonLabel: 'Use this folder', message: 'Pick a score or calibration report folder, or the folder a new score report is written into.' },
};

/** Purposes whose dialog picks a file (in one step) rather than a folder. */
const PICKS_A_FILE: ReadonlySet<FolderPurpose> = new Set(['scenario']);

export function folderDialogOptions(purpose: FolderPurpose): OpenDialogOptions {
  const wording = WORDING[purpose];
  if (PICKS_A_FILE.has(purpose)) {
    return {
      title: wording.title,
      buttonLabel: wording.buttonLabel,
      message: wording.message,
      filters: [{ name: 'Scenario files', extensions: ['json'] }],
      properties: ['openFile', 'dontAddToRecent'],
    };
  }
  return {
    title: wording.title,
    buttonLabel: wording.buttonLabel,
    message: wording.message,
    properties: ['openDirectory', 'createDirectory', 'dontAddToRecent'],
  };
}

/** Scenario files are opened and saved in the same places, so both dialogs share one memory. */
const MEMORY_KEY: Partial<Record<FolderPurpose, FolderPurpose>> = { 'scenario-save': 'scenario' };

/**
 * `startIn`: where a dialog opens before anything was picked for its purpose (the bundled
 * scenarios for a scenario file); afterwards it opens where the last pick for that purpose was.
 */
export function createNativeFolderChooser(
  showOpenDialog: (options: OpenDialogOptions) => Promise<OpenDialogReturnValue>,
  startIn: Partial<Record<FolderPurpose, string>> = {},
): FolderChooser {
  const last = new Map<FolderPurpose, string>();
  return {
    mode: 'native',
    async choose(purpose) {
      const key = MEMORY_KEY[purpose] ?? purpose;
      const options = folderDialogOptions(purpose);
      const defaultPath = last.get(key) ?? startIn[key];
      const result = await showOpenDialog(defaultPath === undefined ? options : { ...options, defaultPath });
      if (result.canceled || result.filePaths.length === 0) return null;
      const picked = result.filePaths[0];
      // A picked file's folder is where the next dialog opens.
      last.set(key, options.properties?.includes('openFile') ? dirname(picked) : picked);
      return picked;
    },
  };
}
