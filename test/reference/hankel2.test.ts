import { describe, expect, it } from 'vitest';
import { hankel2 } from '../../src/exact/hankel2.ts';

const j0 = (x: number) => hankel2(x)[0];
const y0 = (x: number) => -hankel2(x)[1];

/** Root of g in [lo, hi] by bisection to the last bit (g changes sign once there). */
function bisect(g: (x: number) => number, lo: number, hi: number): number {
  let gLo = g(lo);
  for (let i = 0; i < 200; i++) {
    const mid = 0.5 * (lo + hi);
    if (mid === lo || mid === hi) break;
    const gMid = g(mid);
    if (Math.sign(gMid) === Math.sign(gLo)) { lo = mid; gLo = gMid; } else hi = mid;
  }
  return 0.5 * (lo + hi);
}

describe('hankel2: H0^(2)(x) = J0(x) − j·Y0(x)', () => {
  // Table values have 10 decimals, so they are good to 5e-11.
  const table: [number, number, number][] = [
    [1, 0.7651976866, 0.0882569642], // Abramowitz & Stegun Table 9.1, from memory; agrees with mpmath 1.3 at 20 digits
    [2, 0.2238907791, 0.5103756726], // Abramowitz & Stegun Table 9.1, from memory; agrees with mpmath 1.3 at 20 digits
    [5, -0.1775967713, -0.3085176252], // Abramowitz & Stegun Table 9.1, from memory; agrees with mpmath 1.3 at 20 digits
    [10, -0.2459357645, 0.0556711673], // Abramowitz & Stegun Table 9.1, from memory; agrees with mpmath 1.3 at 20 digits
  ];
  for (const [x, j, y] of table) {
    it(`matches the table at x = ${x}`, () => {
      expect(Math.abs(j0(x) - j)).toBeLessThan(6e-11);
      expect(Math.abs(y0(x) - y)).toBeLessThan(6e-11);
    });
  }

  it('has its first zeros of J0 and Y0 where the table puts them', () => {
    expect(Math.abs(bisect(j0, 2, 3) - 2.4048255577)).toBeLessThan(6e-11); // Abramowitz & Stegun Table 9.5, j0,1, from memory
    expect(Math.abs(bisect(y0, 0.5, 1.5) - 0.8935769663)).toBeLessThan(6e-11); // Abramowitz & Stegun Table 9.5, y0,1, from memory
  });

  it('follows the large-argument expansion at x = 200 and x = 1000', () => {
    // DLMF 10.17.6 with a_k(0) of DLMF 10.17.1: a1 = −1/8, a2 = 9/128, a3 = −75/1024, a4 = 3675/32768.
    // H0^(2)(x) ~ √(2/(πx))·e^{−j(x − π/4)}·(1 + j/(8x) − 9/(128x²) − 75j/(1024x³) + 3675/(32768x⁴));
    // by DLMF §10.17(iii) the remainder is below the first omitted term, |a5|/x⁵·√(2/(πx)) with
    // a5 = −893025/3932160, which is 4e-14 at x = 200;
    // at x = 1000 it is negligible and the bound is the rounding of x − π/4 (ulp 1.1e-13) times 0.025.
    for (const [x, tolerance] of [[200, 1e-13], [1000, 4e-15]]) {
      const seriesRe = 1 - 9 / (128 * x * x) + 3675 / (32768 * x ** 4);
      const seriesIm = 1 / (8 * x) - 75 / (1024 * x ** 3);
      const phase = -(x - Math.PI / 4);
      const amplitude = Math.sqrt(2 / (Math.PI * x));
      const re = amplitude * (Math.cos(phase) * seriesRe - Math.sin(phase) * seriesIm);
      const im = amplitude * (Math.sin(phase) * seriesRe + Math.cos(phase) * seriesIm);
      const [hRe, hIm] = hankel2(x);
      expect(Math.hypot(hRe - re, hIm - im)).toBeLessThan(tolerance); // DLMF 10.17.6, 10.17.1, remainder bound §10.17(iii)
    }
    // Leading term alone misses by about |1/(8x)|·√(2/(πx)) = 3.5e-5: the check above is not loose.
    const x = 200;
    const amplitude = Math.sqrt(2 / (Math.PI * x));
    const [hRe, hIm] = hankel2(x);
    const lead = [amplitude * Math.cos(-(x - Math.PI / 4)), amplitude * Math.sin(-(x - Math.PI / 4))];
    expect(Math.hypot(hRe - lead[0], hIm - lead[1])).toBeGreaterThan(3e-5); // DLMF 10.17.6, first correction term
  });

  it('follows the small-argument logarithmic form at x = 1e-4', () => {
    const x = 1e-4;
    const euler = 0.5772156649015329; // Euler's constant γ, DLMF 5.2.3
    const q = (x * x) / 4;
    const j0Series = 1 - q + (q * q) / 4; // DLMF 10.2.2
    expect(Math.abs(j0(x) - j0Series)).toBeLessThanOrEqual(2.3e-16); // DLMF 10.2.2, to one unit in the last place
    // Y0(x) ≈ (2/π)(ln(x/2) + γ)·J0(x); the next term of DLMF 10.8.2 is (2/π)·x²/4 = 1.6e-9.
    const logForm = (2 / Math.PI) * (Math.log(x / 2) + euler) * j0(x);
    expect(Math.abs(y0(x) - logForm)).toBeLessThan(1.7e-9); // DLMF 10.8.2 (leading terms, as DLMF 10.7.3)
    expect(Math.abs(y0(x) - logForm)).toBeGreaterThan(1.5e-9); // the dropped term is really there
    const twoTerms = logForm + (2 / Math.PI) * (q - (1.5 * q * q) / 4);
    expect(Math.abs(y0(x) - twoTerms) / Math.abs(twoTerms)).toBeLessThan(1e-14); // DLMF 10.8.2
  });

  it('gives the documented values at the edges', () => {
    expect(hankel2(0)).toEqual([1, Number.POSITIVE_INFINITY]); // J0(0) = 1, Y0 → −∞ (DLMF 10.8.2)
    expect(hankel2(Number.POSITIVE_INFINITY)).toEqual([0, 0]); // DLMF 10.2.6, decay as x^{−1/2}
    for (const x of [-1, -1e-300, Number.NEGATIVE_INFINITY, Number.NaN]) {
      expect(hankel2(x)).toEqual([Number.NaN, Number.NaN]); // documented: branch cut, common practice
    }
  });
});
