/**
 * Zod schemas for the scenario's `objects` and `fill` (README "Objects"), checking each
 * field on its own like schema.ts: types, finite numbers, names, allowed shapes and
 * materials, unknown keys. What ties fields together (a radius above 0, a rectangle with
 * an area, a simple polygon of 3 to 64 points, objects clear of the absorber, the source
 * and probes) is judged in object-rules.ts, once these checks have passed.
 *
 * An object's material is either "pec" or a medium. The medium schema is passed in, so
 * an object's medium is read exactly as the scenario's `medium` is (its defaults
 * included).
 */
import * as z from 'zod';
import { closestName } from './did-you-mean.ts';
import { containerMessage, finiteNumber, listOf, nameField, type FieldHint } from './schema-kit.ts';
import { describeValue, quote } from './show.ts';
import type { Fill, Material, Medium, SceneObject } from './types.ts';

export const OBJECT_SHAPES = ['circle', 'rectangle', 'polygon'] as const;
export type ObjectShape = (typeof OBJECT_SHAPES)[number];
export const FILL_KINDS = ['staircase', 'average', 'conformal'] as const satisfies readonly Fill[];
export const FILL_DEFAULT: Fill = 'staircase';

/** The fields each shape takes, beyond "name", "shape" and "material". */
export const SHAPE_FIELDS: Record<ObjectShape, readonly string[]> = {
  circle: ['x', 'y', 'radius'],
  rectangle: ['x0', 'y0', 'x1', 'y1'],
  polygon: ['points'],
};
const COMMON_FIELDS = ['name', 'shape', 'material'] as const;

const MATERIAL_EXAMPLE = '"pec" for a perfect electric conductor, or a medium such as { "epsR": 4.4 }';
const OBJECT_EXAMPLE = 'an object such as { "shape": "circle", "x": 0.15, "y": 0.15, "radius": 0.01, "material": "pec" }';

const coordinate = (what: string, example: string): FieldHint => ({ what: `${what} in metres`, example });

const pointSchema = z.tuple([
  finiteNumber(coordinate('the x coordinate of the point', '0.12')),
  finiteNumber(coordinate('the y coordinate of the point', '0.1')),
], {
  error: (iss) => {
    if (iss.code === 'too_small' || iss.code === 'too_big') {
      const n = Array.isArray(iss.input) ? iss.input.length : 0;
      return `holds ${n} number${n === 1 ? '' : 's'}; write each point as [x, y], two numbers in metres, e.g. [0.12, 0.1]`;
    }
    if (iss.code === 'invalid_type') return `expected a point [x, y] in metres, e.g. [0.12, 0.1], but found ${describeValue(iss.input)}`;
    return undefined;
  },
});

function shapeFieldSchemas<M extends z.ZodType<Medium>>(medium: M) {
  const material = materialSchema(medium);
  const name = nameField.optional();
  return {
    circle: z.object({
      name, material,
      x: finiteNumber(coordinate('the x coordinate of the centre', '0.15')),
      y: finiteNumber(coordinate('the y coordinate of the centre', '0.15')),
      radius: finiteNumber(coordinate('the radius', '0.01')),
    }),
    rectangle: z.object({
      name, material,
      x0: finiteNumber(coordinate('the x coordinate of one corner', '0.1')),
      y0: finiteNumber(coordinate('the y coordinate of one corner', '0.1')),
      x1: finiteNumber(coordinate('the x coordinate of the opposite corner', '0.12')),
      y1: finiteNumber(coordinate('the y coordinate of the opposite corner', '0.2')),
    }),
    polygon: z.object({
      name, material,
      points: listOf(pointSchema, 'a list of 3 to 64 points [[x, y], …] in metres, e.g. [[0.1, 0.1], [0.12, 0.1], [0.1, 0.13]]'),
    }),
  };
}

/**
 * What an object is made of: the text "pec", or a medium read by `medium` (the scenario's
 * own medium schema, so its defaults apply: epsR 1 when left out).
 *
 * @example
 * materialSchema(mediumSchema).parse({ epsR: 4.4 }); // { epsR: 4.4 }
 */
export function materialSchema<M extends z.ZodType<Medium>>(medium: M) {
  return z.unknown().transform((input, ctx): Material => {
    if (input === 'pec') return 'pec';
    if (input === undefined) {
      ctx.issues.push({ code: 'custom', input, message: `required; give ${MATERIAL_EXAMPLE}` });
      return z.NEVER;
    }
    if (typeof input === 'string') {
      const near = closestName(input, ['pec']) ?? (/^(metal|conductor|perfect)/i.test(input) ? 'pec' : undefined);
      const hint = near !== undefined ? ' (did you mean "pec"?)' : '';
      ctx.issues.push({ code: 'custom', input, message: `${quote(input)} is not a material${hint}; write ${MATERIAL_EXAMPLE}` });
      return z.NEVER;
    }
    if (input === null || typeof input !== 'object' || Array.isArray(input)) {
      ctx.issues.push({ code: 'custom', input, message: `expected ${MATERIAL_EXAMPLE}, but found ${describeValue(input)}` });
      return z.NEVER;
    }
    const parsed = medium.safeParse(input);
    if (parsed.success) return parsed.data;
    for (const issue of parsed.error.issues) ctx.issues.push({ ...issue, input: undefined });
    return z.NEVER;
  });
}

