/*
 * Numerical dispersion of the 2D TMz Yee scheme in a lossy, dispersive medium. With the
 * e^{+jωt} convention a plane wave exp(j(ωt − k̃x·x − k̃y·y)) on the grid satisfies
 *   μ0·ε0·ε̃r(ω)·Ω² = (2/dx)²·sin²(k̃·cosθ·dx/2) + (2/dy)²·sin²(k̃·sinθ·dy/2),
 *   Ω = (2/dt)·sin(ω·dt/2),
 * where ε̃r is the scheme's discrete permittivity (src/exact/medium.ts). This is the lossless
 * relation of src/exact/dispersion.ts (Taflove & Hagness, Computational Electrodynamics, 3rd
 * ed., 2005, ch. 4) with c² replaced by c0²/ε̃r; ε̃r is complex, so k̃ is too. The right side
 * is even in k̃, so roots come in pairs ±k̃: the physical one decays along the direction of
 * travel, Im k̃ ≤ 0 (Re k̃ ≥ 0 when Im k̃ = 0), the root the long-wave limit k̃ ≈ (Ω/c0)·√ε̃r
 * continues into. For Re ε̃r < 0 (a plasma below its plasma frequency) that root lies near
 * the negative imaginary axis: an evanescent wave.
 */
import { C0 } from '../scenario/constants.ts';
import type { Medium } from '../scenario/types.ts';
import { cScale, type Complex } from './complex.ts';
import { discretePermittivity, refractiveIndex, relativePermittivity, wavenumber } from './medium.ts';

/** Newton iterations {@link solveLossyDispersion} allows before it gives up. */
export const LOSSY_DISPERSION_MAX_ITERATIONS = 30;

/** Step halvings per Newton iteration before a step is taken as it stands. */
const MAX_HALVINGS = 40;

/** What {@link solveLossyDispersion} found. */
export interface LossyDispersionSolution {
  /** k̃ on the physical branch, rad/m, or [NaN, NaN] when none was found. */
  k: Complex;
  /** Newton iterations used, ≤ {@link LOSSY_DISPERSION_MAX_ITERATIONS}. */
  iterations: number;
  /** True when the iteration met its step tolerance at a root in the first Brillouin zone. */
  converged: boolean;
}

function checkArguments(f: number, theta: number, dx: number, dy: number, dt: number): void {
  const positive: [string, number][] = [['dx', dx], ['dy', dy], ['dt', dt]];
  for (const [name, value] of positive) {
    if (!(value > 0) || !Number.isFinite(value)) throw new RangeError(`${name} must be finite and > 0, got ${value}`);
  }
  if (!Number.isFinite(theta)) throw new RangeError(`theta must be finite, got ${theta}`);
  if (!(f > 0) || !(f < 1 / (2 * dt))) {
    throw new RangeError(`f must be > 0 and below the temporal Nyquist frequency 1/(2·dt) = ${1 / (2 * dt)} Hz, got ${f}`);
  }
}

/**
 * Residual F(k) − T of the relation and its slope F'(k), written into `out` as
 * [res re, res im, slope re, slope im]. One axis contributes (2/Δ)²·sin²(a·k) with
 * a = u·Δ/2, u the direction cosine; sin² is formed from sin itself (no 1 − cos, which
 * would cancel at fine resolution).
 */
function residual(
  kr: number, ki: number, weights: readonly number[], halves: readonly number[], tr: number, ti: number, out: number[],
): void {
  let fr = -tr;
  let fi = -ti;
  let gr = 0;
  let gi = 0;
  for (let axis = 0; axis < 2; axis++) {
    const a = halves[axis];
    const w = weights[axis];
    const x = a * kr;
    const y = a * ki;
    const ch = Math.cosh(y);
    const sh = Math.sinh(y);
    const sinR = Math.sin(x) * ch;
    const sinI = Math.cos(x) * sh;
    const cosR = Math.cos(x) * ch;
    const cosI = -Math.sin(x) * sh;
    fr += w * (sinR * sinR - sinI * sinI);
    fi += w * 2 * sinR * sinI;
    // d/dk sin²(ak) = 2a·sin(ak)·cos(ak)
    gr += 2 * a * w * (sinR * cosR - sinI * cosI);
    gi += 2 * a * w * (sinR * cosI + sinI * cosR);
  }
  out[0] = fr;
  out[1] = fi;
  out[2] = gr;
  out[3] = gi;
}

