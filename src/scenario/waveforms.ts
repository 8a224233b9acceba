import type { Waveform } from '../scenario/types.ts';

/**
 * Source current waveforms I(t) and their time derivatives in closed form.
 * `gaussian`:           I = A·exp(−((t−t0)/τ)²)
 * `modulated-gaussian`: I = A·exp(−((t−t0)/τ)²)·sin(2πf0(t−t0))
 * `ricker`:             I = A·(1 − 2π²f0²(t−t0)²)·exp(−π²f0²(t−t0)²)
 * Units: t in s, f0 in Hz, τ in s, A in amperes; I in A, I' in A/s.
 *
 * @example
 * const w = { kind: 'gaussian', tau: 1e-10, t0: 5e-10 };
 * waveformValue(w, 1, 5e-10); // 1
 */
export function waveformValue(w: Waveform, amplitude: number, t: number): number {
  const s = t - w.t0;
  switch (w.kind) {
    case 'gaussian': {
      const u = s / (w.tau as number);
      return amplitude * Math.exp(-u * u);
    }
    case 'modulated-gaussian': {
      const u = s / (w.tau as number);
      return amplitude * Math.exp(-u * u) * Math.sin(2 * Math.PI * (w.f0 as number) * s);
    }
    case 'ricker': {
      const p = Math.PI * (w.f0 as number) * s;
      const p2 = p * p;
      return amplitude * (1 - 2 * p2) * Math.exp(-p2);
    }
  }
}

/**
 * Time derivative dI/dt of {@link waveformValue}, in A/s, differentiated by hand.
 *
 * @example
 * waveformDerivative({ kind: 'gaussian', tau: 1e-10, t0: 5e-10 }, 1, 5e-10); // 0
 */
export function waveformDerivative(w: Waveform, amplitude: number, t: number): number {
  const s = t - w.t0;
  switch (w.kind) {
    case 'gaussian': {
      const tau = w.tau as number;
      const u = s / tau;
      return amplitude * Math.exp(-u * u) * (-2 * s / (tau * tau));
    }
    case 'modulated-gaussian': {
      const tau = w.tau as number;
      const omega = 2 * Math.PI * (w.f0 as number);
      const u = s / tau;
      const g = Math.exp(-u * u);
      return amplitude * g * (omega * Math.cos(omega * s) - (2 * s / (tau * tau)) * Math.sin(omega * s));
    }
    case 'ricker': {
      const a = Math.PI * (w.f0 as number);
      const a2 = a * a;
      const p2 = a2 * s * s;
      // d/ds[(1 − 2a²s²)e^{−a²s²}] = e^{−a²s²}·(−4a²s − 2a²s(1 − 2a²s²)) = 2a²s·e^{−a²s²}(2a²s² − 3)
      return amplitude * 2 * a2 * s * Math.exp(-p2) * (2 * p2 - 3);
    }
  }
}

/**
 * Half-width in time beyond which |I| is below 1e-12 of its peak, s. The exact transient
 * field treats I as zero outside t0 ± this extent.
 */
export function waveformExtent(w: Waveform): number {
  // exp(−u²) < 1e-12·(something of order one) for u > 5.3; 6 leaves margin for polynomial factors.
  if (w.kind === 'ricker') return 6 / (Math.PI * (w.f0 as number));
  return 6 * (w.tau as number);
}

/**
 * Continuous Fourier transform of I(t) with the e^{+jωt} convention,
 * I(ω) = ∫ I(t)·e^{−jωt} dt, in A·s, returned as [re, im]. Closed forms: the Gaussian
 * transform √π·τ·exp(−(ωτ/2)²) shifted by e^{−jωt0}.
 *
 * @example
 * waveformSpectrum({ kind: 'gaussian', tau: 1e-10, t0: 0 }, 1, 0); // [1.772e-10, 0]
 */
export function waveformSpectrum(w: Waveform, amplitude: number, f: number): [number, number] {
  const omega = 2 * Math.PI * f;
  let re = 0;
  let im = 0; // spectrum of the pulse centred at t = 0
  switch (w.kind) {
    case 'gaussian': {
      const tau = w.tau as number;
      re = Math.sqrt(Math.PI) * tau * Math.exp(-(((omega * tau) / 2) ** 2));
      break;
    }
    case 'modulated-gaussian': {
      // sin(ω0 t) = (e^{jω0t} − e^{−jω0t})/(2j): G(ω−ω0)/(2j) − G(ω+ω0)/(2j)
      const tau = w.tau as number;
      const w0 = 2 * Math.PI * (w.f0 as number);
      const g = (x: number) => Math.sqrt(Math.PI) * tau * Math.exp(-(((x * tau) / 2) ** 2));
      im = -(g(omega - w0) - g(omega + w0)) / 2;
      break;
    }
    case 'ricker': {
      // FT of (1 − 2a²t²)e^{−a²t²} = (√π/a)·(ω²/(2a²))·e^{−ω²/(4a²)}
      const a = Math.PI * (w.f0 as number);
      re = (Math.sqrt(Math.PI) / a) * (omega * omega / (2 * a * a)) * Math.exp(-(omega * omega) / (4 * a * a));
      break;
    }
  }
  const c = Math.cos(omega * w.t0);
  const s = -Math.sin(omega * w.t0);
  return [amplitude * (re * c - im * s), amplitude * (re * s + im * c)];
}

/**
 * Frequency of the spectral peak |I(f)| and the highest frequency where |I(f)| has fallen
 * `dropDb` below that peak (default 40 dB), Hz. Found by scanning then bisecting.
 */
export function waveformBand(w: Waveform, dropDb = 40): { peakHz: number; edgeHz: number } {
  const mag = (f: number) => Math.hypot(...waveformSpectrum(w, 1, f));
  const scale = w.kind === 'gaussian' ? 1 / (w.tau as number) : (w.f0 as number);
  let peakHz = 0;
  let peak = 0;
  const n = 4000;
  const fMax = w.kind === 'gaussian' ? 3 * scale : 8 * scale;
  for (let k = 0; k <= n; k++) {
    const f = (fMax * k) / n;
    const m = mag(f);
    if (m > peak) { peak = m; peakHz = f; }
  }
  const threshold = peak * 10 ** (-dropDb / 20);
  let lo = peakHz;
  let hi = peakHz + scale;
  while (mag(hi) > threshold) hi += scale;
  for (let k = 0; k < 80; k++) {
    const mid = 0.5 * (lo + hi);
    if (mag(mid) > threshold) lo = mid; else hi = mid;
  }
  return { peakHz, edgeHz: 0.5 * (lo + hi) };
}

/** Default waveform fields for a kind, from DESIGN.md: τ = 1/f0 and t0 = 5τ for the Gaussians, t0 = 2/f0 for ricker. */
export function waveformDefaults(kind: Waveform['kind'], f0: number | undefined, tau: number | undefined): { tau?: number; t0: number } {
  if (kind === 'ricker') return { t0: 2 / (f0 as number) };
  const t = tau ?? 1 / (f0 as number);
  return { tau: t, t0: 5 * t };
}
