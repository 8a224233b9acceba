/**
 * Replaying a run in the field view: the store keeps the Ez frames of the current or last
 * run (its "film"); this controller decides which frame is on show (the newest while a run
 * steps, a chosen one afterwards), plays the film at about 24 frames a second, scrubs to a
 * frame, and when a run ends replays it up to its most telling frame.
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
}

/** Milliseconds between replayed frames (about 24 a second). */
const REPLAY_INTERVAL_MS = 42;

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
  private end = 0;
  private readonly timer: IntervalController;
  private readonly feed: SubscriptionController<ShownFrame | undefined>;

  /** `changed` is called on every new frame and every replay step (the host redraws). */
  constructor(private readonly host: ReactiveControllerHost & HTMLElement, private readonly source: () => FrameSource | undefined, private readonly changed: () => void) {
    host.addController(this);
    this.timer = new IntervalController(host, () => this.advance());
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
    if (live) this.rewind();
    else if (this.film.length > 1) this.play(0, tellingFrame(this.film));
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

  hostConnected(): void {}
  hostDisconnected(): void { this.playing = false; }
}
