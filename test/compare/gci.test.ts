import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  APPARENT_ORDER_MAX_ITERATIONS,
  FIXED_POINT_MAX_ITERATIONS,
  SAFETY_FACTOR_ASSUMED,
  SAFETY_FACTOR_OBSERVED,
  apparentOrder,
  gridConvergenceIndex,
} from '../../src/compare/gci.ts';

/** Values of f0 + C·h^p on the given cell sizes. */
const series = (f0: number, C: number, p: number, sizes: number[]) => sizes.map((h) => f0 + C * h ** p);

describe('GCI: the worked example of Celik et al. 2008', () => {
  // Their Table 1, first column: 2D grids of N = 18000, 8000 and 4500 cells, h ∝ N^(−1/2).
  const sizes = [18000, 8000, 4500].map((n) => 1 / Math.sqrt(n));
  const values = [6.063, 5.972, 5.863]; // Celik et al. 2008 Table 1 (from memory; the same inputs as the pyGCS documentation example)
  const g = gridConvergenceIndex(values, sizes);

  it('reproduces the ratios, order, extrapolated value and errors of their Table 1', () => {
    expect(g.r21).toBeCloseTo(1.5, 12); // Celik et al. 2008 Table 1: r21 = 1.5 (from memory)
    expect(g.r32).toBeCloseTo(4 / 3, 12); // Celik et al. 2008 Table 1: r32 = 1.333 (from memory)
    expect(g.kind).toBe('monotone');
    expect(Math.abs(g.order - 1.53)).toBeLessThan(0.005); // Celik et al. 2008 Table 1: p = 1.53 (from memory)
    expect(Math.abs(g.extrapolated - 6.1685)).toBeLessThan(0.00005); // Celik et al. 2008 Table 1: φ_ext21 = 6.1685 (from memory)
    expect(Math.abs(g.relativeError - 0.015)).toBeLessThan(0.0005); // Celik et al. 2008 Table 1: e_a21 = 1.5 % (from memory)
    expect(Math.abs(g.extrapolatedRelativeError - 0.017)).toBeLessThan(0.0005); // Celik et al. 2008 Table 1: e_ext21 = 1.7 % (from memory)
    expect(g.safetyFactor).toBe(1.25); // Celik et al. 2008, three grids
    expect(g.reason).toBeNull();
  });

  it('gives the GCIs of the pyGCS documentation for the same example', () => {
    expect(Math.abs(g.gciFine - 0.0217)).toBeLessThan(0.00005); // pyGCS documentation example (pypi.org/project/pyGCS): GCI_21 = 2.17 %
    expect(Math.abs(g.gciCoarse - 0.0411)).toBeLessThan(0.00005); // pyGCS documentation example (pypi.org/project/pyGCS): GCI_32 = 4.11 %
  });

  it('holds the values that define the fit: f1 = f_ext − C·h1^p and f2, f3 likewise', () => {
    // Three values fix f_ext, C and p exactly, so the fitted curve passes through all three.
    const C = (g.extrapolated - values[0]) / sizes[0] ** g.order;
    for (let i = 0; i < 3; i++) {
      expect(Math.abs(g.extrapolated - C * sizes[i] ** g.order - values[i])).toBeLessThan(1e-12); // Richardson extrapolation, Roache 1998
    }
  });
});

