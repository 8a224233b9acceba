import type { AnySimulation } from '../engine/create-simulation.ts';
import type { Complex } from '../exact/complex.ts';
import { exactReference } from './reference.ts';
import { relativeErrorDb, schemeTransfer } from './metrics.ts';

/** |FDTD/exact − 1| in dB at every Ez node, at the frequency of a full-grid running DFT. */
export interface ErrorMap {
  nx: number;
  ny: number;
  /** Frequency of the map, Hz. */
  f_Hz: number;
  /** Row-major (i fastest, index j·nx + i); NaN at the source node, where ρ = 0. */
  db: Float32Array;
}

/**
 * The error map of a run at its `k`-th full-grid DFT's frequency: at each node, the scheme's
 * transfer function (full-grid DFT of Ez over the DFT of the injected current, the same
 * ratio as spectra.csv; a decimated DFT's aliases stay 80 dB below it, src/exact/dft-decimation.ts) against the
 * exact field of the scenario (compare/reference.ts: the line source in its medium, or beside
 * one circular object), as 20·log10|FDTD/exact − 1|; NaN everywhere without an exact reference. Dispersion
 * anisotropy shows as error growing faster along the axes than along the diagonals;
 * absorber reflections show as ripples over the interior. Returns undefined when the
 * simulation has no full-grid DFT `k`.
 *
 * @example
 * const sim = await Simulation.create(scenario, { fullGridFrequencies: [5e9, 1e10] });
 * sim.run();
 * errorMapOf(sim, 1)?.db; // Float32Array of nx·ny values in dB, at 10 GHz
 */
export function errorMapOf(sim: AnySimulation, k = 0): ErrorMap | undefined {
  const full = sim.fullGridDft(k);
  const f = sim.fullGridFrequencies[k];
  if (!full || f === undefined) return undefined;
  const { nx, ny } = sim.layout;
  const reference = exactReference(sim.scenario);
  const current = sim.currentDft(f);
  const hasCurrent = current[0] * current[0] + current[1] * current[1] > 0;
  const db = new Float32Array(nx * ny).fill(NaN);
  if (!hasCurrent || reference.kind === 'none') return { nx, ny, f_Hz: f, db };
  const { dx, dy } = sim.layout;
  const put = (i: number, j: number, exact: Complex) => {
    const k = j * nx + i;
    db[k] = relativeErrorDb(schemeTransfer([full.re[k], full.im[k]], current), exact);
  };
  if (reference.kind === 'hankel') {
    // The line source's field depends on the distance alone: one evaluation at (|Δi|, |Δj|)
    // serves the up to four nodes mirrored about the source (the same distance to the bit).
    const { i: si, j: sj } = sim.layout.source;
    const width = Math.max(si, nx - 1 - si) + 1;
    const row = Array.from({ length: width }, (_, di) => ({ i: si + di, j: sj, x: (si + di) * dx, y: sj * dy }));
    for (let dj = 0; dj <= Math.max(sj, ny - 1 - sj); dj++) {
      for (const node of row) { node.j = sj + dj; node.y = (sj + dj) * dy; }
      const exact = reference.transfer(f, row);
      for (const j of dj === 0 ? [sj] : [sj - dj, sj + dj]) {
        if (j < 0 || j >= ny) continue;
        for (let i = 0; i < nx; i++) put(i, j, exact[Math.abs(i - si)]);
      }
    }
    return { nx, ny, f_Hz: f, db };
  }
  const row = Array.from({ length: nx }, (_, i) => ({ i, j: 0, x: i * dx, y: 0 }));
  for (let j = 0; j < ny; j++) {
    for (const node of row) { node.j = j; node.y = j * dy; }
    const exact = reference.transfer(f, row);
    for (let i = 0; i < nx; i++) put(i, j, exact[i]);
  }
  return { nx, ny, f_Hz: f, db };
}

/**
 * The colour range of an error map from its finite values in dB: the 2nd and 98th
 * percentiles widened to multiples of 5 dB (at least 5 dB wide; −80 to 0 dB with fewer than
 * two values). Sorts `values` in place.
 *
 * @example
 * colourRangeDb([-63, -41, -52, -38]); // [-65, -35]
 */
export function colourRangeDb(values: number[]): [number, number] {
  if (values.length < 2) return [-80, 0];
  values.sort((a, b) => a - b);
  const lo = Math.floor(values[Math.floor(0.02 * (values.length - 1))] / 5) * 5;
  const hi = Math.ceil(values[Math.ceil(0.98 * (values.length - 1))] / 5) * 5;
  return hi > lo ? [lo, hi] : [lo, lo + 5];
}
