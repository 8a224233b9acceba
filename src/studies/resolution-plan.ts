/**
 * Resolution study: how many cells per wavelength keep the phase the grid loses across the
 * project within a budget. For each resolution a dedicated measurement run places a
 * modulated-Gaussian line current and three probe lines (along x, along y, along the 45°
 * diagonal) from two to five wavelengths out; the phase error arg(FDTD/exact) along each
 * line is fitted against distance by least squares, whose slope is the phase lost per
 * wavelength (the fit removes the near-source offset). The Yee dispersion relation
 * (Taflove & Hagness, Computational Electrodynamics, ch. 4) predicts the same slope.
 * Held fixed from the user's scenario: the Courant number, the ratio dy/dx, the medium and
 * the absorber grading. Cells per wavelength count along x at the highest frequency.
 */
import { engineMemoryBytes } from '../scenario/memory.ts';
import { waveformBand } from '../scenario/waveforms.ts';
import { phaseErrorPerWavelengthDeg } from '../exact/dispersion.ts';
import { predictedErrors } from '../exact/dispersion-lossy.ts';
import { isSimpleMedium, wavenumber } from '../exact/medium.ts';
import { timeStep, waveSpeed } from '../scenario/layout.ts';
import type { Medium, Scenario } from '../scenario/types.ts';
import { shiftObject } from '../scenario/geometry.ts';
import type { SpectraJob } from './jobs.ts';
import type { ProjectionOptions } from './projection.ts';

export const DEFAULT_CELLS_PER_WAVELENGTH = [8, 10, 12, 14, 16, 18, 20, 24, 28, 32, 36, 40, 44, 48, 54, 60] as const;

/** Geometry of a measurement run, in wavelengths of the medium at the study frequency. */
export const MEASUREMENT = {
  /** From the inner face of the layers to the source. */
  sourceOffset: 1,
  /** Where the probe lines start and end, measured from the source. */
  lineStart: 2,
  lineEnd: 5,
  /** Interior left beyond the far ends of the lines. */
  farMargin: 1,
  /** Periods recorded after the pulse has passed the far end of the lines. */
  tailPeriods: 4,
  /** Thinnest absorber used for measurement runs, cells. */
  minimumCells: 10,
} as const;

/** Line names of a measurement run. */
export const LINE_NAMES = { x: 'along x', y: 'along y', diagonal: 'diagonal' } as const;

export interface ResolutionStudyOptions {
  /** Largest distance in the project, in wavelengths at the highest frequency. */
  size_wavelengths: number;
  /** Phase error allowed across that distance, degrees. */
  budget_deg: number;
  /** Resolutions to measure (default DEFAULT_CELLS_PER_WAVELENGTH within minCells..maxCells). */
  cellsPerWavelength?: number[];
  /** Coarsest resolution measured (default 8); added to the list if absent. */
  minCells?: number;
  /** Finest resolution measured (default 60); added to the list if absent. */
  maxCells?: number;
  /** The 3D projection and the geometry floor (projection.ts). */
  projection?: ProjectionOptions;
}

/** Problems with study options, as messages naming the option; empty when all is well. */
export function resolutionOptionProblems(o: ResolutionStudyOptions): string[] {
  const problems: string[] = [];
  if (!(Number.isFinite(o.size_wavelengths) && o.size_wavelengths > 0)) problems.push(`size: ${o.size_wavelengths} is not a positive number of wavelengths, e.g. --size 12`);
  if (!(Number.isFinite(o.budget_deg) && o.budget_deg > 0)) problems.push(`budget: ${o.budget_deg} is not a positive number of degrees, e.g. --budget 5`);
  const cpw = (name: string, v: number | undefined) => {
    if (v !== undefined && !(Number.isFinite(v) && v >= 4 && v <= 400)) problems.push(`${name}: ${v} is not a number of cells per wavelength from 4 to 400`);
  };
  cpw('min-cells', o.minCells);
  cpw('max-cells', o.maxCells);
  for (const v of o.cellsPerWavelength ?? []) cpw('cellsPerWavelength', v);
  if (o.cellsPerWavelength && o.cellsPerWavelength.length === 0) problems.push('cellsPerWavelength: give at least one value');
  if (o.minCells !== undefined && o.maxCells !== undefined && o.minCells > o.maxCells) problems.push(`min-cells ${o.minCells} is above max-cells ${o.maxCells}`);
  const p = o.projection ?? {};
  if (p.dims === 3 && !p.volume) problems.push('volume: the 3D projection needs the project\'s region as X,Y,Z in metres, e.g. --volume 0.2,0.1,0.05');
  if (p.volume && !(p.volume.length === 3 && p.volume.every((v) => Number.isFinite(v) && v > 0))) problems.push(`volume: ${p.volume.join(',')} is not three positive lengths in metres; write e.g. 0.2,0.1,0.05`);
  if (p.feature_m !== undefined && !(p.feature_m > 0)) problems.push(`feature: ${p.feature_m} is not a positive length in metres; write e.g. 0.0016`);
  if (p.cellsPerFeature !== undefined && !(Number.isInteger(p.cellsPerFeature) && p.cellsPerFeature >= 1 && p.cellsPerFeature <= 100)) problems.push(`cells-per-feature: ${p.cellsPerFeature} is not a whole number of cells from 1 to 100; write e.g. 4`);
  if (p.mcells3d !== undefined && !(p.mcells3d > 0)) problems.push(`speed: ${p.mcells3d} is not a positive number of million cells per second; write e.g. 300`);
  return problems;
}

