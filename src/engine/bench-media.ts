/**
 * The media engine's rows of `gridgauge bench`: the benchmark grid with a lossy (σ only) or a
 * Debye background, on the media engine, timed in alternation with the lossless engine on the
 * same grid so that the ratio sees the same machine load; the plain-TypeScript kernel of the
 * same scheme for the usual column; and what the media engine's extra arrays cost, from the
 * two engines' own memory figures.
 */
import { benchScenario, BENCH_CPML_CELLS } from './bench-scenario.ts';
import { median, round, stepsFor, timeRun, type BenchResult } from './bench.ts';
import type { EngineModules } from './create-simulation.ts';
import { MediaPlainKernel } from './media-plain-kernel.ts';
import { MediaSimulation } from './media-simulation.ts';
import { Simulation } from './simulation.ts';
import type { Medium } from '../scenario/types.ts';

/** The two media of the benchmark (our own round numbers). */
export const BENCH_MEDIA: Record<'lossy' | 'debye', Medium> = {
  lossy: { epsR: 1, sigma: 0.01 },
  debye: { epsR: 1, poles: [{ kind: 'debye', deltaEps: 2, tau: 1e-11 }] },
};

export function measureMedium(modules: EngineModules, n: number, medium: 'lossy' | 'debye', runs: number, runSeconds: number): BenchResult {
  const total = 1_000_000;
  const base = benchScenario(n, total);
  const lossless = new Simulation(modules.engine, base);
  const media = new MediaSimulation(modules.media, { ...base, medium: BENCH_MEDIA[medium] });
  const plain = MediaPlainKernel.fromScenario({ ...benchScenario(n, 20_000), medium: BENCH_MEDIA[medium] });
  const warm = Math.max(4, Math.round(2e6 / (n * n)));
  for (let r = 0; r < 3; r++) { lossless.step(warm); media.step(warm); }
  plain.step(2);
  const steps = stepsFor(runSeconds, (c) => media.step(c), warm);
  const referenceSteps = stepsFor(runSeconds, (c) => lossless.step(c), warm);
  const plainSteps = Math.max(1, stepsFor(runSeconds, (c) => plain.step(c), 1));
  const mediaRuns: number[] = [];
  const losslessRuns: number[] = [];
  const plainRuns: number[] = [];
  for (let r = 0; r < runs; r++) {
    const m = timeRun((c) => media.step(c), steps);
    const l = timeRun((c) => lossless.step(c), referenceSteps);
    mediaRuns.push((n * n * steps) / m.wall / 1e6);
    losslessRuns.push((n * n * referenceSteps) / l.wall / 1e6);
    if (r < 3) {
      const p = timeRun((c) => plain.step(c), plainSteps);
      plainRuns.push((n * n * plainSteps) / p.wall / 1e6);
    }
  }
  const extra = (media.memoryBytes - lossless.memoryBytes) / (n * n);
  lossless.dispose();
  media.dispose();
  const engine = median(mediaRuns);
  const reference = median(losslessRuns);
  const plainMcells = median(plainRuns);
  return {
    nx: n, ny: n, steps, engine_mcells: round(engine), plain_ts_mcells: round(plainMcells), ratio: round(engine / plainMcells, 2),
    cpml_cells: BENCH_CPML_CELLS, plain_ts_steps: plainSteps,
    engine_runs_mcells: mediaRuns.map((x) => round(x)), plain_ts_runs_mcells: plainRuns.map((x) => round(x)),
    field_bytes: 3 * 4 * n * n, bytes_per_cell: NaN, implied_GBps: NaN, bandwidth_share_pct: NaN,
    probes_overhead_pct: null, engine_cpu_mcells: null, plain_ts_cpu_mcells: null,
    medium, lossless_engine_mcells: round(reference), ratio_to_lossless: round(engine / reference, 2), extra_bytes_per_cell: round(extra, 2),
  };
}
