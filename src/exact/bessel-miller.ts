/**
 * J_n(z) of integer order by Miller's backward recurrence (DLMF 3.6(iii), 10.74(iv)): the
 * recurrence J_{n−1} = (2n/z)·J_n − J_{n+1} (DLMF 10.6.1) run downward from zero far above the
 * wanted orders converges to the minimal solution J_n for any complex z ≠ 0, and the sum
 * e^{jz} = J0 + 2 Σ_{k≥1} j^k J_k (Jacobi–Anger, DLMF 10.12.1 at t = j; e^{−jz} with (−j)^k
 * when Im z > 0) fixes the scale. The sum's terms have no worse cancellation than about
 * √|z| in the lower half-plane (on the negative imaginary axis they are the positive I_k).
 * At large |z| the caller may instead anchor the scale on J0 and J1 known from elsewhere:
 * the sum then gathers more rounding (about |z| terms) than two accurate values carry.
 */
import type { Complex } from './complex.ts';

/**
 * Order N at which to start the backward recurrence so that J_0..J_nMax and their normalising
 * sum come out to about 1e-17 relative. A trial solution q with q_{k0} = 0, q_{k0+1} = 1 is run
 * forward from k0 = max(nMax, |z|) until |q| ≥ 1e17. Started at N, the recurrence yields
 * J_k − (J_{N+1}/H_{N+1})·H_k for any second solution H; by the Casoratian
 * J_{k+1}H_k − J_kH_{k+1} = −2j/(πz) (DLMF 10.5.5) the forward-grown q_N is about
 * (π|z|/2)·J_{k0}·H_N, and J_N·H_N ≈ 1/(πN) past the turning point, so
 * |J_N| ≈ |z|·|J_{k0}|/(2N·|q_N|). That is the size of the terms the normalising sum gets
 * wrong (its terms near N carry the H_k contamination, which is as large as J_N itself), and
 * the threshold puts it near 1e-17 of J_{k0}; the error at the orders wanted is far smaller
 * (the forward test of Olver's and Gautschi's method; Gautschi, SIAM Review 9(1), 1967).
 *
 * @param nMax - highest order wanted, integer ≥ 0
 * @param z - argument, dimensionless, z ≠ 0
 * @returns the starting order N > nMax
 * @example
 * millerStartOrder(0, [1, 0]); // 18
 */
export function millerStartOrder(nMax: number, z: Complex): number {
  const size = Math.hypot(z[0], z[1]);
  const k0 = Math.max(nMax, Math.ceil(size));
  if (size < 1e-100) return k0 + 3; // each order down multiplies the error by (z/2k)²
  const threshold = 1e17;
  const m2 = z[0] * z[0] + z[1] * z[1];
  const invR = z[0] / m2;
  const invI = -z[1] / m2;
  let pr = 0;
  let pi = 0;
  let qr = 1;
  let qi = 0;
  let k = k0 + 1;
  while (Math.abs(qr) + Math.abs(qi) < threshold) {
    const cr = 2 * k * invR;
    const ci = 2 * k * invI;
    const nr = cr * qr - ci * qi - pr;
    const ni = cr * qi + ci * qr - pi;
    pr = qr;
    pi = qi;
    qr = nr;
    qi = ni;
    k++;
  }
  return k + 1;
}