/** The resolutions a study measures, ascending, without repeats. */
export function resolutionList(o: Omit<ResolutionStudyOptions, 'size_wavelengths' | 'budget_deg'>): number[] {
  if (o.cellsPerWavelength) return [...new Set(o.cellsPerWavelength)].sort((a, b) => a - b);
  const lo = o.minCells ?? DEFAULT_CELLS_PER_WAVELENGTH[0];
  const hi = o.maxCells ?? DEFAULT_CELLS_PER_WAVELENGTH[DEFAULT_CELLS_PER_WAVELENGTH.length - 1];
  return [...new Set([lo, ...DEFAULT_CELLS_PER_WAVELENGTH.filter((n) => n > lo && n < hi), hi])].sort((a, b) => a - b);
}

/**
 * The frequency the study works at: the highest analysis frequency of the scenario, or
 * when it lists none, the highest frequency at which the source spectrum is 40 dB below
 * its peak, Hz.
 */
export function studyFrequency(s: Scenario): number {
  if (s.frequencies.length > 0) return Math.max(...s.frequencies);
  return waveformBand(s.source.waveform).edgeHz;
}

/**
 * The measurement run for `cellsPerWavelength` cells per wavelength along x at `f` Hz:
 * dx = λ/N, dy = dx·(the scenario's dy/dx), the scenario's Courant number, medium and
 * absorber grading (at least MEASUREMENT.minimumCells thick); a modulated Gaussian at f
 * (τ = 1/f, t0 = 5τ); lines along x, y and the 45° diagonal from 2 to 5 wavelengths; and
 * enough steps for the pulse to pass the far ends and a few periods more.
 */
/**
 * The wavelength in a medium at f, m: c/f in a lossless medium (as always), 2π/Re k in a
 * lossy or dispersive one (cells per wavelength count by Re k).
 */
export function mediumWavelength(m: Medium, f: number): number {
  return isSimpleMedium(m) ? waveSpeed(m.epsR) / f : (2 * Math.PI) / wavenumber(m, f)[0];
}

export function measurementScenario(s: Scenario, cellsPerWavelength: number, f: number): Scenario {
  const wavelength = mediumWavelength(s.medium, f);
  const c = wavelength * f;
  const dx = wavelength / cellsPerWavelength;
  const dy = dx * (s.grid.dy / s.grid.dx);
  const cells = Math.max(s.absorber.cells, MEASUREMENT.minimumCells);
  const M = MEASUREMENT;
  const reach = (M.sourceOffset + M.lineEnd + M.farMargin) * wavelength;
  const nx = 2 * cells + Math.ceil(reach / dx) + 1;
  const ny = 2 * cells + Math.ceil(reach / dy) + 1;
  const si = cells + Math.round((M.sourceOffset * wavelength) / dx);
  const sj = cells + Math.round((M.sourceOffset * wavelength) / dy);
  const x = si * dx;
  const y = sj * dy;
  const r0 = M.lineStart * wavelength;
  const r1 = M.lineEnd * wavelength;
  const d = Math.SQRT1_2;
  const tau = 1 / f;
  const t0 = 5 * tau;
  const dt = timeStep(s.grid.courant, dx, dy, s.medium.epsR);
  // the pulse is over by t0 + 6τ; a slow grid (a few % at 8 cells per wavelength) arrives late,
  // and in a dispersive medium the pulse travels slower than the phase at f
  const window = t0 + 6 * tau + ((isSimpleMedium(s.medium) ? 1.05 : 1.3) * r1) / c + M.tailPeriods / f;
  return {
    format: 'gridgauge-scenario',
    version: 1,
    grid: { nx, ny, dx, dy, courant: s.grid.courant },
    medium: { ...s.medium },
    absorber: { ...s.absorber, cells },
    source: { x, y, amplitude: 1, waveform: { kind: 'modulated-gaussian', f0: f, tau, t0 } },
    ...(s.polarization ? { polarization: s.polarization } : {}),
    probes: [],
    lines: [
      { name: LINE_NAMES.x, x0: x + r0, y0: y, x1: x + r1, y1: y },
      { name: LINE_NAMES.y, x0: x, y0: y + r0, x1: x, y1: y + r1 },
      { name: LINE_NAMES.diagonal, x0: x + r0 * d, y0: y + r0 * d, x1: x + r1 * d, y1: y + r1 * d },
    ],
    frequencies: [f],
    steps: Math.ceil(window / dt),
  };
}

