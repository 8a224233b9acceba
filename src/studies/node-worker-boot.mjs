// Entry of a study worker thread in Node. Node 20 cannot load TypeScript, and a worker's
// `execArgv: ['--import', 'tsx']` does not register the loader in the thread, so this plain
// module registers tsx itself and then imports the TypeScript worker named in workerData.
import { register } from 'tsx/esm/api';
import { workerData } from 'node:worker_threads';

register();
await import(workerData.entry);
