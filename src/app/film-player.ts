/**
 * Live frames and replay in the field view: the store keeps the Ez frames of the current or
 * last run (its "film"); this controller decides which frame is on show (the newest while a
 * run steps, a chosen one afterwards), plays the film at about 24 frames a second, scrubs to
 * a frame, and when a run ends replays it up to its most telling frame. While a run steps it
 * asks for the next frame each time the newest has been painted, only while the view is on
 * screen (an IntersectionObserver: a hidden section or a view scrolled away counts as off),
 * so frames arrive at the display's rate or slower and none are made for nobody.
 */
import type { ReactiveController, ReactiveControllerHost } from 'lit';
import { IntervalController, SubscriptionController } from './controllers.ts';
import type { ShownFrame } from './store.ts';

/** Where Ez frames come from (the store). */
export interface FrameSource {
  readonly frame: ShownFrame | undefined;
  /** Every frame of the current or last run, oldest first. */
  readonly film: readonly ShownFrame[];
  onFrame(listen: (f: ShownFrame | undefined) => void): () => void;
  /** Asks the run for the next frame. */
  requestFrame(): void;
  /** Tells the run whether the view is on screen. */
  fieldOnScreen(visible: boolean): void;
}

/** Milliseconds between replayed frames (about 24 a second). */
const REPLAY_INTERVAL_MS = 42;
/** While a run steps on screen, ask again this often in case a request was lost (a restarted worker). */
const REQUEST_AGAIN_MS = 400;

/**
 * The most telling frame of a finished run: the last one before the absorber has taken a
 * quarter of the wave (Σ Ez² below 75 % of its largest value), when the wave front spans
 * most of the grid.
 */
export function tellingFrame(film: readonly { sumSquares: number }[]): number {
  let top = 0;
  for (const f of film) top = Math.max(top, f.sumSquares);
  let best = film.length - 1;
  let seenTop = false;
  for (let k = 0; k < film.length; k++) {
    if (film[k].sumSquares === top) seenTop = true;
    if (seenTop && film[k].sumSquares >= 0.75 * top) best = k;
    if (seenTop && film[k].sumSquares < 0.75 * top) break;
  }
  return best;
}

export class FilmPlayer implements ReactiveController {
  /** Index into the film of the frame shown after a run; undefined follows the newest frame. */
  index: number | undefined;
  playing = false;
  /** True while a run steps: the newest frame is shown and the film cannot be replayed. */
  live = false;
  /** The view is on screen (as far as the IntersectionObserver has said). */
  onScreen = true;
  private end = 0;
  private readonly timer: IntervalController;
  private readonly askAgain: IntervalController;
  private readonly feed: SubscriptionController<ShownFrame | undefined>;
  private observer: IntersectionObserver | undefined;
  /** The newest frame that a request was made after, so one painted frame asks once. */
  private askedAfter: ShownFrame | undefined;

  /** `changed` is called on every new frame and every replay step (the host redraws). */
  constructor(private readonly host: ReactiveControllerHost & HTMLElement, private readonly source: () => FrameSource | undefined, private readonly changed: () => void) {
    host.addController(this);
    this.timer = new IntervalController(host, () => this.advance());
    this.askAgain = new IntervalController(host, () => this.ask());
    this.feed = new SubscriptionController(host, () => {
      const s = this.source();
      return s ? (listen) => s.onFrame(listen) : undefined;
    }, (f) => {
      if (!f) this.rewind(); // the film was cleared (new run or reset)
      this.changed();
    });
  }

  get film(): readonly ShownFrame[] {
    return this.source()?.film ?? [];
  }

  /** The frame on show. */
  get frame(): ShownFrame | undefined {
    return this.index !== undefined && !this.live ? this.film[this.index] : this.source()?.frame;
  }

  /** The frame source changed: listen to the new one. */
  renew(): void {
    this.feed.renew();
  }

  /** Follows a run's start and end: live frames while it steps, a replay when it is over. */
  setLive(live: boolean): void {
    if (live === this.live) return;
    this.live = live;
    if (live) {
      this.rewind();
      this.askedAfter = undefined;
      this.ask();
      this.askAgain.start(REQUEST_AGAIN_MS);
    } else {
      this.askAgain.stop();
      if (this.film.length > 1) this.play(0, tellingFrame(this.film));
    }
  }

  /** The host has painted `frame`: when it is the newest live one, ask for the next. */
  painted(frame: ShownFrame | undefined): void {
    const newest = this.source()?.frame;
    if (!this.live || !frame || frame !== newest || frame === this.askedAfter) return;
    this.askedAfter = frame;
    this.ask();
  }

  private ask(): void {
    if (this.live && this.onScreen) this.source()?.requestFrame();
  }

  private setOnScreen(visible: boolean): void {
    if (visible === this.onScreen) return;
    this.onScreen = visible;
    this.source()?.fieldOnScreen(visible);
    this.ask();
  }

  /** Steps through the film from `from` to `to`. */
  play(from: number, to: number): void {
    this.pause();
    this.playing = true;
    this.index = from;
    this.end = to;
    this.timer.start(REPLAY_INTERVAL_MS);
    this.host.requestUpdate();
  }

  pause(): void {
    this.timer.stop();
    if (this.playing) this.host.requestUpdate();
    this.playing = false;
  }

  /** Shows frame `index` of the film and stops any replay. */
  scrub(index: number): void {
    this.pause();
    this.index = Math.max(0, Math.min(index, this.film.length - 1));
    this.host.requestUpdate();
  }

  private rewind(): void {
    this.pause();
    this.index = undefined;
  }

  private advance(): void {
    const next = (this.index ?? 0) + 1;
    if (next > this.end || next >= this.film.length) {
      this.pause();
      return;
    }
    this.index = next;
    this.host.requestUpdate();
    this.changed();
  }

  hostConnected(): void {
    if (typeof IntersectionObserver === 'undefined') return;
    this.observer = new IntersectionObserver((entries) => this.setOnScreen(entries[entries.length - 1].isIntersecting));
    this.observer.observe(this.host);
  }

  hostDisconnected(): void {
    this.playing = false;
    this.observer?.disconnect();
    this.observer = undefined;
    this.setOnScreen(false);
  }
}
