/**
 * The exact 2D field of a line source beside an infinite circular cylinder, by the
 * cylindrical-wave (eigenfunction) series: the incident wave H0^(2)(k1|r − rs|) expanded by
 * Graf's addition theorem, H0^(2)(k1|r − rs|) = Σ_n J_n(k1ρ<) H_n^(2)(k1ρ>) e^{jn(φ−φs)}
 * (DLMF 10.23.7), a scattered wave Σ c_n H_n^(2)(k1ρ) e^{jn(φ−φs)} outside and a transmitted
 * wave Σ d_n J_n(k2ρ) e^{jn(φ−φs)} inside, with c_n, d_n from the boundary conditions at
 * ρ = a (Harrington, Time-Harmonic Electromagnetic Fields, 1961, ch. 5, and Balanis,
 * Advanced Engineering Electromagnetics, ch. 11; chapter numbers from memory).
 * Time convention e^{+jωt}; μ = μ0 everywhere.
 *
 * Polarizations and boundary conditions:
 *  - TMz (Ez, electric line current I): PEC Ez = 0; penetrable Ez and (1/μ)∂Ez/∂ρ continuous.
 *  - TEz (Hz, magnetic line current M): PEC ∂Hz/∂ρ = 0; penetrable Hz and (1/ε)∂Hz/∂ρ continuous.
 * With β = k (TMz) or k/ε (TEz) on each side and f_n, f_n' the values and argument
 * derivatives at ρ = a, the scattered mode's value there is
 *   b_n = −A_n·[β1 J_n'(k1a) − β2 J_n(k1a) J_n'(k2a)/J_n(k2a)] / [β1 L_n − β2 J_n'(k2a)/J_n(k2a)],
 * A_n = H_n^(2)(k1ρs), L_n = H_n^(2)'(k1a)/H_n^(2)(k1a), and the transmitted mode's value there
 *   s_n = β1·W·T_n / [β1 L_n − β2 J_n'(k2a)/J_n(k2a)],  T_n = H_n^(2)(k1ρs)/H_n^(2)(k1a),
 * W = −2j/(πk1a) the Wronskian J_n H_n^(2)' − J_n' H_n^(2) (DLMF 10.5.5). PEC: b_n = −A_n J_n(k1a)
 * (TMz) or −A_n J_n'(k1a)/L_n (TEz), s_n = 0.
 *
 * Nothing overflows: the field outside is F = H0^(2)(k1R) + Σ b_n·E_n·e^{jnΔφ} with
 * E_n = H_n^(2)(k1ρ)/H_n^(2)(k1a), and inside F = Σ s_n·J_n(k2ρ)/J_n(k2a)·e^{jnΔφ}; every factor
 * (b_n, s_n, T_n, E_n, J_n(k2ρ)/J_n(k2a)) stays between about 0 and 1 in size and is built as a
 * running product of the ratios J_n/J_{n−1} (backward recurrence) and H_n/H_{n−1} (upward
 * recurrence) from bessel.ts. Derivatives come from the same ratios by
 * C_n' = C_{n−1} − (n/z)C_n (DLMF 10.6.2), arranged so that no ratio is divided by (a zero of
 * J_n(k2a) or J_n(k1a) costs no accuracy). The incident wave is the closed form, so the series
 * holds only the scattered part and converges like (a²/(ρρs))^n outside and (ρ/ρs)^n inside.
 *
 * Normalisation: F = Ez/(−ωμ0 I/4) for TMz and F = Hz/(−ωε0ε1 M/4) for TEz, so that the incident
 * part is H0^(2)(k1|r − rs|); inside the cylinder F keeps the outside factor.
 *
 * Accuracy (test/reference/cylinder-series.test.ts): within 1.4e-14 of |F| + |incident| of an
 * independent mpmath series over 84 cases (both polarizations; PEC, lossless, lossy and
 * negative-ε cylinders; lossy outside medium; observers inside, outside and on the surface;
 * sources within 0.025a of the surface; ka up to 20), and power balance to 1e-15.
 */
import { cAbs as mag, cDiv as div, cMul as mul, cScale as scale, cSub as sub, type Complex } from './complex.ts';
import { besselJRatioSequence, hankel2, hankel2RatioSequence, type RatioSequence } from './bessel.ts';

