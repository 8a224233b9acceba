/**
 * Staircase study (README "Staircase study"): how fine the cells must be for a curved object
 * to be represented well, in a scenario with exactly one circle, where the eigenfunction
 * series gives the exact field. For each polarization, fill and resolution the scenario is
 * run at that resolution (positions and the circle held) and compared with the series at the
 * probes and along the lines; the study recommends the coarsest resolution meeting both
 * budgets and says which fill gets there.
 */
import { exactReference } from '../compare/reference.ts';
import { complexRatioErrors } from '../compare/metrics.ts';
import { layoutOf } from '../scenario/layout.ts';
import type { CircleObject, Fill, Polarization, Scenario } from '../scenario/types.ts';
import { formatSI, formatSig } from '../scenario/units.ts';
import { readListOption, type StudyChart, type StudyDefinition, optionReaders } from './definition.ts';
import { transferAt, type SpectraJob, type SpectraResult } from './jobs.ts';
import { applyResolution, mediumWavelength, studyFrequency } from './resolution-plan.ts';

export interface StaircaseOptions {
  budget_dB: number;
  budget_deg: number;
  /** Polarizations to study (default both). */
  polarizations?: Polarization[];
  cellsPerWavelength?: number[];
}

export const STAIRCASE_CELLS = [8, 10, 12, 16, 20, 24, 32, 40, 48, 60] as const;
/** Points within this share of a wavelength of the circle's surface count as near it. */
export const NEAR_SURFACE_WAVELENGTHS = 0.1;

export interface StaircaseCandidatePlan {
  key: string;
  jobs: SpectraJob[];
  polarization: Polarization;
  fill: Fill;
  cellsPerWavelength: number;
  dx_m: number;
  scenario: Scenario;
}

export interface StaircasePlan {
  shared: SpectraJob[];
  candidates: StaircaseCandidatePlan[];
  budget_dB: number;
  budget_deg: number;
  frequency_Hz: number;
  wavelength_m: number;
  material: 'pec' | 'penetrable';
}

export interface StaircaseCandidate {
  key: string;
  polarization: Polarization;
  fill: Fill;
  cellsPerWavelength: number;
  dx_m: number;
  /** Worst over probes, line points and frequencies: |magnitude error| dB and |phase error| °. */
  mag_err_dB: number;
  phase_err_deg: number;
  /** Worst |FDTD − exact| / |incident| near the surface (within 0.1 λ) and elsewhere. */
  rel_err_near: number;
  rel_err_far: number;
  nx: number;
  ny: number;
  seconds: number;
  error?: string;
}

export interface StaircaseRecommendation { polarization: Polarization; fill: Fill; cellsPerWavelength: number; dx_m: number; mag_err_dB: number; phase_err_deg: number }

export interface StaircaseResult {
  plan: StaircasePlan;
  candidates: StaircaseCandidate[];
  /** Per polarization: the coarsest candidate meeting both budgets (any fill), or null. */
  recommended: StaircaseCandidate | null;
  byPolarization: Record<string, StaircaseRecommendation | null>;
  /** Per polarization and fill: the coarsest resolution meeting both budgets (null when none does). */
  byFill: { polarization: Polarization; fill: Fill; cellsPerWavelength: number | null }[];
  planned: number;
  complete: boolean;
  workers: number[];
  seconds: number;
}

/** The fills that differ for this object: staircase always; average for a penetrable one; conformal for a conductor. */
export function fillsFor(circle: CircleObject): Fill[] {
  return circle.material === 'pec' ? ['staircase', 'conformal'] : ['staircase', 'average'];
}

