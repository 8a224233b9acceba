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
import { gaussLegendre } from '../exact/gauss-legendre.ts';
import type { CircleObject, PolygonObject, RectangleObject } from './types.ts';

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

/**
 * ∫ from u to v of the half-chord √(r² − t²) dt, for −r ≤ u ≤ v ≤ r: with t = r·sin θ the
 * primitive is ½(t·√(r² − t²) + r²·θ). The difference θv − θu is taken as one atan2 of
 * sin(θv − θu) and cos(θv − θu), and √(r² − t²) as √((r − t)(r + t)), so a piece next to
 * the circle's edge (u near r) keeps its digits instead of cancelling asin values near π/2.
 */
function halfChordIntegral(u: number, v: number, r: number): number {
  const root = (t: number) => Math.sqrt(Math.max(0, (r - t) * (r + t)));
  const ru = root(u);
  const rv = root(v);
  const angle = Math.atan2(v * ru - u * rv, ru * rv + u * v);
  return 0.5 * (v * rv - u * ru) + 0.5 * r * r * angle;
}

/**
 * Exact area of a circle (centre (cx, cy), radius r) inside a box, m², by integrating over
 * x the length of the vertical chord that lies between the box's y0 and y1. The chord's
 * ends are either the box's sides or ±√(r² − t²); the integration range is split where
 * they swap, so each piece is a sum of constants and √(r² − t²), whose integral is
 * closed-form (`halfChordIntegral`).
 */
function circleBoxArea(cx: number, cy: number, r: number, box: Box): number {
  if (!(r > 0)) return 0;
  const y0 = box.y0 - cy;
  const y1 = box.y1 - cy;
  const xa = Math.max(box.x0 - cx, -r);
  const xb = Math.min(box.x1 - cx, r);
  if (!(xb > xa) || !(y1 > y0) || y0 >= r || y1 <= -r) return 0;
  const cuts = [xa, xb];
  for (const y of [y0, y1]) {
    if (Math.abs(y) >= r) continue;
    const s = Math.sqrt((r - Math.abs(y)) * (r + Math.abs(y)));
    for (const t of [-s, s]) if (t > xa && t < xb) cuts.push(t);
  }
  cuts.sort((p, q) => p - q);
  let area = 0;
  for (let k = 0; k + 1 < cuts.length; k++) {
    const u = cuts[k];
    const v = cuts[k + 1];
    if (!(v > u)) continue;
    const mid = 0.5 * (u + v);
    const h = Math.sqrt(Math.max(0, r * r - mid * mid));
    const topIsChord = h < y1;
    const bottomIsChord = -h > y0;
    if ((topIsChord ? h : y1) <= (bottomIsChord ? -h : y0)) continue;
    const chordIntegral = halfChordIntegral(u, v, r);
    const top = topIsChord ? chordIntegral : y1 * (v - u);
    const bottom = bottomIsChord ? -chordIntegral : y0 * (v - u);
    area += top - bottom;
  }
  return area;
}

/**
 * The part of a polygon inside a box, by Sutherland–Hodgman clipping against the box's four
 * sides in turn (Sutherland & Hodgman, "Reentrant polygon clipping", CACM 17(1), 1974). A
 * concave polygon may come out with edges running along the box's sides twice; they
 * enclose no area, so the shoelace area of the result is still exact. A side at ±Infinity
 * clips nothing, so a horizontal strip is the box { x0: −∞, x1: ∞, y0, y1 }.
 *
 * @example
 * polygonSignedArea(clipPolygon([[0, 0], [2, 0], [0, 2]], { x0: 0, y0: 0, x1: 1, y1: 1 })); // 1: the unit square lies under the edge x + y = 2
 */
