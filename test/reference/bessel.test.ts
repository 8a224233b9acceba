import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import {
  besselJ, besselJRatioSequence, besselJScaled, besselJSequence, besselSequences, besselY, besselYSequence,
  hankel2, hankel2RatioSequence, hankel2Scaled, hankel2Sequence,
} from '../../src/exact/bessel.ts';
import type { Complex } from '../../src/exact/complex.ts';
import { hankel2 as hankel2Real } from '../../src/exact/hankel2.ts';

const dist = (a: Complex, b: Complex) => Math.hypot(a[0] - b[0], a[1] - b[1]);
const mag = (a: Complex) => Math.hypot(a[0], a[1]);
const rel = (a: Complex, b: Complex) => dist(a, b) / mag(b);
const mul = (a: Complex, b: Complex): Complex => [a[0] * b[0] - a[1] * b[1], a[0] * b[1] + a[1] * b[0]];
const sub = (a: Complex, b: Complex): Complex => [a[0] - b[0], a[1] - b[1]];
const inv = (a: Complex): Complex => [a[0] / (a[0] ** 2 + a[1] ** 2), -a[1] / (a[0] ** 2 + a[1] ** 2)];
/** j^n */
const jPow = (n: number): Complex => [[1, 0], [0, 1], [-1, 0], [0, -1]][((n % 4) + 4) % 4] as Complex;

describe('values computed with scipy', () => {
  it('matches the four values given in the issue', () => {
    expect(rel(besselJ(0, [4, 2]), [-1.3787022343924844, 0.3905423570667095])).toBeLessThan(3e-15); // scipy.special (given in the issue)
    expect(rel(hankel2(0, [4, -2]), [-0.04953734704361481, -0.009083428955909812])).toBeLessThan(3e-15); // scipy.special (given in the issue)
    expect(rel(hankel2(5, [4, -2]), [-0.21889019762227033, 0.09309925623202772])).toBeLessThan(3e-15); // scipy.special (given in the issue)
    expect(rel(besselJ(30, [20, -10]), [-0.005717886230869416, 0.009066259719169191])).toBeLessThan(3e-15); // scipy.special (given in the issue)
  });
});

interface FixtureCase {
  n: number; z: Complex; j: [string, string]; y: [string, string]; h2: [string, string]; sj: string; sy: string; sh: string;
}
const fixture = JSON.parse(readFileSync(new URL('../fixtures/bessel-complex.json', import.meta.url), 'utf8')) as { cases: FixtureCase[] };

/**
 * Error measure: |ours − reference| / (|f_n| + min(|f_{n−1}|, |f_{n+1}|)), the local size of
 * the function (fixture generator's header); it is the relative error except right beside a
 * zero of f_n, where no relative error can be had.
 */
function fixtureError(ours: Complex, ref: [string, string], size: number): number {
  const r: Complex = [Number(ref[0]), Number(ref[1])];
  if (!Number.isFinite(mag(r))) return mag(ours) === Number.POSITIVE_INFINITY ? 0 : Number.POSITIVE_INFINITY;
  if (size < 1e-290) return dist(ours, r) <= 1e-300 ? 0 : Number.POSITIVE_INFINITY;
  return dist(ours, r) / size;
}