export function planStaircaseStudy(s: Scenario, o: StaircaseOptions): StaircasePlan {
  const objects = s.objects ?? [];
  if (objects.length !== 1 || objects[0].shape !== 'circle') {
    throw new RangeError(`objects: the staircase study needs exactly one circle, where the exact series exists (this scenario has ${objects.length === 1 ? `one ${objects[0].shape}` : `${objects.length} objects`}); use the convergence study for other geometry`);
  }
  if (!(o.budget_dB > 0) || !(o.budget_deg > 0)) throw new RangeError('budget-db and budget-deg: give both budgets as positive numbers, e.g. --budget-db 0.5 --budget-deg 5');
  const circle = objects[0] as CircleObject;
  const f = studyFrequency(s);
  const wavelength = mediumWavelength(s.medium, f);
  const cells = [...new Set(o.cellsPerWavelength ?? STAIRCASE_CELLS)].sort((a, b) => a - b);
  const polarizations = o.polarizations ?? ['TMz', 'TEz'];
  const candidates = polarizations.flatMap((polarization) => fillsFor(circle).flatMap((fill) => cells.map((n): StaircaseCandidatePlan => {
    const scenario: Scenario = { ...applyResolution(s, n, f), polarization, fill };
    return { key: `${polarization}/${fill}/${n}`, jobs: [{ kind: 'spectra', scenario }], polarization, fill, cellsPerWavelength: n, dx_m: scenario.grid.dx, scenario };
  })));
  return { shared: [], candidates, budget_dB: o.budget_dB, budget_deg: o.budget_deg, frequency_Hz: f, wavelength_m: wavelength, material: circle.material === 'pec' ? 'pec' : 'penetrable' };
}

/** Errors against the series at every probe and line point, every frequency. */
function evaluateStaircase(plan: StaircasePlan, c: StaircaseCandidatePlan, run: SpectraResult): StaircaseCandidate {
  const s = c.scenario;
  const layout = layoutOf(s);
  const circle = (s.objects as CircleObject[])[0];
  const exact = exactReference(s);
  const incident = exactReference({ ...s, objects: [] });
  const points = [...layout.probes, ...layout.lines.flatMap((l) => l.nodes)];
  let mag = 0; let phase = 0; let near = 0; let far = 0;
  s.frequencies.forEach((f, k) => {
    const ex = exact.transfer(f, points);
    const inc = incident.transfer(f, points);
    points.forEach((p, q) => {
      if (!Number.isFinite(ex[q][0])) return; // the source node
      const fdtd = transferAt(run, k, q);
      const e = complexRatioErrors(fdtd, ex[q]);
      mag = Math.max(mag, Math.abs(e.magDb));
      phase = Math.max(phase, Math.abs(e.phaseDeg));
      const rel = Math.hypot(fdtd[0] - ex[q][0], fdtd[1] - ex[q][1]) / Math.hypot(...inc[q]);
      const surface = Math.abs(Math.hypot(p.x - circle.x, p.y - circle.y) - circle.radius);
      if (surface <= NEAR_SURFACE_WAVELENGTHS * plan.wavelength_m) near = Math.max(near, rel); else far = Math.max(far, rel);
    });
  });
  return {
    key: c.key, polarization: c.polarization, fill: c.fill, cellsPerWavelength: c.cellsPerWavelength, dx_m: c.dx_m,
    mag_err_dB: mag, phase_err_deg: phase, rel_err_near: near || NaN, rel_err_far: far || NaN,
    nx: s.grid.nx, ny: s.grid.ny, seconds: run.seconds,
  };
}

const meets = (plan: StaircasePlan, c: StaircaseCandidate) => !c.error && c.mag_err_dB <= plan.budget_dB && c.phase_err_deg <= plan.budget_deg;
const coarsest = (plan: StaircasePlan, rows: readonly StaircaseCandidate[]) =>
  rows.filter((c) => meets(plan, c)).reduce<StaircaseCandidate | null>((best, c) => (!best || c.cellsPerWavelength < best.cellsPerWavelength ? c : best), null);

