import { describe, expect, it } from 'vitest';
import { exactTimeSeries } from '../../src/exact/transient.ts';
import { lineCurrentTransfer } from '../../src/exact/transfer.ts';
import { waveformExtent, waveformSpectrum, waveformValue } from '../../src/scenario/waveforms.ts';
import { C0, MU0 } from '../../src/scenario/constants.ts';
import type { Waveform } from '../../src/scenario/types.ts';

/*
 * The transient field and the transfer function are two computations of one field, by
 * different methods (quadrature in time, Bessel functions in frequency). If both are right,
 *   ∫ Ez(t)e^{−jωt} dt / ∫ I(t)e^{−jωt} dt = Z(f, ρ).
 * Both transforms are taken with the trapezoid rule on one grid t_m = t_start + m·h. For a
 * smooth pulse that is negligible at t_start this rule is spectrally accurate: its error is
 * the aliased spectrum at 2π/h − ω, below e^{−(πτ/h)²}-like levels for the step used here
 * (Trefethen & Weideman, SIAM Review 56, 2014). The current is negligible at the window's end,
 * but the field is not: in 2D it leaves a wake that decays only as 1/t². That wake is added
 * beyond the window analytically:
 *   Ez(t) ≈ (μ0/2π) Σ_n c_n t^{−n},  c_n = Σ_j b_j a^{2j} C(n−1, n−2−2j) M_{n−2−2j},
 * from K′(s) = −s(s² − a²)^{−3/2} = −Σ_j b_j a^{2j} s^{−2−2j} (b = 1, 3/2, 15/8, …),
 * (t − τ)^{−p} = t^{−p} Σ_m C(p+m−1, m)(τ/t)^m and the moments M_m = ∫ τ^m I dτ; and
 *   ∫_T^∞ t^{−n} e^{−jωt} dt = e^{−jωT}/(jωT^n) Σ_k (−1)^k (n)_k/(jωT)^k
 * (repeated integration by parts; used where ωT ≥ 60). The trapezoid sum ending at T with
 * a non-zero integrand gets the Euler–Maclaurin end correction −(h²/12)·g′(T).
 */

const TAIL_ORDER = 8; // moments M_0..M_8, wake terms t^{−2}..t^{−10}
const KERNEL = [1, 3 / 2, 15 / 8, 35 / 16, 315 / 128];

function binomial(n: number, k: number): number {
  let r = 1;
  for (let i = 1; i <= k; i++) r = (r * (n - k + i)) / i;
  return r;
}

interface Case { name: string; w: Waveform; h: number; fMin: number }

