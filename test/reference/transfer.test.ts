import { describe, expect, it } from 'vitest';
import { lineCurrentTransfer } from '../../src/exact/transfer.ts';
import { C0, MU0 } from '../../src/scenario/constants.ts';

const arg = ([re, im]: [number, number]) => Math.atan2(im, re);
const wavenumber = (f: number, epsR: number) => (2 * Math.PI * f * Math.sqrt(epsR)) / C0;

describe('lineCurrentTransfer: Z = Ez/I = −(ωμ0/4)·H0^(2)(kρ)', () => {
  it('equals −(ωμ0/4)(J0 − jY0) at kρ = 1', () => {
    const f = 1e9;
    const rho = 1 / wavenumber(f, 1);
    const scale = -(2 * Math.PI * f * MU0) / 4;
    const [re, im] = lineCurrentTransfer(f, rho, 1);
    // J0(1) = 0.7651976866, Y0(1) = 0.0882569642 (10 decimals: relative 7e-11 and 6e-10)
    expect(Math.abs(re / scale - 0.7651976866)).toBeLessThan(6e-11); // Abramowitz & Stegun Table 9.1 with 9.1.4 (H = J − jY), from memory
    expect(Math.abs(im / scale + 0.0882569642)).toBeLessThan(6e-11); // Abramowitz & Stegun Table 9.1 with 9.1.4 (H = J − jY), from memory
  });

  it('scales with the medium through k = ω√εr/c0 only (μ = μ0)', () => {
    // εr = 4 halves the wavelength: Z(f, ρ, 4) = Z(f, 2ρ, 1) because ωμ0 is unchanged.
    const a = lineCurrentTransfer(3e9, 0.01, 4);
    const b = lineCurrentTransfer(3e9, 0.02, 1);
    expect(a[0]).toBeCloseTo(b[0], 12); // common practice, no source
    expect(a[1]).toBeCloseTo(b[1], 12); // common practice, no source
  });

  it('is an outgoing wave: its phase falls by k·Δρ plus the known asymptotic correction', () => {
    // arg Z = π − θ0(kρ) with θ0(x) ~ x − π/4 − 1/(8x) + 25/(384x³) − 1073/(5120x⁵) (DLMF 10.18.18,
    // μ = 0, from memory; the x⁻³ coefficient also follows from DLMF 10.17.6, and mpmath puts the
    // remainder after the x⁻³ term below the x⁻⁵ term at x = 10 and 30, as DLMF §10.18(iii) says). So arg Z(ρ2) − arg Z(ρ1) = −(x2 − x1) + (1/x2 − 1/x1)/8 − (25/384)(1/x2³ − 1/x1³)
    // with an error below (1073/5120)(1/x1⁵ + 1/x2⁵), plus rounding: x = kρ is known to an ulp or
    // two, and the phase moves one radian per unit of x, so allow 8·ε·x2.
    const f = 1e10;
    const k = wavenumber(f, 1);
    for (const x1 of [20, 50, 100, 300, 1000]) {
      const rho1 = x1 / k;
      const rho2 = rho1 + Math.PI / (4 * k); // an eighth of a wavelength further out
      const x2 = k * rho2;
      const measured = arg(lineCurrentTransfer(f, rho2, 1)) - arg(lineCurrentTransfer(f, rho1, 1));
      const wrapped = measured - 2 * Math.PI * Math.round(measured / (2 * Math.PI));
      const correction = (1 / x2 - 1 / x1) / 8 - (25 / 384) * (1 / x2 ** 3 - 1 / x1 ** 3);
      const expected = -(x2 - x1) + correction;
      const bound = (1073 / 5120) * (1 / x1 ** 5 + 1 / x2 ** 5) + 8 * Number.EPSILON * x2;
      expect(Math.abs(wrapped - expected)).toBeLessThan(bound); // DLMF 10.18.18 and §10.18(iii) remainder bound
      // Without the correction the check would fail: the correction is really being tested.
      expect(Math.abs(wrapped + (x2 - x1))).toBeGreaterThan(10 * bound); // DLMF 10.18.18, 1/(8x) term
      expect(wrapped).toBeLessThan(0); // the phase falls outward (e^{+jωt}, outgoing H0^(2))
    }
  });

  it('carries constant power per unit length outward: ρ·|Z|² → (ωμ0/4)²·2/(πk)', () => {
    // M0²(x) = J0² + Y0² ~ (2/(πx))(1 − 1/(8x²) + 27/(128x⁴)), next term 1125/(1024x⁶) (DLMF 10.18.17,
    // μ = 0, from memory; remainder bound §10.18(iii); checked with mpmath at x = 20 and 100)
    const f = 5e9;
    const k = wavenumber(f, 1);
    const scale = (2 * Math.PI * f * MU0) / 4;
    for (const x of [20, 100, 1000]) {
      const [re, im] = lineCurrentTransfer(f, x / k, 1);
      const normalised = ((re * re + im * im) / (scale * scale)) * ((Math.PI * x) / 2);
      const series = 1 - 1 / (8 * x * x) + 27 / (128 * x ** 4);
      expect(Math.abs(normalised - series)).toBeLessThan(1.2 / x ** 6 + 1e-14); // DLMF 10.18.17
    }
  });

  it('gives the documented values at the edges', () => {
    const nan = [Number.NaN, Number.NaN];
    expect(lineCurrentTransfer(1e9, 0, 1)).toEqual(nan); // documented: ρ = 0 is the wire itself
    expect(lineCurrentTransfer(0, 0.1, 1)).toEqual(nan); // documented: no field defined at DC
    expect(lineCurrentTransfer(1e9, -0.1, 1)).toEqual(nan); // documented
    expect(lineCurrentTransfer(1e9, 0.1, 0)).toEqual(nan); // documented
    expect(lineCurrentTransfer(1e9, 0.1, -2)).toEqual(nan); // documented
    for (const bad of [Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY]) {
      expect(lineCurrentTransfer(bad, 0.1, 1)).toEqual(nan); // documented
      expect(lineCurrentTransfer(1e9, bad, 1)).toEqual(nan); // documented
      expect(lineCurrentTransfer(1e9, 0.1, bad)).toEqual(nan); // documented
    }
    // A real impulse response has Z(−f) = conj Z(f).
    const [re, im] = lineCurrentTransfer(2e9, 0.05, 1);
    expect(lineCurrentTransfer(-2e9, 0.05, 1)).toEqual([re, -im]); // common practice, no source
  });
});
