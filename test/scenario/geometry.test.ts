import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { boundingBox, containsPoint, onBoundary, polygonDefect, polygonSignedArea, shapeArea, topShapeAt, type Shape } from '../../src/scenario/geometry.ts';
import { areaInBox, clipPolygon, layeredAreas } from '../../src/scenario/geometry-area.ts';
import { layeredLengths, lengthOutside, segmentInside } from '../../src/scenario/geometry-segments.ts';

const circle = (x: number, y: number, radius: number): Shape => ({ shape: 'circle', x, y, radius });
const rect = (x0: number, y0: number, x1: number, y1: number): Shape => ({ shape: 'rectangle', x0, y0, x1, y1 });
const poly = (points: [number, number][]): Shape => ({ shape: 'polygon', points });

/** The L-shaped hexagon: the square [0, 3]² less its top-right [1, 3] × [1, 3] (area 5). */
const L_SHAPE: [number, number][] = [[0, 0], [3, 0], [3, 1], [1, 1], [1, 3], [0, 3]];

describe('circle ∩ box area', () => {
  const c = circle(0.15, 0.12, 0.01);
  const r = 0.01;

  it('is the whole box when the box lies inside the circle', () => {
    const box = { x0: 0.1495, y0: 0.1195, x1: 0.1505, y1: 0.1205 };
    expect(areaInBox(c, box)).toBeCloseTo(1e-6, 18); // closed form: box ⊂ disk ⇒ area = dx·dy = 1e-6 m²
  });

  it('is πr² when the circle lies inside the box', () => {
    expect(areaInBox(c, { x0: 0.1, y0: 0.1, x1: 0.2, y1: 0.2 })).toBeCloseTo(Math.PI * r * r, 17); // closed form: πr²
    expect(areaInBox(c, { x0: -Infinity, y0: -Infinity, x1: Infinity, y1: Infinity })).toBeCloseTo(Math.PI * r * r, 17); // closed form: πr²
  });

  it('is πr² for a circle inside one grid cell', () => {
    const pin = circle(0.1502, 0.1498, 0.0003);
    expect(areaInBox(pin, { x0: 0.1495, y0: 0.1495, x1: 0.1505, y1: 0.1505 })).toBeCloseTo(Math.PI * 0.0003 ** 2, 21); // closed form: πr² (the cell's right and bottom sides are tangent to the circle)
  });

  it('keeps its accuracy for a cell on the rim of a circle ten thousand cells across', () => {
    const R = 10;
    const h = 0.0005;
    // The cell [R − h, R + h] × [−h, h] at the rightmost point; with √(R² − y²) = R − y²/2R − …,
    // the area is 2h·h − h³/(3R) + O(h⁵/R³).
    const expected = 2 * h * h - h ** 3 / (3 * R); // closed form: series of the segment, next term ~1e-22 m²
    expect(areaInBox(circle(0, 0, R), { x0: R - h, y0: -h, x1: R + h, y1: h })).toBeCloseTo(expected, 17); // closed form above
  });

  it('gives half and quarter disks for boxes bounded by lines through the centre', () => {
    expect(areaInBox(c, { x0: 0.15, y0: 0, x1: 1, y1: 1 })).toBeCloseTo((Math.PI * r * r) / 2, 17); // closed form: πr²/2
    expect(areaInBox(c, { x0: 0, y0: 0, x1: 0.15, y1: 0.12 })).toBeCloseTo((Math.PI * r * r) / 4, 17); // closed form: πr²/4
  });

  it('gives the circular segment cut off by a line at distance h from the centre', () => {
    for (const h of [0, 0.002, 0.0055, 0.0099]) {
      const segment = r * r * Math.acos(h / r) - h * Math.sqrt(r * r - h * h); // closed form: segment area r²·acos(h/r) − h·√(r² − h²)
      expect(areaInBox(c, { x0: 0, y0: 0.12 + h, x1: 1, y1: 1 })).toBeCloseTo(segment, 17); // closed form above, cut by y = y_c + h
      expect(areaInBox(c, { x0: 0, y0: 0, x1: 0.15 - h, y1: 1 })).toBeCloseTo(segment, 17); // closed form above, cut by x = x_c − h
    }
  });

  it('gives the strip of a quarter disk between the centre line and height h', () => {
    for (const h of [0.001, 0.005, 0.0093]) {
      const strip = 0.5 * (h * Math.sqrt(r * r - h * h) + r * r * Math.asin(h / r)); // closed form: ∫₀ʰ √(r² − y²) dy
      expect(areaInBox(c, { x0: 0.15, y0: 0.12, x1: 0.2, y1: 0.12 + h })).toBeCloseTo(strip, 17); // closed form above
    }
  });

  it('is zero for a box outside the circle, one touching it, or a circle without radius', () => {
    expect(areaInBox(c, { x0: 0.161, y0: 0.1, x1: 0.2, y1: 0.2 })).toBe(0); // common practice, no source
    expect(areaInBox(c, { x0: 0.16, y0: 0.1, x1: 0.2, y1: 0.2 })).toBeLessThan(1e-15); // tangent at x = x_c + r, common practice, no source
    expect(areaInBox(circle(0, 0, 0), { x0: -1, y0: -1, x1: 1, y1: 1 })).toBe(0); // common practice, no source
    expect(areaInBox(circle(0, 0, Number.NaN), { x0: -1, y0: -1, x1: 1, y1: 1 })).toBe(0); // common practice, no source
  });

  it('adds up over a tiling of the plane to πr², whatever the circle and the cell size', () => {
    fc.assert(fc.property(
      fc.double({ min: -1, max: 1, noNaN: true }), fc.double({ min: -1, max: 1, noNaN: true }),
      fc.double({ min: 0.05, max: 3, noNaN: true }), fc.double({ min: 0.07, max: 0.9, noNaN: true }), fc.double({ min: 0.07, max: 0.9, noNaN: true }),
      (x, y, radius, dx, dy) => {
        let sum = 0;
        for (let i = Math.floor((x - radius) / dx) - 1; i <= Math.ceil((x + radius) / dx); i++) {
          for (let j = Math.floor((y - radius) / dy) - 1; j <= Math.ceil((y + radius) / dy); j++) {
            sum += areaInBox(circle(x, y, radius), { x0: i * dx, y0: j * dy, x1: (i + 1) * dx, y1: (j + 1) * dy });
          }
        }
        expect(sum).toBeCloseTo(Math.PI * radius * radius, 10); // closed form: πr² (cells tile the plane)
      },
    ), { numRuns: 200, seed: 3 });
  });
});

