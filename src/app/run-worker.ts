/**
 * The page's run worker: takes a scenario and steps the engine in batches of about 40 ms,
 * so that pause, resume and stop are heard between batches. Between batches it sends an Ez
 * frame when the page has asked for one (the field view asks once per picture it paints
 * while it is on screen, so frames come at the display's rate and never pile up), replay
 * frames at even steps through the run while the field view is on screen, and progress a
 * few times a second; the engine never waits for the page. At the end (or on stop) it sends
 * the comparison results and the error maps, their buffers transferred, not copied.
 */
import { errorMapOf, type ErrorMap } from '../compare/error-map.ts';
import { collectResults } from '../compare/results.ts';
import { drive } from '../engine/batch-driver.ts';
import { createSimulation, loadEngineModules, type AnySimulation, type EngineModules } from '../engine/create-simulation.ts';
import { demoScenario } from '../scenario/defaults.ts';
import type { Scenario } from '../scenario/types.ts';
import { mapOptions } from './map-plan.ts';
import type { FromWorker, ToWorker } from './protocol.ts';

declare const self: DedicatedWorkerGlobalScope;

/** Both engines, compiled once as the worker starts. */
const modules = loadEngineModules();

/** Replay frames per run, at even steps, while the field view is on screen. */
const FRAMES_PER_RUN = 40;
/** Aim for batches of about this much stepping, ms: long enough that the time between batches is small beside it, short enough that commands are answered promptly. */
const BATCH_TARGET_MS = 40;
/** Progress messages at most this often, ms. */
const PROGRESS_INTERVAL_MS = 100;
/** Least time between two blow-up checks, ms; grown with the grid (400 ms at 1000²) so that their full-grid passes stay about 1 % of the time. */
const WATCH_INTERVAL_MS = 33;
const WATCH_MS_PER_NODE = 4e-4;
/** Largest side of a frame sent to the page; bigger grids are sampled every few nodes. */
const FRAME_MAX_SIDE = 600;

let paused = false;
let stopRequested = false;
let wake: (() => void) | undefined;
/** The page has drawn its last frame and wants the next. */
let frameWanted = false;
/** The field view is on screen: replay frames are worth capturing. */
let fieldOnScreen = true;
/**
 * Frame buffers the page has given back, filled again for later frames: memory fresh from
 * the system costs a page fault per 4 KiB on its first touch, which on some machines is
 * slower than the copy itself.
 */
const spare: ArrayBuffer[] = [];
const SPARE_LIMIT_BYTES = 128 * 2 ** 20;

/**
 * The last simulation, kept so that the next run takes over its engine instance and the
 * memory behind it (for the same reason) unless it is much larger than the next run needs.
 */
let lastRun: AnySimulation | undefined;

function reusable(scenario: Scenario, maps: number): AnySimulation | undefined {
  const needed = 4 * scenario.grid.nx * scenario.grid.ny * (3 + 2 * maps);
  if (lastRun && lastRun.memoryBytes > 2 * needed + 2 ** 26) {
    lastRun.dispose();
    lastRun = undefined;
  }
  return lastRun;
}

function bufferOf(bytes: number): ArrayBuffer {
  const k = spare.findIndex((b) => b.byteLength === bytes);
  return k >= 0 ? spare.splice(k, 1)[0] : new ArrayBuffer(bytes);
}

function takeBack(buffers: readonly ArrayBuffer[]): void {
  for (const b of buffers) if (b.byteLength > 0) spare.push(b);
  let total = spare.reduce((n, b) => n + b.byteLength, 0);
  while (total > SPARE_LIMIT_BYTES) total -= (spare.shift() as ArrayBuffer).byteLength;
}

const post = (message: FromWorker, transfer: Transferable[] = []) => self.postMessage(message, transfer);

// A message-channel hop yields to the event loop without the 4 ms clamp of nested timeouts.
const channel = new MessageChannel();
const yieldQueue: (() => void)[] = [];
channel.port1.onmessage = () => yieldQueue.shift()?.();
function yieldToMessages(): Promise<void> {
  return new Promise((resolve) => {
    yieldQueue.push(resolve);
    channel.port2.postMessage(0);
  });
}

