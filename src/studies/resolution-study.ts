/**
 * The resolution study as a study definition (definition.ts): plans from resolution-plan.ts,
 * fits the phase error along each measurement line, recommends the coarsest resolution
 * whose worst direction stays within the budget across the project, and describes its
 * table, files and emitted runs.
 */
import { complexRatioErrors } from '../compare/metrics.ts';
import { exactReference } from '../compare/reference.ts';
import { layoutOf, nodeDistance } from '../scenario/layout.ts';
import type { Scenario } from '../scenario/types.ts';
import { formatBytes, formatSI, formatSig } from '../scenario/units.ts';
import { readListOption, type StudyChart, type StudyDefinition, type StudyOutput, optionReaders } from './definition.ts';
import { transferAt, type SpectraResult } from './jobs.ts';
import { fitLine, unwrapDegrees } from './phase-fit.ts';
import type { StudyPool } from './pool.ts';
import {
  applyResolution, LINE_NAMES, mediumWavelength, planResolutionStudy, predictedLags, projectEstimate, resolutionOptionProblems,
  type ProjectEstimate, type ResolutionCandidatePlan, type ResolutionStudyOptions, type ResolutionStudyPlan,
} from './resolution-plan.ts';
import { featureCellsPerWavelength, projectTo3d, type Projection3dResult, type ProjectionOptions } from './projection.ts';
import { runStudy, type StudyCallbacks } from './run-study.ts';

export * from './resolution-plan.ts';

/** Phase error along one probe line, fitted as phase = intercept + slope·ρ. */
export interface LinePhaseSlope {
  name: string;
  /** Slope of the unwrapped phase error against ρ, degrees per wavelength of the medium (negative: the grid lags). */
  slopeDegPerWavelength: number;
  /** Phase error extrapolated to ρ = 0, degrees (the near-source offset the fit removes). */
  interceptDeg: number;
  /** RMS distance of the measured phase errors from the fitted line, degrees. */
  residualRmsDeg: number;
}

export interface ResolutionCandidateResult {
  cellsPerWavelength: number;
  dx_m: number;
  dy_m: number;
  /** Measured lag per wavelength, degrees (positive): the worse of x and y. */
  axis_deg_per_wavelength: number;
  /** Measured lag per wavelength along the 45° diagonal, degrees. */
  diagonal_deg_per_wavelength: number;
  predicted_axis_deg_per_wavelength: number;
  predicted_diagonal_deg_per_wavelength: number;
  /** Measured lag per wavelength along x and along y separately, degrees. */
  x_deg_per_wavelength: number;
  y_deg_per_wavelength: number;
  /** Worst direction's measured lag per wavelength × the project size, degrees. */
  projected_error_deg: number;
  /** RMS distance of the measured phases from the fitted lines, degrees (worst line). */
  fit_residual_deg: number;
  /** Run time of the measurement in its worker, s. */
  seconds: number;
  cellUpdates: number;
  project: ProjectEstimate;
  error?: string;
}

export interface ResolutionStudyResult {
  budget_deg: number;
  size_wavelengths: number;
  frequency_Hz: number;
  wavelength_m: number;
  courant: number;
  aspect: number;
  /** Engine speed over all measurement runs, million node updates per second per worker. */
  mcells_per_second: number;
  candidates: ResolutionCandidateResult[];
  /** Coarsest resolution whose projected error meets the budget (made finer by a feature, if one governs); null if none. */
  recommended: ResolutionCandidateResult | null;
  /** What set the recommendation: the phase budget, or the thinnest feature. */
  governedBy: 'dispersion' | 'feature';
  /** The recommendation projected onto a 3D grid (with --dims 3). */
  projection3d: Projection3dResult | null;
  planned: number;
  complete: boolean;
  workers: number[];
  seconds: number;
}

/**
 * Phase error arg(FDTD/exact) at every node of every line at the run's first analysis
 * frequency, unwrapped along the line, with its least-squares slope against ρ. FDTD is the
 * scheme's transfer function (as in lines.csv); exact is −(ωμ/4)·H0^(2)(kρ). The fit removes
 * the constant near-source offset, leaving the phase the grid loses per unit distance,
 * which is what the dispersion relation predicts.
 */
