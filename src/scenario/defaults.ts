/**
 * The built-in demo: a line current in free space on a 300 × 300 grid of 1 mm cells, a
 * 10 GHz modulated Gaussian (30 cells per wavelength at 10 GHz), three probes at one and
 * four wavelengths along x and about 3.3 wavelengths along the diagonal, and a probe line
 * along x. examples/demo.json holds the same scenario; a unit test keeps them equal.
 */
import type { Scenario } from './types.ts';

/**
 * A fresh copy of the demo scenario, every default written out, so that validating it
 * returns it unchanged.
 *
 * @example
 * demoScenario().grid.nx; // 300
 */
export function demoScenario(): Scenario {
  return {
    format: 'gridgauge-scenario',
    version: 1,
    grid: { nx: 300, ny: 300, dx: 0.001, dy: 0.001, courant: 0.5 },
    medium: { epsR: 1 },
    absorber: { cells: 10, order: 3, sigmaScale: 1, kappaMax: 5, alphaMax: 0.05 },
    source: {
      x: 0.15, y: 0.15, amplitude: 1,
      waveform: { kind: 'modulated-gaussian', f0: 1e10, tau: 1e-10, t0: 5e-10 },
    },
    probes: [
      { name: 'near', x: 0.18, y: 0.15 },
      { name: 'far', x: 0.27, y: 0.15 },
      { name: 'diagonal', x: 0.22, y: 0.22 },
    ],
    lines: [{ name: 'x-axis', x0: 0.16, y0: 0.15, x1: 0.28, y1: 0.15 }],
    frequencies: [5e9, 1e10, 1.5e10],
    // 2 ns: the pulse (centred at 0.5 ns, envelope below e^-25 by 1 ns) has passed the
    // farthest point, the line's end 130 mm out, by about 1.43 ns.
    steps: 1200,
  };
}
