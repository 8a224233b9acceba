/**
 * Figures the set-up form shows beside its fields, worked out here so that no component
 * does domain arithmetic: the memory of a run together with its error maps, how many error
 * maps fit under the cap, the run-time estimate, the stability limit and waveform defaults
 * while other fields are still wrong, the f0 ↔ τ pairing when the waveform kind changes,
 * and where a new probe or line goes. Functions named "…OfDraft" read a raw draft (the
 * page's unvalidated scenario object, SI units) and give undefined where the fields they
 * need are missing or not positive; the others take valid figures.
 */
import type { DerivedQuantities } from './derived.ts';
import { stabilityLimit } from './layout.ts';
import { MEMORY_CAP_BYTES } from './memory.ts';
import type { Waveform, WaveformKind } from './types.ts';
import { withWaveformDefaults } from './waveforms.ts';

const KINDS: readonly WaveformKind[] = ['gaussian', 'modulated-gaussian', 'ricker'];

/** The value at a path of a raw draft, or undefined when a step is missing. */
function read(raw: unknown, path: readonly (string | number)[]): unknown {
  let v: unknown = raw;
  for (const s of path) {
    if (v === null || typeof v !== 'object' || !Object.prototype.hasOwnProperty.call(v, s)) return undefined;
    v = (v as Record<string | number, unknown>)[s];
  }
  return v;
}

/** A finite number above 0 at `path`, else undefined. */
function positive(raw: unknown, path: readonly (string | number)[]): number | undefined {
  const v = read(raw, path);
  return typeof v === 'number' && Number.isFinite(v) && v > 0 ? v : undefined;
}

/** A finite number at `path` (any sign), else undefined. */
function finite(raw: unknown, path: readonly (string | number)[]): number | undefined {
  const v = read(raw, path);
  return typeof v === 'number' && Number.isFinite(v) ? v : undefined;
}

/** A computed figure to `digits` significant digits, so 1/1e10 is written 1e-10, not 1.0000000000000001e-10. */
function rounded(x: number, digits: number): number {
  return Number(x.toPrecision(digits));
}

/**
 * Bytes of one full-grid running DFT, the accumulator behind one error map: two float32
 * (real and imaginary part) per Ez node, 8·nx·ny (the engine's layout, src/scenario/memory.ts;
 * the engine starts each of its two arrays on a 64-byte line, so its own figure can be up to
 * 126 bytes more).
 *
 * @example
 * fullGridDftBytes(300, 300); // 720000
 */
export function fullGridDftBytes(nx: number, ny: number): number {
  return 8 * nx * ny;
}

/**
 * How many error maps fit beside a run under the memory cap: the largest k ≤ `frequencies`
 * with runBytes + k·8·nx·ny ≤ capBytes. Maps go to the analysis frequencies first-first,
 * so the result is how many of the first frequencies get one. Bytes in, a count out; 0
 * when the run alone reaches the cap or there are no frequencies.
 *
 * @example
 * errorMapsThatFit(1.2e6, 300, 300, 3); // 3
 */
export function errorMapsThatFit(runBytes: number, nx: number, ny: number, frequencies: number, capBytes = MEMORY_CAP_BYTES): number {
  const each = fullGridDftBytes(nx, ny);
  if (!(frequencies > 0) || !(each > 0) || !(runBytes <= capBytes)) return 0;
  return Math.max(0, Math.min(Math.floor(frequencies), Math.floor((capBytes - runBytes) / each)));
}

/** Memory of a page run: the engine's run (what `gridgauge check` reports) and the error maps on top, bytes. */
export interface RunMemory {
  /** Fields, absorber, source table, probe series and running DFTs: `memory_bytes` of `check`. */
  run_bytes: number;
  /** Error maps accumulated with the run. */
  maps: number;
  /** maps · 8·nx·ny. */
  errorMaps_bytes: number;
  total_bytes: number;
}

