/**
 * Warnings: inputs that are valid but whose results would mean little (README "Warnings").
 * They never block a run; `check` and `run` print them, the page shows them, summary.json
 * lists them. Each names the field to change and how, in the field's own unit (SI in files).
 * The first warning is the most likely root cause: a cell size so coarse that the grid
 * cannot carry the pulse at all (often millimetres typed as metres) comes before the
 * consequences it has on every frequency and probe.
 */
import { dispersionCutoff } from '../exact/dispersion.ts';
import { wavenumber } from '../exact/medium.ts';
import { layoutOf, nodeDistance } from './layout.ts';
import { objectWarnings } from './object-rules.ts';
import { approx } from './show.ts';
import type { Scenario } from './types.ts';
import { formatSI } from './units.ts';
import { waveformBand, waveformExtent } from './waveforms.ts';

export interface Warning {
  /** Stable identifier for scripts: few-cells, above-cutoff, not-passed, not-reached, energy-left, object-missed, tez-average. */
  code: string;
  /** The field to change, as in validation messages. */
  path: string;
  message: string;
}

/** Fewer cells per wavelength than this and the grid's error is of order one (common practice, no source). */
export const MIN_CELLS_PER_WAVELENGTH = 5;
/** Cells per wavelength this many or more is what a unit-slip suggestion aims at (common practice, no source). */
const COMFORTABLE_CELLS = 10;
/** The grid's waves are up to this much slower than the medium's at the resolutions warned about (a margin on arrival times). */
const SLOWEST_GRID_SPEED = 0.9;

/** Cells per wavelength along the coarser axis at frequency f (Re k of the medium). */
export function cellsPerWavelength(s: Scenario, f: number): number {
  const k = wavenumber(s.medium, f)[0];
  return (2 * Math.PI) / k / Math.max(s.grid.dx, s.grid.dy);
}

/** The lowest frequency at which the grid stops carrying a wave in some direction (axes and diagonal), Hz. */
export function gridCutoff(s: Scenario): number {
  const { dx, dy, dt, c } = layoutOf(s);
  return Math.min(...[0, Math.PI / 4, Math.PI / 2].map((theta) => dispersionCutoff(theta, dx, dy, dt, c)));
}

function coarseCell(s: Scenario, f: number, where: string): Warning | undefined {
  const n = cellsPerWavelength(s, f);
  if (!(n < MIN_CELLS_PER_WAVELENGTH)) return undefined;
  const axis = s.grid.dx >= s.grid.dy ? 'dx' : 'dy';
  const d = s.grid[axis];
  const wavelength = n * d;
  let hint = `use ${axis} ≤ ${approx(wavelength / COMFORTABLE_CELLS)} m (${COMFORTABLE_CELLS} cells per wavelength)`;
  // the common slip: millimetres (or micrometres) typed as metres, which gives cells of 10 cm or more
  for (const [factor, unit] of [[1e-3, 'mm'], [1e-6, 'µm']] as const) {
    if (d >= 0.1 && n / factor >= COMFORTABLE_CELLS && n / factor <= 1000) {
      hint = `did you mean ${approx(d)} ${unit}, i.e. ${approx(d * factor)} m? Otherwise ${hint}`;
      break;
    }
  }
  return {
    code: 'few-cells',
    path: `grid.${axis}`,
    message: `${approx(d)} m is ${approx(n)} cells per wavelength at ${formatSI(f, 'Hz')} ${where} (fewer than ${MIN_CELLS_PER_WAVELENGTH}): the grid cannot carry that wave faithfully; ${hint}`,
  };
}

/**
 * Warnings that follow from the scenario alone: too few cells per wavelength at f0, at the
 * band edge or at an analysis frequency; an analysis frequency or the band edge above the
 * grid's cutoff; a run too short for the pulse to reach or pass a probe or a line; an object
 * that falls between the sample points; the average fill on a penetrable object in TEz.
 */
