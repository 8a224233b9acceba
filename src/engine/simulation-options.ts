/**
 * How a simulation is asked to keep full-grid running DFTs and to reuse an engine instance,
 * and the plan of those DFTs that both engines take.
 */
import type { Layout } from '../scenario/layout.ts';
import type { Scenario } from '../scenario/types.ts';
import { fullGridDecimation } from '../exact/dft-decimation.ts';

export interface SimulationOptions {
  /** Frequency of one full-grid running DFT sampled at every step (the report's error map), Hz. */
  fullGridFrequency?: number;
  /**
   * Frequencies of full-grid running DFTs (the page's error maps), Hz, taken in one pass and
   * sampled every m-th step, m chosen from the pulse's band so that aliases stay 80 dB below
   * the wanted value (src/exact/dft-decimation.ts). Takes the place of `fullGridFrequency`.
   */
  fullGridFrequencies?: readonly number[];
  /** Decimation of every full-grid DFT instead of the ones chosen, all sampled at the same steps (1 = every step). */
  fullGridDecimation?: number;
  /**
   * A finished simulation whose engine instance this one takes over (disposing it), when it
   * ran on the same engine: memory the system has already backed is not faulted in again,
   * which on some machines costs more than the steps. The page's run worker passes its last run.
   */
  reuse?: { takeEngine(module: WebAssembly.Module): unknown };
}

/** How the full-grid DFTs sample the field. */
export interface FullGridPlan {
  /** Frequencies, Hz, in the order asked for. */
  frequencies: number[];
  /** Per frequency, the decimation m: a sample every m steps, weighted by m. */
  decimations: number[];
  /** Per frequency, the offset r (0 ≤ r < m): the samples n ≡ r (mod m), n ≥ 1. */
  offsets: number[];
}

/** Most full-grid DFTs one engine keeps (assembly/engine.ts and media.ts, FULL_GRID_MAX). */
export const FULL_GRID_MAX = 1024;

/**
 * The full-grid DFTs a simulation keeps: their frequencies and how each samples the field.
 * With `fullGridFrequencies` each frequency gets its own decimation from
 * {@link fullGridDecimation} for the scenario's pulse, time step and medium (lossy media
 * weigh aliases by their attenuation over the farthest node), and offsets spread over the
 * decimation so that the DFTs seldom take the same step: a step that updates one map's
 * accumulators instead of all of them leaves the fields in cache. Aliases keep their
 * magnitudes whatever the offset, so the bound is the same. `fullGridFrequency` alone keeps
 * every step, as the report always has; `fullGridDecimation` sets one decimation for all,
 * offset 0.
 *
 * @example
 * fullGridPlan(demo, layoutOf(demo), { fullGridFrequencies: [5e9, 1e10, 1.5e10] });
 * // { frequencies: [5e9, 1e10, 1.5e10], decimations: [22, 19, 16], offsets: [0, 6, 10] }
 */
export function fullGridPlan(scenario: Scenario, layout: Layout, options: SimulationOptions): FullGridPlan {
  const frequencies = options.fullGridFrequencies !== undefined ? [...options.fullGridFrequencies]
    : options.fullGridFrequency !== undefined ? [options.fullGridFrequency] : [];
  if (frequencies.length > FULL_GRID_MAX) {
    throw new Error(`fullGridFrequencies: ${frequencies.length} full-grid DFTs asked for; one engine keeps at most ${FULL_GRID_MAX}`);
  }
  if (!frequencies.every((f) => Number.isFinite(f) && f > 0)) {
    throw new Error('fullGridFrequencies: every full-grid DFT frequency must be a finite number of Hz above 0');
  }
  const forced = options.fullGridDecimation;
  if (forced !== undefined && !(Number.isInteger(forced) && forced >= 1)) {
    throw new Error(`fullGridDecimation: ${forced} is not a whole number of steps of at least 1`);
  }
  if (forced !== undefined || options.fullGridFrequencies === undefined) {
    return { frequencies, decimations: frequencies.map(() => forced ?? 1), offsets: frequencies.map(() => 0) };
  }
  const { nx, ny, dx, dy, source } = layout;
  const sx = source.i * dx;
  const sy = source.j * dy;
  const reach = Math.max(...[[0, 0], [nx - 1, 0], [0, ny - 1], [nx - 1, ny - 1]].map(([i, j]) => Math.hypot(i * dx - sx, j * dy - sy)));
  const decimations = frequencies.map((f) => fullGridDecimation({ waveform: scenario.source.waveform, dt: layout.dt, frequencies: [f], medium: scenario.medium, reach }));
  const offsets = decimations.map((m, k) => Math.floor((k * m) / frequencies.length) % m);
  return { frequencies, decimations, offsets };
}

/** Writes a plan into an engine's table of full-grid DFTs (16 bytes each: ω·dt, m, r). */
export function fillFullGridTable(memory: WebAssembly.Memory, address: number, plan: FullGridPlan, dt: number): void {
  const f64 = new Float64Array(memory.buffer, address, 2 * plan.frequencies.length);
  const i32 = new Int32Array(memory.buffer, address, 4 * plan.frequencies.length);
  plan.frequencies.forEach((f, k) => {
    f64[2 * k] = 2 * Math.PI * f * dt;
    i32[4 * k + 2] = plan.decimations[k];
    i32[4 * k + 3] = plan.offsets[k];
  });
}
