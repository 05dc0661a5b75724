// The renderer's entry: connects the bridge (desktop or web mode), builds the screens around one
// shared sweep, and shows the Sweep screen. Failing to connect is shown in the page with what to
// do, never as a blank window.
import './pliant.css';

import type { AppInfo } from '../sim/bridge/bridge-contract.ts';
import { SAFETY_CAUTION } from '../sim/scenario/safety-caution.ts';
import { AppShell } from './app/app-shell.ts';
import { SweepDocument } from './app/sweep-document.ts';
import { connectBridge } from './bridge/connect-bridge.ts';
import type { PliantBridge } from './bridge/pliant-bridge.ts';
import { DatasetsScreen } from './datasets/datasets-screen.ts';
import { ExportScreen } from './export/export-screen.ts';
import { PreviewScreen } from './preview/preview-screen.ts';
import { ScoresScreen } from './scores/scores-screen.ts';
import { SeedScreen } from './seed/seed-screen.ts';
import { SweepScreen } from './sweep/sweep-screen.ts';
import { h } from './ui/element.ts';
import { pickFolderInPage } from './ui/folder-picker-dialog.ts';

async function start(host: HTMLElement): Promise<void> {
  let bridge: PliantBridge;
  let info: AppInfo;
  try {
    bridge = connectBridge({ pickFolderInPage });
    info = await bridge.invoke('app.info', {});
  } catch (error) {
    host.replaceChildren(h('div', { className: 'start-failure', attrs: { role: 'alert' } }, h('h1', { text: 'Pliant could not start' }), h('p', { text: (error as Error).message })));
    return;
  }
  const sweep = new SweepDocument(async (text, fileName) => {
    const check = await bridge.invoke('scenario.check', { text, fileName: bareFileName(fileName) });
    return check.problems;
  });
  const shell = new AppShell(info.mode === 'web' ? `web mode · ${info.version}` : info.version);
  const sweepScreen = new SweepScreen(bridge, sweep);
  const preview = new PreviewScreen(sweep);
  const seed = new SeedScreen(bridge, {
    preview: (text, fileName, source, index) => {
      shell.show('preview');
      preview.previewScenario(text, fileName, source, index);
    },
  });
  const datasets = new DatasetsScreen(bridge, (seedPath) => {
    shell.show('seed');
    void seed.open(seedPath);
  });
  const exportScreen = new ExportScreen(bridge, sweep, { ...info, safetyNotice: info.safetyNotice || SAFETY_CAUTION }, (path) => {
    shell.show('datasets');
    void datasets.open(path);
  });
  const scores = new ScoresScreen(bridge, info.safetyNotice || SAFETY_CAUTION);
  // Going back to the Sweep screen means previewing its scenario again, not the seed file's.
  sweepScreen.root.addEventListener('focusin', () => preview.useSweep());
  for (const screen of [sweepScreen, preview, exportScreen, datasets, seed, scores]) shell.add(screen);
  host.replaceChildren(shell.root);
  shell.show('sweep');
  document.documentElement.setAttribute('data-pliant-ready', 'true');
}

/** The checker names the file in every problem line; it takes the bare name only. */
function bareFileName(name: string): string {
  const base = name.split(/[/\\]/).pop() ?? '';
  return base === '' ? 'untitled.json' : base;
}

const host = document.getElementById('pliant-app');
if (host) void start(host);