describe('GCI: synthetic series with known order', () => {
  const f0 = 2.5;
  const C = -0.8;
  const grids: [string, number[]][] = [
    ['uniform r = 2', [0.01, 0.02, 0.04]],
    ['uniform r = √2', [0.1, 0.1 * Math.SQRT2, 0.2]],
    ['r21 = 1.5, r32 = 4/3', [0.02, 0.03, 0.04]],
    ['r21 = 1.3, r32 = 1.6', [0.05, 0.065, 0.104]],
    ['r21 = 1.7, r32 = 1.35', [0.05, 0.085, 0.11475]],
  ];

  for (const [name, sizes] of grids) {
    it(`recovers p = 2 and extrapolates exactly from f0 + C·h² (${name})`, () => {
      const values = series(f0, C, 2, sizes);
      const g = gridConvergenceIndex(values, sizes);
      expect(g.kind).toBe('monotone');
      expect(Math.abs(g.order - 2)).toBeLessThan(1e-10); // exact order of the series, no source
      expect(Math.abs(g.extrapolated - f0)).toBeLessThan(1e-12 * Math.abs(f0)); // Richardson extrapolation is exact for f0 + C·h^p (Roache 1998)
      const trueError = Math.abs(values[0] - f0);
      // For an exact series the Richardson estimate equals the true error: GCI = Fs·|f1 − f0|.
      expect(Math.abs(g.gciFineAbsolute - 1.25 * trueError)).toBeLessThan(1e-10 * trueError); // Roache 1998: GCI = Fs × Richardson error estimate
      expect(Math.abs(g.gciFine - (1.25 * trueError) / Math.abs(values[0]))).toBeLessThan(1e-10 * g.gciFine); // Celik et al. 2008 GCI_fine21 definition
      expect(Math.abs(g.extrapolatedRelativeError - trueError / Math.abs(f0))).toBeLessThan(1e-10 * g.extrapolatedRelativeError); // Celik et al. 2008 e_ext21 definition
      expect(Math.abs(g.relativeError - Math.abs((values[0] - values[1]) / values[0]))).toBeLessThan(1e-15); // Celik et al. 2008 e_a21 definition
      const coarseError = Math.abs(values[1] - f0);
      expect(Math.abs(g.gciCoarseAbsolute - 1.25 * coarseError)).toBeLessThan(1e-10 * coarseError); // the same estimate on grids 2 and 3
      expect(g.iterations).toBeLessThanOrEqual(APPARENT_ORDER_MAX_ITERATIONS);
      expect(g.reason).toBeNull();
    });
  }

  it('needs one fixed-point step for uniform ratios and several for non-uniform ones', () => {
    expect(gridConvergenceIndex(series(f0, C, 2, [0.01, 0.02, 0.04]), [0.01, 0.02, 0.04]).iterations).toBeLessThanOrEqual(2); // q(p) = 0 when r21 = r32 (Celik et al. 2008)
    expect(gridConvergenceIndex(series(f0, C, 2, [0.02, 0.03, 0.04]), [0.02, 0.03, 0.04]).iterations).toBeGreaterThan(3);
  });

  it('recovers p = 1 from f0 + C·h, uniform and non-uniform', () => {
    for (const sizes of [[0.01, 0.02, 0.04], [0.02, 0.03, 0.04], [1, 1.4, 2.1]]) {
      const g = gridConvergenceIndex(series(f0, C, 1, sizes), sizes);
      expect(Math.abs(g.order - 1)).toBeLessThan(1e-10); // exact order of the series, no source
      expect(Math.abs(g.extrapolated - f0)).toBeLessThan(1e-12 * Math.abs(f0)); // Richardson extrapolation is exact (Roache 1998)
    }
  });

  it('recovers a non-integer order (p = 1.5) with a positive C', () => {
    const sizes = [0.1, 0.14, 0.2];
    const g = gridConvergenceIndex(series(-4, 3, 1.5, sizes), sizes);
    expect(Math.abs(g.order - 1.5)).toBeLessThan(1e-10); // exact order of the series, no source
    expect(Math.abs(g.extrapolated + 4)).toBeLessThan(1e-12 * 4); // Roache 1998
  });
});

