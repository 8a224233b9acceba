/** Progress of a study: jobs finished, share of the work done, and an estimate of the time left. */
export interface StudyProgress {
  /** Jobs finished (the reference run included). */
  finished: number;
  /** Jobs in the study. */
  total: number;
  /** Share of the work done, 0..1, weighted by each job's Ez-node updates. */
  fraction: number;
  /** Seconds since the study started. */
  elapsedSeconds: number;
  /** Estimated seconds left (NaN until something is done). */
  secondsLeft: number;
}

/**
 * Keeps the work done per job (in Ez-node updates) and turns it into {@link StudyProgress}.
 * The time left assumes the rest goes at the average rate so far.
 */
export class ProgressTracker {
  private readonly done = new Map<number, number>();
  private finishedJobs = 0;
  private readonly started = performance.now();
  private readonly totalWork: number;

  constructor(private readonly work: number[], private readonly report?: (p: StudyProgress) => void) {
    this.totalWork = work.reduce((a, b) => a + b, 0);
  }

  /** Job `index` has done `fraction` of its steps. */
  step(index: number, fraction: number): void {
    this.done.set(index, this.work[index] * Math.min(1, Math.max(0, fraction)));
    this.emit();
  }

  /** Job `index` is over (finished or failed). */
  finish(index: number): void {
    this.done.set(index, this.work[index]);
    this.finishedJobs++;
    this.emit();
  }

  snapshot(): StudyProgress {
    let sum = 0;
    for (const v of this.done.values()) sum += v;
    const fraction = this.totalWork > 0 ? sum / this.totalWork : 1;
    const elapsedSeconds = (performance.now() - this.started) / 1000;
    const secondsLeft = fraction > 0 ? (elapsedSeconds * (1 - fraction)) / fraction : NaN;
    return { finished: this.finishedJobs, total: this.work.length, fraction, elapsedSeconds, secondsLeft };
  }

  private emit(): void {
    this.report?.(this.snapshot());
  }
}
