import type { RunResults, SpectrumPoint } from '../compare/results.ts';
import { scenarioHash } from '../scenario/hash.ts';
import type { Scenario } from '../scenario/types.ts';
import { energyLeftWarning, scenarioWarnings, type Warning } from '../scenario/warnings.ts';
import { exactKind } from '../compare/reference.ts';
import { jsonForOutput, toCsv } from './csv.ts';

/** The four files of a run, by file name, as text (docs/outputs.md "Files of a run"). */
export type RunFiles = Record<'timeseries.csv' | 'spectra.csv' | 'lines.csv' | 'summary.json', string>;

/** `timeseries.csv`: t_s, then <probe>.fdtd and <probe>.exact per probe; one row per sample n = 0..steps. */
export function timeseriesCsv(r: RunResults): string {
  const header = ['t_s', ...r.probes.flatMap((p) => [`${p.name}.fdtd`, `${p.name}.exact`])];
  const rows: number[][] = [];
  for (let n = 0; n <= r.steps; n++) {
    const row = [n * r.dt_s];
    for (const p of r.probes) row.push(p.fdtd[n], p.exact[n]);
    rows.push(row);
  }
  return toCsv(header, rows);
}

const spectrumColumns = (s: SpectrumPoint) => [
  s.fdtd[0], s.fdtd[1], s.exact[0], s.exact[1], s.mag_err_dB, s.phase_err_deg,
];

/** `spectra.csv`: one row per probe per analysis frequency. */
export function spectraCsv(r: RunResults): string {
  const header = ['probe', 'f_Hz', 'rho_m', 'fdtd_re', 'fdtd_im', 'exact_re', 'exact_im', 'mag_err_dB', 'phase_err_deg', 'predicted_phase_err_deg', 'predicted_mag_err_dB', 'note'];
  const rows = r.probes.flatMap((p) => p.spectra.map((s) => [p.name, s.f_Hz, s.rho_m, ...spectrumColumns(s), s.predicted_phase_err_deg, s.predicted_mag_err_dB, s.note]));
  return toCsv(header, rows);
}

/** `lines.csv`: one row per line node per frequency, ordered by line, frequency, then s_m. */
export function linesCsv(r: RunResults): string {
  const header = ['line', 's_m', 'x_m', 'y_m', 'rho_m', 'f_Hz', 'fdtd_re', 'fdtd_im', 'exact_re', 'exact_im', 'mag_err_dB', 'phase_err_deg'];
  // collectResults builds each line's points frequency by frequency, nodes in order along the
  // line; snapped i and j only grow along a segment, so s_m does too: already contract order.
  const rows = r.lines.flatMap((l) => l.points.map((pt) => [l.name, pt.s_m, pt.x_m, pt.y_m, pt.rho_m, pt.f_Hz, ...spectrumColumns(pt)]));
  return toCsv(header, rows);
}

/** The object written as `summary.json` (NaN becomes null on output). */
export function summaryObject(r: RunResults, extra: Record<string, unknown> = {}) {
  return {
    dt_s: r.dt_s,
    steps: r.steps,
    source: r.source,
    probes: r.probes.map((p) => ({
      name: p.name, i: p.i, j: p.j, x_m: p.x_m, y_m: p.y_m, rho_m: p.rho_m, relErrMax: p.relErrMax,
      rho_wavelengths: p.rho_wavelengths, exact_error: p.exact_error,
      spectra: p.spectra.map((s) => ({
        f_Hz: s.f_Hz, mag_err_dB: s.mag_err_dB, phase_err_deg: s.phase_err_deg, predicted_phase_err_deg: s.predicted_phase_err_deg,
        predicted_mag_err_dB: s.predicted_mag_err_dB, ...(s.note ? { note: s.note } : {}),
      })),
      reached: p.reached,
    })),
    stepsPlanned: r.stepsPlanned,
    complete: r.steps === r.stepsPlanned,
    ...extra,
  };
}

/** Exact columns that could not be made to their accuracy target: said, never hidden. */
function exactWarnings(scenario: Scenario, r: RunResults): Warning[] {
  return r.probes.flatMap((p, k) => (p.exact_note ? [{
    code: 'exact-inaccurate', path: `probes[${k}]`,
    message: `the exact column here is good to ${p.exact_error.toExponential(1)} of its peak, not the 1e-4 aimed at: ${p.exact_note}`,
  }] : []));
}

/** How a run went, for the keys summary.json carries after the contract's. */
export interface RunFacts {
  runSeconds: number;
  /** Why the run ended early (a blow-up, or "interrupted"), if it did. */
  stopped?: { step: number; reason: string };
  /** Field energy left at the end over its peak, dB (NaN if unknown). */
  energyLeftDb: number;
}

/**
 * The keys summary.json carries after the contract's, the same from the command line and
 * the page: run time, grid size, frequencies, how it stopped, the warnings (those of the
 * scenario and the energy left at the end) and the scenario's fingerprint.
 */
export function runExtras(scenario: Scenario, r: RunResults, facts: RunFacts): Record<string, unknown> {
  const energyLeft = energyLeftWarning(facts.energyLeftDb, scenario.steps);
  return {
    run_seconds: facts.runSeconds, nx: scenario.grid.nx, ny: scenario.grid.ny, frequencies_Hz: r.frequencies,
    ...(facts.stopped ? { stopped: facts.stopped } : {}),
    warnings: [...scenarioWarnings(scenario), ...(energyLeft ? [energyLeft] : []), ...exactWarnings(scenario, r)],
    scenario_hash: scenarioHash(scenario),
    polarization: scenario.polarization ?? 'TMz',
    quantity: (scenario.polarization ?? 'TMz') === 'TMz' ? 'Ez' : 'Hz',
    exact: exactKind(scenario),
    ...(exactKind(scenario) === 'none' ? { exact_note: 'no exact reference; use the convergence study' } : {}),
  };
}

/** All four files of a run as text. */
export function runFiles(r: RunResults, extra: Record<string, unknown> = {}): RunFiles {
  return {
    'timeseries.csv': timeseriesCsv(r),
    'spectra.csv': spectraCsv(r),
    'lines.csv': linesCsv(r),
    'summary.json': jsonForOutput(summaryObject(r, extra)),
  };
}
