/**
 * The files of the studies (DESIGN.md "Outputs of studies"): absorber.csv / absorber.json
 * and resolution.csv / resolution.json, plus absorber-error.csv (error against time for
 * the recommended and the current setting), and the scenario files of `--emit`. Contract
 * columns come first in the contract's order; extra columns follow at the end.
 */
import { jsonForOutput, toCsv } from '../io/csv.ts';
import type { Absorber, Scenario } from '../scenario/types.ts';
import type { AbsorberCandidateResult, AbsorberStudyPlan, AbsorberStudyResult } from './absorber-study.ts';
import type { ResolutionCandidateResult, ResolutionStudyPlan, ResolutionStudyResult } from './resolution-study.ts';

export const ABSORBER_CSV_HEADER = [
  'cells', 'order', 'sigmaScale', 'kappaMax', 'alphaMax', 'reflection_dB', 'theory_dB', 'memory_bytes', 'seconds',
  'worst_probe', 'nx', 'ny', 'current',
] as const;

export const RESOLUTION_CSV_HEADER = [
  'cellsPerWavelength', 'dx_m', 'axis_deg_per_wavelength', 'diagonal_deg_per_wavelength',
  'predicted_axis_deg_per_wavelength', 'predicted_diagonal_deg_per_wavelength',
  'projected_error_deg', 'x_deg_per_wavelength', 'y_deg_per_wavelength', 'fit_residual_deg',
  'project_nx', 'project_ny', 'project_steps', 'project_memory_bytes', 'project_seconds', 'seconds',
] as const;

const absorberOf = (a: Absorber): Absorber => ({
  cells: a.cells, order: a.order, sigmaScale: a.sigmaScale, kappaMax: a.kappaMax, alphaMax: a.alphaMax,
});

function absorberRow(c: AbsorberCandidateResult) {
  return {
    ...absorberOf(c),
    reflection_dB: c.reflection_dB,
    theory_dB: c.theory_dB,
    memory_bytes: c.memory_bytes,
    seconds: c.seconds,
    worst_probe: c.worst_probe,
    per_probe_dB: c.per_probe_dB,
    nx: c.nx,
    ny: c.ny,
    current: c.isCurrent,
    ...(c.error ? { error: c.error } : {}),
  };
}

/** `absorber.csv`: one row per finished candidate, in table order. */
export function absorberCsv(r: AbsorberStudyResult): string {
  return toCsv(ABSORBER_CSV_HEADER, r.candidates.map((c) => [
    c.cells, c.order, c.sigmaScale, c.kappaMax, c.alphaMax, c.reflection_dB, c.theory_dB, c.memory_bytes, c.seconds,
    c.worst_probe, c.nx, c.ny, c.isCurrent ? 1 : 0,
  ]));
}

/** The object written as `absorber.json` and printed by `absorber-study --json`. */
export function absorberJsonObject(r: AbsorberStudyResult) {
  const brief = (c: AbsorberCandidateResult | null) => c && {
    ...absorberOf(c), reflection_dB: c.reflection_dB, theory_dB: c.theory_dB, memory_bytes: c.memory_bytes,
    margin_dB: r.target_dB - c.reflection_dB,
  };
  return {
    target_dB: r.target_dB,
    recommended: brief(r.recommended),
    current: brief(r.current),
    candidates: r.candidates.map(absorberRow),
    method: 'reference grid: error(t) = |E - Eref| / max|Eref| at each probe; a candidate\'s figure is its worst probe\'s maximum, in dB',
    steps: r.steps,
    dt_s: r.dt_s,
    probes: r.probes.map((p) => ({ name: p.name, x_m: p.x, y_m: p.y, added: p.added })),
    reference: r.reference,
    planned: r.planned,
    complete: r.complete,
    workers: r.workers.length,
    study_seconds: r.seconds,
  };
}

/** `absorber-error.csv`: t_s, then the worst probe's error for the current and the recommended setting. */
export function absorberErrorCsv(r: AbsorberStudyResult): string {
  const columns: [string, Float32Array][] = [];
  if (r.current) columns.push([`current ${r.current.key}`, r.current.errorSeries]);
  if (r.recommended) columns.push([`recommended ${r.recommended.key}`, r.recommended.errorSeries]);
  const n = Math.max(0, ...columns.map(([, s]) => s.length));
  const rows: number[][] = [];
  for (let k = 0; k < n; k++) rows.push([k * r.dt_s, ...columns.map(([, s]) => (k < s.length ? s[k] : NaN))]);
  return toCsv(['t_s', ...columns.map(([name]) => name)], rows);
}

/** All absorber study files by name. */
export function absorberFiles(r: AbsorberStudyResult): Record<string, string> {
  return {
    'absorber.csv': absorberCsv(r),
    'absorber.json': jsonForOutput(absorberJsonObject(r)),
    'absorber-error.csv': absorberErrorCsv(r),
  };
}

