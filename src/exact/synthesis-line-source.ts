import { C0, EPS0, MU0 } from '../scenario/constants.ts';
import type { Medium, Polarization, Waveform } from '../scenario/types.ts';
import { hankel2 } from './bessel.ts';
import { cSqrt, type Complex } from './complex.ts';
import { synthesizeTransient, type SynthesisOptions, type SynthesisResult, type TransferAt } from './synthesis.ts';

/**
 * The medium's relative permittivity at a complex angular frequency ω (rad/s), the analytic
 * continuation of relativePermittivity (medium.ts) into the lower half-plane:
 * εr = ε∞ − jσ/(ωε0) + Σ Δε/(1 + jωτ) + Σ −ωp²/(ω² − jωγ) + Σ Δε·ω0²/(ω0² + 2jωδ − ω²).
 *
 * @param m - the medium (epsR = ε∞, sigma in S/m, poles)
 * @param omega - [ν, −α], rad/s, not 0
 * @returns εr, dimensionless
 * @example
 * permittivityAt({ epsR: 4, sigma: 0.01 }, [2 * Math.PI * 1e9, 0]); // [4, -0.1798]
 */
export function permittivityAt(m: Medium, omega: Complex): Complex {
  const [wr, wi] = omega;
  const inv = (r: number, i: number): Complex => { const d = r * r + i * i; return [r / d, -i / d]; };
  const [jr, ji] = inv(wr, wi); // 1/ω
  const s = (m.sigma ?? 0) / EPS0;
  let er = m.epsR + s * ji, ei = -s * jr; // −jσ/(ωε0)
  for (const p of m.poles ?? []) {
    let num = 0, dr = 0, di = 0;
    if (p.kind === 'debye') { num = p.deltaEps; dr = 1 - wi * p.tau; di = wr * p.tau; } // 1 + jωτ
    else if (p.kind === 'drude') { num = -p.omegaP * p.omegaP; dr = wr * wr - wi * wi + wi * p.gamma; di = 2 * wr * wi - wr * p.gamma; } // ω² − jωγ
    else { num = p.deltaEps * p.omega0 * p.omega0; dr = p.omega0 * p.omega0 - 2 * p.delta * wi - (wr * wr - wi * wi); di = 2 * p.delta * wr - 2 * wr * wi; }
    const [qr, qi] = inv(dr, di);
    er += num * qr; ei += num * qi;
  }
  return [er, ei];
}

/**
 * Transfer function of a line source in a homogeneous medium at complex ω (rad/s), e^{+jωt}:
 * TMz Ez/I = −(ωμ0/4)·H0⁽²⁾(kρ); TEz Hz/M = −(ωε0εr(ω)/4)·H0⁽²⁾(kρ); k = (ω/c0)·√εr(ω) on the
 * branch with Im k ≤ 0 (outgoing and decaying for Im ω ≤ 0). Harrington, Time-Harmonic
 * Electromagnetic Fields (1961), ch. 5 (the line sources; the TEz form by duality).
 *
 * @param m - the medium
 * @param polarization - 'TMz' (V/m per A) or 'TEz' (A/m per V)
 * @param rho - distance from the source, m (> 0)
 * @returns G as a function of ω = [ν, −α]
 * @example
 * lineSourceTransfer({ epsR: 1 }, 'TMz', 0.03)([2 * Math.PI * 1e10, 0]); // ≈ [-4366.28, -4501.86]
 */
export function lineSourceTransfer(m: Medium, polarization: Polarization, rho: number): TransferAt {
  return (omega) => {
    const [wr, wi] = omega;
    const eps = permittivityAt(m, omega);
    const w2r = wr * wr - wi * wi, w2i = 2 * wr * wi;
    let [kr, ki] = cSqrt([w2r * eps[0] - w2i * eps[1], w2r * eps[1] + w2i * eps[0]]);
    if (ki > 0 || (ki === 0 && kr < 0)) { kr = -kr; ki = -ki; }
    const [hr, hi] = hankel2(0, [(kr * rho) / C0, (ki * rho) / C0]);
    const [fr, fi] = polarization === 'TMz'
      ? [(-wr * MU0) / 4, (-wi * MU0) / 4]
      : [(-EPS0 * (wr * eps[0] - wi * eps[1])) / 4, (-EPS0 * (wr * eps[1] + wi * eps[0])) / 4];
    return [fr * hr - fi * hi, fr * hi + fi * hr];
  };
}

/**
 * The synthesised time column of a line source in a homogeneous (lossy, dispersive) medium,
 * sampled at t = n·dt (the grid's sampling): {@link synthesizeTransient} with
 * {@link lineSourceTransfer} and the delay ρ·√ε∞/c0, the earliest arrival.
 *
 * @param medium - the medium (epsR = ε∞ > 0)
 * @param polarization - 'TMz' (Ez, V/m, for a current in A) or 'TEz' (Hz, A/m, for a magnetic current in V)
 * @param waveform - source waveform
 * @param amplitude - source amplitude
 * @param rho - distance, m (> 0)
 * @param dt - sample interval, s
 * @param samples - number of samples
 * @param options - tolerance, damping, maxEvaluations, tFirst (as in synthesizeTransient)
 * @returns as {@link synthesizeTransient}
 * @throws RangeError for ρ ≤ 0 or ε∞ ≤ 0, and as {@link synthesizeTransient}
 * @example
 * synthesizedLineSource({ epsR: 4, poles: [{ kind: 'debye', deltaEps: 10, tau: 1e-11 }] }, 'TMz',
 *   { kind: 'ricker', f0: 1e10, t0: 2e-10 }, 1, 0.02, 1e-12, 1200).met; // true
 */
export function synthesizedLineSource(
  medium: Medium, polarization: Polarization, waveform: Waveform, amplitude: number, rho: number, dt: number, samples: number,
  options: Pick<SynthesisOptions, 'tolerance' | 'damping' | 'maxEvaluations' | 'tFirst'> = {},
): SynthesisResult {
  if (!(rho > 0) || !Number.isFinite(rho)) throw new RangeError(`synthesizedLineSource: rho must be finite and > 0, got ${rho}`);
  if (!(medium.epsR > 0) || !Number.isFinite(medium.epsR)) throw new RangeError(`synthesizedLineSource: epsR must be finite and > 0, got ${medium.epsR}`);
  return synthesizeTransient({
    waveform, amplitude, transfer: lineSourceTransfer(medium, polarization, rho),
    delay: (rho * Math.sqrt(medium.epsR)) / C0, dt, samples, ...options,
  });
}