/** A point in polar coordinates about the cylinder's axis: ρ in length units, φ in radians. */
export interface Polar {
  rho: number;
  phi: number;
}

/** The cylinder's inside: a perfect electric conductor or a medium of wavenumber k2 and relative permittivity ε2. */
export type CylinderInside = 'pec' | { k2: Complex; eps2: Complex };

/** Everything but the observer. Lengths in any one unit, wavenumbers in rad per that unit. */
export interface CylinderProblem {
  polarization: 'TMz' | 'TEz';
  /** Wavenumber outside, Im k1 ≤ 0 (k1 = k0·√ε1 on the branch with Im ≤ 0). */
  k1: Complex;
  /** Relative permittivity outside (used by TEz, and by TEz's normalisation). */
  eps1: Complex;
  inside: CylinderInside;
  /** Cylinder radius a ≥ 0 (0: no cylinder). */
  radius: number;
  /** Line source, ρs > a. */
  source: Polar;
}

export interface CylinderSeriesResult {
  /** The total normalised field F at the observer (NaN on the source itself). */
  value: Complex;
  /** Outside: the scattered part F − H0^(2)(k1R) (finite on the source too). Inside: NaN. */
  scattered: Complex;
  /** Number of orders summed, n = 0..terms−1 (each n ≥ 1 stands for ±n). */
  terms: number;
  /** |last order's contribution| / |value|: how far the truncation reached. */
  lastTermRatio: number;
  /** False when the cap of {@link MAX_ORDERS} orders was reached before the tail fell below 1e-16. */
  converged: boolean;
}

/** Hard cap on the number of orders (a source closer than about 2e-4·a to the surface reaches it). */
export const MAX_ORDERS = 200_000;

/** The tail must be below this fraction of Σ|terms| + |incident|. */
const TAIL_TOLERANCE = 1e-16;

/**
 * The normalised total field of a line source beside a circular cylinder at one observer
 * (module comment for the method). Term-count rule: orders are summed at least up to
 * n0 = X + 2·X^{1/3} + 2, X = the largest of |k1|ρs, |k1|a, |k2|a (the last turning point of
 * the Bessel functions whose ratios set the size of the terms, plus the width of the Airy
 * transition; a dielectric's whispering-gallery resonances lie below |k2|a),
 * and then until three successive orders n have |term_n|/(1 − q) ≤ 1e-16·(|incident| +
 * Σ|terms|), where q is the larger of the geometric rate of the series (a²/(ρρs) outside,
 * ρ/ρs inside) and the observed ratio of the last two terms: a bound on the geometric tail.
 *
 * Edge cases: an observer on the source gives value NaN (the scattered part stays finite); an
 * observer exactly on the surface uses the outside series (the inside one gives the same value
 * there); an observer inside a PEC cylinder gives 0; radius 0 gives the plain H0^(2)(k1R).
 *
 * @param p - the problem and the observer
 * @returns the field, the number of orders used and the truncation figures
 * @throws RangeError when the source is not outside the cylinder (ρs ≤ a), Im k1 > 0, or any
 *   input is not finite
 * @example
 * cylinderSeries({ polarization: 'TMz', k1: [1, 0], eps1: [1, 0], inside: 'pec', radius: 2,
 *   source: { rho: 4, phi: 0 }, observer: { rho: 3, phi: Math.PI / 2 } }).value;
 * // ≈ [-0.085536970067, 0.029675029968]
 */
export function cylinderSeries(p: CylinderProblem & { observer: Polar }): CylinderSeriesResult {
  return cylinderSeriesSolver(p).at(p.observer);
}

/**
 * The same for many observers at one frequency, sharing the per-order coefficients (built
 * once, O(N + |k|a) for N orders) so that each observer costs one run of its own ratio
 * recurrence and one sum, O(N) operations (O(N + |k2|ρ) inside), plus one H0^(2) for the
 * incident wave: a few tens of microseconds for N of a hundred or two, against a full table
 * rebuild per point for repeated {@link cylinderSeries} calls.
 *
 * @param p - the problem
 * @param observers - observer positions
 * @returns one result per observer, in order
 * @throws RangeError as {@link cylinderSeries}
 * @example
 * cylinderSeriesMany(problem, line.map(([x, y]) => ({ rho: Math.hypot(x, y), phi: Math.atan2(y, x) })));
 */
