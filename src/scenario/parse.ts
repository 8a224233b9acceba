/**
 * Reading a scenario from untrusted input (a file, a link, a form): JSON text to checked
 * `Scenario`, or the full list of problems, each with the path of the field and a message
 * that says what to write instead. Neither function throws, whatever it is given.
 */
import { withWaveformDefaults } from './waveforms.ts';
import { objectProblems } from './object-rules.ts';
import { poleStabilityProblems } from './media-rules.ts';
import { estimateMemoryBytes, runsOnMediaEngine } from './memory-estimate.ts';
import { MEMORY_CAP_BYTES } from './memory.ts';
import { showBytes } from './show.ts';
import { closestName } from './did-you-mean.ts';
import { locateJsonError } from './json-error.ts';
import type { PathSegment } from './path.ts';
import { renderPath } from './path.ts';
import type { RawProblem } from './rules.ts';
import { crossFieldProblems, FieldReader } from './rules.ts';
import type { ScenarioFromSchema } from './schema.ts';
import { FIELD_OWNERS, FORMAT_NAME, FORMAT_VERSION, knownFieldsAt, scenarioSchema, versionMessage } from './schema.ts';
import type { Medium, ParseResult, Pole, Problem, Scenario, SceneObject } from './types.ts';

/** Path used for problems with the text as a whole (empty, malformed JSON). */
export const FILE_PATH = '(file)';
/** Path used for problems with the value as a whole (not an object, unreadable). */
export const SCENARIO_PATH = '(scenario)';
/** Largest scenario file read, bytes: a scenario is a few kilobytes of JSON (the CLI and the page refuse bigger files). */
export const SCENARIO_FILE_CAP_BYTES = 5 * 1024 * 1024;
/** At most this many problems are listed; a garbage file should not flood the screen. */
export const MAX_PROBLEMS = 100;

/**
 * Parse the text of a scenario file and validate it.
 *
 * @example
 * const r = parseScenarioText(readFileSync('examples/demo.json', 'utf8'));
 * if (!r.ok) for (const p of r.problems) console.error(formatProblem(p));
 */
export function parseScenarioText(text: string): ParseResult {
  try {
    if (typeof text !== 'string') return fail(FILE_PATH, `expected the text of a scenario file but found ${typeof text}`);
    const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text; // editors on Windows add a byte-order mark
    if (body.trim() === '') return fail(FILE_PATH, 'is empty; a scenario file holds one JSON object, see examples/demo.json');
    let value: unknown;
    try {
      value = JSON.parse(body);
    } catch (e) {
      const where = locateJsonError(body);
      if (where === undefined) return fail(FILE_PATH, `is not valid JSON (${errorText(e)}); check the file with a JSON validator`);
      return fail(FILE_PATH, `malformed JSON at line ${where.line}, column ${where.column}: ${where.reason}`);
    }
    return validateScenario(value);
  } catch (e) {
    return fail(FILE_PATH, `could not be read (${errorText(e)}); save it as UTF-8 JSON text`);
  }
}

/**
 * Validate a value (parsed JSON, or an object built by the page) against format 1 and
 * fill in the defaults.
 *
 * @example
 * validateScenario({ grid: {…}, source: {…}, frequencies: [1e10], steps: 1200 });
 */
export function validateScenario(value: unknown): ParseResult {
  try {
    return validate(value);
  } catch (e) {
    // Getters that throw, proxies and the like: plain data never gets here.
    return fail(SCENARIO_PATH, `could not be read (${errorText(e)}); pass plain data as read from a JSON file`);
  }
}

/** One problem as a line of text: `grid.courant: 0.75 is above …`. */
export function formatProblem(p: Problem): string {
  return `${p.path}: ${p.message}`;
}

