/**
 * The one loop that steps a simulation to its end: in batches sized by a cell budget or by
 * a time budget, with an optional stop request, blow-up watch and work between batches
 * (progress, frames, yielding to the event loop). The command line, study jobs, the page's
 * run worker and `Simulation.run` all step through it, so batching, stopping and the
 * blow-up watch behave the same everywhere.
 */
import { BlowUpWatch, type BlowUp, type WatchedSimulation } from './blow-up.ts';

/** What the driver needs of a simulation. */
export interface Steppable extends WatchedSimulation {
  readonly stepsDone: number;
  readonly stepsLeft: number;
  step(count: number): number;
}

export interface DriveOptions {
  /** Node updates per batch (default 2e7): steps = cells budget / (nx·ny), at least 1. */
  cellsPerBatch?: number;
  /** Most steps in one batch (default 500). */
  maxBatchSteps?: number;
  /**
   * Aim for batches of about this many milliseconds instead: the batch grows or shrinks
   * after each one to meet it (starting from the cell budget).
   */
  targetBatchMs?: number;
  /** Asked before each batch; true ends the run early (the run counts as stopped). */
  shouldStop?: () => boolean;
  /** Watch for a blow-up after batches; the run ends at the first one found. */
  watch?: boolean;
  /** Least time between two blow-up checks, ms (default 0: after every batch). */
  watchIntervalMs?: number;
  /** Called after every batch (awaited by `drive`): progress, frames, yielding. */
  afterBatch?: (state: BatchState) => void | Promise<void>;
}

export interface BatchState {
  stepsDone: number;
  stepsTotal: number;
  /** Milliseconds spent stepping so far (time between batches excluded). */
  steppingMs: number;
}

export interface DriveOutcome {
  stepsDone: number;
  /** True when the run ended before its last step (a stop request or a blow-up). */
  stopped: boolean;
  blowUp?: BlowUp;
  steppingMs: number;
  /** With the watch on: field energy at the end over its peak after the source ended, dB (NaN if unknown). */
  energyLeftDb: number;
}

class Driver {
  private batch: number;
  private readonly max: number;
  private readonly watch: BlowUpWatch | undefined;
  private lastWatch = -Infinity;
  steppingMs = 0;
  blowUp: BlowUp | undefined;

  constructor(private readonly sim: Steppable, private readonly o: DriveOptions) {
    const cells = sim.layout.nx * sim.layout.ny;
    // with the watch on, at least ~32 checks per run, so the energy left at the end is
    // measured against a peak actually seen
    const total = sim.stepsDone + sim.stepsLeft;
    this.max = Math.max(1, Math.min(o.maxBatchSteps ?? 500, o.watch ? Math.ceil(total / 32) : Infinity));
    this.batch = Math.max(1, Math.min(this.max, Math.floor((o.cellsPerBatch ?? 2e7) / cells)));
    this.watch = o.watch ? new BlowUpWatch(sim) : undefined;
  }

  get going(): boolean {
    return this.sim.stepsLeft > 0 && !this.blowUp && !(this.o.shouldStop?.() ?? false);
  }

  /** One batch; false once nothing is left to do. */
  stepOnce(): void {
    const start = performance.now();
    this.sim.step(this.batch);
    const took = performance.now() - start;
    this.steppingMs += took;
    if (this.o.targetBatchMs !== undefined && took > 0.5) {
      this.batch = Math.max(1, Math.min(this.max, Math.round((this.batch * this.o.targetBatchMs) / took)));
    }
    if (this.watch) {
      const now = performance.now();
      if (now - this.lastWatch >= (this.o.watchIntervalMs ?? 0) || this.sim.stepsLeft === 0) {
        this.lastWatch = now;
        this.blowUp = this.watch.check();
      }
    }
  }

  state(): BatchState {
    return { stepsDone: this.sim.stepsDone, stepsTotal: this.sim.stepsDone + this.sim.stepsLeft, steppingMs: this.steppingMs };
  }

  outcome(): DriveOutcome {
    return {
      stepsDone: this.sim.stepsDone, stopped: this.sim.stepsLeft > 0, blowUp: this.blowUp, steppingMs: this.steppingMs,
      energyLeftDb: this.watch?.energyLeftDb() ?? NaN,
    };
  }
}

/** Steps `sim` to its end (or a stop or blow-up), awaiting `afterBatch` between batches. */
export async function drive(sim: Steppable, options: DriveOptions = {}): Promise<DriveOutcome> {
  const d = new Driver(sim, options);
  while (d.going) {
    d.stepOnce();
    await options.afterBatch?.(d.state());
  }
  return d.outcome();
}

/** The same without awaiting: for threads that need not hear anything while they step. */
export function driveSync(sim: Steppable, options: DriveOptions = {}): DriveOutcome {
  const d = new Driver(sim, options);
  while (d.going) {
    d.stepOnce();
    void options.afterBatch?.(d.state());
  }
  return d.outcome();
}