export function cylinderSeriesMany(p: CylinderProblem, observers: Polar[]): CylinderSeriesResult[] {
  const solver = cylinderSeriesSolver(p);
  return observers.map((o) => solver.at(o));
}

/**
 * A reusable evaluator: checks the problem once and keeps its per-order coefficients,
 * growing the table (by recomputing it at least twice as long) when an observer needs more
 * orders than an earlier one did.
 *
 * @param p - the problem
 * @returns `at(observer)` and `outgoingAmplitudes(nMax)`: the c_n of the scattered wave
 *   Σ c_n H_n^(2)(k1ρ) e^{jnΔφ} for n = 0..nMax (c_{−n} = c_n), for far-field and power checks
 * @throws RangeError as {@link cylinderSeries}
 * @example
 * const solver = cylinderSeriesSolver(problem);
 * const f = solver.at({ rho: 3, phi: 0 }).value;
 */
export function cylinderSeriesSolver(p: CylinderProblem): {
  at(observer: Polar): CylinderSeriesResult;
  outgoingAmplitudes(nMax: number): Complex[];
} {
  checkProblem(p);
  let table: ModeTable | null = null;
  const tableFor = (orders: number): ModeTable => {
    if (!table || table.orders < orders) table = buildTable(p, Math.max(orders, table ? 2 * table.orders : 0));
    return table;
  };
  return {
    at: (observer) => evaluate(p, observer, tableFor),
    outgoingAmplitudes: (nMax) => {
      if (!Number.isInteger(nMax) || nMax < 0) throw new RangeError(`outgoingAmplitudes: nMax must be an integer ≥ 0, got ${nMax}`);
      if (p.radius === 0) return Array.from({ length: nMax + 1 }, () => [0, 0] as Complex);
      const t = tableFor(nMax + 1);
      return Array.from({ length: nMax + 1 }, (_, n) => [t.cRe[n], t.cIm[n]] as Complex);
    },
  };
}

// ---------------------------------------------------------------------------------------

function checkProblem(p: CylinderProblem): void {
  const finite = (...xs: number[]) => xs.every(Number.isFinite);
  if (!finite(p.k1[0], p.k1[1], p.eps1[0], p.eps1[1], p.radius, p.source.rho, p.source.phi)) {
    throw new RangeError('cylinderSeries: k1, eps1, radius and source must be finite');
  }
  if (p.k1[1] > 0) throw new RangeError(`cylinderSeries: Im k1 must be ≤ 0 (e^{+jωt}, outgoing H^(2)), got ${p.k1[1]}`);
  if (p.k1[0] === 0 && p.k1[1] === 0) throw new RangeError('cylinderSeries: k1 must not be 0');
  if (!(p.radius >= 0)) throw new RangeError(`cylinderSeries: radius must be ≥ 0, got ${p.radius}`);
  if (!(p.source.rho > p.radius)) {
    throw new RangeError(`cylinderSeries: the source must be outside the cylinder (ρs > a), got ρs = ${p.source.rho}, a = ${p.radius}`);
  }
  if (p.inside !== 'pec') {
    const { k2, eps2 } = p.inside;
    if (!finite(k2[0], k2[1], eps2[0], eps2[1])) throw new RangeError('cylinderSeries: k2 and eps2 must be finite');
    if (k2[0] === 0 && k2[1] === 0) throw new RangeError('cylinderSeries: k2 must not be 0');
  }
  if (p.polarization === 'TEz' && p.eps1[0] === 0 && p.eps1[1] === 0) throw new RangeError('cylinderSeries: eps1 must not be 0 for TEz');
}

/** 1 − (n/z)·r: the derivative C_n'/C_{n−1} from the ratio r = C_n/C_{n−1} (DLMF 10.6.2). */
const slope = (n: number, r: Complex, z: Complex): Complex => sub([1, 0], scale(div(r, z), n));
/** First value of a ratio sequence divided by that of another, with their scales. */
function firstRatio(num: RatioSequence, den: RatioSequence): Complex {
  return scale(div(num.first, den.first), Math.exp(num.logScale - den.logScale));
}

