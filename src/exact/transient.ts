import { C0, MU0 } from '../scenario/constants.ts';
import type { Waveform } from '../scenario/types.ts';
import { waveformDerivative, waveformExtent } from '../scenario/waveforms.ts';
import { gaussLegendre } from './gauss-legendre.ts';

/*
 * Quadrature design. In u the integrand I'(t − a·cosh u), a = ρ/c, is smooth (analytic)
 * on the whole range, so composite Gauss–Legendre converges fast. Panels end at whichever
 * comes first of: a fixed step in u (the map u → cosh u is exponential, so wide panels
 * would need high degree), and a fixed step in retarded time, sized so that the fastest
 * oscillation in the pulse turns through at most PHASE_PER_PANEL radians per panel. Near
 * u = 0 the retarded time is quadratic in u, which doubles the local phase rate, so when
 * the range starts within one step of u = 0 the first retarded-time panel is a quarter
 * step long. With 24 points and 45 rad per panel the integral is converged to about 1e-12
 * of the field's peak (test/reference/transient.test.ts refines the panels to show it).
 *
 * Once the wavefront is more than one retarded-time panel past the end of the pulse (the
 * wake, most samples of a long run), the kernel 1/√((t − τ)² − a²) is smooth over the
 * whole pulse, so the integral is taken in τ on fixed Gauss–Legendre nodes instead:
 * ∫ I'(τ)/√((t − τ)² − a²) dτ. I'(τ) at those nodes is computed once per series, so a wake
 * sample costs a square root per node rather than the pulse's exponentials and sines.
 */
const POINTS = 24;
const { nodes: NODES, weights: WEIGHTS } = gaussLegendre(POINTS);
const PHASE_PER_PANEL = 45;
const U_PER_PANEL = 4;
// Bound once: module transforms (Vite, tsx) can turn a named import into a getter call.
const derivative = waveformDerivative;

/**
 * Angular frequency above which the spectrum of I' is below about 1e-10 of its peak, rad/s.
 * Sets the retarded-time panel width.
 */
function highestAngularFrequency(w: Waveform): number {
  switch (w.kind) {
    case 'gaussian': return 10 / w.tau;
    case 'modulated-gaussian': return 2 * Math.PI * w.f0 + 10 / w.tau;
    case 'ricker': return 10 * Math.PI * w.f0;
  }
}

/**
 * acosh(1 + δ), accurate for small δ (acosh(x) itself loses half the digits near x = 1) and
 * free of overflow for huge δ (there acosh(1 + δ) = ln(2(1 + δ)) to within 1/(4δ²)).
 */
function acoshOnePlus(delta: number): number {
  if (!(delta > 0)) return 0;
  if (delta > 1e8) return Math.LN2 + Math.log1p(delta);
  return Math.log1p(delta + Math.sqrt(delta * (delta + 2)));
}

/** What one (waveform, ρ, εr, refinement) needs to evaluate the field at many times (telegraph.ts adds its loss). */
export interface Plan {
  w: Waveform;
  /** ρ/c, s. */
  a: number;
  tauLo: number;
  tauMax: number;
  timeStep: number;
  uStep: number;
  /** Retarded-time nodes over the whole pulse, and weight·I'(τ) at each; built on first use. */
  wakeTimes: Float64Array | null;
  wakeWeights: Float64Array | null;
}

/** The plan for a pulse `w` seen after the delay `a` = ρ/c, s. */
export function retardedPlan(w: Waveform, a: number, refinement: number): Plan {
  const extent = waveformExtent(w);
  const span = 2 * extent;
  const timeStep = span / Math.ceil((span * highestAngularFrequency(w) * refinement) / PHASE_PER_PANEL);
  return {
    w, a, tauLo: w.t0 - extent, tauMax: w.t0 + extent, timeStep,
    uStep: U_PER_PANEL / refinement, wakeTimes: null, wakeWeights: null,
  };
}

function makePlan(w: Waveform, rho: number, epsR: number, refinement: number): Plan {
  return retardedPlan(w, (rho * Math.sqrt(epsR)) / C0, refinement);
}

/** Fills the plan's wake rule: Gauss–Legendre nodes over the pulse and weight·I'(τ) at each. */
export function buildWakeRule(plan: Plan): void {
  const panels = Math.round((plan.tauMax - plan.tauLo) / plan.timeStep);
  const times = new Float64Array(panels * POINTS);
  const weights = new Float64Array(panels * POINTS);
  const half = 0.5 * plan.timeStep;
  for (let p = 0; p < panels; p++) {
    const mid = plan.tauLo + (p + 0.5) * plan.timeStep;
    for (let i = 0; i < POINTS; i++) {
      const tau = mid + half * NODES[i];
      times[p * POINTS + i] = tau;
      weights[p * POINTS + i] = half * WEIGHTS[i] * derivative(plan.w, 1, tau);
    }
  }
  plan.wakeTimes = times;
  plan.wakeWeights = weights;
}