/**
 * The ratios J_n(z)/J_{n−1}(z) for n = 1..nMax and J_0(z)·e^{−|Im z|}, both from one backward
 * recurrence in ratio form r_n = t/(1 − t·r_{n+1}), t = z/(2n) (the continued fraction of
 * DLMF 10.10.1), started at zero at {@link millerStartOrder}. The Jacobi–Anger sum is
 * nested in the same pass, S = 1 + 2j·r_1·T_2 with T_k = 1 + j·r_k·T_{k+1} (−j when
 * Im z > 0), and J_0·e^{−|Im z|} = e^{±j Re z}/S. Nothing overflows. Next to a zero of
 * J_{n−1} the ratio r_n is large and only good to a few digits, but products of consecutive
 * ratios, and J_0 with r_1, stay consistent to full precision, because they all come from the
 * same numbers.
 *
 * Given `anchor` = [J0, J1]·e^{−|Im z|} from elsewhere, J0 is fitted to it instead (least
 * squares on the chain's 1 and r_1, which keeps the two consistent).
 *
 * @param nMax - highest order, integer ≥ 0
 * @param z - argument, dimensionless, any complex z ≠ 0
 * @param anchor - optional [J0, J1]·e^{−|Im z|}
 * @returns ratios (length nMax + 1, entry n = J_n/J_{n−1}, entry 0 NaN) and j0Scaled
 * @example
 * besselJRatioChain(1, [1, 0]).ratios[1]; // ≈ [0.5750809, 0]  (J1(1)/J0(1))
 */
export function besselJRatioChain(nMax: number, z: Complex, anchor?: [Complex, Complex]): { ratios: Complex[]; j0Scaled: Complex } {
  const start = millerStartOrder(Math.max(nMax, 1), z);
  const ratios: Complex[] = new Array(Math.max(nMax, 1) + 1);
  ratios[0] = [Number.NaN, Number.NaN];
  const sign = z[1] > 0 ? -1 : 1;
  let rr = 0;
  let ri = 0;
  let tr = 1; // T_{n+1}
  let ti = 0;
  for (let n = start; n >= 1; n--) {
    const ar = z[0] / (2 * n);
    const ai = z[1] / (2 * n);
    const dr = 1 - (ar * rr - ai * ri);
    const di = -(ar * ri + ai * rr);
    const d2 = dr * dr + di * di;
    const nr = (ar * dr + ai * di) / d2;
    ri = (ai * dr - ar * di) / d2;
    rr = nr;
    if (n < ratios.length) ratios[n] = [rr, ri];
    // T_n = 1 + (±j)·r_n·T_{n+1}; at n = 1 the weight is 2 and the 1 is J_0's own term
    const pr = rr * tr - ri * ti;
    const pi = rr * ti + ri * tr;
    const w = n === 1 ? 2 : 1;
    tr = 1 - sign * w * pi;
    ti = sign * w * pr;
  }
  if (anchor) return { ratios: ratios.slice(0, nMax + 1), j0Scaled: anchorFactor([1, 0], ratios[1], anchor) };
  // J_0·e^{−|Im z|} = e^{±j Re z}/S
  const cr = Math.cos(z[0]);
  const ci = sign * Math.sin(z[0]);
  const m = Math.max(Math.abs(tr), Math.abs(ti));
  const sr = tr / m;
  const si = ti / m;
  const s2 = (sr * sr + si * si) * m;
  return { ratios: ratios.slice(0, nMax + 1), j0Scaled: [(cr * sr + ci * si) / s2, (ci * sr - cr * si) / s2] };
}

/**
 * The factor α minimising |α·f0 − a0|² + |α·f1 − a1|²: scales a trial solution onto two known
 * values (a zero of one of J0, J1 costs nothing, since they never vanish together).
 */
function anchorFactor(f0: Complex, f1: Complex, anchor: [Complex, Complex]): Complex {
  const m = Math.max(Math.abs(f0[0]), Math.abs(f0[1]), Math.abs(f1[0]), Math.abs(f1[1]));
  const [g0r, g0i, g1r, g1i] = [f0[0] / m, f0[1] / m, f1[0] / m, f1[1] / m];
  const [a0, a1] = anchor;
  const nr = g0r * a0[0] + g0i * a0[1] + g1r * a1[0] + g1i * a1[1]; // conj(g0)a0 + conj(g1)a1
  const ni = g0r * a0[1] - g0i * a0[0] + g1r * a1[1] - g1i * a1[0];
  const d = (g0r * g0r + g0i * g0i + g1r * g1r + g1i * g1i) * m;
  return [nr / d, ni / d];
}

/** Above this size the trial values are scaled down (by 2^−600) to stay finite. */
const RESCALE_AT = 2 ** 600;

