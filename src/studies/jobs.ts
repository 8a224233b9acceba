/**
 * The unit of work of a study: one scenario run on one engine instance, and what comes
 * back from it. The same code runs inside a Node worker thread, a page Web Worker, or the
 * calling thread; everything crossing a worker boundary is plain data and typed arrays.
 *
 * A job's result holds exactly numbers a run's output files hold too (timeseries.csv's
 * FDTD columns, spectra.csv's and lines.csv's FDTD transfer function), so a study can score
 * runs done elsewhere from their files (README "Batch scheduler round trip") and get the
 * same figures to the last digit.
 */
import { schemeTransfer } from '../compare/metrics.ts';
import { driveSync } from '../engine/batch-driver.ts';
import { createSimulation, type AnySimulation, type EngineModules } from '../engine/create-simulation.ts';
import type { Scenario } from '../scenario/types.ts';

/** Run a scenario and return the field at every probe, every sample (timeseries.csv). */
export interface ProbeSeriesJob { kind: 'probe-series'; scenario: Scenario }

/**
 * Run a scenario and return the scheme's transfer function (field over source, as in
 * spectra.csv and lines.csv) at every probe and every line node, at every analysis frequency.
 */
export interface SpectraJob { kind: 'spectra'; scenario: Scenario }

export type StudyJob = ProbeSeriesJob | SpectraJob;

export interface JobCost {
  /** Wall-clock seconds of the run inside the worker (engine only, no messaging). */
  seconds: number;
  /** Node updates done: nx·ny·steps. */
  cellUpdates: number;
}

export interface ProbeSeriesResult extends JobCost {
  kind: 'probe-series';
  /** The field at each probe, samples n = 0..steps. */
  series: Float32Array[];
  /** True when every sample is finite (the run did not blow up). */
  finite: boolean;
}

export interface SpectraResult extends JobCost {
  kind: 'spectra';
  /**
   * (re, im) pairs: for each analysis frequency (outer), the probes in order, then the
   * nodes of each line in order (inner). Length 2·frequencies·points.
   */
  transfer: Float64Array;
  /** Number of points per frequency: probes, then line nodes. */
  points: number;
  /** True when the field was finite at the end (the run did not blow up). */
  finite: boolean;
}

export type StudyJobResult = ProbeSeriesResult | SpectraResult;

/** Node updates a job will do, for progress weights: nx·ny·steps. */
export function jobCellUpdates(job: { scenario: Scenario }): number {
  return job.scenario.grid.nx * job.scenario.grid.ny * job.scenario.steps;
}

/** The typed-array buffers of a result, to hand over to the other thread without copying. */
export function resultTransfers(result: StudyJobResult): ArrayBuffer[] {
  const arrays = result.kind === 'probe-series' ? result.series : [result.transfer];
  return arrays.map((a) => a.buffer as ArrayBuffer);
}

/**
 * Runs one job to the end on a fresh engine instance of `module`, calling `onProgress`
 * between batches of steps, and returns its result. Throws on engine errors.
 */
export function runJob(modules: EngineModules, job: StudyJob, onProgress: (done: number, total: number) => void = () => {}): StudyJobResult {
  const t0 = performance.now();
  const sim = createSimulation(modules, job.scenario);
  try {
    driveSync(sim, { cellsPerBatch: 2e7, afterBatch: (s) => onProgress(s.stepsDone, s.stepsTotal) });
    const seconds = (performance.now() - t0) / 1000;
    const cellUpdates = jobCellUpdates(job);
    if (job.kind === 'probe-series') {
      const series = job.scenario.probes.map((_, p) => sim.probeSeries(p));
      const finite = series.every((s) => s.every(Number.isFinite));
      return { kind: 'probe-series', series, finite, seconds, cellUpdates };
    }
    return { kind: 'spectra', ...transferAtPoints(sim), seconds, cellUpdates };
  } finally {
    sim.dispose();
  }
}

/** The scheme's transfer function at every probe and line node (the `fdtd` columns of spectra.csv and lines.csv). */
function transferAtPoints(sim: AnySimulation): { transfer: Float64Array; points: number; finite: boolean } {
  const { layout, scenario } = sim;
  const points = layout.probes.length + layout.lines.reduce((n, l) => n + l.nodes.length, 0);
  const transfer = new Float64Array(2 * points * scenario.frequencies.length);
  let at = 0;
  scenario.frequencies.forEach((f, k) => {
    const current = sim.currentDft(f);
    const put = (value: [number, number]) => { transfer[at++] = value[0]; transfer[at++] = value[1]; };
    layout.probes.forEach((_, p) => put(schemeTransfer(sim.probeDft(p, k), current)));
    layout.lines.forEach((line, l) => line.nodes.forEach((_, n) => put(schemeTransfer(sim.lineDft(l, n, k), current))));
  });
  return { transfer, points, finite: Number.isFinite(sim.maxAbsEz()) };
}

/** The transfer function of point `point` (probes first, then line nodes) at frequency index `f`. */
export function transferAt(r: SpectraResult, f: number, point: number): [number, number] {
  const k = 2 * (f * r.points + point);
  return [r.transfer[k], r.transfer[k + 1]];
}
