/**
 * Rules that tie scenario fields together (docs/scenario.md "Format 1"): the grid must hold the
 * absorber and an interior, the Courant number must be within the stability limit, the
 * waveform must carry the fields its kind needs and no others, names must be unique,
 * frequencies must be below 1/(2·dt), everything placed must sit in the interior, and the
 * run must fit in memory. Each rule runs only when the fields it reads passed the schema
 * (and any earlier rule), so one mistake does not set off a cascade of follow-on messages.
 */
import { engineMemoryBytes, MEMORY_CAP_BYTES } from './memory.ts';
import { lineNodes, snapIndex, stabilityLimit, timeStep, waveSpeed } from './layout.ts';
import type { PathSegment } from './path.ts';
import { pathsOverlap } from './path.ts';
import { ABSORBER_DEFAULTS, MEDIUM_DEFAULTS, POLE_FIELDS } from './schema.ts';
import { approx, floorTo4Decimals, quote, showBytes, tidy } from './show.ts';

/** A problem before its path is written out. */
export interface RawProblem { path: PathSegment[]; message: string }

/** Reads fields of the raw (unvalidated) scenario, but only those known to be valid. */
export class FieldReader {
  private readonly invalid: PathSegment[][] = [];

  constructor(private readonly raw: unknown) {}

  /** Record that a field (and everything inside it) failed a check. */
  markInvalid(path: PathSegment[]): void {
    this.invalid.push(path);
  }

  isValid(path: PathSegment[]): boolean {
    return !this.invalid.some((p) => pathsOverlap(p, path));
  }

  /** The raw value at `path`, reading own properties only; undefined when absent. */
  get(path: PathSegment[]): unknown {
    let v: unknown = this.raw;
    for (const s of path) {
      if (v === null || typeof v !== 'object') return undefined;
      if (!Object.prototype.hasOwnProperty.call(v, s)) return undefined;
      v = (v as Record<PathSegment, unknown>)[s];
    }
    return v;
  }

  /** A valid number at `path`; `fallback` when the field is absent (a schema default). */
  number(path: PathSegment[], fallback?: number): number | undefined {
    if (!this.isValid(path)) return undefined;
    const v = this.get(path);
    if (v === undefined) return fallback;
    return typeof v === 'number' && Number.isFinite(v) ? v : undefined;
  }

  string(path: PathSegment[]): string | undefined {
    if (!this.isValid(path)) return undefined;
    const v = this.get(path);
    return typeof v === 'string' ? v : undefined;
  }

  /** Number of entries when the field holds a list, else 0. */
  count(path: PathSegment[]): number {
    const v = this.get(path);
    return Array.isArray(v) ? v.length : 0;
  }
}

/** Above this many candidate nodes a line is counted by formula rather than walked. */
const LINE_WALK_LIMIT = 100_000;

/** Apply every cross-field rule, in order; each marks what it finds invalid. */
export function crossFieldProblems(r: FieldReader): RawProblem[] {
  const out: RawProblem[] = [];
  const report = (path: PathSegment[], message: string) => {
    out.push({ path, message });
    r.markInvalid(path);
  };
  checkGridHoldsAbsorber(r, report);
  checkStability(r, report);
  checkWaveformFields(r, report);
  checkPoles(r, report, ['medium']);
  for (let i = 0; i < r.count(['objects']); i++) checkPoles(r, report, ['objects', i, 'material']);
  checkFrequencies(r, report);
  checkUniqueNames(r, report);
  checkInterior(r, report);
  checkMemory(r, report);
  return out;
}

type Report = (path: PathSegment[], message: string) => void;

