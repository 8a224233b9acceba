/**
 * The two starting values H0^(2)(z) and H1^(2)(z) of the upward recurrence, for |z| > 2 in
 * the closed fourth quadrant (Re z ≥ 0, Im z ≤ 0), where H^(2) is the solution that decays
 * (or keeps its size, on the real axis). Both come out scaled by e^{−Im z}, which takes off
 * the e^{Im z} size of H^(2) so that nothing under- or overflows for any |Im z|.
 *
 * Two methods, each where it converges to full precision:
 *  - |z| ≥ 25: Hankel's expansion (DLMF 10.17.4), whose smallest term is about e^{−2|z|}.
 *  - 2 < |z| < 25: the integral K_ν(ζ) = (π/(2ζ))^{1/2} e^{−ζ}/Γ(ν+½) ∫_0^∞ e^{−t} t^{ν−½}
 *    (1 + t/(2ζ))^{ν−½} dt (DLMF 10.32.8) at ζ = jz, turned by t = s² into an integral of
 *    e^{−s²}·(smooth) over the whole real line and summed by the trapezoidal rule, which
 *    converges geometrically for such integrands (DLMF 3.5.ii; Trefethen & Weideman, SIAM
 *    Review 56(3), 2014). The integrand's branch points s = ±(−2ζ)^{1/2} lie at distance
 *    ≥ |ζ|^{1/2} > √2 from the real axis, so a step of 0.2 leaves an error near
 *    e^{2 − 2π√2/0.2} ≈ 1e-18.
 * H_ν^(2)(z) = (2/π)·j^{ν+1}·K_ν(jz) links the two (DLMF 10.27.8).
 * For |z| ≥ 25 the same expansion of H^(1) (DLMF 10.17.3) also gives J0 and J1, on which
 * Miller's recurrence is anchored there.
 */
import type { Complex } from './complex.ts';

/** Below this |z| the power series take over. */
export const SMALL_ARGUMENT = 2;
/** From this |z| on Hankel's expansions serve: their smallest term, about e^{−2|z|}, is 2e-22 there. */
export const LARGE_ARGUMENT = 25;

const STEP = 0.2;
const NODES = 36; // s = 0, 0.2, …, 7.0; e^{−49} ≈ 5e-22 is the truncation error
const NODE_SQUARES = Array.from({ length: NODES }, (_, j) => (j * STEP) ** 2);
/** Trapezoid weights h·e^{−s²}, doubled for s > 0 because the integrand is even. */
const NODE_WEIGHTS = NODE_SQUARES.map((s2, j) => (j === 0 ? 1 : 2) * STEP * Math.exp(-s2));

/**
 * [H0^(2)(z)·e^{−Im z}, H1^(2)(z)·e^{−Im z}] for 2 < |z| in the closed fourth quadrant.
 *
 * @param z - argument, dimensionless, Re z ≥ 0, Im z ≤ 0, |z| > 2
 * @returns the two scaled Hankel functions
 * @example
 * hankel2StartScaled([10, 0]); // ≈ [[-0.2459357644513482, -0.0556711672835994], [0.0434727461688614, -0.2490154242069539]]
 */
export function hankel2StartScaled(z: Complex): [Complex, Complex] {
  return Math.hypot(z[0], z[1]) >= LARGE_ARGUMENT ? hankelExpansion(z).h2 : hankelIntegral(z);
}

/** e^{−j·Re z}·e^{jθ} without forming Re z − θ, which would round away digits of a large Re z. */
function phaseFactor(x: number, theta: number): Complex {
  const c = Math.cos(x);
  const s = Math.sin(x);
  const ct = Math.cos(theta);
  const st = Math.sin(theta);
  return [c * ct + s * st, c * st - s * ct];
}

/** Principal square root of a complex number. */
function sqrtC(r: number, i: number): Complex {
  const m = Math.hypot(r, i);
  if (r >= 0) {
    const t = Math.sqrt((m + r) / 2);
    return [t, t === 0 ? 0 : i / (2 * t)];
  }
  const t = Math.sqrt((m - r) / 2);
  return [Math.abs(i) / (2 * t), i >= 0 ? t : -t];
}

/**
 * [J0(z)·e^{−|Im z|}, J1(z)·e^{−|Im z|}] for |z| ≥ 25 in the closed fourth quadrant, as
 * (H^(1) + H^(2))/2 (DLMF 10.4.4) from Hankel's expansions of both (DLMF 10.17.3, 10.17.4, both
 * valid there). Miller's algorithm is anchored on these two at large |z|: they are good to a
 * few ulps, where its own normalising sum gathers rounding from about |z| terms.
 *
 * @param z - argument, dimensionless, Re z ≥ 0, Im z ≤ 0, |z| ≥ 25
 * @returns the two scaled values
 * @example
 * besselJ01LargeScaled([100, 0]); // ≈ [[0.0199858503042231, 0], [-0.0771453520141121, 0]]
 */
export function besselJ01LargeScaled(z: Complex): [Complex, Complex] {
  const { h1, h2 } = hankelExpansion(z);
  const damp = Math.exp(2 * z[1]); // H^(2)·e^{−|Im z|} = (its scaled value)·e^{−2|Im z|}
  return [0, 1].map((nu) => [(h1[nu][0] + damp * h2[nu][0]) / 2, (h1[nu][1] + damp * h2[nu][1]) / 2]) as [Complex, Complex];
}

