/**
 * The absorber study as a study definition (definition.ts): plans from absorber-plan.ts,
 * scores each candidate's probe series against the reference run, recommends the fewest
 * cells meeting the target, and describes its table, files and emitted runs.
 */
import { formatBytes } from '../scenario/units.ts';
import {
  ABSORBER_SWEEP_DEFAULTS, absorberKey, absorberOptionProblems, applyAbsorber, compareAbsorbers, gradingKey, planAbsorberStudy, recommendAbsorber,
  type AbsorberBasis, type AbsorberCandidatePlan, type AbsorberGrading, type AbsorberStudyOptions, type AbsorberStudyPlan, type StudyProbe,
} from './absorber-plan.ts';
import { type StudyChart, type StudyDefinition, type StudyOutput, optionReaders } from './definition.ts';
import type { ProbeSeriesResult } from './jobs.ts';
import type { StudyPool } from './pool.ts';
import { reflectionErrorDb, reflectionErrorSeries } from './reflection.ts';
import { runStudy, type StudyCallbacks } from './run-study.ts';

export * from './absorber-plan.ts';
export type { StudyCallbacks } from './run-study.ts';

export interface AbsorberCandidateResult {
  cells: number; order: number; sigmaScale: number; kappaMax: number; alphaMax: number;
  key: string;
  isCurrent: boolean;
  /** Worst of the user's probes: max_n |E − Eref| / max_n |Eref|, dB; NaN if the run failed. */
  reflection_dB: number;
  /** The worst case: the larger of every probe's figure (the user's and those along the layer) and the long window's, dB. */
  reflection_worst_dB: number;
  /** Every probe over the long window against the long reference, dB (NaN without the long-run check). */
  long_dB: number;
  /** The probe where the worst case was found. */
  worst_case_probe: string;
  theory_dB: number;
  memory_bytes: number;
  /** Run time of the candidate in its worker, s. */
  seconds: number;
  nx: number;
  ny: number;
  /** Name of the probe with the largest error. */
  worst_probe: string;
  per_probe_dB: Record<string, number>;
  /** |E − Eref| / max|Eref| at the worst probe, one value per sample n = 0..steps. */
  errorSeries: Float32Array;
  /** Why the candidate has no figure (a failed or unstable run). */
  error?: string;
}

export interface AbsorberStudyResult {
  target_dB: number;
  /** What the recommendation rests on. */
  basis: AbsorberBasis;
  /** Steps of the long window (0: no long-run check). */
  longSteps: number;
  steps: number;
  dt_s: number;
  probes: StudyProbe[];
  reference: { nx: number; ny: number; seconds: number };
  /** Finished candidates, ordered by cells, order, sigmaScale, kappaMax, alphaMax. */
  candidates: AbsorberCandidateResult[];
  /** Fewest cells meeting the target, ties broken by the larger margin; null if none does. */
  recommended: AbsorberCandidateResult | null;
  /** The user's own setting, when it finished. */
  current: AbsorberCandidateResult | null;
  /** Candidates planned (finished or not). */
  planned: number;
  /** False when the study was cancelled before every candidate finished. */
  complete: boolean;
  /** Serial numbers of the workers that ran jobs. */
  workers: number[];
  /** Wall-clock seconds of the whole study. */
  seconds: number;
}

/** Worst finite per-probe figure and its index; NaN and −1 when no probe has one. */
function worstProbe(perProbe: number[]): { index: number; value: number } {
  let index = -1;
  let value = NaN;
  perProbe.forEach((v, k) => {
    if (Number.isFinite(v) && !(v <= value)) { index = k; value = v; }
  });
  return { index, value };
}

function baseRow(plan: AbsorberCandidatePlan, seconds: number) {
  return {
    ...plan.absorber, key: plan.key, isCurrent: plan.isCurrent, theory_dB: plan.theory_dB, memory_bytes: plan.memory_bytes,
    seconds, nx: plan.scenario.grid.nx, ny: plan.scenario.grid.ny,
  };
}

/** The figure a recommendation on `basis` reads. */
export const basisFigure = (basis: AbsorberBasis) => (c: AbsorberCandidateResult) => (basis === 'worst-case' ? c.reflection_worst_dB : c.reflection_dB);

