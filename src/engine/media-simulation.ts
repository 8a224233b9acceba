import { layoutOf, type Layout } from '../scenario/layout.ts';
import type { Scenario } from '../scenario/types.ts';
import type { MaterialMap } from './material-map.ts';
import { mediaMemoryBytes } from '../scenario/media-memory.ts';
import { fillFullGridTable, fullGridPlan, type Complex, type SimulationOptions } from './simulation.ts';
import { instantiateMedia, loadMediaModule, type MediaExports } from './wasm.ts';

/** The most memory one engine instance can address (wasm32), less a margin for its own data. */
const WASM32_LIMIT_BYTES = 4 * 2 ** 30 - 2 ** 26;

import { mediaTables, PATCH_KIND, type MediaTables, type PatchRecord } from './media-tables.ts';

export * from './media-tables.ts';
const PTR = {
  a: 0, b: 1, c: 2,
  bEx: 3, aEx: 4, gEx: 5, bHx: 6, aHx: 7, gHx: 8,
  bEy: 9, aEy: 10, gEy: 11, bHy: 12, aHy: 13, gHy: 14,
  source: 15, probeIndex: 16, series: 17, pointIndex: 18, omegaDt: 19, dft: 20,
  poleTable: 26, statesA: 27,
  patchesA: 30, patchesB: 31, patchesC: 32, rowStartA: 33, rowStartB: 34, rowStartC: 35,
  patchPool: 36, sourceCorrections: 37, pecRunsA: 38, pecRunsB: 39, pecRunsC: 40, pecStartA: 41, pecStartB: 42, pecStartC: 43,
} as const;

/** PEC points of one component as runs of consecutive k within a row: [first k, length] pairs. */
function pecRuns(list: PatchRecord[], nx: number): number[] {
  const runs: number[] = [];
  for (const p of list) {
    if (p.kind !== PATCH_KIND.pec) continue;
    const last = runs.length - 2;
    if (last >= 0 && runs[last] + runs[last + 1] === p.k && Math.floor(runs[last] / nx) === Math.floor(p.k / nx)) runs[last + 1]++;
    else runs.push(p.k, 1);
  }
  return runs;
}

/** Index of the first run (pairs) or record of each row j = 0..ny, for lists sorted by k. */
function rowStarts(firstKs: number[], nx: number, ny: number): Int32Array {
  const starts = new Int32Array(ny + 1);
  let p = 0;
  for (let j = 0; j <= ny; j++) {
    while (p < firstKs.length && firstKs[p] < j * nx) p++;
    starts[j] = p;
  }
  return starts;
}

/**
 * One FDTD run in lossy or dispersive media, TMz or TEz, with objects given by a material
 * map: the same interface as {@link Simulation}, with the node field `a` (Ez in TMz, Hz in
 * TEz) in the place of Ez. `ezView` is a, `hxView` b (Hx, or −Ex in TEz) and `hyView` c
 * (Hy, or −Ey in TEz); probe series and DFTs are of a. In TEz the source is a magnetic line
 * current M (V) and the outer wall is a perfect electric conductor half a cell inside the
 * outermost nodes (tangential E zero there; the outermost Hz nodes stay zero).
 *
 * Stability: dt from the Courant number with c∞ = c0/√ε∞ as for a lossless medium; σ and
 * Debye poles need nothing more. A Drude pole also needs ωp·dt < 2·√ε∞·√(1 − s²) and a
 * Lorentz pole ω0·dt < 2·√(ε∞(1 − s²)/(εs − ε∞·s²)), with εs = ε∞ + Δε and s the Courant
 * number over its 2D limit (exact for γ = 0, δ = 0; damping only helps): from the scheme's
 * dispersion relation μ0ε0ε̃r(ω)Ω² = K², all roots Ω² of which must lie in [0, 4/dt²) for
 * every grid wavenumber K up to its largest, K²c∞²dt² = 4s² (von Neumann analysis).
 *
 * @example
 * const sim = await MediaSimulation.create({ ...scenario, medium: { epsR: 2, sigma: 0.01 } });
 * sim.run();
 * sim.probeDft(0, 0); // [re, im] of Ez at the first probe and frequency
 */
export class MediaSimulation {
  readonly scenario: Scenario;
  readonly layout: Layout;
  readonly dt: number;
  readonly memoryBytes: number;
  /** Frequency of the first full-grid DFT, Hz (undefined without one). */
  readonly fullGridFrequency: number | undefined;
  /** Frequencies of the full-grid DFTs, Hz, in the order asked for. */
  readonly fullGridFrequencies: readonly number[];
  /** Per full-grid DFT, its decimation m and offset r: it takes the samples n ≡ r (mod m), each weighted by m. */
  readonly fullGridDecimations: readonly number[];
  readonly fullGridOffsets: readonly number[];
  readonly tables: MediaTables;
  private engine: MediaExports | undefined;
  private readonly module: WebAssembly.Module;
  private readonly lineOffsets: number[];
  private readonly pointCount: number;

