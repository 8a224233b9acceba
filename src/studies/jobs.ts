/**
 * The unit of work of a study: one scenario run on one engine instance, and what comes
 * back from it. The same code runs inside a Node worker thread, a page Web Worker, or the
 * calling thread; everything crossing a worker boundary is plain data and typed arrays.
 */
import { complexRatioErrors, schemeTransfer } from '../compare/metrics.ts';
import { Simulation } from '../engine/simulation.ts';
import { lineCurrentTransfer } from '../exact/transfer.ts';
import { nodeDistance } from '../scenario/layout.ts';
import type { Scenario } from '../scenario/types.ts';
import { fitLine, unwrapDegrees } from './phase-fit.ts';

/** Run a scenario and return Ez at every probe (the reference-grid method needs the series). */
export interface ProbeSeriesJob { kind: 'probe-series'; scenario: Scenario }

/**
 * Run a scenario with probe lines and one analysis frequency (the first of `frequencies`)
 * and fit the phase error along each line against distance.
 */
export interface PhaseSlopeJob { kind: 'phase-slope'; scenario: Scenario }

export type StudyJob = ProbeSeriesJob | PhaseSlopeJob;

export interface JobCost {
  /** Wall-clock seconds of the run inside the worker (engine only, no messaging). */
  seconds: number;
  /** Ez-node updates done: nx·ny·steps. */
  cellUpdates: number;
}

export interface ProbeSeriesResult extends JobCost {
  kind: 'probe-series';
  /** Ez at each probe, samples n = 0..steps, V/m. */
  series: Float32Array[];
  /** True when every sample is finite (the run did not blow up). */
  finite: boolean;
}

/** Phase error along one probe line, fitted as phase = intercept + slope·ρ. */
export interface LinePhaseSlope {
  name: string;
  /** Slope of the unwrapped phase error against ρ, degrees per wavelength of the medium (negative: the grid lags). */
  slopeDegPerWavelength: number;
  /** Phase error extrapolated to ρ = 0, degrees (the near-source offset the fit removes). */
  interceptDeg: number;
  /** RMS distance of the measured phase errors from the fitted line, degrees. */
  residualRmsDeg: number;
  /** Distance of each line node from the source, m. */
  rho_m: Float64Array;
  /** Unwrapped phase error arg(FDTD/exact) at each node, degrees. */
  phaseErrDeg: Float64Array;
}

export interface PhaseSlopeResult extends JobCost {
  kind: 'phase-slope';
  f_Hz: number;
  lines: LinePhaseSlope[];
}

export type StudyJobResult = ProbeSeriesResult | PhaseSlopeResult;

/** Ez-node updates a job will do, for progress weights: nx·ny·steps. */
export function jobCellUpdates(job: { scenario: Scenario }): number {
  return job.scenario.grid.nx * job.scenario.grid.ny * job.scenario.steps;
}

/** The typed-array buffers of a result, to hand over to the other thread without copying. */
export function resultTransfers(result: StudyJobResult): ArrayBuffer[] {
  const arrays = result.kind === 'probe-series' ? result.series : result.lines.flatMap((l) => [l.rho_m, l.phaseErrDeg]);
  return arrays.map((a) => a.buffer as ArrayBuffer);
}

function runSteps(sim: Simulation, onProgress: (done: number, total: number) => void): void {
  const cells = sim.layout.nx * sim.layout.ny;
  const batch = Math.max(1, Math.min(500, Math.floor(2e7 / cells)));
  while (sim.stepsLeft > 0) {
    sim.step(batch);
    onProgress(sim.stepsDone, sim.scenario.steps);
  }
}

/**
 * Runs one job to the end on a fresh engine instance of `module`, calling `onProgress`
 * between batches of steps, and returns its result. Throws on engine errors.
 */
export function runJob(module: WebAssembly.Module, job: StudyJob, onProgress: (done: number, total: number) => void = () => {}): StudyJobResult {
  const t0 = performance.now();
  const sim = new Simulation(module, job.scenario);
  try {
    runSteps(sim, onProgress);
    const seconds = (performance.now() - t0) / 1000;
    const cellUpdates = jobCellUpdates(job);
    if (job.kind === 'probe-series') {
      const series = job.scenario.probes.map((_, p) => sim.probeSeries(p));
      const finite = series.every((s) => s.every(Number.isFinite));
      return { kind: 'probe-series', series, finite, seconds, cellUpdates };
    }
    return { kind: 'phase-slope', ...lineSlopes(sim), seconds, cellUpdates };
  } finally {
    sim.dispose();
  }
}

/**
 * Phase error arg(FDTD/exact) at every node of every line at the first analysis frequency,
 * unwrapped along the line, with its least-squares slope against ρ. FDTD is the line DFT
 * over the half-step current DFT (DESIGN.md, spectra.csv); exact is the Hankel transfer
 * function −(ωμ/4)·H0^(2)(kρ). The fit removes the constant near-source offset, leaving
 * the phase the grid loses per unit distance, which is what the dispersion relation predicts.
 */
function lineSlopes(sim: Simulation): { f_Hz: number; lines: LinePhaseSlope[] } {
  const { layout, scenario } = sim;
  const f = scenario.frequencies[0];
  const wavelength = layout.c / f;
  const current = sim.currentDft(f);
  const lines = layout.lines.map((line, l): LinePhaseSlope => {
    const rho = new Float64Array(line.nodes.length);
    const wrapped = new Float64Array(line.nodes.length);
    line.nodes.forEach((node, k) => {
      rho[k] = nodeDistance(node, layout.source, layout.dx, layout.dy);
      const exact = lineCurrentTransfer(f, rho[k], scenario.medium.epsR);
      wrapped[k] = complexRatioErrors(schemeTransfer(sim.lineDft(l, k, 0), current), exact).phaseDeg;
    });
    const phase = unwrapDegrees(wrapped);
    const fit = fitLine(rho, phase);
    return {
      name: line.name,
      slopeDegPerWavelength: fit.slope * wavelength,
      interceptDeg: fit.intercept,
      residualRmsDeg: fit.residualRms,
      rho_m: rho,
      phaseErrDeg: phase,
    };
  });
  return { f_Hz: f, lines };
}
