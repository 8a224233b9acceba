/**
 * Exact areas of the scenario's shapes inside an axis-aligned box (README "Objects"): a
 * circle by integrating its chord, a rectangle by intersection, a polygon by clipping; and
 * how a box is shared among overlapping shapes, later on top.
 */
import { gaussLegendre } from '../exact/gauss-legendre.ts';
import { boundingBox, polygonSignedArea, type Box, type Circle, type Shape } from './geometry.ts';
import { layeredLengths, segmentInside } from './geometry-segments.ts';

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
