import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { besselJ, besselJSequence, hankel2, hankel2Sequence } from '../../src/exact/bessel.ts';
import { cDiv as div, cMul as mul } from '../../src/exact/complex.ts';
import type { Complex } from '../../src/exact/complex.ts';
import {
  cylinderSeries, cylinderSeriesMany, cylinderSeriesSolver, MAX_ORDERS, type CylinderProblem, type Polar,
} from '../../src/exact/cylinder-series.ts';
import { gaussLegendre } from '../../src/exact/gauss-legendre.ts';

const deg = Math.PI / 180;
const mag = (a: Complex) => Math.hypot(a[0], a[1]);
const dist = (a: Complex, b: Complex) => Math.hypot(a[0] - b[0], a[1] - b[1]);
const rel = (a: Complex, b: Complex) => dist(a, b) / mag(b);

/** k = √ε on the branch with Im k ≤ 0 (k0 = 1). */
function medium(eps: Complex): { k2: Complex; eps2: Complex } {
  const m = Math.hypot(eps[0], eps[1]);
  let re = Math.sqrt((m + eps[0]) / 2);
  let im = Math.sqrt((m - eps[0]) / 2) * (eps[1] < 0 ? -1 : 1);
  if (im > 0 || (im === 0 && eps[0] < 0)) [re, im] = [-re, -im];
  if (eps[1] === 0 && eps[0] < 0) [re, im] = [0, -Math.sqrt(-eps[0])];
  return { k2: [re, im], eps2: eps };
}

/** The geometry: k1 = 1, ε1 = 1, ka = 2, source at kd = 4 on the x axis. */
function problem(polarization: 'TMz' | 'TEz', inside: CylinderProblem['inside'], source: Polar = { rho: 4, phi: 0 }): CylinderProblem {
  return { polarization, k1: [1, 0], eps1: [1, 0], inside, radius: 2, source };
}

describe('values computed with scipy', () => {
  it('matches the five values given in the issue', () => {
    const at = (p: CylinderProblem, rho: number, phiDeg: number) => cylinderSeries({ ...p, observer: { rho, phi: phiDeg * deg } }).value;
    // the issue gives 12 decimals: agreement to their rounding
    expect(dist(at(problem('TMz', 'pec'), 3, 90), [-0.085536970067, 0.029675029968])).toBeLessThan(1e-12); // scipy.special (given in the issue)
    expect(dist(at(problem('TEz', 'pec'), 3, 90), [-0.198057648704, 0.339303898007])).toBeLessThan(1e-12); // scipy.special (given in the issue)
    expect(dist(at(problem('TMz', { k2: [2, 0], eps2: [4, 0] }), 1, 45), [-0.192614802688, 0.180837839232])).toBeLessThan(1e-12); // scipy.special (given in the issue)
    expect(dist(at(problem('TMz', medium([4, -2])), 3, 180), [-0.126234418601, 0.001795880858])).toBeLessThan(1e-12); // scipy.special (given in the issue)
    const close = cylinderSeries({ ...problem('TMz', 'pec', { rho: 2.2, phi: 0 }), observer: { rho: 2.5, phi: 30 * deg } });
    expect(dist(close.value, [0.083613392231, 0.058580079115])).toBeLessThan(1e-12); // scipy.special (given in the issue)
    // the issue needed about 84 orders; our tail rule (1e-16) takes some more
    expect(close.terms).toBeGreaterThan(84); // documented term-count rule
    expect(close.terms).toBeLessThan(130); // documented term-count rule
    expect(close.converged).toBe(true); // documented
  });
});

interface FixtureCase extends CylinderProblem { observer: Polar; value: [string, string]; orders: number }
const fixture = JSON.parse(readFileSync(new URL('../fixtures/cylinder-series.json', import.meta.url), 'utf8')) as { cases: FixtureCase[] };

