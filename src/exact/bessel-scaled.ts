/**
 * The machinery behind bessel.ts: J_n(z), Y_n(z) and H_n^(2)(z) for orders 0..nMax anywhere in
 * the plane, each value carried as a mantissa and a natural-log scale (J grows like
 * e^{|Im z|}, H^(2) like (n−1)!(2/z)^n), so that nothing over- or underflows on the way.
 *
 * How the values are made, all in the closed fourth quadrant u (Re u ≥ 0, Im u ≤ 0):
 *  - J_n(u): the ascending series for |u| ≤ 2 (bessel-series.ts), else Miller's backward
 *    recurrence (bessel-miller.ts), anchored for |u| ≥ 25 on J0, J1 from Hankel's expansions.
 *  - H_n^(2)(u): H0 and H1 from the series (|u| ≤ 2), an integral or Hankel's expansion
 *    (bessel-hankel-start.ts), then the upward recurrence DLMF 10.6.1, which is stable for
 *    H^(2) in the lower half-plane (it is the dominant solution there for growing n).
 *  - Y_n(u) = j·(H_n^(2) − J_n). Never J − jY for H^(2): in the lower half-plane H^(2) is
 *    smaller than J and Y by e^{2|Im u|}, and the subtraction would lose that many digits.
 * The rest of the plane follows by J_n(z̄) = conj J_n(z) with H^(2)(z̄) = conj H^(1)(z)
 * (DLMF 10.11.9) and by the continuation formulas across the cut, DLMF 10.11.1–10.11.2 at
 * m = ±1: J_n(ze^{±πj}) = (−1)^n J_n(z), Y_n(ze^{±πj}) = (−1)^n (Y_n(z) ± 2j J_n(z)).
 * Im z = +0 on the negative real axis is ph z = +π, Im z = −0 is ph z = −π.
 */
import type { Complex } from './complex.ts';
import { LARGE_ARGUMENT, SMALL_ARGUMENT, besselJ01LargeScaled, hankel2StartScaled } from './bessel-hankel-start.ts';
import { besselJScaledMiller } from './bessel-miller.ts';
import { besselJSeriesSequence, besselY01Series } from './bessel-series.ts';

/** A value m·e^{log}: [re(m), im(m), log]. */
export type Scaled = [number, number, number];

/** Above this size a recurrence's values are scaled down and the scale carried in the log. */
const BIG = 2 ** 600;
const LOG_BIG = 600 * Math.LN2;

/**
 * m·e^{log} as a plain complex number, multiplied in steps so that nothing over- or underflows
 * before the result itself does (a zero part stays 0 rather than becoming 0·∞ = NaN).
 *
 * @param s - [re(m), im(m), log]
 * @returns m·e^{log}
 * @example
 * unscale([0.5, 0, 1000]); // [Infinity, 0]
 */
export function unscale(s: Scaled): Complex {
  let [re, im, log] = s;
  const step = log > 0 ? 600 : -600;
  const factor = Math.exp(step);
  for (let i = 0; i < 8 && Math.abs(log) > 600; i++) {
    re *= factor;
    im *= factor;
    log -= step;
  }
  const e = Math.exp(log);
  return [re === 0 ? 0 : re * e, im === 0 ? 0 : im * e];
}

/** a·x + b·y for scaled a, b and real weights x, y, rescaled to the larger log. */
function combine(a: Scaled, x: number, b: Scaled, y: number): Scaled {
  const log = Math.max(aLog(a), aLog(b));
  const ea = Math.exp(a[2] - log) * x;
  const eb = Math.exp(b[2] - log) * y;
  return [a[0] * ea + b[0] * eb, a[1] * ea + b[1] * eb, log];
}

/** The log of a scaled value, −Infinity for a zero mantissa (so the other one sets the scale). */
function aLog(a: Scaled): number {
  return a[0] === 0 && a[1] === 0 ? Number.NEGATIVE_INFINITY : a[2];
}

const timesJ = (a: Scaled): Scaled => [-a[1], a[0], a[2]];
const conj = (a: Scaled): Scaled => [a[0], -a[1], a[2]];
const times = (a: Scaled, s: number): Scaled => [a[0] * s, a[1] * s, a[2]];

