import { wrapDegrees } from './angles.ts';

/*
 * Numerical dispersion of the 2D TMz Yee scheme (Taflove & Hagness, Computational
 * Electrodynamics, 3rd ed., 2005, ch. 4): a plane wave exp(j(ωt − k̃x·x − k̃y·y)) on the grid
 * must satisfy
 *   sin²(ω·dt/2)/(c·dt)² = sin²(k̃x·dx/2)/dx² + sin²(k̃y·dy/2)/dy²,
 * with k̃x = k̃·cosθ, k̃y = k̃·sinθ. Along a fixed direction the right side increases with
 * k̃ up to the edge of the first Brillouin zone, k̃max = min(π/(|cosθ|·dx), π/(|sinθ|·dy));
 * the physical root is the one in (0, k̃max]. Above the frequency at which the left side
 * exceeds the right side at k̃max, or above the temporal Nyquist frequency 1/(2·dt), no real
 * root exists on that branch: the grid cannot carry the wave in that direction.
 */

/** Thrown by {@link numericalWavenumber} above the grid's cutoff for the requested direction. */
export class DispersionCutoffError extends RangeError {
  /** The requested frequency, Hz. */
  readonly frequency: number;
  /** The highest frequency with a real numerical wavenumber in that direction, Hz. */
  readonly cutoff: number;

  constructor(frequency: number, cutoff: number, theta: number) {
    const degrees = (theta * 180) / Math.PI;
    super(
      `no real numerical wavenumber at ${frequency} Hz along ${degrees}°: above the grid's cutoff ` +
        `of ${cutoff} Hz in that direction (refine dx/dy or lower the frequency)`,
    );
    this.name = 'DispersionCutoffError';
    this.frequency = frequency;
    this.cutoff = cutoff;
  }
}

function checkGrid(theta: number, dx: number, dy: number, dt: number, c: number): void {
  const positive: [string, number][] = [['dx', dx], ['dy', dy], ['dt', dt], ['c', c]];
  for (const [name, value] of positive) {
    if (!(value > 0) || !Number.isFinite(value)) throw new RangeError(`${name} must be finite and > 0, got ${value}`);
  }
  if (!Number.isFinite(theta)) throw new RangeError(`theta must be finite, got ${theta}`);
}

function checkFrequency(f: number): void {
  if (!(f >= 0) || !Number.isFinite(f)) throw new RangeError(`f must be finite and ≥ 0, got ${f}`);
}

/** Right side of the dispersion relation along direction cosines (cx, sy), 1/m². */
function spatialTerm(k: number, cx: number, sy: number, dx: number, dy: number): number {
  const xTerm = Math.sin((k * cx * dx) / 2) / dx;
  const yTerm = Math.sin((k * sy * dy) / 2) / dy;
  return xTerm * xTerm + yTerm * yTerm;
}

/** d(spatialTerm)/dk, 1/m. */
function spatialSlope(k: number, cx: number, sy: number, dx: number, dy: number): number {
  return (cx * Math.sin(k * cx * dx)) / (2 * dx) + (sy * Math.sin(k * sy * dy)) / (2 * dy);
}

/** Edge of the first Brillouin zone along the direction, rad/m. */
function zoneEdge(cx: number, sy: number, dx: number, dy: number): number {
  return Math.min(Math.PI / (cx * dx), Math.PI / (sy * dy));
}

/**
 * Highest frequency at which the 2D TMz Yee grid carries a real wave along direction θ:
 * where sin²(ω·dt/2)/(c·dt)² reaches the spatial term at the Brillouin-zone edge, capped
 * at the temporal Nyquist frequency 1/(2·dt). Source: the Yee dispersion relation
 * (Taflove & Hagness, Computational Electrodynamics, 3rd ed., ch. 4).
 *
 * @param theta - propagation angle from the x axis, rad
 * @param dx - cell size along x, m
 * @param dy - cell size along y, m
 * @param dt - time step, s
 * @param c - wave speed in the medium, m/s
 * @returns cutoff frequency, Hz
 * @throws RangeError when dx, dy, dt or c is not finite and > 0, or theta is not finite
 *
 * @example
 * dispersionCutoff(0, 1e-3, 1e-3, 0.5e-3 / 299792458, 299792458); // ≈ 9.993e10 Hz
 */