function resolutionRow(c: ResolutionCandidateResult) {
  return {
    cellsPerWavelength: c.cellsPerWavelength,
    dx_m: c.dx_m,
    axis_deg_per_wavelength: c.axis_deg_per_wavelength,
    diagonal_deg_per_wavelength: c.diagonal_deg_per_wavelength,
    predicted_axis_deg_per_wavelength: c.predicted_axis_deg_per_wavelength,
    predicted_diagonal_deg_per_wavelength: c.predicted_diagonal_deg_per_wavelength,
    projected_error_deg: c.projected_error_deg,
    x_deg_per_wavelength: c.x_deg_per_wavelength,
    y_deg_per_wavelength: c.y_deg_per_wavelength,
    fit_residual_deg: c.fit_residual_deg,
    dy_m: c.dy_m,
    project: c.project,
    seconds: c.seconds,
    ...(c.error ? { error: c.error } : {}),
  };
}

/** `resolution.csv`: one row per finished resolution, coarsest first. */
export function resolutionCsv(r: ResolutionStudyResult): string {
  return toCsv(RESOLUTION_CSV_HEADER, r.candidates.map((c) => [
    c.cellsPerWavelength, c.dx_m, c.axis_deg_per_wavelength, c.diagonal_deg_per_wavelength,
    c.predicted_axis_deg_per_wavelength, c.predicted_diagonal_deg_per_wavelength,
    c.projected_error_deg, c.x_deg_per_wavelength, c.y_deg_per_wavelength, c.fit_residual_deg,
    c.project.nx, c.project.ny, c.project.steps, c.project.memory_bytes, c.project.seconds, c.seconds,
  ]));
}

/** The object written as `resolution.json` and printed by `resolution-study --json`. */
export function resolutionJsonObject(r: ResolutionStudyResult) {
  const rec = r.recommended;
  return {
    budget_deg: r.budget_deg,
    size_wavelengths: r.size_wavelengths,
    recommended: rec && {
      cellsPerWavelength: rec.cellsPerWavelength,
      dx_m: rec.dx_m,
      projected_error_deg: rec.projected_error_deg,
      dy_m: rec.dy_m,
      project: rec.project,
    },
    candidates: r.candidates.map(resolutionRow),
    frequency_Hz: r.frequency_Hz,
    wavelength_m: r.wavelength_m,
    courant: r.courant,
    dy_over_dx: r.aspect,
    mcells_per_second: r.mcells_per_second,
    method: 'least-squares slope of arg(FDTD/exact) against distance along lines 2 to 5 wavelengths from a line current; lag per wavelength, positive',
    planned: r.planned,
    complete: r.complete,
    workers: r.workers.length,
    study_seconds: r.seconds,
  };
}

/** All resolution study files by name. */
export function resolutionFiles(r: ResolutionStudyResult): Record<string, string> {
  return {
    'resolution.csv': resolutionCsv(r),
    'resolution.json': jsonForOutput(resolutionJsonObject(r)),
  };
}

const scenarioText = (s: Scenario) => `${JSON.stringify(s, null, 2)}\n`;
const fileSafe = (x: number) => String(x).replace(/[^0-9a-zA-Z.+-]/g, '_');

/**
 * The runs of an absorber study as scenario files for a batch scheduler: reference.json,
 * one file per candidate, and study.json saying which is which and how to score them.
 */
export function absorberEmitFiles(plan: AbsorberStudyPlan): Record<string, string> {
  const files: Record<string, string> = { 'reference.json': scenarioText(plan.reference) };
  const entries = plan.candidates.map((c) => {
    const a = c.absorber;
    const name = `absorber-${fileSafe(a.cells)}-m${fileSafe(a.order)}-s${fileSafe(a.sigmaScale)}-k${fileSafe(a.kappaMax)}-a${fileSafe(a.alphaMax)}.json`;
    files[name] = scenarioText(c.scenario);
    return { file: name, ...absorberOf(a), current: c.isCurrent, theory_dB: c.theory_dB, memory_bytes: c.memory_bytes };
  });
  files['study.json'] = jsonForOutput({
    study: 'absorber',
    target_dB: plan.target_dB,
    reference: 'reference.json',
    scoring: 'for each candidate and each probe: max_n |E[n] - Eref[n]| / max_n |Eref[n]| with Eref from reference.json; the candidate\'s figure is the largest over probes, 20*log10',
    candidates: entries,
  });
  return files;
}

/** The measurement runs of a resolution study as scenario files, with study.json. */
export function resolutionEmitFiles(plan: ResolutionStudyPlan): Record<string, string> {
  const files: Record<string, string> = {};
  const entries = plan.candidates.map((c) => {
    const name = `resolution-${fileSafe(c.cellsPerWavelength)}.json`;
    files[name] = scenarioText(c.scenario);
    return {
      file: name, cellsPerWavelength: c.cellsPerWavelength, dx_m: c.dx_m,
      predicted_axis_deg_per_wavelength: Math.max(c.predicted.x, c.predicted.y),
      predicted_diagonal_deg_per_wavelength: c.predicted.diagonal,
    };
  });
  files['study.json'] = jsonForOutput({
    study: 'resolution',
    budget_deg: plan.budget_deg,
    size_wavelengths: plan.size_wavelengths,
    frequency_Hz: plan.frequency_Hz,
    scoring: 'run each file; from lines.csv fit phase_err_deg against rho_m by least squares on each line; lag per wavelength = -slope * wavelength_m; projected error = worst line * size_wavelengths',
    wavelength_m: plan.wavelength_m,
    candidates: entries,
  });
  return files;
}
