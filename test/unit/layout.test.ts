import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { lineNodes, snapIndex } from '../../src/scenario/layout.ts';

describe('probe-line nodes', () => {
  it('run from the first snapped end to the last with distance from the first strictly growing, at any angle', () => {
    // lines.csv rows are ordered by s_m (docs/outputs.md, lines.csv); outputs rely on this order
    fc.assert(fc.property(
      fc.double({ min: 0, max: 0.3, noNaN: true }), fc.double({ min: 0, max: 0.3, noNaN: true }),
      fc.double({ min: 0, max: 0.3, noNaN: true }), fc.double({ min: 0, max: 0.3, noNaN: true }),
      fc.constantFrom(1e-3, 7e-4, 2.5e-3),
      (x0, y0, x1, y1, d) => {
        const nodes = lineNodes(x0, y0, x1, y1, d, 1.3 * d);
        expect(nodes[0].i).toBe(snapIndex(x0, d));
        expect(nodes[nodes.length - 1].i).toBe(snapIndex(x1, d));
        const s = nodes.map((n) => Math.hypot((n.i - nodes[0].i) * d, (n.j - nodes[0].j) * 1.3 * d));
        for (let k = 1; k < s.length; k++) expect(s[k]).toBeGreaterThan(s[k - 1]);
        // max(|Δi|, |Δj|) + 1 points before repeats are dropped, so never more nodes than that
        const span = Math.max(Math.abs(snapIndex(x1, d) - snapIndex(x0, d)), Math.abs(snapIndex(y1, 1.3 * d) - snapIndex(y0, 1.3 * d))) + 1;
        expect(nodes.length).toBeLessThanOrEqual(span);
      },
    ), { numRuns: 2000, seed: 11 });
  });
});