function validate(value: unknown): ParseResult {
  if (value === null || typeof value !== 'object' || Array.isArray(value)) {
    return fail(SCENARIO_PATH, `expected a scenario object { "grid", "source", "steps", … } but found ${kindOf(value)}; see examples/demo.json`);
  }
  const version = Object.prototype.hasOwnProperty.call(value, 'version') ? (value as { version: unknown }).version : undefined;
  if (typeof version === 'number' && Number.isInteger(version) && version > FORMAT_VERSION) {
    // A newer file may use fields this build has never heard of: judging them would only mislead.
    return fail('version', versionMessage(version));
  }
  const parsed = scenarioSchema.safeParse(value);
  const reader = new FieldReader(value);
  const problems: RawProblem[] = [];
  if (!parsed.success) {
    for (const issue of parsed.error.issues) {
      if (issue.code === 'unrecognized_keys') {
        for (const key of issue.keys) problems.push(unknownField(issue.path as PathSegment[], key));
      } else {
        const path = issue.path as PathSegment[];
        problems.push({ path, message: issue.message });
        reader.markInvalid(path);
      }
    }
  }
  problems.push(...crossFieldProblems(reader));
  if (problems.length > 0 || !parsed.success) return { ok: false, problems: finish(problems) };
  const scenario = toScenario(parsed.data);
  // objects are judged against the whole scenario (absorber, source, probes), once all else is valid
  const objectIssues = [...poleStabilityProblems(scenario), ...(scenario.objects ? objectProblems(scenario) : [])];
  if (objectIssues.length > 0) return { ok: false, problems: objectIssues };
  // the media engine's needs (pole states, patches) are known only now
  const bytes = runsOnMediaEngine(scenario) ? estimateMemoryBytes(scenario) : 0;
  if (bytes > MEMORY_CAP_BYTES) {
    return { ok: false, problems: [{ path: 'grid.nx', message: `a ${scenario.grid.nx} × ${scenario.grid.ny} grid with this medium and these objects needs about ${showBytes(bytes)}, above the cap of ${showBytes(MEMORY_CAP_BYTES)}; use a smaller grid, fewer poles or steps` }] };
  }
  return { ok: true, scenario };
}

/** Names people reach for that are not fields, with where the quantity is set instead. */
const NOT_FIELDS: Record<string, string> = {
  dt: 'the time step is not given directly; it follows from grid.courant as dt = courant·min(dx, dy)/c',
  timestep: 'the time step is not given directly; it follows from grid.courant as dt = courant·min(dx, dy)/c',
  permittivity: 'did you mean medium.epsR?',
  epsilon: 'did you mean medium.epsR?',
  pml: 'did you mean absorber?',
  cpml: 'did you mean absorber?',
  timesteps: 'did you mean steps?',
  iterations: 'did you mean steps?',
};

function unknownField(owner: PathSegment[], key: string): RawProblem {
  const path = [...owner, key];
  const known = knownFieldsAt(owner) ?? [];
  const near = closestName(key, known);
  if (near !== undefined) return { path, message: `unknown field; did you mean ${renderPath([...owner, near])}?` };
  // The right name in the wrong object: "epsR" inside grid, "f0" directly in source.
  const lower = key.toLowerCase();
  const home = FIELD_OWNERS.find((o) => !o.owner.includes('[]') && o.fields.some((f) => f.toLowerCase() === lower));
  if (home !== undefined) {
    const field = home.fields.find((f) => f.toLowerCase() === lower) as string;
    const where = home.owner === '' ? field : `${home.owner}.${field}`;
    return { path, message: `unknown field here; did you mean ${where}?` };
  }
  const alias = NOT_FIELDS[lower.replace(/[^a-z]/g, '')];
  if (alias !== undefined) return { path, message: `unknown field; ${alias}` };
  const ownerName = owner.length === 0 ? 'a scenario' : renderPath(owner);
  return { path, message: `unknown field; remove it (${ownerName} takes ${known.join(', ')})` };
}

const SECTION_ORDER = ['format', 'version', 'grid', 'medium', 'absorber', 'source', 'probes', 'lines', 'frequencies', 'steps'];

/** Problems in file order (section, then list index), capped, with paths written out. */
function finish(raw: RawProblem[]): Problem[] {
  const rank = (p: RawProblem) => {
    const section = SECTION_ORDER.indexOf(String(p.path[0]));
    return section === -1 ? SECTION_ORDER.length : section;
  };
  const index = (p: RawProblem) => (typeof p.path[1] === 'number' ? p.path[1] : -1);
  const sorted = raw
    .map((p, order) => ({ p, order }))
    .sort((a, b) => rank(a.p) - rank(b.p) || index(a.p) - index(b.p) || a.order - b.order)
    .map(({ p }) => ({ path: p.path.length === 0 ? SCENARIO_PATH : renderPath(p.path), message: p.message }));
  if (sorted.length <= MAX_PROBLEMS) return sorted;
  const more = sorted.length - (MAX_PROBLEMS - 1);
  return [...sorted.slice(0, MAX_PROBLEMS - 1), { path: SCENARIO_PATH, message: `${more} more problems not listed; fix the ones above first` }];
}