/** Phase lag per wavelength from the Yee dispersion relation at angle θ (rad), degrees, positive for a lag. */
export function predictedLagPerWavelength(f: number, theta: number, dx: number, dy: number, dt: number, c: number): number {
  return Math.abs(phaseErrorPerWavelengthDeg(f, theta, dx, dy, dt, c));
}

/**
 * Predicted lag per wavelength along x, y and the 45° diagonal at `cellsPerWavelength`
 * cells per wavelength along x, for a Courant number and dy/dx held fixed, degrees.
 * Works for any real N (the page draws it as a smooth curve).
 */
export function predictedLags(f: number, medium: Medium, courant: number, aspect: number, cellsPerWavelength: number): { x: number; y: number; diagonal: number } {
  const wavelength = mediumWavelength(medium, f);
  const dx = wavelength / cellsPerWavelength;
  const dy = aspect * dx;
  const dt = timeStep(courant, dx, dy, medium.epsR);
  if (!isSimpleMedium(medium)) {
    // the relation with the scheme's discrete permittivity: the ADE's own error included
    const lag = (theta: number) => Math.abs(predictedErrors(medium, f, theta, wavelength, dx, dy, dt).phaseDeg);
    return { x: lag(0), y: lag(Math.PI / 2), diagonal: lag(Math.PI / 4) };
  }
  const c = waveSpeed(medium.epsR);
  return {
    x: predictedLagPerWavelength(f, 0, dx, dy, dt, c),
    y: predictedLagPerWavelength(f, Math.PI / 2, dx, dy, dt, c),
    diagonal: predictedLagPerWavelength(f, Math.PI / 4, dx, dy, dt, c),
  };
}


/**
 * The user's scenario at another resolution: dx = λ/N at frequency `f` (dy keeps its
 * ratio to dx), the same Courant number, absorber cells, physical interior and simulated
 * time; source, probes and lines keep their distance from the interior's corner. This is
 * what "apply" does with a recommendation. The result still needs validation (memory cap).
 */
export function applyResolution(s: Scenario, cellsPerWavelength: number, f: number): Scenario {
  const { nx, ny, dx, dy } = s.grid;
  const L = s.absorber.cells;
  const newDx = mediumWavelength(s.medium, f) / cellsPerWavelength;
  const newDy = newDx * (dy / dx);
  const interior = (count: number, old: number, d: number) => Math.max(1, Math.ceil(((count - 1 - 2 * L) * old) / d - 1e-9));
  const mx = (x: number) => x - L * dx + L * newDx;
  const my = (y: number) => y - L * dy + L * newDy;
  const oldDt = timeStep(s.grid.courant, dx, dy, s.medium.epsR);
  const newDt = timeStep(s.grid.courant, newDx, newDy, s.medium.epsR);
  return {
    ...s,
    grid: { ...s.grid, dx: newDx, dy: newDy, nx: interior(nx, dx, newDx) + 1 + 2 * L, ny: interior(ny, dy, newDy) + 1 + 2 * L },
    source: { ...s.source, x: mx(s.source.x), y: my(s.source.y) },
    probes: s.probes.map((p) => ({ ...p, x: mx(p.x), y: my(p.y) })),
    lines: s.lines.map((l) => ({ ...l, x0: mx(l.x0), y0: my(l.y0), x1: mx(l.x1), y1: my(l.y1) })),
    // objects move with the interior too, so every distance inside it is held
    ...(s.objects ? { objects: s.objects.map((o) => shiftObject(o, mx(0), my(0))) } : {}),
    steps: Math.max(1, Math.ceil((s.steps * oldDt) / newDt - 1e-9)),
  };
}

