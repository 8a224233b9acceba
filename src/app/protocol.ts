/**
 * Messages between the page and its run worker (src/app/run-worker.ts). The worker posts
 * the string "ready" once its engine module is compiled, then answers commands with the
 * messages below. Every run carries a `runId`, so late messages of a run the page has
 * already left behind are recognised and dropped.
 */
import type { ErrorMap } from '../compare/error-map.ts';
import type { RunResults } from '../compare/results.ts';
import type { Scenario } from '../scenario/types.ts';

export type ToWorker =
  /** `mapFrequencies`: the analysis frequencies to accumulate a full-grid DFT (an error map) for, Hz. */
  | { type: 'run'; runId: number; scenario: Scenario; mapFrequencies: number[] }
  | { type: 'pause' }
  | { type: 'resume' }
  | { type: 'stop' }
  /** The page has painted its last frame: send the next after the current batch. */
  | { type: 'frame' }
  /** Whether the field view is on screen: replay frames are captured only then (the last field always). */
  | { type: 'view'; visible: boolean }
  /** Frame buffers the page is done with (transferred), for the worker to fill again. */
  | { type: 'recycle'; buffers: ArrayBuffer[] }
  /** Fault injection for the recovery test: the worker throws outside any handler. */
  | { type: 'crash' };

/** A copy of Ez for the field view, possibly every `stride`-th node to keep frames small. */
export interface FieldFrame {
  runId: number;
  step: number;
  /** Size of `data`: ceil(nx/stride) × ceil(ny/stride). */
  width: number;
  height: number;
  stride: number;
  /** Kept for replay (frames at even steps through the run, and the last); the others are shown and given back. */
  film: boolean;
  /** Row-major Ez samples, V/m; row r holds j = r·stride. */
  data: Float32Array;
}

/** Where the stepping phase's wall-clock time went in the worker, ms (pauses excluded). */
export interface SteppingSplit {
  /** From the first batch to the last. */
  wall: number;
  /** Inside the engine's step calls (field update, probe and line DFTs, full-grid DFTs). */
  engine: number;
  /** Capturing Ez frames and posting them. */
  frames: number;
  /** Posting progress messages. */
  progress: number;
  /** Waiting on the worker's event loop between batches (commands are heard there). */
  idle: number;
  batches: number;
  frameCount: number;
}

/** Where the worker's time went, ms: set-up, stepping (with frames), results, error maps, and the stepping's split. */
export interface RunTimings { setup: number; stepping: number; results: number; errorMap: number; split: SteppingSplit }

export type FromWorker =
  | { type: 'started'; runId: number; stepsTotal: number }
  /** A few times a second; `stepsPerSecond` by the wall clock so far, pauses excluded. */
  | { type: 'progress'; runId: number; stepsDone: number; stepsPerSecond: number; paused: boolean }
  | ({ type: 'frame' } & FieldFrame)
  | {
    type: 'done'; runId: number; stopped: boolean; results: RunResults;
    /** One map per mapped frequency, in the order asked for. */
    errorMaps: ErrorMap[];
    /** Wall-clock seconds from receiving the scenario to the results being ready. */
    runSeconds: number;
    /** Time steps per second by the wall clock from the first batch to the last (pauses excluded). */
    stepsPerSecond: number;
    timings: RunTimings;
    /** Set when the run was stopped because the field blew up: the step and the likely cause. */
    blowUp?: { step: number; reason: string };
    /** Field energy left at the end over its peak after the source ended, dB (NaN if unknown). */
    energyLeftDb: number;
  }
  | { type: 'failed'; runId: number; message: string };
