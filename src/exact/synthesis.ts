/**
 * The time column of a field whose transfer function G(ω) = field/source is known only in
 * frequency, by numerical Fourier synthesis with e^{+jωt}:
 *   x(t) = (1/π)·Re ∫₀^∞ I(ω)·G(ω)·e^{jωt} dω,  I(ω) = ∫ I(t)e^{−jωt} dt.
 *
 * Method. Three known factors are taken out of the integrand before any quadrature: the pulse
 * centre t0 (I(ω) = e^{−jωt0}·Ic(ω), Ic the spectrum of the centred pulse in closed form), a
 * delay D given by the caller (the earliest arrival, so that G(ω)e^{jωD} no longer turns over
 * the band) and the oscillation e^{jωs}, s = t − t0 − D, that differs from sample to sample.
 * What is left, F(ω) = Ic(ω)·G(ω)·e^{jωD}, is smooth and needs few G evaluations whatever the
 * length of the column. F is interpolated on panels by polynomials on the zeros of the
 * Chebyshev polynomial U_n (the nodes of Fejér's second rule, nested under doubling, never on
 * a panel's ends, so ω = 0 is never evaluated) in barycentric form (Berrut & Trefethen,
 * SIAM Review 46, 2004). A panel is made twice as fine while that pays (Trefethen, SIAM Review
 * 50, 2008, "Is Gauss quadrature better than Clenshaw–Curtis?", for nested Chebyshev rules)
 * and split when its error falls slowly, which is what a singular end does: a panel touching
 * ω = 0, where a 2D field goes as ω·ln ω (or ln ω), is split at 0.15 of its width, the
 * geometric grading of the hp method (Schwab, p- and hp-Finite Element Methods, 1998, ch. 4;
 * chapter from memory).
 * Panels are refined worst first until the sum of their errors meets the target (global
 * adaptivity as in Piessens et al., QUADPACK, 1983), in rounds, so that a vectorised G sees
 * every new frequency of a round in one call. The integral of the interpolant against e^{jωs}
 * is then taken on Gauss–Legendre nodes fine enough for the largest |s| (no G calls there),
 * summed directly for every sample: no FFT, no wrap-around. Work: at most maxEvaluations G
 * calls (default 4000; a line source needs 100–500 for 1e-4 to 1e-8), plus about
 * N·(ωmax·|s|max/4 + 50 per panel) multiply-adds for N samples.
 *
 * Error estimate (absolute, the same for every sample before damping): since |e^{jωs}| = 1,
 *   |error(t)| ≤ (1/π)·[∫|F − p| dω + tail above ωmax + cut below ωlo] + rounding,
 * with ∫|F − p| over a panel taken as width × max|F − p_coarse| at the nodes the coarser
 * interpolant did not use (the coarse error bounds the fine one while the panel converges);
 * the tail as ∫_{ωmax}^∞ |Ic|·g·(ω/ωmax) dω in closed form, g = the largest |G·e^{jωD}| on the
 * top panel, assuming |G| grows at most linearly beyond (a line source's grows as √ω).
 *
 * Damping: with ω = ν − jα, α > 0, x(t) = e^{αs}·(1/π)·Re ∫₀^∞ F(ν − jα)·e^{jνs} dν. This holds
 * because Ic is entire and G is analytic in the lower half-plane: G is the transform of a
 * causal response h(t), and ∫₀^∞ h(t)e^{−jωt} dt converges (for a passive medium h is bounded
 * by a power of t) when Im ω < 0; a real h gives F(−ν − jα) = conj F(ν − jα), which allows the
 * one-sided form. The contour then stays a distance α from the branch point at ω = 0 and from
 * the medium's poles (all in Im ω > 0), but the error of sample n grows by e^{αs_n}. The default
 * α = 1/s_last at most triples the last sample's error. Measured on 1200–3200-sample columns
 * of 10 GHz pulses 2–60 cm out: it helps a near-singular G, a lightly damped resonance
 * (1240 → 498 evaluations), and a pulse with DC content (gaussian, 214 → 124); it does not help
 * a smooth G with a zero-DC pulse (modulated gaussian, lossless: 105 → 153).
 */
import type { Waveform } from '../scenario/types.ts';
import type { Complex } from './complex.ts';
import { gaussLegendre, type QuadratureRule } from './gauss-legendre.ts';
import { centredSpectrum, envelope, pulseBand, tailIntegral } from './synthesis-spectrum.ts';