/** Ez now, every `stride`-th node so that no side exceeds `maxSide`, in a buffer given back earlier where one fits. */
function frameOf(sim: AnySimulation, runId: number, film: boolean, maxSide = FRAME_MAX_SIDE): FromWorker & { type: 'frame' } {
  const { nx, ny } = sim.layout;
  const stride = Math.max(1, Math.ceil(Math.max(nx, ny) / maxSide));
  const ez = sim.ezView();
  const width = Math.ceil(nx / stride);
  const height = Math.ceil(ny / stride);
  const data = new Float32Array(bufferOf(4 * width * height));
  if (stride === 1) {
    data.set(ez);
  } else {
    for (let r = 0; r < height; r++) {
      const row = r * stride * nx;
      for (let c = 0; c < width; c++) data[r * width + c] = ez[row + c * stride];
    }
  }
  return { type: 'frame', runId, step: sim.stepsDone, width, height, stride, film, data };
}

/** The error maps a finished (or stopped) run accumulated, in the order asked for. */
function mapsOf(sim: AnySimulation): ErrorMap[] {
  return sim.fullGridFrequencies.flatMap((_f, k) => errorMapOf(sim, k) ?? []);
}

async function run(message: ToWorker & { type: 'run' }): Promise<void> {
  const { runId, scenario } = message;
  const t0 = performance.now();
  paused = false;
  stopRequested = false;
  let sim: AnySimulation | undefined;
  try {
    const engines = await modules;
    sim = createSimulation(engines, scenario, { ...mapOptions(message.mapFrequencies), reuse: reusable(scenario, message.mapFrequencies.length) });
    const tSetup = performance.now();
    post({ type: 'started', runId, stepsTotal: scenario.steps });
    const frameSteps = Math.max(1, Math.ceil(scenario.steps / FRAMES_PER_RUN));
    let nextFilmStep = frameSteps;
    let lastFrameStep = -1;
    let lastProgress = -Infinity;
    const live = sim;
    const split = { wall: 0, engine: 0, frames: 0, progress: 0, idle: 0, batches: 0, frameCount: 0 };
    let pausedMs = 0;
    const tFirst = performance.now();
    // Steps per second by the wall clock from the first batch, pauses left out: what the person gets.
    const stepsPerSecond = () => (1000 * live.stepsDone) / Math.max(performance.now() - tFirst - pausedMs, 1e-3);
    const sendFrame = (film: boolean) => {
      const t = performance.now();
      const frame = frameOf(live, runId, film);
      post(frame, [frame.data.buffer]);
      lastFrameStep = live.stepsDone;
      split.frameCount++;
      split.frames += performance.now() - t;
    };
    const outcome = await drive(sim, {
      cellsPerBatch: 2e7, maxBatchSteps: frameSteps, targetBatchMs: BATCH_TARGET_MS,
      shouldStop: () => stopRequested, watch: true,
      watchIntervalMs: Math.max(WATCH_INTERVAL_MS, WATCH_MS_PER_NODE * sim.layout.nx * sim.layout.ny),
      afterBatch: async () => {
        split.batches++;
        const film = fieldOnScreen && live.stepsDone >= nextFilmStep;
        if (film) nextFilmStep = (Math.floor(live.stepsDone / frameSteps) + 1) * frameSteps;
        if ((frameWanted || film) && live.stepsLeft > 0) {
          frameWanted = false;
          sendFrame(film);
        }
        const now = performance.now();
        if (now - lastProgress >= PROGRESS_INTERVAL_MS) {
          lastProgress = now;
          post({ type: 'progress', runId, stepsDone: live.stepsDone, stepsPerSecond: stepsPerSecond(), paused: false });
          split.progress += performance.now() - now;
        }
        const tYield = performance.now();
        await yieldToMessages();
        split.idle += performance.now() - tYield;
        if (paused && !stopRequested) {
          const tPause = performance.now();
          while (paused && !stopRequested) {
            post({ type: 'progress', runId, stepsDone: live.stepsDone, stepsPerSecond: stepsPerSecond(), paused: true });
            await new Promise<void>((resolve) => { wake = resolve; });
          }
          pausedMs += performance.now() - tPause;
        }
      },
    });
    split.wall = performance.now() - tFirst - pausedMs;
    split.engine = outcome.steppingMs;
    const { blowUp } = outcome;
    // The last field is always sent, on screen or not: it is what the view shows afterwards.
    if (sim.stepsDone !== lastFrameStep) sendFrame(true);
    const tStepped = performance.now();
    const results = collectResults(sim);
    const tResults = performance.now();
    const errorMaps = mapsOf(sim);
    const tMap = performance.now();
    const transfer: Transferable[] = [];
    for (const p of results.probes) transfer.push(p.fdtd.buffer, p.exact.buffer);
    for (const m of errorMaps) transfer.push(m.db.buffer);
    post({
      type: 'done', runId, stopped: sim.stepsLeft > 0, results, errorMaps, blowUp, energyLeftDb: outcome.energyLeftDb,
      runSeconds: (performance.now() - t0) / 1000,
      stepsPerSecond: (1000 * sim.stepsDone) / Math.max(split.wall, 1e-3),
      timings: { setup: tSetup - t0, stepping: tStepped - tSetup, results: tResults - tStepped, errorMap: tMap - tResults, split },
    }, transfer);
  } catch (e) {
    post({ type: 'failed', runId, message: e instanceof Error ? e.message : String(e) });
  } finally {
    if (sim && !sim.disposed) lastRun = sim;
  }
}

