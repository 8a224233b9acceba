/**
 * What the lossless engine's `Simulation` and the media engine's `MediaSimulation` share:
 * the full-grid DFT plan, the DFT points (probes, then every node of every line), claiming
 * an engine instance, the tables both engines read at the same buffer indices, stepping, and
 * reading back series and running DFTs. Each engine's own coefficients stay in its class.
 */
import { layoutOf, type Layout } from '../scenario/layout.ts';
import type { Scenario } from '../scenario/types.ts';
import type { Complex } from '../exact/complex.ts';
import { driveSync } from './batch-driver.ts';
import { fillFullGridTable, fullGridPlan, type FullGridPlan, type SimulationOptions } from './simulation-options.ts';

/** The most memory one engine instance can address (wasm32), less a margin for its own data. */
const WASM32_LIMIT_BYTES = 4 * 2 ** 30 - 2 ** 26;

/** Buffer indices both engines give `pointerTo` the same meaning (assembly/engine.ts and media.ts). */
export const COMMON_PTR = {
  node: 0, b: 1, c: 2,
  bEx: 3, aEx: 4, gEx: 5, bHx: 6, aHx: 7, gHx: 8,
  bEy: 9, aEy: 10, gEy: 11, bHy: 12, aHy: 13, gHy: 14,
  source: 15, probeIndex: 16, series: 17, pointIndex: 18, omegaDt: 19, dft: 20,
} as const;

/** The exports both engines have. */
export interface CommonExports {
  memory: WebAssembly.Memory;
  pointerTo(which: number): number;
  fullGridTable(): number;
  fullGridAt(k: number, imaginary: number): number;
  stepsDone(): number;
  step(count: number): void;
}

/** CPML coefficient tables along one axis, as `cpmlAxisTables` gives them. */
interface AxisTables { bE: ArrayLike<number>; aE: ArrayLike<number>; gE: ArrayLike<number>; bH: ArrayLike<number>; aH: ArrayLike<number>; gH: ArrayLike<number> }

export abstract class EngineRun<E extends CommonExports> {
  readonly scenario: Scenario;
  readonly layout: Layout;
  readonly dt: number;
  /** Frequency of the first full-grid DFT, Hz (undefined without one). */
  readonly fullGridFrequency: number | undefined;
  /** Frequencies of the full-grid DFTs, Hz, in the order asked for. */
  readonly fullGridFrequencies: readonly number[];
  /** Per full-grid DFT, its decimation m and offset r: it takes the node field's samples n ≡ r (mod m), each weighted by m. */
  readonly fullGridDecimations: readonly number[];
  readonly fullGridOffsets: readonly number[];
  protected engine: E | undefined;
  protected readonly module: WebAssembly.Module;
  protected readonly full: FullGridPlan;
  protected readonly lineOffsets: number[] = [];
  /** DFT points: the probes, then every node of every line. */
  protected readonly pointCount: number;
  private bytes = 0;

  protected constructor(module: WebAssembly.Module, scenario: Scenario, options: SimulationOptions) {
    this.module = module;
    this.scenario = scenario;
    const layout = (this.layout = layoutOf(scenario));
    this.dt = layout.dt;
    const full = (this.full = fullGridPlan(scenario, layout, options));
    this.fullGridFrequencies = full.frequencies;
    this.fullGridFrequency = full.frequencies[0];
    this.fullGridDecimations = full.decimations;
    this.fullGridOffsets = full.offsets;
    let points = layout.probes.length;
    for (const line of layout.lines) {
      this.lineOffsets.push(points);
      points += line.nodes.length;
    }
    this.pointCount = points;
  }

  /** Bytes the engine claims for this run. */
  get memoryBytes(): number { return this.bytes; }

  /**
   * Takes over `reuse`'s engine instance or makes one, and claims `bytes` with `allocate`.
   * WebAssembly memory is addressed with 32 bits: beyond 4 GiB the engine's offsets would
   * wrap, so this refuses before allocating (validation's cap is lower; this guards direct use).
   */
  protected claimEngine(bytes: number, options: SimulationOptions, instantiate: (m: WebAssembly.Module) => E, allocate: (e: E) => number): E {
    this.bytes = bytes;
    const { nx, ny } = this.layout;
    if (bytes > WASM32_LIMIT_BYTES) {
      throw new Error(`grid.nx: a ${nx} × ${ny} grid needs ${(bytes / 2 ** 30).toFixed(1)} GiB, beyond the 4 GiB one WebAssembly engine can address; use a smaller grid or fewer steps`);
    }
    const engine = (options.reuse?.takeEngine(this.module) as E | undefined) ?? instantiate(this.module);
    if (allocate(engine) === 0) {
      throw new Error(`grid.nx: the engine could not get ${(bytes / 2 ** 20).toFixed(0)} MiB for a ${nx} × ${ny} grid; use a smaller grid or fewer steps`);
    }
    this.engine = engine;
    return engine;
  }