function checkGridHoldsAbsorber(r: FieldReader, report: Report): void {
  const nx = r.number(['grid', 'nx']);
  const ny = r.number(['grid', 'ny']);
  const cells = r.number(['absorber', 'cells'], ABSORBER_DEFAULTS.cells);
  if (nx === undefined || ny === undefined || cells === undefined) return;
  const need = 3 + 2 * cells;
  const noInterior = nx - 2 * cells < 1 || ny - 2 * cells < 1;
  for (const [axis, n] of [['nx', nx], ['ny', ny]] as const) {
    if (n >= need) continue;
    report(['grid', axis], `${n} nodes are too few for ${cells} absorber cells on each side; ${axis} must be at least 3 + 2·${cells} = ${need}, so use ${need} or more, or fewer absorber cells`);
  }
  if (noInterior) {
    const most = Math.max(0, Math.floor((Math.min(nx, ny) - 3) / 2));
    report(['absorber', 'cells'], `${cells} cells on each side leave no interior nodes on a ${nx} × ${ny} grid; use at most ${most} cells, or a larger grid`);
  }
}

function checkStability(r: FieldReader, report: Report): void {
  const dx = r.number(['grid', 'dx']);
  const dy = r.number(['grid', 'dy']);
  const courant = r.number(['grid', 'courant']);
  if (dx === undefined || dy === undefined || courant === undefined) return;
  const limit = stabilityLimit(dx, dy);
  // Relative slack so the limit typed out in full (0.7071067811865476) is accepted.
  if (courant <= limit * (1 + 1e-12)) return;
  const rounded = approx(limit);
  const shown = Number(rounded) < courant ? rounded : String(limit);
  report(['grid', 'courant'], `${courant} is above the 2D stability limit ${shown} for these cells; use ${floorTo4Decimals(limit)} or less`);
}

function checkWaveformFields(r: FieldReader, report: Report): void {
  const base = ['source', 'waveform'];
  const kind = r.string([...base, 'kind']);
  if (kind === undefined) return;
  const has = (field: string) => r.get([...base, field]) !== undefined;
  const valid = (field: string) => r.isValid([...base, field]);
  const needs = kind === 'gaussian' ? 'tau' : 'f0';
  if (!has(needs)) {
    report([...base, needs], needs === 'tau'
      ? `required for a gaussian waveform; give the Gaussian width τ in seconds, e.g. 1e-10`
      : `required for a ${kind} waveform; give the centre frequency in Hz, e.g. 1e10`);
  }
  if (kind === 'gaussian' && has('f0') && valid('f0')) {
    report([...base, 'f0'], 'does not apply to a gaussian waveform, which takes tau and t0; remove f0, or use kind "modulated-gaussian" for a pulse with a centre frequency');
  }
  if (kind === 'ricker' && has('tau') && valid('tau')) {
    report([...base, 'tau'], 'does not apply to a ricker waveform, whose width follows from f0; remove tau');
  }
}

/** What each pole field means, for "required" messages. */
const POLE_FIELD_HINTS: Record<string, string> = {
  deltaEps: 'the strength Δε, e.g. 10', tau: 'the relaxation time τ in seconds, e.g. 8e-12', omegaP: 'the plasma frequency ωp in rad/s, e.g. 1.2e16',
  gamma: 'the collision rate γ in 1/s, e.g. 1e14', omega0: 'the resonance frequency ω0 in rad/s, e.g. 4e15', delta: 'the damping δ in 1/s, e.g. 1e14',
};
/** Fields a pole kind needs (others of its kind default to 0). */
const POLE_REQUIRED: Record<string, readonly string[]> = { debye: ['deltaEps', 'tau'], drude: ['omegaP'], lorentz: ['deltaEps', 'omega0'] };

