import { describe, expect, it } from 'vitest';
import { synthesizedLineSource } from '../../src/exact/synthesis-line-source.ts';
import { telegraphField, telegraphTimeSeries } from '../../src/exact/telegraph.ts';
import { exactTimeSeries, transientField } from '../../src/exact/transient.ts';
import { C0, EPS0, MU0 } from '../../src/scenario/constants.ts';
import type { Waveform } from '../../src/scenario/types.ts';
import { waveformDerivative, waveformExtent } from '../../src/scenario/waveforms.ts';

const gaussian: Waveform = { kind: 'gaussian', tau: 1e-10, t0: 5e-10 };
const modulated: Waveform = { kind: 'modulated-gaussian', f0: 1e10, tau: 1e-10, t0: 5e-10 };
const ricker: Waveform = { kind: 'ricker', f0: 1e10, t0: 2e-10 };
const kinds = { gaussian, modulated, ricker };
const EPS_R = 4;
/** Loss rate a = σ/(2ε), 1/s. */
const rate = (sigma: number) => sigma / (2 * EPS0 * EPS_R);

/**
 * Times from the front until well behind the pulse, and past the diffusion peak, which comes
 * at about a·(ρ/c)² after the front when the direct wave is damped out (a·ρ/c ≫ 1).
 */
function sampleTimes(w: Waveform, rho: number, count: number, sigma = 0): number[] {
  const delay = (rho * Math.sqrt(EPS_R)) / C0;
  const front = delay + w.t0 - waveformExtent(w);
  const end = front + 2 * waveformExtent(w) + 3e-9 + 2 * rate(sigma) * delay * delay;
  return Array.from({ length: count }, (_, n) => front + ((end - front) * (n + 0.5)) / count);
}

