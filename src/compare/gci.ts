/*
 * Richardson extrapolation and the Grid Convergence Index (GCI) for a quantity computed on
 * two to five grids, following the procedure of Celik, Ghia, Roache, Freitas, Coleman &
 * Raad, "Procedure for Estimation and Reporting of Uncertainty Due to Discretization in CFD
 * Applications", J. Fluids Eng. 130 (2008) 078001, itself built on Roache, Verification and
 * Validation in Computational Science and Engineering (1998), and ASME V&V 20-2009.
 *
 * Notation: grid 1 is the finest. fᵢ are the values, hᵢ the representative cell sizes
 * (h1 < h2 < h3), r21 = h2/h1, r32 = h3/h2, ε21 = f2 − f1, ε32 = f3 − f2.
 * Relative errors are fractions (0.021, not 2.1 %); absolute ones are in the unit of f.
 *
 * What is implemented, exactly:
 * - Apparent order p solves |ε32/ε21| = r21^p·(r32^p − s)/(r21^p − s), s = sign(ε32/ε21),
 *   the Richardson model f = f0 + C·h^p through the three values. First by the fixed-point
 *   iteration of Celik et al.,
 *     p ← |ln|ε32/ε21| + q(p)| / ln r21,  q(p) = ln((r21^p − s)/(r32^p − s)),
 *   from p0 = |ln|ε32/ε21|| / ln r21 (q = 0, exact when r21 = r32), stopping when p moves by
 *   ≤ 1e-13·max(1, p), at most {@link FIXED_POINT_MAX_ITERATIONS} iterations. That
 *   iteration contracts only while r32 is not much larger than r21 (roughly r32 < r21²).
 *   When it does not settle, bisection on the same equation takes over: in logarithms,
 *   H(p) = p·ln r32 + ln(1 − s·r32^−p) − ln(1 − s·r21^−p) − ln|ε32/ε21| is strictly
 *   increasing for p > 0 (its slope exceeds min(ln r21, ln r32) for s = 1 and is positive
 *   for s = −1; our own short derivation), so a root is bracketed once H changes sign.
 *   Iterations of both count against {@link APPARENT_ORDER_MAX_ITERATIONS}.
 * - Convergence ratio R = ε21/ε32 and the classification, from the existence of a root
 *   p > 0 (H(0+) < 0):
 *     oscillatory  R < 0 (s = −1); a root exists only for −1 < R < 0 (a decaying
 *                  oscillation); R ≤ −1 gives NaN order;
 *     monotone     0 < R < ln r21/ln r32;
 *     divergent    R ≥ ln r21/ln r32 (the apparent order would be ≤ 0); NaN order.
 *   For equal ratios the bound is 1, which gives the usual criteria (monotone 0 < R < 1,
 *   divergent R > 1). For unequal ratios it is not 1: f0 + C·h on h = 2, 3, 4 has R = 1
 *   and converges at p = 1.
 * - f_ext21 = (r21^p·f1 − f2)/(r21^p − 1); e_a21 = |(f1 − f2)/f1|; e_ext21 = |(f_ext21 − f1)/f_ext21|;
 *   GCI_fine21 = Fs·e_a21/(r21^p − 1), Fs = 1.25 with three or more grids.
 * - The coarse index: Celik et al. report GCI_fine21 only (their step 5 and Table 1, from memory);
 *   as the index of the coarser pair we give the same formula on grids 2 and 3,
 *   GCI32 = Fs·e_a32/(r32^p − 1), e_a32 = |(f2 − f3)/f2| (the band around f2). Roache's
 *   GCI_coarse = Fs·|ε|·r^p/(r^p − 1) (the band of the coarser grid of one pair) is not given.
 * - Absolute forms, for quantities near zero such as a phase in degrees or a level in dB:
 *   Fs·|f1 − f2|/(r21^p − 1) and Fs·|f2 − f3|/(r32^p − 1), in the unit of f.
 * - No asymptotic-range ratio GCI32/(r21^p·GCI21) (Roache 1998): with p fitted to the same
 *   three values it is identically 1 in absolute form (f1/f2 in relative form) and tells
 *   nothing; compare the orders of other triples (four or five grids) instead.
 * - Two grids: no order can be observed; p is assumed (default 2, the Yee scheme's formal
 *   order) and Fs = 3 (Roache 1998).
 * - Four or five grids: the three finest give the result; the apparent order of every other
 *   run of three consecutive grids (2-3-4, 3-4-5) is reported beside it.
 * - Nothing throws on data: NaN or infinite values or sizes, sizes not strictly increasing
 *   (a ratio ≤ 1), fewer than two or more than five grids, lists of different lengths,
 *   ε21 = 0 or ε32 = 0 (already converged, or no information), no root p > 0, a root above
 *   1024, f1 = 0 or f_ext21 = 0 for the relative errors, overflow: each gives NaN where it
 *   bites and a reason string saying why.
 */