/** Each pole carries the fields its kind needs and no field of another kind. */
function checkPoles(r: FieldReader, report: Report, medium: PathSegment[]): void {
  const list = [...medium, 'poles'];
  for (let k = 0; k < r.count(list); k++) {
    const base = [...list, k];
    const kind = r.string([...base, 'kind']);
    if (kind === undefined || !(kind in POLE_FIELDS)) continue;
    const fields = POLE_FIELDS[kind as keyof typeof POLE_FIELDS];
    for (const name of POLE_REQUIRED[kind]) {
      if (r.get([...base, name]) === undefined) report([...base, name], `required for a ${kind} pole; give ${POLE_FIELD_HINTS[name]}`);
    }
    for (const name of Object.keys(POLE_FIELD_HINTS)) {
      if (!fields.includes(name) && r.get([...base, name]) !== undefined && r.isValid([...base, name])) {
        report([...base, name], `does not apply to a ${kind} pole, which takes ${fields.join(' and ')}; remove ${name}`);
      }
    }
  }
}

/** Time step in seconds when every field it depends on is valid. */
function validTimeStep(r: FieldReader): number | undefined {
  const dx = r.number(['grid', 'dx']);
  const dy = r.number(['grid', 'dy']);
  const courant = r.number(['grid', 'courant']);
  const epsR = r.number(['medium', 'epsR'], MEDIUM_DEFAULTS.epsR);
  if (dx === undefined || dy === undefined || courant === undefined || epsR === undefined) return undefined;
  return timeStep(courant, dx, dy, epsR);
}

function checkFrequencies(r: FieldReader, report: Report): void {
  const dt = validTimeStep(r);
  if (dt === undefined) return;
  const highest = 1 / (2 * dt);
  const dx = r.number(['grid', 'dx']) as number;
  const dy = r.number(['grid', 'dy']) as number;
  const epsR = r.number(['medium', 'epsR'], MEDIUM_DEFAULTS.epsR) as number;
  for (let k = 0; k < r.count(['frequencies']); k++) {
    const f = r.number(['frequencies', k]);
    if (f === undefined || f < highest) continue;
    // a frequency far above what cells of 10 cm or more resolve is most often millimetres typed as metres
    const d = Math.max(dx, dy);
    const cells = waveSpeed(epsR) / f / d;
    const slip = d >= 0.1 && cells < 1 && cells * 1000 >= 5 ? ` (grid.dx/dy of ${approx(d)} m is ${approx(cells)} cells per wavelength at ${f} Hz: did you mean ${approx(d)} mm, i.e. ${approx(d / 1000)} m?)` : '';
    report(['frequencies', k], `${f} Hz is not below 1/(2·dt) = ${approx(highest)} Hz, the highest frequency this time step can sample${slip}; use a lower frequency, or smaller cells or Courant number`);
  }
}

function checkUniqueNames(r: FieldReader, report: Report): void {
  const seen = new Map<string, PathSegment[]>();
  for (const list of ['probes', 'lines'] as const) {
    for (let k = 0; k < r.count([list]); k++) {
      const path = [list, k, 'name'];
      const name = r.string(path);
      if (name === undefined) continue;
      const first = seen.get(name);
      if (first === undefined) { seen.set(name, path); continue; }
      const firstOwner = `${String(first[0])}[${String(first[1])}]`;
      report(path, `${quote(name)} is already the name of ${firstOwner}; give every probe and line its own name`);
    }
  }
}

function checkInterior(r: FieldReader, report: Report): void {
  const nx = r.number(['grid', 'nx']);
  const ny = r.number(['grid', 'ny']);
  const dx = r.number(['grid', 'dx']);
  const dy = r.number(['grid', 'dy']);
  const cells = r.number(['absorber', 'cells'], ABSORBER_DEFAULTS.cells);
  if (nx === undefined || ny === undefined || dx === undefined || dy === undefined || cells === undefined) return;
  const axes = {
    x: { d: dx, n: nx, index: 'i' },
    y: { d: dy, n: ny, index: 'j' },
  };
  const place = (path: PathSegment[], axis: 'x' | 'y') => {
    const v = r.number(path);
    if (v === undefined) return;
    const { d, n, index } = axes[axis];
    const k = snapIndex(v, d);
    const lo = cells;
    const hi = n - 1 - cells;
    if (k >= lo && k <= hi) return;
    const where = k < 0 || k > n - 1 ? 'outside the grid' : 'in the absorber layer';
    const snapped = Number.isFinite(k) ? ` (nearest node ${index} = ${k})` : '';
    const field = String(path[path.length - 1]);
    report(path, `${v} m lies ${where}${snapped}; keep ${field} between ${tidy(lo * d)} m and ${tidy(hi * d)} m, the interior nodes ${index} = ${lo} to ${hi}`);
  };
  place(['source', 'x'], 'x');
  place(['source', 'y'], 'y');
  for (let k = 0; k < r.count(['probes']); k++) {
    place(['probes', k, 'x'], 'x');
    place(['probes', k, 'y'], 'y');
  }
  for (let k = 0; k < r.count(['lines']); k++) {
    place(['lines', k, 'x0'], 'x');
    place(['lines', k, 'y0'], 'y');
    place(['lines', k, 'x1'], 'x');
    place(['lines', k, 'y1'], 'y');
  }
}

