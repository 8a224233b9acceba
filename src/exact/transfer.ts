import { C0, MU0 } from '../scenario/constants.ts';
import { hankel2 } from './hankel2.ts';

/**
 * Frequency-domain field of an infinite line current along z in a homogeneous,
 * non-magnetic, lossless medium: the transfer function Z(f, ρ) = Ez/I = −(ωμ0/4)·H0^(2)(kρ),
 * k = ω·√εr/c0, with the e^{+jωt} time convention (outgoing wave). Source: the 2D Green's
 * function of the Helmholtz equation, Harrington, Time-Harmonic Electromagnetic Fields
 * (1961), ch. 5 (cylindrical wave functions, the line source).
 * Physics texts written with e^{−iωt} and H0^(1) give the complex conjugate of this value.
 *
 * Edge cases: ρ = 0 (the field is singular on the wire) and f = 0 (no radiated field is
 * defined at DC) give [NaN, NaN], as do ρ < 0, εr ≤ 0 and any NaN or infinite argument.
 * A negative frequency gives the complex conjugate of Z(|f|), as for any real impulse
 * response, so two-sided spectra can use this directly.
 *
 * @param f - frequency, Hz
 * @param rho - distance from the line current, m
 * @param epsR - relative permittivity of the medium, dimensionless
 * @returns [re, im] of Ez/I, V/m per A (Ω/m)
 *
 * @example
 * lineCurrentTransfer(1e10, 0.03, 1); // ≈ [-4366.28, -4501.86] V/m per A, about one wavelength out
 */
export function lineCurrentTransfer(f: number, rho: number, epsR: number): [number, number] {
  if (!Number.isFinite(f) || f === 0 || !Number.isFinite(rho) || !(rho > 0) || !Number.isFinite(epsR) || !(epsR > 0)) {
    return [Number.NaN, Number.NaN];
  }
  const omega = 2 * Math.PI * Math.abs(f);
  const k = (omega * Math.sqrt(epsR)) / C0;
  const [hRe, hIm] = hankel2(k * rho);
  const scale = -(omega * MU0) / 4;
  return f > 0 ? [scale * hRe, scale * hIm] : [scale * hRe, -scale * hIm];
}