/**
 * H_ν^(2)(z) ~ (2/(πz))^{1/2} e^{−j(z − νπ/2 − π/4)} Σ_k (−j)^k a_k(ν)/z^k and
 * H_ν^(1)(z) ~ (2/(πz))^{1/2} e^{+j(z − νπ/2 − π/4)} Σ_k j^k a_k(ν)/z^k, with
 * a_k(ν) = a_{k−1}(ν)·(4ν² − (2k−1)²)/(8k) (DLMF 10.17.3, 10.17.4, 10.17.1), summed until the
 * terms stop shrinking or fall below a quarter ulp of the sum; for ν = 0, 1. H^(2) comes
 * scaled by e^{−Im z}, H^(1) by e^{Im z} (e^{−|Im z|} here).
 */
function hankelExpansion(z: Complex): { h1: [Complex, Complex]; h2: [Complex, Complex] } {
  const [zr, zi] = z;
  const m2 = zr * zr + zi * zi;
  const invR = zr / m2; // 1/z
  const invI = -zi / m2;
  const amp = sqrtC((2 / Math.PI) * invR, (2 / Math.PI) * invI);
  const h1: Complex[] = [];
  const h2: Complex[] = [];
  for (const nu of [0, 1]) {
    let tr = 1; // a_k/z^k
    let ti = 0;
    let sr = 1; // Σ (−j)^k a_k/z^k
    let si = 0;
    let ur = 1; // Σ j^k a_k/z^k
    let ui = 0;
    let last = 1;
    for (let k = 1; k < 100; k++) {
      const f = (4 * nu * nu - (2 * k - 1) ** 2) / (8 * k);
      const ar = f * (tr * invR - ti * invI);
      ti = f * (tr * invI + ti * invR);
      tr = ar;
      const size = Math.abs(tr) + Math.abs(ti);
      if (size >= last) break;
      // (−j)^k t and j^k t
      switch (k & 3) {
        case 1: sr += ti; si -= tr; ur -= ti; ui += tr; break;
        case 2: sr -= tr; si -= ti; ur -= tr; ui -= ti; break;
        case 3: sr -= ti; si += tr; ur += ti; ui -= tr; break;
        default: sr += tr; si += ti; ur += tr; ui += ti; break;
      }
      last = size;
      if (size <= 2 ** -56 * Math.min(Math.abs(sr) + Math.abs(si), Math.abs(ur) + Math.abs(ui))) break;
    }
    const [pr, pi] = phaseFactor(zr, (nu * Math.PI) / 2 + Math.PI / 4); // e^{−j(Re z − θ)}
    const ar = amp[0] * pr - amp[1] * pi;
    const ai = amp[0] * pi + amp[1] * pr;
    h2.push([ar * sr - ai * si, ar * si + ai * sr]);
    const br = amp[0] * pr + amp[1] * pi; // amp·conj(phase)
    const bi = amp[1] * pr - amp[0] * pi;
    h1.push([br * ur - bi * ui, br * ui + bi * ur]);
  }
  return { h1: [h1[0], h1[1]], h2: [h2[0], h2[1]] };
}

/**
 * With ζ = jz and c = 1/(2ζ):  K0(ζ) = e^{−ζ}(2ζ)^{−1/2} ∫ e^{−s²}(1 + c s²)^{−1/2} ds and
 * K1(ζ) = 2e^{−ζ}(2ζ)^{−1/2} ∫ e^{−s²} s² (1 + c s²)^{1/2} ds over the real line
 * (DLMF 10.32.8 with t = s², Γ(½) = √π, Γ(3/2) = √π/2); then H0^(2) = (2j/π)K0 and
 * H1^(2) = −(2/π)K1. For z in the fourth quadrant 1 + c s² stays in the right half-plane, so
 * the principal root is the continuous one.
 */
function hankelIntegral(z: Complex): [Complex, Complex] {
  const [zr, zi] = z;
  const zetaR = -zi; // ζ = jz
  const zetaI = zr;
  const m2 = 4 * (zetaR * zetaR + zetaI * zetaI);
  const cr = (2 * zetaR) / m2; // c = 1/(2ζ)
  const ci = (-2 * zetaI) / m2;
  let i0r = 0;
  let i0i = 0;
  let i1r = 0;
  let i1i = 0;
  for (let j = 0; j < NODES; j++) {
    const s2 = NODE_SQUARES[j];
    const [wr, wi] = sqrtC(1 + cr * s2, ci * s2);
    const weight = NODE_WEIGHTS[j];
    const inv = weight / (wr * wr + wi * wi);
    i0r += wr * inv;
    i0i -= wi * inv;
    i1r += weight * s2 * wr;
    i1i += weight * s2 * wi;
  }
  // (2ζ)^{−1/2}·e^{−j·Re z} (the e^{−Im ζ}… size factor e^{Im z} is the scaling we drop)
  const [qr, qi] = sqrtC(2 * zetaR, 2 * zetaI);
  const q2 = qr * qr + qi * qi;
  const [pr, pi] = phaseFactor(zr, 0);
  const fr = (pr * qr + pi * qi) / q2; // e^{−j Re z}/√(2ζ)
  const fi = (pi * qr - pr * qi) / q2;
  const k0r = fr * i0r - fi * i0i;
  const k0i = fr * i0i + fi * i0r;
  const k1r = 2 * (fr * i1r - fi * i1i);
  const k1i = 2 * (fr * i1i + fi * i1r);
  const c = 2 / Math.PI;
  return [
    [-c * k0i, c * k0r],
    [-c * k1r, -c * k1i],
  ];
}