describe('polygon ∩ box area (Sutherland–Hodgman)', () => {
  it('matches hand-computed areas for a triangle', () => {
    const t = poly([[0, 0], [2, 0], [0, 2]]);
    expect(areaInBox(t, { x0: 0, y0: 0, x1: 1, y1: 1 })).toBeCloseTo(1, 15); // hand-computed: the unit square lies under x + y = 2
    expect(areaInBox(t, { x0: 1, y0: 0, x1: 2, y1: 1 })).toBeCloseTo(0.5, 15); // hand-computed: ∫₁² (2 − x) dx = 0.5
    expect(areaInBox(t, { x0: 0.5, y0: 0.5, x1: 1.5, y1: 1.5 })).toBeCloseTo(0.5, 15); // hand-computed: the edge x + y = 2 is the box's diagonal
    expect(areaInBox(t, { x0: 2, y0: 0, x1: 3, y1: 1 })).toBe(0); // hand-computed: no overlap
  });

  it('is exact for a concave polygon whose clipped outline runs along the box twice', () => {
    const l = poly(L_SHAPE);
    expect(areaInBox(l, { x0: 0.5, y0: 0.5, x1: 2.5, y1: 2.5 })).toBeCloseTo(1.75, 14); // hand-computed: 2 × 0.5 below y = 1, plus 0.5 × 1.5 left of x = 1 above it
    expect(areaInBox(l, { x0: 2, y0: 2, x1: 3, y1: 3 })).toBe(0); // hand-computed: the notch
    expect(areaInBox(l, { x0: -1, y0: -1, x1: 4, y1: 4 })).toBeCloseTo(5, 14); // hand-computed: 9 − 4
  });

  it('gives the same area for either orientation', () => {
    const box = { x0: 0.3, y0: 0.2, x1: 2.7, y1: 1.9 };
    const cw = poly([...L_SHAPE].reverse());
    expect(areaInBox(cw, box)).toBeCloseTo(areaInBox(poly(L_SHAPE), box), 14); // common practice, no source
    expect(polygonSignedArea([...L_SHAPE].reverse())).toBeCloseTo(-5, 14); // shoelace formula: clockwise is negative
  });

  it('clips to a strip when the other sides are infinite', () => {
    const strip = clipPolygon(L_SHAPE, { x0: -Infinity, x1: Infinity, y0: 0.5, y1: 1.5 });
    expect(Math.abs(polygonSignedArea(strip))).toBeCloseTo(0.5 * 3 + 0.5 * 1, 14); // hand-computed: 3 wide below y = 1, 1 wide above
  });

  it('rectangle ∩ box is the overlap of the two boxes, with the corners in any order', () => {
    expect(areaInBox(rect(2, 3, 0, 1), { x0: 1, y0: 0, x1: 5, y1: 2 })).toBeCloseTo(1, 15); // hand-computed: [1, 2] × [1, 2]
    expect(shapeArea(rect(2, 3, 0, 1))).toBe(4); // hand-computed
  });
});

