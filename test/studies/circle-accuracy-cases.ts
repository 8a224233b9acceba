/**
 * One circle against its eigenfunction series at several resolutions: the scenarios and the
 * measurement shared by test/studies/circle-accuracy.test.ts and scripts/staircase-table.mts.
 *
 * Geometry, in free-space wavelengths λ at f0 = 10 GHz (vacuum around the object): a
 * 3.2 λ square interior, the circle's centre near the middle but off every grid line (so
 * no resolution sees a symmetric cut), the line source 0.9 λ to its left. Every probe lies
 * on the 0.1 λ lattice, so every resolution used (cells per wavelength a multiple of 10)
 * has a node exactly there and all of them compare the same points: "near" probes within
 * 0.1 λ of the surface, outside it, all round the circle; "far" probes 0.5 λ or more away.
 *
 * The error at a point is |FDTD − exact| / |incident|, the incident field being the exact
 * field of the source alone at that point (the staircase study's measure). The dispersion
 * floor is measured by the same run without the object (against the Hankel field); the
 * scattered-field error |(FDTD − FDTD without object) − (exact − incident)| / |incident|
 * takes the direct wave's dispersion and the absorber's reflection of it out, and leaves
 * what the object's representation adds.
 */
import { collectResults } from '../../src/compare/results.ts';
import { complexRatioErrors } from '../../src/compare/metrics.ts';
import { makeSimulation } from '../../src/engine/create-simulation.ts';
import { C0 } from '../../src/scenario/constants.ts';
import type { Complex } from '../../src/exact/complex.ts';
import type { CircleObject, Fill, Material, Polarization, Probe, Scenario } from '../../src/scenario/types.ts';

export const F0 = 1e10;
export const WAVELENGTH = C0 / F0;
/** Interior side, λ. */
const SIDE = 3.2;
const CENTRE: [number, number] = [1.6137, 1.5941];
const SOURCE: [number, number] = [0.7, 1.6];
const FAR: [number, number][] = [[2.6, 1.6], [1.6, 2.6], [1.6, 0.6], [2.3, 2.3], [0.4, 2.0]];
/** Near probes: within this many λ of the surface (the staircase study's "near"). */
export const NEAR = 0.1;

export interface CircleCase {
  polarization: Polarization;
  fill: Fill;
  material: Material;
  /** Radius, λ. */
  radius: number;
}

/** The PEC post and the dielectric rod the tests and the table use. */
export const PEC_RADIUS = 0.3;
export const ROD = { epsR: 4 } as const;
export const ROD_RADIUS = 0.25;

/** Lattice points (0.1 λ) outside the circle within NEAR of its surface, one per eighth of a turn where there is one. */
export function nearPoints(radius: number): [number, number][] {
  const out: [number, number][] = [];
  for (let q = 0; q < 8; q++) {
    const t = (q * Math.PI) / 4;
    const want = [CENTRE[0] + (radius + 0.05) * Math.cos(t), CENTRE[1] + (radius + 0.05) * Math.sin(t)];
    let best: [number, number] | undefined;
    let bestD = Infinity;
    for (let i = Math.round(want[0] * 10) - 2; i <= Math.round(want[0] * 10) + 2; i++) {
      for (let j = Math.round(want[1] * 10) - 2; j <= Math.round(want[1] * 10) + 2; j++) {
        const p: [number, number] = [i / 10, j / 10];
        const gap = Math.hypot(p[0] - CENTRE[0], p[1] - CENTRE[1]) - radius;
        const d = Math.hypot(p[0] - want[0], p[1] - want[1]);
        if (gap > 0.02 && gap <= NEAR && d < bestD && !out.some((o) => o[0] === p[0] && o[1] === p[1])) { best = p; bestD = d; }
      }
    }
    if (best) out.push(best);
  }
  return out;
}

/**
 * The scenario at `cells` cells per free-space wavelength (a multiple of 10), with or without
 * the object. Steps: 30 periods of f0 for a conductor, 50 for the rod (it rings longer); by
 * then the field at the probes is below 1e-6 of its peak from 20 cells per wavelength on
 * (the TMz staircase rod at 10 rings on at about 6e-4).
 */
export function circleScenario(c: CircleCase, cells: number, withObject = true): Scenario {
  if (cells % 10 !== 0) throw new RangeError('cells per wavelength must be a multiple of 10 (probes on the 0.1 λ lattice)');
  const d = WAVELENGTH / cells;
  const L = 10;
  const n = Math.round(SIDE * cells) + 1 + 2 * L;
  const at = (p: [number, number]) => ({ x: L * d + p[0] * WAVELENGTH, y: L * d + p[1] * WAVELENGTH });
  const probes: Probe[] = [
    ...nearPoints(c.radius).map((p, q) => ({ name: `near ${q}`, ...at(p) })),
    ...FAR.map((p, q) => ({ name: `far ${q}`, ...at(p) })),
  ];
  const centre = at(CENTRE);
  // 2·cells steps a period at S = 0.5 on square cells
  const periods = c.material === 'pec' ? 30 : 50;
  return {
    format: 'gridgauge-scenario', version: 1,
    grid: { nx: n, ny: n, dx: d, dy: d, courant: 0.5 },
    medium: { epsR: 1 },
    absorber: { cells: L, order: 3, sigmaScale: 1, kappaMax: 5, alphaMax: 0.05 },
    source: { ...at(SOURCE), amplitude: 1, waveform: { kind: 'modulated-gaussian', f0: F0, tau: 1 / F0, t0: 5 / F0 } },
    probes, lines: [], frequencies: [F0], steps: 2 * cells * periods,
    polarization: c.polarization, fill: c.fill,
    ...(withObject ? { objects: [{ name: 'circle', shape: 'circle' as const, x: centre.x, y: centre.y, radius: c.radius * WAVELENGTH, material: c.material }] } : {}),
  };
}

