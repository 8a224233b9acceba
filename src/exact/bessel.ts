/**
 * Bessel functions J_n, Y_n and the Hankel function H_n^(2) = J_n − j·Y_n (DLMF 10.4.4) of
 * integer order n and complex argument z, on the principal branch (−π < ph z ≤ π, cut along
 * the negative real axis). With the e^{+jωt} convention H_n^(2)(kρ) is the outgoing wave, and
 * a lossy or lossless-negative medium has Im k ≤ 0, so the lower half-plane is the home
 * ground here.
 *
 * How the values are made, all in the closed fourth quadrant u (Re u ≥ 0, Im u ≤ 0):
 *  - J_n(u): the ascending series for |u| ≤ 2 (bessel-series.ts), Miller's backward
 *    recurrence with the Jacobi–Anger normalisation above (bessel-miller.ts).
 *  - H_n^(2)(u): H0 and H1 from the series (|u| ≤ 2), an integral or Hankel's expansion
 *    (bessel-hankel-start.ts), then the upward recurrence DLMF 10.6.1, which is stable for
 *    H^(2) in the lower half-plane (it is the dominant solution there for growing n).
 *  - Y_n(u) = j·(H_n^(2) − J_n). Never J − jY for H^(2): in the lower half-plane H^(2) is
 *    smaller than J and Y by e^{2|Im u|}, and the subtraction would lose that many digits.
 * The rest of the plane follows by J_n(z̄) = conj J_n(z) with H^(2)(z̄) = conj H^(1)(z)
 * (DLMF 10.11.9) and by the continuation formulas across the cut, DLMF 10.11.1–10.11.2 at
 * m = ±1: J_n(ze^{±πj}) = (−1)^n J_n(z), Y_n(ze^{±πj}) = (−1)^n (Y_n(z) ± 2j J_n(z)).
 * On the negative real axis Im z = +0 is read as ph z = +π (the principal value) and
 * Im z = −0 as ph z = −π, the limit from below.
 *
 * Internally every value carries a natural-log scale (J grows like e^{|Im z|}, H^(2) like
 * (n−1)!(2/z)^n), so the unscaled results overflow to ±Infinity, or underflow to 0, only
 * where the true value is beyond the double range; the scaled variants never do.
 */
import type { Complex } from './complex.ts';
import { LARGE_ARGUMENT, SMALL_ARGUMENT, besselJ01LargeScaled, hankel2StartScaled } from './bessel-hankel-start.ts';
import { besselJRatioChain, besselJScaledMiller } from './bessel-miller.ts';
import { besselJSeriesSequence, besselY01Series } from './bessel-series.ts';

/** All three families at one argument, orders 0..nMax. */
export interface BesselSequences {
  j: Complex[];
  y: Complex[];
  h2: Complex[];
}

/**
 * A sequence f_0..f_nMax given as f_0 = first·e^{logScale} and the ratios f_n/f_{n−1}: the form
 * that neither overflows nor underflows at high orders, for products of many such factors.
 */
export interface RatioSequence {
  first: Complex;
  logScale: number;
  /** ratios[n] = f_n/f_{n−1} for n ≥ 1; ratios[0] is NaN. */
  ratios: Complex[];
}

/** A value m·e^{log}: [re(m), im(m), log]. */
type Scaled = [number, number, number];

/** Above this size a recurrence's values are scaled down and the scale carried in the log. */
const BIG = 2 ** 600;
const LOG_BIG = 600 * Math.LN2;

/**
 * J_n(z), Bessel function of the first kind (DLMF 10.2.2), integer order, complex argument.
 * Negative orders by J_{−n} = (−1)^n J_n (DLMF 10.4.1).
 *
 * @param n - order, an integer
 * @param z - argument [re, im], dimensionless
 * @returns J_n(z)
 * @throws RangeError when n is not an integer
 * @example
 * besselJ(0, [4, 2]); // ≈ [-1.3787022343924844, 0.3905423570667095]
 */
export function besselJ(n: number, z: Complex): Complex {
  return single(n, z, 'j');
}

