// What every screen gives the app shell: its root element, its name in the navigation, and
// hooks for being shown and hidden (a hidden screen stops its animation and its shortcuts).

export interface Screen {
  readonly id: string;
  readonly title: string;
  readonly root: HTMLElement;
  shown?(): void;
  hidden?(): void;
}