export function clipPolygon(points: readonly (readonly [number, number])[], box: Box): [number, number][] {
  let xs = points.map((p) => p[0]);
  let ys = points.map((p) => p[1]);
  // Each side as (axis, bound, keep ≥ or ≤).
  const sides: [0 | 1, number, 1 | -1][] = [[0, box.x0, 1], [0, box.x1, -1], [1, box.y0, 1], [1, box.y1, -1]];
  for (const [axis, bound, dir] of sides) {
    if (!Number.isFinite(bound)) continue;
    const u = axis === 0 ? xs : ys;
    const v = axis === 0 ? ys : xs;
    const nu: number[] = [];
    const nv: number[] = [];
    const n = u.length;
    for (let k = 0; k < n; k++) {
      const m = k === 0 ? n - 1 : k - 1;
      const curIn = dir * (u[k] - bound) >= 0;
      const prevIn = dir * (u[m] - bound) >= 0;
      if (curIn !== prevIn) {
        nu.push(bound);
        nv.push(v[m] + ((bound - u[m]) * (v[k] - v[m])) / (u[k] - u[m]));
      }
      if (curIn) { nu.push(u[k]); nv.push(v[k]); }
    }
    if (axis === 0) { xs = nu; ys = nv; } else { ys = nu; xs = nv; }
    if (xs.length === 0) break;
  }
  return xs.map((x, k) => [x, ys[k]]);
}

/**
 * Exact area of the part of a shape inside an axis-aligned box, m². Circle: the chord
 * integral of `circleBoxArea` above; rectangle: the overlap of the two boxes; polygon:
 * Sutherland–Hodgman clipping then the shoelace formula.
 *
 * @example
 * areaInBox({ shape: 'circle', x: 0, y: 0, radius: 1 }, { x0: 0, y0: 0, x1: 2, y1: 2 }); // π/4
 */
export function areaInBox(s: Shape, box: Box): number {
  switch (s.shape) {
    case 'circle': return circleBoxArea(s.x, s.y, s.radius, box);
    case 'rectangle': {
      const b = boundingBox(s);
      const w = Math.min(b.x1, box.x1) - Math.max(b.x0, box.x0);
      const h = Math.min(b.y1, box.y1) - Math.max(b.y0, box.y0);
      return w > 0 && h > 0 ? w * h : 0;
    }
    case 'polygon': {
      const b = boundingBox(s);
      if (b.x1 <= box.x0 || b.x0 >= box.x1 || b.y1 <= box.y0 || b.y0 >= box.y1) return 0;
      return Math.abs(polygonSignedArea(clipPolygon(s.points, box)));
    }
  }
}

/** Parameter intervals [t0, t1] ⊂ [0, 1] along a segment, sorted and disjoint. */
export type Intervals = [number, number][];

/**
 * The parts of the segment from (ax, ay) to (bx, by) that lie in the closed shape, as
 * intervals of the parameter t (the point a + t·(b − a)), sorted and disjoint.
 * Circle: the roots of |a + t(b − a) − centre|² = r². Rectangle: Liang–Barsky clipping
 * (Liang & Barsky, "A new concept and method for line clipping", ACM TOG 3(1), 1984).
 * Polygon: the segment is cut where it meets an edge or passes through a vertex, and each
 * piece is classified by its midpoint with {@link containsPoint}, so pieces running along
 * an edge count as inside.
 *
 * @example
 * segmentInside({ shape: 'circle', x: 0, y: 0, radius: 1 }, -2, 0, 2, 0); // [[0.25, 0.75]]
 */