/**
 * Y_n(z), Bessel function of the second kind (DLMF 10.2.3), integer order, principal branch.
 * Y_{−n} = (−1)^n Y_n (DLMF 10.4.1). Y_n(0) = −Infinity (real).
 *
 * @param n - order, an integer
 * @param z - argument [re, im], dimensionless
 * @returns Y_n(z)
 * @throws RangeError when n is not an integer
 * @example
 * besselY(0, [1, 0]); // ≈ [0.08825696421567697, 0]
 */
export function besselY(n: number, z: Complex): Complex {
  return single(n, z, 'y');
}

/**
 * H_n^(2)(z) = J_n(z) − j·Y_n(z) (DLMF 10.4.4), integer order, principal branch; the outgoing
 * cylindrical wave of order n with e^{+jωt}. H^(2)_{−n} = (−1)^n H^(2)_n (DLMF 10.4.6).
 * (The real-argument, order-zero routine of the same name is in hankel2.ts.)
 *
 * @param n - order, an integer
 * @param z - argument [re, im], dimensionless
 * @returns H_n^(2)(z); at z = 0, [J_n(0), +Infinity]
 * @throws RangeError when n is not an integer
 * @example
 * hankel2(5, [4, -2]); // ≈ [-0.21889019762227033, 0.09309925623202772]
 */
export function hankel2(n: number, z: Complex): Complex {
  return single(n, z, 'h2');
}

/**
 * J_0(z)..J_nMax(z) in one pass (cost O(nMax + |z|)).
 *
 * @param nMax - highest order, an integer ≥ 0
 * @param z - argument [re, im], dimensionless
 * @returns array of nMax + 1 values, index = order
 * @throws RangeError when nMax is not an integer ≥ 0
 * @example
 * besselJSequence(2, [1, 0]); // ≈ [[0.76520, 0], [0.44005, 0], [0.11490, 0]]
 */
export function besselJSequence(nMax: number, z: Complex): Complex[] {
  return besselSequences(nMax, z).j;
}

/**
 * Y_0(z)..Y_nMax(z) in one pass (cost O(nMax + |z|)).
 *
 * @param nMax - highest order, an integer ≥ 0
 * @param z - argument [re, im], dimensionless
 * @returns array of nMax + 1 values, index = order
 * @throws RangeError when nMax is not an integer ≥ 0
 * @example
 * besselYSequence(1, [1, 0]); // ≈ [[0.08826, 0], [-0.78121, 0]]
 */
export function besselYSequence(nMax: number, z: Complex): Complex[] {
  return besselSequences(nMax, z).y;
}

/**
 * H_0^(2)(z)..H_nMax^(2)(z) in one pass (cost O(nMax + |z|)).
 *
 * @param nMax - highest order, an integer ≥ 0
 * @param z - argument [re, im], dimensionless
 * @returns array of nMax + 1 values, index = order
 * @throws RangeError when nMax is not an integer ≥ 0
 * @example
 * hankel2Sequence(1, [1, 0]); // ≈ [[0.76520, -0.08826], [0.44005, 0.78121]]
 */
export function hankel2Sequence(nMax: number, z: Complex): Complex[] {
  return besselSequences(nMax, z).h2;
}

/**
 * J_n, Y_n and H_n^(2) for n = 0..nMax at one argument, sharing the work (module comment).
 * Non-finite arguments give NaN everywhere, except z = +∞ on the real axis, where every
 * value is 0 (the functions decay like |z|^{−1/2}).
 *
 * @param nMax - highest order, an integer ≥ 0
 * @param z - argument [re, im], dimensionless
 * @returns the three sequences, index = order
 * @throws RangeError when nMax is not an integer ≥ 0
 * @example
 * besselSequences(1, [2, -1]).h2[1]; // H_1^(2)(2 − j)
 */
export function besselSequences(nMax: number, z: Complex): BesselSequences {
  checkOrder(nMax, 'nMax');
  const scaled = scaledSequences(nMax, z);
  return { j: scaled.j.map(unscale), y: scaled.y.map(unscale), h2: scaled.h2.map(unscale) };
}

/**
 * J_n(z)·e^{−|Im z|}: finite for every finite z (the scaled form of DLMF 10.14.4's bound).
 *
 * @param n - order, an integer
 * @param z - argument [re, im], dimensionless
 * @returns J_n(z)·e^{−|Im z|}
 * @example
 * besselJScaled(0, [0, -800]); // ≈ [0.0141, 0]: e^{−800}·I0(800), though I0(800) overflows
 */
