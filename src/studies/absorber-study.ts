/**
 * Absorber study: how thick a CPML, graded how, must be added around the user's region to
 * keep boundary reflection below a target. Every candidate keeps the user's interior and
 * the places of source and probes in it; only the layer around it changes, so the grid
 * grows or shrinks by the change in layer cells. Reflection is measured by the
 * reference-grid method (Taflove & Hagness, Computational Electrodynamics, ch. 7): one run
 * on a grid so large that nothing comes back to the probes within the window serves as
 * the reference for all candidates; a candidate's figure is max over probes of
 * max_n |E − Eref| / max_n |Eref|, in dB.
 */
import { MEMORY_CAP_BYTES } from '../engine/memory.ts';
import { scenarioMemoryBytes } from '../scenario/derived.ts';
import { layoutOf } from '../scenario/layout.ts';
import type { Absorber, Probe, Scenario } from '../scenario/types.ts';
import { theoreticalReflectionDb } from './cpml-theory.ts';
import { jobCellUpdates, type ProbeSeriesResult } from './jobs.ts';
import { StudyCancelled, type StudyPool } from './pool.ts';
import { ProgressTracker, type StudyProgress } from './progress.ts';
import { padScenario, referenceScenario, reflectionErrorDb, reflectionErrorSeries } from './reflection.ts';

/** The grading of a layer: everything in {@link Absorber} but its thickness. */
export type AbsorberGrading = Omit<Absorber, 'cells'>;

/** The grading swept over thickness by default: cubic, σmax = σopt, with κ and α (a CFS layer). */
export const DEFAULT_GRADING: AbsorberGrading = { order: 3, sigmaScale: 1, kappaMax: 5, alphaMax: 0.05 };
/** The same layer without κ and α, swept too so the chart shows what κ and α buy. */
export const PLAIN_GRADING: AbsorberGrading = { order: 3, sigmaScale: 1, kappaMax: 1, alphaMax: 0 };

export interface AbsorberStudyOptions {
  /** Largest acceptable reflection error, dB (default −60). */
  target_dB?: number;
  /** Layer thicknesses swept with each of `sweepGradings` (default 4, 6, 8, 10, 12, 16, 20, 24). */
  cells?: number[];
  /** Gradings swept over `cells` (default: DEFAULT_GRADING, PLAIN_GRADING and the user's own). */
  sweepGradings?: AbsorberGrading[];
  /** Thicknesses at which the two sub-grids below run (default 8). */
  gradingCells?: number[];
  /** Orders m of the m × sigmaScale sub-grid, at DEFAULT_GRADING's κmax and αmax (default 2..5). */
  orders?: number[];
  /** sigmaScale values of that sub-grid (default 0.25, 0.5, 1, 1.5, 2). */
  sigmaScales?: number[];
  /** κmax values of the κmax × αmax sub-grid, at DEFAULT_GRADING's m and sigmaScale (default 1, 5, 10, 15). */
  kappaMaxes?: number[];
  /** αmax values of that sub-grid, S/m (default 0, 0.05, 0.1, 0.2). */
  alphaMaxes?: number[];
  /** Steps per run; at most the scenario's own (default: the scenario's). */
  steps?: number;
}

export const ABSORBER_DEFAULTS = {
  target_dB: -60,
  cells: [4, 6, 8, 10, 12, 16, 20, 24],
  gradingCells: [8],
  orders: [2, 3, 4, 5],
  sigmaScales: [0.25, 0.5, 1, 1.5, 2],
  kappaMaxes: [1, 5, 10, 15],
  alphaMaxes: [0, 0.05, 0.1, 0.2],
} as const;

/** One probe the study records, in metres on the user's own grid. */
export interface StudyProbe extends Probe {
  /** True when the study placed it (the scenario has no probes of its own). */
  added: boolean;
}

export interface AbsorberCandidatePlan {
  absorber: Absorber;
  /** Stable identity, e.g. "10/3/1/5/0.05". */
  key: string;
  /** The user's own setting. */
  isCurrent: boolean;
  /** What runs: the user's interior, source and study probes inside this layer. */
  scenario: Scenario;
  /** Engine memory the user's own scenario would need with this layer, bytes. */
  memory_bytes: number;
  /** Theoretical normal-incidence reflection of the continuous profile, dB. */
  theory_dB: number;
}

export interface AbsorberStudyPlan {
  target_dB: number;
  steps: number;
  dt_s: number;
  probes: StudyProbe[];
  current: Absorber;
  reference: Scenario;
  candidates: AbsorberCandidatePlan[];
}

