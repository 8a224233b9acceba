import type { Scenario } from '../scenario/types.ts';
import type { MaterialMap } from './material-map.ts';
import { mediaMemoryBytes } from '../scenario/media-memory.ts';
import type { SimulationOptions } from './simulation-options.ts';
import { instantiateMedia, loadMediaModule, type MediaExports } from './wasm.ts';
import { EngineRun } from './engine-run.ts';
import { mediaTables, PATCH_KIND, type MediaTables, type PatchRecord } from './media-tables.ts';

export * from './media-tables.ts';
// Buffer indices of the media engine's own tables (assembly/media.ts `pointerTo`); 0-20 are COMMON_PTR.
const PTR = {
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
export class MediaSimulation extends EngineRun<MediaExports> {
  readonly tables: MediaTables;

  /** Loads (once) the media engine module and builds a simulation. */
  static async create(scenario: Scenario, options: SimulationOptions = {}, map?: MaterialMap): Promise<MediaSimulation> {
    return new MediaSimulation(await loadMediaModule(), scenario, options, map);
  }

  constructor(module: WebAssembly.Module, scenario: Scenario, options: SimulationOptions = {}, map?: MaterialMap) {
    super(module, scenario, options);
    const layout = this.layout;
    const { nx, ny } = layout;
    const t = (this.tables = mediaTables(scenario, map));
    const points = this.pointCount;
    const fullGrid = this.full.frequencies.length;
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
    const bytes = mediaMemoryBytes({
      nx, ny, cells: t.layer, steps: scenario.steps, probes: layout.probes.length,
      dftPoints: points, frequencies: frequencies.length, fullGridDft: fullGrid,
      polarization: t.te ? 'TEz' : 'TMz', stateSlots: t.slots, poleRecords: t.poles.length, patches: counts,
      poolSlots: t.poolSlots, sourceCorrections: t.sourceStates.length, pecRuns: runCounts, maskRows,
    });
    const engine = this.claimEngine(bytes, options, instantiateMedia, (e) => e.allocate(nx, ny, t.layer, scenario.steps,
      layout.probes.length, points, frequencies.length, fullGrid, t.te ? 1 : 0, t.slots, t.poles.length, ...counts,
      t.poolSlots, t.sourceStates.length, ...runCounts, maskRows));

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
    this.writeCommonTables(t.x, t.y, t.current);
  }

  /** Largest |a| on the grid (NaN if any node is NaN). */
  maxAbsEz(): number {
    return this.live().maxAbsA();
  }
}