export function besselJScaled(n: number, z: Complex): Complex {
  return rescaled(n, z, 'j', -Math.abs(z[1]));
}

/**
 * H_n^(2)(z)·e^{−Im z}: takes off the e^{Im z} size of the outgoing wave, so it stays finite
 * deep in the lower half-plane where H^(2) itself underflows.
 *
 * @param n - order, an integer
 * @param z - argument [re, im], dimensionless
 * @returns H_n^(2)(z)·e^{−Im z}
 * @example
 * hankel2Scaled(0, [0, -800]); // ≈ [0, 0.0282]: (2j/π)·e^{800}·K0(800)
 */
export function hankel2Scaled(n: number, z: Complex): Complex {
  return rescaled(n, z, 'h2', -z[1]);
}

/**
 * J_n(z) for n = 0..nMax as a {@link RatioSequence}: first = J_0(z)·e^{−|Im z|},
 * logScale = |Im z|, ratios from the backward recurrence, first from the same pass so that
 * the two agree even next to a zero of J_0 (bessel-miller.ts). Any z ≠ 0.
 *
 * @param nMax - highest order, an integer ≥ 0
 * @param z - argument [re, im], dimensionless, finite, not 0
 * @returns the ratio form of J_0..J_nMax
 * @throws RangeError for z = 0 or non-finite z, or a bad nMax
 * @example
 * const s = besselJRatioSequence(3, [2, 0]); // s.ratios[1] = J1(2)/J0(2) ≈ 2.5759
 */
export function besselJRatioSequence(nMax: number, z: Complex): RatioSequence {
  checkOrder(nMax, 'nMax');
  checkNonZeroFinite(z);
  const { ratios, j0Scaled } = besselJRatioChain(nMax, z, largeAnchor(z));
  return { first: j0Scaled, logScale: Math.abs(z[1]), ratios };
}

/**
 * H_n^(2)(z) for n = 0..nMax as a {@link RatioSequence}: first = H_0^(2)(z)·e^{−Im z},
 * logScale = Im z, ratios from the upward recurrence in ratio form
 * h_{n+1} = 2n/z − 1/h_n (DLMF 10.6.1), which is stable for Im z ≤ 0 only.
 *
 * @param nMax - highest order, an integer ≥ 0
 * @param z - argument [re, im], dimensionless, finite, not 0, Im z ≤ 0
 * @returns the ratio form of H_0^(2)..H_nMax^(2)
 * @throws RangeError for Im z > 0, z = 0, non-finite z or a bad nMax
 * @example
 * const s = hankel2RatioSequence(300, [2, -0.5]); // s.ratios[300] ≈ 2·299/z: no overflow
 */
export function hankel2RatioSequence(nMax: number, z: Complex): RatioSequence {
  checkOrder(nMax, 'nMax');
  checkNonZeroFinite(z);
  if (z[1] > 0) throw new RangeError(`hankel2RatioSequence: needs Im z ≤ 0 (upward recurrence is unstable above), got ${z[1]}`);
  const start = scaledSequences(1, z).h2;
  const h0 = start[0];
  const ratios: Complex[] = [[Number.NaN, Number.NaN]];
  if (nMax >= 1) {
    const e = Math.exp(start[1][2] - h0[2]);
    const d = h0[0] * h0[0] + h0[1] * h0[1];
    let hr = (e * (start[1][0] * h0[0] + start[1][1] * h0[1])) / d;
    let hi = (e * (start[1][1] * h0[0] - start[1][0] * h0[1])) / d;
    ratios.push([hr, hi]);
    const m2 = z[0] * z[0] + z[1] * z[1];
    for (let n = 1; n < nMax; n++) {
      const h2 = hr * hr + hi * hi;
      const nr = (2 * n * z[0]) / m2 - hr / h2;
      hi = (-2 * n * z[1]) / m2 + hi / h2;
      hr = nr;
      ratios.push([hr, hi]);
    }
  }
  const first = unscale([h0[0], h0[1], h0[2] - z[1]]);
  return { first, logScale: z[1], ratios };
}