/**
 * Solves the 2D TMz Yee dispersion relation with loss and dispersion (module comment) for
 * the complex numerical wavenumber k̃ along θ, reporting the iteration count. Complex Newton
 * from the long-wave root (Ω/c0)·√ε̃r (Im ≤ 0) rather than from the medium's own k: near a
 * plasma frequency Re εr and Re ε̃r can differ in sign, and from a real start Newton never
 * leaves the real axis. Each step is halved until it lowers |residual| (at most 40
 * halvings); at most {@link LOSSY_DISPERSION_MAX_ITERATIONS} iterations; it stops when a
 * step is below 8·ε_machine·|k̃|. The root is mapped to the branch Im k̃ ≤ 0 (Re k̃ ≥ 0 if
 * real) and must lie in the first Brillouin zone (Re k̃·|cosθ|·dx ≤ π and
 * Re k̃·|sinθ|·dy ≤ π); otherwise, or without convergence, k is [NaN, NaN]. A lossless
 * medium above the grid's cutoff has no such root (the iteration stays real and cannot
 * converge): NaN, as src/exact/dispersion.ts. A lossy medium there may give the complex
 * root near the zone edge if the iteration reaches it. Source: the relation of Taflove &
 * Hagness, Computational Electrodynamics, 3rd ed., ch. 4, with the discrete permittivity of
 * ch. 9 (chapters from memory); Newton's method with step halving (Dennis & Schnabel,
 * Numerical Methods for Unconstrained Optimization and Nonlinear Equations, 1983, ch. 6,
 * chapter from memory).
 *
 * @param medium - the medium (epsR = ε∞, sigma in S/m, poles)
 * @param f - frequency, Hz (> 0, below 1/(2·dt))
 * @param theta - propagation angle from the x axis, rad
 * @param dx - cell size along x, m
 * @param dy - cell size along y, m
 * @param dt - time step, s
 * @returns k̃ in rad/m with the iteration count and whether it converged
 * @throws RangeError when f, dx, dy, dt or theta is out of range (the message names it), or
 *   the medium gives a non-finite permittivity
 *
 * @example
 * // εr = 4, σ = 0.5 S/m at 10 GHz, 1 mm cells, dt at S = 0.5 for c0/2
 * solveLossyDispersion({ epsR: 4, sigma: 0.5 }, 1e10, 0, 1e-3, 1e-3, 1e-3 / C0);
 * // { k: [≈ 424.034, ≈ −47.607], iterations: 4, converged: true } (k = [421.774, −46.800])
 */
export function solveLossyDispersion(
  medium: Medium, f: number, theta: number, dx: number, dy: number, dt: number,
): LossyDispersionSolution {
  checkArguments(f, theta, dx, dy, dt);
  const eps = discretePermittivity(medium, f, dt);
  if (!Number.isFinite(eps[0]) || !Number.isFinite(eps[1])) {
    throw new RangeError(`the medium gives a non-finite permittivity at ${f} Hz`);
  }
  const Omega = (2 / dt) * Math.sin(Math.PI * f * dt);
  const scale = (Omega * Omega) / (C0 * C0);
  const tr = eps[0] * scale;
  const ti = eps[1] * scale;
  // The long-wave root of the grid's own ε̃r, not the medium's k: near a plasma frequency
  // Re εr and Re ε̃r can differ in sign, and from a real start Newton stays real.
  const start = cScale(refractiveIndex(eps), Omega / C0);
  const cx = Math.abs(Math.cos(theta));
  const sy = Math.abs(Math.sin(theta));
  const weights = [4 / (dx * dx), 4 / (dy * dy)];
  const halves = [(cx * dx) / 2, (sy * dy) / 2];
  const at = [0, 0, 0, 0];
  const trial = [0, 0, 0, 0];
  let kr = start[0];
  let ki = start[1];
  residual(kr, ki, weights, halves, tr, ti, at);
  let converged = false;
  let iterations = 0;
  while (iterations < LOSSY_DISPERSION_MAX_ITERATIONS && !converged) {
    iterations++;
    const [rr, ri, gr, gi] = at;
    const g2 = gr * gr + gi * gi;
    if (g2 === 0 || !Number.isFinite(g2)) break;
    // Newton step δ = residual / slope
    let sr = (rr * gr + ri * gi) / g2;
    let si = (ri * gr - rr * gi) / g2;
    const size = Math.hypot(kr, ki);
    if (Math.hypot(sr, si) <= 8 * Number.EPSILON * size) {
      kr -= sr;
      ki -= si;
      converged = true;
      break;
    }
    const before = Math.hypot(rr, ri);
    for (let halving = 0; halving <= MAX_HALVINGS; halving++) {
      residual(kr - sr, ki - si, weights, halves, tr, ti, trial);
      if (Math.hypot(trial[0], trial[1]) < before || halving === MAX_HALVINGS) break;
      sr /= 2;
      si /= 2;
    }
    kr -= sr;
    ki -= si;
    for (let i = 0; i < 4; i++) at[i] = trial[i];
    if (at[0] === 0 && at[1] === 0) converged = true;
  }
  if (ki > 0 || (ki === 0 && kr < 0)) {
    kr = -kr;
    ki = -ki;
  }
  const edge = Math.PI * (1 + 1e-12);
  const inZone = kr * cx * dx <= edge && kr * sy * dy <= edge;
  if (!converged || !inZone || !Number.isFinite(kr) || !Number.isFinite(ki)) {
    return { k: [Number.NaN, Number.NaN], iterations, converged: false };
  }
  return { k: [kr, ki === 0 ? 0 : ki], iterations, converged: true };
}