/** Default cap on transfer-function evaluations per column (tested never to be exceeded). */
export const SYNTHESIS_MAX_EVALUATIONS = 4000;
const START_LEVEL = 4, TOP_LEVEL = 6; // 15 nodes (7 inside give the first estimate) up to 63, then split
const ZERO_SPLIT = 0.15;
const FAST = 8; // a doubling must cut the estimate by this much to be worth repeating
const HALF_PHASE = 300; // largest phase of e^{jωs} over half a Gauss sub-panel, rad
const TAIL_SHARE = 0.1;
const STOP_WIDTH = 1e-9; // panels narrower than this fraction of the first are not refined

/** G at one angular frequency ω = ν − jα (rad/s, α ≥ 0): field per unit source. */
export type TransferAt = (omega: Complex) => Complex;
/** G at many angular frequencies in one call (same order as given). */
export type TransferMany = (omegas: Complex[]) => Complex[];

export interface SynthesisOptions {
  waveform: Waveform;
  /** Source amplitude (A for a current, V for a magnetic current). */
  amplitude: number;
  /** G one frequency at a time; give this or `transferMany`. */
  transfer?: TransferAt;
  /** G for a batch of frequencies (a cylinder solver, say); preferred when both are given. */
  transferMany?: TransferMany;
  /** D, s: G(ω)e^{jωD} should vary slowly; the earliest arrival is the right choice. Default 0. */
  delay?: number;
  /** First output time, s (default 0); `samples` samples at tFirst + n·dt, dt in s. */
  tFirst?: number; dt: number; samples: number;
  /** Target error relative to the column's peak (default 1e-4). */
  tolerance?: number;
  /** α in 1/s (0 = none), or 'auto' (the default): α = 1/(t_last − t0 − delay), at most 0.5/τ, which at most triples the error of the last sample (module comment). */
  damping?: number | 'auto';
  /** Cap on G evaluations (default SYNTHESIS_MAX_EVALUATIONS, at least 15). */
  maxEvaluations?: number;
}

export interface SynthesisResult {
  /** The field at tFirst + n·dt (units of G times the amplitude). */
  values: Float64Array;
  /** The error estimate of each sample (absolute). */
  errors: Float64Array;
  /** Largest of `errors`, that over the column's peak |value|, and the peak. */
  error: number; relativeError: number; peak: number;
  /** Number of G evaluations made (≤ maxEvaluations), and whether the target was met. */
  evaluations: number; met: boolean;
  /** Empty when met; otherwise why not, and what to change. */
  message: string;
  /** The band integrated, rad/s, the damping used, 1/s, and the number of panels. */
  omegaLow: number; omegaHigh: number; damping: number; panels: number;
}

interface Panel {
  a: number; b: number; level: number;
  re: Float64Array; im: Float64Array; // F at node k = 1..2^L − 1, index k − 1
  estimate: number; previous: number; stalled: boolean;
  size: number; // width × max|F|
  gain: number; // max |G·e^{jωD}| on the panel
}

interface Level { count: number; x: Float64Array; fromLow: Float64Array; fromHigh: Float64Array; bary: Float64Array }

const levels: Level[] = [];
for (let L = 0; L <= TOP_LEVEL; L++) {
  const N = 2 ** L;
  const count = Math.max(N - 1, 0);
  const lv: Level = { count, x: new Float64Array(count), fromLow: new Float64Array(count), fromHigh: new Float64Array(count), bary: new Float64Array(count) };
  for (let k = 1; k < N; k++) {
    const theta = (k * Math.PI) / N;
    lv.x[k - 1] = Math.cos(theta);
    lv.fromLow[k - 1] = Math.cos(theta / 2) ** 2; // (1 + x)/2 without cancellation near x = −1
    lv.fromHigh[k - 1] = Math.sin(theta / 2) ** 2; // (1 − x)/2
    lv.bary[k - 1] = (k % 2 ? -1 : 1) * Math.sin(theta) ** 2; // 1/U_n'(x_k) up to a constant
  }
  levels.push(lv);
}

function nodeOmega(p: { a: number; b: number }, lv: Level, i: number): number {
  const h = p.b - p.a;
  return lv.x[i] <= 0 ? p.a + h * lv.fromLow[i] : p.b - h * lv.fromHigh[i];
}

/** Barycentric interpolant through the nodes of `lv` (every `stride`-th of re/im) at x. */
function interpolate(lv: Level, re: Float64Array, im: Float64Array, stride: number, x: number): Complex {
  let nr = 0, ni = 0, d = 0;
  for (let i = 0; i < lv.count; i++) {
    const diff = x - lv.x[i];
    const j = (i + 1) * stride - 1;
    if (diff === 0) return [re[j], im[j]];
    const c = lv.bary[i] / diff;
    nr += c * re[j]; ni += c * im[j]; d += c;
  }
  return [nr / d, ni / d];
}