describe('containment of closed shapes', () => {
  const l = poly(L_SHAPE);

  it('counts polygon vertices and edges as inside, the notch as outside', () => {
    for (const [x, y] of L_SHAPE) expect(containsPoint(l, x, y)).toBe(true); // closed shape: vertices are on the boundary
    expect(containsPoint(l, 1.5, 1)).toBe(true); // on the notch's bottom edge
    expect(containsPoint(l, 1, 2)).toBe(true); // on the notch's left edge
    expect(containsPoint(l, 2, 2)).toBe(false); // in the notch
    expect(containsPoint(l, 1.5, 1 + 1e-9)).toBe(false); // just inside the notch
    expect(containsPoint(l, 0.5, 2.5)).toBe(true); // common practice, no source
    expect(containsPoint(l, -1e-9, 1)).toBe(false); // common practice, no source
  });

  it('keeps grid positions that rounding puts a hair outside an edge', () => {
    const r = rect(0.1, 0.1, 0.3, 0.2);
    expect(3 * 0.1).toBeGreaterThan(0.3); // 0.30000000000000004, IEEE 754 rounding
    expect(containsPoint(r, 3 * 0.1, 0.15)).toBe(true); // within the rounding band of the boundary
    expect(containsPoint(poly([[0.1, 0.1], [0.3, 0.1], [0.3, 0.2]]), 3 * 0.1, 0.15)).toBe(true); // same, on a polygon edge
    expect(containsPoint(circle(0, 0, 0.3), 3 * 0.1, 0)).toBe(true); // same, on a circle
  });

  it('tells the boundary from the inside', () => {
    expect(onBoundary(circle(0, 0, 1), Math.SQRT1_2, Math.SQRT1_2)).toBe(true); // closed form: cos²45° + sin²45° = 1
    expect(onBoundary(circle(0, 0, 1), 0.5, 0)).toBe(false); // common practice, no source
    expect(onBoundary(rect(0, 0, 1, 1), 1, 0.5)).toBe(true); // common practice, no source
    expect(onBoundary(rect(0, 0, 1, 1), 0.5, 0.5)).toBe(false); // common practice, no source
    expect(onBoundary(l, 1.5, 1)).toBe(true); // common practice, no source
  });

  it('finds the last shape holding a point', () => {
    const shapes = [rect(0, 0, 2, 2), circle(1, 1, 0.5), rect(5, 5, 6, 6)];
    expect(topShapeAt(shapes, 1, 1)).toBe(1); // later shapes cover earlier ones (README "Objects")
    expect(topShapeAt(shapes, 0.1, 0.1)).toBe(0); // common practice, no source
    expect(topShapeAt(shapes, 3, 3)).toBe(-1); // common practice, no source
  });

  it('gives bounding boxes', () => {
    expect(boundingBox(poly(L_SHAPE))).toEqual({ x0: 0, y0: 0, x1: 3, y1: 3 }); // hand-computed
    expect(boundingBox(circle(1, 2, 0.5))).toEqual({ x0: 0.5, y0: 1.5, x1: 1.5, y1: 2.5 }); // hand-computed
  });
});