export function lineSlopes(scenario: Scenario, run: SpectraResult): LinePhaseSlope[] {
  const layout = layoutOf(scenario);
  const f = scenario.frequencies[0];
  const wavelength = mediumWavelength(scenario.medium, f);
  const reference = exactReference(scenario);
  let point = layout.probes.length;
  return layout.lines.map((line): LinePhaseSlope => {
    const rho = new Float64Array(line.nodes.length);
    const wrapped = new Float64Array(line.nodes.length);
    line.nodes.forEach((node, k) => {
      rho[k] = nodeDistance(node, layout.source, layout.dx, layout.dy);
      const exact = reference.transfer(f, [node])[0];
      wrapped[k] = complexRatioErrors(transferAt(run, 0, point++), exact).phaseDeg;
    });
    const fit = fitLine(rho, unwrapDegrees(wrapped));
    return { name: line.name, slopeDegPerWavelength: fit.slope * wavelength, interceptDeg: fit.intercept, residualRmsDeg: fit.residualRms };
  });
}

const projectOf = (plan: ResolutionStudyPlan, cellsPerWavelength: number, mcells: number) =>
  projectEstimate(plan.size_wavelengths, cellsPerWavelength, plan.aspect, plan.courant, plan.absorberCells, mcells);

/** Figures of one measurement run (project time left NaN: the speed is known at the end). */
export function evaluateResolution(plan: ResolutionStudyPlan, c: ResolutionCandidatePlan, run: SpectraResult): ResolutionCandidateResult {
  const lines = lineSlopes(c.scenario, run);
  const lag = (name: string) => {
    const line = lines.find((l) => l.name === name);
    return line ? Math.abs(line.slopeDegPerWavelength) : NaN;
  };
  const x = lag(LINE_NAMES.x);
  const y = lag(LINE_NAMES.y);
  const diagonal = lag(LINE_NAMES.diagonal);
  const axis = Math.max(x, y);
  return {
    cellsPerWavelength: c.cellsPerWavelength,
    dx_m: c.dx_m,
    dy_m: c.dy_m,
    axis_deg_per_wavelength: axis,
    diagonal_deg_per_wavelength: diagonal,
    predicted_axis_deg_per_wavelength: Math.max(c.predicted.x, c.predicted.y),
    predicted_diagonal_deg_per_wavelength: c.predicted.diagonal,
    x_deg_per_wavelength: x,
    y_deg_per_wavelength: y,
    projected_error_deg: Math.max(axis, diagonal) * plan.size_wavelengths,
    fit_residual_deg: Math.max(...lines.map((l) => l.residualRmsDeg)),
    seconds: run.seconds,
    cellUpdates: run.cellUpdates,
    project: projectOf(plan, c.cellsPerWavelength, NaN),
  };
}

/** The coarsest (fewest cells per wavelength) candidate whose projected error is within the budget, or null. */
export function recommendResolution<T extends { cellsPerWavelength: number; projected_error_deg: number }>(candidates: readonly T[], budget_deg: number): T | null {
  let best: T | null = null;
  for (const c of candidates) {
    if (!(c.projected_error_deg <= budget_deg)) continue;
    if (!best || c.cellsPerWavelength < best.cellsPerWavelength) best = c;
  }
  return best;
}

/** Columns of resolution.csv: the contract's first, extras after. */
export const RESOLUTION_CSV_HEADER = [
  'cellsPerWavelength', 'dx_m', 'axis_deg_per_wavelength', 'diagonal_deg_per_wavelength',
  'predicted_axis_deg_per_wavelength', 'predicted_diagonal_deg_per_wavelength',
  'projected_error_deg', 'x_deg_per_wavelength', 'y_deg_per_wavelength', 'fit_residual_deg',
  'project_nx', 'project_ny', 'project_steps', 'project_memory_bytes', 'project_seconds', 'seconds',
] as const;

