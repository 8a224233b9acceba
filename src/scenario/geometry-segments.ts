/**
 * The parts of a segment inside the scenario's shapes (README "Objects"), as intervals of
 * its parameter, and how a segment is shared among overlapping shapes, later on top.
 */
import { boundaryTolerance, boundingBox, containsPoint, type Polygon, type Shape } from './geometry.ts';

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