describe('fixture: mpmath 1.3 at 40+ digits (test/fixtures/generate-bessel.py)', () => {
  // The recurrences run over about max(n, |z|) orders and add about an ulp each; the worst
  // case measured is 4.4e-14 (Y and H2 at n = 199 and |z| ≈ 6, J_199 likewise): the issue's
  // 1e-12 with room to spare, and the test holds it to 1e-13.
  const tolerance = 1e-13;
  it(`agrees with all ${fixture.cases.length} cases (J, Y, H2; 0 ≤ n ≤ 200, 1e-3 ≤ |z| ≤ 1e3)`, () => {
    const failures: string[] = [];
    let worst = 0;
    for (const c of fixture.cases) {
      const s = besselSequences(c.n, c.z);
      const errors = [
        fixtureError(s.j[c.n], c.j, Number(c.sj)),
        fixtureError(s.y[c.n], c.y, Number(c.sy)),
        fixtureError(s.h2[c.n], c.h2, Number(c.sh)),
      ];
      for (const [i, e] of errors.entries()) {
        worst = Math.max(worst, Number.isFinite(e) ? e : 1);
        if (!(e <= tolerance)) failures.push(`${'JYH'[i]}_${c.n}(${c.z}): error ${e}`);
      }
    }
    expect(failures).toEqual([]); // fixture: mpmath.besselj, mpmath.bessely
    expect(worst).toBeGreaterThan(0); // the comparison really ran
  });

  it('covers what it claims: orders to 200, |z| from 1e-3 to 1e3, both sides of the cut, the axes', () => {
    const cases = fixture.cases;
    expect(Math.max(...cases.map((c) => c.n))).toBe(200); // common practice, no source
    expect(Math.min(...cases.map((c) => mag(c.z)))).toBeLessThanOrEqual(1.01e-3); // common practice, no source
    expect(Math.max(...cases.map((c) => mag(c.z)))).toBeGreaterThanOrEqual(999); // common practice, no source
    expect(cases.some((c) => c.z[0] < 0 && Object.is(c.z[1], -0))).toBe(true); // common practice, no source
    expect(cases.some((c) => c.z[0] < 0 && Object.is(c.z[1], 0))).toBe(true); // common practice, no source
    expect(cases.some((c) => c.z[0] === 0 && c.z[1] < 0)).toBe(true); // common practice, no source
    expect(cases.some((c) => c.z[1] < -150)).toBe(true); // common practice, no source
  });
});

describe('modified Bessel functions through the imaginary axis', () => {
  // Abramowitz & Stegun Table 9.8, from memory, to 10 digits; the fixture generator checks them against mpmath.
  const table: [number, number, number, number, number][] = [
    [1, 1.266065878, 0.5651591040, 0.4210244382, 0.6019072302], // Abramowitz & Stegun Table 9.8, from memory
    [2, 2.279585302, 1.590636855, 0.1138938727, 0.1398658818], // Abramowitz & Stegun Table 9.8, from memory
    [5, 27.23987182, 24.33564214, 0.003691098334, 0.004044613445], // Abramowitz & Stegun Table 9.8, from memory
  ];
  for (const [x, i0, i1, k0, k1] of table) {
    it(`gives I0, I1, K0, K1 at x = ${x}`, () => {
      // DLMF 10.27.6: I_n(x) = j^{−n} J_n(jx), and J_n(−jx) = (−j)^n I_n(x) since J_n(−z) = (−1)^n J_n(z)
      expect(rel(besselJ(0, [0, x]), [i0, 0])).toBeLessThan(1e-9); // Abramowitz & Stegun Table 9.8 with DLMF 10.27.6
      expect(rel(besselJ(1, [0, x]), mul(jPow(1), [i1, 0]))).toBeLessThan(1e-9); // Abramowitz & Stegun Table 9.8 with DLMF 10.27.6
      expect(rel(besselJ(1, [0, -x]), mul(jPow(-1), [i1, 0]))).toBeLessThan(1e-9); // Abramowitz & Stegun Table 9.8 with DLMF 10.27.6, 10.4.1
      // DLMF 10.27.8: K_n(x) = −(π/2)·j·e^{−nπj/2}·H_n^(2)(−jx), i.e. H_n^(2)(−jx) = (2/π)·j^{n+1}·K_n(x)
      expect(rel(hankel2(0, [0, -x]), [0, (2 / Math.PI) * k0])).toBeLessThan(1e-9); // Abramowitz & Stegun Table 9.8 with DLMF 10.27.8
      expect(rel(hankel2(1, [0, -x]), [-(2 / Math.PI) * k1, 0])).toBeLessThan(1e-9); // Abramowitz & Stegun Table 9.8 with DLMF 10.27.8
    });
  }

  it('follows the large-argument expansions of I0 and K0 at x = 800, beyond the double range of I0', () => {
    // DLMF 10.40.1/10.40.2 with a_k(0) = 1, −1/8, 9/128, −225/3072, 11025/98304 (DLMF 10.17.1):
    // e^{−x}I0(x) ≈ Σ (−1)^k a_k/x^k / √(2πx), e^{x}K0(x) ≈ Σ a_k/x^k · √(π/(2x)); first omitted term 7e-16
    const x = 800;
    const iScaled = (1 + 1 / (8 * x) + 9 / (128 * x * x) + 225 / (3072 * x ** 3) + 11025 / (98304 * x ** 4)) / Math.sqrt(2 * Math.PI * x);
    const kScaled = (1 - 1 / (8 * x) + 9 / (128 * x * x) - 225 / (3072 * x ** 3) + 11025 / (98304 * x ** 4)) * Math.sqrt(Math.PI / (2 * x));
    expect(rel(besselJScaled(0, [0, -x]), [iScaled, 0])).toBeLessThan(2e-15); // DLMF 10.40.1
    expect(rel(hankel2Scaled(0, [0, -x]), [0, (2 / Math.PI) * kScaled])).toBeLessThan(2e-15); // DLMF 10.40.2 with 10.27.8
    expect(besselJ(0, [0, -x])[0]).toBe(Number.POSITIVE_INFINITY); // I0(800) ≈ 1e346 overflows honestly (documented)
    expect(mag(hankel2(0, [0, -x]))).toBeLessThan(1e-300); // K0(800) ≈ 1e-349 underflows (documented)
  });
});

