/**
 * Convergence study for any scenario (README "Convergence study"): the scenario run on 2–5
 * grids, each `ratio` times finer than the last, with every physical quantity held (positions,
 * object sizes, the absorber's thickness, the simulated time, the Courant number). At every
 * probe and analysis frequency the magnitude (dB) and phase (degrees) of the field-over-source
 * transfer function are compared across grids by Richardson extrapolation and the Grid
 * Convergence Index (Roache 1998; ASME V&V 20-2009; Celik et al., J. Fluids Eng. 130, 078001,
 * 2008; src/compare/gci.ts). Where an exact reference exists, the true error stands beside it.
 */
import { exactReference } from '../compare/reference.ts';
import { gridConvergenceIndex, type ConvergenceKind } from '../compare/gci.ts';
import { wrapDegrees } from '../exact/angles.ts';
import { scenarioMemoryBytes } from '../scenario/derived.ts';
import { layoutOf, snapIndex } from '../scenario/layout.ts';
import { MEMORY_CAP_BYTES } from '../scenario/memory.ts';
import type { Scenario } from '../scenario/types.ts';
import { formatBytes, formatSI, formatSig } from '../scenario/units.ts';
import { type StudyChart, type StudyDefinition, optionReaders } from './definition.ts';
import { transferAt, type SpectraJob, type SpectraResult } from './jobs.ts';

export interface ConvergenceOptions { levels?: number; ratio?: number; budget_dB?: number; budget_deg?: number }

export const CONVERGENCE_DEFAULTS = { levels: 3, ratio: 2, budget_dB: 0.1, budget_deg: 1 } as const;
/** An observed order within this of the scheme's formal order 2 counts as the asymptotic range (common practice, no source). */
export const ORDER_TOLERANCE = 0.5;
/** Node updates per second assumed for the time estimate before running (about this engine's speed on one core). */
const NOMINAL_CELLS_PER_SECOND = 1e9;

export interface LevelPlan {
  key: string;
  jobs: SpectraJob[];
  /** 0 is the user's grid; each level is `ratio` times finer than the one before. */
  level: number;
  factor: number;
  dx_m: number;
  dy_m: number;
  nx: number;
  ny: number;
  steps: number;
  memory_bytes: number;
  /** Before running: nx·ny·steps at NOMINAL_CELLS_PER_SECOND. */
  estimated_seconds: number;
  scenario: Scenario;
}

export interface ConvergencePlan {
  shared: SpectraJob[];
  candidates: LevelPlan[];
  levels: number;
  ratio: number;
  budget_dB: number;
  budget_deg: number;
  probes: string[];
  frequencies: number[];
  exact: 'hankel' | 'cylinder-series' | 'none';
  polarization: 'TMz' | 'TEz';
}

/** One probe at one frequency on one level. */
export interface LevelValue {
  probe: string;
  f_Hz: number;
  mag_dB: number;
  phase_deg: number;
  true_mag_err_dB: number;
  true_phase_err_deg: number;
  /** Filled by `finish`: GCI of this level, |value − extrapolated|·Fs, dB and degrees. */
  gci_mag_dB: number;
  gci_phase_deg: number;
  p_mag: number;
  p_phase: number;
  kind_mag: ConvergenceKind;
  kind_phase: ConvergenceKind;
}

export interface LevelResult {
  level: number;
  dx_m: number;
  dy_m: number;
  nx: number;
  ny: number;
  steps: number;
  memory_bytes: number;
  seconds: number;
  values: LevelValue[];
  /** Worst over probes and frequencies, after `finish`. */
  worst_gci_mag_dB: number;
  worst_gci_phase_deg: number;
  worst_true_mag_err_dB: number;
  worst_true_phase_err_deg: number;
  error?: string;
}

export interface ConvergenceResult {
  plan: ConvergencePlan;
  candidates: LevelResult[];
  /** The coarsest level whose GCI meets both budgets everywhere; null when none does or the data are outside the asymptotic range. */
  recommended: LevelResult | null;
  /** Why there is no recommendation, or what limits it (empty when all is well). */
  caveats: string[];
  /** With an exact reference: rows whose finest-grid GCI bounds the true error, of all rows (magnitude and phase). */
  gciBoundsTrueError: { bounded: number; rows: number } | null;
  planned: number;
  complete: boolean;
  workers: number[];
  seconds: number;
}

