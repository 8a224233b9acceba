import { describe, expect, it } from 'vitest';
import { gaussLegendre } from '../../src/exact/gauss-legendre.ts';

describe('gaussLegendre', () => {
  it('reproduces the 5-point rule', () => {
    const { nodes, weights } = gaussLegendre(5);
    const x = [-0.906179845938664, -0.538469310105683, 0, 0.538469310105683, 0.906179845938664];
    const w = [0.236926885056189, 0.478628670499366, 0.568888888888889, 0.478628670499366, 0.236926885056189];
    for (let i = 0; i < 5; i++) {
      expect(Math.abs(nodes[i] - x[i])).toBeLessThan(1e-15); // Abramowitz & Stegun Table 25.4, n = 5, from memory
      expect(Math.abs(weights[i] - w[i])).toBeLessThan(1e-15); // Abramowitz & Stegun Table 25.4, n = 5, from memory
    }
    expect(weights[2]).toBeCloseTo(128 / 225, 15); // Abramowitz & Stegun Table 25.4, exact centre weight 128/225
  });

  it('integrates polynomials up to degree 2n − 1 exactly and misses degree 2n', () => {
    for (const n of [1, 2, 7, 24]) {
      const { nodes, weights } = gaussLegendre(n);
      for (let degree = 0; degree <= 2 * n; degree++) {
        let sum = 0;
        for (let i = 0; i < n; i++) sum += weights[i] * nodes[i] ** degree;
        const exact = degree % 2 === 0 ? 2 / (degree + 1) : 0;
        if (degree < 2 * n) expect(Math.abs(sum - exact)).toBeLessThan(1e-14); // A&S 25.4.29, exact to degree 2n − 1
        else if (n <= 7) expect(Math.abs(sum - exact)).toBeGreaterThan(1e-6); // A&S 25.4.29, not exact at degree 2n (error ≈ 2e-4 for n = 7)
      }
    }
  });

  it('rejects a point count that is not a positive integer', () => {
    for (const n of [0, -3, 2.5, Number.NaN, Number.POSITIVE_INFINITY]) {
      expect(() => gaussLegendre(n)).toThrow(RangeError); // documented
    }
  });
});