export interface ResolutionCandidatePlan {
  key: string;
  /** The measurement run: transfer functions along the three lines. */
  jobs: SpectraJob[];
  cellsPerWavelength: number;
  dx_m: number;
  dy_m: number;
  dt_s: number;
  scenario: Scenario;
  /** Lag per wavelength the dispersion relation predicts, degrees. */
  predicted: { x: number; y: number; diagonal: number };
}

export interface ResolutionStudyPlan {
  shared: SpectraJob[];
  size_wavelengths: number;
  budget_deg: number;
  frequency_Hz: number;
  wavelength_m: number;
  courant: number;
  epsR: number;
  medium: Medium;
  /** dy/dx, held fixed. */
  aspect: number;
  /** Absorber cells assumed for the project grid. */
  absorberCells: number;
  projection: ProjectionOptions;
  candidates: ResolutionCandidatePlan[];
}

/** The measurement runs of a resolution study. Throws RangeError on bad options. */
export function planResolutionStudy(s: Scenario, options: ResolutionStudyOptions): ResolutionStudyPlan {
  const problems = resolutionOptionProblems(options);
  if (problems.length > 0) throw new RangeError(problems.join('; '));
  const f = studyFrequency(s);
  const aspect = s.grid.dy / s.grid.dx;
  const candidates = resolutionList(options).map((n): ResolutionCandidatePlan => {
    const scenario = measurementScenario(s, n, f);
    const { dx, dy } = scenario.grid;
    return {
      key: String(n), jobs: [{ kind: 'spectra', scenario }],
      cellsPerWavelength: n, dx_m: dx, dy_m: dy, dt_s: timeStep(s.grid.courant, dx, dy, s.medium.epsR), scenario,
      predicted: predictedLags(f, s.medium, s.grid.courant, aspect, n),
    };
  });
  return {
    shared: [],
    size_wavelengths: options.size_wavelengths,
    budget_deg: options.budget_deg,
    frequency_Hz: f,
    wavelength_m: mediumWavelength(s.medium, f),
    courant: s.grid.courant,
    epsR: s.medium.epsR,
    medium: s.medium,
    aspect,
    absorberCells: s.absorber.cells,
    projection: options.projection ?? {},
    candidates,
  };
}

/** Memory and run time of a square 2D project grid at one resolution. */
export interface ProjectEstimate {
  nx: number;
  ny: number;
  steps: number;
  memory_bytes: number;
  /** At the engine speed measured during the study; NaN until one run has finished. */
  seconds: number;
}

/**
 * A 2D grid covering size × size wavelengths at `cellsPerWavelength` cells per wavelength
 * along x (dy = aspect·dx), plus the absorber on every side, run long enough for a wave
 * to cross its diagonal once after a 10-period pulse. Memory from the engine's own
 * estimate (fields, CPML, coefficients, source table); time = nx·ny·steps / speed.
 */
export function projectEstimate(
  size_wavelengths: number, cellsPerWavelength: number, aspect: number, courant: number, absorberCells: number, mcellsPerSecond: number,
): ProjectEstimate {
  const nx = Math.ceil(size_wavelengths * cellsPerWavelength) + 1 + 2 * absorberCells;
  const ny = Math.ceil((size_wavelengths * cellsPerWavelength) / aspect) + 1 + 2 * absorberCells;
  // in periods: the pulse (10) and the diagonal in wavelengths; one period is N·(dx/min(dx,dy))/S steps
  const stepsPerPeriod = (cellsPerWavelength / courant) * (1 / Math.min(1, aspect));
  const steps = Math.ceil((10 + size_wavelengths * Math.hypot(1, 1)) * stepsPerPeriod);
  const memory_bytes = engineMemoryBytes({ nx, ny, cells: absorberCells, steps, probes: 0, dftPoints: 0, frequencies: 0, fullGridDft: false });
  return { nx, ny, steps, memory_bytes, seconds: (nx * ny * steps) / (mcellsPerSecond * 1e6) };
}

