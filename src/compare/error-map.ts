import type { Simulation } from '../engine/simulation.ts';
import { lineCurrentTransfer } from '../exact/transfer.ts';
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
 * exact line-current field −(ωμ/4)·H0^(2)(kρ), as 20·log10|FDTD/exact − 1|. Dispersion
 * anisotropy shows as error growing faster along the axes than along the diagonals;
 * absorber reflections show as ripples over the interior. Returns undefined when the
 * simulation was created without a full-grid DFT.
 *
 * @example
 * const sim = await Simulation.create(scenario, { fullGridFrequency: 1e10 });
 * sim.run();
 * errorMapOf(sim)?.db; // Float32Array of nx·ny values in dB
 */
export function errorMapOf(sim: Simulation): ErrorMap | undefined {
  const full = sim.fullGridDft();
  const f = sim.fullGridFrequency;
  if (!full || f === undefined) return undefined;
  const { nx, ny, dx, dy, source } = sim.layout;
  const epsR = sim.scenario.medium.epsR;
  const current = sim.currentDft(f);
  const hasCurrent = current[0] * current[0] + current[1] * current[1] > 0;
  const db = new Float32Array(nx * ny);
  for (let j = 0; j < ny; j++) {
    const yy = (j - source.j) * dy;
    for (let i = 0; i < nx; i++) {
      const k = j * nx + i;
      const rho = Math.hypot((i - source.i) * dx, yy);
      if (!(rho > 0) || !hasCurrent) { db[k] = NaN; continue; }
      db[k] = relativeErrorDb(schemeTransfer([full.re[k], full.im[k]], current), lineCurrentTransfer(f, rho, epsR));
    }
  }
  return { nx, ny, f_Hz: f, db };
}