export function segmentInside(s: Shape, ax: number, ay: number, bx: number, by: number): Intervals {
  const ex = bx - ax;
  const ey = by - ay;
  const len2 = ex * ex + ey * ey;
  if (!(len2 > 0)) return containsPoint(s, ax, ay) ? [[0, 1]] : [];
  const tol = boundaryTolerance(s);
  switch (s.shape) {
    case 'circle': {
      const r = s.radius + tol;
      const fx = ax - s.x;
      const fy = ay - s.y;
      const half = fx * ex + fy * ey;
      const c = fx * fx + fy * fy - r * r;
      const disc = half * half - len2 * c;
      if (disc < 0) return [];
      const root = Math.sqrt(disc);
      // The product of the roots is c/len2: take the larger-magnitude root first to avoid cancellation.
      const q = half >= 0 ? -(half + root) : -(half - root);
      let t0: number;
      let t1: number;
      if (q === 0) { t0 = 0; t1 = 0; } else { t0 = q / len2; t1 = c / q; }
      if (t0 > t1) [t0, t1] = [t1, t0];
      return clampInterval(t0, t1);
    }
    case 'rectangle': {
      const b = boundingBox(s);
      let t0 = 0;
      let t1 = 1;
      const clip = (p: number, q: number): boolean => {
        // p·t ≤ q must hold on the kept part (Liang–Barsky).
        if (p === 0) return q >= 0;
        const t = q / p;
        if (p < 0) { if (t > t0) t0 = t; } else if (t < t1) { t1 = t; }
        return t0 <= t1;
      };
      if (!clip(-ex, ax - (b.x0 - tol)) || !clip(ex, b.x1 + tol - ax) || !clip(-ey, ay - (b.y0 - tol)) || !clip(ey, b.y1 + tol - ay)) return [];
      return [[t0, t1]];
    }
    case 'polygon': return polygonSegmentInside(s, ax, ay, ex, ey, len2, tol);
  }
}

function clampInterval(t0: number, t1: number): Intervals {
  const u = Math.max(0, t0);
  const v = Math.min(1, t1);
  return u <= v ? [[u, v]] : [];
}

function polygonSegmentInside(s: Polygon, ax: number, ay: number, ex: number, ey: number, len2: number, tol: number): Intervals {
  const pts = s.points;
  const n = pts.length;
  const cuts = [0, 1];
  const len = Math.sqrt(len2);
  for (let k = 0, m = n - 1; k < n; m = k++) {
    const [px, py] = pts[m];
    const [qx, qy] = pts[k];
    // A vertex on (or within the band of) the segment cuts it where it projects.
    const tv = ((qx - ax) * ex + (qy - ay) * ey) / len2;
    if (tv > 0 && tv < 1 && Math.abs((qx - ax) * ey - (qy - ay) * ex) / len <= tol) cuts.push(tv);
    const fx = qx - px;
    const fy = qy - py;
    const denom = ex * fy - ey * fx;
    if (denom === 0) continue;
    const t = ((px - ax) * fy - (py - ay) * fx) / denom;
    const u = ((px - ax) * ey - (py - ay) * ex) / denom;
    if (t > 0 && t < 1 && u >= 0 && u <= 1) cuts.push(t);
  }
  cuts.sort((p, q) => p - q);
  const out: Intervals = [];
  for (let k = 0; k + 1 < cuts.length; k++) {
    const u = cuts[k];
    const v = cuts[k + 1];
    if (!(v > u)) continue;
    const mid = 0.5 * (u + v);
    if (!containsPoint(s, ax + mid * ex, ay + mid * ey)) continue;
    const last = out[out.length - 1];
    if (last !== undefined && last[1] >= u) last[1] = v;
    else out.push([u, v]);
  }
  return out;
}

/**
 * Length of the segment from (ax, ay) to (bx, by) lying outside the closed shape, m.
 *
 * @example
 * lengthOutside({ shape: 'rectangle', x0: 0, y0: 0, x1: 1, y1: 1 }, -1, 0.5, 2, 0.5); // 2
 */
export function lengthOutside(s: Shape, ax: number, ay: number, bx: number, by: number): number {
  const len = Math.hypot(bx - ax, by - ay);
  let inside = 0;
  for (const [u, v] of segmentInside(s, ax, ay, bx, by)) inside += v - u;
  return Math.max(0, len * (1 - inside));
}

/**
 * How a segment is shared out among overlapping shapes, later shapes covering earlier ones:
 * entry k is the length, m, of the part whose last containing shape is shapes[k]. The rest
 * of the segment lies outside them all.
 *
 * @example
 * layeredLengths([{ shape: 'rectangle', x0: 0, y0: 0, x1: 2, y1: 1 }, { shape: 'rectangle', x0: 1, y0: 0, x1: 3, y1: 1 }],
 *   -1, 0.5, 4, 0.5); // [1, 2]
 */
