/**
 * The sample points of one field component over the part of the grid near objects, and
 * how the objects cover them: the staircase owner of each point and, for the blending
 * fills, the share of the dx × dy cell around it each object takes (used by
 * build-material-map.ts and conformal-fill.ts).
 */
import { C0 } from '../scenario/constants.ts';
import { boundingBox, containsPoint, polygonSignedArea, type Box, type Shape } from '../scenario/geometry.ts';
import { clipPolygon, layeredAreas } from '../scenario/geometry-area.ts';
import { segmentInside } from '../scenario/geometry-segments.ts';
import type { Layout } from '../scenario/layout.ts';
import type { Fill, Medium, Polarization, Scenario, SceneObject } from '../scenario/types.ts';

/** Offsets of a component's sample point (i + ox, j + oy), in cells. */
export interface Lattice { ox: number; oy: number; name: 'a' | 'b' | 'c' }
export const LATTICE_A: Lattice = { ox: 0, oy: 0, name: 'a' };
export const LATTICE_B: Lattice = { ox: 0, oy: 0.5, name: 'b' };
export const LATTICE_C: Lattice = { ox: 0.5, oy: 0, name: 'c' };

/** Relative slack on "the whole cell" and "nothing at all". */
export const WHOLE = 1e-12;

/** Run of sample points [j, iFrom, iTo] in one row. */
export type Run = [number, number, number];

/** Grid, objects, and the index rectangle worth visiting (two cells around every object). */
export class GridContext {
  readonly nx: number;
  readonly ny: number;
  readonly dx: number;
  readonly dy: number;
  readonly dt: number;
  readonly objects: SceneObject[];
  readonly boxes: Box[];
  readonly background: Medium;
  readonly i0: number;
  readonly i1: number;
  readonly j0: number;
  readonly j1: number;
  readonly width: number;
  /** Runs of sample points within two cells of some object, in k order. */
  readonly runs: Run[];
  /** Runs within two cells of some conductor, in k order. */
  readonly metalRuns: Run[];

  constructor(s: MaterialScenario, layout: Layout) {
    ({ nx: this.nx, ny: this.ny, dx: this.dx, dy: this.dy, dt: this.dt } = layout);
    this.objects = s.objects ?? [];
    this.background = s.medium;
    this.boxes = this.objects.map((o) => boundingBox(o));
    const near = this.boxes.map((b) => this.indexBox(b, 0, this.nx - 1, 0, this.ny - 1));
    this.i0 = Math.min(...near.map((r) => r.i0));
    this.i1 = Math.max(...near.map((r) => r.i1));
    this.j0 = Math.min(...near.map((r) => r.j0));
    this.j1 = Math.max(...near.map((r) => r.j1));
    this.width = this.i1 - this.i0 + 1;
    this.runs = runsOf(near, this.j0, this.j1);
    this.metalRuns = runsOf(near.filter((_, k) => this.isPec(k)), this.j0, this.j1);
  }

  /** Indices within two cells of a box, clipped to [ia, ib] × [ja, jb]. */
  private indexBox(b: Box, ia: number, ib: number, ja: number, jb: number) {
    return {
      i0: clamp(Math.floor(b.x0 / this.dx) - 2, ia, ib), i1: clamp(Math.ceil(b.x1 / this.dx) + 2, ia, ib),
      j0: clamp(Math.floor(b.y0 / this.dy) - 2, ja, jb), j1: clamp(Math.ceil(b.y1 / this.dy) + 2, ja, jb),
    };
  }

  /** Index range of a lattice's sample points within one cell of object k's box. */
  rangeOf(k: number, l: Lattice) {
    const b = this.boxes[k];
    return {
      i0: Math.max(this.i0, Math.ceil(b.x0 / this.dx - l.ox) - 1),
      i1: Math.min(this.i1, Math.floor(b.x1 / this.dx - l.ox) + 1),
      j0: Math.max(this.j0, Math.ceil(b.y0 / this.dy - l.oy) - 1),
      j1: Math.min(this.j1, Math.floor(b.y1 / this.dy - l.oy) + 1),
    };
  }

