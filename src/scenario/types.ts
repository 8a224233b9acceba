/**
 * The scenario model, format 1 (see README "Scenario file"). All quantities are SI:
 * metres, seconds, hertz, amperes. `Scenario` is what a file holds after validation with
 * every default filled in; the page, the CLI and the studies pass this type around.
 */

export type WaveformKind = 'gaussian' | 'modulated-gaussian' | 'ricker';

export interface Waveform {
  kind: WaveformKind;
  /** Centre frequency (modulated-gaussian, ricker), Hz. Absent for gaussian. */
  f0?: number;
  /** Gaussian width, s: I ∝ exp(−((t−t0)/τ)²). Absent for ricker. */
  tau?: number;
  /** Delay of the pulse centre, s. */
  t0: number;
}

export interface Grid { nx: number; ny: number; dx: number; dy: number; courant: number }
export interface Medium { epsR: number }
export interface Absorber { cells: number; order: number; sigmaScale: number; kappaMax: number; alphaMax: number }
export interface Source { x: number; y: number; amplitude: number; waveform: Waveform }
export interface Probe { name: string; x: number; y: number }
export interface ProbeLine { name: string; x0: number; y0: number; x1: number; y1: number }

export interface Scenario {
  format: 'gridgauge-scenario';
  version: 1;
  grid: Grid;
  medium: Medium;
  absorber: Absorber;
  source: Source;
  probes: Probe[];
  lines: ProbeLine[];
  frequencies: number[];
  steps: number;
}

/** One problem found in a scenario: the full path of the field and a message with the fix. */
export interface Problem { path: string; message: string }

export type ParseResult =
  | { ok: true; scenario: Scenario }
  | { ok: false; problems: Problem[] };