export function layeredLengths(shapes: readonly Shape[], ax: number, ay: number, bx: number, by: number): number[] {
  const len = Math.hypot(bx - ax, by - ay);
  return layeredFractions(shapes.map((s) => segmentInside(s, ax, ay, bx, by))).map((f) => f * len);
}

/** The share of [0, 1] whose last covering interval list is entry k. */
function layeredFractions(lists: readonly Intervals[]): number[] {
  const out = lists.map(() => 0);
  const cuts = [0, 1];
  for (const list of lists) for (const [u, v] of list) cuts.push(u, v);
  cuts.sort((p, q) => p - q);
  for (let k = 0; k + 1 < cuts.length; k++) {
    const u = cuts[k];
    const v = cuts[k + 1];
    if (!(v > u)) continue;
    const mid = 0.5 * (u + v);
    for (let s = lists.length - 1; s >= 0; s--) {
      if (lists[s].some(([p, q]) => p <= mid && mid <= q)) { out[s] += v - u; break; }
    }
  }
  return out;
}

/** Rows (Gauss–Legendre points) per stretch when overlapping shapes share a box out numerically. */
const ROWS_PER_STRETCH = 16;

/**
 * How a box is shared out among overlapping shapes, later shapes covering earlier ones:
 * entry k is the area, m², whose last containing shape is shapes[k]. Exact when at most one
 * shape cuts the box after the last shape that covers it whole (the usual case, one
 * boundary through a grid cell). Otherwise the box is cut into horizontal stretches at
 * every height where a shape has a vertex, a side, its top or bottom, or where two outlines
 * cross each other or the box's sides, so that inside a stretch each share varies smoothly
 * with height. Each stretch is integrated over 16 rows, each shared out exactly by
 * `layeredLengths`: the 16-point Gauss–Legendre rule (Abramowitz & Stegun 25.4.29) in θ
 * after the substitution y = centre − half·cos θ, which absorbs the √(y − y_top) growth of
 * a circle's chord at the ends of a stretch.
 *
 * @example
 * layeredAreas([{ shape: 'rectangle', x0: 0, y0: 0, x1: 1, y1: 1 }, { shape: 'circle', x: 0.5, y: 0.5, radius: 0.25 }],
 *   { x0: 0, y0: 0, x1: 1, y1: 1 }); // [1 − π/16, π/16]
 */
export function layeredAreas(shapes: readonly Shape[], box: Box): number[] {
  const w = box.x1 - box.x0;
  const h = box.y1 - box.y0;
  const full = w * h;
  const areas = shapes.map((s) => areaInBox(s, box));
  const out = shapes.map(() => 0);
  let base = -1;
  for (let k = areas.length - 1; k >= 0; k--) if (areas[k] >= full * (1 - 1e-12)) { base = k; break; }
  const cutting: number[] = [];
  for (let k = base + 1; k < areas.length; k++) if (areas[k] > 0) cutting.push(k);
  if (cutting.length <= 1) {
    const top = cutting.length === 1 ? Math.min(areas[cutting[0]], full) : 0;
    if (cutting.length === 1) out[cutting[0]] = top;
    if (base >= 0) out[base] = full - top;
    return out;
  }
  const involved = base >= 0 ? [base, ...cutting] : cutting;
  const breaks = new Set<number>([box.y0, box.y1]);
  const addBreak = (y: number) => { if (y > box.y0 && y < box.y1) breaks.add(y); };
  for (const k of involved) breakHeights(shapes[k]).forEach(addBreak);
  const sides: Shape = { shape: 'rectangle', ...box };
  for (let p = 0; p < involved.length; p++) {
    crossingHeights(shapes[involved[p]], sides).forEach(addBreak);
    for (let q = p + 1; q < involved.length; q++) crossingHeights(shapes[involved[p]], shapes[involved[q]]).forEach(addBreak);
  }
  const ys = [...breaks].sort((p, q) => p - q);
  const list = involved.map((k) => shapes[k]);
  const rule = gaussLegendre(ROWS_PER_STRETCH);
  for (let m = 0; m + 1 < ys.length; m++) {
    // y = centre − half·cos θ, θ ∈ [0, π]: a circle's chord, growing like √(y − y_top) at
    // the end of a stretch, times dy/dθ = half·sin θ is smooth in θ.
    const centre = 0.5 * (ys[m] + ys[m + 1]);
    const half = 0.5 * (ys[m + 1] - ys[m]);
    for (let r = 0; r < ROWS_PER_STRETCH; r++) {
      const theta = 0.5 * Math.PI * (1 + rule.nodes[r]);
      const y = centre - half * Math.cos(theta);
      const weight = half * Math.sin(theta) * 0.5 * Math.PI * rule.weights[r];
      const lengths = layeredLengths(list, box.x0, y, box.x1, y);
      involved.forEach((k, q) => { out[k] += lengths[q] * weight; });
    }
  }
  return out;
}

