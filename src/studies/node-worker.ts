/**
 * A study worker thread for the command line and tests (started by node-pool.ts, bundled
 * or through tsx). The engine arrives compiled in workerData.module when the parent has it.
 */
import { parentPort, workerData } from 'node:worker_threads';
import type { EngineModules } from '../engine/create-simulation.ts';
import { serveStudyJobs } from './worker-side.ts';

const port = parentPort;
if (!port) throw new Error('node-worker.ts runs only as a worker thread; use createNodePool()');
const given = (workerData as { modules?: EngineModules } | null)?.modules;
serveStudyJobs({
  post: (message, transfer) => port.postMessage(message, transfer),
  listen: (handler) => port.on('message', handler),
}, given ? () => Promise.resolve(given) : undefined);
