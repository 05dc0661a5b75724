// The controls under a 3-D view: play/pause, step, speed, and a timeline to scrub along, with
// the current time and frame in seconds and frame numbers. Space plays or pauses and the arrow
// keys step (Shift: ten frames) whenever the bar's screen is showing and no text field has focus.
import { button, h, select } from '../ui/element.ts';
import type { PlaybackClock } from './playback-clock.ts';
import { PLAYBACK_SPEEDS } from './playback-clock.ts';

export interface PlaybackBarEvents {
  /** The clock changed in a way that needs the frame redrawn. */
  changed(): void;
}

export class PlaybackBar {
  readonly root: HTMLElement;
  private readonly playButton: HTMLButtonElement;
  private readonly timeline: HTMLInputElement;
  private readonly readout: HTMLElement;
  private readonly speed: HTMLSelectElement;
  private clock: PlaybackClock | null = null;
  private available = 0;

  constructor(private readonly events: PlaybackBarEvents) {
    this.playButton = button('Play', () => this.togglePlay(), { className: 'play-button', title: 'Play or pause (Space)', attrs: { 'data-role': 'play' } });
    const back = button('◀ Step', () => this.step(-1), { title: 'One frame back (←, Shift+← for ten)', attrs: { 'data-role': 'step-back' } });
    const forward = button('Step ▶', () => this.step(1), { title: 'One frame on (→, Shift+→ for ten)', attrs: { 'data-role': 'step-forward' } });
    this.speed = select(PLAYBACK_SPEEDS.map((s) => [String(s), `${s}× real time`] as const), '1', { 'aria-label': 'Playback speed', 'data-role': 'speed' });
    this.speed.addEventListener('change', () => {
      if (this.clock) this.clock.speed = Number(this.speed.value);
    });
    this.timeline = h('input', { className: 'timeline', attrs: { type: 'range', min: '0', max: '0', step: '1', value: '0', 'aria-label': 'Timeline', 'data-role': 'timeline' } });
    this.timeline.addEventListener('input', () => {
      if (!this.clock) return;
      this.clock.playing = false;
      this.clock.seek(Number(this.timeline.value), this.available);
      this.sync();
      this.events.changed();
    });
    this.readout = h('span', { className: 'time-readout', attrs: { 'data-role': 'time-readout', 'aria-live': 'off' } });
    this.root = h('div', { className: 'playback-bar' }, this.playButton, back, forward, this.speed, this.timeline, this.readout);
    document.addEventListener('keydown', this.onKey);
    this.setClock(null, 0);
  }

  setClock(clock: PlaybackClock | null, available: number): void {
    this.clock = clock;
    if (clock) clock.speed = Number(this.speed.value);
    this.setAvailable(available);
  }

  /** Frames ready to show (grows while a preview streams in). */
  setAvailable(available: number): void {
    this.available = available;
    this.timeline.max = String(Math.max(0, (this.clock?.frameCount ?? 1) - 1));
    this.sync();
  }

  /** Updates the button, timeline and readout from the clock. */
  sync(): void {
    const clock = this.clock;
    this.playButton.textContent = clock?.playing ? 'Pause' : 'Play';
    this.playButton.disabled = clock === null;
    if (!clock) {
      this.readout.textContent = 't = — s';
      return;
    }
    this.timeline.value = String(clock.frame);
    const endS = (clock.frameCount - 1) * clock.frameIntervalS;
    const nowS = clock.frame * clock.frameIntervalS;
    const loading = this.available < clock.frameCount ? ` · ${this.available} of ${clock.frameCount} frames ready` : '';
    this.readout.textContent = `t = ${nowS.toFixed(3)} s of ${endS.toFixed(3)} s · frame ${clock.frame} of ${clock.frameCount - 1}${loading}`;
  }

  dispose(): void {
    document.removeEventListener('keydown', this.onKey);
  }

  private togglePlay(): void {
    if (!this.clock) return;
    this.clock.toggle();
    this.sync();
    this.events.changed();
  }

  private step(delta: number): void {
    if (!this.clock) return;
    this.clock.step(delta, this.available);
    this.sync();
    this.events.changed();
  }

  private readonly onKey = (event: KeyboardEvent): void => {
    if (!this.clock || !isShowing(this.root) || isTyping(event.target)) return;
    if (event.key === ' ' || event.code === 'Space') {
      // Space on a button reached from the keyboard presses it; playback must not also toggle.
      // A button last clicked with the mouse merely kept the focus: there Space plays and
      // pauses as everywhere else (and the click is not repeated).
      const target = event.target;
      if (target instanceof HTMLElement && target.matches('button, a[href], summary') && target !== lastPointerPressed) return;
      event.preventDefault();
      this.togglePlay();
    } else if (event.key === 'ArrowRight' || event.key === 'ArrowLeft') {
      event.preventDefault();
      const size = event.shiftKey ? 10 : 1;
      this.step(event.key === 'ArrowRight' ? size : -size);
    }
  };
}

/** The control the pointer last went down on, to tell focus by click from focus by Tab. */
let lastPointerPressed: Element | null = null;
document.addEventListener('pointerdown', (event) => {
  lastPointerPressed = event.target instanceof Element ? event.target.closest('button, a[href], summary') : null;
}, true);

function isShowing(element: HTMLElement): boolean {
  return element.isConnected && element.closest('[hidden]') === null;
}

function isTyping(target: EventTarget | null): boolean {
  if (!(target instanceof HTMLElement)) return false;
  if (target instanceof HTMLTextAreaElement || target.isContentEditable) return true;
  if (target instanceof HTMLInputElement) return target.type !== 'range' && target.type !== 'checkbox' && target.type !== 'button';
  return target instanceof HTMLSelectElement;
}