  inside(i: number, j: number): boolean {
    return i >= this.i0 && i <= this.i1 && j >= this.j0 && j <= this.j1;
  }

  local(i: number, j: number): number {
    return (j - this.j0) * this.width + (i - this.i0);
  }

  /** Objects whose bounding box meets the box. */
  objectsNear(box: Box): number[] {
    const out: number[] = [];
    this.boxes.forEach((b, k) => {
      if (b.x0 <= box.x1 && b.x1 >= box.x0 && b.y0 <= box.y1 && b.y1 >= box.y0) out.push(k);
    });
    return out;
  }

  isPec(k: number): boolean {
    return k >= 0 && this.objects[k].material === 'pec';
  }

  /** The medium of object k (a penetrable one), or the background for k = −1. */
  mediumOf(k: number): Medium {
    return k < 0 ? this.background : (this.objects[k].material as Medium);
  }
}

export function clamp(v: number, lo: number, hi: number): number {
  return Math.min(hi, Math.max(lo, v));
}

/** Merge index boxes into runs per row, in k order. */
export function runsOf(boxes: { i0: number; i1: number; j0: number; j1: number }[], j0: number, j1: number): Run[] {
  const out: Run[] = [];
  if (boxes.length === 0) return out;
  for (let j = j0; j <= j1; j++) {
    const row = boxes.filter((r) => r.j0 <= j && j <= r.j1).sort((p, q) => p.i0 - q.i0);
    let run: Run | undefined;
    for (const r of row) {
      if (run !== undefined && r.i0 <= run[2] + 1) { run[2] = Math.max(run[2], r.i1); continue; }
      if (run !== undefined) out.push(run);
      run = [j, r.i0, r.i1];
    }
    if (run !== undefined) out.push(run);
  }
  return out;
}

/** Objects after the last one covering a cell whole, with the area each covers, m². */
export interface PartCover { objects: number[]; areas: number[] }

/**
 * One component's sample points over the visited rectangle: the staircase owner of each
 * (last object holding it, −1 for none) and, for the blending fills, how the objects cover
 * the dx × dy cell around it (`whole`: the last object covering all of it, −1 for none;
 * `part`: the objects after that one covering some of it).
 */
export class LatticeView {
  readonly owner: Int32Array;
  readonly whole: Int32Array;
  readonly part = new Map<number, PartCover>();

  constructor(readonly g: GridContext, readonly l: Lattice, want: { owners: boolean; cells: boolean }) {
    const size = g.width * (g.j1 - g.j0 + 1);
    this.owner = new Int32Array(want.owners ? size : 0).fill(-1);
    this.whole = new Int32Array(want.cells ? size : 0).fill(-1);
    g.objects.forEach((o, k) => {
      if (want.owners) paintOwners(this, o, k);
      if (want.cells) paintCells(this, o, k);
    });
  }

  x(i: number): number { return (i + this.l.ox) * this.g.dx; }
  y(j: number): number { return (j + this.l.oy) * this.g.dy; }

  cell(i: number, j: number): Box {
    const x = this.x(i);
    const y = this.y(j);
    return { x0: x - 0.5 * this.g.dx, x1: x + 0.5 * this.g.dx, y0: y - 0.5 * this.g.dy, y1: y + 0.5 * this.g.dy };
  }

  /** Whether any object covers some of the cell at local index li. */
  covered(li: number): boolean {
    return this.whole[li] >= 0 || this.part.has(li);
  }

  /** How the cell at (i, j) is shared out: areas, m², per object; the background holds the rest. */
  shares(i: number, j: number): { objects: number[]; areas: number[] } {
    const li = this.g.local(i, j);
    const w = this.whole[li];
    const part = this.part.get(li);
    const cellArea = this.g.dx * this.g.dy;
    if (part === undefined) return w >= 0 ? { objects: [w], areas: [cellArea] } : { objects: [], areas: [] };
    if (part.objects.length === 1) {
      const a = Math.min(part.areas[0], cellArea);
      return w >= 0 ? { objects: [w, part.objects[0]], areas: [cellArea - a, a] } : { objects: part.objects, areas: [a] };
    }
    const objects = w >= 0 ? [w, ...part.objects] : part.objects;
    return { objects, areas: layeredAreas(objects.map((k) => this.g.objects[k]), this.cell(i, j)) };
  }
}