/** Fixed-point iterations of Celik et al. tried before bisection takes over. */
export const FIXED_POINT_MAX_ITERATIONS = 100;

/** All iterations (fixed point, bracketing, bisection) allowed for one apparent order. */
export const APPARENT_ORDER_MAX_ITERATIONS = 300;

/** Largest apparent order searched for. */
const MAX_ORDER = 1024;

/** Safety factor with three or more grids (Celik et al. 2008; Roache 1998). */
export const SAFETY_FACTOR_OBSERVED = 1.25;

/** Safety factor with two grids and an assumed order (Roache 1998). */
export const SAFETY_FACTOR_ASSUMED = 3;

/** How the three finest values approach each other; 'unknown' with fewer than three grids or degenerate data. */
export type ConvergenceKind = 'monotone' | 'oscillatory' | 'divergent' | 'unknown';

/** The apparent order of one run of three grids. */
export interface ApparentOrder {
  /** p, or NaN (see reason). */
  order: number;
  /** Iterations used (fixed point, then bracketing and bisection if needed). */
  iterations: number;
  /** How p was found: Celik et al.'s fixed point, or bisection after it did not settle. */
  method: 'fixed-point' | 'bisection' | null;
  /** Classification by R (module comment). */
  kind: ConvergenceKind;
  /** R = ε21/ε32. */
  convergenceRatio: number;
  /** Why order is NaN; null when it is not. */
  reason: string | null;
}

/**
 * The result of {@link gridConvergenceIndex}. With two grids r32, convergenceRatio,
 * gciCoarse and gciCoarseAbsolute are NaN by nature; any other NaN comes with a reason.
 */
export interface GciResult {
  /** Number of grids given. */
  grids: number;
  /** r21 = h2/h1 and r32 = h3/h2 (r32 NaN with two grids). */
  r21: number;
  r32: number;
  /** Classification of the three finest grids. */
  kind: ConvergenceKind;
  /** R = ε21/ε32 of the three finest grids. */
  convergenceRatio: number;
  /** p used: observed from the three finest grids, or assumed with two. */
  order: number;
  /** True when p was observed, false when assumed. */
  orderObserved: boolean;
  /** Iterations spent on p (0 with two grids). */
  iterations: number;
  /** How p was found (null with two grids or no order). */
  method: 'fixed-point' | 'bisection' | null;
  /** Fs: 1.25 with three or more grids, 3 with two. */
  safetyFactor: number;
  /** f_ext21, unit of f. */
  extrapolated: number;
  /** e_a21 = |(f1 − f2)/f1|, fraction. */
  relativeError: number;
  /** e_ext21 = |(f_ext21 − f1)/f_ext21|, fraction. */
  extrapolatedRelativeError: number;
  /** GCI_fine21 = Fs·e_a21/(r21^p − 1), fraction. */
  gciFine: number;
  /** Fs·|f1 − f2|/(r21^p − 1), unit of f. */
  gciFineAbsolute: number;
  /** GCI32 = Fs·e_a32/(r32^p − 1), fraction (NaN with two grids). */
  gciCoarse: number;
  /** Fs·|f2 − f3|/(r32^p − 1), unit of f (NaN with two grids). */
  gciCoarseAbsolute: number;
  /** Apparent orders of the other runs of three consecutive grids (four or five grids). */
  otherOrders: { grids: [number, number, number]; order: number; kind: ConvergenceKind; reason: string | null }[];
  /** Why a field is NaN that the number of grids would allow; null when none is. */
  reason: string | null;
}

/** Options of {@link gridConvergenceIndex}. */
export interface GciOptions {
  /** Order assumed with two grids; default 2 (the Yee scheme's formal order). */
  assumedOrder?: number;
}

/**
 * Apparent order of accuracy p from three grids (Celik et al. 2008, step 3: the fixed-point
 * iteration, with bisection on the same equation when it does not settle), the convergence
 * ratio R = ε21/ε32 and its classification (module comment for the exact definitions). NaN
 * order with a reason for: a non-finite input, a ratio ≤ 1, ε21 = 0 or ε32 = 0, a divergent
 * series, a non-decaying oscillation, or a root above 1024. Never throws.
 *
 * @param f1 - value on the finest grid (any unit)
 * @param f2 - value on the middle grid
 * @param f3 - value on the coarsest grid
 * @param r21 - h2/h1 (> 1)
 * @param r32 - h3/h2 (> 1)
 * @returns order p, iterations, method, kind, R and the reason when p is NaN
 *
 * @example
 * apparentOrder(6.063, 5.972, 5.863, 1.5, 4 / 3); // order ≈ 1.534, kind 'monotone' (Celik et al. 2008, Table 1)
 */
