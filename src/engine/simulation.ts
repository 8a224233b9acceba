import { EPS0, MU0 } from '../scenario/constants.ts';
import { layoutOf, type Layout } from '../scenario/layout.ts';
import type { Scenario } from '../scenario/types.ts';
import { cpmlAxisTables } from './cpml-profile.ts';
import { engineMemoryBytes } from '../scenario/memory.ts';
import { waveformValue } from '../scenario/waveforms.ts';
import { instantiateEngine, loadEngineModule, type EngineExports } from './wasm.ts';
import { driveSync } from './batch-driver.ts';
import type { Complex } from '../exact/complex.ts';
import { fullGridDecimation } from '../exact/dft-decimation.ts';
import { isSimpleMedium } from '../exact/medium.ts';

/** The most memory one engine instance can address (wasm32), less a margin for its own data. */
const WASM32_LIMIT_BYTES = 4 * 2 ** 30 - 2 ** 26;

export type { Complex } from '../exact/complex.ts';

export interface SimulationOptions {
  /** Frequency of one full-grid running DFT sampled at every step (the report's error map), Hz. */
  fullGridFrequency?: number;
  /**
   * Frequencies of full-grid running DFTs (the page's error maps), Hz, taken in one pass and
   * sampled every m-th step, m chosen from the pulse's band so that aliases stay 80 dB below
   * the wanted value (src/exact/dft-decimation.ts). Takes the place of `fullGridFrequency`.
   */
  fullGridFrequencies?: readonly number[];
  /** Decimation of every full-grid DFT instead of the ones chosen, all sampled at the same steps (1 = every step). */
  fullGridDecimation?: number;
  /**
   * A finished simulation whose engine instance this one takes over (disposing it), when it
   * ran on the same engine: memory the system has already backed is not faulted in again,
   * which on some machines costs more than the steps. The page's run worker passes its last run.
   */
  reuse?: { takeEngine(module: WebAssembly.Module): unknown };
}

/** How the full-grid DFTs sample the field. */
export interface FullGridPlan {
  /** Frequencies, Hz, in the order asked for. */
  frequencies: number[];
  /** Per frequency, the decimation m: a sample every m steps, weighted by m. */
  decimations: number[];
  /** Per frequency, the offset r (0 ≤ r < m): the samples n ≡ r (mod m), n ≥ 1. */
  offsets: number[];
}

/** Most full-grid DFTs one engine keeps (assembly/engine.ts and media.ts, FULL_GRID_MAX). */
export const FULL_GRID_MAX = 1024;

/**
 * The full-grid DFTs a simulation keeps: their frequencies and how each samples the field.
 * With `fullGridFrequencies` each frequency gets its own decimation from
 * {@link fullGridDecimation} for the scenario's pulse, time step and medium (lossy media
 * weigh aliases by their attenuation over the farthest node), and offsets spread over the
 * decimation so that the DFTs seldom take the same step: a step that updates one map's
 * accumulators instead of all of them leaves the fields in cache. Aliases keep their
 * magnitudes whatever the offset, so the bound is the same. `fullGridFrequency` alone keeps
 * every step, as the report always has; `fullGridDecimation` sets one decimation for all,
 * offset 0.
 *
 * @example
 * fullGridPlan(demo, layoutOf(demo), { fullGridFrequencies: [5e9, 1e10, 1.5e10] });
 * // { frequencies: [5e9, 1e10, 1.5e10], decimations: [22, 19, 16], offsets: [0, 6, 10] }
 */
