/**
 * Zod schemas for the scenario file, format 1 (docs/scenario.md).
 * They check each field on its own: type, range, whole numbers, allowed names, unknown
 * keys. Rules that tie fields together (stability limit, absorber against grid size,
 * positions inside the interior, waveform fields per kind, unique names, frequencies below
 * 1/(2·dt), memory) live in rules.ts, because they can only be judged once the fields they
 * depend on are valid. Every message says what to write instead.
 *
 * `format` and `version` may be left out: a hand-written file or an object built by the
 * page is then read as format 1. A file that gives them must give them right.
 */
import * as z from 'zod';
import { closestName } from './did-you-mean.ts';
import { fillSchema, objectsSchema } from './object-schema.ts';
import {
  containerMessage, finiteNumber, listOf, nameField, nameProblem, NAME_MAX_LENGTH, numberAtLeast, objectOf, positiveNumber, wholeNumberAtLeast,
  type FieldHint,
} from './schema-kit.ts';

export { containerMessage, finiteNumber, listOf, nameField, nameProblem, NAME_MAX_LENGTH, type FieldHint };
import type { Medium } from './types.ts';
import { describeValue, quote } from './show.ts';

export const FORMAT_NAME = 'gridgauge-scenario';
export const FORMAT_VERSION = 1;
export const WAVEFORM_KINDS = ['gaussian', 'modulated-gaussian', 'ricker'] as const;
export const POLARIZATIONS = ['TMz', 'TEz'] as const;
export const MEDIUM_DEFAULTS = { epsR: 1 } as const;
export const ABSORBER_DEFAULTS = { cells: 10, order: 3, sigmaScale: 1, kappaMax: 5, alphaMax: 0.05 } as const;
export const AMPLITUDE_DEFAULT = 1;

const waveformKind = z.enum(WAVEFORM_KINDS, {
  error: (iss) => {
    const kinds = WAVEFORM_KINDS.join(', ');
    if (iss.input === undefined) return `required; use one of ${kinds}`;
    if (typeof iss.input !== 'string') return `expected one of ${kinds} but found ${describeValue(iss.input)}`;
    const near = closestName(iss.input, WAVEFORM_KINDS);
    return `${quote(iss.input)} is not a waveform kind; use one of ${kinds}${near ? ` (did you mean ${near}?)` : ''}`;
  },
});

const position = (axis: string): FieldHint => ({ what: `the ${axis} coordinate in metres`, example: '0.15' });

/** Smallest and largest cell size accepted, m: beyond them float32 source scaling overflows. */
export const CELL_SPAN = [1e-9, 1e3] as const;
function inCellSpan(d: number): boolean {
  return !(d > 0) || (d >= CELL_SPAN[0] && d <= CELL_SPAN[1]);
}
const CELL_SPAN_MESSAGE = `is outside the cell sizes the float32 engine holds; use a size between ${CELL_SPAN[0]} m (1 nm) and ${CELL_SPAN[1]} m`;

export const gridSchema = objectOf({
  nx: wholeNumberAtLeast(3, { what: 'the number of Ez nodes along x, absorber layers included', example: '300' }, ', too few nodes for any grid'),
  ny: wholeNumberAtLeast(3, { what: 'the number of Ez nodes along y, absorber layers included', example: '300' }, ', too few nodes for any grid'),
  dx: positiveNumber({ what: 'the cell size along x in metres', example: '0.001' }).refine(inCellSpan, { error: CELL_SPAN_MESSAGE }),
  dy: positiveNumber({ what: 'the cell size along y in metres', example: '0.001' }).refine(inCellSpan, { error: CELL_SPAN_MESSAGE }),
  courant: positiveNumber({ what: 'the Courant number c·dt/min(dx, dy), at most the stability limit (0.7071 for square cells)', example: '0.5' }),
}, 'the grid as { "nx", "ny", "dx", "dy", "courant" }');

/** Most dispersion poles a medium may carry. */
export const MAX_POLES = 6;
export const POLE_KINDS = ['debye', 'drude', 'lorentz'] as const;
/** The fields each pole kind takes besides "kind". */
export const POLE_FIELDS: Record<(typeof POLE_KINDS)[number], readonly string[]> = {
  debye: ['deltaEps', 'tau'],
  drude: ['omegaP', 'gamma'],
  lorentz: ['deltaEps', 'omega0', 'delta'],
};

