/**
 * Bessel functions J_n, Y_n and the Hankel function H_n^(2) = J_n − j·Y_n (DLMF 10.4.4) of
 * integer order n and complex argument z, on the principal branch (−π < ph z ≤ π, cut along
 * the negative real axis). With the e^{+jωt} convention H_n^(2)(kρ) is the outgoing wave, and
 * a lossy or lossless-negative medium has Im k ≤ 0, so the lower half-plane is the home
 * ground here. The methods are described in bessel-scaled.ts (and the files it draws on);
 * this file holds the public functions: single orders, all orders 0..nMax at once, the
 * scaled variants and the ratio forms for products over hundreds of orders.
 *
 * On the negative real axis Im z = +0 is read as ph z = +π (the principal value) and
 * Im z = −0 as ph z = −π, the limit from below. Unscaled results overflow to ±Infinity, or
 * underflow to 0, only where the true value is beyond the double range (J and Y for
 * |Im z| ≳ 710, H^(2) for Im z ≲ −745 or n far above |z|); the scaled variants J·e^{−|Im z|}
 * and H^(2)·e^{−Im z} do not overflow for any finite z.
 *
 * Accuracy (test/reference/bessel.test.ts against mpmath at 40+ digits, 302 cases, 0 ≤ n ≤ 200,
 * 1e-3 ≤ |z| ≤ 1e3, |Im z| ≤ 710, the whole lower half-plane, both sides of the cut, the real
 * and negative imaginary axes): error ≤ 4.4e-14 of the local size |f_n| + min(|f_{n−1}|, |f_{n+1}|),
 * which is the relative error except right beside a zero of f_n (zeros of neighbouring orders
 * interlace, so the size never vanishes). The error grows like (n + |z|)·1e-16, the number of
 * recurrence steps; H^(2) in the lower half-plane has no zeros and is relatively accurate
 * everywhere. Cost O(max(n, |z|)) per call; the sequence functions give all orders for the
 * same price.
 */
import type { Complex } from './complex.ts';
import { LARGE_ARGUMENT, besselJ01LargeScaled } from './bessel-hankel-start.ts';
import { besselJRatioChain } from './bessel-miller.ts';
import { hankelStartLower, scaledSequences, unscale } from './bessel-scaled.ts';

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
  const start = hankelStartLower(z) ?? scaledSequences(1, z).h2;
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
  return rescaled(n, z, family, 0);
}

/** One value times e^{log}; H0^(2) and H1^(2) in the lower half-plane skip J (the incident wave's case). */
function rescaled(n: number, z: Complex, family: Family, log: number): Complex {
  if (!Number.isInteger(n)) throw new RangeError(`bessel: order must be an integer, got ${n}`);
  const m = Math.abs(n);
  const v = (family === 'h2' && m <= 1 ? hankelStartLower(z)?.[m] : undefined) ?? scaledSequences(m, z)[family][m];
  const value = unscale([v[0], v[1], v[2] + log]);
  return n < 0 && m % 2 === 1 ? [-value[0], -value[1]] : value;
}

