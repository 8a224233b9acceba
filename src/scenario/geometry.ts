/**
 * Plane geometry of the scenario's objects (README "Objects"), in metres: whether a point
 * lies in a shape, bounding boxes and areas, the checks that make a polygon usable, the
 * exact area a shape covers of an axis-aligned box, and the parts of a segment inside a
 * shape. Shapes are closed: a point on the boundary counts as inside. Because grid
 * positions are computed as i·dx, a point within a relative 1e-12 of the shape's size
 * (or of its coordinates, whichever is larger) from the boundary counts as on it, so a
 * node meant to sit on an edge is not lost to rounding.
 *
 * When objects overlap, later ones cover earlier ones: `layeredLengths` and
 * `layeredAreas` share a segment or a box out among a list of shapes in that order.
 */
import type { CircleObject, PolygonObject, RectangleObject, SceneObject } from './types.ts';

export type Circle = Pick<CircleObject, 'shape' | 'x' | 'y' | 'radius'>;
export type Rectangle = Pick<RectangleObject, 'shape' | 'x0' | 'y0' | 'x1' | 'y1'>;
export type Polygon = Pick<PolygonObject, 'shape' | 'points'>;
/** An object's outline without its name and material; every `SceneObject` is one. */
export type Shape = Circle | Rectangle | Polygon;

/** An axis-aligned box, m, with x0 ≤ x1 and y0 ≤ y1. */
export interface Box { x0: number; y0: number; x1: number; y1: number }

/** Most vertices a polygon may have. */
export const POLYGON_MAX_POINTS = 64;

/** Width of the band around a boundary that counts as on it, relative to the shape's scale. */
const BOUNDARY_RELATIVE = 1e-12;

/**
 * The smallest box holding the shape.
 *
 * @example
 * boundingBox({ shape: 'circle', x: 0.1, y: 0.2, radius: 0.01 }); // { x0: 0.09, y0: 0.19, x1: 0.11, y1: 0.21 }
 */
export function boundingBox(s: Shape): Box {
  switch (s.shape) {
    case 'circle': return { x0: s.x - s.radius, y0: s.y - s.radius, x1: s.x + s.radius, y1: s.y + s.radius };
    case 'rectangle': return { x0: Math.min(s.x0, s.x1), y0: Math.min(s.y0, s.y1), x1: Math.max(s.x0, s.x1), y1: Math.max(s.y0, s.y1) };
    case 'polygon': {
      let x0 = Infinity; let y0 = Infinity; let x1 = -Infinity; let y1 = -Infinity;
      for (const [x, y] of s.points) {
        if (x < x0) x0 = x;
        if (x > x1) x1 = x;
        if (y < y0) y0 = y;
        if (y > y1) y1 = y;
      }
      return { x0, y0, x1, y1 };
    }
  }
}

/** Distance from the boundary within which a point counts as on it, m. */
export function boundaryTolerance(s: Shape): number {
  const b = boundingBox(s);
  const scale = Math.max(Math.abs(b.x0), Math.abs(b.x1), Math.abs(b.y0), Math.abs(b.y1), b.x1 - b.x0, b.y1 - b.y0);
  return BOUNDARY_RELATIVE * scale;
}

/**
 * Twice-signed area of a polygon by the shoelace formula (Gauss's area formula), halved:
 * positive when the points run counter-clockwise, m².
 *
 * @example
 * polygonSignedArea([[0, 0], [1, 0], [0, 1]]); // 0.5
 */
export function polygonSignedArea(points: readonly (readonly [number, number])[]): number {
  let twice = 0;
  const n = points.length;
  for (let k = 0, m = n - 1; k < n; m = k++) twice += points[m][0] * points[k][1] - points[k][0] * points[m][1];
  return twice / 2;
}

/**
 * Area of the shape, m² (a polygon's taken unsigned, so either orientation gives the same).
 *
 * @example
 * shapeArea({ shape: 'rectangle', x0: 0, y0: 0, x1: 0.02, y1: 0.01 }); // 0.0002
 */
export function shapeArea(s: Shape): number {
  switch (s.shape) {
    case 'circle': return Math.PI * s.radius * s.radius;
    case 'rectangle': return Math.abs(s.x1 - s.x0) * Math.abs(s.y1 - s.y0);
    case 'polygon': return Math.abs(polygonSignedArea(s.points));
  }
}

/** Distance from (px, py) to the segment from (ax, ay) to (bx, by), m. */
function distanceToSegment(px: number, py: number, ax: number, ay: number, bx: number, by: number): number {
  const ex = bx - ax;
  const ey = by - ay;
  const len2 = ex * ex + ey * ey;
  let t = len2 > 0 ? ((px - ax) * ex + (py - ay) * ey) / len2 : 0;
  t = t < 0 ? 0 : t > 1 ? 1 : t;
  return Math.hypot(px - (ax + t * ex), py - (ay + t * ey));
}

