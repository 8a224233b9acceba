import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import roots from '../fixtures/dispersion-roots.json';
import { C0 } from '../../src/scenario/constants.ts';
import type { Medium } from '../../src/scenario/types.ts';
import { cAbs, cLog, cMul, cSqrt, cSub, type Complex } from '../../src/exact/complex.ts';
import { discretePermittivity, relativePermittivity, wavenumber } from '../../src/exact/medium.ts';
import {
  numericalWavenumber,
  numericalWavenumberOrNaN,
  phaseErrorPerWavelengthDeg,
  predictedPhaseErrorDeg,
} from '../../src/exact/dispersion.ts';
import {
  LOSSY_DISPERSION_MAX_ITERATIONS,
  numericalWavenumberLossy,
  predictedErrors,
  solveLossyDispersion,
} from '../../src/exact/dispersion-lossy.ts';

interface LossyCase {
  name: string; medium: Medium; f: number; theta: number; dx: number; dy: number; dt: number;
  cellsPerWavelength: number; courant: number; epsTilde: Complex; k: Complex; kTilde: Complex;
}
const lossy = roots.lossy as unknown as LossyCase[];
const losslessReal = roots.losslessReal as { f: number; theta: number; dx: number; dy: number; dt: number; c: number; k: number }[];

const distance = (a: Complex, b: Complex) => cAbs(cSub(a, b));

/** arcsin z = −j·ln(jz + √(1 − z²)), principal branches (DLMF 4.23.19, equation number from memory). */
function asin(z: Complex): Complex {
  const root = cSqrt(cSub([1, 0], cMul(z, z)));
  const [lr, li] = cLog([root[0] - z[1], root[1] + z[0]]);
  return [li, -lr];
}

/** T = μ0ε0·ε̃r·Ω², the left side of the relation, 1/m². */
function leftSide(medium: Medium, f: number, dt: number): Complex {
  const Omega = (2 / dt) * Math.sin(Math.PI * f * dt);
  const eps = discretePermittivity(medium, f, dt);
  const s = (Omega * Omega) / (C0 * C0);
  return [eps[0] * s, eps[1] * s];
}

/** √T on the branch Im ≤ 0. */
function lowerRoot(t: Complex): Complex {
  const r = cSqrt(t);
  return r[1] > 0 || (r[1] === 0 && r[0] < 0) ? [-r[0], -r[1]] : r;
}

/** Right side minus left side, relative to |T| (complex arithmetic spelled out, independent of the solver). */
function relativeResidual(k: Complex, medium: Medium, f: number, theta: number, dx: number, dy: number, dt: number): number {
  const t = leftSide(medium, f, dt);
  let sum: Complex = [-t[0], -t[1]];
  for (const [u, d] of [[Math.cos(theta), dx], [Math.sin(theta), dy]]) {
    const a = (u * d) / 2;
    const s: Complex = [Math.sin(a * k[0]) * Math.cosh(a * k[1]), Math.cos(a * k[0]) * Math.sinh(a * k[1])];
    const s2 = cMul(s, s);
    sum = [sum[0] + (4 / (d * d)) * s2[0], sum[1] + (4 / (d * d)) * s2[1]];
  }
  return cAbs(sum) / cAbs(t);
}