/**
 * The memory a run in the page takes with `maps` error maps (its full-grid running DFTs),
 * split so the page can say why its figure is above the command line's. `maps` is clipped
 * to what fits under the cap (see {@link errorMapsThatFit}).
 *
 * @example
 * runMemory(deriveQuantities(demoScenario()), 1).errorMaps_bytes; // 720000
 */
export function runMemory(d: DerivedQuantities, maps: number): RunMemory {
  const k = Math.max(0, Math.min(Math.floor(maps), d.errorMapsFitting));
  const errorMaps = k * d.fullGridDft_bytes;
  return { run_bytes: d.memory_bytes, maps: k, errorMaps_bytes: errorMaps, total_bytes: d.memory_bytes + errorMaps };
}

/**
 * Wall-clock estimate of the stepping, s: the scenario's Ez-node updates (nx·ny·steps) over
 * a measured or assumed rate in node updates per second. NaN for a rate that is not positive.
 *
 * @example
 * runTimeEstimate(deriveQuantities(demoScenario()), 150e6); // 0.72
 */
export function runTimeEstimate(d: DerivedQuantities, nodeUpdatesPerSecond: number): number {
  return nodeUpdatesPerSecond > 0 ? d.nodeUpdates / nodeUpdatesPerSecond : NaN;
}

/**
 * The 2D stability limit on the Courant number from a draft's dx and dy alone, so the form
 * can show it while other fields are wrong: 1/(min(dx,dy)·√(1/dx² + 1/dy²)) (Taflove &
 * Hagness, Computational Electrodynamics, 3rd ed., §4.7). Undefined without valid cells.
 *
 * @example
 * stabilityLimitOfDraft({ grid: { dx: 1e-3, dy: 1e-3 } }); // 0.7071067811865475
 */
export function stabilityLimitOfDraft(raw: unknown): number | undefined {
  const dx = positive(raw, ['grid', 'dx']);
  const dy = positive(raw, ['grid', 'dy']);
  return dx && dy ? stabilityLimit(dx, dy) : undefined;
}

/**
 * A draft's waveform with its defaults filled in (README "Scenario file": τ = 1/f0 and
 * t0 = 5τ for the modulated Gaussian, t0 = 5τ for the Gaussian, t0 = 2/f0 for Ricker), when
 * its kind is known and the fields that kind needs are positive; undefined otherwise. A t0
 * that is not a number is left to the default.
 *
 * @example
 * waveformOfDraft({ source: { waveform: { kind: 'ricker', f0: 1e9 } } }); // { kind: 'ricker', f0: 1e9, t0: 2e-9 }
 */
export function waveformOfDraft(raw: unknown): Waveform | undefined {
  const base = ['source', 'waveform'];
  const kind = read(raw, [...base, 'kind']);
  if (!KINDS.includes(kind as WaveformKind)) return undefined;
  const f0 = positive(raw, [...base, 'f0']);
  const tau = positive(raw, [...base, 'tau']);
  const t0 = finite(raw, [...base, 't0']);
  if (kind === 'gaussian' ? tau === undefined : f0 === undefined) return undefined;
  return withWaveformDefaults({ kind: kind as WaveformKind, f0, tau: kind === 'ricker' ? undefined : tau, t0 });
}

/**
 * The defaults a draft's waveform would take for the fields left out, s: τ (modulated
 * Gaussian: 1/f0) and t0, for the form's placeholders. A field with no default for the
 * kind, or whose inputs are missing, is absent.
 *
 * @example
 * waveformDefaultsOfDraft({ source: { waveform: { kind: 'modulated-gaussian', f0: 1e10 } } }); // { tau: 1e-10, t0: 5e-10 }
 */
export function waveformDefaultsOfDraft(raw: unknown): { tau?: number; t0?: number } {
  const base = ['source', 'waveform'];
  const kind = read(raw, [...base, 'kind']);
  const f0 = positive(raw, [...base, 'f0']);
  const tau = positive(raw, [...base, 'tau']);
  if (kind === 'gaussian') return tau ? { t0: 5 * tau } : {};
  if (kind === 'ricker') return f0 ? { t0: 2 / f0 } : {};
  if (kind === 'modulated-gaussian') {
    const width = tau ?? (f0 ? 1 / f0 : undefined);
    return { ...(f0 ? { tau: 1 / f0 } : {}), ...(width ? { t0: 5 * width } : {}) };
  }
  return {};
}