const poleKind = z.enum(POLE_KINDS, {
  error: (iss) => {
    const kinds = POLE_KINDS.join(', ');
    if (iss.input === undefined) return `required; use one of ${kinds}`;
    if (typeof iss.input !== 'string') return `expected one of ${kinds} but found ${describeValue(iss.input)}`;
    const near = closestName(iss.input, POLE_KINDS);
    return `${quote(iss.input)} is not a pole kind; use one of ${kinds}${near ? ` (did you mean ${near}?)` : ''}`;
  },
});

const nonNegative = (h: FieldHint, why: string) => numberAtLeast(0, h, why);
/** `field` with an upper bound `max` (in `unit`), refused with the reason and the fix. */
const atMost = <T extends z.ZodType<number>>(field: T, max: number, unit: string, why: string) => {
  const u = unit ? ` ${unit}` : '';
  return field.refine((v) => !(v > max), { error: (iss) => `is ${plainNumber(iss.input)}${u}, above the largest accepted ${plainNumber(max)}${u} (${why}); use ${plainNumber(max)}${u} or less` });
};
/** A number as a person would type it: 1e18 rather than 1000000000000000000 or 1e+18. */
const plainNumber = (x: unknown) => (typeof x === 'number' && Math.abs(x) >= 1e4 ? x.toExponential().replace('e+', 'e') : String(x));

const deltaEps = atMost(nonNegative({ what: 'the pole\'s strength Δε (dimensionless), 0 or more', example: '10' }, '; a passive medium has no negative Δε'),
  1e4, '', 'the grid\'s float32 coefficients stay finite below it');

/** One dispersion pole; fields of the other kinds are refused in rules (by kind). */
export const poleSchema = objectOf({
  kind: poleKind,
  deltaEps: deltaEps.optional(),
  tau: atMost(positiveNumber({ what: 'the Debye relaxation time τ in seconds', example: '8e-12' }), 1, 's', 'slower than any relaxation a run could see').optional(),
  omegaP: atMost(positiveNumber({ what: 'the plasma frequency ωp in rad/s', example: '1.2e16' }), 1e18, 'rad/s', 'far above any frequency a grid resolves').optional(),
  gamma: atMost(nonNegative({ what: 'the collision rate γ in 1/s, 0 or more', example: '1e14' }, '; a negative damping makes the medium gain energy'), 1e18, '1/s', 'far above any rate a grid resolves').optional(),
  omega0: atMost(positiveNumber({ what: 'the resonance frequency ω0 in rad/s', example: '4e15' }), 1e18, 'rad/s', 'far above any frequency a grid resolves').optional(),
  delta: atMost(nonNegative({ what: 'the damping δ in 1/s, 0 or more', example: '1e14' }, '; a negative damping makes the medium gain energy'), 1e18, '1/s', 'far above any rate a grid resolves').optional(),
}, 'a pole such as { "kind": "debye", "deltaEps": 10, "tau": 8e-12 }');

export const mediumSchema = objectOf({
  epsR: numberAtLeast(1, { what: 'the relative permittivity εr of the medium (ε∞ with poles), 1 or more', example: '1 for vacuum or air', fallback: 'leave it out for 1' }, ', which no passive medium has')
    .refine((v) => !(v > 1e4), { error: (iss) => `is ${String(iss.input)}, above the largest accepted 1e4 (no common dielectric comes near it); use 1e4 or less` })
    .default(MEDIUM_DEFAULTS.epsR),
  sigma: nonNegative({ what: 'the conductivity σ in S/m, 0 or more', example: '0.01', fallback: 'leave it out for a lossless medium' }, '; a conductivity cannot be negative')
    .refine((v) => !(v > 1e9), { error: (iss) => `is ${String(iss.input)} S/m, above the largest accepted 1e9 (beyond metals); use 1e9 or less, or a "pec" object` })
    .optional(),
  poles: listOf(poleSchema, 'a list of poles [{ "kind": "debye", "deltaEps": 10, "tau": 8e-12 }, …]', 'for none')
    .refine((list) => list.length <= MAX_POLES, { error: (iss) => `holds ${(iss.input as unknown[]).length} poles; use at most ${MAX_POLES}` })
    .optional(),
}, 'the medium as { "epsR": … }', 'for vacuum');

