import type { AnySimulation } from '../engine/create-simulation.ts';
import { exactReference } from './reference.ts';
import { relativeErrorDb, schemeTransfer } from './metrics.ts';

/** |FDTD/exact − 1| in dB at every Ez node, at the frequency of the full-grid running DFT. */
export interface ErrorMap {
  nx: number;
  ny: number;
  /** Frequency of the map, Hz. */
  f_Hz: number;
  /** Row-major (i fastest, index j·nx + i); NaN at the source node, where ρ = 0. */
  db: Float32Array;
}

/**
 * The error map of a run: at each node, the scheme's transfer function (full-grid DFT of
 * Ez over the DFT of the injected current, the same ratio as spectra.csv) against the
 * exact field of the scenario (compare/reference.ts: the line source in its medium, or beside
 * one circular object), as 20·log10|FDTD/exact − 1|; NaN everywhere without an exact reference. Dispersion
 * anisotropy shows as error growing faster along the axes than along the diagonals;
 * absorber reflections show as ripples over the interior. Returns undefined when the
 * simulation was created without a full-grid DFT.
 *
 * @example
 * const sim = await Simulation.create(scenario, { fullGridFrequency: 1e10 });
 * sim.run();
 * errorMapOf(sim)?.db; // Float32Array of nx·ny values in dB
 */
export function errorMapOf(sim: AnySimulation): ErrorMap | undefined {
  const full = sim.fullGridDft();
  const f = sim.fullGridFrequency;
  if (!full || f === undefined) return undefined;
  const { nx, ny } = sim.layout;
  const reference = exactReference(sim.scenario);
  const current = sim.currentDft(f);
  const hasCurrent = current[0] * current[0] + current[1] * current[1] > 0;
  const db = new Float32Array(nx * ny).fill(NaN);
  if (!hasCurrent || reference.kind === 'none') return { nx, ny, f_Hz: f, db };
  const row = Array.from({ length: nx }, (_, i) => ({ i, j: 0, x: i * sim.layout.dx, y: 0 }));
  for (let j = 0; j < ny; j++) {
    for (const node of row) { node.j = j; node.y = j * sim.layout.dy; }
    const exact = reference.transfer(f, row);
    for (let i = 0; i < nx; i++) {
      const k = j * nx + i;
      db[k] = relativeErrorDb(schemeTransfer([full.re[k], full.im[k]], current), exact[i]);
    }
  }
  return { nx, ny, f_Hz: f, db };
}