/**
 * J_n(z)·e^{−|Im z|} for n = 0..nMax by Miller's algorithm with the Jacobi–Anger
 * normalisation (module comment). The e^{−|Im z|} scaling removes the growth of J in |Im z|,
 * so the result is finite for every finite z; orders whose scaled value is below the
 * smallest double come out as 0.
 *
 * Given `anchor` = [J0, J1]·e^{−|Im z|} from elsewhere, the scale is fitted to it instead.
 *
 * @param nMax - highest order, integer ≥ 1
 * @param z - argument, dimensionless, z ≠ 0 (accurate for |z| ≳ 1; the power series serve below)
 * @param anchor - optional [J0, J1]·e^{−|Im z|}
 * @returns J_n(z)·e^{−|Im z|} for n = 0..nMax
 * @example
 * besselJScaledMiller(1, [0, -5])[0]; // ≈ [0.1835408126, 0]  (e^{−5}·I0(5))
 */
export function besselJScaledMiller(nMax: number, z: Complex, anchor?: [Complex, Complex]): Complex[] {
  const start = millerStartOrder(nMax, z);
  const m2 = z[0] * z[0] + z[1] * z[1];
  const invR = z[0] / m2;
  const invI = -z[1] / m2;
  // weights 2·u^k with u = j (Im z ≤ 0) or −j (Im z > 0)
  const sign = z[1] > 0 ? -1 : 1;
  const outR = new Float64Array(nMax + 1);
  const outI = new Float64Array(nMax + 1);
  let nextR = 0; // f_{k+1}
  let nextI = 0;
  let curR = 1; // f_k at k = start
  let curI = 0;
  let sumR = 0;
  let sumI = 0;
  for (let k = start; k >= 0; k--) {
    if (k <= nMax) {
      outR[k] = curR;
      outI[k] = curI;
    }
    // add w_k·f_k, w_0 = 1, w_k = 2(sign·j)^k
    const w = k === 0 ? 1 : 2;
    switch ((sign * k) & 3) {
      case 0: sumR += w * curR; sumI += w * curI; break;
      case 1: sumR -= w * curI; sumI += w * curR; break;
      case 2: sumR -= w * curR; sumI -= w * curI; break;
      default: sumR += w * curI; sumI -= w * curR; break;
    }
    if (k === 0) break;
    const cr = 2 * k * invR;
    const ci = 2 * k * invI;
    const prevR = cr * curR - ci * curI - nextR;
    const prevI = cr * curI + ci * curR - nextI;
    nextR = curR;
    nextI = curI;
    curR = prevR;
    curI = prevI;
    if (Math.abs(curR) + Math.abs(curI) > RESCALE_AT) {
      const s = 1 / RESCALE_AT;
      curR *= s; curI *= s; nextR *= s; nextI *= s; sumR *= s; sumI *= s;
      for (let j = k; j <= nMax; j++) {
        outR[j] *= s;
        outI[j] *= s;
      }
    }
  }
  if (anchor) {
    const [gr, gi] = anchorFactor([outR[0], outI[0]], [outR[1], outI[1]], anchor);
    return Array.from({ length: nMax + 1 }, (_, k) => [outR[k] * gr - outI[k] * gi, outR[k] * gi + outI[k] * gr] as Complex);
  }
  // J_k e^{−|Im z|} = f_k·e^{±j Re z}/S
  const pr = Math.cos(z[0]);
  const pi = sign * Math.sin(z[0]);
  // g = e^{±j Re z}/S, with S scaled to order one first so that |S|² cannot overflow
  const m = Math.max(Math.abs(sumR), Math.abs(sumI));
  const sr = sumR / m;
  const si = sumI / m;
  const s2 = (sr * sr + si * si) * m;
  const gr = (pr * sr + pi * si) / s2;
  const gi = (pi * sr - pr * si) / s2;
  const out: Complex[] = [];
  for (let k = 0; k <= nMax; k++) out.push([outR[k] * gr - outI[k] * gi, outR[k] * gi + outI[k] * gr]);
  return out;
}