/** The object written as `resolution.json` and printed by `resolution-study --json`. */
export function resolutionJsonObject(r: ResolutionStudyResult) {
  const rec = r.recommended;
  return {
    budget_deg: r.budget_deg,
    size_wavelengths: r.size_wavelengths,
    recommended: rec && {
      cellsPerWavelength: rec.cellsPerWavelength, dx_m: rec.dx_m, projected_error_deg: rec.projected_error_deg, dy_m: rec.dy_m, project: rec.project,
      ...(r.governedBy === 'feature' ? { governed_by: 'feature' } : {}),
    },
    candidates: r.candidates.map((c) => ({
      cellsPerWavelength: c.cellsPerWavelength, dx_m: c.dx_m,
      axis_deg_per_wavelength: c.axis_deg_per_wavelength, diagonal_deg_per_wavelength: c.diagonal_deg_per_wavelength,
      predicted_axis_deg_per_wavelength: c.predicted_axis_deg_per_wavelength, predicted_diagonal_deg_per_wavelength: c.predicted_diagonal_deg_per_wavelength,
      projected_error_deg: c.projected_error_deg, x_deg_per_wavelength: c.x_deg_per_wavelength, y_deg_per_wavelength: c.y_deg_per_wavelength,
      fit_residual_deg: c.fit_residual_deg, dy_m: c.dy_m, project: c.project, seconds: c.seconds,
      ...(c.error ? { error: c.error } : {}),
    })),
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
    ...(r.projection3d ? { projection3d: r.projection3d } : {}),
  };
}

function resolutionOutputs(r: ResolutionStudyResult): StudyOutput[] {
  return [
    {
      name: 'resolution.csv', kind: 'csv', header: RESOLUTION_CSV_HEADER,
      rows: r.candidates.map((c) => [
        c.cellsPerWavelength, c.dx_m, c.axis_deg_per_wavelength, c.diagonal_deg_per_wavelength,
        c.predicted_axis_deg_per_wavelength, c.predicted_diagonal_deg_per_wavelength,
        c.projected_error_deg, c.x_deg_per_wavelength, c.y_deg_per_wavelength, c.fit_residual_deg,
        c.project.nx, c.project.ny, c.project.steps, c.project.memory_bytes, c.project.seconds, c.seconds,
      ]),
    },
    { name: 'resolution.json', kind: 'json', value: resolutionJsonObject(r) },
  ];
}

const deg = (x: number) => formatSig(x, 3);

/** The recommendation when the thinnest feature asks for finer cells than the phase budget: predicted figures at that resolution. */
function featureRow(plan: ResolutionStudyPlan, base: ResolutionCandidateResult, n: number, mcells: number): ResolutionCandidateResult {
  const p = predictedLags(plan.frequency_Hz, plan.medium, plan.courant, plan.aspect, n);
  const dx = plan.wavelength_m / n;
  return {
    ...base, cellsPerWavelength: n, dx_m: dx, dy_m: dx * plan.aspect,
    predicted_axis_deg_per_wavelength: Math.max(p.x, p.y), predicted_diagonal_deg_per_wavelength: p.diagonal,
    projected_error_deg: Math.max(p.x, p.y, p.diagonal) * plan.size_wavelengths,
    project: projectOf(plan, n, mcells),
  };
}

/** Measured lag per wavelength (points) over the dispersion relation's curves (lines), log–log, with the budget. */
function resolutionCharts(plan: ResolutionStudyPlan, rows: readonly ResolutionCandidateResult[]): StudyChart[] {
  const measured = rows.filter((r) => !r.error);
  if (measured.length === 0) return [];
  const lo = plan.candidates[0].cellsPerWavelength;
  const hi = plan.candidates[plan.candidates.length - 1].cellsPerWavelength;
  const dense = Array.from({ length: 60 }, (_, k) => lo * (hi / lo) ** (k / 59));
  const predicted = dense.map((n) => predictedLags(plan.frequency_Hz, plan.medium, plan.courant, plan.aspect, n));
  const mx = measured.map((r) => r.cellsPerWavelength);
  return [{
    id: 'phase', title: 'Phase lag per wavelength against cells per wavelength',
    x: { label: 'cells per wavelength', log: true }, y: { label: 'phase lag (° per wavelength)', log: true },
    series: [
      { label: 'measured, axis', x: mx, y: measured.map((r) => r.axis_deg_per_wavelength), style: 'points', colour: 'fdtd' },
      { label: 'measured, diagonal', x: mx, y: measured.map((r) => r.diagonal_deg_per_wavelength), style: 'points', colour: 'exact' },
      { label: 'predicted, axis', x: dense, y: predicted.map((p) => Math.max(p.x, p.y)), colour: 'fdtd' },
      { label: 'predicted, diagonal', x: dense, y: predicted.map((p) => p.diagonal), colour: 'exact' },
      { label: 'budget / size', x: [lo, hi], y: [plan.budget_deg / plan.size_wavelengths, plan.budget_deg / plan.size_wavelengths], style: 'dashed', colour: 'error' },
    ],
  }];
}
const fileSafe = (x: number) => String(x).replace(/[^0-9a-zA-Z.+-]/g, '_');