  /** Writes the tables both engines read: full-grid DFT plan, CPML profiles, source samples, probe and DFT points, ω·dt. */
  protected writeCommonTables(x: AxisTables, y: AxisTables, current: ArrayLike<number>): void {
    const e = this.live();
    const { nx, ny, probes, lines } = this.layout;
    const P = COMMON_PTR;
    fillFullGridTable(e.memory, e.fullGridTable() >>> 0, this.full, this.dt);
    this.f32(P.bEx, nx).set(x.bE); this.f32(P.aEx, nx).set(x.aE); this.f32(P.gEx, nx).set(x.gE);
    this.f32(P.bHx, nx).set(x.bH); this.f32(P.aHx, nx).set(x.aH); this.f32(P.gHx, nx).set(x.gH);
    this.f32(P.bEy, ny).set(y.bE); this.f32(P.aEy, ny).set(y.aE); this.f32(P.gEy, ny).set(y.gE);
    this.f32(P.bHy, ny).set(y.bH); this.f32(P.aHy, ny).set(y.aH); this.f32(P.gHy, ny).set(y.gH);
    this.f64(P.source, this.scenario.steps).set(current);
    const probeIndex = this.i32(P.probeIndex, probes.length);
    probes.forEach((p, k) => { probeIndex[k] = p.j * nx + p.i; });
    const pointIndex = this.i32(P.pointIndex, this.pointCount);
    probes.forEach((p, k) => { pointIndex[k] = p.j * nx + p.i; });
    lines.forEach((line, l) => {
      line.nodes.forEach((node, k) => { pointIndex[this.lineOffsets[l] + k] = node.j * nx + node.i; });
    });
    const frequencies = this.scenario.frequencies;
    const omegaDt = this.f64(P.omegaDt, frequencies.length);
    frequencies.forEach((f, k) => { omegaDt[k] = 2 * Math.PI * f * this.dt; });
  }

  protected live(): E {
    if (!this.engine) throw new Error('simulation has been disposed');
    return this.engine;
  }
  // Addresses are unsigned 32-bit; the raw binding hands them over as signed, so an address
  // beyond 2 GiB would come out negative without the `>>> 0`.
  protected f32(which: number, length: number): Float32Array {
    const e = this.live();
    return new Float32Array(e.memory.buffer, e.pointerTo(which) >>> 0, length);
  }
  protected f64(which: number, length: number): Float64Array {
    const e = this.live();
    return new Float64Array(e.memory.buffer, e.pointerTo(which) >>> 0, length);
  }
  protected i32(which: number, length: number): Int32Array {
    const e = this.live();
    return new Int32Array(e.memory.buffer, e.pointerTo(which) >>> 0, length);
  }

  /** Time steps taken so far; samples n = 0..stepsDone of the node field exist. */
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

  /** Live view of the node field (Ez in TMz, V/m; Hz in TEz, A/m), row-major, i fastest; valid until dispose. Copy it to keep it. */
  ezView(): Float32Array {
    return this.f32(COMMON_PTR.node, this.layout.nx * this.layout.ny);
  }
  /** Live view of b: Hx (TMz, A/m) or −Ex (TEz, V/m), same indexing. */
  hxView(): Float32Array { return this.f32(COMMON_PTR.b, this.layout.nx * this.layout.ny); }
  /** Live view of c: Hy (TMz, A/m) or −Ey (TEz, V/m), same indexing. */
  hyView(): Float32Array { return this.f32(COMMON_PTR.c, this.layout.nx * this.layout.ny); }

  /** Largest |node field| on the grid (NaN if any node is NaN). */
  abstract maxAbsEz(): number;

  /** The node field at probe `p` for samples n = 0..stepsDone (a copy). */
  probeSeries(p: number): Float32Array {
    const length = this.scenario.steps + 1;
    const all = this.f32(COMMON_PTR.series, this.layout.probes.length * length);
    return all.slice(p * length, p * length + this.stepsDone + 1);
  }

  private dftAt(point: number, f: number): Complex {
    const d = this.f64(COMMON_PTR.dft, 2 * this.pointCount * this.scenario.frequencies.length);
    const k = 2 * (f * this.pointCount + point);
    return [d[k], d[k + 1]];
  }

  /** Σ_{n=0..stepsDone} a[n]·e^{−jωn·dt} of the node field a at probe `p`, frequency index `f`. */
  probeDft(p: number, f: number): Complex {
    return this.dftAt(p, f);
  }

  /** Same running DFT at node `k` of line `l`. */
  lineDft(l: number, k: number, f: number): Complex {
    return this.dftAt(this.lineOffsets[l] + k, f);
  }

  /**
   * DFT of the injected current (I in TMz, M in TEz) with its half-step timing,
   * Σ_{n=0..stepsDone−1} I((n+½)dt)·e^{−jω(n+½)dt}, at frequency `freqHz`.
   */
  currentDft(freqHz: number): Complex {
    const current = this.f64(COMMON_PTR.source, this.scenario.steps);
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
   * Full-grid running DFT `k` of the node field (re, im per node, live views),
   * Σ_n m·a[n]·e^{−jωn·dt} over the samples it takes (n ≡ r mod m, see
   * `fullGridDecimations`), or undefined when there is none.
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

  /** Disposes this simulation and hands over its engine instance if it was made from `module` (see `SimulationOptions.reuse`). */
  takeEngine(module: WebAssembly.Module): E | undefined {
    const engine = module === this.module ? this.engine : undefined;
    this.dispose();
    return engine;
  }

  /** Releases the engine instance and its memory. */
  dispose(): void {
    this.engine = undefined;
  }

  get disposed(): boolean {
    return this.engine === undefined;
  }
}