export function scenarioWarnings(s: Scenario): Warning[] {
  const out: Warning[] = [];
  const w = s.source.waveform;
  const band = waveformBand(w);
  const f0 = w.kind === 'gaussian' ? band.peakHz : w.f0;
  const first = f0 > 0 ? coarseCell(s, f0, '(the pulse\'s centre frequency)') : undefined;
  if (first) out.push(first);
  else {
    const edge = coarseCell(s, band.edgeHz, '(the pulse\'s −40 dB band edge)');
    if (edge) out.push(edge);
  }
  s.frequencies.forEach((f, k) => {
    const c = coarseCell(s, f, `(frequencies[${k}])`);
    if (c && !out.some((x) => x.path === c.path && x.code === 'few-cells')) out.push({ ...c, path: `frequencies[${k}]` });
  });

  const cutoff = gridCutoff(s);
  s.frequencies.forEach((f, k) => {
    if (f > cutoff) {
      out.push({ code: 'above-cutoff', path: `frequencies[${k}]`, message: `${formatSI(f, 'Hz')} is above ${formatSI(cutoff, 'Hz')}, the highest frequency this grid carries in every direction: FDTD values there are not a wave; lower the frequency or refine grid.dx and grid.dy` });
    }
  });
  if (band.edgeHz > cutoff) {
    out.push({ code: 'above-cutoff', path: 'source.waveform', message: `the pulse's −40 dB band edge ${formatSI(band.edgeHz, 'Hz')} is above ${formatSI(cutoff, 'Hz')}, the highest frequency this grid carries in every direction: part of the pulse cannot propagate; use a narrower band (larger tau or lower f0) or finer cells` });
  }

  const layout = layoutOf(s);
  const end = s.steps * layout.dt;
  const slow = SLOWEST_GRID_SPEED * layout.c;
  const passes = (rho: number) => w.t0 + waveformExtent(w) + rho / slow;
  const arrives = (rho: number) => w.t0 + rho / layout.c;
  const stepsFor = (t: number) => Math.ceil(t / layout.dt);
  layout.probes.forEach((p, k) => {
    const rho = nodeDistance(p, layout.source, layout.dx, layout.dy);
    if (end < arrives(rho)) {
      out.push({ code: 'not-reached', path: `probes[${k}]`, message: `the run ends at ${formatSI(end, 's')}, before the pulse reaches this probe (about ${formatSI(arrives(rho), 's')}): its figures are left out; use steps ≥ ${stepsFor(passes(rho))}` });
    } else if (end < passes(rho)) {
      out.push({ code: 'not-passed', path: `probes[${k}]`, message: `the run ends at ${formatSI(end, 's')}, before the pulse has passed this probe (about ${formatSI(passes(rho), 's')}): its spectra are cut short; use steps ≥ ${stepsFor(passes(rho))}` });
    }
  });
  layout.lines.forEach((line, k) => {
    const far = Math.max(...line.nodes.map((n) => nodeDistance(n, layout.source, layout.dx, layout.dy)));
    if (end < passes(far)) {
      out.push({ code: 'not-passed', path: `lines[${k}]`, message: `the run ends at ${formatSI(end, 's')}, before the pulse has passed the far end of this line (about ${formatSI(passes(far), 's')}): its spectra are cut short; use steps ≥ ${stepsFor(passes(far))}` });
    }
  });
  for (const w of objectWarnings(s)) out.push({ code: 'object-missed', path: w.path, message: w.message });
  const tezAverage = tezAverageWarning(s);
  if (tezAverage) out.push(tezAverage);
  return out;
}

/**
 * The average fill in TEz blends the permittivity arithmetically on the Ex and Ey edges, and
 * those edges cross a dielectric's surface, where the field's normal part wants the harmonic
 * mean: measured against the series, it converges slower than the staircase and stays behind
 * it (an εr 4 rod at 40 cells per wavelength: 0.10 of the incident field against 0.026,
 * scripts/staircase-table.mts). PEC objects are not affected (they use the conformal rule).
 */
function tezAverageWarning(s: Scenario): Warning | undefined {
  if (s.polarization !== 'TEz' || s.fill !== 'average') return undefined;
  const k = (s.objects ?? []).findIndex((o) => o.material !== 'pec');
  if (k < 0) return undefined;
  return {
    code: 'tez-average',
    path: 'fill',
    message: `"average" blends εr arithmetically on the Ex and Ey edges, which cross the surface of objects[${k}]; in TEz that is measured less accurate than the staircase for penetrable objects: use "fill": "staircase", or compare both with staircase-study`,
  };
}

/** Indices of probes the pulse has not reached by the end of the run (their figures are left out). */
export function unreachedProbes(s: Scenario, stepsDone = s.steps): Set<number> {
  const layout = layoutOf(s);
  const end = stepsDone * layout.dt;
  const w = s.source.waveform;
  const out = new Set<number>();
  layout.probes.forEach((p, k) => {
    const rho = nodeDistance(p, layout.source, layout.dx, layout.dy);
    if (end < w.t0 + rho / layout.c) out.add(k);
  });
  return out;
}

/** Energy left in the grid at the end, as a share of its peak, above which spectra are cut short (−40 dB). */
export const ENERGY_LEFT_LIMIT_DB = -40;

/** The warning for a run that ended with `leftDb` of its peak field energy still in the grid, or undefined. */
export function energyLeftWarning(leftDb: number, steps: number): Warning | undefined {
  if (!(leftDb > ENERGY_LEFT_LIMIT_DB)) return undefined;
  return {
    code: 'energy-left',
    path: 'steps',
    message: `${approx(leftDb)} dB of the peak field energy is still in the grid at the last step (above ${ENERGY_LEFT_LIMIT_DB} dB): the running DFTs miss the rest of the response, so spectra carry a truncation error; run longer, e.g. steps ${Math.ceil(steps * 1.5)} or more`,
  };
}
