/**
 * Quantities that follow from a valid scenario, for `gridgauge check` and the page. The
 * field names are part of the `check --json` output: plain names, SI unit after an
 * underscore, no suffix for pure numbers. Quantities that do not exist for the scenario
 * (the wavelength at the centre frequency of a baseband gaussian) are NaN, which the JSON
 * writer prints as null.
 */
import { MEMORY_CAP_BYTES } from './memory.ts';
import { estimateMemoryBytes } from './memory-estimate.ts';
import { waveformBand } from './waveforms.ts';
import { errorMapsThatFit, fullGridDftBytes } from './readouts.ts';
import { stabilityLimit, timeStep, waveSpeed } from './layout.ts';
import type { Scenario } from './types.ts';
import { isSimpleMedium, relativePermittivity, wavenumber } from '../exact/medium.ts';

export interface DerivedQuantities {
  /** Time step, s. */
  dt_s: number;
  /** Wave speed in the medium, c0/√εr, m/s. */
  c_m_per_s: number;
  /** Courant number S = c·dt/min(dx, dy), as given. */
  courant: number;
  /** 2D stability limit on S for these cells. */
  stabilityLimit: number;
  /** stabilityLimit − courant. */
  stabilityMargin: number;
  /** (stabilityLimit − courant)/stabilityLimit. */
  stabilityMarginFraction: number;
  /** Centre frequency: the waveform's f0, or the spectral peak (0 Hz) for a gaussian, Hz. */
  f0_Hz: number;
  /** Highest frequency at which the source spectrum is 40 dB below its peak, Hz. */
  bandEdge_Hz: number;
  /** Wavelength in the medium at f0_Hz, m (NaN when f0_Hz is 0). */
  wavelengthAtF0_m: number;
  /** Wavelength in the medium at bandEdge_Hz, m. */
  wavelengthAtBandEdge_m: number;
  /** Wavelength at f0_Hz over the coarser cell size max(dx, dy) (NaN when f0_Hz is 0). */
  cellsPerWavelengthAtF0: number;
  /** Wavelength at bandEdge_Hz over max(dx, dy). */
  cellsPerWavelengthAtBandEdge: number;
  /** Highest frequency the time step can sample, 1/(2·dt), Hz. */
  nyquist_Hz: number;
  /** Engine memory estimate, bytes. */
  memory_bytes: number;
  /** Cap on the memory estimate, bytes. */
  memoryCap_bytes: number;
  /** Interior nodes along x and y (the absorber layers excluded). */
  interiorNx: number;
  interiorNy: number;
  /** εr(ω) of the medium at f0 and at the band edge, real and imaginary parts (Im ≤ 0 for a lossy medium). */
  epsRAtF0_re: number;
  epsRAtF0_im: number;
  epsRAtBandEdge_re: number;
  epsRAtBandEdge_im: number;
  /** Attenuation over one wavelength at f0, dB (0 in a lossless medium). */
  lossPerWavelengthAtF0_dB: number;
  /** 1/|Im k| at f0 where the medium conducts, m (NaN without conductivity). */
  skinDepthAtF0_m: number;
  /** c∞ = c0/√ε∞, which sets the Courant limit, m/s. */
  fastestWaveSpeed_m_per_s: number;
  /** Simulated time, steps·dt, s. */
  duration_s: number;
  /** One full-grid running DFT (the page's error map at one frequency), 8·nx·ny, bytes. */
  fullGridDft_bytes: number;
  /** How many of the first analysis frequencies can have an error map beside the run under the cap. */
  errorMapsFitting: number;
  /** Ez-node updates of the whole run, nx·ny·steps (the basis of a run-time estimate). */
  nodeUpdates: number;
}

/** Engine memory for a scenario, bytes: fields, absorber, probe series and running DFTs. */
export function scenarioMemoryBytes(s: Scenario, fullGridDft = false): number {
  return estimateMemoryBytes(s, fullGridDft);
}

/**
 * Derived quantities of a validated scenario.
 *
 * @example
 * deriveQuantities(demoScenario()).cellsPerWavelengthAtF0; // ≈ 29.98 (10 GHz, 1 mm cells)
 */
export function deriveQuantities(s: Scenario): DerivedQuantities {
  const { dx, dy, courant, nx, ny } = s.grid;
  const c = waveSpeed(s.medium.epsR);
  const dt = timeStep(courant, dx, dy, s.medium.epsR);
  const limit = stabilityLimit(dx, dy);
  const band = waveformBand(s.source.waveform);
  const f0 = s.source.waveform.kind === 'gaussian' ? band.peakHz : s.source.waveform.f0;
  const coarser = Math.max(dx, dy);
  const simple = isSimpleMedium(s.medium);
  // in a lossy or dispersive medium the wavelength follows Re k at each frequency
  const wavelengthAt = (f: number) => (!(f > 0) ? NaN : simple ? c / f : (2 * Math.PI) / wavenumber(s.medium, f)[0]);
  const eps0 = f0 > 0 ? relativePermittivity(s.medium, f0) : [NaN, NaN];
  const epsEdge = relativePermittivity(s.medium, band.edgeHz);
  const kF0 = f0 > 0 ? wavenumber(s.medium, f0) : [NaN, NaN];
  const memory = scenarioMemoryBytes(s);
  return {
    dt_s: dt,
    c_m_per_s: c,
    courant,
    stabilityLimit: limit,
    stabilityMargin: limit - courant,
    stabilityMarginFraction: (limit - courant) / limit,
    f0_Hz: f0,
    bandEdge_Hz: band.edgeHz,
    wavelengthAtF0_m: wavelengthAt(f0),
    wavelengthAtBandEdge_m: wavelengthAt(band.edgeHz),
    cellsPerWavelengthAtF0: wavelengthAt(f0) / coarser,
    cellsPerWavelengthAtBandEdge: wavelengthAt(band.edgeHz) / coarser,
    nyquist_Hz: 1 / (2 * dt),
    memory_bytes: memory,
    memoryCap_bytes: MEMORY_CAP_BYTES,
    interiorNx: nx - 2 * s.absorber.cells,
    interiorNy: ny - 2 * s.absorber.cells,
    duration_s: s.steps * dt,
    fullGridDft_bytes: fullGridDftBytes(nx, ny),
    errorMapsFitting: errorMapsThatFit(memory, nx, ny, s.frequencies.length),
    nodeUpdates: nx * ny * s.steps,
    epsRAtF0_re: eps0[0],
    epsRAtF0_im: eps0[1],
    epsRAtBandEdge_re: epsEdge[0],
    epsRAtBandEdge_im: epsEdge[1],
    lossPerWavelengthAtF0_dB: simple ? 0 : 20 * Math.LOG10E * Math.abs(kF0[1]) * ((2 * Math.PI) / kF0[0]),
    skinDepthAtF0_m: (s.medium.sigma ?? 0) > 0 ? 1 / Math.abs(kF0[1]) : NaN,
    fastestWaveSpeed_m_per_s: c,
  };
}