/**
 * Whether the point (x, y) lies in the closed shape (boundary included, within the
 * rounding band of the module comment). Polygons: on an edge counts as inside, otherwise
 * the crossing-number (even–odd) test of a ray towards +x (Shimrat, CACM 5(8), 1962,
 * Algorithm 112; Haines, "Point in polygon strategies", Graphics Gems IV, 1994).
 *
 * @example
 * containsPoint({ shape: 'polygon', points: [[0, 0], [1, 0], [0, 1]] }, 0.5, 0.5); // true (on the slanted edge)
 */
export function containsPoint(s: Shape, x: number, y: number): boolean {
  const tol = boundaryTolerance(s);
  switch (s.shape) {
    case 'circle': {
      const r = s.radius + tol;
      const dx = x - s.x;
      const dy = y - s.y;
      return dx * dx + dy * dy <= r * r;
    }
    case 'rectangle': {
      const b = boundingBox(s);
      return x >= b.x0 - tol && x <= b.x1 + tol && y >= b.y0 - tol && y <= b.y1 + tol;
    }
    case 'polygon': {
      const pts = s.points;
      const n = pts.length;
      let inside = false;
      for (let k = 0, m = n - 1; k < n; m = k++) {
        const [ax, ay] = pts[m];
        const [bx, by] = pts[k];
        if (distanceToSegment(x, y, ax, ay, bx, by) <= tol) return true;
        if ((ay > y) !== (by > y) && x < ax + ((y - ay) * (bx - ax)) / (by - ay)) inside = !inside;
      }
      return inside;
    }
  }
}

/**
 * Whether the point (x, y) lies on the shape's boundary, within the rounding band of the
 * module comment.
 *
 * @example
 * onBoundary({ shape: 'circle', x: 0, y: 0, radius: 1 }, 0, 1); // true
 */
export function onBoundary(s: Shape, x: number, y: number): boolean {
  const tol = boundaryTolerance(s);
  switch (s.shape) {
    case 'circle': return Math.abs(Math.hypot(x - s.x, y - s.y) - s.radius) <= tol;
    case 'rectangle': {
      const b = boundingBox(s);
      const inBand = x >= b.x0 - tol && x <= b.x1 + tol && y >= b.y0 - tol && y <= b.y1 + tol;
      const deepInside = x > b.x0 + tol && x < b.x1 - tol && y > b.y0 + tol && y < b.y1 - tol;
      return inBand && !deepInside;
    }
    case 'polygon': {
      const pts = s.points;
      for (let k = 0, m = pts.length - 1; k < pts.length; m = k++) {
        if (distanceToSegment(x, y, pts[m][0], pts[m][1], pts[k][0], pts[k][1]) <= tol) return true;
      }
      return false;
    }
  }
}

/**
 * Index of the last shape in the list whose closed outline holds the point (later shapes
 * cover earlier ones), or −1 when none does.
 *
 * @example
 * topShapeAt([{ shape: 'circle', x: 0, y: 0, radius: 1 }, { shape: 'circle', x: 1, y: 0, radius: 1 }], 0.5, 0); // 1
 */
export function topShapeAt(shapes: readonly Shape[], x: number, y: number): number {
  for (let k = shapes.length - 1; k >= 0; k--) if (containsPoint(shapes[k], x, y)) return k;
  return -1;
}

/** What makes a list of points unusable as a polygon; edge k runs from points[k] to points[k+1] (the last back to points[0]). */
export type PolygonDefect =
  | { kind: 'too-few'; count: number }
  | { kind: 'too-many'; count: number }
  /** points[index] and the point after it are the same point. */
  | { kind: 'repeated-point'; index: number }
  /** All points lie on one straight line. */
  | { kind: 'no-area' }
  /** Two edges that do not share a point cross each other at `at`. */
  | { kind: 'edges-cross'; first: number; second: number; at: [number, number] }
  /** Two edges that do not share a point touch or run along each other at `at`. */
  | { kind: 'edges-touch'; first: number; second: number; at: [number, number] }
  /** An edge turns straight back along the edge before it. */
  | { kind: 'edge-folds-back'; first: number; second: number };

/**
 * The first reason a list of points is not a simple polygon of at most
 * {@link POLYGON_MAX_POINTS} vertices with an area, or undefined when it is one. Simple:
 * no two edges that do not share a vertex meet (touching counts), and no edge runs back
 * along its neighbour. Either orientation is accepted. Every pair of edges is tested with
 * orientation predicates (Cormen, Leiserson, Rivest & Stein, Introduction to Algorithms,
 * 3rd ed., §33.1, "Determining whether two line segments intersect"); at most 64 vertices
 * keep the 2016 pairs cheap. Collinearity is judged within the rounding band of the module
 * comment.
 *
 * @example
 * polygonDefect([[0, 0], [1, 1], [1, 0], [0, 1]]); // { kind: 'edges-cross', first: 0, second: 2, at: [0.5, 0.5] }
 */
