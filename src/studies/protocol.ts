import type { StudyJob, StudyJobResult } from './jobs.ts';

/** Messages from the pool to a study worker. */
export type ToWorker = { type: 'job'; id: number; job: StudyJob };

/** Messages from a study worker to the pool. */
export type FromWorker =
  | { type: 'ready' }
  | { type: 'fatal'; message: string }
  | { type: 'progress'; id: number; done: number; total: number }
  | { type: 'result'; id: number; result: StudyJobResult }
  | { type: 'failed'; id: number; message: string };