describe('telegraphField: Ez = −(μ0/2π)∫ I′(t − (ρ/c)cosh u)·e^{−a(ρ/c)cosh u}cosh(a(ρ/c)sinh u) du', () => {
  it('is the lossless field exactly when σ = 0', () => {
    for (const w of Object.values(kinds)) {
      const a = telegraphTimeSeries(w, 1, 0.05, EPS_R, 0, 1e-12, 3000);
      const b = exactTimeSeries(w, 1, 0.05, EPS_R, 1e-12, 3000);
      expect(Array.from(a)).toEqual(Array.from(b)); // weight (e^{0} + e^{0})/2 = 1: transient.ts (Morse & Feshbach ch. 7)
      expect(telegraphField(w, 1, 0.02, EPS_R, 0, 1.3e-9)).toBe(transientField(w, 1, 0.02, EPS_R, 1.3e-9)); // same
    }
  });

  /**
   * The scale errors are measured against: the field's peak, or 1e-6 of the lossless field's
   * peak at the same ρ when that is larger. Where a·ρ/c ≫ 1 only a remainder of the pulse
   * survives, the integrand cancels to far below its own size (a zero-mean pulse in a
   * diffusive medium keeps 1e-12 of it or less), and no quadrature in double precision gets
   * that remainder to 1e-10 of itself; it is held to 1e-16 of the lossless peak instead.
   */
  function scale(w: Waveform, rho: number, peak: number): number {
    let lossless = 0;
    for (const t of sampleTimes(w, rho, 200)) lossless = Math.max(lossless, Math.abs(transientField(w, 1, rho, EPS_R, t)));
    return Math.max(peak, 1e-6 * lossless);
  }

  for (const [name, w] of Object.entries(kinds)) {
    it(`${name}: the quadrature converges to better than 1e-10 of the peak`, () => {
      for (const sigma of [0.01, 1, 30]) {
        for (const rho of [1e-3, 0.03, 0.3]) {
          let peak = 0;
          let difference = 0;
          for (const t of sampleTimes(w, rho, 200, sigma)) {
            const base = telegraphField(w, 1, rho, EPS_R, sigma, t);
            const refined = telegraphField(w, 1, rho, EPS_R, sigma, t, 3);
            peak = Math.max(peak, Math.abs(refined));
            difference = Math.max(difference, Math.abs(refined - base));
          }
          expect(difference / scale(w, rho, peak)).toBeLessThan(1e-10); // common practice, no source (refinement study)
        }
      }
    });
  }

  it('agrees with an independent trapezoid rule in u (both the u and the wake forms)', () => {
    // The integrand is even in u and negligible where the retarded time leaves the pulse, so the
    // trapezoid rule on [0, U] (the midpoint rule once the front is past the pulse) converges
    // geometrically (Trefethen & Weideman, SIAM Review 56, 2014).
    for (const sigma of [0.1, 3]) {
      for (const rho of [2e-3, 0.05]) {
        const T = (rho * Math.sqrt(EPS_R)) / C0;
        const A = rate(sigma) * T;
        let peak = 0;
        let difference = 0;
        for (const t of sampleTimes(ricker, rho, 25)) {
          // the u where the retarded time is in the pulse window; I′ is below 1e-11 of its peak at both ends
          const upper = Math.acosh((t - (ricker.t0 - waveformExtent(ricker))) / T);
          const lower = Math.acosh(Math.max(1, (t - (ricker.t0 + waveformExtent(ricker))) / T));
          const points = 40000;
          const h = (upper - lower) / points;
          const term = (u: number) => 0.5 * (Math.exp(-A * Math.exp(-u)) + Math.exp(-A * Math.exp(u))) * waveformDerivative(ricker, 1, t - T * Math.cosh(u));
          let sum = (lower === 0 ? 0.5 : 0) * term(0);
          for (let i = lower === 0 ? 1 : 0; i < points; i++) sum += term(lower + (lower === 0 ? i : i + 0.5) * h);
          const reference = (-MU0 / (2 * Math.PI)) * sum * h;
          peak = Math.max(peak, Math.abs(reference));
          difference = Math.max(difference, Math.abs(telegraphField(ricker, 1, rho, EPS_R, sigma, t) - reference));
        }
        expect(difference / scale(ricker, rho, peak)).toBeLessThan(1e-10); // Trefethen & Weideman 2014, trapezoid rule for even integrands
      }
    }
  });

  it('becomes 2D diffusion late: Ez → (μ0/4π)[Q/t² + (2M1 − a(ρ/c)²Q)/t³]', () => {
    /*
     * Far behind the front (a·s ≫ 1, s ≫ ρ/c) the kernel e^{−as}cosh(ar)/(2πr) is
     * (1/(4πs))·(1 − a(ρ/c)²/(2s) + O(s⁻²)) (s − r = (ρ/c)²/(s + r)), half the lossless 1/(2πs):
     * the 2D diffusion kernel. Then Ez = −μ0∫I′(τ)g(t − τ)dτ = −μ0∫I(τ)g′(t − τ)dτ
     * = (μ0/4π)[Q/t² + (2M1 − a(ρ/c)²Q)/t³ + O(t⁻⁴)], Q = ∫I = √π·τ, M1 = t0·Q.
     */
    const sigma = 1;
    const rho = 0.03;
    const T = (rho * Math.sqrt(EPS_R)) / C0;
    const a = rate(sigma);
    const q = Math.sqrt(Math.PI) * 1e-10;
    const t0 = gaussian.t0;
    for (const t of [1e-8, 2e-8, 4e-8, 1.6e-7]) {
      const asymptote = (MU0 / (4 * Math.PI)) * (q / t ** 2 + (2 * t0 * q - a * T * T * q) / t ** 3);
      expect(Math.abs(telegraphField(gaussian, 1, rho, EPS_R, sigma, t) / asymptote - 1)).toBeLessThan(((t0 + a * T * T) / t) ** 2); // Morse & Feshbach ch. 7 (diffusion limit), expansion above
    }
  });

  it('is exactly zero before the front, NaN for bad input', () => {
    for (const w of Object.values(kinds)) {
      const rho = 0.04;
      const front = (rho * Math.sqrt(EPS_R)) / C0 + w.t0 - waveformExtent(w);
      for (const t of [Number.NEGATIVE_INFINITY, -1, 0, front * 0.5, front * (1 - 1e-12)]) {
        expect(Object.is(telegraphField(w, 1, rho, EPS_R, 2, t), 0)).toBe(true); // causality, common practice
      }
      expect(telegraphField(w, 1, rho, EPS_R, 2, front * (1 + 1e-6))).not.toBe(0); // causality, common practice
    }
    for (const [rho, epsR, sigma] of [[0, 4, 1], [-1, 4, 1], [0.1, 0, 1], [0.1, 4, -1], [0.1, 4, Number.NaN], [0.1, Number.POSITIVE_INFINITY, 1], [Number.NaN, 4, 1]]) {
      expect(telegraphField(ricker, 1, rho, epsR, sigma, 1e-9)).toBeNaN(); // documented
    }
    expect(telegraphField(ricker, 1, 0.1, 4, 1, Number.NaN)).toBeNaN(); // documented
    expect(telegraphField(ricker, 1, 0.1, 4, 1, Number.POSITIVE_INFINITY)).toBe(0); // documented
    for (const refinement of [0, 0.5, Number.NaN]) expect(() => telegraphField(ricker, 1, 0.1, 4, 1, 1e-9, refinement)).toThrow(RangeError); // documented
    expect(Array.from(telegraphTimeSeries(ricker, 1, 0, 4, 1, 1e-12, 3)).every(Number.isNaN)).toBe(true); // documented
    expect(telegraphTimeSeries(ricker, 1, 0.1, 4, 1, 1e-12, 0).length).toBe(0); // documented
    for (const dt of [0, -1, Number.NaN]) expect(() => telegraphTimeSeries(ricker, 1, 0.1, 4, 1, dt, 3)).toThrow(RangeError); // documented
    for (const samples of [-1, 2.5]) expect(() => telegraphTimeSeries(ricker, 1, 0.1, 4, 1, 1e-12, samples)).toThrow(RangeError); // documented
  });

  it('the series matches the pointwise field and is linear in the amplitude', () => {
    const series = telegraphTimeSeries(modulated, -3, 0.05, EPS_R, 0.5, 2e-12, 1500);
    let peak = 0;
    for (const v of series) peak = Math.max(peak, Math.abs(v));
    for (let n = 0; n < 1500; n += 11) {
      expect(Math.abs(series[n] + 3 * telegraphField(modulated, 1, 0.05, EPS_R, 0.5, n * 2e-12))).toBeLessThanOrEqual(1e-15 * peak); // linearity, common practice
    }
  });
});

