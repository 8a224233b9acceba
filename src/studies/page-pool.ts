/** The study pool in the page: one module Web Worker per hardware thread by default. */
import { StudyPool, type WorkerFactory } from './pool.ts';

/** Starts each worker from ./study-worker.ts (Vite bundles it as a module worker). */
export const pageWorkerFactory: WorkerFactory = (handlers) => {
  const worker = new Worker(new URL('./study-worker.ts', import.meta.url), { type: 'module', name: 'gridgauge study' });
  worker.onmessage = (e: MessageEvent) => handlers.message(e.data);
  worker.onerror = (e: ErrorEvent) => {
    e.preventDefault();
    handlers.error(new Error(e.message || 'the study worker could not start'));
  };
  worker.onmessageerror = () => handlers.error(new Error('a study worker sent a message that could not be read'));
  return {
    post: (message) => worker.postMessage(message),
    terminate: () => worker.terminate(),
  };
};

/** Hardware threads the browser reports (at least 1). */
export function pageHardwareThreads(): number {
  return Math.max(1, navigator.hardwareConcurrency || 1);
}

/** A pool of `size` module workers (default: one per hardware thread). */
export function createPagePool(size = pageHardwareThreads()): StudyPool {
  return new StudyPool(pageWorkerFactory, size);
}