function finishStaircase(plan: StaircasePlan, candidates: StaircaseCandidate[], info: { planned: number; complete: boolean; workers: number[]; seconds: number }): StaircaseResult {
  const polarizations = [...new Set(plan.candidates.map((c) => c.polarization))];
  const fills = [...new Set(plan.candidates.map((c) => c.fill))];
  const byPolarization: Record<string, StaircaseRecommendation | null> = {};
  for (const p of polarizations) {
    const best = coarsest(plan, candidates.filter((c) => c.polarization === p));
    byPolarization[p] = best && { polarization: p, fill: best.fill, cellsPerWavelength: best.cellsPerWavelength, dx_m: best.dx_m, mag_err_dB: best.mag_err_dB, phase_err_deg: best.phase_err_deg };
  }
  // overall: the finer of the polarizations' answers (a project with both must meet both)
  const picks = polarizations.map((p) => coarsest(plan, candidates.filter((c) => c.polarization === p)));
  const recommended = picks.some((p) => p === null) ? null : picks.reduce((a, b) => ((b as StaircaseCandidate).cellsPerWavelength > (a as StaircaseCandidate).cellsPerWavelength ? b : a), picks[0]);
  const byFill = polarizations.flatMap((p) => fills.map((fill) => ({ polarization: p, fill, cellsPerWavelength: coarsest(plan, candidates.filter((c) => c.polarization === p && c.fill === fill))?.cellsPerWavelength ?? null })));
  return { plan, candidates, recommended, byPolarization, byFill, ...info };
}

function staircaseCharts(plan: StaircasePlan, rows: readonly StaircaseCandidate[]): StudyChart[] {
  const groups = [...new Set(rows.map((r) => `${r.polarization}/${r.fill}`))];
  if (rows.length < 2) return [];
  const cells = [...new Set(plan.candidates.map((c) => c.cellsPerWavelength))].sort((a, b) => a - b);
  const finest = rows.filter((r) => r.cellsPerWavelength === cells[cells.length - 1] && Number.isFinite(r.rel_err_far));
  const y0 = finest.length ? Math.max(...finest.map((r) => Math.max(r.rel_err_far, r.rel_err_near || 0))) : NaN;
  const n1 = cells[cells.length - 1];
  return [{
    id: 'staircase', title: 'Error against the series', x: { label: 'cells per wavelength', log: true }, y: { label: '|FDTD − exact| / |incident| (worst)', log: true },
    series: [
      ...groups.map((g, k) => ({
        label: g, x: cells, colour: k,
        y: cells.map((n) => {
          const r = rows.find((x) => `${x.polarization}/${x.fill}` === g && x.cellsPerWavelength === n);
          return r && !r.error ? Math.max(r.rel_err_near || 0, r.rel_err_far || 0) : null;
        }),
      })),
      ...(Number.isFinite(y0) ? [
        { label: 'first order', x: cells, y: cells.map((n) => y0 * (n1 / n)), style: 'dashed' as const, colour: 'predicted' as const },
        { label: 'second order', x: cells, y: cells.map((n) => y0 * (n1 / n) ** 2), style: 'dashed' as const, colour: 'error' as const },
      ] : []),
    ],
  }];
}

export const STAIRCASE_CSV_HEADER = ['polarization', 'fill', 'cellsPerWavelength', 'dx_m', 'mag_err_dB', 'phase_err_deg', 'rel_err_near', 'rel_err_far', 'nx', 'ny', 'seconds'] as const;

function staircaseJson(r: StaircaseResult) {
  return {
    budget_dB: r.plan.budget_dB, budget_deg: r.plan.budget_deg, frequency_Hz: r.plan.frequency_Hz, wavelength_m: r.plan.wavelength_m,
    recommended: r.recommended && { polarization: r.recommended.polarization, fill: r.recommended.fill, cellsPerWavelength: r.recommended.cellsPerWavelength, dx_m: r.recommended.dx_m },
    by_polarization: r.byPolarization, by_fill: r.byFill, material: r.plan.material,
    candidates: r.candidates,
    method: 'each candidate run at its resolution (positions and the circle held) and compared with the eigenfunction series at every probe and line point and frequency; worst magnitude and phase errors, and |FDTD - exact| / |incident| near the surface (within 0.1 wavelength) and elsewhere',
    planned: r.planned, complete: r.complete, workers: r.workers.length, study_seconds: r.seconds,
  };
}

