import { cpmlSigmaMax } from '../engine/cpml-profile.ts';
import { EPS0 } from '../scenario/constants.ts';
import { waveSpeed } from '../scenario/layout.ts';
import type { Absorber } from '../scenario/types.ts';

/**
 * Theoretical normal-incidence reflection of a continuously graded absorber backed by a
 * perfect conductor, in dB: R(0) = exp(−2·σmax·d / ((m+1)·ε·c)), the round trip through a
 * layer of thickness d = cells·Δ with σ = σmax(ρ/d)^m (Taflove & Hagness, Computational
 * Electrodynamics, 3rd ed., §7.6; Berenger 1994). σmax = sigmaScale·0.8(m+1)/(η·Δ) as the
 * engine uses it, so the figure does not depend on Δ: 20·log10 R(0) = −1.6·sigmaScale·cells·(20/ln 10).
 * κ and α do not enter (they do not change the attenuation of a normally incident
 * propagating wave in the continuous model with α = 0). A layer of 0 cells reflects 0 dB.
 * Units: spacing Δ in m; result in dB (negative).
 *
 * @example
 * theoreticalReflectionDb({ cells: 10, order: 3, sigmaScale: 1, kappaMax: 5, alphaMax: 0.05 }, 1e-3, 1); // ≈ −138.97
 */
export function theoreticalReflectionDb(absorber: Absorber, spacing: number, epsR: number): number {
  if (absorber.cells <= 0) return 0;
  const m = absorber.order;
  const eps = EPS0 * epsR;
  const c = waveSpeed(epsR);
  const sigmaMax = cpmlSigmaMax(absorber, spacing, epsR);
  const d = absorber.cells * spacing;
  const lnR = (-2 * sigmaMax * d) / ((m + 1) * eps * c);
  return (20 * lnR) / Math.LN10;
}
