/**
 * The page's one shared store: the scenario being edited and its check, display choices,
 * the state of the run and its results. Components never write it; gg-app passes slices
 * down as properties and turns the components' events into controller actions
 * (src/app/controller.ts), which call `set`.
 *
 * Ez frames change many times a second, so they bypass the reactive state: the field
 * view subscribes to them and draws in requestAnimationFrame, and asks for the next frame
 * through the store (`requestFrame`, `fieldOnScreen`), which the controller passes to the
 * run worker.
 */
import type { ErrorMap } from '../compare/error-map.ts';
import type { RunResults } from '../compare/results.ts';
import type { DerivedQuantities } from '../scenario/derived.ts';
import type { Warning } from '../scenario/warnings.ts';
import type { ParseResult, Scenario } from '../scenario/types.ts';
import type { DisplayUnits, Draft } from './draft.ts';
import { frameStats, type FrameStats } from './frame-stats.ts';
import type { FieldFrame, RunTimings } from './protocol.ts';
import type { View } from './persist.ts';
import type { ThemeName } from './theme.ts';

export type RunPhase = 'idle' | 'running' | 'paused' | 'stopping' | 'done' | 'stopped' | 'failed';

export interface RunState {
  phase: RunPhase;
  runId: number;
  stepsDone: number;
  stepsTotal: number;
  /** Time steps per second while stepping. */
  stepsPerSecond: number;
  /** Seconds from pressing run to results, for a finished or stopped run. */
  runSeconds?: number;
  /** Why a run failed, or a note about how it ended. */
  message?: string;
  /** Where the worker's time went, ms (for the benchmark). */
  timings?: RunTimings;
  /** Field energy left at the end of the last run over its peak, dB (for its warning). */
  energyLeftDb?: number;
  /** Why the last run ended early, if it did. */
  stopped?: { step: number; reason: string };
}

/** A message shown above the work area until dismissed. */
export interface Notice { kind: 'error' | 'info'; title: string; lines: string[] }

export interface AppState {
  draft: Draft;
  check: ParseResult;
  derived: DerivedQuantities | undefined;
  /** Valid but meaningless choices in the scenario (src/scenario/warnings.ts); empty while it is invalid. */
  warnings: Warning[];
  units: DisplayUnits;
  theme: ThemeName;
  /** The section of the page on show. */
  view: View;
  run: RunState;
  /** Results of the last finished or stopped run, and the scenario that produced them. */
  results: RunResults | undefined;
  resultsScenario: Scenario | undefined;
  /** Error maps of the last run, one per mapped frequency. */
  errorMaps: ErrorMap[];
  /** The JSON of each study finished in this session, by file name, for the report. */
  studyFiles: Record<string, unknown>;
  /** Index into the results' frequencies for the line charts. */
  lineFrequency: number;
  /** The error map's chosen frequency, Hz: shown when mapped, mapped first by the next run (undefined: the first). */
  mapFrequencyHz: number | undefined;
  /** Ez-node updates per second measured on the last run, for the run-time estimate. */
  measuredCellRate: number | undefined;
  notice: Notice | undefined;
}

/** An Ez frame with the figures the field view needs (worked out on arrival, off the worker's clock). */
export type ShownFrame = FieldFrame & FrameStats;

/**
 * What the page asks of the run: the next frame, replay frames on or off as the field view
 * comes on or goes off screen, and the buffers of frames it is done with, given back.
 */
export type FrameDemand = { type: 'frame' } | { type: 'view'; visible: boolean } | { type: 'recycle'; buffers: ArrayBuffer[] };

/** Bytes of Ez frames kept for replaying a run; beyond it every other frame is dropped. */
const FILM_BUDGET_BYTES = 96 * 2 ** 20;

export class Store extends EventTarget {
  private current: AppState;
  private latestFrame: ShownFrame | undefined;
  private frames: ShownFrame[] = [];
  private filmBytes = 0;
  private readonly frameListeners = new Set<(f: ShownFrame | undefined) => void>();
  private readonly demandListeners = new Set<(d: FrameDemand) => void>();
  /** Frames received and the main-thread milliseconds their figures took (read by the page benchmark). */
  readonly frameCosts = { count: 0, ms: 0 };

  constructor(initial: AppState) {
    super();
    this.current = initial;
  }

  get state(): AppState {
    return this.current;
  }

  set(patch: Partial<AppState>): void {
    this.current = { ...this.current, ...patch };
    this.dispatchEvent(new Event('change'));
  }

  setRun(patch: Partial<RunState>): void {
    this.set({ run: { ...this.current.run, ...patch } });
  }

  get frame(): ShownFrame | undefined {
    return this.latestFrame;
  }

  /** The frames of the current or last run, oldest first, for replay. */
  get film(): readonly ShownFrame[] {
    return this.frames;
  }

  /**
   * Shows a new frame, and keeps it for replay when it is a film frame; undefined clears the
   * view and the film. Frames no longer shown or kept go back to the run worker for reuse.
   */
  setFrame(incoming: FieldFrame | undefined): void {
    const t0 = performance.now();
    const frame: ShownFrame | undefined = incoming && { ...incoming, ...frameStats(incoming.data) };
    if (incoming) {
      this.frameCosts.count++;
      this.frameCosts.ms += performance.now() - t0;
    }
    const previous = this.latestFrame;
    this.latestFrame = frame;
    // a live frame was never in the film: it goes back once a newer one is on show
    const done: ShownFrame[] = previous && !previous.film ? [previous] : [];
    if (!frame) {
      done.push(...this.frames);
      this.frames = [];
      this.filmBytes = 0;
    } else if (frame.film) {
      this.frames.push(frame);
      this.filmBytes += frame.data.byteLength;
      if (this.filmBytes > FILM_BUDGET_BYTES && this.frames.length > 2) {
        const last = this.frames[this.frames.length - 1];
        const kept = this.frames.filter((_f, k) => k % 2 === 0);
        if (kept[kept.length - 1] !== last) kept.push(last);
        done.push(...this.frames.filter((f) => !kept.includes(f)));
        this.frames = kept;
        this.filmBytes = this.frames.reduce((n, f) => n + f.data.byteLength, 0);
      }
    }
    this.giveBack(done);
    for (const listen of this.frameListeners) listen(frame);
  }

  /** Hands the buffers of frames no longer shown or kept to the run worker (each once). */
  private giveBack(frames: readonly ShownFrame[]): void {
    const buffers = [...new Set(frames.map((f) => f.data.buffer as ArrayBuffer))].filter((b) => b.byteLength > 0);
    if (buffers.length === 0) return;
    for (const listen of this.demandListeners) listen({ type: 'recycle', buffers });
  }

  /** Calls `listen` on every new Ez frame; returns the unsubscribe function. */
  onFrame(listen: (f: ShownFrame | undefined) => void): () => void {
    this.frameListeners.add(listen);
    return () => this.frameListeners.delete(listen);
  }

  /** The field view has painted the newest frame and wants the next one. */
  requestFrame(): void {
    for (const listen of this.demandListeners) listen({ type: 'frame' });
  }

  /** The field view came on screen (true) or went off it (false). */
  fieldOnScreen(visible: boolean): void {
    for (const listen of this.demandListeners) listen({ type: 'view', visible });
  }

  /** Calls `listen` on every request of the field view (the controller sends them to the run worker). */
  onFrameDemand(listen: (d: FrameDemand) => void): () => void {
    this.demandListeners.add(listen);
    return () => this.demandListeners.delete(listen);
  }
}