const ruleCache = new Map<number, QuadratureRule>();
function rule(n: number): QuadratureRule {
  let r = ruleCache.get(n);
  if (!r) { r = gaussLegendre(n); ruleCache.set(n, r); }
  return r;
}

/** (1/π)·Re ∫ p(ω)e^{jωs_n} dω over all panels, s_n = s0 + n·dt, on Gauss nodes fine enough for |s| ≤ sMax. */
function sumColumn(panels: Panel[], s0: number, dt: number, out: Float64Array, sMax: number): void {
  out.fill(0);
  const N = out.length;
  for (const p of panels) {
    const lv = levels[p.level], h = p.b - p.a;
    // Gauss with M points is exact to degree 2M − 1; e^{jκx} on [−1, 1] needs about
    // κ + 10κ^{1/3} + 30 Legendre degrees to 1e-16 (its coefficients are (2k+1)·j^k·j_k(κ) by
    // Rayleigh's expansion, DLMF 10.60.7, and j_k(κ) dies off fast for k beyond κ, DLMF 10.19.1;
    // numbers from memory), on top of the interpolant's own degree n − 1.
    const kappa = (h * sMax) / 2;
    const m = Math.max(1, Math.ceil(kappa / HALF_PHASE));
    const k = kappa / m;
    const { nodes, weights } = rule(8 * Math.ceil((lv.count + k + 10 * Math.cbrt(k) + 30) / 16));
    for (let j = 0; j < m; j++) {
      for (let i = 0; i < nodes.length; i++) {
        const x = -1 + (2 * j + 1 + nodes[i]) / m;
        const omega = p.a + (h * (1 + x)) / 2;
        const [vr, vi] = interpolate(lv, p.re, p.im, 1, x);
        const scale = (weights[i] * h) / (2 * m * Math.PI);
        const cr = scale * vr, ci = scale * vi;
        const stepC = Math.cos(omega * dt), stepS = Math.sin(omega * dt);
        for (let start = 0; start < N; start += 64) {
          const phase = omega * (s0 + start * dt);
          let zr = Math.cos(phase), zi = Math.sin(phase);
          const end = Math.min(N, start + 64);
          for (let n = start; n < end; n++) {
            out[n] += cr * zr - ci * zi;
            const t = zr * stepC - zi * stepS;
            zi = zr * stepS + zi * stepC;
            zr = t;
          }
        }
      }
    }
  }
}

/**
 * The time column x(t_n), t_n = tFirst + n·dt, of a field with transfer function G(ω) driven by
 * a pulse, x(t) = (1/π)·Re ∫₀^∞ I(ω)G(ω)e^{jωt} dω (e^{+jωt}), by adaptive interpolation of
 * Ic·G·e^{jωD} on nested Chebyshev (Fejér) panels and direct summation over fine Gauss nodes
 * (module comment; Trefethen, SIAM Review 50, 2008; Piessens et al., QUADPACK, 1983). The band
 * comes from the pulse's closed-form spectrum (|Ic| below 1e-3·tolerance of its peak, widened
 * while the tail bound asks for it). Work is bounded: at most `maxEvaluations` G calls, however
 * long the column. The estimate bounds the error wherever the panels' two-level estimates hold
 * (no feature of G narrower than a panel's node spacing goes unseen); the tests hold it against
 * exact columns. When the target is not reached, `met` is false and `message` says why and
 * what to change.
 *
 * @param o - see {@link SynthesisOptions}: waveform, amplitude, transfer (ω complex, rad/s),
 *   delay D (s), tFirst and dt (s), samples, tolerance (relative), damping (1/s), maxEvaluations
 * @returns the column, its per-sample and worst error estimates, G evaluations, met, message
 * @throws RangeError on bad arguments (dt ≤ 0, samples not an integer ≥ 0, tolerance ≤ 0,
 *   negative damping, maxEvaluations < 15, no transfer) or a non-finite G value
 * @example
 * const r = synthesizeTransient({ waveform: { kind: 'ricker', f0: 1e10, t0: 2e-10 }, amplitude: 1,
 *   transfer: (w) => [w[0] * 0 + 1, 0], dt: 1e-12, samples: 400 }); // G = 1: the pulse itself
 * r.values[200]; // ≈ 1 (the ricker's peak), r.met === true
 */