type RawPole = { kind: Pole['kind']; deltaEps?: number; tau?: number; omegaP?: number; gamma?: number; omega0?: number; delta?: number };
type RawMedium = { epsR: number; sigma?: number; poles?: RawPole[] };

/** A pole with its kind's fields only (the rules have checked they are there), in a fixed order. */
function toPole(p: RawPole): Pole {
  switch (p.kind) {
    case 'debye': return { kind: 'debye', deltaEps: p.deltaEps as number, tau: p.tau as number };
    case 'drude': return { kind: 'drude', omegaP: p.omegaP as number, gamma: p.gamma ?? 0 };
    case 'lorentz': return { kind: 'lorentz', deltaEps: p.deltaEps as number, omega0: p.omega0 as number, delta: p.delta ?? 0 };
  }
}

/** A medium as read: conductivity and poles only when the file gives them, so it writes back as it was. */
function toMedium(m: RawMedium): Medium {
  return {
    epsR: m.epsR,
    ...(m.sigma !== undefined ? { sigma: m.sigma } : {}),
    ...(m.poles !== undefined ? { poles: m.poles.map(toPole) } : {}),
  };
}

function toObject(o: SceneObject): SceneObject {
  const material = o.material === 'pec' ? 'pec' : toMedium(o.material as RawMedium);
  const name = o.name !== undefined ? { name: o.name } : {};
  switch (o.shape) {
    case 'circle': return { ...name, shape: 'circle', x: o.x, y: o.y, radius: o.radius, material };
    case 'rectangle': return { ...name, shape: 'rectangle', x0: o.x0, y0: o.y0, x1: o.x1, y1: o.y1, material };
    case 'polygon': return { ...name, shape: 'polygon', points: o.points.map(([x, y]) => [x, y]), material };
  }
}

function toScenario(d: ScenarioFromSchema): Scenario {
  const waveform = withWaveformDefaults(d.source.waveform);
  return {
    format: FORMAT_NAME,
    version: FORMAT_VERSION,
    grid: { nx: d.grid.nx, ny: d.grid.ny, dx: d.grid.dx, dy: d.grid.dy, courant: d.grid.courant },
    medium: toMedium(d.medium as RawMedium),
    absorber: {
      cells: d.absorber.cells, order: d.absorber.order, sigmaScale: d.absorber.sigmaScale,
      kappaMax: d.absorber.kappaMax, alphaMax: d.absorber.alphaMax,
    },
    source: { x: d.source.x, y: d.source.y, amplitude: d.source.amplitude, waveform },
    probes: d.probes.map((p) => ({ name: p.name, x: p.x, y: p.y })),
    lines: d.lines.map((l) => ({ name: l.name, x0: l.x0, y0: l.y0, x1: l.x1, y1: l.y1 })),
    frequencies: [...d.frequencies],
    steps: d.steps,
    // optional sections only when given, so a scenario without them reads and writes as before
    ...(d.polarization !== undefined ? { polarization: d.polarization } : {}),
    ...(d.objects !== undefined ? { objects: (d.objects as SceneObject[]).map(toObject) } : {}),
    ...(d.fill !== undefined ? { fill: d.fill } : {}),
  };
}

function fail(path: string, message: string): ParseResult {
  return { ok: false, problems: [{ path, message }] };
}

function kindOf(value: unknown): string {
  if (value === null) return 'null';
  if (Array.isArray(value)) return 'a list';
  if (typeof value === 'string') return 'text';
  return `a ${typeof value}`;
}

/** The text of a thrown value, without letting a hostile toString throw again. */
function errorText(e: unknown): string {
  try {
    return e instanceof Error ? e.message : String(e);
  } catch {
    return 'unknown error';
  }
}
