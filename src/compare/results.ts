import type { AnySimulation } from '../engine/create-simulation.ts';
import type { Complex } from '../exact/complex.ts';
import { predictedPhaseErrorDeg } from '../exact/dispersion.ts';
import { predictedErrors } from '../exact/dispersion-lossy.ts';
import { wrapDegrees } from '../exact/angles.ts';
import { isSimpleMedium } from '../exact/medium.ts';
import { nodeDistance, type Node } from '../scenario/layout.ts';
import { unreachedProbes } from '../scenario/warnings.ts';
import { exactColumn } from './exact-series.ts';
import { complexRatioErrors, maxDifferenceAndPeak, schemeTransfer } from './metrics.ts';
import { exactReference, type ExactReference } from './reference.ts';

/** FDTD beside exact at one point and one frequency, both as Ez/I in V/m per A. */
export interface SpectrumPoint {
  f_Hz: number;
  rho_m: number;
  fdtd: Complex;
  exact: Complex;
  mag_err_dB: number;
  phase_err_deg: number;
  /** From the Yee dispersion relation along the direction from the source; NaN above cutoff. */
  predicted_phase_err_deg: number;
  /** Magnitude error the dispersion relation predicts (0 in a lossless medium), dB; NaN where no prediction applies. */
  predicted_mag_err_dB: number;
  /** Why the numbers are missing or what they mean: "not reached", or empty. */
  note: string;
}

export interface ProbeResult {
  name: string; i: number; j: number; x_m: number; y_m: number; rho_m: number;
  /** False when the run ended before the pulse reached the probe: its errors are left out (NaN). */
  reached: boolean;
  /** ρ in wavelengths at each analysis frequency (medium wavelength). */
  rho_wavelengths: number[];
  /** max_n |fdtd − exact| / max_n |exact|; NaN where undefined (ρ = 0, no exact reference). */
  relErrMax: number;
  /** Error estimate of the exact column relative to its peak, and why it misses the target (empty when it meets it). */
  exact_error: number;
  exact_note: string;
  fdtd: Float32Array;
  exact: Float64Array;
  spectra: SpectrumPoint[];
}

export interface LinePoint extends SpectrumPoint { s_m: number; x_m: number; y_m: number; i: number; j: number }

export interface LineResult { name: string; points: LinePoint[] }

export interface RunResults {
  dt_s: number;
  /** Steps actually taken (less than the scenario's when a run was interrupted). */
  steps: number;
  stepsPlanned: number;
  source: { i: number; j: number; x_m: number; y_m: number };
  frequencies: number[];
  probes: ProbeResult[];
  lines: LineResult[];
}

/**
 * Errors the dispersion relation predicts along the direction from the source: the lossless
 * Yee relation (phase only) in a lossless medium, the relation with the scheme's discrete
 * permittivity (phase and magnitude) in a lossy or dispersive one. NaN with objects, where no
 * plane-wave prediction applies; "evanescent" where Re εr ≤ 0 leaves no wave to compare.
 */
function predicted(sim: AnySimulation, f: number, from: Node, to: Node, rho: number): { phase: number; mag: number; note: string } {
  if (!(rho > 0) || (sim.scenario.objects?.length ?? 0) > 0) return { phase: NaN, mag: NaN, note: '' };
  const { dx, dy, dt, c } = sim.layout;
  const theta = Math.atan2((to.j - from.j) * dy, (to.i - from.i) * dx);
  if (isSimpleMedium(sim.scenario.medium)) {
    const phase = wrapDegrees(predictedPhaseErrorDeg(f, rho, theta, dx, dy, dt, c));
    // the lossless relation gives a real k̃: no predicted change of magnitude
    return { phase, mag: Number.isFinite(phase) ? 0 : NaN, note: '' };
  }
  const p = predictedErrors(sim.scenario.medium, f, theta, rho, dx, dy, dt);
  return { phase: wrapDegrees(p.phaseDeg), mag: p.magDb, note: p.evanescent ? 'evanescent' : '' };
}

function spectrumPoint(sim: AnySimulation, f: number, current: Complex, dft: Complex, exact: Complex, node: Node, rho: number, reached = true): SpectrumPoint {
  const fdtd = schemeTransfer(dft, current);
  const { magDb, phaseDeg } = reached ? complexRatioErrors(fdtd, exact) : { magDb: NaN, phaseDeg: NaN };
  const p = predicted(sim, f, sim.layout.source, node, rho);
  return {
    f_Hz: f, rho_m: rho, fdtd, exact, mag_err_dB: magDb, phase_err_deg: phaseDeg,
    predicted_phase_err_deg: p.phase,
    predicted_mag_err_dB: p.mag,
    note: !reached ? 'not reached' : p.note,
  };
}

/** Relative time-domain error max_n |a − b| / max_n |b| (NaN when b is all zero or not finite). */
export function relativeMaxError(fdtd: ArrayLike<number>, exact: ArrayLike<number>): number {
  for (let k = 0; k < exact.length; k++) if (!Number.isFinite(exact[k])) return NaN;
  const { diff, peak } = maxDifferenceAndPeak(fdtd, exact);
  return peak > 0 ? diff / peak : NaN;
}

/**
 * Collects everything a run reports: probe series beside the exact transient field, probe
 * and line spectra beside the Hankel transfer function, and the errors between them. Works
 * on a finished or a stopped simulation (it uses the steps taken so far).
 */
export function collectResults(sim: AnySimulation): RunResults {
  const { layout, scenario, dt } = sim;
  const steps = sim.stepsDone;
  const freqs = scenario.frequencies;
  const reference: ExactReference = exactReference(scenario);
  const currents = freqs.map((f) => sim.currentDft(f));
  const src = layout.source;
  const unreached = unreachedProbes(scenario, steps);

  const probes = layout.probes.map((p, index): ProbeResult => {
    const rho = nodeDistance(p, src, layout.dx, layout.dy);
    const fdtd = sim.probeSeries(index);
    const column = exactColumn(scenario, src, p, rho, dt, steps + 1);
    const reached = !unreached.has(index);
    return {
      name: p.name, i: p.i, j: p.j, x_m: p.x, y_m: p.y, rho_m: rho, reached,
      rho_wavelengths: freqs.map((f) => (rho * f) / layout.c),
      relErrMax: reached ? relativeMaxError(fdtd, column.values) : NaN,
      exact_error: column.relativeError, exact_note: column.message,
      fdtd, exact: column.values,
      spectra: freqs.map((f, k) => spectrumPoint(sim, f, currents[k], sim.probeDft(index, k), reference.transfer(f, [p])[0], p, rho, reached)),
    };
  });

  const lines = layout.lines.map((line, l): LineResult => {
    const first = line.nodes[0];
    const points: LinePoint[] = [];
    freqs.forEach((f, k) => {
      const exact = reference.transfer(f, line.nodes);
      line.nodes.forEach((node, n) => {
        const rho = nodeDistance(node, src, layout.dx, layout.dy);
        points.push({
          ...spectrumPoint(sim, f, currents[k], sim.lineDft(l, n, k), exact[n], node, rho),
          s_m: nodeDistance(node, first, layout.dx, layout.dy), x_m: node.x, y_m: node.y, i: node.i, j: node.j,
        });
      });
    });
    return { name: line.name, points };
  });

  return {
    dt_s: dt, steps, stepsPlanned: scenario.steps,
    source: { i: src.i, j: src.j, x_m: src.x, y_m: src.y },
    frequencies: freqs.slice(), probes, lines,
  };
}