export function synthesizeTransient(o: SynthesisOptions): SynthesisResult {
  const { waveform: w, amplitude, dt, samples: N } = o;
  const tol = o.tolerance ?? 1e-4;
  const maxEval = o.maxEvaluations ?? SYNTHESIS_MAX_EVALUATIONS;
  const D = o.delay ?? 0;
  const tFirst = o.tFirst ?? 0;
  if (!(dt > 0) || !Number.isFinite(dt)) throw new RangeError(`synthesizeTransient: dt must be finite and > 0, got ${dt}`);
  if (!Number.isInteger(N) || N < 0) throw new RangeError(`synthesizeTransient: samples must be an integer ≥ 0, got ${N}`);
  if (!(tol > 0) || !Number.isFinite(tol)) throw new RangeError(`synthesizeTransient: tolerance must be finite and > 0, got ${tol}`);
  if (!(maxEval >= 15)) throw new RangeError(`synthesizeTransient: maxEvaluations must be at least 15, got ${maxEval}`);
  if (![D, tFirst, amplitude].every(Number.isFinite)) throw new RangeError('synthesizeTransient: delay, tFirst and amplitude must be finite');
  if (!o.transfer && !o.transferMany) throw new RangeError('synthesizeTransient: give transfer or transferMany');
  const s0 = tFirst - w.t0 - D;
  const sLast = s0 + (N - 1) * dt, sMax = Math.max(Math.abs(s0), Math.abs(sLast));
  const band = pulseBand(w, Math.max(1e-3 * tol, 1e-17));
  const damping = o.damping ?? 'auto';
  const alpha = damping === 'auto' ? (sLast > 0 ? Math.min(1 / sLast, 0.5 / band.time) : 0) : damping;
  if (!(alpha >= 0) || !Number.isFinite(alpha)) throw new RangeError(`synthesizeTransient: damping must be finite and ≥ 0, got ${o.damping}`);
  const values = new Float64Array(N);
  const errors = new Float64Array(N);
  if (N === 0) return { values, errors, error: 0, relativeError: 0, peak: 0, evaluations: 0, met: true, message: '', omegaLow: band.lo, omegaHigh: band.hi, damping: alpha, panels: 0 };

  let evaluations = 0;
  const growD = Math.exp(alpha * D);
  /** F = Ic·G·e^{jωD} and |G·e^{jωD}| at ω = ν − jα, for every ν, in one call of G. */
  const evaluate = (nus: number[]): { re: number[]; im: number[]; gain: number[] } => {
    const omegas = nus.map((nu): Complex => [nu, -alpha]);
    const g = o.transferMany ? o.transferMany(omegas) : omegas.map(o.transfer as TransferAt);
    evaluations += nus.length;
    const out = { re: [] as number[], im: [] as number[], gain: [] as number[] };
    nus.forEach((nu, i) => {
      const [gr, gi] = g[i] ?? [Number.NaN, Number.NaN];
      if (!Number.isFinite(gr) || !Number.isFinite(gi)) {
        throw new RangeError(`synthesizeTransient: the transfer function is not finite at ω = ${nu} − j${alpha} rad/s (a singular point on the contour: try damping > 0)`);
      }
      const [ir, ii] = centredSpectrum(w, amplitude, omegas[i]);
      const er = growD * Math.cos(nu * D), ei = growD * Math.sin(nu * D);
      const hr = gr * er - gi * ei, hi = gr * ei + gi * er;
      out.re.push(ir * hr - ii * hi);
      out.im.push(ir * hi + ii * hr);
      out.gain.push(Math.hypot(hr, hi));
    });
    return out;
  };

  // Panels [lo, hi] of about the spectrum's width, no more than the budget allows.
  const count = Math.max(1, Math.min(Math.round((band.hi - band.lo) / band.width), Math.floor(maxEval / 15)));
  const firstWidth = (band.hi - band.lo) / count;
  let panels: Panel[] = [];
  const blank = (a: number, b: number, stalled = false): Panel => ({
    a, b, level: START_LEVEL, re: new Float64Array(0), im: new Float64Array(0), estimate: Infinity, previous: Infinity, stalled, size: 0, gain: 0,
  });
  let pending: Panel[] = Array.from({ length: count }, (_, i) => blank(band.lo + i * firstWidth, i === count - 1 ? band.hi : band.lo + (i + 1) * firstWidth));
  let lo = band.lo, hi = band.hi;
  // The peak sets the goal. After a first full column, each round looks only at every
  // stride-th sample (at most 256, or a quarter of the Nyquist interval π/hi) and at the
  // samples around the last peak: a value from below, so the goal is only ever too strict.
  const stride = Math.max(1, Math.floor(Math.PI / (4 * band.hi * dt)), Math.ceil(N / 256));
  let peakAt = 0;
  const peakOver = (first: number, step: number, count: number): void => {
    const part = new Float64Array(count);
    sumColumn(panels, s0 + first * dt, dt * step, part, sMax);
    for (let n = 0; n < count; n++) {
      const v = Math.abs(part[n]) * Math.exp(alpha * (s0 + (first + n * step) * dt));
      if (v > peak) { peak = v; peakAt = first + n * step; }
    }
  };
  let total = Infinity, peak = 0, interp = 0, tail = 0, low = 0, rounding = 0;
  let stop = '';
  for (let round = 0; ; round++) {
    install(pending, evaluate);
    panels = [...panels.filter((p) => !pending.includes(p)), ...pending].sort((x, y) => x.a - y.a);
    peak = 0;
    if (round === 0) peakOver(0, 1, N);
    else {
      const near = Math.max(0, peakAt - 32);
      peakOver(near, 1, Math.min(N, peakAt + 33) - near);
      peakOver(0, stride, Math.ceil(N / stride));
    }
    interp = panels.reduce((s, p) => s + p.estimate, 0) / Math.PI;
    const top = panels[panels.length - 1];
    tail = (top.gain * tailIntegral(w, amplitude, hi, alpha)) / Math.PI;
    // below lo (modulated kind only) the envelope rises towards lo; G is allowed ten times its size there
    low = lo > 0 ? (10 * lo * envelope(w, amplitude, lo, alpha) * panels[0].gain) / Math.PI : 0;
    rounding = ((1e-14 + 4e-16 * hi * sMax) * panels.reduce((s, p) => s + p.size, 0)) / Math.PI;
    const amplify = Math.exp(alpha * Math.max(sLast, s0));
    total = amplify * (interp + tail + low + rounding);
    if (total <= tol * peak) break;
    if (interp + tail + low <= rounding) { stop = 'rounding'; break; }
    const goal = Math.max((tol * peak) / amplify, 2 * rounding); // nothing is gained below the rounding level
    if (round >= 500) { stop = 'budget'; break; }
    // This round's work: widen the band if its ends are too costly, then the worst panels.
    pending = [];
    let cost = 0;
    const afford = (c: number) => evaluations + cost + c <= maxEval;
    if (tail > TAIL_SHARE * goal && afford(15)) { pending.push(blank(hi, hi + band.width)); cost += 15; hi += band.width; }
    if (low > TAIL_SHARE * goal && lo > 0 && afford(15)) { pending.push(blank(Math.max(0, lo - band.width), lo)); cost += 15; lo = Math.max(0, lo - band.width); }
    let rest = interp * Math.PI;
    for (const p of [...panels].sort((x, y) => y.estimate - x.estimate)) {
      if (rest <= 0.25 * goal * Math.PI) break;
      if (p.b - p.a < STOP_WIDTH * firstWidth) continue;
      const split = p.stalled || p.level >= TOP_LEVEL || (p.level > START_LEVEL && p.previous < FAST * p.estimate);
      const c = split ? 30 : 2 ** p.level;
      if (!afford(c)) continue;
      cost += c;
      rest -= p.estimate;
      if (!split) { p.level += 1; pending.push(p); continue; }
      const slow = p.level > START_LEVEL && p.previous < FAST * p.estimate;
      const cut = p.a === 0 ? ZERO_SPLIT * p.b : 0.5 * (p.a + p.b);
      panels = panels.filter((q) => q !== p);
      pending.push(blank(p.a, cut, p.a === 0 && (slow || p.stalled)), blank(cut, p.b));
    }
    if (pending.length === 0) { stop = 'budget'; break; }
  }
  sumColumn(panels, s0, dt, values, sMax);
  let error = 0;
  for (let n = 0; n < N; n++) {
    const amplify = Math.exp(alpha * (s0 + n * dt));
    values[n] *= amplify;
    peak = Math.max(peak, Math.abs(values[n]));
    errors[n] = amplify * (interp + tail + low + rounding);
    error = Math.max(error, errors[n]);
  }
  const relativeError = error === 0 ? 0 : peak > 0 ? error / peak : Infinity;
  const met = error <= tol * peak;
  return {
    values, errors, error, relativeError, peak, evaluations, met,
    message: met ? '' : explain(stop, { w, tol, relativeError, evaluations, maxEval, panels, interp, tail, low, rounding, peak, error, firstWidth }),
    omegaLow: lo, omegaHigh: hi, damping: alpha, panels: panels.length,
  };
}

