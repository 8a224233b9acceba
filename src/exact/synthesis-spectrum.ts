/**
 * The pulse spectra in the form Fourier synthesis needs (synthesis.ts): the spectrum of the
 * centred pulse at a complex angular frequency, the band that holds all but a given fraction
 * of it, and closed-form bounds of its size and of its tail beyond a frequency. All from the
 * closed forms of waveforms.ts (waveformSpectrum), which are entire functions of ω.
 */
import type { Waveform } from '../scenario/types.ts';
import type { Complex } from './complex.ts';

/**
 * Spectrum of the pulse centred at t = 0 (I(ω)·e^{jωt0}) at a complex angular frequency, in
 * closed form (the transforms of waveformSpectrum, continued off the real axis; all three
 * are entire): gaussian √π·τ·e^{−(ωτ/2)²}; modulated-gaussian [g(ω − ω0) − g(ω + ω0)]/(2j)
 * with g the gaussian's; ricker (√π/a)·2q·e^{−q}, a = πf0, q = ω²/(4a²). Gradshteyn &
 * Ryzhik 3.896.4 (the Gaussian transform; number from memory).
 *
 * @param w - waveform (its t0 is ignored)
 * @param amplitude - A
 * @param omega - [ν, −α], rad/s
 * @returns Ic(ω), A·s
 * @example
 * centredSpectrum({ kind: 'gaussian', tau: 1e-10, t0: 5e-10 }, 1, [0, 0]); // [1.7725e-10, 0]
 */
export function centredSpectrum(w: Waveform, amplitude: number, omega: Complex): Complex {
  const gauss = (re: number, im: number, tau: number): Complex => {
    const x = (re * tau) / 2, y = (im * tau) / 2;
    const m = Math.sqrt(Math.PI) * tau * Math.exp(y * y - x * x);
    return [m * Math.cos(-2 * x * y), m * Math.sin(-2 * x * y)];
  };
  const [re, im] = omega;
  if (w.kind === 'gaussian') {
    const g = gauss(re, im, w.tau);
    return [amplitude * g[0], amplitude * g[1]];
  }
  if (w.kind === 'modulated-gaussian') {
    const w0 = 2 * Math.PI * w.f0;
    const lo = gauss(re - w0, im, w.tau), hi = gauss(re + w0, im, w.tau);
    return [(amplitude * (lo[1] - hi[1])) / 2, (-amplitude * (lo[0] - hi[0])) / 2]; // (lo − hi)/(2j)
  }
  const a = Math.PI * w.f0;
  const qr = (re * re - im * im) / (4 * a * a), qi = (2 * re * im) / (4 * a * a);
  const m = ((2 * Math.sqrt(Math.PI)) / a) * Math.exp(-qr) * amplitude;
  const er = m * Math.cos(-qi), ei = m * Math.sin(-qi);
  return [qr * er - qi * ei, qr * ei + qi * er];
}

/**
 * The band [lo, hi] of angular frequency outside which |Ic| is below `ratio` of its peak, in
 * closed form from the Gaussian factors (the ricker's X·e^{1−X} = ratio by fixed-point
 * iteration X ← 1 + L + ln X, L = −ln ratio, which contracts for X > 1), a natural panel width
 * (the Gaussian's 1/e half-width 2/τ, or 2a for ricker) and the pulse's time scale.
 *
 * @param w - waveform
 * @param ratio - fraction of the peak, in (0, 1)
 * @returns lo, hi and width in rad/s; time in s
 * @example
 * pulseBand({ kind: 'gaussian', tau: 1e-10, t0: 5e-10 }, 1e-8).hi; // ≈ 8.58e10 rad/s
 */
export function pulseBand(w: Waveform, ratio: number): { lo: number; hi: number; width: number; time: number } {
  const L = -Math.log(ratio);
  if (w.kind === 'gaussian') return { lo: 0, hi: (2 * Math.sqrt(L)) / w.tau, width: 2 / w.tau, time: w.tau };
  if (w.kind === 'modulated-gaussian') {
    const w0 = 2 * Math.PI * w.f0, half = (2 * Math.sqrt(L)) / w.tau;
    return { lo: Math.max(0, w0 - half), hi: w0 + half, width: 2 / w.tau, time: w.tau };
  }
  // ricker: |Ic| ∝ X·e^{1−X} with X = ω²/(4a²); solve X·e^{1−X} = ratio, X > 1, by fixed point
  const a = Math.PI * w.f0;
  let X = 1 + L;
  for (let i = 0; i < 60; i++) X = 1 + L + Math.log(X);
  return { lo: 0, hi: 2 * a * Math.sqrt(X), width: 2 * a, time: 1 / a };
}

