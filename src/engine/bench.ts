import { BENCH_CPML_CELLS, benchScenario } from './bench-scenario.ts';
import { stripVectorsPerRow } from '../scenario/memory.ts';
import { PlainKernel } from './plain-kernel.ts';
import { Simulation } from './simulation.ts';
import { instantiateEngine, loadEngineModule, loadMediaModule } from './wasm.ts';
import { measureMedium } from './bench-media.ts';

/**
 * The engine benchmark behind `gridgauge bench`: Mcells/s (million Ez-node updates per
 * second, nx·ny·steps / seconds / 1e6) of the wasm engine and of a plain-TypeScript kernel
 * of the same algorithm, timed in alternation so that both see the same machine load; the
 * memory traffic per cell update, set against the machine's memory bandwidth measured
 * in the same run; the cost of probes and running DFTs; and the speed early and late in
 * a run: fields that decay towards zero pass through subnormal floats, which some
 * processors handle slowly and WebAssembly cannot flush to zero.
 */

/** One grid size. The first six fields are the `bench --json` contract (docs/outputs.md). */
export interface BenchResult {
  nx: number;
  ny: number;
  /** Steps in one timed engine run. */
  steps: number;
  /** Engine, median over the timed runs, Mcells/s. */
  engine_mcells: number;
  /** Plain-TypeScript kernel, median over its timed runs, Mcells/s. */
  plain_ts_mcells: number;
  /** engine_mcells / plain_ts_mcells. */
  ratio: number;
  /** CPML cells on each side. */
  cpml_cells: number;
  /** Steps in one timed plain-TypeScript run. */
  plain_ts_steps: number;
  /** Every timed run, Mcells/s, in the order they ran. */
  engine_runs_mcells: number[];
  plain_ts_runs_mcells: number[];
  /** Memory the three field arrays occupy, bytes. */
  field_bytes: number;
  /**
   * Bytes a step must move per cell update if every array value is read once and written
   * once: Ez, Hx, Hy (24 B) plus the CPML ψ values spread over the grid.
   */
  bytes_per_cell: number;
  /** bytes_per_cell · engine_mcells: the memory traffic the engine's speed implies, GB/s. */
  implied_GBps: number;
  /** implied_GBps as a share of memoryBandwidth_GBps, %. */
  bandwidth_share_pct: number;
  /** Extra time for 10 probes, 2 lines of 200 nodes and 3 running DFT frequencies, %. */
  probes_overhead_pct: number | null;
  /**
   * The same runs timed by this process's CPU time instead of the wall clock: higher than
   * the wall-clock figure when other processes took turns on the processor.
   */
  engine_cpu_mcells: number | null;
  plain_ts_cpu_mcells: number | null;
  /** The medium of the run: "lossless" (the lossless engine), "lossy" (σ only) or "debye" (one Debye pole; both on the media engine). */
  medium: string;
  /** Media rows: the lossless engine's speed timed in alternation with this one, and the ratio. */
  lossless_engine_mcells?: number;
  ratio_to_lossless?: number;
  /** Media rows: the media engine's memory beyond the lossless engine's for the same grid, bytes per cell (from memoryBytes). */
  extra_bytes_per_cell?: number;
}

export interface MemoryBandwidth {
  /** Three arrays read and rewritten in one pass in wasm (the traffic shape of a step), GB/s. */
  stream3_GBps: number;
  /** One array copied to another (typed-array copyWithin), read + write bytes, GB/s. */
  copy_GBps: number;
  /** Bytes touched per measurement, chosen to be far larger than the caches. */
  bytes: number;
}

/** Speeds through a run, timed by this process's CPU time where it can be read. */
export interface SpeedOverRun {
  nx: number;
  ny: number;
  /** Steps per timed window. */
  window: number;
  /** Median Mcells/s over the windows in which subnormal floats were present. */
  with_subnormals_mcells: number | null;
  /** Median over those windows of the extra time against the all-zero twin, %. */
  subnormal_slowdown_pct: number | null;
  /** First and last step of the windows that had subnormal values. */
  subnormal_steps: [number, number] | null;
  /** Median Mcells/s of a twin grid with no source (all zeros), timed alternately. */
  zero_field_mcells: number;
  /** Median Mcells/s over steps 0–300 (the front crossing a 256² grid). */
  early_mcells: number;
  /** Median Mcells/s over the last 500 steps (the wave has filled the grid and the absorber). */
  late_mcells: number;
  /** Most subnormal field values seen in any window, and at which step. */
  max_subnormals: number;
  max_subnormals_step: number;
  windows: { step: number; mcells: number; zero_field_mcells: number; subnormals: number }[];
}