/** Evaluates the new nodes of every pending panel in one call of G and updates its estimate. */
function install(pending: Panel[], evaluate: (nus: number[]) => { re: number[]; im: number[]; gain: number[] }): void {
  const nus: number[] = [];
  const slots: [Panel, number][] = [];
  for (const p of pending) {
    const lv = levels[p.level];
    const fresh = p.re.length === 0;
    const re = new Float64Array(lv.count), im = new Float64Array(lv.count);
    for (let i = 0; i < lv.count; i++) {
      if (!fresh && i % 2 === 1) { re[i] = p.re[(i - 1) / 2]; im[i] = p.im[(i - 1) / 2]; continue; } // node k = i + 1 even: kept
      nus.push(nodeOmega(p, lv, i));
      slots.push([p, i]);
    }
    p.re = re; p.im = im;
  }
  const f = evaluate(nus);
  const gains = new Map<Panel, number>();
  slots.forEach(([p, i], j) => {
    p.re[i] = f.re[j]; p.im[i] = f.im[j];
    gains.set(p, Math.max(gains.get(p) ?? 0, f.gain[j]));
  });
  for (const p of pending) {
    const lv = levels[p.level], coarse = levels[p.level - 1], h = p.b - p.a;
    let worst = 0, biggest = 0;
    for (let i = 0; i < lv.count; i++) {
      biggest = Math.max(biggest, Math.hypot(p.re[i], p.im[i]));
      if (i % 2 === 1) continue;
      const [cr, ci] = interpolate(coarse, p.re, p.im, 2, lv.x[i]);
      worst = Math.max(worst, Math.hypot(p.re[i] - cr, p.im[i] - ci));
    }
    [p.previous, p.estimate, p.size] = [p.estimate, h * worst, h * biggest];
    p.gain = Math.max(p.gain, gains.get(p) ?? 0);
  }
}

