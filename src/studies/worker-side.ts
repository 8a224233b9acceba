import { loadEngineModules, type EngineModules } from '../engine/create-simulation.ts';
import { resultTransfers, runJob } from './jobs.ts';
import type { FromWorker, ToWorker } from './protocol.ts';

/** The two things a study worker needs from its host (worker_threads port or Web Worker scope). */
export interface WorkerEndpoint {
  post(message: FromWorker, transfer?: ArrayBuffer[]): void;
  listen(handler: (message: ToWorker) => void): void;
}

/** Least time between two progress messages of one job, ms. */
const PROGRESS_INTERVAL_MS = 100;

/**
 * Turns the current thread into a study worker: gets the engine once (compiled by the
 * parent and handed over, or else loaded here), says "ready", then runs each job it is
 * sent, one at a time, posting progress and the result. The listener is attached before
 * the engine loads so no early message is lost.
 */
export function serveStudyJobs(endpoint: WorkerEndpoint, engine: () => Promise<EngineModules> = loadEngineModules): void {
  let module: EngineModules | undefined;
  const waiting: ToWorker[] = [];

  const handle = (message: ToWorker) => {
    if (message.type !== 'job') return;
    const { id, job } = message;
    let last = 0;
    try {
      const result = runJob(module as EngineModules, job, (done, total) => {
        const now = performance.now();
        if (now - last < PROGRESS_INTERVAL_MS && done < total) return;
        last = now;
        endpoint.post({ type: 'progress', id, done, total });
      });
      endpoint.post({ type: 'result', id, result }, resultTransfers(result));
    } catch (e) {
      endpoint.post({ type: 'failed', id, message: e instanceof Error ? e.message : String(e) });
    }
  };

  endpoint.listen((message) => {
    if (module) handle(message);
    else waiting.push(message);
  });

  engine().then(
    (m) => {
      module = m;
      endpoint.post({ type: 'ready' });
      for (const message of waiting.splice(0)) handle(message);
    },
    (e: unknown) => endpoint.post({ type: 'fatal', message: e instanceof Error ? e.message : String(e) }),
  );
}