export const resolutionStudy: StudyDefinition<ResolutionStudyOptions, ResolutionCandidatePlan, ResolutionStudyPlan, ResolutionCandidateResult, ResolutionStudyResult> = {
  id: 'resolution',
  title: 'Resolution',
  verb: 'resolution-study',
  summary: 'Measure phase error per wavelength against cells per wavelength (default 8..60); recommend the coarsest cell that keeps the phase error across SIZE within BUDGET.',
  options: [
    { name: 'size', label: 'Project size (wavelengths)', metavar: 'WAVELENGTHS', required: true, help: 'largest distance in the project, in wavelengths at the highest frequency (required)', defaultText: '12' },
    { name: 'budget', label: 'Phase budget (degrees)', metavar: 'DEGREES', required: true, help: 'phase error allowed across that distance (required)', defaultText: '5' },
    { name: 'min-cells', label: 'Coarsest cells per wavelength', help: 'lower end of the range (default 8)', defaultText: '8' },
    { name: 'max-cells', label: 'Finest cells per wavelength', help: 'upper end of the range (default 60)', defaultText: '60' },
    { name: 'feature', label: 'Thinnest feature (m)', help: 'the smallest size the grid must resolve (a substrate, a gap, a wire), m', metavar: 'SIZE' },
    { name: 'cells-per-feature', label: 'Cells across it', help: 'cells across the thinnest feature (default 4)', defaultText: '4' },
    { name: 'dims', label: 'Project dimensions', help: '3 projects the answer onto a 3D grid', defaultText: '2', choices: ['2', '3'] },
    { name: 'volume', label: '3D region X,Y,Z (m)', help: 'the 3D project\'s region without absorber, three lengths in m', metavar: 'X,Y,Z' },
    { name: 'speed', label: '3D speed (Mcells/s)', help: 'your 3D engine\'s speed; default: half this machine\'s 2D figure, labelled as an estimate', metavar: 'MCELLS' },
  ],
  readOptions(values) {
    const problems: string[] = [];
    const { num } = optionReaders(values, problems);
    const dims = values.dims === undefined || values.dims === '' ? undefined : Number(values.dims);
    if (dims !== undefined && dims !== 2 && dims !== 3) problems.push(`dims: "${values.dims}" is not 2 or 3; write 3 for the 3D projection`);
    const volume = readListOption('volume', values.volume, 'metres', '0.2,0.1,0.05');
    if (volume.problem) problems.push(volume.problem);
    const projection: ProjectionOptions = {
      dims: dims as 2 | 3 | undefined, volume: volume.value as [number, number, number] | undefined,
      feature_m: num('feature', 'metres', '0.0016'), cellsPerFeature: num('cells-per-feature', 'cells', '4'), mcells3d: num('speed', 'Mcells/s', '300'),
    };
    const size = num('size', 'wavelengths', '12');
    const budget = num('budget', 'degrees', '5');
    const minCells = num('min-cells', 'cells per wavelength', '8');
    const maxCells = num('max-cells', 'cells per wavelength', '60');
    if (problems.length) return { problems };
    if (size === undefined) problems.push('size is required: the largest distance in the project in wavelengths at the highest frequency, e.g. 12');
    if (budget === undefined) problems.push('budget is required: the phase error allowed across that distance in degrees, e.g. 5');
    if (problems.length) return { problems };
    const options: ResolutionStudyOptions = { size_wavelengths: size as number, budget_deg: budget as number, minCells, maxCells, projection };
    problems.push(...resolutionOptionProblems(options));
    return problems.length ? { problems } : { options, problems };
  },
  plan: planResolutionStudy,
  evaluate: (plan, c, [run]) => evaluateResolution(plan, c, run as SpectraResult),
  failed: (plan, c, error) => ({
    cellsPerWavelength: c.cellsPerWavelength, dx_m: c.dx_m, dy_m: c.dy_m,
    axis_deg_per_wavelength: NaN, diagonal_deg_per_wavelength: NaN,
    predicted_axis_deg_per_wavelength: Math.max(c.predicted.x, c.predicted.y),
    predicted_diagonal_deg_per_wavelength: c.predicted.diagonal,
    x_deg_per_wavelength: NaN, y_deg_per_wavelength: NaN, projected_error_deg: NaN, fit_residual_deg: NaN,
    seconds: NaN, cellUpdates: 0, project: projectOf(plan, c.cellsPerWavelength, NaN), error,
  }),
  compare: (a, b) => a.cellsPerWavelength - b.cellsPerWavelength,
  pick: (plan, rows) => recommendResolution(rows, plan.budget_deg),
  finish(plan, candidates, info) {
    const ran = candidates.filter((r) => r.seconds > 0);
    const mcells = ran.reduce((a, r) => a + r.cellUpdates, 0) / ran.reduce((a, r) => a + r.seconds, 0) / 1e6;
    for (const r of candidates) r.project = projectOf(plan, r.cellsPerWavelength, mcells);
    const byBudget = recommendResolution(candidates, plan.budget_deg);
    const featureN = featureCellsPerWavelength(plan, plan.projection);
    const byFeature = byBudget && featureN > byBudget.cellsPerWavelength;
    return {
      governedBy: byFeature ? 'feature' : 'dispersion',
      projection3d: projectTo3d(plan, byBudget, mcells, plan.projection, plan.absorberCells),
      budget_deg: plan.budget_deg,
      size_wavelengths: plan.size_wavelengths,
      frequency_Hz: plan.frequency_Hz,
      wavelength_m: plan.wavelength_m,
      courant: plan.courant,
      aspect: plan.aspect,
      mcells_per_second: mcells,
      candidates,
      recommended: byFeature ? featureRow(plan, byBudget, featureN, mcells) : byBudget,
      planned: info.planned,
      complete: info.complete,
      workers: info.workers,
      seconds: info.seconds,
    };
  },
  rows: (r) => r.candidates,
  recommended: (r) => r.recommended,
  columns: [
    { label: 'cells/λ', value: (c) => String(c.cellsPerWavelength) },
    { label: 'dx', value: (c) => formatSI(c.dx_m, 'm') },
    { label: 'dy', value: (c) => formatSI(c.dy_m, 'm') },
    { label: 'axis °/λ', value: (c) => deg(c.axis_deg_per_wavelength) },
    { label: 'predicted', value: (c) => deg(c.predicted_axis_deg_per_wavelength) },
    { label: 'diagonal °/λ', value: (c) => deg(c.diagonal_deg_per_wavelength) },
    { label: 'predicted', value: (c) => deg(c.predicted_diagonal_deg_per_wavelength) },
    { label: 'across project', value: (c) => `${deg(c.projected_error_deg)}°` },
    { label: 'project grid', value: (c) => `${c.project.nx} × ${c.project.ny}` },
    { label: 'memory', value: (c) => formatBytes(c.project.memory_bytes) },
    { label: 'time', value: (c) => (Number.isFinite(c.project.seconds) ? `${formatSig(c.project.seconds, 2)} s` : '—') },
  ],
  rowNotes: (r, c) => [c === r.recommended ? 'recommended' : '', c.error ?? ''].filter(Boolean),
  heading: (r) => [
    `resolution study at ${formatSI(r.frequency_Hz, 'Hz')} (wavelength ${formatSI(r.wavelength_m, 'm')} in the medium), ` +
      `Courant number ${r.courant}, dy/dx ${formatSig(r.aspect, 4)}; ${r.candidates.length} of ${r.planned} resolutions`,
    'phase lag per wavelength: measured (slope of the phase error from 2 to 5 wavelengths) and predicted by the dispersion relation',
  ],
  verdict(r) {
    const lines: string[] = [];
    const rec = r.recommended;
    if (!r.complete) lines.push(`interrupted: ${r.candidates.length} of ${r.planned} resolutions finished; the recommendation is among those`);
    if (rec) {
      lines.push(`recommended: ${rec.cellsPerWavelength} cells per wavelength (dx = ${formatSI(rec.dx_m, 'm')}): ` +
        `${formatSig(rec.projected_error_deg, 3)}° across ${r.size_wavelengths} wavelengths, budget ${r.budget_deg}°`);
      lines.push(`  a ${r.size_wavelengths} × ${r.size_wavelengths} wavelength 2D grid: ${rec.project.nx} × ${rec.project.ny} cells, ${rec.project.steps} steps, ` +
        `${formatBytes(rec.project.memory_bytes)}, about ${formatSig(rec.project.seconds, 2)} s at ${formatSig(r.mcells_per_second, 3)} Mcells/s`);
    } else {
      lines.push(`no resolution meets the budget ${r.budget_deg}° across ${r.size_wavelengths} wavelengths: recommended is null; try finer cells (--max-cells) or a larger budget`);
    }
    if (rec && r.governedBy === 'feature') lines.push('  governed by the thinnest feature (finer than the phase budget needs); its figures are the dispersion relation\'s at that resolution');
    const p = r.projection3d;
    if (p) {
      lines.push(`3D projection (by the 3D dispersion relation, not a 3D run): ${p.cellsPerWavelength} cells per wavelength, dx = ${formatSI(p.dx_m, 'm')}, dt = ${formatSI(p.dt_s, 's')}, ` +
        `${p.nx} × ${p.ny} × ${p.nz} = ${formatSig(p.cells, 3)} cells, ${formatBytes(p.memory_bytes)}, ${p.steps} steps, about ${formatSig(p.seconds, 2)} s at ${formatSig(p.mcells_per_second, 3)} Mcells/s (${p.speed_source}); governed by ${p.governedBy === 'feature' ? 'the thinnest feature' : 'dispersion'}`);
    }
    return lines;
  },
  noneMeets: (r) => `no resolution meets the budget ${r.budget_deg}° across ${r.size_wavelengths} wavelengths: recommended is null`,
  outputs: resolutionOutputs,
  json: resolutionJsonObject,
  jobFiles: (plan) => ({ shared: [], candidates: plan.candidates.map((c) => [`resolution-${fileSafe(c.cellsPerWavelength)}.json`]) }),
  manifest: (plan) => ({
    study: 'resolution',
    budget_deg: plan.budget_deg,
    size_wavelengths: plan.size_wavelengths,
    frequency_Hz: plan.frequency_Hz,
    scoring: 'run each file; from lines.csv fit phase_err_deg against rho_m by least squares on each line; lag per wavelength = -slope * wavelength_m; projected error = worst line * size_wavelengths',
    wavelength_m: plan.wavelength_m,
    candidates: plan.candidates.map((c) => ({
      file: `resolution-${fileSafe(c.cellsPerWavelength)}.json`, cellsPerWavelength: c.cellsPerWavelength, dx_m: c.dx_m,
      predicted_axis_deg_per_wavelength: Math.max(c.predicted.x, c.predicted.y),
      predicted_diagonal_deg_per_wavelength: c.predicted.diagonal,
    })),
  }),
  emitted: (plan) => `${plan.candidates.length} measurement scenarios and study.json`,
  apply: (scenario, plan, pick) => applyResolution(scenario, pick.cellsPerWavelength, plan.frequency_Hz),
  charts: resolutionCharts,
  pageNote: 'Held fixed: your Courant number and dy/dx. Cells per wavelength count along x at your highest analysis frequency. Each resolution runs its own line current with probe lines along x, y and the diagonal from 2 to 5 wavelengths out.',
  rowData: (c) => ({ key: String(c.cellsPerWavelength), cells: String(c.cellsPerWavelength) }),
};

/** Runs a planned resolution study on a pool (see run-study.ts). */
export function runResolutionStudy(plan: ResolutionStudyPlan, pool: StudyPool, callbacks: StudyCallbacks<ResolutionCandidateResult> = {}): Promise<ResolutionStudyResult> {
  return runStudy(resolutionStudy, plan, pool, callbacks);
}