export interface PointError {
  name: string;
  near: boolean;
  /** |FDTD − exact| / |incident|. */
  rel: number;
  /** The same without the object (FDTD against the Hankel field): the dispersion and absorber floor. */
  floor: number;
  /** |(FDTD − FDTD without object) − (exact − incident)| / |incident|. */
  scattered: number;
  mag_dB: number;
  phase_deg: number;
}

export interface GroupErrors {
  rel: number; floor: number; scattered: number; mag_dB: number; phase_deg: number;
  /** Root mean square of rel over the group: steadier than the worst for fitting an order. */
  rms: number;
}

export interface CircleErrors {
  cells: number;
  points: PointError[];
  /** Worst over near and over far points, of each measure (magnitude and phase as absolute values). */
  near: GroupErrors;
  far: GroupErrors;
  /** Largest |field| at the probes in the last 5 % of the run over the largest in the run (energy left). */
  tail: number;
}

async function transfers(s: Scenario) {
  const sim = await makeSimulation(s);
  sim.run();
  const r = collectResults(sim);
  let peak = 0;
  let tail = 0;
  const from = Math.floor(0.95 * r.steps);
  for (const p of r.probes) {
    p.fdtd.forEach((v, n) => { peak = Math.max(peak, Math.abs(v)); if (n >= from) tail = Math.max(tail, Math.abs(v)); });
  }
  const out = r.probes.map((p) => ({ name: p.name, fdtd: p.spectra[0].fdtd, exact: p.spectra[0].exact }));
  sim.dispose();
  return { points: out, tail: tail / peak };
}

const sub = (a: Complex, b: Complex): Complex => [a[0] - b[0], a[1] - b[1]];
const abs = (a: Complex) => Math.hypot(a[0], a[1]);

// Runs without the object are the same for every fill: keep them.
const freeRuns = new Map<string, Promise<Awaited<ReturnType<typeof transfers>>>>();

/** Run the case at one resolution with and without the object, and measure every probe. */
export async function measureCircle(c: CircleCase, cells: number): Promise<CircleErrors> {
  const s = circleScenario(c, cells, true);
  const withObject = await transfers(s);
  const freeScenario = circleScenario(c, cells, false);
  const key = JSON.stringify({ ...freeScenario, fill: undefined });
  if (!freeRuns.has(key)) freeRuns.set(key, transfers(freeScenario));
  const free = await (freeRuns.get(key) as ReturnType<typeof transfers>);
  const circle = s.objects![0] as CircleObject;
  const surfaceGap = (p: Probe) => Math.hypot(p.x - circle.x, p.y - circle.y) - circle.radius;
  const points = withObject.points.map((p, q): PointError => {
    const f = free.points[q];
    const incident = abs(f.exact);
    const e = complexRatioErrors(p.fdtd, p.exact);
    return {
      name: p.name,
      near: surfaceGap(s.probes[q]) <= NEAR * WAVELENGTH * (1 + 1e-9),
      rel: abs(sub(p.fdtd, p.exact)) / incident,
      floor: abs(sub(f.fdtd, f.exact)) / incident,
      scattered: abs(sub(sub(p.fdtd, f.fdtd), sub(p.exact, f.exact))) / incident,
      mag_dB: e.magDb, phase_deg: e.phaseDeg,
    };
  });
  const worst = (near: boolean): GroupErrors => {
    const list = points.filter((p) => p.near === near);
    const max = (k: 'rel' | 'floor' | 'scattered' | 'mag_dB' | 'phase_deg') => Math.max(...list.map((p) => Math.abs(p[k])));
    const rms = Math.sqrt(list.reduce((t, p) => t + p.rel * p.rel, 0) / list.length);
    return { rel: max('rel'), floor: max('floor'), scattered: max('scattered'), mag_dB: max('mag_dB'), phase_deg: max('phase_deg'), rms };
  };
  return { cells, points, near: worst(true), far: worst(false), tail: Math.max(withObject.tail, free.tail) };
}

/**
 * Least-squares slope of log(error) against log(cell size): the observed order of
 * convergence (common practice, e.g. Roache, Verification and Validation in Computational
 * Science and Engineering, 1998, from memory).
 */
export function observedOrder(cells: readonly number[], errors: readonly number[]): number {
  const x = cells.map((n) => Math.log(1 / n));
  const y = errors.map((e) => Math.log(e));
  const mx = x.reduce((p, q) => p + q, 0) / x.length;
  const my = y.reduce((p, q) => p + q, 0) / y.length;
  let sxy = 0;
  let sxx = 0;
  x.forEach((v, k) => { sxy += (v - mx) * (y[k] - my); sxx += (v - mx) ** 2; });
  return sxy / sxx;
}