export function dispersionCutoff(theta: number, dx: number, dy: number, dt: number, c: number): number {
  checkGrid(theta, dx, dy, dt, c);
  const cx = Math.abs(Math.cos(theta));
  const sy = Math.abs(Math.sin(theta));
  const reach = c * dt * Math.sqrt(spatialTerm(zoneEdge(cx, sy, dx, dy), cx, sy, dx, dy));
  return reach >= 1 ? 1 / (2 * dt) : Math.asin(reach) / (Math.PI * dt);
}

/**
 * Numerical wavenumber k̃ of the 2D TMz Yee grid at frequency f along direction θ: the root
 * in (0, k̃max] of sin²(ω·dt/2)/(c·dt)² = sin²(k̃·cosθ·dx/2)/dx² + sin²(k̃·sinθ·dy/2)/dy²
 * (Taflove & Hagness, Computational Electrodynamics, 3rd ed., ch. 4), by Newton's method
 * from the exact k = ω/c, kept inside a shrinking bracket by bisection whenever a Newton
 * step would leave it. f = 0 gives 0.
 *
 * @param f - frequency, Hz (finite, ≥ 0)
 * @param theta - propagation angle from the x axis, rad
 * @param dx - cell size along x, m
 * @param dy - cell size along y, m
 * @param dt - time step, s
 * @param c - wave speed in the medium, m/s
 * @returns k̃, rad/m
 * @throws RangeError for an argument out of range (message names it), and
 *   {@link DispersionCutoffError} (a RangeError) when f is above {@link dispersionCutoff}
 *
 * @example
 * // 20 cells per wavelength along x, Courant number 0.5
 * numericalWavenumber(299792458 / 0.02, 0, 1e-3, 1e-3, 0.5e-3 / 299792458, 299792458); // ≈ 315.1388 rad/m (k = 314.1593)
 */
export function numericalWavenumber(f: number, theta: number, dx: number, dy: number, dt: number, c: number): number {
  checkFrequency(f);
  checkGrid(theta, dx, dy, dt, c);
  if (f === 0) return 0;
  const cx = Math.abs(Math.cos(theta));
  const sy = Math.abs(Math.sin(theta));
  const kMax = zoneEdge(cx, sy, dx, dy);
  const halfPhase = Math.PI * f * dt;
  const target = Math.sin(halfPhase) / (c * dt);
  const target2 = target * target;
  if (halfPhase > Math.PI / 2 || spatialTerm(kMax, cx, sy, dx, dy) < target2) {
    throw new DispersionCutoffError(f, dispersionCutoff(theta, dx, dy, dt, c), theta);
  }
  const k = (2 * Math.PI * f) / c;
  let lo = 0;
  let hi = kMax;
  let kt = k < kMax ? k : 0.5 * kMax;
  for (let iteration = 0; iteration < 200; iteration++) {
    const residual = spatialTerm(kt, cx, sy, dx, dy) - target2;
    if (residual === 0) return kt;
    if (residual < 0) lo = kt;
    else hi = kt;
    const slope = spatialSlope(kt, cx, sy, dx, dy);
    let next = kt - residual / slope;
    if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
    if (Math.abs(next - kt) <= 4 * Number.EPSILON * kt) return next;
    kt = next;
  }
  return kt;
}

/**
 * {@link numericalWavenumber} that returns NaN instead of throwing, for tables in which an
 * undefined value is written as NaN (docs/physics.md): NaN above the cutoff and for any argument
 * out of range (including NaN and ±Infinity). Source: as numericalWavenumber.
 *
 * @param f - frequency, Hz; theta - rad; dx, dy - m; dt - s; c - m/s
 * @returns k̃, rad/m, or NaN
 *
 * @example
 * numericalWavenumberOrNaN(1e12, 0, 1e-3, 1e-3, 0.5e-3 / 299792458, 299792458); // NaN (above cutoff)
 */
export function numericalWavenumberOrNaN(f: number, theta: number, dx: number, dy: number, dt: number, c: number): number {
  try {
    return numericalWavenumber(f, theta, dx, dy, dt, c);
  } catch (error) {
    if (error instanceof RangeError) return Number.NaN;
    throw error;
  }
}

/**
 * Relative phase-velocity error of the 2D TMz Yee grid, ṽp/c − 1 = k/k̃ − 1 (negative: the
 * grid's waves are slow). Source: Taflove & Hagness, Computational Electrodynamics, 3rd ed.,
 * ch. 4. f = 0 gives 0 (the long-wave limit); NaN above the cutoff or for arguments out of
 * range, as {@link numericalWavenumberOrNaN}.
 *
 * @param f - frequency, Hz; theta - propagation angle, rad; dx, dy - cell sizes, m;
 *   dt - time step, s; c - wave speed in the medium, m/s
 * @returns ṽp/c − 1, dimensionless
 *
 * @example
 * phaseVelocityError(299792458 / 0.02, 0, 1e-3, 1e-3, 0.5e-3 / 299792458, 299792458); // ≈ −3.108e-3
 */
