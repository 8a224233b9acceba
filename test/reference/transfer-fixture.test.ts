import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { hankel2 } from '../../src/exact/hankel2.ts';
import { lineCurrentTransfer } from '../../src/exact/transfer.ts';

interface Fixture {
  hankel2: { x: number; h2: [string, string] }[];
  transfer: { f: number; rho: number; epsR: number; k_rho: string; z: [string, string] }[];
}
// mpmath 1.3 at 40 and 60 digits (test/fixtures/generate-transfer.py, run by hand).
const fixture = JSON.parse(readFileSync(new URL('../fixtures/transfer.json', import.meta.url), 'utf8')) as Fixture;

/** |a − b| / |b| for complex values. */
function relErr(a: [number, number], b: [number, number]): number {
  return Math.hypot(a[0] - b[0], a[1] - b[1]) / Math.hypot(b[0], b[1]);
}

describe('fixture: H0^(2)(x) and the line-current transfer function from mpmath', () => {
  it('holds enough cases to mean something', () => {
    expect(fixture.hankel2.length).toBeGreaterThan(60);
    expect(fixture.transfer.length).toBeGreaterThan(100);
  });

  it('H0^(2)(x) agrees to 1e-13 of |H| plus the argument\'s own rounding, x in [1e-4, 1e4] and at the zeros of J0 and Y0', () => {
    let worst = 0;
    for (const { x, h2 } of fixture.hankel2) {
      const ref: [number, number] = [Number(h2[0]), Number(h2[1])];
      // x is exact in the fixture; the phase of H moves one radian per unit of x, and the
      // library's J0/Y0 reduce x modulo π with an error of a few ulps of x.
      const bound = 1e-13 + 4 * Number.EPSILON * x;
      const e = relErr(hankel2(x), ref);
      worst = Math.max(worst, e / bound);
      expect(e, `x = ${x}`).toBeLessThan(bound); // mpmath besselj/bessely, test/fixtures/generate-transfer.py
    }
    expect(worst).toBeGreaterThan(0); // the comparison is real (not every value rounds identically)
  });

  it('Z(f, ρ, εr) agrees to 1e-13 of |Z| plus the rounding of kρ, over 1 MHz–100 GHz, 0.1 mm–10 m, εr 1–81', () => {
    for (const c of fixture.transfer) {
      const ref: [number, number] = [Number(c.z[0]), Number(c.z[1])];
      const x = Number(c.k_rho);
      // kρ = 2πf·√εr·ρ/c0 is formed in doubles: about 4 roundings of x, each moving the phase by ε·x.
      const bound = 1e-13 + 8 * Number.EPSILON * x;
      expect(relErr(lineCurrentTransfer(c.f, c.rho, c.epsR), ref), `f=${c.f} ρ=${c.rho} εr=${c.epsR}`).toBeLessThan(bound); // mpmath, test/fixtures/generate-transfer.py
    }
  });

  it('the conjugate symmetry Z(−f) = conj Z(f) holds against the same fixture', () => {
    for (const c of fixture.transfer.slice(0, 20)) {
      const [re, im] = lineCurrentTransfer(-c.f, c.rho, c.epsR);
      const ref: [number, number] = [Number(c.z[0]), -Number(c.z[1])];
      expect(relErr([re, im], ref)).toBeLessThan(1e-13 + 8 * Number.EPSILON * Number(c.k_rho)); // real impulse response, common practice
    }
  });
});
