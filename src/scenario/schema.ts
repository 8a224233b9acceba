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
import { describeValue, quote } from './show.ts';

export const FORMAT_NAME = 'gridgauge-scenario';
export const FORMAT_VERSION = 1;
export const WAVEFORM_KINDS = ['gaussian', 'modulated-gaussian', 'ricker'] as const;
export const MEDIUM_DEFAULTS = { epsR: 1 } as const;
export const ABSORBER_DEFAULTS = { cells: 10, order: 3, sigmaScale: 1, kappaMax: 5, alphaMax: 0.05 } as const;
export const AMPLITUDE_DEFAULT = 1;
export const NAME_MAX_LENGTH = 40;

/** What a number field holds, for messages: "give <what>, e.g. <example>". */
export interface FieldHint {
  what: string;
  example: string;
  /** For fields with a default: how to get it, e.g. "leave it out for 1". */
  fallback?: string;
}

function give(h: FieldHint): string {
  return `give ${h.what}, e.g. ${h.example}${h.fallback ? `, or ${h.fallback}` : ''}`;
}

function numberTypeMessage(input: unknown, h: FieldHint): string {
  if (input === undefined) return `required; ${give(h)}`;
  if (typeof input === 'number') return `${input} is not a finite number; ${give(h)}`; // NaN or ±Infinity
  if (typeof input === 'string' && input.trim() !== '' && Number.isFinite(Number(input))) {
    return `${quote(input)} is text; write the number without quotes: ${Number(input)}`;
  }
  return `expected a number but found ${describeValue(input)}; ${give(h)}`;
}

/** A finite number (zod 4 refuses NaN and ±Infinity as the wrong type). */
export function finiteNumber(h: FieldHint) {
  return z.number({ error: (iss) => numberTypeMessage(iss.input, h) });
}

function positiveNumber(h: FieldHint) {
  return finiteNumber(h).gt(0, { error: (iss) => `${String(iss.input)} is not above 0; ${give(h)}` });
}

function numberAtLeast(min: number, h: FieldHint, why: string) {
  return finiteNumber(h).gte(min, { error: (iss) => `${String(iss.input)} is below ${min}${why}; ${give(h)}` });
}

function wholeNumberAtLeast(min: number, h: FieldHint, why: string) {
  return finiteNumber(h)
    .int({
      abort: true,
      error: (iss) => {
        const x = iss.input as number;
        if (Number.isInteger(x)) return `${x} is far too large; ${give(h)}`;
        // the nearest whole number, unless that is at or below the minimum: then the field's own example
        const near = Math.round(x);
        return `${x} is not a whole number; use a whole number such as ${near > min ? near : h.example}`;
      },
    })
    .gte(min, { error: (iss) => `${String(iss.input)} is below ${min}${why}; ${give(h)}` });
}

/** Message for an object or list of the wrong type; `leaveOut` says what leaving it out gives. */
export function containerMessage(input: unknown, description: string, leaveOut?: string): string {
  if (input === undefined) return `required; give ${description}`;
  return `expected ${description} but found ${describeValue(input)}${leaveOut ? `; or leave the field out ${leaveOut}` : ''}`;
}

function objectOf<T extends z.core.$ZodLooseShape>(shape: T, description: string, leaveOut?: string) {
  return z.strictObject(shape, {
    error: (iss) => (iss.code === 'invalid_type' ? containerMessage(iss.input, description, leaveOut) : undefined),
  });
}

export function listOf<T extends z.ZodType>(item: T, description: string, leaveOut?: string) {
  return z.array(item, {
    error: (iss) => (iss.code === 'invalid_type' ? containerMessage(iss.input, description, leaveOut) : undefined),
  });
}

/** The letters-and-digits rule for probe and line names. Returns the problem, or undefined. */
export function nameProblem(name: string): string | undefined {
  const chars = Array.from(name);
  if (chars.length === 0) return `is empty; give a name of 1 to ${NAME_MAX_LENGTH} letters, digits, spaces, "_", "." or "-"`;
  if (chars.length > NAME_MAX_LENGTH) return `${quote(name)} is ${chars.length} characters long; use at most ${NAME_MAX_LENGTH}`;
  if (!/^[\p{L}0-9]$/u.test(chars[0])) return `${quote(name)} starts with ${JSON.stringify(chars[0])}; start the name with a letter or digit`;
  const bad = chars.find((c) => !/^[\p{L}\p{M}0-9 _.\-]$/u.test(c));
  if (bad !== undefined) return `${quote(name)} contains ${JSON.stringify(bad)}; use only letters, digits, spaces, "_", "." and "-"`;
  return undefined;
}

export const nameField = z
  .string({
    error: (iss) => iss.input === undefined
      ? `required; give a name of 1 to ${NAME_MAX_LENGTH} letters, digits, spaces, "_", "." or "-", e.g. "near"`
      : `expected a name in double quotes but found ${describeValue(iss.input)}`,
  })
  .refine((s) => nameProblem(s) === undefined, { error: (iss) => nameProblem(iss.input as string) });

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

export const mediumSchema = objectOf({
  epsR: numberAtLeast(1, { what: 'the relative permittivity εr of the medium, 1 or more', example: '1 for vacuum or air', fallback: 'leave it out for 1' }, ', which no passive medium has')
    .refine((v) => !(v > 1e4), { error: (iss) => `is ${String(iss.input)}, above the largest accepted 1e4 (no common dielectric comes near it); use 1e4 or less` })
    .default(MEDIUM_DEFAULTS.epsR),
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
  'lines.[]': Object.keys(lineSchema.shape),
};

/** Every object path with its fields, for a hint when a field sits in the wrong object. */
export const FIELD_OWNERS: readonly { owner: string; fields: readonly string[] }[] =
  Object.entries(FIELDS_BY_OBJECT).map(([owner, fields]) => ({ owner, fields }));