export interface BenchReport {
  results: BenchResult[];
  /** The larger of the two bandwidth measurements, GB/s. */
  memoryBandwidth_GBps: number;
  memoryBandwidth: MemoryBandwidth;
  speedOverRun: SpeedOverRun | null;
  environment: { runtime: string; cpu: string; cores: number; loadAverage: number[] };
  /** Runs per figure, and the seconds aimed at per timed run. */
  runs: number;
  run_seconds: number;
}

export interface BenchOptions {
  /** Grid sizes n (n × n), default 256, 1024, 2048. */
  sizes?: number[];
  /** Fewer and shorter runs: a check that everything works, not figures to quote. */
  quick?: boolean;
  onProgress?: (msg: string) => void;
}

const CPML_CELLS = BENCH_CPML_CELLS;
export { benchScenario };

export const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
};
const now = () => performance.now() / 1e3;
export const round = (x: number, digits = 0) => Number(x.toFixed(digits));
const finite = (x: number) => (Number.isFinite(x) ? round(x) : null);

interface Timing { wall: number; cpu: number }

/** CPU seconds this process has used (all threads), or NaN where it cannot be read. */
function cpuSeconds(): number {
  if (typeof process === 'undefined' || typeof process.cpuUsage !== 'function') return NaN;
  const u = process.cpuUsage();
  return (u.user + u.system) / 1e6;
}

/** Wall-clock and CPU seconds for `count` steps of `step`. */
export function timeRun(step: (count: number) => unknown, count: number): Timing {
  const c0 = cpuSeconds();
  const t0 = now();
  step(count);
  const wall = now() - t0;
  return { wall, cpu: cpuSeconds() - c0 };
}

/** Wall-clock seconds for `count` steps of `step`. */
function timeSteps(step: (count: number) => unknown, count: number): number {
  return timeRun(step, count).wall;
}

/**
 * CPU seconds for `count` steps where they can be read, else wall-clock seconds: for
 * comparing two runs by their own work, whatever else the machine is doing meanwhile.
 */
function ownSeconds(step: (count: number) => unknown, count: number): number {
  const t = timeRun(step, count);
  return Number.isFinite(t.cpu) && t.cpu > 0 ? t.cpu : t.wall;
}

/** Steps that take about `seconds`, from a timed probe run of `probeSteps`. */
export function stepsFor(seconds: number, step: (count: number) => unknown, probeSteps: number): number {
  const t = Math.max(timeSteps(step, probeSteps), 1e-6);
  return Math.max(1, Math.round((seconds / t) * probeSteps));
}

/** Modelled bytes per cell update: fields read and written once, ψ likewise (see BenchResult). */
export function bytesPerCellUpdate(nx: number, ny: number, cells: number, psiXRow: number): number {
  const psiValues = 2 * ny * psiXRow + 2 * (2 * cells) * nx;
  return (3 * 8 * nx * ny + 8 * psiValues) / (nx * ny);
}

async function measureBandwidth(module: WebAssembly.Module, quick: boolean): Promise<MemoryBandwidth> {
  // 3 × 64 MiB: far beyond the last-level cache of any machine this runs on.
  const n = 4096;
  const e = instantiateEngine(module);
  if (e.allocate(n, n, 0, 1, 0, 0, 0, 0) === 0) throw new Error('bench: could not allocate the bandwidth buffers');
  const bytes = 3 * n * n * 4;
  e.streamFields(1);
  const stream: number[] = [];
  const copy: number[] = [];
  const u8 = new Uint8Array(e.memory.buffer, e.pointerTo(0), bytes);
  const half = Math.floor(bytes / 2 / 64) * 64;
  for (let r = 0; r < (quick ? 3 : 7); r++) {
    const t = timeSteps((c) => e.streamFields(c), 2);
    stream.push((2 * 2 * bytes) / t / 1e9);
    const t0 = now();
    u8.copyWithin(0, half, 2 * half);
    copy.push((2 * half) / (now() - t0) / 1e9);
  }
  return { stream3_GBps: round(median(stream), 1), copy_GBps: round(median(copy), 1), bytes };
}

