import { describe, expect, it } from 'vitest';
import { wrapDegrees } from '../../src/exact/angles.ts';

describe('wrapDegrees into (−180, 180]', () => {
  it('maps angles to the principal value', () => {
    const cases: [number, number][] = [
      [0, 0], [90, 90], [180, 180], [-180, 180], [190, -170], [-190, 170], [359, -1], [360, 0],
      [540, 180], [-540, 180], [720.5, 0.5], [-0.25, -0.25], [1e6, -80], [179.999999, 179.999999],
    ];
    for (const [input, expected] of cases) expect(wrapDegrees(input)).toBe(expected); // common practice, no source
  });

  it('never returns −0 and rejects non-finite angles', () => {
    expect(Object.is(wrapDegrees(-0), 0)).toBe(true); // documented
    expect(Object.is(wrapDegrees(-360), 0)).toBe(true); // documented
    expect(wrapDegrees(Number.NaN)).toBeNaN(); // documented
    expect(wrapDegrees(Number.POSITIVE_INFINITY)).toBeNaN(); // documented
    expect(wrapDegrees(Number.NEGATIVE_INFINITY)).toBeNaN(); // documented
  });
});
