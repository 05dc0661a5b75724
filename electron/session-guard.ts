// Locks down the browser session the window uses: every permission request and check is denied
// (Electron's security checklist, item 5: by default Electron grants them all), device access is
// denied, and downloads are cancelled, since Pliant writes its files from the main process and
// never through the page.
import type { Session } from 'electron';

export function guardSession(session: Session): void {
  session.setPermissionRequestHandler((_contents, _permission, callback) => callback(false));
  session.setPermissionCheckHandler(() => false);
  session.setDevicePermissionHandler(() => false);
  session.on('will-download', (event) => event.preventDefault());
}