const whole = (x: number) => Math.abs(x - Math.round(x)) < 1e-9 * Math.max(1, Math.abs(x));

/**
 * The scenario on a grid `factor` times finer, holding every physical quantity; throws a
 * RangeError naming what cannot be held (a non-integer ratio that moves a node).
 */
export function refineScenario(s: Scenario, factor: number, level: number): Scenario {
  const problem = (what: string) => new RangeError(`level ${level} (${formatSig(factor, 4)} × finer): ${what}; use a whole-number ratio such as 2`);
  const L = s.absorber.cells;
  for (const [name, count] of [['grid.nx − 1', s.grid.nx - 1], ['grid.ny − 1', s.grid.ny - 1], ['absorber.cells', L], ['steps', s.steps]] as const) {
    if (!whole(count * factor)) throw problem(`${name} = ${count} times ${formatSig(factor, 4)} is not a whole number, so the grid would not end (or the run would not stop) at the same place`);
  }
  const { dx, dy } = s.grid;
  const node = (x: number, d: number, what: string) => {
    const i = snapIndex(x, d);
    if (!whole(i * factor)) throw problem(`${what} sits on node ${i}, which is not a node of the finer grid (${i} × ${formatSig(factor, 4)})`);
    return i * d;
  };
  return {
    ...s,
    grid: { ...s.grid, nx: Math.round((s.grid.nx - 1) * factor) + 1, ny: Math.round((s.grid.ny - 1) * factor) + 1, dx: dx / factor, dy: dy / factor },
    absorber: { ...s.absorber, cells: Math.round(L * factor) },
    source: { ...s.source, x: node(s.source.x, dx, 'the source'), y: node(s.source.y, dy, 'the source') },
    probes: s.probes.map((p, k) => ({ ...p, x: node(p.x, dx, `probes[${k}]`), y: node(p.y, dy, `probes[${k}]`) })),
    // the study reads probes only; lines would only cost memory on the fine grids
    lines: [],
    steps: Math.round(s.steps * factor),
  };
}

export function planConvergenceStudy(s: Scenario, o: ConvergenceOptions = {}): ConvergencePlan {
  const levels = o.levels ?? CONVERGENCE_DEFAULTS.levels;
  const ratio = o.ratio ?? CONVERGENCE_DEFAULTS.ratio;
  const problems = convergenceOptionProblems(o);
  if (problems.length) throw new RangeError(problems.join('; '));
  if (s.probes.length === 0) throw new RangeError('probes: the convergence study compares the field at probes; add at least one probe');
  if (s.frequencies.length === 0) throw new RangeError('frequencies: the convergence study compares spectra; add at least one analysis frequency');
  const candidates = Array.from({ length: levels }, (_, level): LevelPlan => {
    const factor = ratio ** level;
    const scenario = level === 0 ? { ...s, lines: [] } : refineScenario(s, factor, level);
    const memory = scenarioMemoryBytes(scenario);
    if (memory > MEMORY_CAP_BYTES) {
      throw new RangeError(`level ${level} (${scenario.grid.nx} × ${scenario.grid.ny}, ${scenario.steps} steps) would need ${formatBytes(memory)}, above the ${formatBytes(MEMORY_CAP_BYTES)} cap; use fewer levels (--levels ${level}) or a smaller ratio`);
    }
    const { nx, ny, dx, dy } = scenario.grid;
    return {
      key: `level-${level}`, jobs: [{ kind: 'spectra', scenario }], level, factor, dx_m: dx, dy_m: dy, nx, ny,
      steps: scenario.steps, memory_bytes: memory, estimated_seconds: (nx * ny * scenario.steps) / NOMINAL_CELLS_PER_SECOND, scenario,
    };
  });
  return {
    shared: [], candidates, levels, ratio,
    budget_dB: o.budget_dB ?? CONVERGENCE_DEFAULTS.budget_dB, budget_deg: o.budget_deg ?? CONVERGENCE_DEFAULTS.budget_deg,
    probes: s.probes.map((p) => p.name), frequencies: s.frequencies.slice(), exact: exactReference(s).kind, polarization: s.polarization ?? 'TMz',
  };
}

