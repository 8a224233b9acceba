// Measured against predicted phase and magnitude errors in each kind of medium at 20 cells
// per wavelength: a line source and a probe 4 wavelengths away along x, square cells, S = 0.5,
// the absorber well away, run long enough for every medium to ring down. "Measured" is the
// FDTD transfer function against the exact field in the medium; "predicted" is the 2D
// dispersion relation with the scheme's discrete permittivity. Our own round-number media.
// Run: npx tsx scripts/media-accuracy.mts
import { collectResults } from '../src/compare/results.ts';
import { makeSimulation } from '../src/engine/create-simulation.ts';
import { mediumWavelength } from '../src/studies/resolution-plan.ts';
import type { Medium } from '../src/scenario/types.ts';
import { makeScenario } from '../test/fixtures/scenarios.ts';

const F0 = 1e10;
const CELLS = 20;
const media: Record<string, Medium> = {
  'lossless εr 2': { epsR: 2 },
  'conductive σ 0.05 S/m': { epsR: 2, sigma: 0.05 },
  'Debye Δε 1.5, τ 20 ps': { epsR: 2, poles: [{ kind: 'debye', deltaEps: 1.5, tau: 2e-11 }] },
  'Drude fp 4 GHz, γ 1e9': { epsR: 1, poles: [{ kind: 'drude', omegaP: 2 * Math.PI * 4e9, gamma: 1e9 }] },
  'Lorentz f0 15 GHz, δ 2e9': { epsR: 2, poles: [{ kind: 'lorentz', deltaEps: 1, omega0: 2 * Math.PI * 1.5e10, delta: 2e9 }] },
};
console.log(`at ${CELLS} cells per wavelength (by Re k at ${F0 / 1e9} GHz), probe 4 wavelengths out along x, S = 0.5`);
console.log('medium                         phase error (°)           magnitude error (dB)');
console.log('                               measured   predicted     measured   predicted');
for (const [name, medium] of Object.entries(media)) {
  const wavelength = mediumWavelength(medium, F0);
  const d = wavelength / CELLS;
  const reach = 4 * CELLS;
  const n = 2 * (reach + 30) + 21;
  const c = (n - 1) / 2;
  const tau = 1.2 / F0;
  const s = makeScenario({
    grid: { nx: n, ny: n, dx: d, dy: d, courant: 0.5 }, medium,
    source: { x: c * d, y: c * d, waveform: { kind: 'modulated-gaussian', f0: F0, tau, t0: 5 * tau } },
    probes: [{ name: 'p', x: (c + reach) * d, y: c * d }], frequencies: [F0], steps: 3 * (14 * CELLS + 6 * reach),
  });
  const sim = await makeSimulation(s);
  sim.run();
  const sp = collectResults(sim).probes[0].spectra[0];
  sim.dispose();
  const f = (x: number) => x.toFixed(3).padStart(10);
  console.log(`${name.padEnd(30)} ${f(sp.phase_err_deg)}  ${f(sp.predicted_phase_err_deg)}    ${f(sp.mag_err_dB)}  ${f(sp.predicted_mag_err_dB)}`);
}
