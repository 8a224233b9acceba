/**
 * A study worker of the page's pool (one per hardware thread): compiles the engine once,
 * then runs the candidate scenarios it is sent and posts their results back.
 */
import { serveStudyJobs } from './worker-side.ts';

declare const self: DedicatedWorkerGlobalScope;

serveStudyJobs({
  post: (message, transfer = []) => self.postMessage(message, transfer),
  listen: (handler) => { self.onmessage = (e: MessageEvent) => handler(e.data); },
});
