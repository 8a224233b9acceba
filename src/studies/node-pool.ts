/** The study pool in Node: one worker_threads worker per hardware thread by default. */
import { availableParallelism } from 'node:os';
import { Worker } from 'node:worker_threads';
import { StudyPool, type WorkerFactory } from './pool.ts';

const bootUrl = new URL('./node-worker-boot.mjs', import.meta.url);
const entryUrl = new URL('./node-worker.ts', import.meta.url);

/** Starts each worker through the tsx bootstrap; an unexpected exit counts as a failure. */
export const nodeWorkerFactory: WorkerFactory = (handlers) => {
  let stopping = false;
  const worker = new Worker(bootUrl, { workerData: { entry: entryUrl.href } });
  worker.on('message', handlers.message);
  worker.on('error', handlers.error);
  worker.on('exit', (code) => {
    if (!stopping) handlers.error(new Error(`study worker stopped unexpectedly (exit code ${code})`));
  });
  return {
    post: (message) => worker.postMessage(message),
    terminate: () => {
      stopping = true;
      void worker.terminate();
    },
  };
};

/** Hardware threads of this machine. */
export function hardwareThreads(): number {
  return availableParallelism();
}

/** A pool of `size` worker threads (default: one per hardware thread). */
export function createNodePool(size = hardwareThreads()): StudyPool {
  return new StudyPool(nodeWorkerFactory, size);
}
