/**
 * Permittivity of a lossy, dispersive medium and its wavenumber (README "Materials"),
 * with the e^{+jωt} time convention. Two forms:
 *  - the medium's own εr(ω) = ε∞ − jσ/(ωε0) + Σ debye Δε/(1 + jωτ)
 *      + Σ drude −ωp²/(ω² − jωγ) + Σ lorentz Δε·ω0²/(ω0² + 2jωδ − ω²);
 *  - the FDTD scheme's discrete ε̃r(ω), which is what the grid actually carries: with
 *    Ω = (2/dt)·sin(ωdt/2) and ω' = (2/dt)·tan(ωdt/2),
 *    ε̃r = ε∞ − jσ·cos(ωdt/2)/(ε0Ω) + Σ debye Δε/(1 + jω'τ)
 *      + Σ drude −ωp²/(Ω² − jΩγ·cos(ωdt/2)) + Σ lorentz Δε·ω0²/(ω0² − Ω² + 2jδ·sin(ωdt)/dt).
 *    These are the z-transform images of the update equations the engine runs
 *    (time-averaged conductivity, trapezoidal Debye ADE, half-step Drude current with γ
 *    averaged, central second-order Lorentz ADE); see Taflove & Hagness, Computational
 *    Electrodynamics, 3rd ed., ch. 9 (chapter from memory) for the ADE family.
 * μ = μ0 throughout.
 */
import { C0, EPS0, ETA0 } from '../scenario/constants.ts';
import type { Medium } from '../scenario/types.ts';
import { cAdd, cDiv, cScale, cSqrt, type Complex } from './complex.ts';

/** True when the medium has neither conductivity nor poles (the lossless, non-dispersive case). */
export function isSimpleMedium(m: Medium): boolean {
  return !(m.sigma ?? 0) && !(m.poles?.length ?? 0);
}

/**
 * The medium's relative permittivity εr(ω) at frequency f.
 *
 * @param m - the medium (epsR = ε∞, sigma in S/m, poles)
 * @param f - frequency, Hz (> 0)
 * @returns [re, im] of εr, dimensionless (Im ≤ 0 for a passive medium)
 * @example
 * relativePermittivity({ epsR: 4, sigma: 0.01 }, 1e9); // [4, -0.1798]
 */
export function relativePermittivity(m: Medium, f: number): Complex {
  const w = 2 * Math.PI * f;
  let e: Complex = [m.epsR, -(m.sigma ?? 0) / (w * EPS0)];
  for (const p of m.poles ?? []) {
    if (p.kind === 'debye') e = cAdd(e, cDiv([p.deltaEps, 0], [1, w * p.tau]));
    else if (p.kind === 'drude') e = cAdd(e, cDiv([-p.omegaP * p.omegaP, 0], [w * w, -w * p.gamma]));
    else e = cAdd(e, cDiv([p.deltaEps * p.omega0 * p.omega0, 0], [p.omega0 * p.omega0 - w * w, 2 * w * p.delta]));
  }
  return e;
}

/**
 * The FDTD scheme's discrete relative permittivity ε̃r(ω) at frequency f and time step dt
 * (formula in the module comment). Tends to {@link relativePermittivity} as dt → 0.
 *
 * @param m - the medium
 * @param f - frequency, Hz (> 0, below 1/(2dt))
 * @param dt - time step, s
 * @returns [re, im] of ε̃r, dimensionless
 */
export function discretePermittivity(m: Medium, f: number, dt: number): Complex {
  const w = 2 * Math.PI * f;
  const half = (w * dt) / 2;
  const Omega = (2 / dt) * Math.sin(half);
  const wPrime = (2 / dt) * Math.tan(half);
  const cosHalf = Math.cos(half);
  let e: Complex = [m.epsR, -((m.sigma ?? 0) * cosHalf) / (EPS0 * Omega)];
  for (const p of m.poles ?? []) {
    if (p.kind === 'debye') e = cAdd(e, cDiv([p.deltaEps, 0], [1, wPrime * p.tau]));
    else if (p.kind === 'drude') e = cAdd(e, cDiv([-p.omegaP * p.omegaP, 0], [Omega * Omega, -Omega * p.gamma * cosHalf]));
    else e = cAdd(e, cDiv([p.deltaEps * p.omega0 * p.omega0, 0], [p.omega0 * p.omega0 - Omega * Omega, (2 * p.delta * Math.sin(w * dt)) / dt]));
  }
  return e;
}

/**
 * √εr on the branch with Im ≤ 0 (the wave decays outward with e^{+jωt}); for a lossless
 * negative εr this is −j·√|εr|.
 */
export function refractiveIndex(epsR: Complex): Complex {
  const n = cSqrt(epsR);
  // principal root has Re ≥ 0; Im n ≤ 0 needs the root with Im ≤ 0
  if (n[1] > 0 || (n[1] === 0 && epsR[0] < 0)) return [-n[0], -n[1]];
  return n;
}

/**
 * Wavenumber k = (ω/c0)·√εr(ω) in rad/m, with Im k ≤ 0.
 *
 * @example
 * wavenumber({ epsR: 4 }, 1e9); // [41.92, 0]
 */
export function wavenumber(m: Medium, f: number): Complex {
  return cScale(refractiveIndex(relativePermittivity(m, f)), (2 * Math.PI * f) / C0);
}

/** Wavenumber for a given complex εr at frequency f, rad/m, Im ≤ 0. */
export function wavenumberOf(epsR: Complex, f: number): Complex {
  return cScale(refractiveIndex(epsR), (2 * Math.PI * f) / C0);
}

/** Wave impedance √(μ0/(ε0 εr)), Ω. */
export function waveImpedance(epsR: Complex): Complex {
  return cDiv([ETA0, 0], refractiveIndex(epsR));
}

/** Wave speed of the infinite-frequency medium, c∞ = c0/√ε∞, m/s: what sets the Courant limit. */
export function fastestSpeed(m: Medium): number {
  return C0 / Math.sqrt(m.epsR);
}