export function fullGridPlan(scenario: Scenario, layout: Layout, options: SimulationOptions): FullGridPlan {
  const frequencies = options.fullGridFrequencies !== undefined ? [...options.fullGridFrequencies]
    : options.fullGridFrequency !== undefined ? [options.fullGridFrequency] : [];
  if (frequencies.length > FULL_GRID_MAX) {
    throw new Error(`fullGridFrequencies: ${frequencies.length} full-grid DFTs asked for; one engine keeps at most ${FULL_GRID_MAX}`);
  }
  if (!frequencies.every((f) => Number.isFinite(f) && f > 0)) {
    throw new Error('fullGridFrequencies: every full-grid DFT frequency must be a finite number of Hz above 0');
  }
  const forced = options.fullGridDecimation;
  if (forced !== undefined && !(Number.isInteger(forced) && forced >= 1)) {
    throw new Error(`fullGridDecimation: ${forced} is not a whole number of steps of at least 1`);
  }
  if (forced !== undefined || options.fullGridFrequencies === undefined) {
    return { frequencies, decimations: frequencies.map(() => forced ?? 1), offsets: frequencies.map(() => 0) };
  }
  const { nx, ny, dx, dy, source } = layout;
  const sx = source.i * dx;
  const sy = source.j * dy;
  const reach = Math.max(...[[0, 0], [nx - 1, 0], [0, ny - 1], [nx - 1, ny - 1]].map(([i, j]) => Math.hypot(i * dx - sx, j * dy - sy)));
  const decimations = frequencies.map((f) => fullGridDecimation({ waveform: scenario.source.waveform, dt: layout.dt, frequencies: [f], medium: scenario.medium, reach }));
  const offsets = decimations.map((m, k) => Math.floor((k * m) / frequencies.length) % m);
  return { frequencies, decimations, offsets };
}

/** Writes a plan into an engine's table of full-grid DFTs (16 bytes each: ω·dt, m, r). */
export function fillFullGridTable(memory: WebAssembly.Memory, address: number, plan: FullGridPlan, dt: number): void {
  const f64 = new Float64Array(memory.buffer, address, 2 * plan.frequencies.length);
  const i32 = new Int32Array(memory.buffer, address, 4 * plan.frequencies.length);
  plan.frequencies.forEach((f, k) => {
    f64[2 * k] = 2 * Math.PI * f * dt;
    i32[4 * k + 2] = plan.decimations[k];
    i32[4 * k + 3] = plan.offsets[k];
  });
}

// Indices of engine buffers, as in assembly/engine.ts `pointerTo`.
const PTR = {
  ez: 0, hx: 1, hy: 2,
  bEx: 3, aEx: 4, gEx: 5, bHx: 6, aHx: 7, gHx: 8,
  bEy: 9, aEy: 10, gEy: 11, bHy: 12, aHy: 13, gHy: 14,
  source: 15, probeIndex: 16, series: 17, pointIndex: 18, omegaDt: 19, dft: 20,
} as const;

/**
 * One FDTD run of a validated scenario: builds the coefficient tables, drives the wasm
 * engine in batches of steps and reads back probe series and running DFTs.
 * DFT points are the probes first, then every node of every line, in order.
 */
export class Simulation {
  readonly scenario: Scenario;
  readonly layout: Layout;
  readonly dt: number;
  readonly memoryBytes: number;
  /** Frequency of the first full-grid DFT, Hz (undefined without one). */
  readonly fullGridFrequency: number | undefined;
  /** Frequencies of the full-grid DFTs, Hz, in the order asked for. */
  readonly fullGridFrequencies: readonly number[];
  /** Per full-grid DFT, its decimation m and offset r: it takes the Ez samples n ≡ r (mod m), each weighted by m. */
  readonly fullGridDecimations: readonly number[];
  readonly fullGridOffsets: readonly number[];
  private engine: EngineExports | undefined;
  private readonly module: WebAssembly.Module;
  private readonly lineOffsets: number[];
  private readonly pointCount: number;

  /** Loads (once) the engine module and builds a simulation. */
  static async create(scenario: Scenario, options: SimulationOptions = {}): Promise<Simulation> {
    return new Simulation(await loadEngineModule(), scenario, options);
  }

