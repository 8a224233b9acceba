/**
 * A pool of study workers shared by the page (module Web Workers) and the command line
 * (worker_threads). The pool knows nothing of either: a factory makes one worker and wires
 * its messages to the handlers it is given. Jobs queue in order; each worker compiles the
 * engine once, says "ready", and runs one job at a time. Cancelling terminates every
 * worker, so running jobs stop at once; their promises reject with StudyCancelled, while
 * jobs already finished keep their results. The pool can be used again after a cancel.
 */
import type { ProbeSeriesJob, ProbeSeriesResult, SpectraJob, SpectraResult, StudyJob, StudyJobResult } from './jobs.ts';
import type { FromWorker, ToWorker } from './protocol.ts';

/** Rejection reason of jobs stopped by {@link StudyPool.cancel} or {@link StudyPool.dispose}. */
export class StudyCancelled extends Error {
  constructor(message = 'study cancelled') {
    super(message);
    this.name = 'StudyCancelled';
  }
}

export interface WorkerHandlers {
  message(message: FromWorker): void;
  /** The worker died or could not start. */
  error(error: Error): void;
}

/** The pool's handle on one worker. */
export interface WorkerPort {
  post(message: ToWorker): void;
  terminate(): void;
}

/** Starts one study worker whose messages go to `handlers`. */
export type WorkerFactory = (handlers: WorkerHandlers) => WorkerPort;

export type ResultOf<J extends StudyJob> = J extends ProbeSeriesJob ? ProbeSeriesResult : J extends SpectraJob ? SpectraResult : StudyJobResult;

export interface JobOutcome<R extends StudyJobResult = StudyJobResult> {
  result: R;
  /** Serial number of the worker that ran the job (1, 2, … in order of start). */
  worker: number;
}

interface Pending {
  id: number;
  job: StudyJob;
  resolve(outcome: JobOutcome): void;
  reject(reason: Error): void;
  onProgress?: (done: number, total: number) => void;
}

interface Slot {
  worker: number;
  port: WorkerPort;
  ready: boolean;
  running?: Pending;
}

export class StudyPool {
  /** Most workers running at once. */
  readonly size: number;
  private slots: Slot[] = [];
  private queue: Pending[] = [];
  private nextId = 1;
  private nextWorker = 1;
  private readyWaiters: (() => void)[] = [];
  private broken: Error | undefined;

  constructor(private readonly factory: WorkerFactory, size: number) {
    this.size = Math.max(1, Math.floor(Number.isFinite(size) ? size : 1));
  }

  /** Workers started since the pool was made (restarts after a cancel count again). */
  get workersStarted(): number {
    return this.nextWorker - 1;
  }

  /** Jobs waiting or running. */
  get pending(): number {
    return this.queue.length + this.slots.filter((s) => s.running).length;
  }

  /** Queues a job; resolves with its result and the worker that ran it. */
  run<J extends StudyJob>(job: J, onProgress?: (done: number, total: number) => void): Promise<JobOutcome<ResultOf<J>>> {
    return new Promise<JobOutcome<ResultOf<J>>>((resolve, reject) => {
      this.queue.push({ id: this.nextId++, job, resolve: resolve as (o: JobOutcome) => void, reject, onProgress });
      this.pump();
    });
  }

  /**
   * Starts every worker now rather than when jobs arrive, and resolves once all of them
   * have their engine compiled (rejects if one cannot start). Jobs may be queued meanwhile.
   */
  warm(): Promise<void> {
    while (this.slots.length < this.size) this.start();
    return new Promise<void>((resolve, reject) => {
      const check = () => {
        if (this.slots.length >= this.size && this.slots.every((s) => s.ready)) resolve();
        else if (this.broken) reject(this.broken);
        else this.readyWaiters.push(check);
      };
      check();
    });
  }

  /** Stops everything: terminates the workers and rejects every waiting or running job. */
  cancel(reason = 'study cancelled'): void {
    const stopped = [...this.slots.flatMap((s) => (s.running ? [s.running] : [])), ...this.queue];
    for (const slot of this.slots) slot.port.terminate();
    this.slots = [];
    this.queue = [];
    for (const p of stopped) p.reject(new StudyCancelled(reason));
    this.wakeWaiters(new StudyCancelled(reason));
  }

  /** Lets warm() callers look again; with `error`, those still waiting fail with it. */
  private wakeWaiters(error?: Error): void {
    this.broken = error;
    for (const waiter of this.readyWaiters.splice(0)) waiter();
    this.broken = undefined;
  }

  /** Cancels whatever is left and lets the process exit. */
  dispose(): void {
    this.cancel('study pool closed');
  }

  private pump(): void {
    for (;;) {
      if (this.queue.length === 0) return;
      const idle = this.slots.find((s) => s.ready && !s.running);
      if (idle) {
        const next = this.queue.shift() as Pending;
        idle.running = next;
        idle.port.post({ type: 'job', id: next.id, job: next.job });
        continue;
      }
      const starting = this.slots.filter((s) => !s.ready).length;
      if (this.slots.length < this.size && starting < this.queue.length) {
        this.start();
        continue;
      }
      return;
    }
  }

  private start(): void {
    const slot = { worker: this.nextWorker++, ready: false } as Slot;
    slot.port = this.factory({
      message: (m) => this.onMessage(slot, m),
      error: (e) => this.onFailure(slot, e),
    });
    this.slots.push(slot);
  }

  private onMessage(slot: Slot, m: FromWorker): void {
    if (!this.slots.includes(slot)) return; // a message still in flight from a terminated worker
    switch (m.type) {
      case 'ready':
        slot.ready = true;
        this.wakeWaiters();
        break;
      case 'fatal':
        this.onFailure(slot, new Error(m.message));
        return;
      case 'progress':
        if (slot.running?.id === m.id) slot.running.onProgress?.(m.done, m.total);
        return;
      case 'result':
      case 'failed': {
        const job = slot.running;
        if (!job || job.id !== m.id) return;
        slot.running = undefined;
        if (m.type === 'result') job.resolve({ result: m.result, worker: slot.worker });
        else job.reject(new Error(m.message));
        break;
      }
    }
    this.pump();
  }

  /** A worker died: its job fails; if it never became ready, the engine cannot load, so all waiting jobs fail too. */
  private onFailure(slot: Slot, error: Error): void {
    if (!this.slots.includes(slot)) return;
    this.slots = this.slots.filter((s) => s !== slot);
    slot.port.terminate();
    slot.running?.reject(error);
    if (!slot.ready) {
      for (const p of this.queue.splice(0)) p.reject(error);
      this.wakeWaiters(error);
    }
    this.pump();
  }
}
