/**
 * The browser benchmark page (bench.html): steps a benchmark grid with the real engine
 * through Simulation on the main thread and writes steps per second into the page.
 * scripts/bench-browser.mjs drives it; it also works opened by hand.
 * Query: size (default 1024), runs (default 9; 0 = set up only, for a driver that calls
 * window.gridgaugeBench.run itself), seconds per run (default 0.3).
 * `window.gridgaugeBench.split` times a page scenario's engine work in three parts for
 * scripts/bench-page.mjs (see {@link engineSplit}).
 */
import { benchScenario } from '../engine/bench-scenario.ts';
import { createSimulation, loadEngineModules, type AnySimulation } from '../engine/create-simulation.ts';
import { Simulation } from '../engine/simulation.ts';
import type { Scenario } from '../scenario/types.ts';
import { mapOptions } from './map-plan.ts';

/** Engine milliseconds per step of a scenario: bare field update, with probe and line DFTs, and with the error maps' full-grid DFTs too. */
export interface EngineSplit {
  nx: number; ny: number;
  bare_ms: number;
  points_ms: number;
  maps_ms: number;
  steps_per_run: number;
  runs: number;
}

const medianOf = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
};

/**
 * Times the engine on `scenario` three ways, in alternation so that all see the same load:
 * without probes, lines or frequencies; with them (probe series and running DFTs); and with
 * the full-grid DFTs the run worker adds for the error maps at `mapFrequencies`. Each is
 * warmed up first (the wave is out of the source by then); medians of `runs` timed runs.
 */
export async function engineSplit(scenario: Scenario, mapFrequencies: number[], runs = 5, seconds = 0.3): Promise<EngineSplit> {
  const modules = await loadEngineModules();
  const long = { ...scenario, steps: 100_000 };
  const bare = { ...long, probes: [], lines: [], frequencies: [] };
  const sims: AnySimulation[] = [
    createSimulation(modules, bare), createSimulation(modules, long), createSimulation(modules, long, mapOptions(mapFrequencies)),
  ];
  const time = (sim: AnySimulation, count: number) => {
    const t0 = performance.now();
    sim.step(count);
    return performance.now() - t0;
  };
  for (const sim of sims) time(sim, 300);
  const count = Math.max(1, Math.round((seconds * 1000 * 20) / Math.max(time(sims[0], 20), 1e-3)));
  const perStep: number[][] = [[], [], []];
  for (let r = 0; r < runs; r++) {
    sims.forEach((sim, k) => perStep[k].push(time(sim, count) / count));
    await pause();
  }
  for (const sim of sims) sim.dispose();
  return {
    nx: scenario.grid.nx, ny: scenario.grid.ny,
    bare_ms: medianOf(perStep[0]), points_ms: medianOf(perStep[1]), maps_ms: medianOf(perStep[2]),
    steps_per_run: count, runs,
  };
}

export interface BenchPageResult {
  nx: number; ny: number;
  steps_per_run: number;
  steps_per_second: number;
  mcells: number;
  runs_mcells: number[];
  userAgent: string;
}

declare global {
  interface Window {
    gridgaugeBench?: {
      /** Steps `count` steps and returns the seconds they took. */
      run(count: number): number;
      split?: typeof engineSplit;
      nx: number; ny: number;
      result?: BenchPageResult;
      error?: string;
    };
  }
}

const params = new URLSearchParams(location.search);
const n = Number(params.get('size') ?? 1024);
const runs = Number(params.get('runs') ?? 9);
const seconds = Number(params.get('seconds') ?? 0.3);

function show(id: string, text: string): void {
  const el = document.getElementById(id);
  if (el) el.textContent = text;
}

const pause = () => new Promise((resolve) => setTimeout(resolve, 0));

async function main(): Promise<void> {
  show('grid', `${n} × ${n}`);
  const sim = await Simulation.create(benchScenario(n, 1_000_000));
  const run = (count: number) => {
    const t0 = performance.now();
    sim.step(count);
    return (performance.now() - t0) / 1e3;
  };
  // Warm-up: the engine's functions move to the optimising compiler after a few calls.
  const warm = Math.max(4, Math.round(2e6 / (n * n)));
  for (let r = 0; r < 4; r++) run(warm);
  const steps = Math.max(1, Math.round((seconds / Math.max(run(warm), 1e-6)) * warm));
  window.gridgaugeBench = { run, split: engineSplit, nx: n, ny: n };
  document.body.dataset.state = 'ready';
  if (runs <= 0) return;
  const perRun: number[] = [];
  for (let r = 0; r < runs; r++) {
    perRun.push((n * n * steps) / run(steps) / 1e6);
    show('mcells', `${perRun[perRun.length - 1].toFixed(0)} (run ${r + 1} of ${runs})`);
    await pause();
  }
  const sorted = [...perRun].sort((a, b) => a - b);
  const mcells = sorted.length % 2 ? sorted[sorted.length >> 1] : (sorted[sorted.length / 2 - 1] + sorted[sorted.length / 2]) / 2;
  const result: BenchPageResult = {
    nx: n, ny: n, steps_per_run: steps,
    steps_per_second: Number(((mcells * 1e6) / (n * n)).toFixed(1)),
    mcells: Math.round(mcells),
    runs_mcells: perRun.map((x) => Math.round(x)),
    userAgent: navigator.userAgent,
  };
  window.gridgaugeBench.result = result;
  show('steps-per-second', result.steps_per_second.toFixed(1));
  show('mcells', String(result.mcells));
  show('result', JSON.stringify(result, null, 2));
  document.body.dataset.state = 'done';
}

main().catch((e: unknown) => {
  const message = e instanceof Error ? e.message : String(e);
  show('result', `error: ${message}`);
  window.gridgaugeBench = { run: () => NaN, nx: n, ny: n, error: message };
  document.body.dataset.state = 'error';
});