export interface AbsorberCandidateResult extends Absorber {
  key: string;
  isCurrent: boolean;
  /** Worst probe's max_n |E − Eref| / max_n |Eref|, dB; NaN if the run failed. */
  reflection_dB: number;
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

/** "cells/order/sigmaScale/kappaMax/alphaMax". */
export function absorberKey(a: Absorber): string {
  return `${a.cells}/${a.order}/${a.sigmaScale}/${a.kappaMax}/${a.alphaMax}`;
}

/** Problems with study options, as messages naming the option; empty when all is well. */
export function absorberOptionProblems(o: AbsorberStudyOptions): string[] {
  const problems: string[] = [];
  const list = (name: string, values: readonly number[] | undefined, ok: (v: number) => boolean, rule: string) => {
    if (values === undefined) return;
    if (values.length === 0) problems.push(`${name}: give at least one value`);
    for (const v of values) if (!Number.isFinite(v) || !ok(v)) problems.push(`${name}: ${v} is not ${rule}`);
  };
  if (o.target_dB !== undefined && !(Number.isFinite(o.target_dB) && o.target_dB < 0)) {
    problems.push(`target: ${o.target_dB} dB is not a negative number of dB, e.g. -60`);
  }
  const wholeCells = (v: number) => Number.isInteger(v) && v >= 1 && v <= 200;
  list('cells', o.cells, wholeCells, 'a whole number of cells from 1 to 200');
  list('gradingCells', o.gradingCells, wholeCells, 'a whole number of cells from 1 to 200');
  list('orders', o.orders, (v) => v >= 1 && v <= 10, 'an order from 1 to 10');
  list('sigmaScales', o.sigmaScales, (v) => v >= 0, 'zero or more');
  list('kappaMaxes', o.kappaMaxes, (v) => v >= 1, '1 or more');
  list('alphaMaxes', o.alphaMaxes, (v) => v >= 0, 'zero or more');
  if (o.steps !== undefined && !(Number.isInteger(o.steps) && o.steps >= 1)) problems.push(`steps: ${o.steps} is not a whole number of steps ≥ 1`);
  return problems;
}

/**
 * The user's scenario with another absorber: the grid grows (or shrinks) by the change in
 * layer cells on every side, and source, probes and lines keep their place in the interior.
 * This is what "apply" does with a recommendation.
 */
export function applyAbsorber(s: Scenario, absorber: Absorber): Scenario {
  const grow = absorber.cells - s.absorber.cells;
  return { ...padScenario(s, grow, grow), absorber: { ...absorber } };
}

/**
 * Probes for the study: the scenario's own, or when it has none, one node inside the
 * interior at the middle of each side (level with the source) and at the interior corner
 * farthest from the source, where the wave meets the layers at grazing incidence.
 */
export function studyProbes(s: Scenario): StudyProbe[] {
  if (s.probes.length > 0) return s.probes.map((p) => ({ ...p, added: false }));
  const { nx, ny, dx, dy } = s.grid;
  const L = s.absorber.cells;
  const src = layoutOf(s).source;
  const lo = L + 1;
  const hiX = nx - 2 - L;
  const hiY = ny - 2 - L;
  const at: [string, number, number][] = [
    ['left', lo, src.j], ['right', hiX, src.j], ['bottom', src.i, lo], ['top', src.i, hiY],
    ['corner', src.i - lo > hiX - src.i ? lo : hiX, src.j - lo > hiY - src.j ? lo : hiY],
  ];
  const seen = new Set<string>([`${src.i},${src.j}`]);
  const out: StudyProbe[] = [];
  for (const [name, i, j] of at) {
    const key = `${i},${j}`;
    if (seen.has(key) || i < L || j < L || i > nx - 1 - L || j > ny - 1 - L) continue;
    seen.add(key);
    out.push({ name, x: i * dx, y: j * dy, added: true });
  }
  return out;
}

/** "order/sigmaScale/kappaMax/alphaMax": the identity of a grading whatever its thickness. */
export function gradingKey(g: AbsorberGrading): string {
  return `${g.order}/${g.sigmaScale}/${g.kappaMax}/${g.alphaMax}`;
}

/** Every absorber the options ask for, the user's own included, without repeats. */
export function absorberCandidates(current: Absorber, options: AbsorberStudyOptions = {}): Absorber[] {
  const o = { ...ABSORBER_DEFAULTS, ...options };
  const userGrading: AbsorberGrading = { order: current.order, sigmaScale: current.sigmaScale, kappaMax: current.kappaMax, alphaMax: current.alphaMax };
  const sweeps = options.sweepGradings ?? [DEFAULT_GRADING, PLAIN_GRADING, userGrading];
  const out = new Map<string, Absorber>();
  const add = (a: Absorber) => out.set(absorberKey(a), a);
  add({ ...current });
  const seenGradings = new Set<string>();
  for (const g of sweeps) {
    if (seenGradings.has(gradingKey(g))) continue;
    seenGradings.add(gradingKey(g));
    for (const cells of o.cells) add({ cells, ...g });
  }
  for (const cells of o.gradingCells) {
    for (const order of o.orders) for (const sigmaScale of o.sigmaScales) add({ ...DEFAULT_GRADING, cells, order, sigmaScale });
    for (const kappaMax of o.kappaMaxes) for (const alphaMax of o.alphaMaxes) add({ ...DEFAULT_GRADING, cells, kappaMax, alphaMax });
  }
  return [...out.values()];
}

/**
 * The runs of an absorber study: the reference and one scenario per candidate. Candidate
 * runs drop the scenario's lines and analysis frequencies (not needed for reflection) and
 * use `options.steps` (at most the scenario's steps).
 */
export function planAbsorberStudy(s: Scenario, options: AbsorberStudyOptions = {}): AbsorberStudyPlan {
  const problems = absorberOptionProblems(options);
  if (problems.length > 0) throw new RangeError(problems.join('; '));
  const steps = Math.min(options.steps ?? s.steps, s.steps);
  const probes = studyProbes(s);
  const measured: Scenario = {
    ...s,
    probes: probes.map(({ name, x, y }) => ({ name, x, y })),
    lines: [],
    frequencies: [],
    steps,
  };
  const candidates = absorberCandidates(s.absorber, options).map((absorber): AbsorberCandidatePlan => ({
    absorber,
    key: absorberKey(absorber),
    isCurrent: absorberKey(absorber) === absorberKey(s.absorber),
    scenario: applyAbsorber(measured, absorber),
    memory_bytes: scenarioMemoryBytes(applyAbsorber(s, absorber)),
    theory_dB: theoreticalReflectionDb(absorber, Math.min(s.grid.dx, s.grid.dy), s.medium.epsR),
  }));
  const reference = referenceScenario(measured, steps);
  const referenceBytes = scenarioMemoryBytes(reference);
  if (referenceBytes > MEMORY_CAP_BYTES) {
    throw new RangeError(`steps: the reference grid for ${steps} steps is ${reference.grid.nx} × ${reference.grid.ny} nodes and would need ` +
      `${(referenceBytes / 2 ** 20).toFixed(0)} MiB, above the ${(MEMORY_CAP_BYTES / 2 ** 20).toFixed(0)} MiB cap; study fewer steps`);
  }
  return {
    target_dB: options.target_dB ?? ABSORBER_DEFAULTS.target_dB,
    steps,
    dt_s: layoutOf(s).dt,
    probes,
    current: { ...s.absorber },
    reference,
    candidates,
  };
}

/**
 * The recommendation: among candidates whose reflection is at or below the target, the
 * fewest cells; among those, the lowest reflection (the largest margin). Null if none.
 */
export function recommendAbsorber<T extends Absorber & { reflection_dB: number }>(candidates: readonly T[], target_dB: number): T | null {
  let best: T | null = null;
  for (const c of candidates) {
    if (!(c.reflection_dB <= target_dB)) continue;
    if (!best || c.cells < best.cells || (c.cells === best.cells && c.reflection_dB < best.reflection_dB)) best = c;
  }
  return best;
}

/** Order of the table: cells, order, sigmaScale, kappaMax, alphaMax. */
export function compareAbsorbers(a: Absorber, b: Absorber): number {
  return a.cells - b.cells || a.order - b.order || a.sigmaScale - b.sigmaScale || a.kappaMax - b.kappaMax || a.alphaMax - b.alphaMax;
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

/** Reflection figures of one finished candidate run against the reference series. */
export function evaluateCandidate(
  plan: AbsorberCandidatePlan, probes: readonly StudyProbe[], run: ProbeSeriesResult, reference: Float32Array[],
): AbsorberCandidateResult {
  const base = {
    ...plan.absorber, key: plan.key, isCurrent: plan.isCurrent, theory_dB: plan.theory_dB, memory_bytes: plan.memory_bytes,
    seconds: run.seconds, nx: plan.scenario.grid.nx, ny: plan.scenario.grid.ny,
  };
  if (!run.finite) {
    return { ...base, reflection_dB: NaN, worst_probe: '', per_probe_dB: {}, errorSeries: new Float32Array(0), error: 'the field became infinite or NaN (unstable run)' };
  }
  const { perProbe } = reflectionErrorDb(run.series, reference);
  const worst = worstProbe(perProbe);
  const per_probe_dB: Record<string, number> = {};
  probes.forEach((p, k) => { per_probe_dB[p.name] = perProbe[k]; });
  return {
    ...base,
    reflection_dB: worst.value,
    worst_probe: worst.index >= 0 ? probes[worst.index].name : '',
    per_probe_dB,
    errorSeries: worst.index >= 0 ? Float32Array.from(reflectionErrorSeries(run.series[worst.index], reference[worst.index])) : new Float32Array(0),
    ...(worst.index < 0 ? { error: 'no probe received the pulse within the window; add steps or move probes' } : {}),
  };
}

export interface StudyCallbacks<C> {
  /** Called as each candidate's figure is known (streaming, in finishing order). */
  onCandidate?: (candidate: C) => void;
  onProgress?: (progress: StudyProgress) => void;
  /** Aborting cancels the study; candidates finished so far are kept. */
  signal?: AbortSignal;
}

/**
 * Runs a planned absorber study on a pool: the reference first (the largest job), then
 * the candidates, largest first, all in parallel. Resolves with every finished candidate
 * and the recommendation; when cancelled, with what finished (complete: false). Rejects
 * if the reference run fails.
 */
export async function runAbsorberStudy(
  plan: AbsorberStudyPlan, pool: StudyPool, callbacks: StudyCallbacks<AbsorberCandidateResult> = {},
): Promise<AbsorberStudyResult> {
  const started = performance.now();
  const { signal } = callbacks;
  const order = plan.candidates.map((_, k) => k).sort((a, b) => jobCellUpdates(plan.candidates[b]) - jobCellUpdates(plan.candidates[a]));
  const work = [jobCellUpdates({ scenario: plan.reference }), ...plan.candidates.map((c) => jobCellUpdates(c))];
  const tracker = new ProgressTracker(work, callbacks.onProgress);
  const workers = new Set<number>();
  const results: AbsorberCandidateResult[] = [];
  const waiting: { index: number; run: ProbeSeriesResult }[] = [];
  let reference: Float32Array[] | undefined;
  let referenceSeconds = NaN;
  let cancelled = false;

  const cancel = () => { cancelled = true; pool.cancel(); };
  if (signal?.aborted) cancel();
  signal?.addEventListener('abort', cancel, { once: true });

  const settle = (index: number, run: ProbeSeriesResult) => {
    const r = evaluateCandidate(plan.candidates[index], plan.probes, run, reference as Float32Array[]);
    results.push(r);
    callbacks.onCandidate?.(r);
  };
  const failed = (index: number, e: unknown) => {
    const c = plan.candidates[index];
    const r: AbsorberCandidateResult = {
      ...c.absorber, key: c.key, isCurrent: c.isCurrent, theory_dB: c.theory_dB, memory_bytes: c.memory_bytes,
      seconds: NaN, nx: c.scenario.grid.nx, ny: c.scenario.grid.ny, reflection_dB: NaN, worst_probe: '', per_probe_dB: {},
      errorSeries: new Float32Array(0), error: e instanceof Error ? e.message : String(e),
    };
    results.push(r);
    callbacks.onCandidate?.(r);
  };

  let referenceError: unknown;
  const referenceRun = pool.run({ kind: 'probe-series', scenario: plan.reference }, (d, t) => tracker.step(0, d / t)).then(
    (o) => {
      workers.add(o.worker);
      tracker.finish(0);
      if (!o.result.finite) throw new Error('the reference run became infinite or NaN; check grid.courant');
      reference = o.result.series;
      referenceSeconds = o.result.seconds;
      for (const w of waiting.splice(0)) settle(w.index, w.run);
    },
  ).catch((e: unknown) => {
    referenceError = e;
    if (!(e instanceof StudyCancelled)) cancel();
  });
  const candidateRuns = order.map((index) => pool.run({ kind: 'probe-series', scenario: plan.candidates[index].scenario }, (d, t) => tracker.step(index + 1, d / t)).then(
    (o) => {
      workers.add(o.worker);
      tracker.finish(index + 1);
      if (reference) settle(index, o.result);
      else waiting.push({ index, run: o.result });
    },
    (e: unknown) => {
      if (e instanceof StudyCancelled) return;
      tracker.finish(index + 1);
      failed(index, e);
    },
  ));
  await Promise.all([referenceRun, ...candidateRuns]);
  signal?.removeEventListener('abort', cancel);
  if (referenceError !== undefined && !(referenceError instanceof StudyCancelled)) {
    throw referenceError instanceof Error ? referenceError : new Error(String(referenceError));
  }

  results.sort(compareAbsorbers);
  return {
    target_dB: plan.target_dB,
    steps: plan.steps,
    dt_s: plan.dt_s,
    probes: plan.probes,
    reference: { nx: plan.reference.grid.nx, ny: plan.reference.grid.ny, seconds: referenceSeconds },
    candidates: results,
    recommended: recommendAbsorber(results, plan.target_dB),
    current: results.find((r) => r.isCurrent) ?? null,
    planned: plan.candidates.length,
    complete: !cancelled && results.length === plan.candidates.length,
    workers: [...workers].sort((a, b) => a - b),
    seconds: (performance.now() - started) / 1000,
  };
}