describe('identities', () => {
  const grid: Complex[] = [[0.5, 0], [3, -1], [10, -10], [30, 0], [100, -2], [0, -40], [-5, -5], [2, 3], [-7, 0.5], [700, -1], [0.01, -0.02]];
  const orders = [0, 1, 5, 20, 60, 150];

  it('satisfies the Wronskians J_{n+1}Y_n − J_nY_{n+1} = 2/(πz) and J_{n+1}H_n − J_nH_{n+1} = −2j/(πz)', () => {
    for (const z of grid) {
      const s = besselSequences(151, z);
      const w = inv(z).map((v) => (2 / Math.PI) * v) as Complex;
      for (const n of orders) {
        const ay = mul(s.j[n + 1], s.y[n]);
        const by = mul(s.j[n], s.y[n + 1]);
        // the products may be as large as e^{2|Im z|}: judge against their size
        if (Number.isFinite(mag(ay)) && Number.isFinite(mag(by))) {
          // the measured worst, 2e-14 at n = 150, is the upward recurrence's ulp per order
          expect(dist(sub(ay, by), w) / (mag(ay) + mag(by))).toBeLessThan(5e-14); // DLMF 10.5.2 (Wronskian), recurrence form
        }
        const ah = mul(s.j[n + 1], s.h2[n]);
        const bh = mul(s.j[n], s.h2[n + 1]);
        if (Number.isFinite(mag(ah)) && Number.isFinite(mag(bh)) && z[1] <= 0) {
          // in the lower half-plane these products are of the size of 1/|z|: a check of H2 to its last digits
          expect(dist(sub(ah, bh), [w[1], -w[0]]) / (mag(ah) + mag(bh))).toBeLessThan(5e-14); // DLMF 10.5.5 (Wronskian of J and H2)
        }
      }
    }
  });

  it('satisfies the recurrence C_{n−1} + C_{n+1} = (2n/z)·C_n order by order', () => {
    for (const z of grid) {
      for (const n of [1, 5, 20, 60]) {
        for (const f of [besselJ, besselY, hankel2]) {
          const a = f(n - 1, z);
          const b = f(n + 1, z);
          const c = mul(mul(inv(z), [2 * n, 0]), f(n, z));
          if (![a, b, c].every((v) => Number.isFinite(mag(v)))) continue;
          expect(dist([a[0] + b[0], a[1] + b[1]], c) / (mag(a) + mag(b) + mag(c))).toBeLessThan(1e-14); // DLMF 10.6.1
        }
      }
    }
  });

  it('agrees with the real-argument H0^(2) of hankel2.ts (stdlib J0, Y0)', () => {
    for (const x of [1e-3, 0.3, 1, 1.999, 2.001, 2.5, 5, 10, 24.99, 25.01, 100, 1000]) {
      expect(rel(hankel2(0, [x, 0]), hankel2Real(x))).toBeLessThan(2e-14); // common practice, no source (two independent implementations)
    }
  });

  it('keeps the symmetries exactly: negative orders, conjugation, J_n(−z) = (−1)^n J_n(z)', () => {
    for (const z of grid) {
      for (const n of [1, 2, 7]) {
        const s = n % 2 === 0 ? 1 : -1;
        expect(besselJ(-n, z)).toEqual(besselJ(n, z).map((v) => s * v)); // DLMF 10.4.1
        expect(besselY(-n, z)).toEqual(besselY(n, z).map((v) => s * v)); // DLMF 10.4.1
        expect(hankel2(-n, z)).toEqual(hankel2(n, z).map((v) => s * v)); // DLMF 10.4.6
        const conj: Complex = [z[0], -z[1]];
        const plus = (v: Complex) => [v[0] + 0, v[1] + 0]; // ±0 alike
        expect(plus(besselJ(n, conj))).toEqual(plus([besselJ(n, z)[0], -besselJ(n, z)[1]])); // DLMF 10.11.9
        expect(rel(besselJ(n, [-z[0], -z[1]]), besselJ(n, z).map((v) => s * v) as Complex)).toBeLessThan(1e-15); // DLMF 10.11.1
      }
    }
  });

  it('jumps across the cut as the continuation formulas say: Y_n(−x+j0) − Y_n(−x−j0) = 4j(−1)^n J_n(x)', () => {
    for (const [n, x] of [[0, 0.5], [1, 3], [4, 30], [9, 200]]) {
      const above = besselY(n, [-x, 0]);
      const below = besselY(n, [-x, -0]);
      const jx = besselJ(n, [x, 0]);
      const s = n % 2 === 0 ? 1 : -1;
      expect(dist(sub(above, below), [0, 4 * s * jx[0]])).toBeLessThan(1e-14 * (mag(above) + mag(below))); // DLMF 10.11.2, m = ±1
      expect(besselJ(n, [-x, 0])).toEqual(besselJ(n, [-x, -0])); // J is entire: no jump (DLMF 10.2.2)
    }
  });

  it('agrees across the method boundaries |z| = 2 (series/integral) and |z| = 25 (integral/expansion)', () => {
    for (const r of [2, 25]) {
      for (const angle of [0, -0.7, -Math.PI / 2]) {
        const inner: Complex = [(r - 1e-9) * Math.cos(angle), (r - 1e-9) * Math.sin(angle)];
        const outer: Complex = [(r + 1e-9) * Math.cos(angle), (r + 1e-9) * Math.sin(angle)];
        // the functions move by about |H'|·2e-9 between the two points
        for (const n of [0, 1, 6]) expect(rel(hankel2(n, inner), hankel2(n, outer))).toBeLessThan(1e-8 * (1 + n)); // common practice, no source
      }
    }
  });
});