async function environment(): Promise<BenchReport['environment']> {
  try {
    const os = await import(/* @vite-ignore */ 'node:os');
    return {
      runtime: `Node ${process.versions.node}, V8 ${process.versions.v8}`,
      cpu: os.cpus()[0]?.model ?? 'unknown', cores: os.cpus().length,
      loadAverage: os.loadavg().map((x) => round(x, 2)),
    };
  } catch {
    return { runtime: 'browser', cpu: 'unknown', cores: navigator.hardwareConcurrency ?? 0, loadAverage: [] };
  }
}

/** Engine against plain TypeScript at one size, timed in alternation. */
function measureSize(module: WebAssembly.Module, n: number, runs: number, runSeconds: number,
  memoryBandwidth: number, quick: boolean): BenchResult {
  const total = 1_000_000; // the source table's length; steps beyond the pulse are ordinary steps
  const sim = new Simulation(module, benchScenario(n, total));
  const plain = PlainKernel.fromScenario(benchScenario(n, Math.min(total, 100_000)));
  // Warm-up: both kernels compiled by their optimising tiers (wasm tier-up, V8 OSR).
  const warm = Math.max(4, Math.round(2e6 / (n * n)));
  for (let r = 0; r < 3; r++) { sim.step(warm); plain.step(Math.max(1, warm >> 2)); }
  const engineSteps = stepsFor(runSeconds, (c) => sim.step(c), warm);
  const plainSteps = stepsFor(runSeconds, (c) => plain.step(c), Math.max(1, warm >> 2));
  const engineRuns: number[] = [];
  const plainRuns: number[] = [];
  const engineCpu: number[] = [];
  const plainCpu: number[] = [];
  for (let r = 0; r < runs; r++) {
    const e = timeRun((c) => sim.step(c), engineSteps);
    const p = timeRun((c) => plain.step(c), plainSteps);
    engineRuns.push((n * n * engineSteps) / e.wall / 1e6);
    plainRuns.push((n * n * plainSteps) / p.wall / 1e6);
    engineCpu.push((n * n * engineSteps) / e.cpu / 1e6);
    plainCpu.push((n * n * plainSteps) / p.cpu / 1e6);
  }
  sim.dispose();
  const engineMcells = median(engineRuns);
  const plainMcells = median(plainRuns);
  const bytes = bytesPerCellUpdate(n, n, CPML_CELLS, 4 * stripVectorsPerRow(n, CPML_CELLS));
  const implied = (bytes * engineMcells) / 1e3;
  return {
    nx: n, ny: n, steps: engineSteps,
    engine_mcells: round(engineMcells), plain_ts_mcells: round(plainMcells), ratio: round(engineMcells / plainMcells, 2),
    cpml_cells: CPML_CELLS, plain_ts_steps: plainSteps,
    engine_runs_mcells: engineRuns.map((x) => round(x)), plain_ts_runs_mcells: plainRuns.map((x) => round(x)),
    field_bytes: 3 * 4 * n * n,
    bytes_per_cell: round(bytes, 2), implied_GBps: round(implied, 1),
    bandwidth_share_pct: round((100 * implied) / memoryBandwidth, 0),
    probes_overhead_pct: measureProbeOverhead(module, n, quick ? 3 : runs, runSeconds / 2),
    engine_cpu_mcells: finite(median(engineCpu)), plain_ts_cpu_mcells: finite(median(plainCpu)),
    medium: 'lossless',
  };
}

/** Extra run time with 10 probes, 2 lines of 200 nodes and 3 frequencies, %. */
function measureProbeOverhead(module: WebAssembly.Module, n: number, runs: number, runSeconds: number): number | null {
  if (n - 2 * CPML_CELLS < 40) return null;
  const total = 1_000_000;
  const bare = new Simulation(module, benchScenario(n, total, false));
  const full = new Simulation(module, benchScenario(n, total, true));
  const warm = Math.max(4, Math.round(2e6 / (n * n)));
  bare.step(warm); full.step(warm);
  const steps = stepsFor(runSeconds, (c) => bare.step(c), warm);
  const ratios: number[] = [];
  for (let r = 0; r < runs; r++) {
    // Alternate which goes first, so a drift in machine speed cancels.
    const first = r % 2 === 0;
    const a = first ? ownSeconds((c) => bare.step(c), steps) : 0;
    const b = ownSeconds((c) => full.step(c), steps);
    const c = first ? a : ownSeconds((k) => bare.step(k), steps);
    ratios.push(b / c);
  }
  bare.dispose(); full.dispose();
  return round(100 * (median(ratios) - 1), 1);
}

/**
 * Speed through a whole run at n × n, window by window, against a twin grid with no source
 * (all zeros, never subnormal) stepped alternately. The numerical wave front runs ahead of
 * the pulse at one cell per step, and between the field and the untouched zeros ahead of it
 * lies a band of subnormal values for as long as that front is crossing the grid.
 */
