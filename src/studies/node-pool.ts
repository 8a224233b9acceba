/**
 * The study pool in Node: one worker_threads worker per hardware thread by default.
 *
 * The installed command (build/cli/gridgauge.mjs, bundled at build time by
 * scripts/build-cli.mjs) starts each worker from the worker bundled beside it,
 * build/cli/study-worker.cjs: no TypeScript loader at run time. Run from the TypeScript
 * sources (tests, development), the worker's module graph is bundled once per process with
 * esbuild, or when esbuild is missing each worker registers tsx itself
 * (node-worker-boot.mjs); a worker through tsx costs about 0.4 s of CPU to start. The
 * engine is compiled once here and handed to every worker.
 */
import { availableParallelism } from 'node:os';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import { loadEngineModules } from '../engine/create-simulation.ts';
import { StudyPool, type WorkerFactory, type WorkerHandlers, type WorkerPort } from './pool.ts';

const bundledWorkerUrl = new URL('../../build/cli/study-worker.cjs', import.meta.url);
const bootUrl = new URL('./node-worker-boot.mjs', import.meta.url);
const entryUrl = new URL('./node-worker.ts', import.meta.url);
const wasmLoaderUrl = new URL('../engine/wasm.ts', import.meta.url);

/** How a worker is started: the worker bundled at build time, bundled script text, or the tsx bootstrap file. */
type WorkerSource = { kind: 'built' } | { kind: 'bundle'; code: string } | { kind: 'tsx' };

/** Set by the build of the command line (scripts/build-cli.mjs). */
const bundled = (globalThis as { GRIDGAUGE_BUNDLED?: boolean }).GRIDGAUGE_BUNDLED === true;

let source: Promise<WorkerSource> | undefined;

async function bundleWorker(): Promise<WorkerSource> {
  try {
    const esbuildName = 'esbuild';
    const esbuild = (await import(/* @vite-ignore */ esbuildName)) as typeof import('esbuild');
    const result = await esbuild.build({
      entryPoints: [fileURLToPath(entryUrl)],
      bundle: true,
      platform: 'node',
      format: 'cjs',
      target: 'node20',
      write: false,
      logLevel: 'silent',
      // the engine module is handed over compiled, so the loader's URL is never fetched; it
      // is still computed when the module loads, so give it the loader's own location
      define: { 'import.meta.url': JSON.stringify(wasmLoaderUrl.href) },
    });
    return { kind: 'bundle', code: result.outputFiles[0].text };
  } catch {
    return { kind: 'tsx' };
  }
}

/**
 * A factory of worker threads: from the bundle when esbuild is there (default), or always
 * through tsx with `'tsx'`. An unexpected exit of a worker counts as its failure.
 */
export function makeNodeWorkerFactory(mode: 'bundle' | 'tsx' = 'bundle'): WorkerFactory {
  if (mode === 'tsx') return (handlers) => startWorker(Promise.resolve({ kind: 'tsx' }), handlers);
  return (handlers) => startWorker(bundled ? Promise.resolve({ kind: 'built' }) : (source ??= bundleWorker()), handlers);
}

export const nodeWorkerFactory: WorkerFactory = makeNodeWorkerFactory();

function startWorker(from: Promise<WorkerSource>, handlers: WorkerHandlers): WorkerPort {
  let stopping = false;
  let worker: Worker | undefined;
  Promise.all([from, loadEngineModules()]).then(([from, modules]) => {
    if (stopping) return;
    worker = from.kind === 'built' ? new Worker(bundledWorkerUrl, { workerData: { modules } })
      : from.kind === 'bundle' ? new Worker(from.code, { eval: true, workerData: { modules } })
        : new Worker(bootUrl, { workerData: { entry: entryUrl.href, modules } });
    worker.on('message', handlers.message);
    worker.on('error', handlers.error);
    worker.on('exit', (code) => {
      if (!stopping) handlers.error(new Error(`study worker stopped unexpectedly (exit code ${code})`));
    });
  }, (e: unknown) => handlers.error(e instanceof Error ? e : new Error(String(e))));
  return {
    // the pool posts jobs only after the worker said "ready", so the worker exists by then
    post: (message) => worker?.postMessage(message),
    terminate: () => {
      stopping = true;
      void worker?.terminate();
    },
  };
}

/** Hardware threads of this machine. */
export function hardwareThreads(): number {
  return availableParallelism();
}

/** A pool of `size` worker threads (default: one per hardware thread). */
export function createNodePool(size = hardwareThreads()): StudyPool {
  return new StudyPool(nodeWorkerFactory, size);
}
