import { EPS0, ETA0 } from '../scenario/constants.ts';
import type { Absorber } from '../scenario/types.ts';

/** CPML recursive-convolution coefficients at one node. */
export interface CpmlCoefficients { b: number; a: number; kappa: number; sigma: number; alpha: number }

/**
 * The largest CPML conductivity of a layer, S/m: σmax = sigmaScale·0.8(m+1)/(η·Δ) with
 * η = η0/√εr the medium's impedance (Roden & Gedney 2000; the 0.8(m+1)/(ηΔ) optimum is
 * common practice for polynomial grading). The one place the rule is written.
 *
 * @example
 * cpmlSigmaMax({ cells: 10, order: 3, sigmaScale: 1, kappaMax: 5, alphaMax: 0.05 }, 1e-3, 1); // ≈ 8.49 S/m
 */
export function cpmlSigmaMax(absorber: Absorber, spacing: number, epsR: number): number {
  const eta = ETA0 / Math.sqrt(epsR);
  return (absorber.sigmaScale * 0.8 * (absorber.order + 1)) / (eta * spacing);
}

/**
 * Graded CPML parameters and recursive-convolution coefficients at depth `depth` (m) into a
 * layer of thickness d = cells·Δ (Roden & Gedney, Microwave Opt. Technol. Lett. 27, 2000):
 * σ = σmax(ρ/d)^m, κ = 1 + (κmax − 1)(ρ/d)^m, α = αmax(1 − ρ/d),
 * σmax = sigmaScale·0.8(m+1)/(η·Δ), b = exp(−(σ/κ + α)·dt/ε), a = σ(b − 1)/(κ(σ + κα)).
 * Units: depth and spacing in m, dt in s; σ in S/m, α in S/m.
 *
 * @example
 * cpmlCoefficients(0, { cells: 10, order: 3, sigmaScale: 1, kappaMax: 5, alphaMax: 0.05 }, 1e-3, 1.18e-12, 1).kappa; // 1
 */
export function cpmlCoefficients(depth: number, absorber: Absorber, spacing: number, dt: number, epsR: number): CpmlCoefficients {
  const d = absorber.cells * spacing;
  const m = absorber.order;
  const eps = EPS0 * epsR;
  const x = Math.min(Math.max(depth / d, 0), 1);
  const sigmaMax = cpmlSigmaMax(absorber, spacing, epsR);
  const grade = x ** m;
  const sigma = sigmaMax * grade;
  const kappa = 1 + (absorber.kappaMax - 1) * grade;
  const alpha = absorber.alphaMax * (1 - x);
  const b = Math.exp(-(sigma / kappa + alpha) * (dt / eps));
  const denominator = kappa * (sigma + kappa * alpha);
  const a = denominator === 0 ? 0 : (sigma * (b - 1)) / denominator;
  return { b, a, kappa, sigma, alpha };
}

/**
 * Per-index coefficient tables along one axis of `count` Ez nodes: E nodes at whole
 * positions, H nodes at half positions (index i ↔ i+½). Depth is measured from the inner
 * face of each layer (node `cells` and node `count−1−cells`); outside the layers b = a = 0
 * and g = 1/κ − 1 = 0, so nothing changes there.
 */
export function cpmlAxisTables(count: number, absorber: Absorber, spacing: number, dt: number, epsR: number) {
  const L = absorber.cells;
  const tables = {
    bE: new Float32Array(count), aE: new Float32Array(count), gE: new Float32Array(count),
    bH: new Float32Array(count), aH: new Float32Array(count), gH: new Float32Array(count),
  };
  if (L === 0) return tables;
  const fill = (b: Float32Array, a: Float32Array, g: Float32Array, index: number, depthCells: number) => {
    if (depthCells <= 0) return;
    const k = cpmlCoefficients(depthCells * spacing, absorber, spacing, dt, epsR);
    b[index] = k.b; a[index] = k.a; g[index] = 1 / k.kappa - 1;
  };
  const far = count - 1 - L;
  for (let i = 0; i < count; i++) {
    fill(tables.bE, tables.aE, tables.gE, i, i < L ? L - i : i > far ? i - far : 0);
    const h = i + 0.5;
    if (i < count - 1) fill(tables.bH, tables.aH, tables.gH, i, h < L ? L - h : h > far ? h - far : 0);
  }
  return tables;
}
