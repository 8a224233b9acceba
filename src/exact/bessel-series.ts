/**
 * Ascending power series of the Bessel functions of integer order for a small complex
 * argument (|z| ≤ 2 in our use, where no term exceeds I0(2) ≈ 2.3, so the sums lose at most
 * about one digit to cancellation). The larger arguments go to Miller's algorithm
 * (bessel-miller.ts) and to the Hankel-function starters (bessel-hankel-start.ts).
 */
import type { Complex } from './complex.ts';

const EULER_GAMMA = 0.5772156649015329;

/** Stop a series once a term is below this fraction of the running sum (a quarter ulp). */
const SERIES_TOLERANCE = 2 ** -55;

/**
 * J_0(z) … J_nMax(z) by the ascending series J_n(z) = (z/2)^n Σ_k (−z²/4)^k / (k!·(n+k)!)
 * (DLMF 10.2.2). Orders whose value is below the smallest double come out as 0.
 *
 * @param nMax - highest order, an integer ≥ 0
 * @param z - argument, dimensionless, |z| ≤ 2 for full accuracy
 * @returns J_n(z) for n = 0..nMax
 * @example
 * besselJSeriesSequence(1, [1, 0]); // [[0.7651976865579666, 0], [0.44005058574493355, 0]]
 */
export function besselJSeriesSequence(nMax: number, z: Complex): Complex[] {
  const [zr, zi] = z;
  const ur = -(zr * zr - zi * zi) / 4; // u = −z²/4
  const ui = -(zr * zi) / 2;
  const out: Complex[] = [];
  let pr = 1; // (z/2)^n / n!
  let pi = 0;
  for (let n = 0; n <= nMax; n++) {
    if (n > 0) {
      const hr = zr / (2 * n);
      const hi = zi / (2 * n);
      const t = pr * hr - pi * hi;
      pi = pr * hi + pi * hr;
      pr = t;
    }
    let sr = 1;
    let si = 0;
    let tr = 1;
    let ti = 0;
    for (let k = 1; k < 200; k++) {
      const d = k * (n + k);
      const nr = (tr * ur - ti * ui) / d;
      ti = (tr * ui + ti * ur) / d;
      tr = nr;
      sr += tr;
      si += ti;
      if (Math.abs(tr) + Math.abs(ti) <= SERIES_TOLERANCE * (Math.abs(sr) + Math.abs(si))) break;
    }
    out.push([pr * sr - pi * si, pr * si + pi * sr]);
  }
  return out;
}

/**
 * Y_0(z) and Y_1(z) by their ascending series (DLMF 10.8.2 with n = 0 and n = 1; in the
 * harmonic-number form of Abramowitz & Stegun 9.1.13 and 9.1.11):
 *   Y0 = (2/π)(ln(z/2) + γ)·J0 − (2/π) Σ_{k≥1} H_k (−z²/4)^k/(k!)²,
 *   Y1 = −2/(πz) + (2/π)(ln(z/2) + γ)·J1 − (z/(2π)) Σ_{k≥0} (H_k + H_{k+1}) (−z²/4)^k/(k!(k+1)!),
 * with H_k the harmonic numbers. Principal branch of the logarithm (cut on the negative
 * real axis).
 *
 * @param z - argument, dimensionless, 0 < |z| ≤ 2 for full accuracy
 * @param j0 - J_0(z), from {@link besselJSeriesSequence}
 * @param j1 - J_1(z), likewise
 * @returns [Y_0(z), Y_1(z)]
 * @example
 * besselY01Series([1, 0], [0.7651976865579666, 0], [0.44005058574493355, 0]);
 * // [[0.08825696421567697, 0], [-0.7812128213002887, 0]]
 */
export function besselY01Series(z: Complex, j0: Complex, j1: Complex): [Complex, Complex] {
  const [zr, zi] = z;
  const ur = -(zr * zr - zi * zi) / 4;
  const ui = -(zr * zi) / 2;
  // sum0 = Σ_{k≥1} H_k u^k/(k!)²;  sum1 = Σ_{k≥0} (H_k + H_{k+1}) u^k/(k!(k+1)!)
  let s0r = 0;
  let s0i = 0;
  let s1r = 1; // k = 0: H_0 + H_1 = 1
  let s1i = 0;
  let t0r = 1; // u^k/(k!)²
  let t0i = 0;
  let t1r = 1; // u^k/(k!(k+1)!)
  let t1i = 0;
  let harmonic = 0;
  for (let k = 1; k < 200; k++) {
    const a = (t0r * ur - t0i * ui) / (k * k);
    t0i = (t0r * ui + t0i * ur) / (k * k);
    t0r = a;
    const b = (t1r * ur - t1i * ui) / (k * (k + 1));
    t1i = (t1r * ui + t1i * ur) / (k * (k + 1));
    t1r = b;
    harmonic += 1 / k;
    const next = 2 * harmonic + 1 / (k + 1); // H_k + H_{k+1}
    s0r += harmonic * t0r;
    s0i += harmonic * t0i;
    s1r += next * t1r;
    s1i += next * t1i;
    const size = Math.abs(t0r) + Math.abs(t0i);
    if (size * next <= SERIES_TOLERANCE * Math.min(Math.abs(s0r) + Math.abs(s0i), Math.abs(s1r) + Math.abs(s1i))) break;
  }
  const lr = Math.log(Math.hypot(zr, zi) / 2) + EULER_GAMMA; // ln(z/2) + γ
  const li = Math.atan2(zi, zr);
  const c = 2 / Math.PI;
  const y0: Complex = [c * (lr * j0[0] - li * j0[1]) - c * s0r, c * (lr * j0[1] + li * j0[0]) - c * s0i];
  // −2/(πz) = −(2/π)·conj(z)/|z|²
  const m2 = zr * zr + zi * zi;
  const zs1r = (zr * s1r - zi * s1i) / (2 * Math.PI);
  const zs1i = (zr * s1i + zi * s1r) / (2 * Math.PI);
  const y1: Complex = [
    (-c * zr) / m2 + c * (lr * j1[0] - li * j1[1]) - zs1r,
    (c * zi) / m2 + c * (lr * j1[1] + li * j1[0]) - zs1i,
  ];
  return [y0, y1];
}
