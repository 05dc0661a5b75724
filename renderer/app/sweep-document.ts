// The scenario being worked on, shared by every screen: its text, where it came from, its parsed
// form and what the checker says about it. The Sweep screen edits it; Preview and Export read it.
// Checking is asynchronous and a newer edit always wins over an older check still under way.
import type { ScenarioProblem } from '../../sim/scenario/scenario-problem.ts';

export type ScenarioChecker = (text: string, fileName: string) => Promise<ScenarioProblem[]>;

export interface SweepState {
  text: string;
  /** Bare file name used in problem lines, e.g. "korrin-tether.json". */
  fileName: string;
  /** Where the text was read from or last saved to; null for a new, unsaved scenario. */
  path: string | null;
  /** True when the bundled read-only examples folder holds it (save it elsewhere). */
  readOnly: boolean;
  /** The parsed JSON, or null while the text is not JSON. */
  document: Record<string, unknown> | null;
  problems: ScenarioProblem[];
  /** Text changed since it was read or saved. */
  dirty: boolean;
  /** A check of the current text is still running. */
  checking: boolean;
}

export type SweepChange = 'loaded' | 'edited' | 'checked' | 'saved';

export class SweepDocument {
  private state: SweepState = { text: '', fileName: 'untitled.json', path: null, readOnly: false, document: null, problems: [], dirty: false, checking: false };
  private readonly listeners: ((change: SweepChange, state: SweepState) => void)[] = [];
  private checkGeneration = 0;

  constructor(private readonly checker: ScenarioChecker) {}

  get current(): Readonly<SweepState> {
    return this.state;
  }

  /** True when there is text, it parses and the checker found nothing wrong. */
  get usable(): boolean {
    return this.state.document !== null && !this.state.checking && this.state.problems.length === 0 && this.state.text !== '';
  }

  subscribe(listener: (change: SweepChange, state: SweepState) => void): void {
    this.listeners.push(listener);
  }

  load(text: string, fileName: string, path: string | null, readOnly: boolean): Promise<void> {
    this.state = { ...this.state, text, fileName, path, readOnly, dirty: false };
    return this.update('loaded');
  }

  edit(text: string): Promise<void> {
    if (text === this.state.text) return Promise.resolve();
    this.state = { ...this.state, text, dirty: true };
    return this.update('edited');
  }

  saved(path: string, fileName: string): void {
    this.state = { ...this.state, path, fileName, readOnly: false, dirty: false };
    this.emit('saved');
  }

  private async update(change: SweepChange): Promise<void> {
    const generation = ++this.checkGeneration;
    const parsed = parseObject(this.state.text);
    this.state = { ...this.state, document: parsed, checking: true };
    this.emit(change);
    let problems: ScenarioProblem[];
    try {
      problems = await this.checker(this.state.text, this.state.fileName);
    } catch (error) {
      problems = [{ pointer: '', message: `could not be checked: ${(error as Error).message}` }];
    }
    if (generation !== this.checkGeneration) return;
    this.state = { ...this.state, problems, checking: false };
    this.emit('checked');
  }

  private emit(change: SweepChange): void {
    for (const listener of this.listeners) listener(change, this.state);
  }
}

function parseObject(text: string): Record<string, unknown> | null {
  try {
    const value: unknown = JSON.parse(text);
    return typeof value === 'object' && value !== null && !Array.isArray(value) ? (value as Record<string, unknown>) : null;
  } catch {
    return null;
  }
}