/**
 * |Ic(ν − jα)| for real ν ≥ 0, bounded above in closed form: |e^{−((ν−jα)τ/2)²}| =
 * e^{−(ντ/2)²}·e^{(ατ/2)²} for the Gaussian factors, |q| ≤ (ν² + α²)/(4a²) for the ricker.
 *
 * @param w - waveform
 * @param amplitude - A
 * @param nu - ν, rad/s
 * @param alpha - α ≥ 0, 1/s
 * @returns the bound, A·s
 * @example
 * envelope({ kind: 'gaussian', tau: 1e-10, t0: 0 }, 1, 0, 0); // 1.7725e-10
 */
export function envelope(w: Waveform, amplitude: number, nu: number, alpha: number): number {
  const A = Math.abs(amplitude);
  if (w.kind === 'ricker') {
    const a = Math.PI * w.f0;
    return ((A * 2 * Math.sqrt(Math.PI)) / a) * ((nu * nu + alpha * alpha) / (4 * a * a)) * Math.exp((alpha * alpha - nu * nu) / (4 * a * a));
  }
  const tau = w.tau, grow = Math.exp((alpha * tau / 2) ** 2), peak = A * Math.sqrt(Math.PI) * tau * grow;
  if (w.kind === 'gaussian') return peak * Math.exp(-((nu * tau / 2) ** 2));
  const w0 = 2 * Math.PI * w.f0;
  return (peak / 2) * (Math.exp(-((((nu - w0) * tau) / 2) ** 2)) + Math.exp(-((((nu + w0) * tau) / 2) ** 2)));
}

/**
 * ∫_W^∞ (ω/W)·envelope(ω) dω in closed form: ∫ ω·e^{−(ωτ/2)²} dω = (2/τ²)·e^{−(Wτ/2)²};
 * ∫ ω³·e^{−ω²/(4a²)} dω = 8a⁴(S + 1)e^{−S}, S = W²/(4a²); and for the modulated kind, with
 * V = W − ω0 > 0, the bound erfc(x) ≤ e^{−x²}/(x√π) (Abramowitz & Stegun 7.1.13, from memory). The bound on
 * the part of the synthesis integral beyond W when |G| grows at most linearly.
 *
 * @param w - waveform
 * @param amplitude - A
 * @param W - the lower limit, rad/s (> ω0 for the modulated kind, else Infinity)
 * @param alpha - α ≥ 0, 1/s
 * @returns the integral, A (A·s times rad/s)
 * @example
 * tailIntegral({ kind: 'ricker', f0: 1e10, t0: 0 }, 1, 4e11, 0); // ≈ 5.79e-17 A: far above the peak
 */
export function tailIntegral(w: Waveform, amplitude: number, W: number, alpha: number): number {
  const A = Math.abs(amplitude);
  if (w.kind === 'ricker') {
    const a = Math.PI * w.f0, S = (W * W) / (4 * a * a);
    return ((A * 4 * Math.sqrt(Math.PI) * a * (S + 1) * Math.exp(-S)) / W) * (1 + (alpha * alpha) / (W * W)) * Math.exp((alpha * alpha) / (4 * a * a));
  }
  const tau = w.tau, grow = Math.exp((alpha * tau / 2) ** 2), peak = A * Math.sqrt(Math.PI) * tau * grow;
  if (w.kind === 'gaussian') return (peak * (2 / (tau * tau)) * Math.exp(-((W * tau / 2) ** 2))) / W;
  const w0 = 2 * Math.PI * w.f0, V = W - w0;
  if (!(V > 0)) return Number.POSITIVE_INFINITY;
  return (peak * (2 / (tau * tau)) * (1 + w0 / V) * Math.exp(-((V * tau / 2) ** 2))) / W;
}