interface Outcome {
  w: Waveform; tol: number; relativeError: number; evaluations: number; maxEval: number;
  panels: Panel[]; interp: number; tail: number; low: number; rounding: number; peak: number; error: number; firstWidth: number;
}

/** Why the target was missed, in words a user can act on. */
function explain(stop: string, r: Outcome): string {
  const head = `target ${r.tol} of the peak not met: estimated error ${r.relativeError.toPrecision(2)} of the peak after ${r.evaluations} transfer evaluations (at most ${r.maxEval}). `;
  if (!(r.peak > r.error)) return `${head}The column holds no signal above its error: are all its samples before the arrival (t0 plus the delay)?`;
  if (stop === 'rounding') return `${head}The rest is the rounding level, ${(r.rounding / r.peak).toPrecision(2)} of this column's peak (small when the column ends before the pulse has passed); ask for a looser tolerance or a longer column.`;
  if (r.evaluations < 2 * 15 * r.panels.length) return `${head}The budget ran out before the band was resolved; raise maxEvaluations.`;
  // The lowest frequencies are the cause only once refinement has graded panels towards ω = 0.
  const nearZero = r.panels.filter((p) => p.a === 0 && p.b < r.firstWidth).reduce((s, p) => s + p.estimate, 0) / Math.PI;
  if (nearZero > 0.5 * r.interp && nearZero > r.tail + r.low) {
    return r.w.kind === 'gaussian'
      ? `${head}Most of it comes from the lowest frequencies, where the gaussian pulse's DC content meets the logarithmic behaviour of the 2D field; a zero-DC waveform (modulated-gaussian or ricker) avoids it, or raise maxEvaluations.`
      : `${head}Most of it comes from the lowest frequencies, where the transfer function is singular; raise maxEvaluations or use damping.`;
  }
  if (r.tail + r.low > r.interp) return `${head}The transfer function grows too fast outside the pulse's band; raise maxEvaluations.`;
  const worst = r.panels.reduce((x, y) => (y.estimate > x.estimate ? y : x)), at = 0.5 * (worst.a + worst.b);
  return `${head}Most of it lies near ω = ${at.toPrecision(3)} rad/s (${(at / (2 * Math.PI)).toPrecision(3)} Hz): raise maxEvaluations; if the transfer function varies fast there, give delay = the earliest arrival time, or damping > 0 for a sharp resonance.`;
}