describe('GCI: classification', () => {
  it('calls a series whose differences alternate in sign oscillatory, with p from s = −1', () => {
    // ε21 = 0.1, ε32 = −0.4: R = −0.25; with r = 2, q(p) = 0 and p = ln 4/ln 2 = 2.
    const g = gridConvergenceIndex([1, 1.1, 0.7], [1, 2, 4]);
    expect(g.kind).toBe('oscillatory'); // R < 0 (Celik et al. 2008; Stern et al. 2001, from memory)
    expect(g.convergenceRatio).toBeCloseTo(-0.25, 14);
    expect(Math.abs(g.order - 2)).toBeLessThan(1e-13); // fixed point of Celik et al. with s = −1, uniform r
    expect(Number.isFinite(g.gciFine)).toBe(true);
    const grows = gridConvergenceIndex([1, 1.4, 1.2], [1, 2, 4]); // ε21 = 0.4, ε32 = −0.2: R = −2
    expect(grows.kind).toBe('oscillatory');
    expect(grows.order).toBeNaN();
    expect(grows.reason).toMatch(/does not decay/);
  });

  it('calls a series whose changes grow divergent and gives no order', () => {
    for (const values of [[1, 1.2, 1.3], [1, 2, 3]]) { // R = 2 and R = 1
      const g = gridConvergenceIndex(values, [1, 2, 4]);
      expect(g.kind).toBe('divergent'); // R ≥ 1 with equal ratios (Celik et al. 2008; Stern et al. 2001, from memory)
      expect(g.order).toBeNaN();
      expect(g.gciFine).toBeNaN();
      expect(g.extrapolated).toBeNaN();
      expect(g.reason).toMatch(/divergent/);
    }
    expect(gridConvergenceIndex([1, 1.05, 1.3], [1, 2, 4]).kind).toBe('monotone'); // R = 0.2
  });

  it('bounds R by ln r21/ln r32, so unequal ratios do not turn a converging series divergent', () => {
    // f0 + C·h on h = 2, 3, 4: ε21 = ε32, R = 1, yet the series converges at p = 1 (bound ln 1.5/ln(4/3) ≈ 1.41)
    const even = gridConvergenceIndex(series(1, 1, 1, [2, 3, 4]), [2, 3, 4]);
    expect(even.convergenceRatio).toBeCloseTo(1, 12); // hand arithmetic
    expect(even.kind).toBe('monotone');
    expect(Math.abs(even.order - 1)).toBeLessThan(1e-10); // exact order, no source
    // p = 2 with r21 = 3, r32 = 1.1: R = (r21² − 1)/(r21²·(r32² − 1)) = 8/(9·0.21) ≈ 4.23 < ln 3/ln 1.1 ≈ 11.5
    const unequal = gridConvergenceIndex(series(1, 1, 2, [1, 3, 3.3]), [1, 3, 3.3]);
    expect(unequal.convergenceRatio).toBeCloseTo(8 / (9 * 0.21), 10); // hand arithmetic
    expect(unequal.kind).toBe('monotone');
    expect(Math.abs(unequal.order - 2)).toBeLessThan(1e-10); // exact order, no source
    // the same bound decides divergence: just above it, no positive order fits
    const bound = Math.log(1.5) / Math.log(4 / 3);
    const beyond = gridConvergenceIndex([1, 1 + bound * 1.01, 1 + bound * 1.01 + 1], [2, 3, 4]);
    expect(beyond.kind).toBe('divergent');
    expect(beyond.reason).toMatch(/ln r21\/ln r32/);
  });

  it('falls back to bisection when the fixed point of Celik et al. does not settle (r32 ≫ r21²)', () => {
    const sizes = [1, 1.1, 5];
    const runaway = apparentOrder(...(series(1, 1, 2, sizes) as [number, number, number]), 1.1, 5 / 1.1);
    expect(runaway.method).toBe('bisection');
    expect(Math.abs(runaway.order - 2)).toBeLessThan(1e-11); // exact order, no source
    expect(runaway.iterations).toBeLessThanOrEqual(APPARENT_ORDER_MAX_ITERATIONS);
    const g = gridConvergenceIndex(series(7, -2, 2, sizes), sizes);
    expect(Math.abs(g.extrapolated - 7)).toBeLessThan(1e-11 * 7); // Richardson extrapolation exact (Roache 1998)
    const celik = apparentOrder(6.063, 5.972, 5.863, 1.5, 4 / 3);
    expect(celik.method).toBe('fixed-point'); // Celik et al. 2008's own iteration settles on their example
    expect(celik.iterations).toBeLessThanOrEqual(FIXED_POINT_MAX_ITERATIONS);
  });
});

