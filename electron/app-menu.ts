// The desktop app's menu bar, in Pliant's own wording. Edit items keep their roles so text fields
// get the platform's usual clipboard behaviour; everything Pliant-specific happens in the page.
import type { MenuItemConstructorOptions } from 'electron';

export interface MenuActions {
  showAbout(): void;
  showSafetyNote(): void;
}

export function appMenuTemplate(options: { isMac: boolean; allowDevTools: boolean; actions: MenuActions }): MenuItemConstructorOptions[] {
  const { isMac, allowDevTools, actions } = options;
  const pliantMenu: MenuItemConstructorOptions = {
    label: 'Pliant',
    submenu: [
      { label: 'About Pliant', click: () => actions.showAbout() },
      { label: 'Before you use simulated data…', click: () => actions.showSafetyNote() },
      { type: 'separator' },
      ...(isMac ? ([{ label: 'Hide Pliant', role: 'hide' }, { type: 'separator' }] as MenuItemConstructorOptions[]) : []),
      { label: 'Close Pliant', role: 'quit' },
    ],
  };
  const editMenu: MenuItemConstructorOptions = {
    label: 'Edit',
    submenu: [
      { label: 'Undo', role: 'undo' },
      { label: 'Redo', role: 'redo' },
      { type: 'separator' },
      { label: 'Cut', role: 'cut' },
      { label: 'Copy', role: 'copy' },
      { label: 'Paste', role: 'paste' },
      { label: 'Select all', role: 'selectAll' },
    ],
  };
  const viewMenu: MenuItemConstructorOptions = {
    label: 'View',
    submenu: [
      { label: 'Reload the page', role: 'reload' },
      { type: 'separator' },
      { label: 'Larger', role: 'zoomIn' },
      { label: 'Smaller', role: 'zoomOut' },
      { label: 'Normal size', role: 'resetZoom' },
      { type: 'separator' },
      { label: 'Full screen', role: 'togglefullscreen' },
      ...(allowDevTools ? ([{ type: 'separator' }, { label: 'Page inspector', role: 'toggleDevTools' }] as MenuItemConstructorOptions[]) : []),
    ],
  };
  return [pliantMenu, editMenu, viewMenu];
}
