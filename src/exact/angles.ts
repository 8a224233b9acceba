/**
 * Wraps an angle in degrees into the half-open interval (−180, 180], the range docs/physics.md
 * fixes for every reported phase error. 180 stays 180 and −180 becomes 180. NaN and
 * ±Infinity give NaN (an infinite angle has no direction). The reduction uses the exact
 * floating-point remainder, so whole turns are removed without rounding error.
 * Source: common practice (principal value of an angle), no single published source.
 *
 * @param degrees - angle, degrees
 * @returns the same direction, degrees, in (−180, 180]
 *
 * @example
 * wrapDegrees(190);  // -170
 * wrapDegrees(-180); // 180
 */
export function wrapDegrees(degrees: number): number {
  if (!Number.isFinite(degrees)) return Number.NaN;
  let r = degrees % 360; // exact, in (−360, 360), sign of `degrees`
  if (r > 180) r -= 360;
  else if (r <= -180) r += 360;
  return r === 0 ? 0 : r; // no −0 in tables
}
