// Prints the figures issue-level accuracy claims rest on: time-domain relErrMax and the
// measured vs predicted phase error at f0, three wavelengths out along the axis and the
// diagonal, at 10, 20 and 40 cells per wavelength (square cells, S = 0.5, vacuum).
// Run: npx tsx scripts/accuracy.mts
import { collectResults } from '../src/compare/results.ts';
import { Simulation } from '../src/engine/simulation.ts';
import { C0 } from '../src/scenario/constants.ts';
import type { Scenario } from '../src/scenario/types.ts';

function scenario(cells: number): Scenario {
  const d = 1e-3;
  const f0 = C0 / (cells * d);
  const reach = 3 * cells;
  const n = 2 * (reach + 40) + 1;
  const c = ((n - 1) / 2) * d;
  const diag = (reach * d) / Math.SQRT2;
  return {
    format: 'gridgauge-scenario', version: 1,
    grid: { nx: n, ny: n, dx: d, dy: d, courant: 0.5 },
    medium: { epsR: 1 },
    absorber: { cells: 10, order: 3, sigmaScale: 1, kappaMax: 5, alphaMax: 0.05 },
    source: { x: c, y: c, amplitude: 1, waveform: { kind: 'modulated-gaussian', f0, tau: 1 / f0, t0: 5 / f0 } },
    probes: [{ name: 'axis', x: c + reach * d, y: c }, { name: 'diagonal', x: c + diag, y: c + diag }],
    lines: [], frequencies: [f0], steps: 40 * cells + 8 * reach,
  };
}

console.log('cells/λ  probe     ρ (λ)   relErrMax   phase meas.   phase pred.   |Ez/I| err');
for (const cells of [10, 20, 40]) {
  const sim = await Simulation.create(scenario(cells));
  sim.run();
  for (const p of collectResults(sim).probes) {
    const s = p.spectra[0];
    console.log(`${String(cells).padStart(7)}  ${p.name.padEnd(9)}${p.rho_wavelengths[0].toFixed(2).padStart(6)}` +
      `${p.relErrMax.toExponential(2).padStart(12)}${`${s.phase_err_deg.toFixed(3)}°`.padStart(14)}` +
      `${`${s.predicted_phase_err_deg.toFixed(3)}°`.padStart(14)}${`${s.mag_err_dB.toFixed(3)} dB`.padStart(13)}`);
  }
  sim.dispose();
}