  /** Loads (once) the media engine module and builds a simulation. */
  static async create(scenario: Scenario, options: SimulationOptions = {}, map?: MaterialMap): Promise<MediaSimulation> {
    return new MediaSimulation(await loadMediaModule(), scenario, options, map);
  }

  constructor(module: WebAssembly.Module, scenario: Scenario, options: SimulationOptions = {}, map?: MaterialMap) {
    this.scenario = scenario;
    const layout = (this.layout = layoutOf(scenario));
    this.dt = layout.dt;
    const { nx, ny } = layout;
    const t = (this.tables = mediaTables(scenario, map));
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
    // PEC points go to the engine as runs, the other patches as records.
    const records = {
      a: t.patches.a.filter((p) => p.kind !== PATCH_KIND.pec),
      b: t.patches.b.filter((p) => p.kind !== PATCH_KIND.pec),
      c: t.patches.c.filter((p) => p.kind !== PATCH_KIND.pec),
    };
    const runs = { a: pecRuns(t.patches.a, nx), b: pecRuns(t.patches.b, nx), c: pecRuns(t.patches.c, nx) };
    const counts: [number, number, number] = [records.a.length, records.b.length, records.c.length];
    const runCounts: [number, number, number] = [runs.a.length / 2, runs.b.length / 2, runs.c.length / 2];
    const maskRows = new Set([...runs.b, ...runs.c].filter((_, n) => n % 2 === 0).map((k) => Math.floor(k / nx))).size;
    this.memoryBytes = mediaMemoryBytes({
      nx, ny, cells: t.layer, steps: scenario.steps, probes: layout.probes.length,
      dftPoints: points, frequencies: frequencies.length, fullGridDft: full.frequencies.length,
      polarization: t.te ? 'TEz' : 'TMz', stateSlots: t.slots, poleRecords: t.poles.length, patches: counts,
      poolSlots: t.poolSlots, sourceCorrections: t.sourceStates.length, pecRuns: runCounts, maskRows,
    });
    if (this.memoryBytes > WASM32_LIMIT_BYTES) {
      throw new Error(`grid.nx: a ${nx} × ${ny} grid needs ${(this.memoryBytes / 2 ** 30).toFixed(1)} GiB, beyond the 4 GiB one WebAssembly engine can address; use a smaller grid or fewer steps`);
    }
    this.module = module;
    const engine = (options.reuse?.takeEngine(module) as MediaExports | undefined) ?? instantiateMedia(module);
    const claimed = engine.allocate(nx, ny, t.layer, scenario.steps, layout.probes.length, points, frequencies.length,
      full.frequencies.length, t.te ? 1 : 0, t.slots, t.poles.length, ...counts, t.poolSlots, t.sourceStates.length,
      ...runCounts, maskRows);
    if (claimed === 0) {
      throw new Error(`grid.nx: the engine could not get ${(this.memoryBytes / 2 ** 20).toFixed(0)} MiB for a ${nx} × ${ny} grid; use a smaller grid or fewer steps`);
    }
    this.engine = engine;

    const poleTable = this.f32(PTR.poleTable, 16 * t.poles.length);
    const poleKinds = this.i32(PTR.poleTable, 16 * t.poles.length);
    t.poles.forEach((p, n) => {
      poleKinds[16 * n] = p.kind;
      poleTable.fill(p.k1, 16 * n + 4, 16 * n + 8);
      poleTable.fill(p.k2, 16 * n + 8, 16 * n + 12);
      poleTable.fill(p.k3, 16 * n + 12, 16 * n + 16);
    });
    const blocks = [[PTR.patchesA, PTR.rowStartA, records.a], [PTR.patchesB, PTR.rowStartB, records.b], [PTR.patchesC, PTR.rowStartC, records.c]] as const;
    for (const [at, starts, list] of blocks) {
      const ints = this.i32(at, 12 * list.length);
      const floats = this.f32(at, 12 * list.length);
      list.forEach((p, n) => {
        ints.set([p.k, p.kind, p.poleFirst, p.poleCount, p.state], 12 * n);
        floats.set(p.coefficients, 12 * n + 8);
      });
      this.i32(starts, ny + 1).set(rowStarts(list.map((p) => p.k), nx, ny));
    }
    const pec = [[PTR.pecRunsA, PTR.pecStartA, runs.a], [PTR.pecRunsB, PTR.pecStartB, runs.b], [PTR.pecRunsC, PTR.pecStartC, runs.c]] as const;
    for (const [at, starts, list] of pec) {
      this.i32(at, list.length).set(list);
      this.i32(starts, ny + 1).set(rowStarts(list.filter((_, n) => n % 2 === 0), nx, ny));
    }
    const corrections = t.sourceStates.length;
    const correctionAddresses = this.i32(PTR.sourceCorrections, corrections);
    t.sourceStates.forEach((s, n) => {
      correctionAddresses[n] = (engine.pointerTo(s.block === 'pool' ? PTR.patchPool : PTR.statesA) >>> 0) + 4 * s.index;
    });

    engine.setCoefficients(
      t.a.ca, t.a.cbx, t.a.cby, t.a.cq, t.b.ca, t.b.cb, t.b.cq, t.c.ca, t.c.cb, t.c.cq,
      t.backgroundPoles, t.sourceScale, t.sourceIndex,
    );
    fillFullGridTable(engine.memory, engine.fullGridTable() >>> 0, full, this.dt);
    const { x, y } = t;
    this.f32(PTR.bEx, nx).set(x.bE); this.f32(PTR.aEx, nx).set(x.aE); this.f32(PTR.gEx, nx).set(x.gE);
    this.f32(PTR.bHx, nx).set(x.bH); this.f32(PTR.aHx, nx).set(x.aH); this.f32(PTR.gHx, nx).set(x.gH);
    this.f32(PTR.bEy, ny).set(y.bE); this.f32(PTR.aEy, ny).set(y.aE); this.f32(PTR.gEy, ny).set(y.gE);
    this.f32(PTR.bHy, ny).set(y.bH); this.f32(PTR.aHy, ny).set(y.aH); this.f32(PTR.gHy, ny).set(y.gH);

    this.f64(PTR.source, scenario.steps).set(t.current);
    const probeIndex = this.i32(PTR.probeIndex, layout.probes.length);
    layout.probes.forEach((p, k) => { probeIndex[k] = p.j * nx + p.i; });
    const pointIndex = this.i32(PTR.pointIndex, points);
    layout.probes.forEach((p, k) => { pointIndex[k] = p.j * nx + p.i; });
    layout.lines.forEach((line, l) => {
      line.nodes.forEach((node, k) => { pointIndex[this.lineOffsets[l] + k] = node.j * nx + node.i; });
    });
    const omegaDt = this.f64(PTR.omegaDt, frequencies.length);
    frequencies.forEach((f, k) => { omegaDt[k] = 2 * Math.PI * f * this.dt; });
  }