describe('GCI: two, four and five grids', () => {
  it('assumes p = 2 with Fs = 3 for two grids', () => {
    const sizes = [0.01, 0.015];
    const values = series(2.5, -0.8, 2, sizes);
    const g = gridConvergenceIndex(values, sizes);
    expect(g.orderObserved).toBe(false);
    expect(g.order).toBe(2);
    expect(g.safetyFactor).toBe(SAFETY_FACTOR_ASSUMED);
    expect(SAFETY_FACTOR_ASSUMED).toBe(3); // Roache 1998, two grids (from memory)
    expect(SAFETY_FACTOR_OBSERVED).toBe(1.25); // Celik et al. 2008
    expect(Math.abs(g.extrapolated - 2.5)).toBeLessThan(1e-12 * 2.5); // exact when the assumed order is the true one
    expect(Math.abs(g.gciFine - (3 * g.relativeError) / (1.5 ** 2 - 1))).toBeLessThan(1e-16); // Roache 1998: Fs·e_a/(r^p − 1)
    expect(g.kind).toBe('unknown');
    expect(g.gciCoarse).toBeNaN();
    expect(g.r32).toBeNaN();
    expect(g.reason).toBeNull();
    const linear = gridConvergenceIndex(series(2.5, -0.8, 1, sizes), sizes, { assumedOrder: 1 });
    expect(Math.abs(linear.extrapolated - 2.5)).toBeLessThan(1e-12 * 2.5); // Richardson extrapolation with the right order
    expect(gridConvergenceIndex(values, sizes, { assumedOrder: 0 }).reason).toMatch(/assumed order/);
    expect(gridConvergenceIndex(values, sizes, { assumedOrder: Number.NaN }).extrapolated).toBeNaN();
  });

  it('uses the three finest of four or five grids and reports the order of the other triples', () => {
    const sizes = [0.01, 0.013, 0.018, 0.025, 0.033];
    const values = series(1, 5, 2, sizes);
    const g = gridConvergenceIndex(values, sizes);
    const three = gridConvergenceIndex(values.slice(0, 3), sizes.slice(0, 3));
    expect(g.grids).toBe(5);
    expect(g.order).toBe(three.order);
    expect(g.gciFine).toBe(three.gciFine);
    expect(g.safetyFactor).toBe(1.25);
    expect(g.otherOrders.map((o) => o.grids)).toEqual([[2, 3, 4], [3, 4, 5]]);
    for (const other of g.otherOrders) {
      expect(Math.abs(other.order - 2)).toBeLessThan(1e-9); // exact order of the series, no source
      expect(other.kind).toBe('monotone');
    }
    const four = gridConvergenceIndex(values.slice(0, 4), sizes.slice(0, 4));
    expect(four.otherOrders).toHaveLength(1);
    // a fourth grid that breaks the pattern shows up in the other triple, not in the result
    const broken = [...values.slice(0, 3), values[3] + 1];
    const gb = gridConvergenceIndex(broken, sizes.slice(0, 4));
    expect(gb.order).toBe(three.order);
    expect(Math.abs(gb.otherOrders[0].order - 2)).toBeGreaterThan(0.1);
  });
});