export function convergenceOptionProblems(o: ConvergenceOptions): string[] {
  const problems: string[] = [];
  if (o.levels !== undefined && !(Number.isInteger(o.levels) && o.levels >= 2 && o.levels <= 5)) problems.push(`levels: ${o.levels} is not a whole number of grids from 2 to 5; use e.g. 3`);
  if (o.ratio !== undefined && !(Number.isFinite(o.ratio) && o.ratio > 1 && o.ratio <= 4)) problems.push(`ratio: ${o.ratio} is not a refinement ratio above 1 and at most 4; use e.g. 2`);
  if (o.budget_dB !== undefined && !(o.budget_dB > 0)) problems.push(`budget-db: ${o.budget_dB} is not a positive number of dB; use e.g. 0.1`);
  if (o.budget_deg !== undefined && !(o.budget_deg > 0)) problems.push(`budget-deg: ${o.budget_deg} is not a positive number of degrees; use e.g. 1`);
  return problems;
}

/** Magnitude and phase of the run's transfer function at every probe and frequency, with the true error where an exact reference exists. */
function evaluateLevel(plan: ConvergencePlan, c: LevelPlan, run: SpectraResult): LevelResult {
  const layout = layoutOf(c.scenario);
  const exact = exactReference(c.scenario);
  const values: LevelValue[] = [];
  plan.frequencies.forEach((f, k) => {
    const reference = exact.transfer(f, layout.probes);
    layout.probes.forEach((p, q) => {
      const [re, im] = transferAt(run, k, q);
      const mag = 20 * Math.log10(Math.hypot(re, im));
      const phase = (Math.atan2(im, re) * 180) / Math.PI;
      const [xr, xi] = reference[q];
      values.push({
        probe: p.name, f_Hz: f, mag_dB: mag, phase_deg: phase,
        true_mag_err_dB: mag - 20 * Math.log10(Math.hypot(xr, xi)),
        true_phase_err_deg: wrapDegrees(phase - (Math.atan2(xi, xr) * 180) / Math.PI),
        gci_mag_dB: NaN, gci_phase_deg: NaN, p_mag: NaN, p_phase: NaN, kind_mag: 'unknown', kind_phase: 'unknown',
      });
    });
  });
  return {
    level: c.level, dx_m: c.dx_m, dy_m: c.dy_m, nx: c.nx, ny: c.ny, steps: c.steps, memory_bytes: c.memory_bytes, seconds: run.seconds,
    values, worst_gci_mag_dB: NaN, worst_gci_phase_deg: NaN, worst_true_mag_err_dB: NaN, worst_true_phase_err_deg: NaN,
  };
}

const maxAbs = (xs: number[]) => xs.reduce((m, x) => (Math.abs(x) > m || Number.isNaN(x) ? (Number.isNaN(x) ? NaN : Math.abs(x)) : m), 0);