/**
 * Reflection figures of one finished candidate against the reference runs: at the user's
 * probes (short window), and the worst case over every probe, short window and, when given,
 * the long window against the long reference.
 */
export function evaluateCandidate(
  plan: AbsorberCandidatePlan, probes: readonly StudyProbe[], run: ProbeSeriesResult, reference: Float32Array[],
  long?: { run: ProbeSeriesResult; reference: Float32Array[] },
): AbsorberCandidateResult {
  const base = baseRow(plan, run.seconds + (long?.run.seconds ?? 0));
  if (!run.finite || (long && !long.run.finite)) {
    return { ...base, ...EMPTY, error: 'the field became infinite or NaN (unstable run)' };
  }
  const { perProbe } = reflectionErrorDb(run.series, reference);
  const own = probes.map((p, k) => (p.edge ? NaN : perProbe[k]));
  const worst = worstProbe(own);
  const longPerProbe = long ? reflectionErrorDb(long.run.series, long.reference).perProbe : [];
  const everywhere = worstProbe([...perProbe, ...longPerProbe]);
  const per_probe_dB: Record<string, number> = {};
  probes.forEach((p, k) => { per_probe_dB[p.name] = perProbe[k]; });
  return {
    ...base,
    reflection_dB: worst.value,
    reflection_worst_dB: everywhere.value,
    long_dB: long ? worstProbe(longPerProbe).value : NaN,
    worst_probe: worst.index >= 0 ? probes[worst.index].name : '',
    worst_case_probe: everywhere.index >= 0 ? `${probes[everywhere.index % probes.length].name}${everywhere.index >= probes.length ? ' (long window)' : ''}` : '',
    per_probe_dB,
    errorSeries: worst.index >= 0 ? Float32Array.from(reflectionErrorSeries(run.series[worst.index], reference[worst.index])) : new Float32Array(0),
    ...(worst.index < 0 ? { error: 'no probe received the pulse within the window; add steps or move probes' } : {}),
  };
}

/** The figures of a candidate without any. */
const EMPTY = {
  reflection_dB: NaN, reflection_worst_dB: NaN, long_dB: NaN, worst_probe: '', worst_case_probe: '', per_probe_dB: {}, errorSeries: new Float32Array(0),
};

const dB = (x: number) => (Number.isFinite(x) ? `${x.toFixed(1)} dB` : x === -Infinity ? '−∞ dB' : '—');
const gradingText = (c: AbsorberCandidateResult) => `${c.cells} cells, m ${c.order}, sigmaScale ${c.sigmaScale}, kappaMax ${c.kappaMax}, alphaMax ${c.alphaMax}`;
const absorberOf = (a: AbsorberCandidateResult) => ({ cells: a.cells, order: a.order, sigmaScale: a.sigmaScale, kappaMax: a.kappaMax, alphaMax: a.alphaMax });

/** Columns of absorber.csv: the contract's first, extras after. */
export const ABSORBER_CSV_HEADER = [
  'cells', 'order', 'sigmaScale', 'kappaMax', 'alphaMax', 'reflection_dB', 'theory_dB', 'memory_bytes', 'seconds',
  'worst_probe', 'nx', 'ny', 'current', 'reflection_worst_dB', 'long_dB', 'worst_case_probe',
] as const;