/**
 * The waveform fields after switching a draft's waveform to `kind`: the fields the new
 * kind takes, carried over or converted, and t0 left out so it takes the new kind's
 * default. The conversion pairs f0 and τ as the modulated Gaussian does by default,
 * τ = 1/f0 (README "Scenario file"), to 6 significant digits; a field the new kind refuses
 * is dropped (f0 for the Gaussian, τ for Ricker). Hz and s.
 *
 * @example
 * waveformForKind({ source: { waveform: { kind: 'ricker', f0: 1e9 } } }, 'gaussian'); // { kind: 'gaussian', tau: 1e-9 }
 */
export function waveformForKind(raw: unknown, kind: WaveformKind): { kind: WaveformKind; f0?: number; tau?: number } {
  const f0 = positive(raw, ['source', 'waveform', 'f0']);
  const tau = positive(raw, ['source', 'waveform', 'tau']);
  const inverse = (x: number | undefined) => (x === undefined ? undefined : rounded(1 / x, 6));
  if (kind === 'gaussian') return { kind, tau: tau ?? inverse(f0) };
  if (kind === 'ricker') return { kind, f0: f0 ?? inverse(tau) };
  return { kind, f0: f0 ?? inverse(tau), ...(tau !== undefined ? { tau } : {}) };
}

/**
 * Where a new probe goes, m: a sixth of the interior to the right of the source, on the
 * source's row, kept inside the interior (i ≤ nx − 1 − cells) and on a whole node. Missing
 * grid fields fall back to 1 mm cells, 100 nodes and 10 absorber cells.
 *
 * @example
 * newProbeSpot(demoScenario()); // [0.197, 0.15]
 */
export function newProbeSpot(raw: unknown): [number, number] {
  const dx = positive(raw, ['grid', 'dx']) ?? 1e-3;
  const nx = positive(raw, ['grid', 'nx']) ?? 100;
  const cells = finite(raw, ['absorber', 'cells']) ?? 10;
  const sx = finite(raw, ['source', 'x']) ?? 0;
  const sy = finite(raw, ['source', 'y']) ?? 0;
  const x = Math.min(sx + Math.round((nx - 2 * cells) / 6) * dx, (nx - 1 - cells) * dx);
  return [rounded(x, 12), sy];
}

/**
 * Where a new probe line goes, m: from 5 cells right of the source to the new-probe spot,
 * along the source's row.
 *
 * @example
 * newLineSpot(demoScenario()); // { x0: 0.155, y0: 0.15, x1: 0.197, y1: 0.15 }
 */
export function newLineSpot(raw: unknown): { x0: number; y0: number; x1: number; y1: number } {
  const [x1, y] = newProbeSpot(raw);
  const dx = positive(raw, ['grid', 'dx']) ?? 1e-3;
  const sx = finite(raw, ['source', 'x']) ?? 0;
  return { x0: rounded(sx + 5 * dx, 12), y0: y, x1, y1: y };
}

/**
 * A frequency to add after the draft's last analysis frequency, Hz: 1.5 times the last, or
 * 1.5 times `fallbackHz` (the centre frequency) when there is none, or 1.5 GHz.
 *
 * @example
 * nextAnalysisFrequency({ frequencies: [1e10] }); // 1.5e10
 */
export function nextAnalysisFrequency(raw: unknown, fallbackHz?: number): number {
  const list = read(raw, ['frequencies']);
  const last = Array.isArray(list) && list.length ? list[list.length - 1] : fallbackHz;
  const base = typeof last === 'number' && Number.isFinite(last) && last > 0 ? last : 1e9;
  return rounded(base * 1.5, 6);
}