function spectralRatioError(c: Case, rho: number, epsR: number): { worst: number; count: number } {
  const { w, h } = c;
  const a = (rho * Math.sqrt(epsR)) / C0;
  const tStart = w.t0 - waveformExtent(w) - 10 * h;
  const steps = Math.round((2e-8 - tStart) / h);
  const tEnd = tStart + steps * h;
  // Field on the grid t_m = tStart + m·h: shift the pulse so the series starts at tStart.
  const field = exactTimeSeries({ ...w, t0: w.t0 - tStart }, 1, rho, epsR, h, steps + 1);
  const current = new Float64Array(steps + 1);
  for (let m = 0; m <= steps; m++) current[m] = waveformValue(w, 1, tStart + m * h);
  const weight = (m: number) => (m === 0 || m === steps ? 0.5 * h : h);

  const moments: number[] = [];
  for (let p = 0; p <= TAIL_ORDER; p++) {
    let s = 0;
    for (let m = 0; m <= steps; m++) s += weight(m) * (tStart + m * h) ** p * current[m];
    moments.push(s);
  }
  const wake: number[] = []; // (μ0/2π)·c_n, the coefficient of t^{−n}
  for (let n = 0; n <= TAIL_ORDER + 2; n++) {
    let sum = 0;
    for (let j = 0; 2 + 2 * j <= n; j++) sum += KERNEL[j] * a ** (2 * j) * binomial(n - 1, n - 2 - 2 * j) * moments[n - 2 - 2 * j];
    wake.push((MU0 / (2 * Math.PI)) * sum);
  }
  let wakeSlope = 0;
  for (let n = 2; n < wake.length; n++) wakeSlope -= (n * wake[n]) / tEnd ** (n + 1);

  // The band: where |I(f)| is within 40 dB of its peak, on a 0.2 GHz grid.
  let peak = 0;
  for (let f = 0; f <= 5e10; f += 1e7) peak = Math.max(peak, Math.hypot(...waveformSpectrum(w, 1, f)));
  let worst = 0;
  let count = 0;
  for (let f = 2e8; f <= 5e10; f += 2e8) {
    if (f < c.fMin || Math.hypot(...waveformSpectrum(w, 1, f)) < 0.01 * peak) continue;
    const omega = 2 * Math.PI * f;
    let numRe = 0;
    let numIm = 0;
    let denRe = 0;
    let denIm = 0;
    for (let m = 0; m <= steps; m++) {
      const t = tStart + m * h;
      const cos = Math.cos(omega * t);
      const sin = -Math.sin(omega * t);
      const wt = weight(m);
      numRe += wt * field[m] * cos;
      numIm += wt * field[m] * sin;
      denRe += wt * current[m] * cos;
      denIm += wt * current[m] * sin;
    }
    const endRe = Math.cos(omega * tEnd);
    const endIm = -Math.sin(omega * tEnd);
    const x = omega * tEnd;
    for (let n = 2; n < wake.length; n++) {
      let seriesRe = 0;
      let seriesIm = 0;
      let termRe = 1;
      let termIm = 0;
      for (let k = 0; k < 40; k++) {
        seriesRe += termRe;
        seriesIm += termIm;
        const factor = (n + k) / x; // multiply by −(n+k)/(jx) = j(n+k)/x
        [termRe, termIm] = [-termIm * factor, termRe * factor];
      }
      const scale = wake[n] / (omega * tEnd ** n); // e^{−jωT}/(jω T^n) = −j·e^{−jωT}/(ωT^n)
      const preRe = endIm * scale;
      const preIm = -endRe * scale;
      numRe += preRe * seriesRe - preIm * seriesIm;
      numIm += preRe * seriesIm + preIm * seriesRe;
    }
    const slopeRe = wakeSlope;
    const slopeIm = -omega * field[steps]; // g′(T) = (f′(T) − jω f(T))·e^{−jωT}
    numRe -= ((h * h) / 12) * (slopeRe * endRe - slopeIm * endIm);
    numIm -= ((h * h) / 12) * (slopeRe * endIm + slopeIm * endRe);

    const den2 = denRe * denRe + denIm * denIm;
    const ratioRe = (numRe * denRe + numIm * denIm) / den2;
    const ratioIm = (numIm * denRe - numRe * denIm) / den2;
    const [zRe, zIm] = lineCurrentTransfer(f, rho, epsR);
    worst = Math.max(worst, Math.hypot(ratioRe - zRe, ratioIm - zIm) / Math.hypot(zRe, zIm));
    count++;
  }
  return { worst, count };
}

describe('transient field and transfer function describe the same field', () => {
  const cases: Case[] = [
    // Gaussian band reaches DC, where Z → 0 and the wake dominates; start at 0.5 GHz (ωT ≥ 60).
    { name: 'gaussian', w: { kind: 'gaussian', tau: 1e-10, t0: 5e-10 }, h: 2e-12, fMin: 5e8 },
    { name: 'modulated-gaussian', w: { kind: 'modulated-gaussian', f0: 1e10, tau: 1e-10, t0: 5e-10 }, h: 2e-12, fMin: 0 },
    { name: 'ricker', w: { kind: 'ricker', f0: 1e10, t0: 2e-10 }, h: 1e-12, fMin: 0 },
  ];
  for (const c of cases) {
    it(`${c.name}: F{Ez}/F{I} = −(ωμ0/4)·H0^(2)(kρ) to 1e-8 across the 40 dB band`, () => {
      for (const [rho, epsR] of [[0.01, 1], [0.05, 1], [0.02, 4]]) {
        const { worst, count } = spectralRatioError(c, rho, epsR);
        expect(count).toBeGreaterThan(20);
        // Required: 1e-6. Measured: 2e-11 at worst, so hold it to 1e-8.
        expect(worst).toBeLessThan(1e-8); // Harrington 1961 ch. 5 (frequency domain) vs Morse & Feshbach 1953 ch. 7 (time domain)
      }
    });
  }
});