describe('lossy 2D Yee dispersion: reference roots', () => {
  it('has the fixture it needs', () => {
    expect(lossy.length).toBeGreaterThanOrEqual(60);
    expect(new Set(lossy.map((c) => c.name)).size).toBeGreaterThanOrEqual(10);
    expect(losslessReal.length).toBeGreaterThanOrEqual(5);
  });

  it('computes the same discrete permittivity and exact k as the generator (formula of src/exact/medium.ts)', () => {
    for (const c of lossy) {
      const eps = discretePermittivity(c.medium, c.f, c.dt);
      expect(distance(eps, c.epsTilde) / cAbs(c.epsTilde)).toBeLessThan(1e-13); // fixture: mpmath, 30 digits, formula in src/exact/medium.ts
      expect(distance(wavenumber(c.medium, c.f), c.k) / cAbs(c.k)).toBeLessThan(1e-13); // fixture: mpmath, 30 digits
    }
  });

  it('matches the continuation roots of mpmath for every medium, direction, resolution and Courant number', () => {
    for (const c of lossy) {
      const kt = numericalWavenumberLossy(c.medium, c.f, c.theta, c.dx, c.dy, c.dt);
      expect(distance(kt, c.kTilde) / cAbs(c.kTilde), c.name).toBeLessThan(1e-14); // fixture: mpmath.findroot at 30 digits, continued from the long-wave root
    }
  });

  it('predicts phase and magnitude errors from the reference roots', () => {
    for (const c of lossy) {
      const rho = (3 * 2 * Math.PI) / cAbs(c.k); // three wavelengths
      // both k and k̃ agree with the fixture to 1e-14 relative; allow 1e-13 of |k|·ρ
      const slack = 1e-13 * cAbs(c.kTilde) * rho;
      const e = predictedErrors(c.medium, c.f, c.theta, rho, c.dx, c.dy, c.dt);
      const magDb = 20 * Math.LOG10E * (c.kTilde[1] - c.k[1]) * rho;
      expect(Math.abs(e.magDb - magDb)).toBeLessThan(20 * Math.LOG10E * slack); // fixture: mpmath roots
      if (c.name.includes('evanescent')) {
        expect(e.evanescent).toBe(true); // Re εr < 0 below the plasma frequency (Drude model)
        expect(e.phaseDeg).toBeNaN(); // documented
      } else {
        const phaseDeg = (-(c.kTilde[0] - c.k[0]) * rho * 180) / Math.PI;
        expect(e.evanescent).toBe(false);
        expect(Math.abs(e.phaseDeg - phaseDeg)).toBeLessThan((180 / Math.PI) * slack); // fixture: mpmath roots
      }
    }
  });

  it('keeps the lossless real roots of src/exact/dispersion.ts', () => {
    for (const c of losslessReal) {
      const kt = numericalWavenumber(c.f, c.theta, c.dx, c.dy, c.dt, c.c);
      expect(Math.abs(kt / c.k - 1)).toBeLessThan(1e-13); // fixture: mpmath.findroot (Anderson), 30 digits
      const lossyRoot = numericalWavenumberLossy({ epsR: (C0 / c.c) ** 2 }, c.f, c.theta, c.dx, c.dy, c.dt);
      expect(Math.abs(lossyRoot[0] / c.k - 1)).toBeLessThan(1e-13); // fixture: mpmath.findroot (Anderson), 30 digits
      expect(lossyRoot[1]).toBe(0); // lossless: the root stays real
    }
  });
});

