import { C0, EPS0, MU0 } from '../scenario/constants.ts';
import type { Waveform } from '../scenario/types.ts';
import { buildWakeRule, retardedIntegral, retardedPlan, type Plan as RetardedPlan } from './transient.ts';

/*
 * The field. In a medium of permittivity ε = ε0·εr and conductivity σ (μ = μ0), Maxwell's
 * equations for Ez(x, y, t) driven by an impressed line current I(t) along z give the
 * telegraph equation
 *   (1/c²)·∂²Ez/∂t² + μ0σ·∂Ez/∂t − ∇²Ez = −μ0·I'(t)·δ(x)δ(y),   c = c0/√εr,
 * (the conduction current σEz is part of the medium, so the source term is the same −μ0·I' as
 * without loss). Its causal Green's function g (the solution for δ(x)δ(y)δ(t) on the right)
 * follows from g = e^{−at}·w, a = σ/(2ε): w then solves the 2D Klein–Gordon equation
 * (1/c²)(w_tt − a²w) − ∇²w = δδδ, whose Laplace transform in t is (1/2π)·K0((ρ/c)·√(s² − a²));
 * the pair ∫ e^{−st}·cosh(b√(t² − T²))/√(t² − T²)·H(t − T) dt = K0(T√(s² − b²)) (write
 * t = T·cosh u and s·cosh u ∓ b·sinh u = √(s² − b²)·cosh(u ∓ u0); the two halves of cosh make
 * ∫_{−∞}^{∞} e^{−R cosh v} dv/2 = K0(R), DLMF 10.32.9, number from memory) gives
 *   g(ρ, t) = H(t − ρ/c)·e^{−at}·cosh(a·√(t² − ρ²/c²)) / (2π·√(t² − ρ²/c²)).
 * There is no further term: in 2D, unlike 3D, the wavefront carries no delta function (the
 * lossless 2D kernel has none to attenuate), and the transform of g above is the whole of
 * ĝ(s) = (1/2π)·K0(ρ·√(s² + 2as)/c). At s = jω, √(s² + 2as)/c = jk with k² = ω²μ0ε − jωμ0σ,
 * Im k < 0, and K0(jkρ) = −(jπ/2)·H0⁽²⁾(kρ) (DLMF 10.27.8; checked numerically with mpmath), so −jωμ0·ĝ(jω) = −(ωμ0/4)·H0⁽²⁾(kρ):
 * the frequency-domain transfer function, as it must be. Convolving with −μ0·I' and putting
 * t − τ = (ρ/c)·cosh u:
 *   Ez(ρ, t) = −(μ0/2π)·∫₀^∞ I'(t − (ρ/c)cosh u)·e^{−a(ρ/c)cosh u}·cosh(a(ρ/c)sinh u) du,
 * the lossless integral times a weight that is (exp(−A·e^{−u}) + exp(−A·e^{u}))/2, A = a·ρ/c,
 * exactly, so it neither overflows nor cancels. Far behind the front the weight tends to ½:
 * the wave has become diffusion, whose 2D kernel 1/(4πt) is half the lossless 1/(2πt).
 *
 * Quadrature. As in transient.ts: composite Gauss–Legendre in u, panels ended by a fixed
 * step in u and a fixed step in retarded time (45 rad of the pulse's fastest oscillation).
 * The weight is analytic and bounded by 1 in the strip |Im u| < π/2 whatever A is, so the
 * step of 4 in u resolves it too. Behind the pulse the integral is taken in retarded time τ
 * with the kernel e^{−as}cosh(ar)/r, s = t − τ, r = √(s² − (ρ/c)²), written as
 * (e^{−a(s−r)} + e^{−a(s+r)})/(2r) with s − r = (ρ/c)²/(s + r); that form is used only where
 * the kernel changes by less than e^{10} across one retarded-time panel.
 */
const KERNEL_RISE = 10;

/** The lossless plan (transient.ts) with the loss rate a = σ/(2ε), 1/s, and A = a·ρ/c. */
interface Plan extends RetardedPlan {
  rate: number;
  loss: number;
}

function makePlan(w: Waveform, rho: number, epsR: number, sigma: number, refinement: number): Plan {
  const delay = (rho * Math.sqrt(epsR)) / C0;
  const rate = sigma / (2 * EPS0 * epsR);
  return { ...retardedPlan(w, delay, refinement), rate, loss: rate * delay };
}

/**
 * True when the retarded-time kernel is smooth on the pulse panels at time t: the front is a
 * panel or more behind the pulse, and the kernel's logarithmic rate at the nearest point
 * (where it is largest; each part falls with s) times the panel is below KERNEL_RISE.
 */
function wakeApplies(plan: Plan, t: number): boolean {
  const { a: delay, rate, timeStep } = plan;
  const s = t - plan.tauMax;
  if (s - delay < timeStep) return false;
  if (rate === 0) return true;
  const r = Math.sqrt((s - delay) * (s + delay));
  const q = Math.exp(-2 * rate * r);
  const slope = (rate * (s - r)) / r + ((2 * rate * s) / r) * (q / (1 + q));
  return slope * timeStep < KERNEL_RISE;
}