describe('sequences and ratio forms', () => {
  it('returns the same values as the single-order calls', () => {
    const z: Complex = [7, -3];
    const [j, y, h] = [besselJSequence(40, z), besselYSequence(40, z), hankel2Sequence(40, z)];
    for (const n of [0, 1, 13, 40]) {
      // the single calls start Miller's recurrence at another order: agreement to rounding
      expect(rel(j[n], besselJ(n, z))).toBeLessThan(1e-14); // common practice, no source
      expect(rel(y[n], besselY(n, z))).toBeLessThan(1e-14); // common practice, no source
      expect(rel(h[n], hankel2(n, z))).toBeLessThan(1e-14); // common practice, no source
    }
  });

  it('rebuilds J_n and H_n^(2) from the ratio forms, and reaches order 500 without overflow', () => {
    for (const z of [[3, -1], [40, -0.5], [0.2, 0], [0, -12]] as Complex[]) {
      const js = besselJRatioSequence(500, z);
      const hs = hankel2RatioSequence(500, z);
      let jv: Complex = [js.first[0] * Math.exp(js.logScale), js.first[1] * Math.exp(js.logScale)];
      let hv: Complex = [hs.first[0] * Math.exp(hs.logScale), hs.first[1] * Math.exp(hs.logScale)];
      const jRef = besselJSequence(60, z);
      const hRef = hankel2Sequence(60, z);
      for (let n = 0; n <= 60; n++) {
        if (n > 0) {
          jv = mul(jv, js.ratios[n]);
          hv = mul(hv, hs.ratios[n]);
        }
        if (mag(jRef[n]) > 1e-280) expect(rel(jv, jRef[n])).toBeLessThan(1e-13); // common practice, no source
        if (mag(hRef[n]) < 1e280) expect(rel(hv, hRef[n])).toBeLessThan(1e-13); // common practice, no source
      }
      // at high order J_n/J_{n−1} → z/(2n) and H_n/H_{n−1} → 2(n−1)/z (DLMF 10.19.1, 10.19.2)
      expect(rel(js.ratios[500], mul(z, [1 / 1000, 0]))).toBeLessThan(1e-2); // DLMF 10.19.1
      expect(rel(hs.ratios[500], mul(inv(z), [998, 0]))).toBeLessThan(1e-2); // DLMF 10.19.2
    }
  });

  it('keeps J_0 and J_1/J_0 consistent at a zero of J_0', () => {
    const x = 2.404825557695773; // first zero of J0, Abramowitz & Stegun Table 9.5 (from memory), the double nearest it
    const s = besselJRatioSequence(3, [x, 0]);
    const j1: Complex = mul(s.first, s.ratios[1]);
    expect(Math.abs(s.first[0])).toBeLessThan(1e-15); // J0 is (nearly) zero there
    expect(rel(j1, besselJ(1, [x, 0]))).toBeLessThan(1e-14); // common practice, no source (J1 from J0 times a ratio of order 1e16)
    expect(Math.abs(j1[0] - 0.5191474973)).toBeLessThan(1e-10); // Abramowitz & Stegun Table 9.5, J1 at j0,1, from memory
  });

  it('refuses what the ratio forms cannot do', () => {
    expect(() => hankel2RatioSequence(5, [1, 0.5])).toThrow(RangeError); // documented: upward recurrence unstable for Im z > 0
    expect(() => besselJRatioSequence(5, [0, 0])).toThrow(RangeError); // documented
    expect(() => hankel2RatioSequence(5, [Number.NaN, 0])).toThrow(RangeError); // documented
  });
});