/** J_n, Y_n and H_n^(2) for n = 0..nMax as scaled values. */
export interface ScaledSequences { j: Scaled[]; y: Scaled[]; h2: Scaled[] }

function constant(nMax: number, value: (n: number) => Complex): Scaled[] {
  return Array.from({ length: nMax + 1 }, (_, n) => [...value(n), 0] as Scaled);
}

/**
 * J_n(z), Y_n(z), H_n^(2)(z) for n = 0..nMax anywhere in the plane, from the fourth-quadrant
 * core by the reflections and continuation formulas of the module comment. z = 0 gives the
 * limits (J_0 = 1, Y = −∞, H^(2) = J + j∞); NaN or an infinity other than +∞ gives NaN; +∞ gives 0.
 *
 * @param nMax - highest order, an integer ≥ 0
 * @param z - argument [re, im], dimensionless
 * @returns the three sequences as scaled values
 * @example
 * unscale(scaledSequences(1, [2, -1]).h2[1]); // H_1^(2)(2 − j)
 */
export function scaledSequences(nMax: number, z: Complex): ScaledSequences {
  const [x, y] = z;
  if (Number.isNaN(x) || Number.isNaN(y) || !Number.isFinite(y) || x === Number.NEGATIVE_INFINITY) {
    const nan = constant(nMax, () => [Number.NaN, Number.NaN]);
    return { j: nan, y: nan, h2: nan };
  }
  if (x === Number.POSITIVE_INFINITY) {
    const zero = constant(nMax, () => [0, 0]);
    return { j: zero, y: zero, h2: zero };
  }
  if (x === 0 && y === 0) {
    return {
      j: constant(nMax, (n) => [n === 0 ? 1 : 0, 0]),
      y: constant(nMax, () => [Number.NEGATIVE_INFINITY, 0]),
      h2: constant(nMax, (n) => [n === 0 ? 1 : 0, Number.POSITIVE_INFINITY]),
    };
  }
  const upperSide = y > 0 || Object.is(y, 0);
  let u: Complex;
  if (x >= 0) u = y > 0 ? [x, -y] : [x, y];
  else u = upperSide ? [-x, -y] : [-x, y];
  const core = fourthQuadrant(nMax, u);
  const j: Scaled[] = [];
  const yy: Scaled[] = [];
  const h2: Scaled[] = [];
  for (let n = 0; n <= nMax; n++) {
    const a = core.j[n];
    const b = core.h2[n];
    if (x > 0 && y === 0) {
      j.push(a);
      yy.push([-b[1], 0, b[2]]); // Y = −Im H2 exactly on the real axis
      h2.push(b);
    } else if (x >= 0 && !(y > 0)) {
      j.push(a);
      yy.push(timesJ(combine(b, 1, a, -1)));
      h2.push(b);
    } else if (x >= 0) {
      j.push(conj(a));
      yy.push(conj(timesJ(combine(b, 1, a, -1))));
      h2.push(conj(combine(a, 2, b, -1)));
    } else {
      const s = n % 2 === 0 ? 1 : -1;
      const ya = timesJ(combine(b, s, a, s)); // (−1)^n·j(H2 + J)
      if (upperSide) {
        j.push(times(a, s));
        yy.push(ya);
        h2.push(combine(b, s, a, 2 * s));
      } else {
        j.push(conj(times(a, s)));
        yy.push(conj(ya));
        h2.push(conj(times(b, -s)));
      }
    }
  }
  return { j, y: yy, h2 };
}

/**
 * H0^(2)(u) and H1^(2)(u) for u ≠ 0 in the closed fourth quadrant: the series (with J0, J1
 * from `j` when given) for |u| ≤ 2, else the integral or Hankel's expansion.
 */
