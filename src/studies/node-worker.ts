/** A study worker thread for the command line and tests (started by node-pool.ts). */
import { parentPort } from 'node:worker_threads';
import { serveStudyJobs } from './worker-side.ts';

const port = parentPort;
if (!port) throw new Error('node-worker.ts runs only as a worker thread; use createNodePool()');
serveStudyJobs({
  post: (message, transfer) => port.postMessage(message, transfer),
  listen: (handler) => port.on('message', handler),
});