/** Per-order coefficients for orders 0..orders−1 (flat arrays for the observers' loops). */
interface ModeTable {
  orders: number;
  /** b_n: the scattered mode's value at ρ = a. */
  bRe: Float64Array; bIm: Float64Array;
  /** c_n: the scattered mode's amplitude on H_n^(2)(k1ρ). */
  cRe: Float64Array; cIm: Float64Array;
  /** g_n: the transmitted mode's factor on J_n(k2ρ)/J_{n−1}(k2a) (n ≥ 1), on J_0(k2ρ)/J_0(k2a) (n = 0). */
  gRe: Float64Array; gIm: Float64Array;
  /** 1/h_n with h_n = H_n^(2)(k1a)/H_{n−1}^(2)(k1a), and 1/r_n with r_n = J_n(k2a)/J_{n−1}(k2a) (zero for PEC). */
  invHaRe: Float64Array; invHaIm: Float64Array;
  invR2Re: Float64Array; invR2Im: Float64Array;
  hA: RatioSequence; // H_n^(2)(k1a)
  jA2: RatioSequence | null; // J_n(k2a)
}

function betas(p: CylinderProblem): [Complex, Complex] {
  const k2: Complex = p.inside === 'pec' ? [0, 0] : p.inside.k2;
  if (p.polarization === 'TMz') return [p.k1, k2];
  return [div(p.k1, p.eps1), p.inside === 'pec' ? [0, 0] : div(k2, p.inside.eps2)];
}

function buildTable(p: CylinderProblem, orders: number): ModeTable {
  const a = p.radius;
  const top = orders; // ratios to n = orders (one above the last order, for n = 0's derivative)
  const z1: Complex = scale(p.k1, a);
  const hS = hankel2RatioSequence(top, scale(p.k1, p.source.rho));
  const hA = hankel2RatioSequence(top, z1);
  const jA = besselJRatioSequence(top, z1);
  const z2: Complex | null = p.inside === 'pec' ? null : scale(p.inside.k2, a);
  const jA2 = z2 ? besselJRatioSequence(top, z2) : null;
  const [beta1, beta2] = betas(p);
  const wronskian = div([0, -2 / Math.PI], z1); // −2j/(π k1 a)
  const t: ModeTable = {
    orders, hA, jA2,
    bRe: new Float64Array(orders), bIm: new Float64Array(orders),
    cRe: new Float64Array(orders), cIm: new Float64Array(orders),
    gRe: new Float64Array(orders), gIm: new Float64Array(orders),
    invHaRe: new Float64Array(orders), invHaIm: new Float64Array(orders),
    invR2Re: new Float64Array(orders), invR2Im: new Float64Array(orders),
  };
  for (let n = 1; n < orders; n++) {
    [t.invHaRe[n], t.invHaIm[n]] = div([1, 0], hA.ratios[n]);
    if (jA2) [t.invR2Re[n], t.invR2Im[n]] = div([1, 0], jA2.ratios[n]);
  }
  const tm = p.polarization === 'TMz';
  // running values: T_n = H_n(k1ρs)/H_n(k1a), J_n(k1a), P_n = H_n(k1ρs)·J_n(k1a)
  let T = firstRatio(hS, hA);
  let J: Complex = scale(jA.first, Math.exp(jA.logScale));
  let P: Complex = scale(mul(hS.first, jA.first), Math.exp(hS.logScale + jA.logScale));
  for (let n = 0; n < orders; n++) {
    // With C_{−} the order n−1 value (n ≥ 1): J_n = r·J_{−}, J_n' = (1 − n r/z)·J_{−}.
    // n = 0 uses J_0' = −J_1, i.e. the same formulas with J_{−} → J_0 and "slope" → −r_1.
    let Jm: Complex; // J_{n−1}(k1a), or J_0 for n = 0
    let Pm: Complex; // H_n(k1ρs)·J_{n−1}(k1a), or P_0 for n = 0
    let r1: Complex; // J_n/J_{n−1} at k1a, or 1 for n = 0
    let d1: Complex; // J_n'(k1a)/J_{n−1}(k1a), or J_0'/J_0 = −r_1
    let L: Complex; // H_n'(k1a)/H_n(k1a)
    if (n === 0) {
      Jm = J; Pm = P; r1 = [1, 0];
      d1 = scale(jA.ratios[1], -1);
      L = scale(hA.ratios[1], -1);
    } else {
      const hs = hS.ratios[n];
      const ha = hA.ratios[n];
      T = div(mul(T, hs), ha);
      Jm = J; Pm = mul(P, hs);
      r1 = jA.ratios[n];
      d1 = slope(n, r1, z1);
      L = sub(div([1, 0], ha), scale(div([1, 0], z1), n));
      J = mul(Jm, r1);
      P = mul(Pm, r1);
    }
    let b: Complex; // value of the scattered mode at ρ = a
    let c: Complex; // its amplitude on H_n(k1ρ)
    let g: Complex = [0, 0];
    if (!jA2 || !z2) {
      if (tm) {
        b = scale(P, -1);
        c = scale(mul(T, J), -1);
      } else {
        b = scale(div(mul(Pm, d1), L), -1);
        c = scale(div(mul(mul(T, Jm), d1), L), -1);
      }
    } else {
      // with r2 = J_n(k2a)/J_{n−1}(k2a) and d2 = J_n'(k2a)/J_{n−1}(k2a) (n = 0: r2 = 1, d2 = −r_1):
      // b = −Pm·(β1 d1 r2 − β2 r1 d2)/(β1 L r2 − β2 d2)
      const r2: Complex = n === 0 ? [1, 0] : jA2.ratios[n];
      const d2: Complex = n === 0 ? scale(jA2.ratios[1], -1) : slope(n, r2, z2);
      const num = sub(mul(beta1, mul(d1, r2)), mul(beta2, mul(r1, d2)));
      const den = sub(mul(beta1, mul(L, r2)), mul(beta2, d2));
      const gamma = div(num, den);
      b = scale(mul(Pm, gamma), -1);
      c = scale(mul(mul(T, Jm), gamma), -1);
      g = div(mul(mul(beta1, wronskian), T), den);
    }
    t.bRe[n] = b[0]; t.bIm[n] = b[1];
    t.cRe[n] = c[0]; t.cIm[n] = c[1];
    t.gRe[n] = g[0]; t.gIm[n] = g[1];
  }
  return t;
}