describe('lossy 2D Yee dispersion: closed form and limits', () => {
  it('matches k̃ = (2/Δ)·asin((Δ/2)·√T) along the axes for every fixture medium', () => {
    // Along θ = 0 the y term vanishes: (2/dx)²·sin²(k̃·dx/2) = T, so sin(k̃·dx/2) = ±(dx/2)·√T.
    // With √T on its Im ≤ 0 branch and the principal arcsin (which keeps the sign of Im for
    // |Re z| < 1), the + sign gives Im k̃ ≤ 0, the physical root; θ = π/2 is the same with dy.
    const seen = new Set<string>();
    for (const c of lossy) {
      if (seen.has(c.name)) continue;
      seen.add(c.name);
      const rootT = lowerRoot(leftSide(c.medium, c.f, c.dt));
      for (const [theta, d] of [[0, c.dx], [Math.PI / 2, c.dy]] as const) {
        const z: Complex = [(d / 2) * rootT[0], (d / 2) * rootT[1]];
        const a = asin(z);
        const closed: Complex = [(2 / d) * a[0], (2 / d) * a[1]];
        const kt = numericalWavenumberLossy(c.medium, c.f, theta, c.dx, c.dy, c.dt);
        expect(distance(kt, closed) / cAbs(closed), c.name).toBeLessThan(1e-12); // closed form of the relation along an axis
      }
    }
  });

  it('tends to the medium’s own wavenumber as the cells and the time step shrink (second order)', () => {
    for (const c of lossy.filter((x) => x.cellsPerWavelength === 10 && x.theta === 0)) {
      const errors = [1, 10].map((scale) => {
        const kt = numericalWavenumberLossy(c.medium, c.f, 0.4, c.dx / scale, c.dy / scale, c.dt / scale);
        return distance(kt, c.k) / cAbs(c.k);
      });
      expect(errors[1]).toBeLessThan(errors[0] / 50); // second-order scheme: ×10 finer, ×100 smaller (Taflove & Hagness ch. 4, from memory)
      expect(errors[1]).toBeGreaterThan(errors[0] / 200); // common practice, no source
    }
  });

  it('gives exactly the lossless solver’s k̃ and phase errors for a lossless, non-dispersive medium', () => {
    for (const epsR of [1, 2.25, 9.8]) {
      const c = C0 / Math.sqrt(epsR);
      for (const [dx, dy, courant] of [[1e-3, 1e-3, 0.5], [1e-3, 2e-3, 0.6], [2e-3, 1e-3, 0.3]]) {
        const dt = (courant * Math.min(dx, dy)) / c;
        for (const cells of [6, 10, 20, 60, 400]) {
          const f = c / (cells * Math.max(dx, dy));
          for (let degrees = -30; degrees <= 200; degrees += 23) {
            const theta = (degrees * Math.PI) / 180;
            const reference = numericalWavenumber(f, theta, dx, dy, dt, c);
            const kt = numericalWavenumberLossy({ epsR }, f, theta, dx, dy, dt);
            expect(Math.abs(kt[0] / reference - 1)).toBeLessThan(1e-12); // src/exact/dispersion.ts (Taflove & Hagness ch. 4)
            expect(kt[1]).toBe(0);
            const k = (2 * Math.PI * f) / c;
            const perWavelength = (360 * (kt[0] - k)) / k;
            const lossless = phaseErrorPerWavelengthDeg(f, theta, dx, dy, dt, c);
            expect(Math.abs(perWavelength - lossless)).toBeLessThan(1e-12 * 360 + 1e-10 * Math.abs(lossless)); // src/exact/dispersion.ts
            const rho = 0.05;
            const e = predictedErrors({ epsR }, f, theta, rho, dx, dy, dt);
            const phase = predictedPhaseErrorDeg(f, rho, theta, dx, dy, dt, c);
            expect(Math.abs(e.phaseDeg - phase)).toBeLessThan(1e-12 * (k * rho * 180) / Math.PI); // src/exact/dispersion.ts
            expect(e.magDb).toBe(0); // lossless grid, lossless medium
          }
        }
      }
    }
  });

  it('is symmetric in the direction: θ, −θ, π − θ and θ + π give the same k̃', () => {
    const c = lossy.find((x) => x.name === 'mixed' && x.cellsPerWavelength === 8)!;
    const base = numericalWavenumberLossy(c.medium, c.f, 0.7, c.dx, c.dy, c.dt);
    for (const theta of [-0.7, Math.PI - 0.7, 0.7 + Math.PI]) {
      expect(distance(numericalWavenumberLossy(c.medium, c.f, theta, c.dx, c.dy, c.dt), base) / cAbs(base)).toBeLessThan(1e-14); // symmetry of the Yee cell, common practice
    }
  });
});