describe('two ways to one field: the closed form against frequency synthesis of −(ωμ0/4)H0⁽²⁾(kρ), k² = ω²μ0ε − jωμ0σ', () => {
  for (const sigma of [0.01, 1, 10]) {
    for (const rho of [0.009, 0.1]) {
      it(`σ = ${sigma} S/m, ρ = ${rho} m (a·ρ/c = ${(rate(sigma) * rho * 2 / C0).toFixed(2)}): agree within the synthesis' estimate`, () => {
        const dt = 1e-12;
        const samples = 1500 + Math.round((rho * Math.sqrt(EPS_R)) / C0 / dt);
        for (const w of Object.values(kinds)) {
          const closed = telegraphTimeSeries(w, 1, rho, EPS_R, sigma, dt, samples);
          const r = synthesizedLineSource({ epsR: EPS_R, sigma }, 'TMz', w, 1, rho, dt, samples);
          expect(r.met).toBe(true); // documented target 1e-4 of the peak
          for (let n = 0; n < samples; n++) expect(Math.abs(r.values[n] - closed[n])).toBeLessThanOrEqual(r.errors[n]); // Morse & Feshbach ch. 7 against Harrington ch. 5 by synthesis
        }
      });
    }
  }

  it('strong loss: the diffusion peak, long after the front, agrees too', () => {
    // a·ρ/c ≈ 9.4 and 28: the direct wave is down by e^{−A}; the field peaks nanoseconds later
    for (const [sigma, rho] of [[10, 0.1], [3, 0.3]]) {
      const dt = 2e-11;
      for (const w of Object.values(kinds)) {
        const closed = telegraphTimeSeries(w, 1, rho, EPS_R, sigma, dt, 3000);
        const r = synthesizedLineSource({ epsR: EPS_R, sigma }, 'TMz', w, 1, rho, dt, 3000);
        expect(r.met).toBe(true); // documented
        for (let n = 0; n < 3000; n++) expect(Math.abs(r.values[n] - closed[n])).toBeLessThanOrEqual(r.errors[n]); // Morse & Feshbach ch. 7 against Harrington ch. 5 by synthesis
      }
    }
  });
});