/** Richardson/GCI across levels for every probe and frequency; fills each level's GCI and worst figures. */
function finishConvergence(plan: ConvergencePlan, levels: LevelResult[], info: { planned: number; complete: boolean; workers: number[]; seconds: number }): ConvergenceResult {
  const ok = levels.filter((l) => !l.error).sort((a, b) => b.level - a.level); // finest first
  const caveats: string[] = [];
  let bounded = 0;
  let rows = 0;
  if (ok.length >= 2) {
    const count = ok[0].values.length;
    for (let q = 0; q < count; q++) {
      const sizes = ok.map((l) => l.dx_m);
      const mags = ok.map((l) => l.values[q].mag_dB);
      // phase unwrapped level by level towards the finest grid's value
      const phases = ok.map((l) => l.values[q].phase_deg);
      for (let k = 1; k < phases.length; k++) phases[k] = phases[0] + wrapDegrees(phases[k] - phases[0]);
      const gm = gridConvergenceIndex(mags, sizes);
      const gp = gridConvergenceIndex(phases, sizes);
      ok.forEach((l, k) => {
        const v = l.values[q];
        v.gci_mag_dB = gm.safetyFactor * Math.abs(mags[k] - gm.extrapolated);
        v.gci_phase_deg = gp.safetyFactor * Math.abs(phases[k] - gp.extrapolated);
        v.p_mag = gm.order; v.p_phase = gp.order; v.kind_mag = gm.kind; v.kind_phase = gp.kind;
      });
      const v = ok[0].values[q];
      const where = `${v.probe} at ${formatSI(v.f_Hz, 'Hz')}`;
      if (ok.length >= 3) {
        for (const [name, g] of [['magnitude', gm], ['phase', gp]] as const) {
          if (g.kind !== 'monotone' || !(Math.abs(g.order - 2) <= ORDER_TOLERANCE)) {
            caveats.push(`${where}, ${name}: ${g.kind === 'monotone' ? `observed order ${formatSig(g.order, 3)}, far from 2` : `${g.kind} convergence${g.reason ? ` (${g.reason})` : ''}`}: not in the asymptotic range, so its GCI is not a reliable bound`);
          }
        }
      }
      if (plan.exact !== 'none') {
        rows += 2;
        if (Math.abs(v.true_mag_err_dB) <= v.gci_mag_dB) bounded++;
        if (Math.abs(v.true_phase_err_deg) <= v.gci_phase_deg) bounded++;
      }
    }
    if (ok.length === 2) caveats.push('two levels: the order is assumed (2), not observed, and the safety factor is 3; use --levels 3 to observe it');
  } else {
    caveats.push('fewer than two levels finished: no convergence figures');
  }
  for (const l of levels) {
    l.worst_gci_mag_dB = maxAbs(l.values.map((v) => v.gci_mag_dB));
    l.worst_gci_phase_deg = maxAbs(l.values.map((v) => v.gci_phase_deg));
    l.worst_true_mag_err_dB = maxAbs(l.values.map((v) => v.true_mag_err_dB));
    l.worst_true_phase_err_deg = maxAbs(l.values.map((v) => v.true_phase_err_deg));
  }
  const candidates = levels.slice().sort((a, b) => a.level - b.level);
  const meets = (l: LevelResult) => l.worst_gci_mag_dB <= plan.budget_dB && l.worst_gci_phase_deg <= plan.budget_deg;
  const coarsest = candidates.find((l) => !l.error && meets(l)) ?? null;
  const trusted = caveats.length === 0 || (ok.length === 2 && caveats.length === 1);
  if (coarsest && !trusted) caveats.push(`level ${coarsest.level} would meet the budgets, but not every quantity is in the asymptotic range: no level is recommended`);
  return {
    plan, candidates, recommended: trusted ? coarsest : null, caveats,
    gciBoundsTrueError: plan.exact === 'none' ? null : { bounded, rows }, ...info,
  };
}

const deg = (x: number) => `${formatSig(x, 3)}°`, dB = (x: number) => `${formatSig(x, 3)} dB`;

function convergenceCharts(plan: ConvergencePlan, rows: readonly LevelResult[], result: ConvergenceResult | undefined): StudyChart[] {
  const done = (result?.candidates ?? rows).filter((l) => Number.isFinite(l.worst_gci_phase_deg) && l.worst_gci_phase_deg > 0);
  if (done.length < 2) return [];
  const x = done.map((l) => l.dx_m);
  const finest = done.reduce((a, b) => (a.dx_m < b.dx_m ? a : b));
  const guide = (y0: number) => x.map((dx) => y0 * (dx / finest.dx_m) ** 2);
  const chart = (id: string, title: string, unit: string, gci: (l: LevelResult) => number, truth: (l: LevelResult) => number): StudyChart => ({
    id, title, x: { label: 'cell size dx', unit: 'm', log: true }, y: { label: `${title} (${unit})`, log: true },
    series: [
      { label: 'GCI (worst)', x, y: done.map(gci), style: 'points', colour: 'fdtd' },
      ...(plan.exact !== 'none' ? [{ label: 'true error (worst)', x, y: done.map(truth), style: 'points' as const, colour: 'exact' as const }] : []),
      { label: 'slope 2', x, y: guide(gci(finest)), style: 'dashed', colour: 'predicted' },
    ],
  });
  return [
    chart('phase', 'phase uncertainty', '°', (l) => l.worst_gci_phase_deg, (l) => l.worst_true_phase_err_deg),
    chart('magnitude', 'magnitude uncertainty', 'dB', (l) => l.worst_gci_mag_dB, (l) => l.worst_true_mag_err_dB),
  ];
}

export const CONVERGENCE_CSV_HEADER = [
  'probe', 'f_Hz', 'level', 'dx_m', 'mag_dB', 'phase_deg', 'p_mag', 'p_phase', 'gci_mag_dB', 'gci_phase_deg', 'true_mag_err_dB', 'true_phase_err_deg',
  'kind_mag', 'kind_phase',
] as const;

