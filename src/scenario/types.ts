/**
 * The scenario model, format 1 (see README "Scenario file"). All quantities are SI:
 * metres, seconds, hertz, amperes. `Scenario` is what a file holds after validation with
 * every default filled in; the page, the CLI and the studies pass this type around.
 */

export type WaveformKind = 'gaussian' | 'modulated-gaussian' | 'ricker';

/**
 * The source waveform, by kind (README "Scenario file"), with every default filled in:
 * `gaussian` I = A·exp(−((t−t0)/τ)²); `modulated-gaussian` the same times sin(2πf0(t−t0));
 * `ricker` I = A(1 − 2π²f0²(t−t0)²)·exp(−π²f0²(t−t0)²). f0 in Hz, τ and t0 in s.
 */
export type Waveform =
  | { kind: 'gaussian'; tau: number; t0: number }
  | { kind: 'modulated-gaussian'; f0: number; tau: number; t0: number }
  | { kind: 'ricker'; f0: number; t0: number };

/** A waveform as written, before defaults: the fields its kind needs, others may be absent. */
export interface WaveformInput { kind: WaveformKind; f0?: number; tau?: number; t0?: number }

export interface Grid { nx: number; ny: number; dx: number; dy: number; courant: number }
/**
 * A pole of a dispersive medium (README "Materials"), with the e^{+jωt} convention:
 * debye   Δε/(1 + jωτ);  drude −ωp²/(ω² − jωγ);  lorentz Δε·ω0²/(ω0² + 2jωδ − ω²).
 * Angular frequencies in rad/s, times in s.
 */
export type Pole =
  | { kind: 'debye'; deltaEps: number; tau: number }
  | { kind: 'drude'; omegaP: number; gamma: number }
  | { kind: 'lorentz'; deltaEps: number; omega0: number; delta: number };
export type PoleKind = Pole['kind'];

/**
 * A homogeneous medium: `epsR` is ε∞ (the permittivity at infinite frequency), `sigma` the
 * static conductivity in S/m, `poles` at most six dispersion poles. μ = μ0 throughout.
 * `sigma` and `poles` are left out (undefined) when the file leaves them out, so a
 * scenario without them writes back exactly as it was read.
 */
export interface Medium { epsR: number; sigma?: number; poles?: Pole[] }

/** Field polarization of the 2D grid: TMz (Ez, Hx, Hy) or TEz (Hz, Ex, Ey). */
export type Polarization = 'TMz' | 'TEz';

/** How objects enter the grid (README "Objects"). */
export type Fill = 'staircase' | 'average' | 'conformal';

/** What an object is made of: perfect electric conductor, or a medium (epsR defaults to 1). */
export type Material = 'pec' | Medium;

interface ObjectBase { name?: string; material: Material }
export interface CircleObject extends ObjectBase { shape: 'circle'; x: number; y: number; radius: number }
export interface RectangleObject extends ObjectBase { shape: 'rectangle'; x0: number; y0: number; x1: number; y1: number }
export interface PolygonObject extends ObjectBase { shape: 'polygon'; points: [number, number][] }
/** An object in the grid, in metres. Later objects overlap earlier ones. */
export type SceneObject = CircleObject | RectangleObject | PolygonObject;
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
  /** Default TMz; left out (undefined) when the file leaves it out. */
  polarization?: Polarization;
  /** Default none; left out when the file leaves it out. */
  objects?: SceneObject[];
  /** Default staircase; left out when the file leaves it out. */
  fill?: Fill;
}

/** One problem found in a scenario: the full path of the field and a message with the fix. */
export interface Problem { path: string; message: string }

export type ParseResult =
  | { ok: true; scenario: Scenario }
  | { ok: false; problems: Problem[] };