export function apparentOrder(f1: number, f2: number, f3: number, r21: number, r32: number): ApparentOrder {
  const fail = (reason: string, kind: ConvergenceKind = 'unknown', convergenceRatio = Number.NaN, iterations = 0): ApparentOrder =>
    ({ order: Number.NaN, iterations, method: null, kind, convergenceRatio, reason });
  if (![f1, f2, f3, r21, r32].every(Number.isFinite)) return fail('a value or ratio is NaN or infinite');
  if (!(r21 > 1) || !(r32 > 1)) return fail(`refinement ratios must exceed 1 (r21 = ${r21}, r32 = ${r32})`);
  const e21 = f2 - f1;
  const e32 = f3 - f2;
  if (!Number.isFinite(e21) || !Number.isFinite(e32)) return fail('differences overflow: values too large');
  if (e21 === 0 && e32 === 0) return fail('all three values are equal: converged, no order can be observed');
  if (e21 === 0) return fail('ε21 = 0: the two finest grids agree, no order can be observed', 'unknown', 0);
  if (e32 === 0) return fail('ε32 = 0: the two coarsest grids agree, no order can be observed', 'unknown', Number.POSITIVE_INFINITY);
  const ratio = e21 / e32;
  const s = ratio < 0 ? -1 : 1;
  const a = Math.log(r21);
  const b = Math.log(r32);
  const target = Math.log(Math.abs(e32 / e21));
  if (s < 0 && !(target > 0)) return fail(`oscillation does not decay: R = ε21/ε32 = ${ratio} ≤ −1`, 'oscillatory', ratio);
  const bound = a / b;
  if (s > 0 && !(ratio < bound)) {
    return fail(`divergent: R = ε21/ε32 = ${ratio} ≥ ln r21/ln r32 = ${bound} (apparent order ≤ 0)`, 'divergent', ratio);
  }
  const kind: ConvergenceKind = s < 0 ? 'oscillatory' : 'monotone';
  const found = (order: number, iterations: number, method: 'fixed-point' | 'bisection'): ApparentOrder =>
    ({ order, iterations, method, kind, convergenceRatio: ratio, reason: null });
  let iterations = 0;
  let p = Math.abs(target) / a;
  while (iterations < FIXED_POINT_MAX_ITERATIONS) {
    iterations++;
    const next = Math.abs(target + Math.log((r21 ** p - s) / (r32 ** p - s))) / a;
    if (!Number.isFinite(next) || !(next > 0)) break;
    if (Math.abs(next - p) <= 1e-13 * Math.max(1, next)) return found(next, iterations, 'fixed-point');
    p = next;
  }
  const excess = (order: number): number =>
    order * b + Math.log1p(-s * Math.exp(-order * b)) - Math.log1p(-s * Math.exp(-order * a)) - target;
  let lo = 0;
  let hi = 1;
  while (excess(hi) <= 0) {
    iterations++;
    lo = hi;
    hi *= 2;
    if (hi > MAX_ORDER) return fail(`apparent order above ${MAX_ORDER}`, kind, ratio, iterations);
  }
  while (hi - lo > 1e-13 * hi && iterations < APPARENT_ORDER_MAX_ITERATIONS) {
    iterations++;
    const mid = 0.5 * (lo + hi);
    if (excess(mid) > 0) hi = mid;
    else lo = mid;
  }
  return found(0.5 * (lo + hi), iterations, 'bisection');
}

/** Fields that extreme data can drive to ±Infinity; those are reported as NaN with a reason. */
const OVERFLOWING_FIELDS = [
  'extrapolated', 'relativeError', 'extrapolatedRelativeError', 'gciFine', 'gciFineAbsolute', 'gciCoarse', 'gciCoarseAbsolute',
] as const;

function checkData(values: readonly number[], sizes: readonly number[]): string | null {
  if (values.length !== sizes.length) return `${values.length} values but ${sizes.length} cell sizes`;
  if (values.length < 2 || values.length > 5) return `two to five grids are needed, got ${values.length}`;
  for (let i = 0; i < values.length; i++) {
    if (!Number.isFinite(values[i])) return `value ${i + 1} is ${values[i]}`;
    if (!Number.isFinite(sizes[i]) || !(sizes[i] > 0)) return `cell size ${i + 1} must be finite and > 0, got ${sizes[i]}`;
    if (i > 0 && !(sizes[i] > sizes[i - 1])) return `cell sizes must grow from the finest grid (ratio h${i + 1}/h${i} = ${sizes[i] / sizes[i - 1]} ≤ 1)`;
    if (i > 0 && !Number.isFinite(sizes[i] / sizes[i - 1])) return `ratio h${i + 1}/h${i} overflows`;
  }
  return null;
}