describe('fixture: mpmath series at 40+ digits (test/fixtures/generate-cylinder.py)', () => {
  it(`agrees with all ${fixture.cases.length} cases to 1e-13 (both polarizations, PEC, dielectric, lossy, negative ε, inside and outside)`, () => {
    const failures: string[] = [];
    let worst = 0;
    for (const c of fixture.cases) {
      const r = cylinderSeries(c);
      const ref: Complex = [Number(c.value[0]), Number(c.value[1])];
      // relative to |F| + |incident|: in a shadow, or on a PEC surface, F is the small
      // difference of the incident and scattered waves and can be no better than they are
      const scale = mag(ref) + (c.observer.rho >= c.radius ? mag(hankel2(0, scaleBy(c.k1, cylinderDistance(c.observer, c.source)))) : 0);
      const e = dist(r.value, ref) / scale;
      worst = Math.max(worst, e);
      if (!(e <= 1e-13) || !r.converged) failures.push(`${JSON.stringify(c)}: error ${e}`);
    }
    expect(failures).toEqual([]); // fixture: mpmath.besselj, mpmath.hankel2, mpmath.lu_solve
    expect(worst).toBeGreaterThan(0); // the comparison really ran
  });

  it('covers the kinds of case it claims', () => {
    const cases = fixture.cases;
    expect(cases.some((c) => c.polarization === 'TEz' && c.inside !== 'pec' && c.observer.rho < c.radius)).toBe(true); // common practice, no source
    expect(cases.some((c) => c.inside !== 'pec' && c.inside.eps2[1] === 0 && c.inside.eps2[0] < 0)).toBe(true); // common practice, no source
    expect(cases.some((c) => c.k1[1] < 0)).toBe(true); // common practice, no source
    expect(cases.some((c) => c.observer.rho === c.radius)).toBe(true); // common practice, no source
    expect(Math.max(...cases.map((c) => c.orders))).toBeGreaterThan(200); // common practice, no source
  });
});