/**
 * Nodes of the valid lines. A line with an invalid end is not counted, so the total is a
 * lower bound, and a memory estimate above the cap is certain even when some lines are wrong.
 */
function validLineNodeCount(r: FieldReader): number {
  const dx = r.number(['grid', 'dx']);
  const dy = r.number(['grid', 'dy']);
  if (dx === undefined || dy === undefined) return 0;
  let total = 0;
  for (let k = 0; k < r.count(['lines']); k++) {
    const [x0, y0, x1, y1] = ['x0', 'y0', 'x1', 'y1'].map((f) => r.number(['lines', k, f]));
    if (x0 === undefined || y0 === undefined || x1 === undefined || y1 === undefined) continue;
    const span = Math.max(
      Math.abs(snapIndex(x1, dx) - snapIndex(x0, dx)),
      Math.abs(snapIndex(y1, dy) - snapIndex(y0, dy)),
    ) + 1;
    total += span <= LINE_WALK_LIMIT ? lineNodes(x0, y0, x1, y1, dx, dy).length : span;
  }
  return total;
}

function checkMemory(r: FieldReader, report: Report): void {
  const nx = r.number(['grid', 'nx']);
  const ny = r.number(['grid', 'ny']);
  const cells = r.number(['absorber', 'cells'], ABSORBER_DEFAULTS.cells);
  const steps = r.number(['steps']);
  if (nx === undefined || ny === undefined || cells === undefined || steps === undefined) return;
  const probes = r.count(['probes']);
  const input = {
    nx, ny, cells, steps, probes,
    dftPoints: probes + validLineNodeCount(r),
    frequencies: r.count(['frequencies']),
    fullGridDft: false,
  };
  const bytes = engineMemoryBytes(input);
  if (bytes <= MEMORY_CAP_BYTES) return;
  const gridOnly = engineMemoryBytes({ ...input, steps: 0, probes: 0, dftPoints: 0, frequencies: 0 });
  const gridFits = gridOnly <= MEMORY_CAP_BYTES;
  const need = `a ${nx} × ${ny} grid run for ${steps} steps needs about ${showBytes(bytes)}, above the cap of ${showBytes(MEMORY_CAP_BYTES)}`;
  // one problem, reported at both sizes it depends on, each saying what to change along its own axis
  const fix = (axis: 'x' | 'y', other: string) => (gridFits
    ? `use a smaller grid (fewer nodes along ${axis}, or along ${other}), or fewer steps, probes, line points or frequencies`
    : `use a smaller grid: fewer nodes along ${axis} (or along ${other}), for example larger cells`);
  report(['grid', 'nx'], `${need}; ${fix('x', 'y: grid.ny')}`);
  report(['grid', 'ny'], `the same grid as grid.nx: ${need}; ${fix('y', 'x: grid.nx')}`);
  if (gridFits) report(['steps'], `${need}; the fields fit, but the stored time series and running DFTs do not; use fewer steps, probes, line points or frequencies`);
}