/**
 * Complex numerical wavenumber k̃ of the 2D TMz Yee grid in a lossy, dispersive medium along
 * θ: the physical root of μ0ε0·ε̃r(ω)·Ω² = (2/dx)²·sin²(k̃·cosθ·dx/2) + (2/dy)²·sin²(k̃·sinθ·dy/2)
 * (module comment), Im k̃ ≤ 0. For a lossless, non-dispersive medium it equals
 * src/exact/dispersion.ts `numericalWavenumber` (to rounding). Source: as
 * {@link solveLossyDispersion}, which does the work.
 *
 * @param medium - the medium; f - frequency, Hz (> 0, below 1/(2·dt)); theta - rad;
 *   dx, dy - cell sizes, m; dt - time step, s
 * @returns [re, im] of k̃, rad/m, or [NaN, NaN] when no root on the physical branch was found
 * @throws RangeError for an argument out of range
 *
 * @example
 * numericalWavenumberLossy({ epsR: 1 }, C0 / 0.02, 0, 1e-3, 1e-3, 0.5e-3 / C0); // ≈ [315.1388, 0] (k = 314.1593)
 */
export function numericalWavenumberLossy(
  medium: Medium, f: number, theta: number, dx: number, dy: number, dt: number,
): Complex {
  return solveLossyDispersion(medium, f, theta, dx, dy, dt).k;
}

/** Errors {@link predictedErrors} returns. */
export interface PredictedErrors {
  /** −Re(k̃ − k)·ρ, degrees (negative: the grid lags); NaN when evanescent. */
  phaseDeg: number;
  /** 20·log10(e)·Im(k̃ − k)·ρ, dB (positive: the grid attenuates less than the medium). */
  magDb: number;
  /** True when Re εr(ω) ≤ 0: the medium carries no propagating wave whose phase to compare. */
  evanescent: boolean;
}

/**
 * Phase and magnitude error the lossy dispersion relation predicts for a wave that has
 * travelled ρ along θ, comparing the grid's e^{−jk̃ρ} with the medium's e^{−jkρ} (k from
 * src/exact/medium.ts `wavenumber`, Im k ≤ 0): phase −Re(k̃ − k)·ρ in degrees, unwrapped
 * (the sign of README's arg(FDTD) − arg(exact)), magnitude 20·log10(e)·Im(k̃ − k)·ρ in dB.
 * When Re εr(ω) ≤ 0 the wave is evanescent: `evanescent` is true and the phase NaN (the
 * magnitude error is still given). Never throws: any argument out of range, ρ < 0 or
 * non-finite, or no root gives NaN for both errors. Source: the relation of
 * {@link solveLossyDispersion} (Taflove & Hagness, Computational Electrodynamics, 3rd ed.,
 * ch. 4).
 *
 * @param medium - the medium
 * @param f - frequency, Hz
 * @param theta - propagation angle, rad
 * @param rho - distance travelled, m (≥ 0)
 * @param dx - cell size along x, m
 * @param dy - cell size along y, m
 * @param dt - time step, s
 * @returns { phaseDeg, magDb, evanescent }
 *
 * @example
 * // lossless, 20 cells per wavelength, S = 0.5, three wavelengths along x
 * predictedErrors({ epsR: 1 }, C0 / 0.02, 0, 0.06, 1e-3, 1e-3, 0.5e-3 / C0); // { phaseDeg: ≈ −3.367, magDb: 0, evanescent: false }
 */
export function predictedErrors(
  medium: Medium, f: number, theta: number, rho: number, dx: number, dy: number, dt: number,
): PredictedErrors {
  const none: PredictedErrors = { phaseDeg: Number.NaN, magDb: Number.NaN, evanescent: false };
  if (!(rho >= 0) || !Number.isFinite(rho)) return none;
  let kt: Complex;
  try {
    kt = numericalWavenumberLossy(medium, f, theta, dx, dy, dt);
  } catch (error) {
    if (error instanceof RangeError) return none;
    throw error;
  }
  const k = wavenumber(medium, f);
  const evanescent = relativePermittivity(medium, f)[0] <= 0;
  const phase = (-(kt[0] - k[0]) * rho * 180) / Math.PI;
  const mag = 20 * Math.LOG10E * (kt[1] - k[1]) * rho;
  return {
    phaseDeg: evanescent ? Number.NaN : phase === 0 ? 0 : phase,
    magDb: mag === 0 ? 0 : mag,
    evanescent,
  };
}