describe('physics checks', () => {
  const insides: [string, CylinderProblem['inside']][] = [['PEC', 'pec'], ['dielectric', medium([4, 0])], ['lossy', medium([4, -2])], ['negative ε', medium([-3, 0])]];

  it('is reciprocal: swapping source and observer (both outside) leaves F unchanged', () => {
    const a: Polar = { rho: 4, phi: 0.3 };
    const b: Polar = { rho: 2.6, phi: 2.1 };
    for (const pol of ['TMz', 'TEz'] as const) {
      for (const [, inside] of insides) {
        const ab = cylinderSeries({ ...problem(pol, inside, a), observer: b }).value;
        const ba = cylinderSeries({ ...problem(pol, inside, b), observer: a }).value;
        expect(rel(ab, ba)).toBeLessThan(1e-13); // reciprocity theorem (Harrington ch. 3, from memory)
      }
    }
    // lossy outside medium too
    const lossy: CylinderProblem = { polarization: 'TEz', k1: [1.2, -0.2], eps1: [1.4, -0.48], inside: medium([3, -1]), radius: 2, source: a };
    const ab = cylinderSeries({ ...lossy, observer: b }).value;
    const ba = cylinderSeries({ ...lossy, source: b, observer: a }).value;
    expect(rel(ab, ba)).toBeLessThan(1e-13); // reciprocity theorem (Harrington ch. 3, from memory)
  });

  it('meets the boundary conditions at ρ = a', () => {
    const on = (p: CylinderProblem, rho: number) => cylinderSeries({ ...p, observer: { rho, phi: 1.1 } }).value;
    const incidentSize = mag(hankel2(0, [2, 0]));
    expect(mag(on(problem('TMz', 'pec'), 2))).toBeLessThan(1e-14 * incidentSize); // PEC: Ez = 0 (Harrington ch. 5)
    const h = 1e-6;
    for (const pol of ['TMz', 'TEz'] as const) {
      for (const [, inside] of insides) {
        const p = problem(pol, inside);
        const f0 = on(p, 2);
        if (inside === 'pec') {
          if (pol === 'TEz') {
            // ∂Hz/∂ρ = 0: the outward difference quotient is O(h) (second derivative times h/2)
            const slope = mag([(on(p, 2 + h)[0] - f0[0]) / h, (on(p, 2 + h)[1] - f0[1]) / h]);
            expect(slope).toBeLessThan(1e-5 * mag(f0)); // PEC: ∂Hz/∂ρ = 0 (Harrington ch. 5)
          }
          continue;
        }
        const inner = on(p, 2 - 1e-12);
        expect(rel(inner, f0)).toBeLessThan(1e-10); // field continuous across ρ = a (Harrington ch. 5)
        // (1/μ)∂E/∂ρ (TMz) or (1/ε)∂H/∂ρ (TEz) continuous: one-sided quotients on each side
        const out = on(p, 2 + h);
        const inn = on(p, 2 - h);
        const w2: Complex = pol === 'TMz' ? [1, 0] : inside.eps2;
        const dOut: Complex = [(out[0] - f0[0]) / h, (out[1] - f0[1]) / h];
        const dIn: Complex = [(f0[0] - inn[0]) / h, (f0[1] - inn[1]) / h];
        const m = w2[0] ** 2 + w2[1] ** 2;
        const dInScaled: Complex = [(dIn[0] * w2[0] + dIn[1] * w2[1]) / m, (dIn[1] * w2[0] - dIn[0] * w2[1]) / m];
        expect(dist(dOut, dInScaled)).toBeLessThan(1e-4 * (mag(dOut) + mag(f0))); // normal derivative condition (Harrington ch. 5), O(h) quotients
      }
    }
  });

  it('tends to the PEC answer as the conductivity grows, like 1/√|ε2| (surface impedance)', () => {
    const observer: Polar = { rho: 3, phi: 90 * deg };
    for (const pol of ['TMz', 'TEz'] as const) {
      const pec = cylinderSeries({ ...problem(pol, 'pec'), observer }).value;
      const errors = [1e2, 1e4, 1e6, 1e8].map((s) => rel(cylinderSeries({ ...problem(pol, medium([1, -s])), observer }).value, pec));
      for (let i = 1; i < errors.length; i++) {
        // each factor 100 in σ takes √100 = 10 off the error (Leontovich surface impedance η/√ε2, from memory)
        expect(errors[i - 1] / errors[i]).toBeGreaterThan(7); // surface impedance Z = η/√ε2 (Leontovich condition, from memory)
        expect(errors[i - 1] / errors[i]).toBeLessThan(14); // surface impedance Z = η/√ε2 (Leontovich condition, from memory)
      }
      expect(errors[3]).toBeLessThan(3e-4); // surface impedance Z = η/√ε2 (Leontovich condition, from memory): error about 1.8/√1e8 measured
    }
  });

  /** Σ_n ε_n |J_n(k1ρs) + c_n|²: the outgoing power over the free source's, in the normalisation of F. */
  function radiatedPower(p: CylinderProblem): number {
    const c = cylinderSeriesSolver(p).outgoingAmplitudes(120);
    const j = besselJSequence(120, [p.source.rho, 0]);
    return c.reduce((s, cn, n) => s + (n === 0 ? 1 : 2) * ((j[n][0] + cn[0]) ** 2 + (j[n][1] + cn[1]) ** 2), 0);
  }
  /** Re F at the source: the power the source delivers, over the free source's (Re H0^(2)(0) = J0(0) = 1). */
  function deliveredPower(p: CylinderProblem): number {
    return 1 + cylinderSeries({ ...p, observer: p.source }).scattered[0];
  }

  it('balances power for lossless cylinders: what the source delivers is what goes to infinity', () => {
    // P_source = −½Re(E(rs)·I*) ∝ Re F(rs); P_∞ ∝ Σ|a_n|² by the orthogonality of e^{jnφ} and
    // H_n^(2) ~ √(2/(πkρ)) e^{−j(kρ − nπ/2 − π/4)} (DLMF 10.17.4); with F's normalisation both
    // are 1 for the free source. Equivalently: scattered power = power taken from the incident wave.
    for (const pol of ['TMz', 'TEz'] as const) {
      for (const inside of ['pec', medium([4, 0]), medium([-3, 0]), medium([12, 0])] as CylinderProblem['inside'][]) {
        for (const source of [{ rho: 4, phi: 0 }, { rho: 2.1, phi: 1 }]) {
          const p = problem(pol, inside, source);
          const delivered = deliveredPower(p);
          expect(Math.abs(delivered - radiatedPower(p))).toBeLessThan(1e-13 * delivered); // Poynting's theorem (power balance), derived in the test
          expect(Math.abs(delivered - 1)).toBeGreaterThan(1e-3); // the cylinder really changes the source's power
        }
      }
    }
  });

  it('balances power for a lossy cylinder: the difference is the heat (ω ε0 |Im ε2|/2)·∫|E|² inside (TMz)', () => {
    for (const eps of [[4, -2], [2, -0.3]] as Complex[]) {
      const p = problem('TMz', medium(eps));
      const absorbedByFlux = deliveredPower(p) - radiatedPower(p);
      // ∫|F|² dA over the disc: Gauss–Legendre in ρ, trapezoid in φ (periodic, spectrally accurate)
      const { nodes, weights } = gaussLegendre(40);
      const m = 64;
      const points: Polar[] = [];
      for (const x of nodes) for (let i = 0; i < m; i++) points.push({ rho: 1 + x, phi: (2 * Math.PI * i) / m });
      const values = cylinderSeriesMany(p, points);
      let integral = 0;
      for (const [k, x] of nodes.entries()) {
        let ring = 0;
        for (let i = 0; i < m; i++) ring += mag(values[k * m + i].value) ** 2;
        integral += weights[k] * (1 + x) * ring * ((2 * Math.PI) / m);
      }
      // P_abs/P_free = (k0²·|Im ε2|/4)·∫|F|² dA with k0 = 1 here (P_free = ωμ0|I|²/8)
      const absorbedByVolume = (Math.abs(eps[1]) / 4) * integral;
      expect(absorbedByFlux).toBeGreaterThan(0.01); // a lossy cylinder absorbs
      expect(Math.abs(absorbedByFlux - absorbedByVolume)).toBeLessThan(1e-11 * absorbedByVolume); // Poynting's theorem, derived in the test
    }
  });

  it('vanishes with the object: ε2 = ε1, radius 0, and a small dielectric cylinder like (ka)²', () => {
    const observer: Polar = { rho: 3, phi: 1 };
    const free = hankel2(0, [cylinderDistance(observer, { rho: 4, phi: 0 }), 0]);
    for (const pol of ['TMz', 'TEz'] as const) {
      const same = cylinderSeries({ ...problem(pol, { k2: [1, 0], eps2: [1, 0] }), observer });
      expect(mag(same.scattered)).toBeLessThan(1e-15); // no contrast, no scattering (Harrington ch. 5)
      const none = cylinderSeries({ ...problem(pol, 'pec'), radius: 0, observer });
      expect(rel(none.value, free)).toBeLessThan(1e-15); // documented: radius 0 is no cylinder
      expect(none.scattered).toEqual([0, 0]); // documented
      const small = [1e-2, 1e-3].map((a) => mag(cylinderSeries({ ...problem(pol, medium([4, 0])), radius: a, observer }).scattered));
      expect(small[0] / small[1]).toBeGreaterThan(90); // Rayleigh scattering ∝ (ka)² in 2D (from memory)
      expect(small[0] / small[1]).toBeLessThan(110); // Rayleigh scattering ∝ (ka)² in 2D (from memory)
    }
    // a thin PEC wire (TMz) does not vanish: its n = 0 wave, −H0(kρs)·J0(ka)/H0(ka)·H0(kρ),
    // falls off only like 1/ln(ka); the other orders are O((ka)²)
    const a = 1e-6;
    const wire = cylinderSeries({ ...problem('TMz', 'pec'), radius: a, observer });
    const ratio = div(besselJ(0, [a, 0]), hankel2(0, [a, 0]));
    const monopole = mul(mul(hankel2(0, [4, 0]), ratio), hankel2(0, [3, 0])).map((v) => -v) as Complex;
    expect(mag(wire.scattered)).toBeGreaterThan(0.01); // Harrington ch. 5, thin wire (from memory): about 0.02 here
    expect(rel(wire.scattered, monopole)).toBeLessThan(1e-10); // Harrington ch. 5, thin wire (from memory)
  });
});