export const convergenceStudy: StudyDefinition<ConvergenceOptions, LevelPlan, ConvergencePlan, LevelResult, ConvergenceResult> = {
  id: 'convergence',
  title: 'Convergence',
  verb: 'convergence-study',
  summary: 'Run the scenario on 2-5 grids, each RATIO times finer, holding every physical quantity; report the observed order, the extrapolated value and the Grid Convergence Index of magnitude and phase at every probe and frequency; recommend the coarsest grid whose GCI meets the budgets.',
  options: [
    { name: 'levels', label: 'Grids', help: 'number of grids, 2 to 5 (3 observes the order)', defaultText: String(CONVERGENCE_DEFAULTS.levels) },
    { name: 'ratio', label: 'Refinement ratio', help: 'each grid this many times finer than the last', defaultText: String(CONVERGENCE_DEFAULTS.ratio) },
    { name: 'budget-db', label: 'Magnitude budget (dB)', help: 'GCI of the magnitude allowed, dB', defaultText: String(CONVERGENCE_DEFAULTS.budget_dB), metavar: 'DB' },
    { name: 'budget-deg', label: 'Phase budget (degrees)', help: 'GCI of the phase allowed, degrees', defaultText: String(CONVERGENCE_DEFAULTS.budget_deg), metavar: 'DEGREES' },
  ],
  readOptions(values) {
    const problems: string[] = [];
    const { num } = optionReaders(values, problems);
    const options: ConvergenceOptions = { levels: num('levels', 'grids', '3'), ratio: num('ratio', 'times finer', '2'), budget_dB: num('budget-db', 'dB', '0.1'), budget_deg: num('budget-deg', 'degrees', '1') };
    if (problems.length === 0) problems.push(...convergenceOptionProblems(options));
    return problems.length ? { problems } : { options, problems };
  },
  plan: planConvergenceStudy,
  evaluate: (plan, c, [run]) => evaluateLevel(plan, c, run as SpectraResult),
  failed: (_plan, c, error) => ({
    level: c.level, dx_m: c.dx_m, dy_m: c.dy_m, nx: c.nx, ny: c.ny, steps: c.steps, memory_bytes: c.memory_bytes, seconds: NaN, values: [],
    worst_gci_mag_dB: NaN, worst_gci_phase_deg: NaN, worst_true_mag_err_dB: NaN, worst_true_phase_err_deg: NaN, error,
  }),
  compare: (a, b) => a.level - b.level,
  pick: () => null, // a level's GCI needs every level: known only at the end
  finish: finishConvergence,
  rows: (r) => r.candidates,
  recommended: (r) => r.recommended,
  columns: [
    { label: 'level', value: (l) => String(l.level) },
    { label: 'dx', value: (l) => formatSI(l.dx_m, 'm') },
    { label: 'grid', value: (l) => `${l.nx} × ${l.ny}` },
    { label: 'steps', value: (l) => String(l.steps) },
    { label: 'memory', value: (l) => formatBytes(l.memory_bytes) },
    { label: 'time', value: (l) => (Number.isFinite(l.seconds) ? `${l.seconds.toFixed(2)} s` : '—') },
    { label: 'GCI |dB|', value: (l) => dB(l.worst_gci_mag_dB) },
    { label: 'GCI °', value: (l) => deg(l.worst_gci_phase_deg) },
    { label: 'true |dB|', value: (l) => dB(l.worst_true_mag_err_dB) },
    { label: 'true °', value: (l) => deg(l.worst_true_phase_err_deg) },
  ],
  rowNotes: (r, l) => [l === r.recommended ? 'recommended' : '', l.level === 0 ? 'your grid' : '', l.error ?? ''].filter(Boolean),
  heading: (r) => [
    `convergence study: ${r.plan.levels} grids, each ${r.plan.ratio} × finer; ${r.plan.probes.length} probes × ${r.plan.frequencies.length} frequencies; exact reference: ${r.plan.exact}`,
    'GCI = Fs·|value − extrapolated| of magnitude (dB) and phase (°), worst over probes and frequencies (Fs 1.25 with 3+ grids, 3 with 2)',
  ],
  verdict(r) {
    const lines: string[] = [];
    if (r.recommended) {
      lines.push(`recommended: level ${r.recommended.level} (dx = ${formatSI(r.recommended.dx_m, 'm')}): GCI ${dB(r.recommended.worst_gci_mag_dB)}, ${deg(r.recommended.worst_gci_phase_deg)} ` +
        `(budgets ${r.plan.budget_dB} dB, ${r.plan.budget_deg}°)`);
    } else {
      lines.push(`no level is recommended (budgets ${r.plan.budget_dB} dB, ${r.plan.budget_deg}°)`);
    }
    for (const c of r.caveats.slice(0, 12)) lines.push(`note: ${c}`);
    if (r.caveats.length > 12) lines.push(`note: ${r.caveats.length - 12} more in convergence.json`);
    if (r.gciBoundsTrueError) lines.push(`the finest grid's GCI bounds the true error in ${r.gciBoundsTrueError.bounded} of ${r.gciBoundsTrueError.rows} quantities`);
    return lines;
  },
  noneMeets: (r) => `no level is recommended: ${r.caveats[0] ?? `no level meets ${r.plan.budget_dB} dB and ${r.plan.budget_deg}°`}`,
  outputs: (r) => [
    {
      name: 'convergence.csv', kind: 'csv', header: CONVERGENCE_CSV_HEADER,
      rows: r.candidates.flatMap((l) => l.values.map((v) => [
        v.probe, v.f_Hz, l.level, l.dx_m, v.mag_dB, v.phase_deg, v.p_mag, v.p_phase, v.gci_mag_dB, v.gci_phase_deg, v.true_mag_err_dB, v.true_phase_err_deg,
        v.kind_mag, v.kind_phase,
      ])),
    },
    { name: 'convergence.json', kind: 'json', value: convergenceJson(r) },
  ],
  json: convergenceJson,
  jobFiles: (plan) => ({ shared: [], candidates: plan.candidates.map((c) => [`level-${c.level}.json`]) }),
  manifest: (plan) => ({
    study: 'convergence', levels: plan.levels, ratio: plan.ratio, budget_dB: plan.budget_dB, budget_deg: plan.budget_deg,
    scoring: 'run each level; from spectra.csv take fdtd_re, fdtd_im at every probe and frequency; magnitude and phase across levels give the observed order, the extrapolated value and the GCI',
    candidates: plan.candidates.map((c) => ({ file: `level-${c.level}.json`, level: c.level, dx_m: c.dx_m, memory_bytes: c.memory_bytes })),
  }),
  emitted: (plan) => `${plan.candidates.length} level scenarios and study.json`,
  preview: (plan) => plan.candidates.map((c) => `level ${c.level}: ${c.nx} × ${c.ny} nodes, ${c.steps} steps, ${formatBytes(c.memory_bytes)}, about ${formatSig(c.estimated_seconds, 2)} s at 1000 Mcells/s`),
  charts: convergenceCharts,
  pageNote: 'Each grid is finer by the ratio; positions, object sizes, the absorber\'s thickness, the simulated time and the Courant number are held. GCI is the Richardson-based uncertainty; with an exact reference the true error stands beside it.',
  rowData: (l) => ({ key: `level-${l.level}`, cells: String(l.level) }),
};