/** A shape's outline: a circle, or straight edges [ax, ay, bx, by]. */
type Outline = { circle: Circle } | { edges: [number, number, number, number][] };

function outlineOf(s: Shape): Outline {
  if (s.shape === 'circle') return { circle: s };
  const pts: [number, number][] = s.shape === 'polygon' ? s.points : [[s.x0, s.y0], [s.x1, s.y0], [s.x1, s.y1], [s.x0, s.y1]];
  return { edges: pts.map(([x, y], k) => [x, y, pts[(k + 1) % pts.length][0], pts[(k + 1) % pts.length][1]]) };
}

/**
 * Heights where the outlines of two shapes cross: circle–circle by the radical line
 * (Weisstein, "Circle–Circle Intersection", MathWorld), circle–edge by the roots of
 * `segmentInside`, edge–edge by solving the two line equations.
 */
function crossingHeights(p: Shape, q: Shape): number[] {
  const a = outlineOf(p);
  const b = outlineOf(q);
  const out: number[] = [];
  if ('circle' in a && 'circle' in b) {
    const c1 = a.circle;
    const c2 = b.circle;
    const d = Math.hypot(c2.x - c1.x, c2.y - c1.y);
    if (d === 0 || d > c1.radius + c2.radius || d < Math.abs(c1.radius - c2.radius)) return out;
    const along = (d * d + c1.radius * c1.radius - c2.radius * c2.radius) / (2 * d);
    const across = Math.sqrt(Math.max(0, c1.radius * c1.radius - along * along));
    const ym = c1.y + (along * (c2.y - c1.y)) / d;
    const dy = (across * (c2.x - c1.x)) / d;
    return [ym + dy, ym - dy];
  }
  if ('circle' in a || 'circle' in b) {
    const c = 'circle' in a ? a.circle : (b as { circle: Circle }).circle;
    const edges = 'edges' in a ? a.edges : (b as { edges: [number, number, number, number][] }).edges;
    for (const [ax, ay, bx, by] of edges) {
      for (const [t0, t1] of segmentInside(c, ax, ay, bx, by)) out.push(ay + t0 * (by - ay), ay + t1 * (by - ay));
    }
    return out;
  }
  for (const [ax, ay, bx, by] of (a as { edges: [number, number, number, number][] }).edges) {
    for (const [cx, cy, dx, dy] of (b as { edges: [number, number, number, number][] }).edges) {
      const rx = bx - ax; const ry = by - ay;
      const sx = dx - cx; const sy = dy - cy;
      const denom = rx * sy - ry * sx;
      if (denom === 0) continue;
      const t = ((cx - ax) * sy - (cy - ay) * sx) / denom;
      const u = ((cx - ax) * ry - (cy - ay) * rx) / denom;
      if (t >= 0 && t <= 1 && u >= 0 && u <= 1) out.push(ay + t * ry);
    }
  }
  return out;
}

/** Heights where a horizontal chord of the shape changes form. */
function breakHeights(s: Shape): number[] {
  switch (s.shape) {
    case 'circle': return [s.y - s.radius, s.y + s.radius];
    case 'rectangle': return [s.y0, s.y1];
    case 'polygon': return s.points.map(([, y]) => y);
  }
}