function hankelStart(u: Complex, j?: Scaled[]): [Scaled, Scaled] {
  if (Math.hypot(u[0], u[1]) > SMALL_ARGUMENT) {
    const [a, b] = hankel2StartScaled(u);
    return [[a[0], a[1], u[1]], [b[0], b[1], u[1]]];
  }
  const [j0, j1]: Complex[] = j ? [[j[0][0], j[0][1]], [j[1][0], j[1][1]]] : besselJSeriesSequence(1, u);
  const [y0, y1] = besselY01Series(u, j0, j1);
  return [[j0[0] + y0[1], j0[1] - y0[0], 0], [j1[0] + y1[1], j1[1] - y1[0], 0]]; // J − jY
}

/**
 * H0^(2)(z) and H1^(2)(z) alone, without J, for finite z ≠ 0 in the closed lower half-plane
 * except the upper side of the cut (Re z < 0, Im z = +0), where the result needs J; null there
 * and in the upper half-plane. The third quadrant by H_n^(2)(−z̄) = −(−1)^n conj H_n^(2)(z)
 * (module comment). This is the cheap path for the incident wave and for the upward ratios.
 *
 * @param z - argument [re, im], dimensionless
 * @returns [H0^(2), H1^(2)] as scaled values, or null
 * @example
 * unscale(hankelStartLower([4, -2])![0]); // ≈ [-0.0495373470436148, -0.0090834289559098]
 */
export function hankelStartLower(z: Complex): [Scaled, Scaled] | null {
  const [x, y] = z;
  if (!Number.isFinite(x) || !Number.isFinite(y) || (x === 0 && y === 0) || y > 0 || (x < 0 && Object.is(y, 0))) return null;
  if (x >= 0) return hankelStart(z);
  const [h0, h1] = hankelStart([-x, y]);
  return [[-h0[0], h0[1], h0[2]], [h1[0], -h1[1], h1[2]]];
}

/** J_n(u) and H_n^(2)(u), n = 0..nMax, for Re u ≥ 0, Im u ≤ 0, u ≠ 0. */
function fourthQuadrant(nMax: number, u: Complex): { j: Scaled[]; h2: Scaled[] } {
  const size = Math.hypot(u[0], u[1]);
  const top = Math.max(nMax, 1);
  let j: Scaled[];
  if (size <= SMALL_ARGUMENT) {
    j = besselJSeriesSequence(top, u).map((v) => [v[0], v[1], 0]);
  } else {
    const anchor = size >= LARGE_ARGUMENT ? besselJ01LargeScaled(u) : undefined;
    j = besselJScaledMiller(top, u, anchor).map((v) => [v[0], v[1], -u[1]]);
  }
  const [h0, h1] = hankelStart(u, j);
  if (u[1] === 0) {
    // real axis: J and Y are real, so J has no imaginary part and Re H2 is J itself, not the
    // upward recurrence's copy of it, which carries an error of about 1e-16·|Y| (all of J when n > x)
    j = j.map((v) => [v[0], 0, v[2]]);
  }
  const h2: Scaled[] = [h0, h1];
  const m2 = u[0] * u[0] + u[1] * u[1];
  const invR = u[0] / m2;
  const invI = -u[1] / m2;
  let [pr, pi] = [h0[0], h0[1]];
  let [cr, ci] = [h1[0], h1[1]];
  let log = h1[2];
  if (h0[2] !== log) [pr, pi] = [pr * Math.exp(h0[2] - log), pi * Math.exp(h0[2] - log)];
  for (let n = 1; n < nMax; n++) {
    const fr = 2 * n * invR;
    const fi = 2 * n * invI;
    const nr = fr * cr - fi * ci - pr;
    const ni = fr * ci + fi * cr - pi;
    pr = cr;
    pi = ci;
    cr = nr;
    ci = ni;
    if (Math.abs(cr) + Math.abs(ci) > BIG) {
      cr /= BIG; ci /= BIG; pr /= BIG; pi /= BIG;
      log += LOG_BIG;
    }
    h2.push([cr, ci, log]);
  }
  const hh = h2.slice(0, nMax + 1);
  if (u[1] === 0) for (const [n, v] of hh.entries()) v[0] = j[n][0] * Math.exp(j[n][2] - v[2]);
  return { j: j.slice(0, nMax + 1), h2: hh };
}