export const absorberSchema = objectOf({
  cells: wholeNumberAtLeast(0, { what: 'the CPML thickness in cells on each side, 0 for none', example: '10', fallback: 'leave it out for 10' }, '; a layer cannot be thinner than 0 cells')
    .default(ABSORBER_DEFAULTS.cells),
  order: numberAtLeast(1, { what: 'the polynomial grading order m of the CPML profile', example: '3', fallback: 'leave it out for 3' }, ', which would make the profile steepest at the inner face')
    .refine((v) => !(v > 20), { error: (iss) => `is ${String(iss.input)}, above the largest accepted 20 (grading beyond that leaves the layer empty); use 20 or less` })
    .default(ABSORBER_DEFAULTS.order),
  sigmaScale: numberAtLeast(0, { what: 'σmax as a multiple of the optimal σ, 0 or more', example: '1', fallback: 'leave it out for 1' }, '; a conductivity cannot be negative')
    .refine((v) => !(v > 100), { error: (iss) => `is ${String(iss.input)}, above the largest accepted 100 (σmax is normally within a few times σopt); use 100 or less` })
    .default(ABSORBER_DEFAULTS.sigmaScale),
  kappaMax: numberAtLeast(1, { what: 'the largest coordinate stretch κmax, 1 or more', example: '5', fallback: 'leave it out for 5' }, '; κ below 1 would shrink the layer')
    .refine((v) => !(v > 1000), { error: (iss) => `is ${String(iss.input)}, above the largest accepted 1000 (useful values are 1 to about 30); use 1000 or less` })
    .default(ABSORBER_DEFAULTS.kappaMax),
  alphaMax: numberAtLeast(0, { what: 'the largest complex frequency shift αmax in S/m, 0 or more', example: '0.05', fallback: 'leave it out for 0.05' }, '; a negative shift makes the layer unstable')
    .refine((v) => !(v > 1000), { error: (iss) => `is ${String(iss.input)}, above the largest accepted 1000 (useful values are 0 to about 1 S/m); use 1000 or less` })
    .default(ABSORBER_DEFAULTS.alphaMax),
}, 'the absorber as { "cells", "order", "sigmaScale", "kappaMax", "alphaMax" }', 'for the defaults');

export const waveformSchema = objectOf({
  kind: waveformKind,
  f0: positiveNumber({ what: 'the centre frequency in Hz', example: '1e10' }).optional(),
  tau: positiveNumber({ what: 'the Gaussian width τ in seconds', example: '1e-10' }).optional(),
  t0: numberAtLeast(0, { what: 'the delay of the pulse centre in seconds', example: '5e-10', fallback: 'leave it out for the default delay' }, '; the pulse must be centred after t = 0')
    .optional(),
}, 'the waveform as an object such as { "kind": "ricker", "f0": 1e10 }');

/** Smallest and largest |amplitude| accepted, A. */
export const AMPLITUDE_SPAN = [1e-12, 1e12] as const;

export const sourceSchema = objectOf({
  x: finiteNumber(position('x')),
  y: finiteNumber(position('y')),
  amplitude: finiteNumber({ what: 'the peak current in amperes', example: '1', fallback: 'leave it out for 1' })
    .refine((a) => a !== 0, { error: 'is 0, which drives no field at all; use a non-zero current in amperes, e.g. 1' })
    // The engine holds fields in float32 (about 1e±38): currents far outside this span
    // would overflow or sink into subnormals. The problem is linear, so nothing is lost.
    .refine((a) => a === 0 || (Math.abs(a) >= AMPLITUDE_SPAN[0] && Math.abs(a) <= AMPLITUDE_SPAN[1]), {
      error: `is outside the span the float32 engine holds; use a current between ${AMPLITUDE_SPAN[0]} and ${AMPLITUDE_SPAN[1]} A in magnitude (results scale linearly, so 1 A loses nothing)`,
    })
    .default(AMPLITUDE_DEFAULT),
  waveform: waveformSchema,
}, 'the source as { "x", "y", "waveform" }');