describe('lossy 2D Yee dispersion: edge cases', () => {
  const dx = 1e-3;
  const dt = (0.5 * dx) / C0;

  it('gives NaN above the cutoff of a lossless grid, as src/exact/dispersion.ts does', () => {
    const cutoff = Math.asin(0.5) / (Math.PI * dt); // along an axis (Taflove & Hagness ch. 4)
    const f = 1.01 * cutoff;
    expect(numericalWavenumberOrNaN(f, 0, dx, dx, dt, C0)).toBeNaN();
    const solution = solveLossyDispersion({ epsR: 1 }, f, 0, dx, dx, dt);
    expect(solution.converged).toBe(false);
    expect(solution.k[0]).toBeNaN();
    expect(solution.iterations).toBeLessThanOrEqual(LOSSY_DISPERSION_MAX_ITERATIONS);
    expect(predictedErrors({ epsR: 1 }, f, 0, 0.1, dx, dx, dt).phaseDeg).toBeNaN();
    const below = numericalWavenumberLossy({ epsR: 1 }, 0.99 * cutoff, 0, dx, dx, dt);
    expect(below[0] * dx).toBeGreaterThan(2.5); // close to the zone edge π, still real
    expect(below[1]).toBe(0);
  });

  it('puts a lossless plasma below its plasma frequency on the negative imaginary axis', () => {
    const plasma: Medium = { epsR: 1, poles: [{ kind: 'drude', omegaP: 2 * Math.PI * 2e10, gamma: 0 }] };
    const kt = numericalWavenumberLossy(plasma, 1e10, 0.3, dx, dx, dt);
    expect(kt[0]).toBe(0); // T is real and negative: sin²(a·k̃) < 0 needs k̃ imaginary
    expect(kt[1]).toBeLessThan(0);
    const e = predictedErrors(plasma, 1e10, 0.3, 0.01, dx, dx, dt);
    expect(e.evanescent).toBe(true);
    expect(e.phaseDeg).toBeNaN();
    expect(Number.isFinite(e.magDb)).toBe(true);
  });

  it('finds the imaginary root when the grid’s ε̃r is negative just above the plasma frequency of the medium', () => {
    // Ω < ω, so ε̃r = 1 − ωp²/Ω² is below εr = 1 − ωp²/ω²: at f = 1.001·fp and ω·dt = π/10
    // the medium still propagates while the grid's wave is evanescent.
    const fp = 1e10;
    const plasma: Medium = { epsR: 1, poles: [{ kind: 'drude', omegaP: 2 * Math.PI * fp, gamma: 0 }] };
    const f = 1.001 * fp;
    const d = C0 / (10 * f);
    const step = (0.5 * d) / C0;
    expect(relativePermittivity(plasma, f)[0]).toBeGreaterThan(0); // precondition
    expect(discretePermittivity(plasma, f, step)[0]).toBeLessThan(0); // precondition
    const s = solveLossyDispersion(plasma, f, 0.2, d, d, step);
    expect(s.converged).toBe(true);
    expect(s.k[0]).toBe(0); // a real negative T has its roots on the imaginary axis
    expect(s.k[1]).toBeLessThan(0);
    expect(relativeResidual(s.k, plasma, f, 0.2, d, d, step)).toBeLessThan(1e-13); // the relation itself
    expect(predictedErrors(plasma, f, 0.2, d, d, d, step).evanescent).toBe(false); // the medium propagates (documented)
  });

  it('rejects arguments out of range by name, and predictedErrors returns NaN instead', () => {
    const m: Medium = { epsR: 4, sigma: 0.5 };
    for (const bad of [0, -1e-3, Number.NaN, Number.POSITIVE_INFINITY]) {
      expect(() => numericalWavenumberLossy(m, 1e10, 0, bad, dx, dt)).toThrow(/dx/);
      expect(() => numericalWavenumberLossy(m, 1e10, 0, dx, bad, dt)).toThrow(/dy/);
      expect(() => numericalWavenumberLossy(m, 1e10, 0, dx, dx, bad)).toThrow(/dt/);
      expect(() => numericalWavenumberLossy(m, bad, 0, dx, dx, dt)).toThrow(/f must/);
      expect(predictedErrors(m, 1e10, 0, 0.1, bad, dx, dt).magDb).toBeNaN();
    }
    expect(() => numericalWavenumberLossy(m, 1 / (2 * dt), 0, dx, dx, dt)).toThrow(/Nyquist/);
    expect(() => numericalWavenumberLossy(m, 1e10, Number.NaN, dx, dx, dt)).toThrow(/theta/);
    expect(() => numericalWavenumberLossy({ epsR: Number.NaN }, 1e10, 0, dx, dx, dt)).toThrow(/non-finite/);
    expect(predictedErrors(m, 1e10, 0, -1, dx, dx, dt).phaseDeg).toBeNaN();
    expect(predictedErrors(m, 1e10, 0, Number.POSITIVE_INFINITY, dx, dx, dt).magDb).toBeNaN();
    const zero = predictedErrors(m, 1e10, 0, 0, dx, dx, dt);
    expect(zero.phaseDeg).toBe(0); // no distance, no error
    expect(zero.magDb).toBe(0);
    expect(Object.is(zero.phaseDeg, -0)).toBe(false);
  });
});