  private live(): MediaExports {
    if (!this.engine) throw new Error('simulation has been disposed');
    return this.engine;
  }
  // Addresses are unsigned 32-bit; the raw binding hands them over as signed, so an address
  // beyond 2 GiB would come out negative without the `>>> 0`.
  private f32(which: number, length: number): Float32Array {
    const e = this.live();
    return new Float32Array(e.memory.buffer, e.pointerTo(which) >>> 0, length);
  }
  private f64(which: number, length: number): Float64Array {
    const e = this.live();
    return new Float64Array(e.memory.buffer, e.pointerTo(which) >>> 0, length);
  }
  private i32(which: number, length: number): Int32Array {
    const e = this.live();
    return new Int32Array(e.memory.buffer, e.pointerTo(which) >>> 0, length);
  }

  /** Time steps taken so far; samples n = 0..stepsDone of a exist. */
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
    while (this.stepsLeft > 0) {
      this.step(batch);
      onProgress?.(this.stepsDone, this.scenario.steps);
    }
  }

  /** Live view of the node field a: Ez (TMz, V/m) or Hz (TEz, A/m); valid until dispose. */
  ezView(): Float32Array {
    return this.f32(PTR.a, this.layout.nx * this.layout.ny);
  }
  /** Live view of b: Hx (TMz, A/m) or −Ex (TEz, V/m). */
  hxView(): Float32Array { return this.f32(PTR.b, this.layout.nx * this.layout.ny); }
  /** Live view of c: Hy (TMz, A/m) or −Ey (TEz, V/m). */
  hyView(): Float32Array { return this.f32(PTR.c, this.layout.nx * this.layout.ny); }

  /** Largest |a| on the grid (NaN if any node is NaN). */
  maxAbsEz(): number {
    return this.live().maxAbsA();
  }

  /** a at probe `p` for samples n = 0..stepsDone (a copy). */
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

  /** Σ_{n=0..stepsDone} a[n]·e^{−jωn·dt} at probe `p`, frequency index `f`. */
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
   * Full-grid running DFT `k` of a (re, im per node, live views), over the samples it takes
   * (n ≡ r mod m, each weighted by m; see `fullGridDecimations`), or undefined when there is none.
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
  takeEngine(module: WebAssembly.Module): MediaExports | undefined {
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