describe('GCI: degenerate data never throw', () => {
  it('returns NaN with a reason for converged or uninformative values', () => {
    const sizes = [1, 2, 4];
    expect(gridConvergenceIndex([1, 1, 1.5], sizes).reason).toMatch(/ε21 = 0/);
    expect(gridConvergenceIndex([1, 1.5, 1.5], sizes).reason).toMatch(/ε32 = 0/);
    expect(gridConvergenceIndex([2, 2, 2], sizes).reason).toMatch(/equal/);
    for (const values of [[1, 1, 1.5], [1, 1.5, 1.5], [2, 2, 2]]) {
      const g = gridConvergenceIndex(values, sizes);
      expect(g.order).toBeNaN();
      expect(g.gciFine).toBeNaN();
      expect(g.gciFineAbsolute).toBeNaN();
    }
  });

  it('returns NaN with a reason for bad values, sizes and lengths', () => {
    const cases: [number[], number[], RegExp][] = [
      [[1, Number.NaN, 2], [1, 2, 4], /value 2/],
      [[1, 1.1, Number.POSITIVE_INFINITY], [1, 2, 4], /value 3/],
      [[1, 1.1, 1.3], [1, Number.NaN, 4], /cell size 2/],
      [[1, 1.1, 1.3], [0, 2, 4], /cell size 1/],
      [[1, 1.1, 1.3], [-1, 2, 4], /cell size 1/],
      [[1, 1.1, 1.3], [1, 1, 4], /ratio/],
      [[1, 1.1, 1.3], [4, 2, 1], /ratio/],
      [[1, 1.1], [1, 2, 4], /2 values but 3/],
      [[1], [1], /two to five/],
      [[], [], /two to five/],
      [[1, 2, 3, 4, 5, 6], [1, 2, 3, 4, 5, 6], /two to five/],
    ];
    for (const [values, sizes, reason] of cases) {
      const g = gridConvergenceIndex(values, sizes);
      expect(g.reason).toMatch(reason);
      expect(g.order).toBeNaN();
      expect(g.extrapolated).toBeNaN();
      expect(g.gciFine).toBeNaN();
    }
    expect(apparentOrder(1, 1.1, 1.3, 1, 2).reason).toMatch(/exceed 1/);
    expect(apparentOrder(1, 1.1, 1.3, 2, Number.NaN).reason).toMatch(/NaN/);
  });

  it('keeps the absolute GCI when f1 = 0 makes relative errors meaningless (a phase error crossing zero)', () => {
    const sizes = [0.5, 1, 2];
    const values = series(-0.3, 1.2, 2, sizes); // f1 = −0.3 + 0.3 = 0
    expect(values[0]).toBe(0);
    const g = gridConvergenceIndex(values, sizes);
    expect(g.relativeError).toBeNaN();
    expect(g.gciFine).toBeNaN();
    expect(g.reason).toMatch(/f1 = 0/);
    expect(Math.abs(g.order - 2)).toBeLessThan(1e-12); // exact order, no source
    expect(Math.abs(g.gciFineAbsolute - 1.25 * 0.3)).toBeLessThan(1e-12); // Fs·|f1 − f0| for an exact series (Roache 1998)
    expect(Math.abs(g.extrapolated + 0.3)).toBeLessThan(1e-12);
  });

  it('never throws and explains every NaN order, for arbitrary numbers', () => {
    fc.assert(
      fc.property(
        fc.array(fc.oneof(fc.double(), fc.double({ min: -2, max: 2 })), { minLength: 0, maxLength: 6 }),
        fc.array(fc.oneof(fc.double(), fc.double({ min: 0, max: 3 }).map((x) => x * x)), { minLength: 0, maxLength: 6 }),
        (values, sizes) => {
          const g = gridConvergenceIndex(values, sizes);
          const fields = [g.extrapolated, g.relativeError, g.extrapolatedRelativeError, g.gciFine, g.gciFineAbsolute, g.gciCoarse, g.gciCoarseAbsolute];
          for (const value of fields) expect(Math.abs(value)).not.toBe(Number.POSITIVE_INFINITY);
          const explained = [g.order, g.extrapolated, g.relativeError, g.extrapolatedRelativeError, g.gciFine, g.gciFineAbsolute];
          if (explained.some(Number.isNaN)) expect(g.reason).not.toBeNull();
          expect(g.iterations).toBeLessThanOrEqual(APPARENT_ORDER_MAX_ITERATIONS);
        },
      ),
      { numRuns: 5000, seed: 2008 },
    );
    fc.assert(
      fc.property(
        fc.tuple(fc.double({ noNaN: true, min: -1e6, max: 1e6 }), fc.double({ noNaN: true, min: -1e6, max: 1e6 }), fc.double({ noNaN: true, min: -1e6, max: 1e6 })),
        fc.double({ min: 1.01, max: 4, noNaN: true }),
        fc.double({ min: 1.01, max: 4, noNaN: true }),
        ([f1, f2, f3], r21, r32) => {
          const a = apparentOrder(f1, f2, f3, r21, r32);
          expect(a.iterations).toBeLessThanOrEqual(APPARENT_ORDER_MAX_ITERATIONS);
          if (a.reason === null) expect(a.order).toBeGreaterThan(0);
          else expect(a.order).toBeNaN();
        },
      ),
      { numRuns: 2000, seed: 130 },
    );
  });
});