describe('lossy 2D Yee dispersion: convergence of the Newton iteration', () => {
  const pole = fc.oneof(
    fc.record({ kind: fc.constant('debye' as const), deltaEps: fc.double({ min: 0.1, max: 80, noNaN: true }), tau: fc.double({ min: 1e-13, max: 1e-9, noNaN: true }) }),
    fc.record({ kind: fc.constant('drude' as const), omegaP: fc.double({ min: 1e9, max: 3e11, noNaN: true }), gamma: fc.double({ min: 0, max: 1e11, noNaN: true }) }),
    fc.record({ kind: fc.constant('lorentz' as const), deltaEps: fc.double({ min: 0.1, max: 10, noNaN: true }), omega0: fc.double({ min: 1e9, max: 3e11, noNaN: true }), delta: fc.double({ min: 1e7, max: 5e10, noNaN: true }) }),
  );
  const medium = fc.record({
    epsR: fc.double({ min: 1, max: 20, noNaN: true }),
    sigma: fc.oneof(fc.constant(0), fc.double({ min: 1e-4, max: 50, noNaN: true })),
    poles: fc.array(pole, { maxLength: 3 }),
  });

  it('converges within the fixed maximum to a root on the physical branch, for random media and grids', () => {
    let most = 0;
    fc.assert(
      fc.property(
        medium,
        fc.double({ min: 1e8, max: 1e11, noNaN: true }),
        fc.double({ min: 8, max: 200, noNaN: true }),
        fc.double({ min: 0.5, max: 2, noNaN: true }),
        fc.double({ min: 0.05, max: 0.99, noNaN: true }),
        fc.double({ min: -Math.PI, max: Math.PI, noNaN: true }),
        (m, f, cells, aspect, fraction, theta) => {
          const k = wavenumber(m as Medium, f);
          // the coarser side of the cell gets `cells` per wavelength of the medium, by |k|
          const dMax = (2 * Math.PI) / (cells * cAbs(k));
          const [dx, dy] = aspect >= 1 ? [dMax / aspect, dMax] : [dMax, dMax * aspect];
          const limit = 1 / (Math.min(dx, dy) * Math.sqrt(1 / dx ** 2 + 1 / dy ** 2));
          const dt = (fraction * limit * Math.min(dx, dy) * Math.sqrt(m.epsR)) / C0;
          fc.pre(f < 0.4 / dt);
          const s = solveLossyDispersion(m as Medium, f, theta, dx, dy, dt);
          most = Math.max(most, s.iterations);
          expect(s.iterations).toBeLessThanOrEqual(LOSSY_DISPERSION_MAX_ITERATIONS);
          expect(s.converged).toBe(true);
          expect(relativeResidual(s.k, m as Medium, f, theta, dx, dy, dt)).toBeLessThan(1e-11); // the relation itself
          expect(s.k[1]).toBeLessThanOrEqual(0); // physical branch: decaying
          expect(s.k[0]).toBeGreaterThanOrEqual(0);
          // the long-wave root: within a factor of the medium's own k at ≥ 8 cells per wavelength
          expect(distance(s.k, k) / cAbs(k)).toBeLessThan(0.5);
        },
      ),
      { numRuns: 400, seed: 20260601 },
    );
    expect(most).toBeLessThanOrEqual(LOSSY_DISPERSION_MAX_ITERATIONS);
    expect(most).toBeGreaterThan(1);
  });
});