/** Orders an observer needs, from the series' geometric rate (the table is sized by it). */
function ordersWanted(turning: number, q: number): number {
  const n0 = Math.ceil(turning + 2 * Math.cbrt(turning)) + 2;
  const tail = q <= 0 ? 0 : Math.ceil(Math.log(TAIL_TOLERANCE * (1 - q)) / Math.log(q));
  return Math.min(MAX_ORDERS, n0 + tail + 8);
}

function evaluate(p: CylinderProblem, o: Polar, tableFor: (orders: number) => ModeTable): CylinderSeriesResult {
  if (!Number.isFinite(o.rho) || !Number.isFinite(o.phi) || o.rho < 0) {
    throw new RangeError(`cylinderSeries: observer must have finite ρ ≥ 0 and φ, got (${o.rho}, ${o.phi})`);
  }
  const a = p.radius;
  const rs = p.source.rho;
  const dphi = o.phi - p.source.phi;
  const outside = o.rho >= a;
  // R² = (ρ − ρs)² + 4ρρs·sin²(Δφ/2): the law of cosines without its cancellation near the source
  const distance = Math.hypot(o.rho - rs, 2 * Math.sqrt(o.rho * rs) * Math.sin(dphi / 2));
  const incident: Complex = outside ? (distance === 0 ? [Number.NaN, Number.NaN] : hankel2(0, scale(p.k1, distance))) : [0, 0];
  if (a === 0) return { value: incident, scattered: [0, 0], terms: 0, lastTermRatio: 0, converged: true };
  if (!outside && p.inside === 'pec') {
    return { value: [0, 0], scattered: [Number.NaN, Number.NaN], terms: 0, lastTermRatio: 0, converged: true };
  }
  const k1 = mag(p.k1);
  const k2 = p.inside === 'pec' ? 0 : mag(p.inside.k2);
  // an outside observer's own k1ρ is left out: |H_n(k1ρ)/H_n(k1a)| ≤ 1 for ρ ≥ a (|H_n^(2)| falls
  // with the distance, DLMF 10.9.30 for real k), so its terms are bounded by the surface values b_n
  const turning = Math.max(k1 * rs, k1 * a, k2 * a, outside ? 0 : k2 * o.rho);
  const q = outside ? (a * a) / (o.rho * rs) : o.rho / rs;
  const wanted = ordersWanted(turning, q);
  const table = tableFor(wanted);
  const n0 = Math.ceil(turning + 2 * Math.cbrt(turning)) + 2;

  // Per observer: f runs through E_n = E_{n−1}·h_n(k1ρ)/h_n(k1a) outside (term b_n·E_n), and inside
  // through U_n = V_{n−1}·J_n(k2ρ)/J_{n−1}(k2ρ) (term g_n·U_n), then V_n = U_n/r_n(k2a).
  let first: Complex; // E_0 or V_0
  let ratios: Complex[] | null; // the observer's own ratios (null at the centre: J_n(0) = 0 for n ≥ 1)
  let coefRe: Float64Array;
  let coefIm: Float64Array;
  let invRe: Float64Array; // 1/h_n(k1a) outside, 1/r_n(k2a) inside
  let invIm: Float64Array;
  if (outside) {
    const hO = hankel2RatioSequence(wanted, scale(p.k1, o.rho));
    first = firstRatio(hO, table.hA);
    ratios = hO.ratios;
    [coefRe, coefIm, invRe, invIm] = [table.bRe, table.bIm, table.invHaRe, table.invHaIm];
  } else {
    const jA2 = table.jA2 as RatioSequence;
    const k2: Complex = p.inside === 'pec' ? [0, 0] : p.inside.k2;
    if (o.rho === 0) {
      first = div([1, 0], scale(jA2.first, Math.exp(jA2.logScale)));
      ratios = null;
    } else {
      const jO = besselJRatioSequence(wanted, scale(k2, o.rho));
      first = firstRatio(jO, jA2);
      ratios = jO.ratios;
    }
    [coefRe, coefIm, invRe, invIm] = [table.gRe, table.gIm, table.invR2Re, table.invR2Im];
  }

  let sumR = 0;
  let sumI = 0;
  let absSum = mag(incident);
  if (!Number.isFinite(absSum)) absSum = 0;
  let small = 0;
  let last = 0;
  let previous = Number.POSITIVE_INFINITY;
  let n = 0;
  let converged = false;
  let [fr, fi] = first;
  for (; n < wanted; n++) {
    if (n > 0) {
      const [rr, ri] = ratios ? ratios[n] : [0, 0];
      [fr, fi] = [fr * rr - fi * ri, fr * ri + fi * rr];
      if (outside) [fr, fi] = [fr * invRe[n] - fi * invIm[n], fr * invIm[n] + fi * invRe[n]];
    }
    const tr = coefRe[n] * fr - coefIm[n] * fi;
    const ti = coefRe[n] * fi + coefIm[n] * fr;
    if (!outside && n > 0) [fr, fi] = [fr * invRe[n] - fi * invIm[n], fr * invIm[n] + fi * invRe[n]];
    const weight = n === 0 ? 1 : 2 * Math.cos(n * dphi);
    sumR += weight * tr;
    sumI += weight * ti;
    const size = (n === 0 ? 1 : 2) * Math.sqrt(tr * tr + ti * ti);
    absSum += size;
    last = size;
    if (n >= n0) {
      const rate = Math.max(q, previous > 0 ? size / previous : 0);
      small = rate < 1 && size / (1 - rate) <= TAIL_TOLERANCE * absSum ? small + 1 : 0;
      if (small >= 3) {
        converged = true;
        n++;
        break;
      }
    }
    previous = size;
  }
  const scattered: Complex = [sumR, sumI];
  const value: Complex = outside ? [incident[0] + sumR, incident[1] + sumI] : scattered;
  return {
    value,
    scattered: outside ? scattered : [Number.NaN, Number.NaN],
    terms: n,
    lastTermRatio: last / mag(value),
    converged,
  };
}
