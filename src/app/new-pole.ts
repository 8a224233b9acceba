/**
 * The values a new dispersion pole starts from in the set-up form, chosen so that the pole
 * acts inside the pulse's band and the person sees its effect before tuning it.
 */
import type { Pole, PoleKind } from '../scenario/types.ts';

/** 12 significant digits, so 2π·f0 is written without float noise. */
const tidy = (x: number) => Number(x.toPrecision(12));

/**
 * A new pole of `kind` placed around the pulse's centre frequency f0 (Hz), so that it
 * shows in the band: a Debye relaxation at f0 (τ = 1/(2πf0)), a Drude plasma frequency of
 * half 2πf0 with γ a tenth of it, a Lorentz resonance at twice f0 with δ a twentieth of
 * ω0. Δε carries over from `from` when both kinds have one. Rates in rad/s, τ in s.
 *
 * @example
 * newPole('debye', 1e10); // { kind: 'debye', deltaEps: 10, tau: 1.59154943092e-11 }
 */
export function newPole(kind: PoleKind, f0Hz: number | undefined, from?: Record<string, unknown>): Pole {
  const w0 = 2 * Math.PI * (f0Hz !== undefined && f0Hz > 0 ? f0Hz : 1e9);
  const kept = typeof from?.deltaEps === 'number' ? from.deltaEps : undefined;
  switch (kind) {
    case 'debye': return { kind, deltaEps: kept ?? 10, tau: tidy(1 / w0) };
    case 'drude': return { kind, omegaP: tidy(w0 / 2), gamma: tidy(w0 / 20) };
    case 'lorentz': return { kind, deltaEps: kept ?? 2, omega0: tidy(2 * w0), delta: tidy(w0 / 10) };
  }
}