/** ∫ I'(t − (ρ/c)cosh u)·weight(u) du for unit amplitude; exactly 0 before the front. */
function fieldIntegral(plan: Plan, t: number): number {
  if (!wakeApplies(plan, t)) return retardedIntegral(plan, t, plan.loss);
  if (plan.wakeTimes === null) buildWakeRule(plan);
  const times = plan.wakeTimes as Float64Array;
  const weights = plan.wakeWeights as Float64Array;
  const { a: delay, rate } = plan;
  let sum = 0;
  for (let i = 0; i < times.length; i++) {
    const s = t - times[i];
    const r = Math.sqrt((s - delay) * (s + delay));
    const kernel = rate === 0 ? 1 : 0.5 * (Math.exp((-rate * delay * delay) / (s + r)) + Math.exp(-rate * (s + r)));
    sum += (weights[i] * kernel) / r;
  }
  return sum;
}

function validMedium(rho: number, epsR: number, sigma: number): boolean {
  const a = (rho * Math.sqrt(epsR)) / C0;
  return rho > 0 && Number.isFinite(rho) && epsR > 0 && Number.isFinite(epsR) && a > 0 && Number.isFinite(a)
    && sigma >= 0 && Number.isFinite(sigma);
}

/**
 * Exact transient Ez of an infinite line current I(t) along z in a homogeneous conducting
 * medium (εr, σ; μ0; no dispersion poles), from the 2D Green's function of the telegraph
 * equation (Morse & Feshbach, Methods of Theoretical Physics, 1953, ch. 7; derivation at the
 * top of this file):
 *   Ez(ρ, t) = −(μ0/2π)·∫₀^∞ I'(t − (ρ/c)cosh u)·e^{−a(ρ/c)cosh u}·cosh(a(ρ/c)sinh u) du,
 * c = c0/√εr, a = σ/(2ε0εr). σ = 0 gives transientField (transient.ts) exactly. Composite
 * Gauss–Legendre quadrature (Davis & Rabinowitz, Methods of Numerical Integration, 1984,
 * ch. 2), as transient.ts: about 1e-12 of the peak, except where a·ρ/c ≫ 1 leaves only a small
 * remainder of a cancelling integrand (test/reference/telegraph.test.ts): there the error is
 * about 1e-16 of the lossless field's peak. I is taken as zero outside t0 ± the
 * waveform's extent, so the result is exactly 0 before t = ρ/c + t0 − extent.
 *
 * Edge cases: ρ ≤ 0, εr ≤ 0, σ < 0, any of them non-finite, or t = NaN give NaN;
 * t = ±Infinity gives 0.
 *
 * @param w - source waveform (kind, f0 in Hz, tau in s, t0 in s)
 * @param amplitude - current amplitude, A
 * @param rho - distance from the line current, m
 * @param epsR - relative permittivity, dimensionless
 * @param sigma - conductivity, S/m
 * @param t - time, s
 * @param refinement - multiplies the number of panels (≥ 1; for convergence checks)
 * @returns Ez, V/m
 * @throws RangeError when refinement is not a finite number ≥ 1
 * @example
 * telegraphField({ kind: 'ricker', f0: 1e9, t0: 2e-9 }, 1, 0.1, 4, 0.01, 3e-9); // ≈ 438.376 V/m
 */
export function telegraphField(
  w: Waveform, amplitude: number, rho: number, epsR: number, sigma: number, t: number, refinement = 1,
): number {
  if (!(refinement >= 1) || !Number.isFinite(refinement)) {
    throw new RangeError(`telegraphField: refinement must be a finite number ≥ 1, got ${refinement}`);
  }
  if (!validMedium(rho, epsR, sigma) || Number.isNaN(t)) return Number.NaN;
  if (!Number.isFinite(t)) return 0;
  const integral = fieldIntegral(makePlan(w, rho, epsR, sigma, refinement), t);
  return integral === 0 ? 0 : (-MU0 / (2 * Math.PI)) * amplitude * integral;
}

/**
 * {@link telegraphField} sampled at t = n·dt, n = 0..samples − 1, with the panels and the
 * wake rule worked out once (Morse & Feshbach, 1953, ch. 7).
 *
 * @param w - source waveform
 * @param amplitude - current amplitude, A
 * @param rho - distance, m (invalid medium or ρ: every sample NaN)
 * @param epsR - relative permittivity
 * @param sigma - conductivity, S/m
 * @param dt - sample interval, s
 * @param samples - number of samples, an integer ≥ 0
 * @returns Ez at each sample time, V/m
 * @throws RangeError when dt is not finite and > 0 or samples is not an integer ≥ 0
 * @example
 * telegraphTimeSeries({ kind: 'ricker', f0: 1e10, t0: 2e-10 }, 1, 0.03, 4, 0.1, 1e-12, 2000)[0]; // 0
 */
export function telegraphTimeSeries(
  w: Waveform, amplitude: number, rho: number, epsR: number, sigma: number, dt: number, samples: number,
): Float64Array {
  if (!(dt > 0) || !Number.isFinite(dt)) throw new RangeError(`telegraphTimeSeries: dt must be finite and > 0, got ${dt}`);
  if (!Number.isInteger(samples) || samples < 0) {
    throw new RangeError(`telegraphTimeSeries: samples must be an integer ≥ 0, got ${samples}`);
  }
  const out = new Float64Array(samples);
  if (!validMedium(rho, epsR, sigma)) return out.fill(Number.NaN);
  const plan = makePlan(w, rho, epsR, sigma, 1);
  const scale = (-MU0 / (2 * Math.PI)) * amplitude;
  for (let n = 0; n < samples; n++) {
    const integral = fieldIntegral(plan, n * dt);
    out[n] = integral === 0 ? 0 : scale * integral;
  }
  return out;
}