  constructor(module: WebAssembly.Module, scenario: Scenario, options: SimulationOptions = {}) {
    if (!isSimpleMedium(scenario.medium) || (scenario.objects?.length ?? 0) > 0 || (scenario.polarization ?? 'TMz') !== 'TMz') {
      throw new Error('this engine runs lossless TMz scenarios without objects; use createSimulation() (create-simulation.ts) for the others');
    }
    this.scenario = scenario;
    const layout = (this.layout = layoutOf(scenario));
    const dt = (this.dt = layout.dt);
    const { nx, ny, dx, dy } = layout;
    const L = scenario.absorber.cells;
    const epsR = scenario.medium.epsR;
    const full = fullGridPlan(scenario, layout, options);
    this.fullGridFrequencies = full.frequencies;
    this.fullGridFrequency = full.frequencies[0];
    this.fullGridDecimations = full.decimations;
    this.fullGridOffsets = full.offsets;
    this.lineOffsets = [];
    let points = layout.probes.length;
    for (const line of layout.lines) {
      this.lineOffsets.push(points);
      points += line.nodes.length;
    }
    this.pointCount = points;
    const frequencies = scenario.frequencies;
    this.memoryBytes = engineMemoryBytes({
      nx, ny, cells: L, steps: scenario.steps, probes: layout.probes.length,
      dftPoints: points, frequencies: frequencies.length, fullGridDft: full.frequencies.length,
    });

    // WebAssembly memory is addressed with 32 bits: beyond 4 GiB the engine's offsets would
    // wrap, so refuse before allocating (validation's cap is lower; this guards direct use).
    if (this.memoryBytes > WASM32_LIMIT_BYTES) {
      throw new Error(`grid.nx: a ${nx} × ${ny} grid needs ${(this.memoryBytes / 2 ** 30).toFixed(1)} GiB, beyond the 4 GiB one WebAssembly engine can address; use a smaller grid or fewer steps`);
    }
    this.module = module;
    const engine = (options.reuse?.takeEngine(module) as EngineExports | undefined) ?? instantiateEngine(module);
    const claimed = engine.allocate(nx, ny, L, scenario.steps, layout.probes.length, points, frequencies.length, full.frequencies.length);
    if (claimed === 0) {
      throw new Error(`grid.nx: the engine could not get ${(this.memoryBytes / 2 ** 20).toFixed(0)} MiB for a ${nx} × ${ny} grid; use a smaller grid or fewer steps`);
    }
    this.engine = engine;

    const eps = EPS0 * epsR;
    engine.setUpdateCoefficients(
      dt / (eps * dx), dt / (eps * dy), dt / (MU0 * dx), dt / (MU0 * dy),
      dt / (eps * dx * dy), layout.source.j * nx + layout.source.i,
    );
    fillFullGridTable(engine.memory, engine.fullGridTable() >>> 0, full, dt);

    const x = cpmlAxisTables(nx, scenario.absorber, dx, dt, epsR);
    const y = cpmlAxisTables(ny, scenario.absorber, dy, dt, epsR);
    this.f32(PTR.bEx, nx).set(x.bE); this.f32(PTR.aEx, nx).set(x.aE); this.f32(PTR.gEx, nx).set(x.gE);
    this.f32(PTR.bHx, nx).set(x.bH); this.f32(PTR.aHx, nx).set(x.aH); this.f32(PTR.gHx, nx).set(x.gH);
    this.f32(PTR.bEy, ny).set(y.bE); this.f32(PTR.aEy, ny).set(y.aE); this.f32(PTR.gEy, ny).set(y.gE);
    this.f32(PTR.bHy, ny).set(y.bH); this.f32(PTR.aHy, ny).set(y.aH); this.f32(PTR.gHy, ny).set(y.gH);

    const current = this.f64(PTR.source, scenario.steps);
    for (let n = 0; n < scenario.steps; n++) {
      current[n] = waveformValue(scenario.source.waveform, scenario.source.amplitude, (n + 0.5) * dt);
    }
    const probeIndex = this.i32(PTR.probeIndex, layout.probes.length);
    layout.probes.forEach((p, k) => { probeIndex[k] = p.j * nx + p.i; });
    const pointIndex = this.i32(PTR.pointIndex, points);
    layout.probes.forEach((p, k) => { pointIndex[k] = p.j * nx + p.i; });
    layout.lines.forEach((line, l) => {
      line.nodes.forEach((node, k) => { pointIndex[this.lineOffsets[l] + k] = node.j * nx + node.i; });
    });
    const omegaDt = this.f64(PTR.omegaDt, frequencies.length);
    frequencies.forEach((f, k) => { omegaDt[k] = 2 * Math.PI * f * dt; });
  }

  private live(): EngineExports {
    if (!this.engine) throw new Error('simulation has been disposed');
    return this.engine;
  }
  private f32(which: number, length: number): Float32Array {
    const e = this.live();
    return new Float32Array(e.memory.buffer, e.pointerTo(which), length);
  }
  private f64(which: number, length: number): Float64Array {
    const e = this.live();
    return new Float64Array(e.memory.buffer, e.pointerTo(which), length);
  }
  private i32(which: number, length: number): Int32Array {
    const e = this.live();
    return new Int32Array(e.memory.buffer, e.pointerTo(which), length);
  }

  /** Time steps taken so far; Ez samples n = 0..stepsDone exist. */
  get stepsDone(): number {
    return this.live().stepsDone();
  }