function convergenceJson(r: ConvergenceResult) {
  return {
    levels: r.plan.levels,
    ratio: r.plan.ratio,
    budget_dB: r.plan.budget_dB,
    budget_deg: r.plan.budget_deg,
    exact: r.plan.exact,
    polarization: r.plan.polarization,
    recommended: r.recommended && { level: r.recommended.level, dx_m: r.recommended.dx_m, gci_mag_dB: r.recommended.worst_gci_mag_dB, gci_phase_deg: r.recommended.worst_gci_phase_deg },
    caveats: r.caveats,
    gci_bounds_true_error: r.gciBoundsTrueError,
    candidates: r.candidates.map((l) => ({
      level: l.level, dx_m: l.dx_m, dy_m: l.dy_m, nx: l.nx, ny: l.ny, steps: l.steps, memory_bytes: l.memory_bytes, seconds: l.seconds,
      worst_gci_mag_dB: l.worst_gci_mag_dB, worst_gci_phase_deg: l.worst_gci_phase_deg,
      worst_true_mag_err_dB: l.worst_true_mag_err_dB, worst_true_phase_err_deg: l.worst_true_phase_err_deg,
      values: l.values, ...(l.error ? { error: l.error } : {}),
    })),
    planned: r.planned,
    complete: r.complete,
    workers: r.workers.length,
    study_seconds: r.seconds,
  };
}
