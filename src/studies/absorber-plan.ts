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
import { MEMORY_CAP_BYTES } from '../scenario/memory.ts';
import { formatBytes } from '../scenario/units.ts';
import { scenarioMemoryBytes } from '../scenario/derived.ts';
import { layoutOf } from '../scenario/layout.ts';
import type { Absorber, Scenario } from '../scenario/types.ts';
import { theoreticalReflectionDb } from './cpml-theory.ts';
import { edgeProbes, type StudyProbe } from './edge-probes.ts';

export type { StudyProbe } from './edge-probes.ts';
import type { ProbeSeriesJob } from './jobs.ts';
import { padScenario, referenceScenario } from './reflection.ts';

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
  /**
   * What the recommendation rests on: "worst-case" (default) the larger of the figure at
   * the user's probes and at probes along the layer's inner face, short and long window;
   * "probes" the user's probes only.
   */
  basis?: AbsorberBasis;
  /** The long window in multiples of the steps (default 10); 0 leaves the long-run check out. */
  longFactor?: number;
}

export type AbsorberBasis = 'worst-case' | 'probes';
export const ABSORBER_BASES: readonly AbsorberBasis[] = ['worst-case', 'probes'];

/** The sweeps of an absorber study when its options leave them out (not the scenario's default layer). */
export const ABSORBER_SWEEP_DEFAULTS = {
  target_dB: -60,
  cells: [4, 6, 8, 10, 12, 16, 20, 24],
  gradingCells: [8],
  orders: [2, 3, 4, 5],
  sigmaScales: [0.25, 0.5, 1, 1.5, 2],
  kappaMaxes: [1, 5, 10, 15],
  alphaMaxes: [0, 0.05, 0.1, 0.2],
  basis: 'worst-case',
  longFactor: 10,
} as const;

/** The layer of the long reference run: thick and graded so that nothing it reflects matters against any candidate. */
export function longReferenceAbsorber(candidates: readonly Absorber[]): Absorber {
  return { cells: Math.max(40, 2 * Math.max(...candidates.map((c) => c.cells))), order: 3, sigmaScale: 1, kappaMax: 5, alphaMax: 0.05 };
}


export interface AbsorberCandidatePlan {
  absorber: Absorber;
  /** The candidate's runs: the probe series in this layer, then (with the long-run check) over the long window. */
  jobs: ProbeSeriesJob[];
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
  /** The reference run every candidate is scored against, then (with the long-run check) the long reference. */
  shared: ProbeSeriesJob[];
  target_dB: number;
  basis: AbsorberBasis;
  /** Steps of the long window (0: no long-run check). */
  longSteps: number;
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
  if (o.basis !== undefined && !ABSORBER_BASES.includes(o.basis)) problems.push(`basis: "${o.basis}" is not a basis; use worst-case or probes`);
  if (o.longFactor !== undefined && !(Number.isInteger(o.longFactor) && o.longFactor >= 0 && o.longFactor <= 100)) {
    problems.push(`long-run: ${o.longFactor} is not a whole number of windows from 0 to 100; use e.g. 10, or 0 to leave the long-run check out`);
  }
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
  const o = { ...ABSORBER_SWEEP_DEFAULTS, ...options };
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
  const own = studyProbes(s);
  const taken = new Set(own.map((p) => `${Math.floor(p.x / s.grid.dx + 0.5)},${Math.floor(p.y / s.grid.dy + 0.5)}`));
  const probes = [...own, ...edgeProbes(s, taken)];
  const longSteps = steps * (options.longFactor ?? ABSORBER_SWEEP_DEFAULTS.longFactor);
  const measured: Scenario = {
    ...s,
    probes: probes.map(({ name, x, y }) => ({ name, x, y })),
    lines: [],
    frequencies: [],
    steps,
  };
  const long: Scenario = { ...measured, steps: longSteps };
  const absorbers = absorberCandidates(s.absorber, options);
  const candidates = absorbers.map((absorber): AbsorberCandidatePlan => {
    const scenario = applyAbsorber(measured, absorber);
    return {
      absorber,
      jobs: [{ kind: 'probe-series', scenario }, ...(longSteps > 0 ? [{ kind: 'probe-series' as const, scenario: applyAbsorber(long, absorber) }] : [])],
      key: absorberKey(absorber),
      isCurrent: absorberKey(absorber) === absorberKey(s.absorber),
      scenario,
      memory_bytes: scenarioMemoryBytes(applyAbsorber(s, absorber)),
      theory_dB: theoreticalReflectionDb(absorber, Math.min(s.grid.dx, s.grid.dy), s.medium.epsR),
    };
  });
  const reference = referenceScenario(measured, steps);
  const referenceBytes = scenarioMemoryBytes(reference);
  if (referenceBytes > MEMORY_CAP_BYTES) {
    throw new RangeError(`steps: the reference grid for ${steps} steps is ${reference.grid.nx} × ${reference.grid.ny} nodes and would need ` +
      `${formatBytes(referenceBytes)}, above the ${formatBytes(MEMORY_CAP_BYTES)} cap; study fewer steps`);
  }
  const longReference = applyAbsorber(long, longReferenceAbsorber(absorbers));
  return {
    shared: [{ kind: 'probe-series', scenario: reference }, ...(longSteps > 0 ? [{ kind: 'probe-series' as const, scenario: longReference }] : [])],
    target_dB: options.target_dB ?? ABSORBER_SWEEP_DEFAULTS.target_dB,
    basis: options.basis ?? ABSORBER_SWEEP_DEFAULTS.basis,
    longSteps,
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
export function recommendAbsorber<T extends Absorber & { reflection_dB: number }>(
  candidates: readonly T[], target_dB: number, figure: (c: T) => number = (c) => c.reflection_dB,
): T | null {
  let best: T | null = null;
  for (const c of candidates) {
    if (!(figure(c) <= target_dB)) continue;
    if (!best || c.cells < best.cells || (c.cells === best.cells && figure(c) < figure(best))) best = c;
  }
  return best;
}

/** Order of the table: cells, order, sigmaScale, kappaMax, alphaMax. */
export function compareAbsorbers(a: Absorber, b: Absorber): number {
  return a.cells - b.cells || a.order - b.order || a.sigmaScale - b.sigmaScale || a.kappaMax - b.kappaMax || a.alphaMax - b.alphaMax;
}