/** The object written as `absorber.json` and printed by `absorber-study --json`. */
export function absorberJsonObject(r: AbsorberStudyResult) {
  const brief = (c: AbsorberCandidateResult | null) => c && {
    ...absorberOf(c), reflection_dB: c.reflection_dB, theory_dB: c.theory_dB, memory_bytes: c.memory_bytes,
    margin_dB: r.target_dB - basisFigure(r.basis)(c),
    reflection_worst_dB: c.reflection_worst_dB,
  };
  return {
    target_dB: r.target_dB,
    recommended: r.recommended && { ...brief(r.recommended), basis: r.basis },
    current: brief(r.current),
    candidates: r.candidates.map((c) => ({
      ...absorberOf(c), reflection_dB: c.reflection_dB, theory_dB: c.theory_dB, memory_bytes: c.memory_bytes, seconds: c.seconds,
      worst_probe: c.worst_probe, per_probe_dB: c.per_probe_dB, nx: c.nx, ny: c.ny, current: c.isCurrent,
      reflection_worst_dB: c.reflection_worst_dB, long_dB: c.long_dB, worst_case_probe: c.worst_case_probe,
      ...(c.error ? { error: c.error } : {}),
    })),
    method: 'reference grid: error(t) = |E - Eref| / max|Eref| at each probe; a candidate\'s figure is its worst probe\'s maximum, in dB',
    steps: r.steps,
    dt_s: r.dt_s,
    probes: r.probes.map((p) => ({ name: p.name, x_m: p.x, y_m: p.y, added: p.added, ...(p.edge ? { edge: true } : {}) })),
    reference: r.reference,
    planned: r.planned,
    complete: r.complete,
    workers: r.workers.length,
    study_seconds: r.seconds,
    basis: r.basis,
    long_steps: r.longSteps,
    worst_case_method: 'the larger of every probe\'s figure (the user\'s and probes one cell inside the layer along every side and in the corners) over the window, and over a window of long_steps against a run with a thick layer',
  };
}

function absorberOutputs(r: AbsorberStudyResult): StudyOutput[] {
  const errorColumns: [string, Float32Array][] = [];
  if (r.current) errorColumns.push([`current ${r.current.key}`, r.current.errorSeries]);
  if (r.recommended) errorColumns.push([`recommended ${r.recommended.key}`, r.recommended.errorSeries]);
  const n = Math.max(0, ...errorColumns.map(([, s]) => s.length));
  const errorRows: number[][] = [];
  for (let k = 0; k < n; k++) errorRows.push([k * r.dt_s, ...errorColumns.map(([, s]) => (k < s.length ? s[k] : NaN))]);
  return [
    {
      name: 'absorber.csv', kind: 'csv', header: ABSORBER_CSV_HEADER,
      rows: r.candidates.map((c) => [
        c.cells, c.order, c.sigmaScale, c.kappaMax, c.alphaMax, c.reflection_dB, c.theory_dB, c.memory_bytes, c.seconds,
        c.worst_probe, c.nx, c.ny, c.isCurrent ? 1 : 0, c.reflection_worst_dB, c.long_dB, c.worst_case_probe,
      ]),
    },
    { name: 'absorber.json', kind: 'json', value: absorberJsonObject(r) },
    // error against time for the current and the recommended setting, worst probe
    { name: 'absorber-error.csv', kind: 'csv', header: ['t_s', ...errorColumns.map(([name]) => name)], rows: errorRows },
  ];
}

const gradingLabel = (c: AbsorberGrading) => `m ${c.order}, σ×${c.sigmaScale}, κ ${c.kappaMax}, α ${c.alphaMax}`;

