import { describe, expect, it } from 'vitest';
import * as z from 'zod';
import { fillSchema, materialSchema, objectSchema, objectsSchema } from '../../src/scenario/object-schema.ts';
import { mediumSchema } from '../../src/scenario/schema.ts';

const objects = objectsSchema(mediumSchema as never);

/** Issues as "path: message" lines, for one list of objects. */
function issues(value: unknown): string[] {
  const r = objects.safeParse(value);
  if (r.success) return [];
  return r.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`);
}

describe('object schema', () => {
  it('reads each shape, filling the medium defaults and keeping only its own fields', () => {
    const r = objects.parse([
      { name: 'rod', shape: 'circle', x: 0.15, y: 0.15, radius: 0.01, material: 'pec' },
      { shape: 'rectangle', x0: 0.1, y0: 0.1, x1: 0.12, y1: 0.2, material: {} },
      { shape: 'polygon', points: [[0.1, 0.1], [0.12, 0.1], [0.1, 0.13]], material: { epsR: 4.4 } },
    ]);
    expect(r).toEqual([
      { name: 'rod', shape: 'circle', x: 0.15, y: 0.15, radius: 0.01, material: 'pec' },
      { shape: 'rectangle', x0: 0.1, y0: 0.1, x1: 0.12, y1: 0.2, material: { epsR: 1 } }, // medium.epsR defaults to 1 (README)
      { shape: 'polygon', points: [[0.1, 0.1], [0.12, 0.1], [0.1, 0.13]], material: { epsR: 4.4 } },
    ]);
  });

  it('names an unknown or missing shape with a hint', () => {
    expect(issues([{ shape: 'circel', x: 0.1 }])).toEqual(['0.shape: "circel" is not a shape; use one of circle, rectangle, polygon (did you mean circle?)']);
    expect(issues([{ x: 0.1 }])).toEqual(['0.shape: required; use one of circle, rectangle, polygon']);
    expect(issues([5])[0]).toMatch(/^0: expected an object such as \{ "shape": "circle"/);
  });

  it('refuses fields of another shape and misspelt fields', () => {
    const found = issues([{ shape: 'circle', x: 0.1, y: 0.1, radis: 0.01, x0: 0.1, material: 'pec' }]);
    expect(found).toContain('0.radis: unknown field; did you mean radius?');
    expect(found).toContain('0.x0: does not apply to a circle (a circle takes "name", "shape", "material", "x", "y", "radius"); remove it, or use "shape": "rectangle"');
    expect(found).toContain('0.radius: required; give the radius in metres, e.g. 0.01');
  });

  it('checks the material: "pec" in lower case, or a medium checked by the medium schema', () => {
    expect(issues([{ shape: 'circle', x: 0.1, y: 0.1, radius: 0.01, material: 'PEC' }])).toEqual([
      '0.material: "PEC" is not a material (did you mean "pec"?); write "pec" for a perfect electric conductor, or a medium such as { "epsR": 4.4 }',
    ]);
    expect(issues([{ shape: 'circle', x: 0.1, y: 0.1, radius: 0.01 }])).toEqual(['0.material: required; give "pec" for a perfect electric conductor, or a medium such as { "epsR": 4.4 }']);
    expect(issues([{ shape: 'circle', x: 0.1, y: 0.1, radius: 0.01, material: { epsR: 0.5 } }])[0]).toMatch(/^0\.material\.epsR: 0\.5 is below 1/);
    expect(issues([{ shape: 'circle', x: 0.1, y: 0.1, radius: 0.01, material: 7 }])[0]).toMatch(/^0\.material: expected "pec" .* but found 7$/);
  });

  it('passes a richer medium schema through to the material', () => {
    const lossy = z.strictObject({ epsR: z.number().default(1), sigma: z.number().optional() });
    expect(materialSchema(lossy).parse({ epsR: 4, sigma: 0.01 })).toEqual({ epsR: 4, sigma: 0.01 });
    expect(objectSchema(lossy).parse({ shape: 'circle', x: 0, y: 0, radius: 1, material: { sigma: 2 } })).toMatchObject({ material: { epsR: 1, sigma: 2 } });
  });

  it('checks points: pairs of finite numbers', () => {
    const found = issues([{ shape: 'polygon', points: [[0.1, 0.1], [0.2], 'x', [Number.NaN, 0.1]], material: 'pec' }]);
    expect(found).toEqual([
      '0.points.1: holds 1 number; write each point as [x, y], two numbers in metres, e.g. [0.12, 0.1]',
      '0.points.2: expected a point [x, y] in metres, e.g. [0.12, 0.1], but found "x" (text)',
      '0.points.3.0: NaN is not a finite number; give the x coordinate of the point in metres, e.g. 0.12',
    ]);
    expect(issues('x')[0]).toMatch(/^: expected a list of objects .* but found "x" \(text\); or leave the field out for none$/);
  });
});

describe('fill schema', () => {
  it('takes the three fills and hints at near misses', () => {
    expect(fillSchema.parse('conformal')).toBe('conformal');
    expect(fillSchema.safeParse('averge').error?.issues[0].message).toBe('"averge" is not a fill; use one of staircase, average, conformal (did you mean average?), or leave the field out for staircase');
    expect(fillSchema.safeParse(3).error?.issues[0].message).toMatch(/^expected one of staircase, average, conformal but found 3/);
  });
});