/** ∫ I'(t − a·cosh u) du for unit amplitude; exactly 0 before the wavefront. */
function fieldIntegral(plan: Plan, t: number): number {
  const a = plan.a;
  if (t - a - plan.tauMax < plan.timeStep) return retardedIntegral(plan, t);
  if (plan.wakeTimes === null) buildWakeRule(plan);
  const times = plan.wakeTimes as Float64Array;
  const weights = plan.wakeWeights as Float64Array;
  let sum = 0;
  for (let i = 0; i < times.length; i++) {
    const s = t - times[i];
    sum += weights[i] / Math.sqrt((s - a) * (s + a));
  }
  return sum;
}

/**
 * ∫ I'(t − a·cosh u)·w(u) du over the u where the retarded time lies in the pulse window, for
 * unit amplitude, by composite Gauss–Legendre in u, with w = 1 (lossless) or, for a
 * conducting medium with A = `loss` (telegraph.ts), w = ½(e^{−A·e^{−u}} + e^{−A·e^{u}}).
 * Exactly 0 when the range is empty (before the wavefront).
 */
export function retardedIntegral(plan: Plan, t: number, loss = 0): number {
  const { w, a, tauLo, tauMax, timeStep, uStep } = plan;
  // Retarded time t − a·cosh u = (t − a) − a·(cosh u − 1). `gap` is how far the latest
  // retarded time still inside the pulse lies behind the wavefront; it is exactly 0 while
  // the wavefront is inside the pulse, so the range then starts exactly at u = 0.
  const front = t - a;
  const gap = front > tauMax ? front - tauMax : 0;
  const span = front - gap - tauLo;
  if (!(span > 0)) return 0;
  const ua = acoshOnePlus(gap / a);
  const ub = acoshOnePlus((gap + span) / a);
  const timePanels = Math.ceil(span / timeStep);
  const dTau = span / timePanels;
  const uPanels = Math.ceil((ub - ua) / uStep);
  const du = (ub - ua) / uPanels;
  // Two increasing sequences of break points in u, merged on the fly.
  let kU = 1;
  // Near the turning point u = 0 the first panel is a quarter step (see the note at the top).
  const graded = gap < dTau;
  let kT = graded ? 0 : 1;
  let nextT = acoshOnePlus((gap + (graded ? 0.25 : 1) * dTau) / a);
  let nextU = kU < uPanels ? ua + kU * du : ub;
  let left = ua;
  let sum = 0;
  for (;;) {
    const right = Math.min(nextT, nextU, ub);
    if (right > left) {
      const half = 0.5 * (right - left);
      const mid = left + half;
      let panel = 0;
      for (let i = 0; i < POINTS; i++) {
        const e = Math.exp(mid + half * NODES[i]);
        const d = derivative(w, 1, t - 0.5 * a * (e + 1 / e));
        panel += loss === 0 ? WEIGHTS[i] * d : WEIGHTS[i] * (0.5 * (Math.exp(-loss / e) + Math.exp(-loss * e))) * d;
      }
      sum += panel * half;
    }
    if (right >= ub) break;
    if (nextT <= right) {
      kT++;
      nextT = kT < timePanels ? acoshOnePlus((gap + kT * dTau) / a) : ub;
    }
    if (nextU <= right) {
      kU++;
      nextU = kU < uPanels ? ua + kU * du : ub;
    }
    left = right;
  }
  return sum;
}

/** ρ and εr make a usable delay a = ρ·√εr/c0: positive and finite, not underflowing to 0. */
function validGeometry(rho: number, epsR: number): boolean {
  const a = (rho * Math.sqrt(epsR)) / C0;
  return rho > 0 && Number.isFinite(rho) && epsR > 0 && Number.isFinite(epsR) && a > 0 && Number.isFinite(a);
}