function measureSpeedOverRun(module: WebAssembly.Module, n: number, quick: boolean): SpeedOverRun {
  const total = quick ? 800 : 2000;
  const window = 25;
  const pulse = new Simulation(module, benchScenario(n, total));
  const zero = new Simulation(module, benchScenario(n, total, false, 0));
  const spare = new Simulation(module, benchScenario(n, total));
  spare.step(Math.max(20, Math.round(3e7 / (n * n)))); // compile to the optimising tier first
  spare.dispose();
  const windows: SpeedOverRun['windows'] = [];
  const tiny = 1.1754943508222875e-38; // smallest normal float32
  const ratios: number[] = [];
  while (pulse.stepsDone < total) {
    const first = windows.length % 2 === 0; // alternate which goes first
    const tz0 = first ? 0 : ownSeconds((c) => zero.step(c), window);
    const tp = ownSeconds((c) => pulse.step(c), window);
    const tz = first ? ownSeconds((c) => zero.step(c), window) : tz0;
    let subnormals = 0;
    for (const v of [pulse.ezView(), pulse.hxView(), pulse.hyView()]) {
      for (let k = 0; k < v.length; k++) {
        const a = Math.abs(v[k]);
        if (a !== 0 && a < tiny) subnormals++;
      }
    }
    if (subnormals > 0) ratios.push(tp / tz);
    windows.push({ step: pulse.stepsDone, mcells: round((n * n * window) / tp / 1e6), zero_field_mcells: round((n * n * window) / tz / 1e6), subnormals });
  }
  pulse.dispose(); zero.dispose();
  const withSub = windows.filter((w) => w.subnormals > 0);
  const worst = windows.reduce((m, w) => (w.subnormals > m.subnormals ? w : m), windows[0]);
  const late = windows.filter((w) => w.step > total - 500);
  return {
    nx: n, ny: n, window,
    with_subnormals_mcells: withSub.length ? round(median(withSub.map((w) => w.mcells))) : null,
    subnormal_slowdown_pct: ratios.length ? round(100 * (median(ratios) - 1), 0) : null,
    subnormal_steps: withSub.length ? [withSub[0].step - window, withSub[withSub.length - 1].step] : null,
    zero_field_mcells: round(median(windows.map((w) => w.zero_field_mcells))),
    early_mcells: round(median(windows.filter((w) => w.step <= 300).map((w) => w.mcells))),
    late_mcells: round(median(late.map((w) => w.mcells))),
    max_subnormals: worst.subnormals, max_subnormals_step: worst.step,
    windows,
  };
}

/**
 * Runs the benchmark in this process (Node): memory bandwidth first, then each grid size,
 * then the speed through a whole 256² run. Takes about half a minute (a few seconds quick).
 *
 * @example
 * const report = await runBench({ sizes: [256], quick: true });
 * console.log(formatBenchReport(report));
 */
export async function runBench(options: BenchOptions = {}): Promise<BenchReport> {
  const sizes = options.sizes ?? [256, 1024, 2048];
  const quick = options.quick ?? false;
  const say = options.onProgress ?? (() => {});
  const runs = quick ? 3 : 9;
  const runSeconds = quick ? 0.04 : 0.15;
  const module = await loadEngineModule();
  say('bench: memory bandwidth');
  const memoryBandwidth = await measureBandwidth(module, quick);
  const bandwidth = Math.max(memoryBandwidth.stream3_GBps, memoryBandwidth.copy_GBps);
  const results: BenchResult[] = [];
  for (const n of sizes) {
    say(`bench: ${n} × ${n}, engine and plain TypeScript`);
    results.push(measureSize(module, n, runs, runSeconds, bandwidth, quick));
  }
  if (sizes.includes(1024)) {
    const modules = { engine: module, media: await loadMediaModule() };
    for (const medium of ['lossy', 'debye'] as const) {
      say(`bench: 1024 × 1024, ${medium} medium on the media engine`);
      results.push(measureMedium(modules, 1024, medium, runs, runSeconds));
    }
  }
  say('bench: speed early and late in a 256 × 256 run');
  const speedOverRun = measureSpeedOverRun(module, 256, quick);
  return {
    results, memoryBandwidth_GBps: bandwidth, memoryBandwidth, speedOverRun,
    environment: await environment(), runs, run_seconds: runSeconds,
  };
}

export { formatBenchReport } from './bench-format.ts';