describe('edge cases', () => {
  it('gives the limits at z = 0', () => {
    expect(besselJ(0, [0, 0])).toEqual([1, 0]); // DLMF 10.2.2
    expect(besselJ(3, [0, 0])).toEqual([0, 0]); // DLMF 10.2.2
    expect(besselY(0, [0, 0])).toEqual([Number.NEGATIVE_INFINITY, 0]); // DLMF 10.8.2 (logarithmic pole), documented
    expect(hankel2(0, [0, 0])).toEqual([1, Number.POSITIVE_INFINITY]); // as hankel2.ts, documented
  });

  it('gives NaN for NaN and for infinities off the positive real axis, 0 at +∞', () => {
    expect(besselJ(0, [Number.NaN, 0])).toEqual([Number.NaN, Number.NaN]); // documented
    expect(hankel2(2, [1, Number.NaN])).toEqual([Number.NaN, Number.NaN]); // documented
    expect(besselY(1, [Number.NEGATIVE_INFINITY, 0])).toEqual([Number.NaN, Number.NaN]); // documented
    expect(besselJ(0, [1, Number.POSITIVE_INFINITY])).toEqual([Number.NaN, Number.NaN]); // documented
    expect(hankel2(4, [Number.POSITIVE_INFINITY, 0])).toEqual([0, 0]); // DLMF 10.7.8 (decay like |z|^{−1/2})
  });

  it('refuses non-integer orders', () => {
    expect(() => besselJ(0.5, [1, 0])).toThrow(RangeError); // documented
    expect(() => besselJSequence(-1, [1, 0])).toThrow(RangeError); // documented
    expect(() => hankel2Sequence(Number.NaN, [1, 0])).toThrow(RangeError); // documented
  });

  it('overflows and underflows only where the true value does, with the right signs', () => {
    // H_200^(2)(1e-3) ≈ j·199!·(2000)^200/π ≈ j·1e1032; J_200(1e-3) ≈ 1e-1035
    const h = hankel2(200, [1e-3, 0]);
    expect(h[1]).toBe(Number.POSITIVE_INFINITY); // DLMF 10.7.4 (Y_n ~ −(n−1)!(2/z)^n/π)
    expect(h[0]).toBe(0); // DLMF 10.7.3 (J_n ~ (z/2)^n/n!), documented underflow
    expect(besselJ(200, [1e-3, 0])).toEqual([0, 0]); // DLMF 10.7.3, documented underflow
    // finite neighbours of the overflow stay accurate: H_100^(2)(1) ≈ j·99!·2^100/π ≈ j·3.8e185
    let lead = 2 ** 100 / Math.PI;
    for (let k = 2; k <= 99; k++) lead *= k;
    expect(rel(hankel2(100, [1, 0]), [0, lead])).toBeLessThan(3e-3); // DLMF 10.8.1 leading term; next term is 1/(4·99) = 2.5e-3 of it
  });
});