export const staircaseStudy: StudyDefinition<StaircaseOptions, StaircaseCandidatePlan, StaircasePlan, StaircaseCandidate, StaircaseResult> = {
  id: 'staircase',
  title: 'Staircase',
  verb: 'staircase-study',
  summary: 'For a scenario with one circle: error against the exact series at the probes and lines for 8-60 cells per wavelength, every fill that applies (staircase, average, conformal) and both polarizations; recommend the coarsest cell meeting both budgets and say which fill.',
  options: [
    { name: 'budget-db', label: 'Magnitude budget (dB)', help: 'largest magnitude error allowed, dB', defaultText: '0.5', metavar: 'DB', required: true },
    { name: 'budget-deg', label: 'Phase budget (degrees)', help: 'largest phase error allowed, degrees', defaultText: '5', metavar: 'DEGREES', required: true },
    { name: 'polarization', label: 'Polarization', help: 'both, TMz or TEz', defaultText: 'both', choices: ['both', 'TMz', 'TEz'], metavar: 'both|TMz|TEz' },
    { name: 'cells', label: 'Cells per wavelength', help: 'resolutions to run', defaultText: STAIRCASE_CELLS.join(', '), metavar: 'LIST' },
  ],
  readOptions(values) {
    const problems: string[] = [];
    const { num } = optionReaders(values, problems);
    const budget_dB = num('budget-db', 'dB', '0.5');
    const budget_deg = num('budget-deg', 'degrees', '5');
    const cells = readListOption('cells', values.cells, 'cells per wavelength', '10, 20, 40');
    if (cells.problem) problems.push(cells.problem);
    for (const n of cells.value ?? []) if (!(n >= 4 && n <= 200)) problems.push(`cells: ${n} is not a number of cells per wavelength from 4 to 200; write e.g. 10, 20, 40`);
    const pol = values.polarization ?? 'both';
    if (!['both', 'TMz', 'TEz', ''].includes(pol)) problems.push(`polarization: "${pol}" is not both, TMz or TEz; write e.g. both`);
    if (budget_dB === undefined) problems.push('budget-db is required: the magnitude error allowed, e.g. 0.5');
    if (budget_deg === undefined) problems.push('budget-deg is required: the phase error allowed, e.g. 5');
    if (budget_dB !== undefined && !(budget_dB > 0)) problems.push(`budget-db: ${budget_dB} is not a positive number of dB; write e.g. 0.5`);
    if (budget_deg !== undefined && !(budget_deg > 0)) problems.push(`budget-deg: ${budget_deg} is not a positive number of degrees; write e.g. 5`);
    if (problems.length) return { problems };
    return { options: { budget_dB: budget_dB as number, budget_deg: budget_deg as number, polarizations: pol === 'TMz' || pol === 'TEz' ? [pol] : undefined, cellsPerWavelength: cells.value }, problems };
  },
  plan: planStaircaseStudy,
  evaluate: (plan, c, [run]) => evaluateStaircase(plan, c, run as SpectraResult),
  failed: (_plan, c, error) => ({
    key: c.key, polarization: c.polarization, fill: c.fill, cellsPerWavelength: c.cellsPerWavelength, dx_m: c.dx_m,
    mag_err_dB: NaN, phase_err_deg: NaN, rel_err_near: NaN, rel_err_far: NaN, nx: c.scenario.grid.nx, ny: c.scenario.grid.ny, seconds: NaN, error,
  }),
  compare: (a, b) => a.polarization.localeCompare(b.polarization) || a.fill.localeCompare(b.fill) || a.cellsPerWavelength - b.cellsPerWavelength,
  pick: (plan, rows) => coarsest(plan, rows),
  finish: finishStaircase,
  rows: (r) => r.candidates,
  recommended: (r) => r.recommended,
  columns: [
    { label: 'polarization', value: (c) => c.polarization, text: true },
    { label: 'fill', value: (c) => c.fill, text: true },
    { label: 'cells/λ', value: (c) => String(c.cellsPerWavelength) },
    { label: 'dx', value: (c) => formatSI(c.dx_m, 'm') },
    { label: '|dB|', value: (c) => formatSig(c.mag_err_dB, 3) },
    { label: '|°|', value: (c) => formatSig(c.phase_err_deg, 3) },
    { label: 'rel. near surface', value: (c) => formatSig(c.rel_err_near, 3) },
    { label: 'rel. elsewhere', value: (c) => formatSig(c.rel_err_far, 3) },
    { label: 'grid', value: (c) => `${c.nx} × ${c.ny}` },
    { label: 'time', value: (c) => (Number.isFinite(c.seconds) ? `${c.seconds.toFixed(2)} s` : '—') },
  ],
  rowNotes: (r, c) => [c === r.recommended ? 'recommended' : '', c.error ?? ''].filter(Boolean),
  heading: (r) => [
    `staircase study at ${formatSI(r.plan.frequency_Hz, 'Hz')} (wavelength ${formatSI(r.plan.wavelength_m, 'm')}), a ${r.plan.material === 'pec' ? 'conducting' : 'penetrable'} circle; ${r.candidates.length} of ${r.planned} runs`,
    'errors: worst over probes, line points and frequencies against the eigenfunction series; rel. = |FDTD − exact| / |incident|, near the surface (within 0.1 λ) and elsewhere',
  ],
  verdict(r) {
    const lines: string[] = [];
    for (const [p, rec] of Object.entries(r.byPolarization)) {
      lines.push(rec ? `${p}: ${rec.cellsPerWavelength} cells per wavelength with the ${rec.fill} fill (dx = ${formatSI(rec.dx_m, 'm')}): ${formatSig(rec.mag_err_dB, 3)} dB, ${formatSig(rec.phase_err_deg, 3)}° (budgets ${r.plan.budget_dB} dB, ${r.plan.budget_deg}°)`
        : `${p}: no resolution meets ${r.plan.budget_dB} dB and ${r.plan.budget_deg}°; try finer cells or larger budgets`);
    }
    for (const p of Object.keys(r.byPolarization)) {
      const fills = r.byFill.filter((x) => x.polarization === p).map((x) => `${x.fill} ${x.cellsPerWavelength ?? 'none'}`);
      lines.push(`  ${p} coarsest meeting the budgets, by fill: ${fills.join(', ')}`);
    }
    if (r.recommended) lines.push(`recommended: ${r.recommended.cellsPerWavelength} cells per wavelength (${r.recommended.fill} fill, set by ${r.recommended.polarization})`);
    return lines;
  },
  noneMeets: (r) => `no resolution meets ${r.plan.budget_dB} dB and ${r.plan.budget_deg}° in every polarization: recommended is null`,
  outputs: (r) => [
    { name: 'staircase.csv', kind: 'csv', header: STAIRCASE_CSV_HEADER, rows: r.candidates.map((c) => [c.polarization, c.fill, c.cellsPerWavelength, c.dx_m, c.mag_err_dB, c.phase_err_deg, c.rel_err_near, c.rel_err_far, c.nx, c.ny, c.seconds]) },
    { name: 'staircase.json', kind: 'json', value: staircaseJson(r) },
  ],
  json: staircaseJson,
  jobFiles: (plan) => ({ shared: [], candidates: plan.candidates.map((c) => [`staircase-${c.polarization}-${c.fill}-${c.cellsPerWavelength}.json`]) }),
  manifest: (plan) => ({
    study: 'staircase', budget_dB: plan.budget_dB, budget_deg: plan.budget_deg, frequency_Hz: plan.frequency_Hz,
    scoring: 'run each file; from spectra.csv and lines.csv compare fdtd with the eigenfunction series of the circle at every point and frequency',
    candidates: plan.candidates.map((c) => ({ file: `staircase-${c.polarization}-${c.fill}-${c.cellsPerWavelength}.json`, polarization: c.polarization, fill: c.fill, cellsPerWavelength: c.cellsPerWavelength })),
  }),
  emitted: (plan) => `${plan.candidates.length} scenarios and study.json`,
  charts: staircaseCharts,
  pageNote: 'Needs exactly one circle. Each run holds the positions and the circle and changes the cell size; errors are against the exact eigenfunction series. A conformal fill that lets the cell grow is the answer to look for.',
  rowData: (c) => ({ key: c.key, cells: String(c.cellsPerWavelength) }),
  apply: (scenario, plan, pick) => ({ ...applyResolution(scenario, pick.cellsPerWavelength, plan.frequency_Hz), fill: pick.fill }),
};