/** Mark the sample points of the lattice held by object k's closed outline as owned by k. */
export function paintOwners(v: LatticeView, o: SceneObject, k: number): void {
  const g = v.g;
  const { i0, i1, j0, j1 } = g.rangeOf(k, v.l);
  const margin = 1e-9 * g.dx;
  for (let j = j0; j <= j1; j++) {
    // One scan line per row; only the points next to where it crosses the outline ask the shape itself.
    const y = v.y(j);
    const xa = v.x(i0) - g.dx;
    const xb = v.x(i1) + g.dx;
    const spans = segmentInside(o, xa, y, xb, y).map(([p, q]) => [xa + p * (xb - xa), xa + q * (xb - xa)]);
    let s = 0;
    for (let i = i0; i <= i1; i++) {
      const x = v.x(i);
      while (s < spans.length && spans[s][1] < x - margin) s++;
      if (s === spans.length || x < spans[s][0] - margin) continue;
      const clear = x > spans[s][0] + margin && x < spans[s][1] - margin;
      if (clear || containsPoint(o, x, y)) v.owner[g.local(i, j)] = k;
    }
  }
}

/** Record, for each cell of the lattice near object k, whether k covers it whole or in part. */
export function paintCells(v: LatticeView, o: SceneObject, k: number): void {
  const g = v.g;
  const { i0, i1, j0, j1 } = g.rangeOf(k, v.l);
  if (i1 < i0) return;
  const cellArea = g.dx * g.dy;
  const hx = 0.5 * g.dx;
  const hy = 0.5 * g.dy;
  const mark = (i: number, j: number, area: number) => {
    if (!(area > 0)) return;
    const li = g.local(i, j);
    if (area >= cellArea * (1 - WHOLE)) { v.whole[li] = k; v.part.delete(li); return; }
    const part = v.part.get(li);
    if (part === undefined) v.part.set(li, { objects: [k], areas: [area] });
    else { part.objects.push(k); part.areas.push(area); }
  };
  if (o.shape !== 'polygon') {
    for (let j = j0; j <= j1; j++) {
      const y = v.y(j);
      for (let i = i0; i <= i1; i++) {
        const x = v.x(i);
        mark(i, j, coveredArea(o, x - hx, y - hy, x + hx, y + hy, cellArea));
      }
    }
    return;
  }
  // Polygons, row by row: the cells an edge passes through get the exact area of the polygon
  // clipped first to the row's strip, then to the cell; the other cells lie wholly inside or
  // outside, as the scan line through their centres says.
  const pts = o.points;
  const onEdge = new Uint8Array(i1 - i0 + 1);
  for (let j = j0; j <= j1; j++) {
    onEdge.fill(0);
    const yc = v.y(j);
    const ylo = yc - hy;
    const yhi = yc + hy;
    for (let e = 0, m = pts.length - 1; e < pts.length; m = e++) {
      const [px, py] = pts[m];
      const [qx, qy] = pts[e];
      if (Math.max(py, qy) < ylo || Math.min(py, qy) > yhi) continue;
      let xa = Math.min(px, qx);
      let xb = Math.max(px, qx);
      if (py !== qy) {
        const xlo = px + clamp((ylo - py) / (qy - py), 0, 1) * (qx - px);
        const xhi = px + clamp((yhi - py) / (qy - py), 0, 1) * (qx - px);
        xa = Math.min(xlo, xhi);
        xb = Math.max(xlo, xhi);
      }
      const lo = Math.max(i0, Math.ceil(xa / g.dx - v.l.ox - 0.5) - 1);
      const hi = Math.min(i1, Math.floor(xb / g.dx - v.l.ox + 0.5) + 1);
      for (let i = lo; i <= hi; i++) onEdge[i - i0] = 1;
    }
    const strip = clipPolygon(pts, { x0: -Infinity, x1: Infinity, y0: ylo, y1: yhi });
    const xa = v.x(i0) - g.dx;
    const xb = v.x(i1) + g.dx;
    const spans = segmentInside(o, xa, yc, xb, yc).map(([p, q]) => [xa + p * (xb - xa), xa + q * (xb - xa)]);
    let s = 0;
    for (let i = i0; i <= i1; i++) {
      const x = v.x(i);
      if (onEdge[i - i0] === 1) {
        if (strip.length > 0) mark(i, j, Math.abs(polygonSignedArea(clipPolygon(strip, { x0: x - hx, x1: x + hx, y0: -Infinity, y1: Infinity }))));
        continue;
      }
      while (s < spans.length && spans[s][1] < x) s++;
      if (s < spans.length && x >= spans[s][0]) mark(i, j, cellArea);
    }
  }
}