const scaleBy = (z: Complex, s: number): Complex => [z[0] * s, z[1] * s];

function cylinderDistance(a: Polar, b: Polar): number {
  return Math.hypot(a.rho * Math.cos(a.phi) - b.rho * Math.cos(b.phi), a.rho * Math.sin(a.phi) - b.rho * Math.sin(b.phi));
}

describe('term count and edge cases', () => {
  it('uses more orders as the source approaches the surface and says when it stops short', () => {
    const observer: Polar = { rho: 2, phi: 0.5 };
    const counts = [2.2, 2.02, 2.002].map((rho) => cylinderSeries({ ...problem('TMz', 'pec', { rho, phi: 0 }), observer }));
    for (const r of counts) expect(r.converged).toBe(true); // documented term-count rule
    // geometric rate a/ρs at the surface: about ln(1e-16)/ln(a/ρs) orders
    expect(counts[1].terms).toBeGreaterThan(8 * counts[0].terms); // documented term-count rule
    expect(counts[2].terms).toBeGreaterThan(8 * counts[1].terms); // documented term-count rule
    const stuck = cylinderSeries({ ...problem('TMz', 'pec', { rho: 2 * (1 + 1e-9), phi: 0 }), observer });
    expect(stuck.converged).toBe(false); // documented: the cap of MAX_ORDERS
    expect(stuck.terms).toBe(MAX_ORDERS); // documented
  });

  it('gives NaN on the source, 0 inside a PEC cylinder, and refuses impossible problems', () => {
    const p = problem('TMz', medium([4, -1]));
    const onSource = cylinderSeries({ ...p, observer: { rho: 4, phi: 0 } });
    expect(onSource.value).toEqual([Number.NaN, Number.NaN]); // documented (the incident wave is singular there)
    expect(Number.isFinite(mag(onSource.scattered))).toBe(true); // documented
    expect(cylinderSeries({ ...problem('TEz', 'pec'), observer: { rho: 1, phi: 0 } }).value).toEqual([0, 0]); // no field inside a perfect conductor
    const centre = cylinderSeries({ ...p, observer: { rho: 0, phi: 0 } });
    expect(Number.isFinite(mag(centre.value))).toBe(true); // documented: only the n = 0 wave reaches the axis
    expect(() => cylinderSeries({ ...problem('TMz', 'pec', { rho: 1, phi: 0 }), observer: { rho: 3, phi: 0 } })).toThrow(RangeError); // documented
    expect(() => cylinderSeries({ ...problem('TMz', 'pec', { rho: 2, phi: 0 }), observer: { rho: 3, phi: 0 } })).toThrow(RangeError); // documented
    expect(() => cylinderSeries({ ...problem('TMz', 'pec'), k1: [1, 0.1], observer: { rho: 3, phi: 0 } })).toThrow(RangeError); // documented
    expect(() => cylinderSeries({ ...problem('TMz', 'pec'), observer: { rho: Number.NaN, phi: 0 } })).toThrow(RangeError); // documented
    expect(() => cylinderSeries({ ...problem('TMz', 'pec'), observer: { rho: -1, phi: 0 } })).toThrow(RangeError); // documented
    expect(() => cylinderSeries({ ...problem('TMz', 'pec'), radius: Number.POSITIVE_INFINITY, observer: { rho: 3, phi: 0 } })).toThrow(RangeError); // documented
  });

  it('reaches far observers with the orders the cylinder needs, not the distance', () => {
    // at k1ρ = 2000 the scattered wave is Σ ε_n c_n H_n^(2)(k1ρ) cos nΔφ (the module's expansion),
    // summed here with H_n from hankel2Sequence directly, which is safe below n = k1ρ
    for (const inside of ['pec', medium([4, -0.5])] as CylinderProblem['inside'][]) {
      const p = problem('TEz', inside);
      const observer: Polar = { rho: 2000, phi: 2.5 };
      const r = cylinderSeries({ ...p, observer });
      const c = cylinderSeriesSolver(p).outgoingAmplitudes(80);
      const h = hankel2Sequence(80, [2000, 0]);
      let direct: Complex = [0, 0];
      for (let n = 0; n <= 80; n++) {
        const w = (n === 0 ? 1 : 2) * Math.cos(n * (observer.phi - p.source.phi));
        const t = mul(c[n], h[n]);
        direct = [direct[0] + w * t[0], direct[1] + w * t[1]];
      }
      expect(rel(r.scattered, direct)).toBeLessThan(1e-12); // DLMF 10.23.7 (the series form), summed independently
      expect(r.terms).toBeLessThan(40); // documented term-count rule: set by ka = 2 and kρs = 4, not by kρ = 2000
    }
  });

  it('gives the same values for many observers as one at a time', () => {
    const p = problem('TEz', medium([2, -0.5]));
    const points: Polar[] = [{ rho: 1, phi: 0.2 }, { rho: 2.5, phi: 3 }, { rho: 2, phi: 0 }, { rho: 9, phi: -1 }, { rho: 0.3, phi: 1 }];
    const many = cylinderSeriesMany(p, points);
    for (const [i, o] of points.entries()) expect(many[i].value).toEqual(cylinderSeries({ ...p, observer: o }).value); // common practice, no source
  });
});