describe('segments inside and outside shapes', () => {
  it('circle: a chord at distance h has length 2√(r² − h²)', () => {
    const c = circle(0.15, 0.15, 0.01);
    expect(lengthOutside(c, 0.1, 0.15, 0.2, 0.15)).toBeCloseTo(0.1 - 0.02, 12); // closed form: L − 2r
    const h = 0.006;
    expect(lengthOutside(c, 0.1, 0.15 + h, 0.2, 0.15 + h)).toBeCloseTo(0.1 - 2 * Math.sqrt(1e-4 - h * h), 12); // closed form: L − 2√(r² − h²)
    expect(lengthOutside(c, 0.15, 0.15, 0.15, 0.17)).toBeCloseTo(0.01, 12); // closed form: from the centre, r inside, r outside
    expect(lengthOutside(c, 0.1, 0.16, 0.2, 0.16)).toBeCloseTo(0.1, 6); // tangent line: only the rounding band inside, common practice, no source
    expect(segmentInside(circle(0, 0, 1), -2, 0, 2, 0)[0][0]).toBeCloseTo(0.25, 10); // closed form: enters at x = −1, t = 1/4
  });

  it('rectangle: Liang–Barsky clipping, edges counting as inside', () => {
    const r = rect(0, 0, 1, 1);
    expect(lengthOutside(r, -1, 0.5, 2, 0.5)).toBeCloseTo(2, 11); // hand-computed: 3 − 1 (the rounding band adds ~1e-12)
    expect(lengthOutside(r, -1, 1, 2, 1)).toBeCloseTo(2, 11); // along the top edge: the edge counts as inside
    expect(lengthOutside(r, -1, -1, 2, 2)).toBeCloseTo(3 * Math.SQRT2 - Math.SQRT2, 11); // hand-computed: the diagonal
    expect(lengthOutside(r, 2, 0, 3, 5)).toBeCloseTo(Math.hypot(1, 5), 14); // hand-computed: misses
  });

  it('polygon: a line through the L-shape\'s notch lies inside twice', () => {
    const l = poly(L_SHAPE);
    const row = segmentInside(l, -1, 2, 4, 2);
    expect(row.length).toBe(1); // hand-computed: inside for x ∈ [0, 1] only
    expect(row[0][0]).toBeCloseTo(0.2, 14); // hand-computed: x = 0 at t = 1/5
    expect(row[0][1]).toBeCloseTo(0.4, 14); // hand-computed: x = 1 at t = 2/5
    expect(segmentInside(l, -1, 0.5, 4, 0.5).length).toBe(1); // hand-computed: below the notch, one piece
    expect(lengthOutside(l, -1, 0.5, 4, 0.5)).toBeCloseTo(2, 14); // hand-computed: inside for x ∈ [0, 3]
    const diagonal = segmentInside(l, -1, -1, 4, 4);
    expect(diagonal.length).toBe(1); // hand-computed: inside from (0, 0) to (1, 1), the notch's corner
    expect(diagonal[0][0]).toBeCloseTo(0.2, 14); // hand-computed: (0, 0) at t = 1/5
    expect(diagonal[0][1]).toBeCloseTo(0.4, 14); // hand-computed: (1, 1) at t = 2/5
    expect(lengthOutside(l, 1.5, 1, 2.5, 1)).toBeCloseTo(0, 14); // along the notch's bottom edge: inside
    expect(lengthOutside(l, 0.5, 0.5, 0.5, 0.5)).toBe(0); // a point segment has no length
  });

  it('shares a segment among overlapping shapes, later ones on top', () => {
    const shapes = [rect(0, 0, 2, 1), rect(1, 0, 3, 1)];
    const [first, second] = layeredLengths(shapes, -1, 0.5, 4, 0.5);
    expect(first).toBeCloseTo(1, 10); // hand-computed: [0, 1] is left to the first (rounding band ~1e-12)
    expect(second).toBeCloseTo(2, 10); // hand-computed: [1, 3]
  });
});