/** Area of a circle or rectangle inside a cell, m², by cheap tests first. */
export function coveredArea(o: Shape, x0: number, y0: number, x1: number, y1: number, cellArea: number): number {
  if (o.shape === 'circle') {
    const nearX = clamp(o.x, x0, x1) - o.x;
    const nearY = clamp(o.y, y0, y1) - o.y;
    if (nearX * nearX + nearY * nearY > o.radius * o.radius) return 0;
    const farX = Math.max(Math.abs(x0 - o.x), Math.abs(x1 - o.x));
    const farY = Math.max(Math.abs(y0 - o.y), Math.abs(y1 - o.y));
    if (farX * farX + farY * farY <= o.radius * o.radius) return cellArea;
  }
  return layeredAreas([o], { x0, y0, x1, y1 })[0];
}

/** c²·dt² in a medium of relative permittivity epsR, m². */
export function courantSquared(epsR: number, dt: number): number {
  return (C0 * C0 * dt * dt) / epsR;
}

/**
 * The medium at a sample point outside the metal under the blending fills: ε∞ and σ
 * averaged over the cell's non-metal area, poles those of `poleOwner` (an object, or −1
 * for the background). Undefined when the result is the background itself.
 */
export function blendAt(v: LatticeView, i: number, j: number, poleOwner: number): Medium | undefined {
  const g = v.g;
  const { objects, areas } = v.shares(i, j);
  const cellArea = g.dx * g.dy;
  let covered = 0;
  let metal = 0;
  let epsSum = 0;
  let sigmaSum = 0;
  objects.forEach((k, q) => {
    const a = areas[q];
    if (!(a > 0)) return;
    covered += a;
    if (g.isPec(k)) { metal += a; return; }
    const m = g.mediumOf(k);
    epsSum += a * m.epsR;
    sigmaSum += a * (m.sigma ?? 0);
  });
  const bg = g.background;
  const own = g.mediumOf(poleOwner);
  const open = cellArea - metal;
  if (!(open > cellArea * WHOLE)) return poleOwner >= 0 ? own : undefined;
  const bgArea = Math.max(0, cellArea - covered);
  const epsR = (epsSum + bgArea * bg.epsR) / open;
  const sigma = (sigmaSum + bgArea * (bg.sigma ?? 0)) / open;
  if (epsR === own.epsR && sigma === (own.sigma ?? 0)) return poleOwner >= 0 ? own : undefined;
  const m: Medium = { epsR };
  if (sigma !== 0) m.sigma = sigma;
  if (own.poles !== undefined) m.poles = own.poles;
  return m;
}

/** The blended medium at a sample point outside the metal, skipping the work deep inside one medium or clear of all objects. */
export function mediumAround(v: LatticeView, i: number, j: number, li: number, poleOwner: number): Medium | undefined {
  const partly = v.part.has(li);
  const whole = v.whole[li];
  if (!partly && whole === poleOwner) return poleOwner >= 0 ? v.g.mediumOf(poleOwner) : undefined;
  return blendAt(v, i, j, poleOwner);
}

/** The parts of a scenario the builder reads. */
export type MaterialScenario = Pick<Scenario, 'grid' | 'medium'> & {
  objects?: SceneObject[];
  fill?: Fill;
  polarization?: Polarization;
};