/** Reflection against layer cells, one curve per grading swept over two or more thicknesses; error against time. */
function absorberCharts(plan: AbsorberStudyPlan, rows: readonly AbsorberCandidateResult[], result: AbsorberStudyResult | undefined): StudyChart[] {
  const cells = [...new Set(plan.candidates.map((c) => c.absorber.cells))].sort((a, b) => a - b);
  const byGrading = new Map<string, AbsorberGrading>();
  const thicknesses = new Map<string, Set<number>>();
  for (const c of plan.candidates) {
    const key = gradingKey(c.absorber);
    byGrading.set(key, c.absorber);
    thicknesses.set(key, (thicknesses.get(key) ?? new Set()).add(c.absorber.cells));
  }
  const curves = [...byGrading.entries()].filter(([key]) => (thicknesses.get(key)?.size ?? 0) >= 2);
  const value = (key: string, n: number) => {
    const c = rows.find((r) => r.cells === n && gradingKey(r) === key);
    return c && Number.isFinite(c.reflection_dB) ? c.reflection_dB : null;
  };
  const charts: StudyChart[] = [{
    id: 'reflection', title: 'Reflection against layer cells',
    x: { label: 'layer cells' }, y: { label: 'reflection (dB)' },
    series: [
      ...curves.map(([key, g], k) => ({ label: gradingLabel(g), x: cells, y: cells.map((n) => value(key, n)), colour: k })),
      { label: 'target', x: cells, y: cells.map(() => plan.target_dB), style: 'dashed' as const, colour: 'error' as const },
    ],
  }];
  const shown = [result?.current, result?.recommended].filter((c): c is AbsorberCandidateResult => !!c && c.errorSeries.length > 0);
  if (result && shown.length > 0) {
    const n = Math.max(...shown.map((c) => c.errorSeries.length));
    const t = Array.from({ length: n }, (_, k) => k * result.dt_s);
    const toDb = (c: AbsorberCandidateResult | null) => t.map((_, k) => (c && k < c.errorSeries.length && c.errorSeries[k] > 0 ? 20 * Math.log10(c.errorSeries[k]) : null));
    charts.push({
      id: 'error', title: 'Error against time, worst probe',
      x: { label: 't', unit: 's' }, y: { label: '|E − Eref| / max|Eref| (dB)' },
      series: [
        { label: 'current', x: t, y: toDb(result.current), colour: 'exact' },
        { label: 'recommended', x: t, y: toDb(result.recommended), colour: 'fdtd' },
      ],
    });
  }
  return charts;
}

const fileSafe = (x: number) => String(x).replace(/[^0-9a-zA-Z.+-]/g, '_');