/**
 * Richardson extrapolation and Grid Convergence Index of a quantity computed on two to five
 * grids, finest first, by the procedure of Celik et al. 2008 with Roache's safety factors
 * (every definition and every degenerate case in the module comment). Never throws on data:
 * a field that cannot be computed is NaN and `reason` says why.
 *
 * @param values - f1, f2, … on grids from finest to coarsest (any unit)
 * @param sizes - representative cell sizes h1 < h2 < … (any length unit, the same for all)
 * @param options - assumedOrder: p used with two grids (default 2)
 * @returns the order, classification, extrapolated value, relative and absolute GCIs
 *
 * @example
 * // Celik et al. 2008, Table 1, first column (2D grids of 18000, 8000 and 4500 cells)
 * gridConvergenceIndex([6.063, 5.972, 5.863], [1, 1.5, 2]);
 * // order ≈ 1.534, extrapolated ≈ 6.1685, relativeError ≈ 0.0150, gciFine ≈ 0.0217
 */
export function gridConvergenceIndex(values: readonly number[], sizes: readonly number[], options: GciOptions = {}): GciResult {
  const result: GciResult = {
    grids: values.length, r21: Number.NaN, r32: Number.NaN, kind: 'unknown', convergenceRatio: Number.NaN,
    order: Number.NaN, orderObserved: values.length >= 3, iterations: 0, method: null,
    safetyFactor: values.length >= 3 ? SAFETY_FACTOR_OBSERVED : SAFETY_FACTOR_ASSUMED,
    extrapolated: Number.NaN, relativeError: Number.NaN, extrapolatedRelativeError: Number.NaN,
    gciFine: Number.NaN, gciFineAbsolute: Number.NaN, gciCoarse: Number.NaN, gciCoarseAbsolute: Number.NaN,
    otherOrders: [], reason: null,
  };
  const problem = checkData(values, sizes);
  if (problem) return { ...result, reason: problem };
  const [f1, f2] = values;
  const r21 = sizes[1] / sizes[0];
  result.r21 = r21;
  if (values.length === 2) {
    const assumed = options.assumedOrder ?? 2;
    if (!Number.isFinite(assumed) || !(assumed > 0)) return { ...result, reason: `assumed order must be finite and > 0, got ${assumed}` };
    result.order = assumed;
  } else {
    const f3 = values[2];
    const r32 = sizes[2] / sizes[1];
    result.r32 = r32;
    const main = apparentOrder(f1, f2, f3, r21, r32);
    result.kind = main.kind;
    result.convergenceRatio = main.convergenceRatio;
    result.iterations = main.iterations;
    result.method = main.method;
    for (let i = 1; i + 2 < values.length; i++) {
      const other = apparentOrder(values[i], values[i + 1], values[i + 2], sizes[i + 1] / sizes[i], sizes[i + 2] / sizes[i + 1]);
      result.otherOrders.push({ grids: [i + 1, i + 2, i + 3], order: other.order, kind: other.kind, reason: other.reason });
    }
    if (main.reason) return { ...result, reason: main.reason };
    result.order = main.order;
    const coarseGrowth = r32 ** main.order - 1;
    result.gciCoarseAbsolute = (result.safetyFactor * Math.abs(f2 - f3)) / coarseGrowth;
    if (f2 !== 0) result.gciCoarse = (result.safetyFactor * Math.abs((f2 - f3) / f2)) / coarseGrowth;
  }
  const growth = r21 ** result.order;
  if (!(growth > 1) || !Number.isFinite(growth)) {
    return { ...result, gciCoarse: Number.NaN, gciCoarseAbsolute: Number.NaN, reason: `r21^p = ${growth}: ratio or order out of scale` };
  }
  result.extrapolated = (growth * f1 - f2) / (growth - 1);
  result.gciFineAbsolute = (result.safetyFactor * Math.abs(f1 - f2)) / (growth - 1);
  const reasons: string[] = [];
  if (Number.isNaN(result.extrapolated)) reasons.push('extrapolated value not computable (values out of scale)');
  if (f1 === 0) {
    reasons.push('f1 = 0: relative errors undefined, use the absolute GCI');
  } else {
    result.relativeError = Math.abs((f1 - f2) / f1);
    result.gciFine = (result.safetyFactor * result.relativeError) / (growth - 1);
  }
  if (result.extrapolated === 0) reasons.push('f_ext21 = 0: extrapolated relative error undefined');
  else result.extrapolatedRelativeError = Math.abs((result.extrapolated - f1) / result.extrapolated);
  if (values.length >= 3 && f2 === 0) reasons.push('f2 = 0: relative coarse GCI undefined, use the absolute one');
  for (const field of OVERFLOWING_FIELDS) {
    if (Math.abs(result[field]) === Number.POSITIVE_INFINITY) {
      result[field] = Number.NaN;
      reasons.push(`${field} overflows (values, ratios or order out of scale)`);
    }
  }
  return { ...result, reason: reasons.length ? reasons.join('; ') : null };
}