export function phaseVelocityError(f: number, theta: number, dx: number, dy: number, dt: number, c: number): number {
  const kt = numericalWavenumberOrNaN(f, theta, dx, dy, dt, c);
  if (f === 0 && kt === 0) return 0;
  return (2 * Math.PI * f) / c / kt - 1;
}

/**
 * Phase error the dispersion relation predicts after a wave travels ρ along θ:
 * −(k̃ − k)·ρ in degrees, the sign docs/physics.md uses for arg(FDTD) − arg(exact) with the
 * e^{+jωt} convention (negative: the grid lags). Not wrapped; see
 * {@link predictedPhaseErrorWrappedDeg}. Source: Taflove & Hagness, Computational
 * Electrodynamics, 3rd ed., ch. 4. f = 0 gives 0; NaN above the cutoff, for ρ < 0 and for
 * arguments out of range.
 *
 * @param f - frequency, Hz
 * @param rho - distance travelled, m (≥ 0)
 * @param theta - propagation angle, rad; dx, dy - cell sizes, m; dt - time step, s;
 *   c - wave speed in the medium, m/s
 * @returns phase error, degrees
 *
 * @example
 * // 20 cells per wavelength, S = 0.5, three wavelengths along x
 * predictedPhaseErrorDeg(299792458 / 0.02, 0.06, 0, 1e-3, 1e-3, 0.5e-3 / 299792458, 299792458); // ≈ −3.367
 */
export function predictedPhaseErrorDeg(
  f: number, rho: number, theta: number, dx: number, dy: number, dt: number, c: number,
): number {
  if (!(rho >= 0) || !Number.isFinite(rho)) return Number.NaN;
  const kt = numericalWavenumberOrNaN(f, theta, dx, dy, dt, c);
  const k = (2 * Math.PI * f) / c;
  const degrees = (-(kt - k) * rho * 180) / Math.PI;
  return degrees === 0 ? 0 : degrees;
}

/**
 * {@link predictedPhaseErrorDeg} wrapped into (−180, 180], comparable with a measured
 * arg(FDTD/exact). Source: as predictedPhaseErrorDeg; wrapping by {@link wrapDegrees}.
 *
 * @param f - Hz; rho - m; theta - rad; dx, dy - m; dt - s; c - m/s
 * @returns phase error, degrees in (−180, 180], or NaN as predictedPhaseErrorDeg
 *
 * @example
 * predictedPhaseErrorWrappedDeg(299792458 / 0.02, 4, 0, 1e-3, 1e-3, 0.5e-3 / 299792458, 299792458); // ≈ 135.50 (−224.50 unwrapped)
 */
export function predictedPhaseErrorWrappedDeg(
  f: number, rho: number, theta: number, dx: number, dy: number, dt: number, c: number,
): number {
  return wrapDegrees(predictedPhaseErrorDeg(f, rho, theta, dx, dy, dt, c));
}

/**
 * Phase lag accumulated per wavelength travelled along θ, 360·(k̃ − k)/k degrees, positive
 * when the grid lags (the magnitude used by resolution studies). Source: Taflove & Hagness,
 * Computational Electrodynamics, 3rd ed., ch. 4. f = 0 gives 0 (the limit); NaN above the
 * cutoff or for arguments out of range.
 *
 * @param f - frequency, Hz; theta - propagation angle, rad; dx, dy - cell sizes, m;
 *   dt - time step, s; c - wave speed in the medium, m/s
 * @returns degrees per wavelength
 *
 * @example
 * phaseErrorPerWavelengthDeg(299792458 / 0.02, 0, 1e-3, 1e-3, 0.5e-3 / 299792458, 299792458); // ≈ 1.122
 */
export function phaseErrorPerWavelengthDeg(f: number, theta: number, dx: number, dy: number, dt: number, c: number): number {
  const kt = numericalWavenumberOrNaN(f, theta, dx, dy, dt, c);
  if (f === 0 && kt === 0) return 0;
  const k = (2 * Math.PI * f) / c;
  return (360 * (kt - k)) / k;
}