export const absorberStudy: StudyDefinition<AbsorberStudyOptions, AbsorberCandidatePlan, AbsorberStudyPlan, AbsorberCandidateResult, AbsorberStudyResult> = {
  id: 'absorber',
  title: 'Absorber',
  verb: 'absorber-study',
  summary: 'Measure CPML reflection for a range of layer settings; recommend the thinnest layer that meets the target (default -60 dB).',
  options: [
    { name: 'target', label: 'Target (dB)', metavar: 'DB', help: 'largest acceptable reflection error, a negative number of dB', defaultText: String(ABSORBER_SWEEP_DEFAULTS.target_dB) },
    { name: 'basis', label: 'Recommend on', help: 'worst-case: probes along the layer and a long window too; probes: your own probes only', defaultText: 'worst-case', choices: ['worst-case', 'probes'], metavar: 'worst-case|probes' },
    { name: 'long-run', label: 'Long window (× steps)', help: 'the long-run check\'s window in multiples of your steps; 0 leaves it out', defaultText: String(ABSORBER_SWEEP_DEFAULTS.longFactor), metavar: 'FACTOR' },
    { name: 'cells', label: 'Layer cells swept', help: 'thicknesses swept with each grading', defaultText: ABSORBER_SWEEP_DEFAULTS.cells.join(', ') },
    { name: 'grading-cells', label: 'Cells for the grading grids', help: 'thickness at which orders, σ, κ and α are swept', defaultText: ABSORBER_SWEEP_DEFAULTS.gradingCells.join(', ') },
    { name: 'orders', label: 'Orders m', help: 'polynomial grading orders', defaultText: ABSORBER_SWEEP_DEFAULTS.orders.join(', ') },
    { name: 'sigma-scales', label: 'sigmaScale values', help: 'σmax as a multiple of σopt', defaultText: ABSORBER_SWEEP_DEFAULTS.sigmaScales.join(', ') },
    { name: 'kappa-maxes', label: 'kappaMax values', help: 'largest real stretch κ', defaultText: ABSORBER_SWEEP_DEFAULTS.kappaMaxes.join(', ') },
    { name: 'alpha-maxes', label: 'alphaMax values (S/m)', help: 'largest frequency shift α', defaultText: ABSORBER_SWEEP_DEFAULTS.alphaMaxes.join(', ') },
  ],
  readOptions(values) {
    const problems: string[] = [];
    const { num, list } = optionReaders(values, problems);
    const options: AbsorberStudyOptions = {
      target_dB: num('target', 'dB', '-60'),
      basis: values.basis === undefined || values.basis === '' ? undefined : values.basis as AbsorberBasis,
      longFactor: num('long-run', 'windows', '10'),
      cells: list('cells', 'cells', '4, 8, 12'),
      gradingCells: list('grading-cells', 'cells', '8'),
      orders: list('orders', 'orders', '2, 3, 4'),
      sigmaScales: list('sigma-scales', 'multiples of σopt', '0.5, 1, 2'),
      kappaMaxes: list('kappa-maxes', 'κ values', '1, 5, 10'),
      alphaMaxes: list('alpha-maxes', 'S/m', '0, 0.05'),
    };
    for (const key of Object.keys(options) as (keyof AbsorberStudyOptions)[]) if (options[key] === undefined) delete options[key];
    if (problems.length === 0) problems.push(...absorberOptionProblems(options));
    return problems.length ? { problems } : { options, problems };
  },
  plan: planAbsorberStudy,
  checkShared(_plan, shared) {
    if (!shared.every((r) => (r as ProbeSeriesResult).finite)) throw new Error('a reference run became infinite or NaN; check grid.courant');
  },
  evaluate: (plan, c, [run, long], [reference, longReference]) => evaluateCandidate(
    c, plan.probes, run as ProbeSeriesResult, (reference as ProbeSeriesResult).series,
    long && longReference ? { run: long as ProbeSeriesResult, reference: (longReference as ProbeSeriesResult).series } : undefined,
  ),
  failed: (_plan, c, error) => ({ ...baseRow(c, NaN), ...EMPTY, error }),
  compare: compareAbsorbers,
  pick: (plan, rows) => recommendAbsorber(rows, plan.target_dB, basisFigure(plan.basis)),
  finish: (plan, candidates, info) => ({
    target_dB: plan.target_dB,
    basis: plan.basis,
    longSteps: plan.longSteps,
    steps: plan.steps,
    dt_s: plan.dt_s,
    probes: plan.probes,
    reference: { nx: plan.reference.grid.nx, ny: plan.reference.grid.ny, seconds: info.shared[0]?.seconds ?? NaN },
    candidates,
    recommended: recommendAbsorber(candidates, plan.target_dB, basisFigure(plan.basis)),
    current: candidates.find((r) => r.isCurrent) ?? null,
    planned: info.planned,
    complete: info.complete,
    workers: info.workers,
    seconds: info.seconds,
  }),
  rows: (r) => r.candidates,
  recommended: (r) => r.recommended,
  columns: [
    { label: 'cells', value: (c) => String(c.cells) },
    { label: 'm', value: (c) => String(c.order) },
    { label: 'sigmaScale', value: (c) => String(c.sigmaScale) },
    { label: 'kappaMax', value: (c) => String(c.kappaMax) },
    { label: 'alphaMax', value: (c) => String(c.alphaMax) },
    { label: 'reflection', value: (c) => dB(c.reflection_dB) },
    { label: 'worst case', value: (c) => dB(c.reflection_worst_dB) },
    { label: 'theory', value: (c) => dB(c.theory_dB) },
    { label: 'worst probe', value: (c) => c.worst_probe || '—', text: true },
    { label: 'memory', value: (c) => formatBytes(c.memory_bytes) },
    { label: 'time', value: (c) => (Number.isFinite(c.seconds) ? `${c.seconds.toFixed(2)} s` : '—') },
  ],
  rowNotes: (r, c) => [c === r.recommended ? 'recommended' : '', c.isCurrent ? 'current' : '', c.error ?? ''].filter(Boolean),
  heading: (r) => [
    `absorber study: ${r.candidates.length} of ${r.planned} candidates, ${r.steps} steps each; reference grid ${r.reference.nx} × ${r.reference.ny}`,
    `probes: ${r.probes.map((p) => p.name).join(', ')}${r.probes.some((p) => p.added) ? ' (placed by the study: the scenario has none)' : ''}`,
    'reflection = worst probe of max|E − Eref| / max|Eref|; theory = exp(−2σmax·d/((m+1)εc)) of the continuous profile',
    `worst case = the same over probes one cell inside the layer on every side and corner${r.longSteps > 0 ? `, and over ${r.longSteps} steps against a thick layer` : ''}; recommended on ${r.basis === 'worst-case' ? 'the worst case' : 'your probes'} (--basis)`,
  ],
  verdict(r) {
    const lines: string[] = [];
    if (!r.complete) {
      lines.push(r.candidates.length === 0
        ? 'interrupted before any candidate could be scored (the reference run had not finished)'
        : `interrupted: ${r.candidates.length} of ${r.planned} candidates finished; the recommendation is among those`);
    }
    if (r.recommended) {
      const figure = basisFigure(r.basis)(r.recommended);
      lines.push(`recommended: ${gradingText(r.recommended)}: ${dB(figure)} ${r.basis === 'worst-case' ? 'worst case' : 'at your probes'} ` +
        `(target ${r.target_dB} dB, margin ${(r.target_dB - figure).toFixed(1)} dB), ${formatBytes(r.recommended.memory_bytes)}` +
        (r.basis === 'worst-case' ? `; at your probes ${dB(r.recommended.reflection_dB)}` : `; worst case ${dB(r.recommended.reflection_worst_dB)}`));
    } else if (r.candidates.length > 0) {
      lines.push(`no candidate meets the target ${r.target_dB} dB: recommended is null; try more cells or a less strict target`);
    }
    if (r.current) lines.push(`current:     ${gradingText(r.current)}: ${dB(r.current.reflection_dB)} at your probes, ${dB(r.current.reflection_worst_dB)} worst case`);
    return lines;
  },
  noneMeets: (r) => `no candidate meets the target ${r.target_dB} dB: recommended is null`,
  outputs: absorberOutputs,
  json: absorberJsonObject,
  jobFiles(plan) {
    const name = (a: AbsorberGrading & { cells: number }) =>
      `absorber-${fileSafe(a.cells)}-m${fileSafe(a.order)}-s${fileSafe(a.sigmaScale)}-k${fileSafe(a.kappaMax)}-a${fileSafe(a.alphaMax)}`;
    return {
      shared: ['reference.json', 'reference-long.json'].slice(0, plan.shared.length),
      candidates: plan.candidates.map((c) => [`${name(c.absorber)}.json`, `${name(c.absorber)}-long.json`].slice(0, c.jobs.length)),
    };
  },
  manifest(plan) {
    return {
      study: 'absorber',
      target_dB: plan.target_dB,
      basis: plan.basis,
      reference: 'reference.json',
      scoring: 'for each candidate and each probe: max_n |E[n] - Eref[n]| / max_n |Eref[n]| with Eref from reference.json; the candidate\'s figure is the largest over probes, 20*log10',
      candidates: plan.candidates.map((c) => {
        const a = c.absorber;
        const file = `absorber-${fileSafe(a.cells)}-m${fileSafe(a.order)}-s${fileSafe(a.sigmaScale)}-k${fileSafe(a.kappaMax)}-a${fileSafe(a.alphaMax)}.json`;
        return { file, ...a, current: c.isCurrent, theory_dB: c.theory_dB, memory_bytes: c.memory_bytes };
      }),
    };
  },
  emitted: (plan) => `${plan.shared.length === 2 ? 'reference.json, reference-long.json' : 'reference.json'}, ${plan.candidates.length} candidates (${plan.candidates[0]?.jobs.length ?? 1} run${plan.candidates[0]?.jobs.length === 1 ? '' : 's'} each) and study.json`,
  apply: (scenario, _plan, pick) => applyAbsorber(scenario, absorberOf(pick)),
  charts: absorberCharts,
  sharedRuns: 'the reference grid',
  pageNote: 'Each candidate keeps your interior, source and probes and changes only the layer around them. Reflection is measured against one run on a grid so large that nothing returns within your steps.',
  rowData: (c) => ({ key: c.key, cells: String(c.cells) }),
};

/** Runs a planned absorber study on a pool (see run-study.ts). Rejects if the reference run fails. */
export function runAbsorberStudy(plan: AbsorberStudyPlan, pool: StudyPool, callbacks: StudyCallbacks<AbsorberCandidateResult> = {}): Promise<AbsorberStudyResult> {
  return runStudy(absorberStudy, plan, pool, callbacks);
}

export { absorberKey };