/**
 * One object of the scenario: its `shape` picks the fields it takes; every other field is
 * refused with a hint (a field of another shape, or a near-miss spelling). The output is a
 * `SceneObject` with only the fields of its shape.
 *
 * @example
 * objectSchema(mediumSchema).parse({ shape: 'circle', x: 0.15, y: 0.15, radius: 0.01, material: 'pec' });
 */
export function objectSchema<M extends z.ZodType<Medium>>(medium: M) {
  const shapes = shapeFieldSchemas(medium);
  return z.unknown().transform((input, ctx): SceneObject => {
    if (input === null || typeof input !== 'object' || Array.isArray(input)) {
      ctx.issues.push({ code: 'custom', input, message: containerMessage(input, OBJECT_EXAMPLE) });
      return z.NEVER;
    }
    const raw = input as Record<string, unknown>;
    const shape = Object.prototype.hasOwnProperty.call(raw, 'shape') ? raw.shape : undefined;
    if (!OBJECT_SHAPES.includes(shape as ObjectShape)) {
      ctx.issues.push({ code: 'custom', input: shape, path: ['shape'], message: shapeMessage(shape) });
      return z.NEVER;
    }
    const kind = shape as ObjectShape;
    const allowed: readonly string[] = [...COMMON_FIELDS, ...SHAPE_FIELDS[kind]];
    for (const key of Object.keys(raw)) {
      if (allowed.includes(key)) continue;
      ctx.issues.push({ code: 'custom', input: raw[key], path: [key], message: unknownFieldMessage(key, kind, allowed) });
    }
    const parsed = shapes[kind].safeParse(raw);
    if (!parsed.success) {
      for (const issue of parsed.error.issues) ctx.issues.push({ ...issue, input: undefined });
      return z.NEVER;
    }
    if (ctx.issues.length > 0) return z.NEVER;
    return toSceneObject(kind, parsed.data);
  });
}

/** The list of objects; leave it out for none. */
export function objectsSchema<M extends z.ZodType<Medium>>(medium: M) {
  return listOf(objectSchema(medium), `a list of objects [${OBJECT_EXAMPLE.replace('an object such as ', '')}, …]`, 'for none');
}

/** How objects enter the grid; leave it out for staircase. */
export const fillSchema = z.enum(FILL_KINDS, {
  error: (iss) => {
    const kinds = FILL_KINDS.join(', ');
    if (typeof iss.input !== 'string') return `expected one of ${kinds} but found ${describeValue(iss.input)}; or leave the field out for ${FILL_DEFAULT}`;
    const near = closestName(iss.input, FILL_KINDS);
    return `${quote(iss.input)} is not a fill; use one of ${kinds}${near ? ` (did you mean ${near}?)` : ''}, or leave the field out for ${FILL_DEFAULT}`;
  },
});

function shapeMessage(shape: unknown): string {
  const shapes = OBJECT_SHAPES.join(', ');
  if (shape === undefined) return `required; use one of ${shapes}`;
  if (typeof shape !== 'string') return `expected one of ${shapes} but found ${describeValue(shape)}`;
  const near = closestName(shape, OBJECT_SHAPES);
  return `${quote(shape)} is not a shape; use one of ${shapes}${near ? ` (did you mean ${near}?)` : ''}`;
}

function unknownFieldMessage(key: string, shape: ObjectShape, allowed: readonly string[]): string {
  const takes = `a ${shape} takes ${allowed.map((f) => quote(f)).join(', ')}`;
  const owner = OBJECT_SHAPES.find((s) => s !== shape && SHAPE_FIELDS[s].includes(key));
  if (owner !== undefined) return `does not apply to a ${shape} (${takes}); remove it, or use "shape": "${owner}"`;
  const near = closestName(key, allowed);
  if (near !== undefined) return `unknown field; did you mean ${near}?`;
  return `unknown field; remove it (${takes})`;
}

type ShapeFields = { name?: string; material: Material } & Record<string, unknown>;

function toSceneObject(shape: ObjectShape, d: ShapeFields): SceneObject {
  const head = d.name === undefined ? {} : { name: d.name };
  switch (shape) {
    case 'circle': return { ...head, shape, x: d.x as number, y: d.y as number, radius: d.radius as number, material: d.material };
    case 'rectangle': return { ...head, shape, x0: d.x0 as number, y0: d.y0 as number, x1: d.x1 as number, y1: d.y1 as number, material: d.material };
    case 'polygon': return { ...head, shape, points: (d.points as [number, number][]).map(([x, y]) => [x, y]), material: d.material };
  }
}
