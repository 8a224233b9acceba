import { wrapDegrees } from '../exact/angles.ts';

/**
 * Magnitude error in dB and phase error in degrees of a measured complex value against a
 * reference: 20·log10|m/r| and arg(m/r) wrapped to (−180°, 180°]. With the e^{+jωt}
 * convention a lagging grid gives a negative phase error. NaN where undefined.
 *
 * @example
 * complexRatioErrors([0, 1], [1, 0]); // { magDb: 0, phaseDeg: 90 }
 */
export function complexRatioErrors(measured: [number, number], reference: [number, number]): { magDb: number; phaseDeg: number } {
  const [a, b] = measured;
  const [c, d] = reference;
  const den = c * c + d * d;
  if (!(den > 0) || !Number.isFinite(den)) return { magDb: NaN, phaseDeg: NaN };
  const re = (a * c + b * d) / den;
  const im = (b * c - a * d) / den;
  return {
    magDb: 20 * Math.log10(Math.hypot(re, im)),
    phaseDeg: wrapDegrees((Math.atan2(im, re) * 180) / Math.PI),
  };
}

/** |measured/reference − 1| in dB, the error-map quantity (20·log10). */
export function relativeErrorDb(measured: [number, number], reference: [number, number]): number {
  const [a, b] = measured;
  const [c, d] = reference;
  const den = c * c + d * d;
  if (!(den > 0)) return NaN;
  const re = (a * c + b * d) / den - 1;
  const im = (b * c - a * d) / den;
  return 20 * Math.log10(Math.hypot(re, im));
}

/**
 * max_n |a[n] − b[n]| and max_n |b[n]| over the common length: the two halves of every
 * "largest error relative to the reference's peak" figure (relErrMax, reflection error).
 */
export function maxDifferenceAndPeak(a: ArrayLike<number>, b: ArrayLike<number>): { diff: number; peak: number } {
  let diff = 0;
  let peak = 0;
  const n = Math.min(a.length, b.length);
  for (let k = 0; k < n; k++) {
    diff = Math.max(diff, Math.abs(a[k] - b[k]));
    peak = Math.max(peak, Math.abs(b[k]));
  }
  return { diff, peak };
}

/**
 * The scheme's transfer function at a point, Ez(f)/I(f): the running DFT of Ez over the DFT
 * of the injected current with its half-step timing, so no half-step phase bias remains
 * (docs/outputs.md, spectra.csv). V/m per A; NaN when the current has no content at f.
 *
 * @example
 * schemeTransfer([2, 0], [0, 1]); // [0, -2]
 */
export function schemeTransfer(ezDft: [number, number], currentDft: [number, number]): [number, number] {
  const [a, b] = ezDft;
  const [c, d] = currentDft;
  const den = c * c + d * d;
  return [(a * c + b * d) / den, (b * c - a * d) / den];
}
