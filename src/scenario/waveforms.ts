import type { Waveform, WaveformInput } from './types.ts';

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
      const u = s / w.tau;
      return amplitude * Math.exp(-u * u);
    }
    case 'modulated-gaussian': {
      const u = s / w.tau;
      return amplitude * Math.exp(-u * u) * Math.sin(2 * Math.PI * w.f0 * s);
    }
    case 'ricker': {
      const p = Math.PI * w.f0 * s;
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
      const tau = w.tau;
      const u = s / tau;
      return amplitude * Math.exp(-u * u) * (-2 * s / (tau * tau));
    }
    case 'modulated-gaussian': {
      const tau = w.tau;
      const omega = 2 * Math.PI * w.f0;
      const u = s / tau;
      const g = Math.exp(-u * u);
      return amplitude * g * (omega * Math.cos(omega * s) - (2 * s / (tau * tau)) * Math.sin(omega * s));
    }
    case 'ricker': {
      const a = Math.PI * w.f0;
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
  return w.kind === 'ricker' ? 6 / (Math.PI * w.f0) : 6 * w.tau;
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
      const tau = w.tau;
      re = Math.sqrt(Math.PI) * tau * Math.exp(-(((omega * tau) / 2) ** 2));
      break;
    }
    case 'modulated-gaussian': {
      // sin(ω0 t) = (e^{jω0t} − e^{−jω0t})/(2j): G(ω−ω0)/(2j) − G(ω+ω0)/(2j)
      const tau = w.tau;
      const w0 = 2 * Math.PI * w.f0;
      const g = (x: number) => Math.sqrt(Math.PI) * tau * Math.exp(-(((x * tau) / 2) ** 2));
      im = -(g(omega - w0) - g(omega + w0)) / 2;
      break;
    }
    case 'ricker': {
      // FT of (1 − 2a²t²)e^{−a²t²} = (√π/a)·(ω²/(2a²))·e^{−ω²/(4a²)}
      const a = Math.PI * w.f0;
      re = (Math.sqrt(Math.PI) / a) * (omega * omega / (2 * a * a)) * Math.exp(-(omega * omega) / (4 * a * a));
      break;
    }
  }
  const c = Math.cos(omega * w.t0);
  const s = -Math.sin(omega * w.t0);
  return [amplitude * (re * c - im * s), amplitude * (re * s + im * c)];
}

/** Most spectrum evaluations {@link waveformBand} ever makes, whatever the numbers (tested). */
export const BAND_SEARCH_EVALUATIONS = 4200;

/**
 * Frequency of the spectral peak |I(f)| and the highest frequency where |I(f)| has fallen
 * `dropDb` below that peak (default 40 dB), Hz. Bounded in time whatever the numbers: the
 * gaussian has a closed form (|I| ∝ exp(−(πfτ)²)); the ricker peaks at f0 and its edge is a
 * bisection in (f/f0)² of 2x·e^{−x}; the modulated gaussian's peak is found on a fixed grid
 * spanning f0 plus its Gaussian envelope, and its edge by doubling then bisection, each with
 * a fixed number of steps. `evaluations` counts spectrum evaluations (at most
 * BAND_SEARCH_EVALUATIONS).
 *
 * @example
 * waveformBand({ kind: 'gaussian', tau: 1e-10, t0: 5e-10 }).edgeHz; // ≈ 7.71e9 (40 dB)
 */
export function waveformBand(w: Waveform, dropDb = 40): { peakHz: number; edgeHz: number; evaluations: number } {
  const ratio = 10 ** (-dropDb / 20);
  if (w.kind === 'gaussian') {
    return { peakHz: 0, edgeHz: Math.sqrt(-Math.log(ratio)) / (Math.PI * w.tau), evaluations: 0 };
  }
  if (w.kind === 'ricker') {
    // |I| ∝ x·e^{−x} with x = (f/f0)², peak at x = 1; the edge solves x·e^{1−x} = ratio for x > 1
    let lo = 1;
    let hi = 2;
    let evaluations = 0;
    const g = (x: number) => { evaluations++; return x * Math.exp(1 - x); };
    while (g(hi) > ratio && hi < 1e6) hi *= 2;
    for (let k = 0; k < 100; k++) {
      const mid = 0.5 * (lo + hi);
      if (g(mid) > ratio) lo = mid; else hi = mid;
    }
    return { peakHz: w.f0, edgeHz: w.f0 * Math.sqrt(0.5 * (lo + hi)), evaluations };
  }
  let evaluations = 0;
  const mag = (f: number) => { evaluations++; return Math.hypot(...waveformSpectrum(w, 1, f)); };
  // the envelope's 1/e half-width in frequency is 1/(πτ); the peak lies within f0 ± a few of
  // them, which 8·f0 covers whenever f0 is not far below that width
  const width = 1 / (Math.PI * w.tau);
  const fMax = Math.max(8 * w.f0, w.f0 + 8 * width);
  let peakHz = 0;
  let peak = 0;
  const n = 4000;
  for (let k = 0; k <= n; k++) {
    const f = (fMax * k) / n;
    const m = mag(f);
    if (m > peak) { peak = m; peakHz = f; }
  }
  const threshold = peak * ratio;
  // bracket the edge: steps of f0 while they are few, then doubling steps (never more than 100 in all)
  const lo = peakHz;
  let hi = peakHz + w.f0;
  let stride = w.f0;
  for (let k = 0; k < 100 && mag(hi) > threshold; k++) {
    if (k >= 40) stride *= 2;
    hi += stride;
  }
  let a = lo;
  let b = hi;
  for (let k = 0; k < 80; k++) {
    const mid = 0.5 * (a + b);
    if (mag(mid) > threshold) a = mid; else b = mid;
  }
  return { peakHz, edgeHz: 0.5 * (a + b), evaluations };
}

/**
 * A waveform with its defaults filled in (README "Scenario file"): τ = 1/f0 for the
 * modulated gaussian, t0 = 5τ for both Gaussian kinds and 2/f0 for ricker. The parser and
 * the page use this one function. The input must carry the field its kind needs (f0 for
 * modulated-gaussian and ricker, τ for gaussian); fields that do not apply are dropped.
 *
 * @example
 * withWaveformDefaults({ kind: 'ricker', f0: 1e9 }); // { kind: 'ricker', f0: 1e9, t0: 2e-9 }
 */
export function withWaveformDefaults(w: WaveformInput): Waveform {
  switch (w.kind) {
    case 'gaussian': {
      const tau = w.tau as number;
      return { kind: 'gaussian', tau, t0: w.t0 ?? 5 * tau };
    }
    case 'modulated-gaussian': {
      const f0 = w.f0 as number;
      const tau = w.tau ?? 1 / f0;
      return { kind: 'modulated-gaussian', f0, tau, t0: w.t0 ?? 5 * tau };
    }
    case 'ricker': {
      const f0 = w.f0 as number;
      return { kind: 'ricker', f0, t0: w.t0 ?? 2 / f0 };
    }
  }
}