/**
 * Exact transient Ez of an infinite line current I(t) along z in a homogeneous,
 * non-magnetic, lossless medium:
 *   Ez(ρ, t) = −(μ0/2π)·∫_0^∞ I'(t − (ρ/c)·cosh u) du,  c = c0/√εr,
 * which is −μ0·∂I/∂t convolved with the 2D free-space Green's function
 * H(t − ρ/c)/(2π·√(t² − ρ²/c²)) (Morse & Feshbach, Methods of Theoretical Physics, 1953,
 * ch. 7), after the substitution c·s = ρ·cosh u that removes the square-root singularity
 * at the wavefront. It is the time-domain counterpart of {@link lineCurrentTransfer}.
 * I is taken as zero outside t0 ± waveformExtent(w), so only the u where the retarded
 * time falls in that window are integrated, by composite Gauss–Legendre quadrature
 * (Davis & Rabinowitz, Methods of Numerical Integration, 2nd ed., 1984, ch. 2); in the wake
 * behind the pulse the same integral is taken in retarded time (see the note at the top of
 * this file). Accuracy: about 1e-12 of the peak field. Before the wavefront,
 * t ≤ ρ/c + t0 − extent, the result is exactly 0 (whatever the amplitude). That window may
 * start before t = 0; the field is then that of the whole pulse, which the scenario
 * defaults make negligible before t = 0 (docs/physics.md).
 *
 * Edge cases: ρ ≤ 0 (ρ = 0 is the singular wire itself), εr ≤ 0, a non-finite ρ or εr, a ρ
 * so small that ρ/c underflows to 0, or t = NaN give NaN; t = −Infinity gives 0, and so
 * does t = +Infinity (the 2D wake decays as 1/t²). `amplitude` is a plain factor.
 *
 * @param w - source waveform (kind, f0 in Hz, tau in s, t0 in s)
 * @param amplitude - current amplitude A, amperes
 * @param rho - distance from the line current, m
 * @param epsR - relative permittivity of the medium, dimensionless
 * @param t - time, s
 * @param refinement - multiplies the number of quadrature panels (≥ 1; for convergence checks)
 * @returns Ez, V/m
 * @throws RangeError when refinement is not a finite number ≥ 1
 *
 * @example
 * transientField({ kind: 'gaussian', tau: 1e-10, t0: 5e-10 }, 1, 0.03, 1, 7e-10); // ≈ 1107.55 V/m
 */
export function transientField(
  w: Waveform, amplitude: number, rho: number, epsR: number, t: number, refinement = 1,
): number {
  if (!(refinement >= 1) || !Number.isFinite(refinement)) {
    throw new RangeError(`transientField: refinement must be a finite number ≥ 1, got ${refinement}`);
  }
  if (!validGeometry(rho, epsR) || Number.isNaN(t)) return Number.NaN;
  if (t === Number.POSITIVE_INFINITY) return 0;
  const integral = fieldIntegral(makePlan(w, rho, epsR, refinement), t);
  return integral === 0 ? 0 : (-MU0 / (2 * Math.PI)) * amplitude * integral;
}

/**
 * Exact transient Ez at one point sampled at t = n·dt, n = 0..samples − 1, the sampling of
 * the grid's Ez (docs/physics.md). Same physics, quadrature and edge cases as
 * {@link transientField} (Morse & Feshbach, Methods of Theoretical Physics, 1953, ch. 7);
 * the panel sizes, and I' at the nodes used in the wake, are worked out once per series.
 *
 * @param w - source waveform (kind, f0 in Hz, tau in s, t0 in s)
 * @param amplitude - current amplitude A, amperes
 * @param rho - distance from the line current, m (ρ ≤ 0 or non-finite: every sample NaN)
 * @param epsR - relative permittivity of the medium, dimensionless
 * @param dt - sample interval, s
 * @param samples - number of samples, an integer ≥ 0
 * @returns Ez at each sample time, V/m
 * @throws RangeError when dt is not finite and > 0 or samples is not an integer ≥ 0
 *
 * @example
 * const ez = exactTimeSeries({ kind: 'ricker', f0: 1e10, t0: 2e-10 }, 1, 0.03, 1, 1e-12, 2000);
 * ez[0]; // 0 (before the wavefront)
 */
export function exactTimeSeries(
  w: Waveform, amplitude: number, rho: number, epsR: number, dt: number, samples: number,
): Float64Array {
  if (!(dt > 0) || !Number.isFinite(dt)) throw new RangeError(`exactTimeSeries: dt must be finite and > 0, got ${dt}`);
  if (!Number.isInteger(samples) || samples < 0) {
    throw new RangeError(`exactTimeSeries: samples must be an integer ≥ 0, got ${samples}`);
  }
  const out = new Float64Array(samples);
  if (!validGeometry(rho, epsR)) return out.fill(Number.NaN);
  const plan = makePlan(w, rho, epsR, 1);
  const scale = (-MU0 / (2 * Math.PI)) * amplitude;
  for (let n = 0; n < samples; n++) {
    const integral = fieldIntegral(plan, n * dt);
    out[n] = integral === 0 ? 0 : scale * integral; // +0, never −0, before the wavefront
  }
  return out;
}