describe('sharing a box among overlapping shapes', () => {
  it('is exact when one shape cuts the box after one that covers it', () => {
    const box = { x0: 0, y0: 0, x1: 1, y1: 1 };
    const [under, over] = layeredAreas([rect(-1, -1, 2, 2), circle(0.5, 0.5, 0.25)], box);
    expect(over).toBeCloseTo(Math.PI / 16, 15); // closed form: π·0.25²
    expect(under).toBeCloseTo(1 - Math.PI / 16, 15); // closed form: the rest of the box
  });

  it('integrates two overlapping cuts by rows, within 1e-10 of the lens formula', () => {
    const r = 0.25;
    const d = 0.3;
    const lens = 2 * r * r * Math.acos(d / (2 * r)) - (d / 2) * Math.sqrt(4 * r * r - d * d); // closed form: lens of two circles, r and centre distance d
    const [first, second] = layeredAreas([circle(0.35, 0.5, r), circle(0.65, 0.5, r)], { x0: 0, y0: 0, x1: 1, y1: 1 });
    expect(second).toBeCloseTo(Math.PI * r * r, 10); // closed form: the later circle keeps all of πr²
    // Centres at different heights: the crossings are not at the circles' common top or bottom.
    const tilted = Math.hypot(0.3, 0.1);
    const lensTilted = 2 * r * r * Math.acos(tilted / (2 * r)) - (tilted / 2) * Math.sqrt(4 * r * r - tilted * tilted); // closed form, as above
    const [low] = layeredAreas([circle(0.35, 0.45, r), circle(0.65, 0.55, r)], { x0: 0, y0: 0, x1: 1, y1: 1 });
    expect(Math.abs(low - (Math.PI * r * r - lensTilted))).toBeLessThan(1e-10); // closed form above; Gauss–Legendre rows between crossings
    expect(Math.abs(first - (Math.PI * r * r - lens))).toBeLessThan(1e-10); // closed form above; Gauss–Legendre rows between crossings
  });

  it('hands the whole box to the last shape covering it', () => {
    const box = { x0: 0, y0: 0, x1: 1, y1: 1 };
    expect(layeredAreas([circle(0.5, 0.5, 0.3), rect(-1, -1, 2, 2)], box)).toEqual([0, 1]); // later shapes cover earlier ones
  });
});

describe('polygon checks', () => {
  it('accepts simple polygons of either orientation, with straight-through vertices', () => {
    expect(polygonDefect(L_SHAPE)).toBeUndefined(); // concave but simple
    expect(polygonDefect([...L_SHAPE].reverse())).toBeUndefined(); // clockwise
    expect(polygonDefect([[0, 0], [1, 0], [2, 0], [2, 2], [0, 2]])).toBeUndefined(); // (1, 0) lies on the way from (0, 0) to (2, 0)
  });

  it('names the two edges of a bow-tie and where they cross', () => {
    expect(polygonDefect([[0, 0], [1, 1], [1, 0], [0, 1]])).toEqual({ kind: 'edges-cross', first: 0, second: 2, at: [0.5, 0.5] }); // hand-computed
  });

  it('refuses outlines that touch themselves away from neighbouring corners', () => {
    // Two triangles meeting at (2, 1): edges 0 and 3 share that point without being neighbours.
    expect(polygonDefect([[0, 0], [2, 1], [4, 0], [4, 3], [2, 1], [0, 3]])).toEqual({ kind: 'edges-touch', first: 0, second: 3, at: [2, 1] }); // hand-computed
    // points[4] = (4, 2) lies on the middle of edge 1, from (4, 0) to (4, 4).
    expect(polygonDefect([[0, 0], [4, 0], [4, 4], [3, 4], [4, 2]])).toEqual({ kind: 'edges-touch', first: 1, second: 3, at: [4, 2] }); // hand-computed
    expect(polygonDefect([[0, 0], [2, 0], [1, 0], [1, 1]])).toEqual({ kind: 'edge-folds-back', first: 0, second: 1 }); // hand-computed
  });

  it('refuses too few or too many points, repeated points and no area', () => {
    expect(polygonDefect([[0, 0], [1, 1]])).toEqual({ kind: 'too-few', count: 2 }); // README "Objects": at least 3 points
    const many = Array.from({ length: 65 }, (_, k): [number, number] => [Math.cos(k / 10), Math.sin(k / 10)]);
    expect(polygonDefect(many)).toEqual({ kind: 'too-many', count: 65 }); // README "Objects": at most 64
    expect(polygonDefect([[0, 0], [1, 0], [1, 0], [0, 1]])).toEqual({ kind: 'repeated-point', index: 1 }); // hand-computed
    expect(polygonDefect([[0, 0], [1, 1], [3, 3]])).toEqual({ kind: 'no-area' }); // hand-computed: all on y = x
  });
});
