import type { Scenario } from '../scenario/types.ts';

/** CPML cells on every side of the benchmark grids. */
export const BENCH_CPML_CELLS = 10;

/**
 * A benchmark grid, shared by `gridgauge bench` and the browser benchmark page: n × n
 * square cells of 1 mm, Courant number 0.5, vacuum, 10-cell CPML, a modulated Gaussian
 * pulse (15 GHz, 20 cells per wavelength) in the middle. With `withProbes`: 10 probes, two
 * lines of up to 200 nodes and 3 running DFT frequencies.
 *
 * @example
 * benchScenario(1024, 500).grid.nx; // 1024
 */
export function benchScenario(n: number, steps: number, withProbes = false, amplitude = 1): Scenario {
  const d = 1e-3;
  const L = BENCH_CPML_CELLS;
  const mid = Math.floor(n / 2);
  const f0 = 1.5e10;
  const probes = withProbes
    ? Array.from({ length: 10 }, (_, p) => ({ name: `p${p}`, x: (mid + 3 + 2 * p) * d, y: (mid - 7 + p) * d }))
    : [];
  const span = Math.min(199, n - 2 * L - 3);
  const lineStart = Math.max(L + 1, mid - Math.floor(span / 2));
  const lines = withProbes
    ? [
      { name: 'across', x0: lineStart * d, y0: (mid + 5) * d, x1: (lineStart + span) * d, y1: (mid + 5) * d },
      { name: 'down', x0: (mid - 5) * d, y0: lineStart * d, x1: (mid - 5) * d, y1: (lineStart + span) * d },
    ]
    : [];
  return {
    format: 'gridgauge-scenario', version: 1,
    grid: { nx: n, ny: n, dx: d, dy: d, courant: 0.5 },
    medium: { epsR: 1 },
    absorber: { cells: L, order: 3, sigmaScale: 1, kappaMax: 5, alphaMax: 0.05 },
    source: { x: mid * d, y: mid * d, amplitude, waveform: { kind: 'modulated-gaussian', f0, tau: 1 / f0, t0: 5 / f0 } },
    probes, lines,
    frequencies: withProbes ? [1e10, 1.5e10, 2e10] : [],
    steps,
  };
}