  /** Steps still to take before the scenario's `steps` is reached. */
  get stepsLeft(): number {
    return this.scenario.steps - this.stepsDone;
  }

  /** Advances up to `count` steps (never beyond the scenario's `steps`); returns steps taken. */
  step(count: number): number {
    const n = Math.max(0, Math.min(Math.floor(count), this.stepsLeft));
    if (n > 0) this.live().step(n);
    return n;
  }

  /** Runs to the end in batches, calling `onProgress(done, total)` between batches. */
  run(onProgress?: (done: number, total: number) => void, batch = 200): void {
    driveSync(this, {
      cellsPerBatch: batch * this.layout.nx * this.layout.ny, maxBatchSteps: batch,
      afterBatch: (s) => onProgress?.(s.stepsDone, s.stepsTotal),
    });
  }

  /** Live view of Ez (row-major, i fastest); valid until dispose. Copy it to keep it. */
  ezView(): Float32Array {
    return this.f32(PTR.ez, this.layout.nx * this.layout.ny);
  }
  /** Live views of Hx and Hy (same indexing as Ez). */
  hxView(): Float32Array { return this.f32(PTR.hx, this.layout.nx * this.layout.ny); }
  hyView(): Float32Array { return this.f32(PTR.hy, this.layout.nx * this.layout.ny); }

  /** Largest |Ez| on the grid (NaN if any node is NaN). */
  maxAbsEz(): number {
    return this.live().maxAbsEz();
  }

  /** Ez at probe `p` for samples n = 0..stepsDone, V/m (a copy). */
  probeSeries(p: number): Float32Array {
    const length = this.scenario.steps + 1;
    const all = this.f32(PTR.series, this.layout.probes.length * length);
    return all.slice(p * length, p * length + this.stepsDone + 1);
  }

  private dftAt(point: number, f: number): Complex {
    const d = this.f64(PTR.dft, 2 * this.pointCount * this.scenario.frequencies.length);
    const k = 2 * (f * this.pointCount + point);
    return [d[k], d[k + 1]];
  }

  /** Σ_{n=0..stepsDone} Ez[n]·e^{−jωn·dt} at probe `p`, frequency index `f`, V/m·(sample). */
  probeDft(p: number, f: number): Complex {
    return this.dftAt(p, f);
  }

  /** Same running DFT at node `k` of line `l`. */
  lineDft(l: number, k: number, f: number): Complex {
    return this.dftAt(this.lineOffsets[l] + k, f);
  }

  /**
   * DFT of the injected current with its half-step timing,
   * Σ_{n=0..stepsDone−1} I((n+½)dt)·e^{−jω(n+½)dt}, A·(sample), at frequency `freqHz`.
   */
  currentDft(freqHz: number): Complex {
    const current = this.f64(PTR.source, this.scenario.steps);
    const w = 2 * Math.PI * freqHz * this.dt;
    let re = 0;
    let im = 0;
    const n = this.stepsDone;
    for (let k = 0; k < n; k++) {
      const phase = w * (k + 0.5);
      re += current[k] * Math.cos(phase);
      im -= current[k] * Math.sin(phase);
    }
    return [re, im];
  }

  /**
   * Full-grid running DFT `k` (re, im per node, live views), Σ_n m·Ez[n]·e^{−jωn·dt} over the
   * samples it takes (n ≡ r mod m, see `fullGridDecimations`), or undefined when there is none.
   */
  fullGridDft(k = 0): { re: Float32Array; im: Float32Array } | undefined {
    if (!(k >= 0 && k < this.fullGridFrequencies.length)) return undefined;
    const e = this.live();
    const size = this.layout.nx * this.layout.ny;
    return {
      re: new Float32Array(e.memory.buffer, e.fullGridAt(k, 0) >>> 0, size),
      im: new Float32Array(e.memory.buffer, e.fullGridAt(k, 1) >>> 0, size),
    };
  }

  /** Releases the engine instance and its memory. */
  /** Disposes this simulation and hands over its engine instance if it was made from `module` (see `SimulationOptions.reuse`). */
  takeEngine(module: WebAssembly.Module): EngineExports | undefined {
    const engine = module === this.module ? this.engine : undefined;
    this.dispose();
    return engine;
  }

  dispose(): void {
    this.engine = undefined;
  }

  get disposed(): boolean {
    return this.engine === undefined;
  }
}
