import { maxDifferenceAndPeak } from '../compare/metrics.ts';
import type { Scenario } from '../scenario/types.ts';
import { shiftObject } from '../scenario/geometry.ts';

/**
 * Shifts a scenario's grid by whole cells: `addX`/`addY` nodes are added on each side
 * (negative removes), and the source, probes and lines move with the interior so they keep
 * their place relative to it. Positions stay in metres.
 */
export function padScenario(s: Scenario, addX: number, addY: number): Scenario {
  const ox = addX * s.grid.dx;
  const oy = addY * s.grid.dy;
  return {
    ...s,
    grid: { ...s.grid, nx: s.grid.nx + 2 * addX, ny: s.grid.ny + 2 * addY },
    source: { ...s.source, x: s.source.x + ox, y: s.source.y + oy },
    probes: s.probes.map((p) => ({ ...p, x: p.x + ox, y: p.y + oy })),
    lines: s.lines.map((l) => ({ ...l, x0: l.x0 + ox, y0: l.y0 + oy, x1: l.x1 + ox, y1: l.y1 + oy })),
    ...(s.objects ? { objects: s.objects.map((o) => shiftObject(o, ox, oy)) } : {}),
  };
}

/**
 * The reference grid of the reference-grid method (Taflove & Hagness, Computational
 * Electrodynamics, ch. 7): the same scenario with enough cells added on every side that no
 * wave leaving the interior can come back to any probe within `steps` time steps. A wave
 * travels at most S·min(dx,dy) per step, and must cross the added band twice to return.
 */
export function referenceScenario(s: Scenario, steps = s.steps): Scenario {
  const travel = steps * s.grid.courant * Math.min(s.grid.dx, s.grid.dy);
  const addX = Math.ceil(travel / (2 * s.grid.dx)) + 2;
  const addY = Math.ceil(travel / (2 * s.grid.dy)) + 2;
  return { ...padScenario(s, addX, addY), steps };
}

/**
 * Reflection error of a run against its reference run, per probe:
 * max_n |E[n] − Eref[n]| / max_n |Eref[n]|, in dB (20·log10). `worst` is the largest.
 */
export function reflectionErrorDb(series: ArrayLike<number>[], reference: ArrayLike<number>[]): { perProbe: number[]; worst: number } {
  const perProbe = series.map((e, p) => {
    const { diff, peak } = maxDifferenceAndPeak(e, reference[p]);
    return 20 * Math.log10(diff / peak);
  });
  return { perProbe, worst: Math.max(...perProbe) };
}

/** Error against the reference at every sample, relative to the reference's peak (for charts). */
export function reflectionErrorSeries(series: ArrayLike<number>, reference: ArrayLike<number>): Float64Array {
  let peak = 0;
  for (let k = 0; k < reference.length; k++) peak = Math.max(peak, Math.abs(reference[k]));
  const out = new Float64Array(Math.min(series.length, reference.length));
  for (let k = 0; k < out.length; k++) out[k] = Math.abs(series[k] - reference[k]) / peak;
  return out;
}
