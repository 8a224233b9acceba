/**
 * Runs any study definition on a worker pool: the shared runs (a reference grid) first,
 * then the candidates' runs, largest first, all in parallel; a candidate is scored as soon
 * as its own runs and the shared ones are done, and streamed to `onCandidate`. Cancelling
 * keeps the candidates already scored. A failed shared run fails the study; a failed
 * candidate run becomes that candidate's error row.
 */
import type { AnyStudyDefinition, PlannedCandidate, StudyDefinition, StudyPlan } from './definition.ts';
import { jobCellUpdates, type StudyJob, type StudyJobResult } from './jobs.ts';
import { StudyCancelled, type StudyPool } from './pool.ts';
import { ProgressTracker, type StudyProgress } from './progress.ts';

export interface StudyCallbacks<C> {
  /** Called as each candidate's figure is known (streaming, in finishing order). */
  onCandidate?: (candidate: C) => void;
  onProgress?: (progress: StudyProgress) => void;
  /** Aborting cancels the study; candidates finished so far are kept. */
  signal?: AbortSignal;
}

/** Where results of the study's runs come from: a pool here, or (issue-free) anything else that runs jobs. */
export type JobRunner = Pick<StudyPool, 'run' | 'cancel'>;

const message = (e: unknown) => (e instanceof Error ? e.message : String(e));

export async function runStudy<O, CP extends PlannedCandidate, P extends StudyPlan<CP>, C, R>(
  definition: StudyDefinition<O, CP, P, C, R>, plan: P, pool: JobRunner, callbacks: StudyCallbacks<C> = {},
): Promise<R> {
  const started = performance.now();
  const { signal } = callbacks;
  // one progress slot per job: shared first, then every candidate's
  const jobs: { job: StudyJob; candidate: number; slot: number }[] = [
    ...plan.shared.map((job, slot) => ({ job, candidate: -1, slot })),
    ...plan.candidates.flatMap((c, index) => c.jobs.map((job, slot) => ({ job, candidate: index, slot }))),
  ];
  const tracker = new ProgressTracker(jobs.map((j) => jobCellUpdates(j.job)), callbacks.onProgress);
  const workers = new Set<number>();
  const scored: C[] = [];
  const sharedResults: StudyJobResult[] = new Array(plan.shared.length);
  let sharedLeft = plan.shared.length;
  const candidateResults = plan.candidates.map((c) => ({ results: new Array<StudyJobResult>(c.jobs.length), left: c.jobs.length, failed: false }));
  let cancelled = false;
  let sharedError: unknown;

  const cancel = () => { cancelled = true; pool.cancel(); };
  if (signal?.aborted) cancel();
  signal?.addEventListener('abort', cancel, { once: true });

  const emit = (c: C) => { scored.push(c); callbacks.onCandidate?.(c); };
  const tryScore = (index: number) => {
    const state = candidateResults[index];
    if (state.failed || state.left > 0 || sharedLeft > 0) return;
    state.left = -1; // scored once
    try {
      emit(definition.evaluate(plan, plan.candidates[index], state.results, sharedResults));
    } catch (e) {
      emit(definition.failed(plan, plan.candidates[index], message(e)));
    }
  };

  // largest first, shared runs ahead of everything
  const order = jobs.map((_, k) => k).sort((a, b) => {
    const sa = jobs[a].candidate < 0 ? 1 : 0;
    const sb = jobs[b].candidate < 0 ? 1 : 0;
    return sb - sa || jobCellUpdates(jobs[b].job) - jobCellUpdates(jobs[a].job);
  });

  await Promise.all(order.map((k) => {
    const { job, candidate, slot } = jobs[k];
    return pool.run(job, (d, t) => tracker.step(k, d / t)).then(
      (o) => {
        workers.add(o.worker);
        tracker.finish(k);
        if (candidate < 0) {
          sharedResults[slot] = o.result;
          if (--sharedLeft > 0) return;
          try {
            definition.checkShared?.(plan, sharedResults);
          } catch (e) {
            sharedError ??= e;
            cancel();
            return;
          }
          plan.candidates.forEach((_, index) => tryScore(index));
          return;
        }
        const state = candidateResults[candidate];
        state.results[slot] = o.result;
        state.left--;
        tryScore(candidate);
      },
      (e: unknown) => {
        if (e instanceof StudyCancelled) return;
        tracker.finish(k);
        if (candidate < 0) {
          sharedError ??= e;
          cancel();
          return;
        }
        const state = candidateResults[candidate];
        if (state.failed) return;
        state.failed = true;
        emit(definition.failed(plan, plan.candidates[candidate], message(e)));
      },
    );
  }));
  signal?.removeEventListener('abort', cancel);
  if (sharedError !== undefined) throw sharedError instanceof Error ? sharedError : new Error(String(sharedError));

  const candidates = scored.slice().sort((a, b) => definition.compare(a, b));
  return definition.finish(plan, candidates, {
    planned: plan.candidates.length,
    complete: !cancelled && candidates.length === plan.candidates.length,
    workers: [...workers].sort((a, b) => a - b),
    seconds: (performance.now() - started) / 1000,
    shared: sharedResults,
  });
}

/** Options for a definition from typed values, throwing RangeError with every problem. */
export function optionsOrThrow<O>(definition: AnyStudyDefinition, values: Record<string, string | undefined>): O {
  const { options, problems } = definition.readOptions(values);
  if (!options || problems.length > 0) throw new RangeError(problems.join('; '));
  return options as O;
}