export function polygonDefect(points: readonly (readonly [number, number])[]): PolygonDefect | undefined {
  const n = points.length;
  if (n < 3) return { kind: 'too-few', count: n };
  if (n > POLYGON_MAX_POINTS) return { kind: 'too-many', count: n };
  const tol = boundaryTolerance({ shape: 'polygon', points: points as [number, number][] });
  const p = (k: number) => points[k % n];
  for (let k = 0; k < n; k++) {
    const [ax, ay] = p(k);
    const [bx, by] = p(k + 1);
    if (Math.hypot(bx - ax, by - ay) <= tol) return { kind: 'repeated-point', index: k };
  }
  if (allOnOneLine(points, tol)) return { kind: 'no-area' };
  for (let k = 0; k < n; k++) {
    // Neighbours share a vertex; they only spoil the outline when the second turns back along the first.
    const [ax, ay] = p(k);
    const [bx, by] = p(k + 1);
    const [cx, cy] = p(k + 2);
    const ux = bx - ax; const uy = by - ay;
    const vx = cx - bx; const vy = cy - by;
    const sine = (ux * vy - uy * vx) / Math.hypot(ux, uy);
    if (Math.abs(sine) <= tol && ux * vx + uy * vy < 0) return { kind: 'edge-folds-back', first: k, second: (k + 1) % n };
  }
  for (let a = 0; a < n; a++) {
    for (let b = a + 2; b < n; b++) {
      if (a === 0 && b === n - 1) continue; // neighbours through points[0]
      const meet = segmentsMeet(p(a), p(a + 1), p(b), p(b + 1), tol);
      if (meet !== undefined) return { kind: meet.proper ? 'edges-cross' : 'edges-touch', first: a, second: b, at: meet.at };
    }
  }
  return undefined;
}

function allOnOneLine(points: readonly (readonly [number, number])[], tol: number): boolean {
  const [x0, y0] = points[0];
  let far = 0;
  let farDistance = 0;
  for (let k = 1; k < points.length; k++) {
    const d = Math.hypot(points[k][0] - x0, points[k][1] - y0);
    if (d > farDistance) { far = k; farDistance = d; }
  }
  if (farDistance <= tol) return true;
  const ux = (points[far][0] - x0) / farDistance;
  const uy = (points[far][1] - y0) / farDistance;
  return points.every(([x, y]) => Math.abs((x - x0) * uy - (y - y0) * ux) <= tol);
}

/** Signed distance of c from the line through a and b (positive to the left), 0 within tol. */
function side(a: readonly [number, number], b: readonly [number, number], c: readonly [number, number], tol: number): number {
  const len = Math.hypot(b[0] - a[0], b[1] - a[1]);
  const d = ((b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0])) / len;
  return Math.abs(d) <= tol ? 0 : Math.sign(d);
}

/** Where two segments meet, if they do: `proper` when they cross at a point inside both. */
function segmentsMeet(
  a: readonly [number, number], b: readonly [number, number], c: readonly [number, number], d: readonly [number, number], tol: number,
): { proper: boolean; at: [number, number] } | undefined {
  const o1 = side(a, b, c, tol);
  const o2 = side(a, b, d, tol);
  const o3 = side(c, d, a, tol);
  const o4 = side(c, d, b, tol);
  if (o1 * o2 < 0 && o3 * o4 < 0) {
    const rx = b[0] - a[0]; const ry = b[1] - a[1];
    const sx = d[0] - c[0]; const sy = d[1] - c[1];
    const t = ((c[0] - a[0]) * sy - (c[1] - a[1]) * sx) / (rx * sy - ry * sx);
    return { proper: true, at: [a[0] + t * rx, a[1] + t * ry] };
  }
  const on = (p: readonly [number, number], q: readonly [number, number], r: readonly [number, number]) =>
    distanceToSegment(r[0], r[1], p[0], p[1], q[0], q[1]) <= tol;
  if (o1 === 0 && on(a, b, c)) return { proper: false, at: [c[0], c[1]] };
  if (o2 === 0 && on(a, b, d)) return { proper: false, at: [d[0], d[1]] };
  if (o3 === 0 && on(c, d, a)) return { proper: false, at: [a[0], a[1]] };
  if (o4 === 0 && on(c, d, b)) return { proper: false, at: [b[0], b[1]] };
  return undefined;
}

/** An object moved by (ox, oy) metres. */
export function shiftObject(o: SceneObject, ox: number, oy: number): SceneObject {
  switch (o.shape) {
    case 'circle': return { ...o, x: o.x + ox, y: o.y + oy };
    case 'rectangle': return { ...o, x0: o.x0 + ox, y0: o.y0 + oy, x1: o.x1 + ox, y1: o.y1 + oy };
    case 'polygon': return { ...o, points: o.points.map(([x, y]) => [x + ox, y + oy] as [number, number]) };
  }
}