self.onmessage = (event: MessageEvent<ToWorker>) => {
  const message = event.data;
  switch (message.type) {
    case 'run':
      void run(message);
      break;
    case 'pause':
      paused = true;
      break;
    case 'resume':
      paused = false;
      wake?.();
      break;
    case 'stop':
      stopRequested = true;
      paused = false;
      wake?.();
      break;
    case 'frame':
      frameWanted = true;
      break;
    case 'view':
      fieldOnScreen = message.visible;
      break;
    case 'recycle':
      takeBack(message.buffers);
      break;
    case 'crash':
      setTimeout(() => { throw new Error('deliberate worker fault (recovery test)'); }, 0);
      break;
  }
};

/**
 * A rehearsal of the demo (the page's own scenario, and most often its first run) through
 * every stage before saying "ready": stepping, replay frames, results and error maps. The
 * browser then has optimised code for all of them, and the worker holds memory the system
 * has already backed (the engine instance, kept for the next run, and the frame buffers,
 * kept for reuse), when the person's first run starts.
 */
function warmUp(engines: EngineModules): void {
  const s = demoScenario();
  const scenario: Scenario = { ...s, steps: Math.min(s.steps, 400) };
  const sim = createSimulation(engines, scenario, mapOptions(scenario.frequencies));
  const frameSteps = Math.max(1, Math.ceil(scenario.steps / FRAMES_PER_RUN));
  const buffers: ArrayBuffer[] = [];
  while (sim.stepsLeft > 0) {
    sim.step(frameSteps);
    buffers.push(frameOf(sim, 0, true).data.buffer as ArrayBuffer);
  }
  buffers.push(frameOf(sim, 0, false, s.grid.nx / 2).data.buffer as ArrayBuffer); // the sampled path too, as big grids take it
  takeBack(buffers);
  // twice: the first call teaches the compiler the types, the second runs optimised code
  for (let k = 0; k < 2; k++) {
    collectResults(sim);
    mapsOf(sim);
  }
  lastRun = sim;
}

// Compile and warm the engine before saying "ready", so pressing run does not wait for it.
modules.then(
  (engines) => {
    try {
      warmUp(engines);
    } catch {
      // a failed warm-up only costs speed; a real run reports its own errors
    }
    self.postMessage('ready');
  },
  (e: unknown) => self.postMessage({ type: 'failed', runId: -1, message: `the engine could not be loaded: ${e instanceof Error ? e.message : String(e)}` }),
);