// ---------------------------------------------------------------------------------------

function checkOrder(n: number, name: string): void {
  if (!Number.isInteger(n) || n < 0) throw new RangeError(`bessel: ${name} must be an integer ≥ 0, got ${n}`);
}

function checkNonZeroFinite(z: Complex): void {
  if (!Number.isFinite(z[0]) || !Number.isFinite(z[1]) || (z[0] === 0 && z[1] === 0)) {
    throw new RangeError(`bessel: argument must be finite and non-zero, got [${z[0]}, ${z[1]}]`);
  }
}

/**
 * [J0, J1]·e^{−|Im z|} from Hankel's expansions for |z| ≥ 25, mapped from the fourth quadrant
 * by J_n(z̄) = conj J_n(z) and J_n(−z) = (−1)^n J_n(z) (DLMF 10.11.9, 10.11.1); else undefined.
 */
function largeAnchor(z: Complex): [Complex, Complex] | undefined {
  if (Math.hypot(z[0], z[1]) < LARGE_ARGUMENT) return undefined;
  const [a, b] = besselJ01LargeScaled([Math.abs(z[0]), -Math.abs(z[1])]);
  const flip = z[1] > 0 !== z[0] < 0; // one reflection of the two: conjugate
  const sign = z[0] < 0 ? -1 : 1; // J1 is odd
  return [
    flip ? [a[0], -a[1]] : a,
    flip ? [sign * b[0], -sign * b[1]] : [sign * b[0], sign * b[1]],
  ];
}

type Family = 'j' | 'y' | 'h2';

function single(n: number, z: Complex, family: Family): Complex {
  if (!Number.isInteger(n)) throw new RangeError(`bessel: order must be an integer, got ${n}`);
  const m = Math.abs(n);
  const value = unscale(scaledSequences(m, z)[family][m]);
  return n < 0 && m % 2 === 1 ? [-value[0], -value[1]] : value;
}

function rescaled(n: number, z: Complex, family: Family, log: number): Complex {
  if (!Number.isInteger(n)) throw new RangeError(`bessel: order must be an integer, got ${n}`);
  const m = Math.abs(n);
  const v = scaledSequences(m, z)[family][m];
  const value = unscale([v[0], v[1], v[2] + log]);
  return n < 0 && m % 2 === 1 ? [-value[0], -value[1]] : value;
}

/** m·e^{log} as a plain complex number, multiplying in steps so that nothing over- or underflows early. */
function unscale(s: Scaled): Complex {
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

interface ScaledSequences { j: Scaled[]; y: Scaled[]; h2: Scaled[] }

function constant(nMax: number, value: (n: number) => Complex): Scaled[] {
  return Array.from({ length: nMax + 1 }, (_, n) => [...value(n), 0] as Scaled);
}

/** The three families anywhere in the plane, from the fourth-quadrant core (module comment). */
function scaledSequences(nMax: number, z: Complex): ScaledSequences {
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

/** J_n(u) and H_n^(2)(u), n = 0..nMax, for Re u ≥ 0, Im u ≤ 0, u ≠ 0. */
function fourthQuadrant(nMax: number, u: Complex): { j: Scaled[]; h2: Scaled[] } {
  const size = Math.hypot(u[0], u[1]);
  const top = Math.max(nMax, 1);
  let j: Scaled[];
  let h0: Scaled;
  let h1: Scaled;
  if (size <= SMALL_ARGUMENT) {
    const jj = besselJSeriesSequence(top, u);
    const [y0, y1] = besselY01Series(u, jj[0], jj[1]);
    j = jj.map((v) => [v[0], v[1], 0]);
    h0 = [jj[0][0] + y0[1], jj[0][1] - y0[0], 0]; // J − jY
    h1 = [jj[1][0] + y1[1], jj[1][1] - y1[0], 0];
  } else {
    const scale = -u[1]; // |Im u|
    const anchor = size >= LARGE_ARGUMENT ? besselJ01LargeScaled(u) : undefined;
    j = besselJScaledMiller(top, u, anchor).map((v) => [v[0], v[1], scale]);
    const [a, b] = hankel2StartScaled(u);
    h0 = [a[0], a[1], u[1]];
    h1 = [b[0], b[1], u[1]];
  }
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