export const probeSchema = objectOf({
  name: nameField,
  x: finiteNumber(position('x')),
  y: finiteNumber(position('y')),
}, 'a probe as { "name", "x", "y" }');

export const lineSchema = objectOf({
  name: nameField,
  x0: finiteNumber(position('x of the start')),
  y0: finiteNumber(position('y of the start')),
  x1: finiteNumber(position('x of the end')),
  y1: finiteNumber(position('y of the end')),
}, 'a probe line as { "name", "x0", "y0", "x1", "y1" }');

export const scenarioSchema = objectOf({
  format: z.literal(FORMAT_NAME, {
    error: (iss) => `${describeValue(iss.input)} is not the name of this format; write "${FORMAT_NAME}" or leave the field out`,
  }).optional(),
  version: z.literal(FORMAT_VERSION, {
    error: (iss) => versionMessage(iss.input),
  }).optional(),
  grid: gridSchema,
  medium: mediumSchema.prefault({}),
  absorber: absorberSchema.prefault({}),
  source: sourceSchema,
  probes: listOf(probeSchema, 'a list of probes [{ "name", "x", "y" }, …]', 'for none').default(() => []),
  lines: listOf(lineSchema, 'a list of probe lines [{ "name", "x0", "y0", "x1", "y1" }, …]', 'for none').default(() => []),
  frequencies: listOf(
    positiveNumber({ what: 'a frequency in Hz at which to compare spectra', example: '1e10' }),
    'a list of frequencies in Hz such as [1e10]',
    'for none',
  ).default(() => []),
  steps: wholeNumberAtLeast(1, { what: 'the number of time steps to run', example: '1200' }, '; run at least one step'),
  polarization: z.enum(POLARIZATIONS, {
    error: (iss) => `${describeValue(iss.input)} is not a polarization; use "TMz" (Ez, Hx, Hy; the default) or "TEz" (Hz, Ex, Ey)`,
  }).optional(),
  objects: objectsSchema(mediumSchema as unknown as z.ZodType<Medium>).optional(),
  fill: fillSchema.optional(),
}, 'a scenario object with "grid", "source" and "steps"');

/** The message for a `version` other than 1; a higher whole number means a newer file. */
export function versionMessage(input: unknown): string {
  if (typeof input === 'number' && Number.isInteger(input) && input > FORMAT_VERSION) {
    return `${input} is a newer scenario format than this build of gridgauge reads (it reads version ${FORMAT_VERSION}); update gridgauge, or rewrite the file as version ${FORMAT_VERSION}`;
  }
  return `${describeValue(input)} is not a scenario format version; write ${FORMAT_VERSION} or leave the field out`;
}

/** The scenario as zod reads it, before waveform defaults are filled in. */
export type ScenarioFromSchema = z.output<typeof scenarioSchema>;

/**
 * The field names an object in a scenario takes, by the path of that object (array
 * indices written as any number). Used for did-you-mean hints on unknown fields.
 */
export function knownFieldsAt(path: readonly (string | number)[]): readonly string[] | undefined {
  const key = path.map((s) => (typeof s === 'number' ? '[]' : s)).join('.');
  return FIELDS_BY_OBJECT[key];
}

const FIELDS_BY_OBJECT: Record<string, readonly string[]> = {
  '': Object.keys(scenarioSchema.shape),
  grid: Object.keys(gridSchema.shape),
  medium: Object.keys(mediumSchema.shape),
  absorber: Object.keys(absorberSchema.shape),
  source: Object.keys(sourceSchema.shape),
  'source.waveform': Object.keys(waveformSchema.shape),
  'probes.[]': Object.keys(probeSchema.shape),
  'medium.poles.[]': Object.keys(poleSchema.shape),
  'objects.[].material': Object.keys(mediumSchema.shape),
  'objects.[].material.poles.[]': Object.keys(poleSchema.shape),
  'lines.[]': Object.keys(lineSchema.shape),
};

/** Every object path with its fields, for a hint when a field sits in the wrong object. */
export const FIELD_OWNERS: readonly { owner: string; fields: readonly string[] }[] =
  Object.entries(FIELDS_BY_OBJECT).map(([owner, fields]) => ({ owner, fields }));
