/**
 * The material map of a scenario (src/engine/material-map.ts): which sample points of which
 * field component the scenario's objects change, and how, under the three fills of README
 * "Objects". Positions follow the Yee grid of the material map: `a` at (i·dx, j·dy), `b` at
 * (i·dx, (j+½)·dy), `c` at ((i+½)·dx, j·dy), index k = j·nx + i; the electric components
 * (`a` in TMz, `b` and `c` in TEz) carry the materials. Later objects cover earlier ones.
 *
 * Staircase: an electric sample point takes the material of the last object whose closed
 * outline holds it. A perfect conductor holds the component at zero; a medium replaces the
 * background there. In TEz an Hz node whose four edges are all in a conductor is left
 * without a patch: its curl is zero for ever, so it stays at its initial zero.
 *
 * Average: around every electric sample point the dx × dy cell centred on it is shared out
 * among the objects (exact areas, geometry.ts) and the background; ε∞ and σ are the
 * arithmetic means weighted by those areas, ε∞ = Σ f·ε∞,k and σ = Σ f·σk. Integrating
 * Ampère's law over the cell gives exactly this mean for a field component parallel to
 * the interfaces (Hwang & Cangellaris, "Effective permittivities for second-order accurate
 * FDTD equations at dielectric interfaces", IEEE MWCL 11(4), 2001), which Ez in TMz always
 * is; for Ex and Ey in TEz it is the usual approximation (the component normal to an
 * interface would want the harmonic mean). A conductor's share of the cell is left out and
 * the rest renormalised, because conductors stay staircased. Dispersion poles are not
 * blended: the point keeps those of the medium that holds it (the object's, or the
 * background's when no object holds it; for a TEz edge whose midpoint lies in metal, the
 * medium with the largest share of the cell).
 *
 * Conformal: as average, plus the contour-path correction of Dey & Mittra ("A locally
 * conformal finite-difference time-domain (FDTD) algorithm for modeling three-dimensional
 * perfectly conducting objects", IEEE Microwave and Guided Wave Letters 7(9):273–275,
 * 1997) for conductors. TMz: an Ez node in a conductor stays 'pec'; an H edge from such a node to a
 * node outside the metal gets lengthFraction f = (length of the edge outside the metal) /
 * (edge length), so the update reads dt/(μ0·f·Δ). TEz: every Hz cell (dx × dy around the
 * node) that a conductor cuts, or whose edges it cuts, gets its area fraction outside the
 * metal and the four edge fractions; an edge wholly in the metal is 'pec'. An edge that
 * crosses metal while both of its Ez nodes lie outside (a plate thinner than a cell, TMz)
 * is not seen, as in the staircase.
 *
 * Small cells. Both schemes are leapfrog updates u'' = −A·u of a matrix A similar to a
 * symmetric positive semi-definite one, stable when dt²·λmax(A) ≤ 4. By Gershgorin's circle
 * theorem (Gershgorin 1931; Horn & Johnson, Matrix Analysis, Thm 6.1.1, from memory)
 * λmax(A) is at most the largest absolute row sum, and each row belongs to one sample point:
 *  - TMz, row of an Ez node with local wave speed c: R = c²·Σ_edges w, with w = 2/Δ² to a
 *    live neighbour, 1/Δ² to a conductor node along a whole edge, 1/(f·Δ²) along a cut edge
 *    (Δ = dx or dy, the edge's length);
 *  - TEz, row of a cut Hz cell with area fraction F: R = (1/F)·Σ_edges c_e²·f_e·m/Δ'², with
 *    c_e the wave speed at the edge's E sample, m = 2 to a live neighbour cell and 1 to one
 *    in the metal, Δ' the distance between the two Hz nodes the edge separates.
 * A cut node or cell is kept when dt²·R ≤ 4 and otherwise dropped into the metal (TMz: the
 * Ez node becomes 'pec' and its cut edges lose their patch; TEz: the Hz node is held at
 * zero). Dropping only lowers the rows of its neighbours, so one pass suffices. Uncut
 * points have dt²·R = 4ν² ≤ 4, with ν = S/S_limit the Courant number over its 2D limit at
 * the fastest medium present (README "Physics conventions"). Consequently no cut whose
 * fraction is at least ν²/2 (TMz edges) or ν² (TEz cell areas) is ever dropped: that value
 * is reported as `smallCells.threshold`; below it a cut is dropped only when its own row
 * fails the bound. `smallCells.dropped` counts dropped Ez nodes (TMz) or Hz cells (TEz).
 *
 * Only sample points within two cells of an object's bounding box are visited.
 */
import { C0 } from '../scenario/constants.ts';
import { boundingBox, clipPolygon, containsPoint, layeredAreas, layeredLengths, polygonSignedArea, segmentInside, type Box, type Shape } from '../scenario/geometry.ts';
import type { Layout } from '../scenario/layout.ts';
import type { Fill, Medium, Polarization, Scenario, SceneObject } from '../scenario/types.ts';
import type { ComponentPatch, MaterialMap } from './material-map.ts';

/** The parts of a scenario the builder reads. */
export type MaterialScenario = Pick<Scenario, 'grid' | 'medium'> & {
  objects?: SceneObject[];
  fill?: Fill;
  polarization?: Polarization;
};

/**
 * Build the material map of a validated scenario on its layout (module comment for the
 * rules of each fill and the small-cell rule).
 *
 * @param s - the scenario: background medium, objects (m), fill, polarization
 * @param layout - its layout (layoutOf): nx, ny, dx and dy in m, dt in s
 * @returns the patches per component, sorted by k, and the sample points each object took
 *
 * @example
 * const map = buildMaterialMap(scenario, layoutOf(scenario));
 * map.nodesPerObject; // e.g. [317] Ez nodes inside a 1 cm rod on a 1 mm grid
 */
export function buildMaterialMap(s: MaterialScenario, layout: Layout): MaterialMap {
  const objects = s.objects ?? [];
  const polarization = s.polarization ?? 'TMz';
  const fill = s.fill ?? 'staircase';
  const map: MaterialMap = { polarization, background: s.medium, a: [], b: [], c: [], nodesPerObject: objects.map(() => 0) };
  const smallCells = { dropped: 0, threshold: smallCellThreshold(s, layout, polarization) };
  if (fill === 'conformal') map.smallCells = smallCells;
  if (objects.length === 0) return map;
  const g = new GridContext(s, layout);
  const blending = fill !== 'staircase';
  const counts = map.nodesPerObject;
  if (polarization === 'TMz') {
    const a = new LatticeView(g, LATTICE_A, { owners: true, cells: blending });
    map.a = sweep(a, counts);
    if (fill === 'conformal') {
      const cut = conformalTMz(g, a, counts);
      map.a = mergePatches(map.a, cut.replaceA);
      map.b = cut.b;
      map.c = cut.c;
      smallCells.dropped = cut.dropped;
    }
    return map;
  }
  const b = new LatticeView(g, LATTICE_B, { owners: true, cells: blending });
  const c = new LatticeView(g, LATTICE_C, { owners: true, cells: blending });
  if (fill !== 'conformal') {
    map.b = sweep(b, counts);
    map.c = sweep(c, counts);
    return map;
  }
  const cells = new LatticeView(g, LATTICE_A, { owners: false, cells: true });
  const cut = conformalTEz(g, cells, b, c, counts);
  map.a = cut.a;
  map.b = cut.b;
  map.c = cut.c;
  smallCells.dropped = cut.dropped;
  return map;
}

/**
 * The fraction at or above which no cut is dropped (module comment): ν²/2 for a TMz edge's
 * length fraction, ν² for a TEz cell's area fraction, with ν² = c²·dt²·(1/dx² + 1/dy²) at
 * the fastest medium present (lowest ε∞), ν = S/S_limit.
 */
function smallCellThreshold(s: MaterialScenario, layout: Layout, polarization: Polarization): number {
  let epsMin = s.medium.epsR;
  for (const o of s.objects ?? []) if (o.material !== 'pec') epsMin = Math.min(epsMin, o.material.epsR);
  const nu2 = courantSquared(epsMin, layout.dt) * (1 / (layout.dx * layout.dx) + 1 / (layout.dy * layout.dy));
  return Math.min(1, polarization === 'TMz' ? nu2 / 2 : nu2);
}

/** c²·dt² in a medium of relative permittivity epsR, m². */
function courantSquared(epsR: number, dt: number): number {
  return (C0 * C0 * dt * dt) / epsR;
}

/** Offsets of a component's sample point (i + ox, j + oy), in cells. */
interface Lattice { ox: number; oy: number; name: 'a' | 'b' | 'c' }
const LATTICE_A: Lattice = { ox: 0, oy: 0, name: 'a' };
const LATTICE_B: Lattice = { ox: 0, oy: 0.5, name: 'b' };
const LATTICE_C: Lattice = { ox: 0.5, oy: 0, name: 'c' };

/** Relative slack on "the whole cell" and "nothing at all". */
const WHOLE = 1e-12;

/** Run of sample points [j, iFrom, iTo] in one row. */
type Run = [number, number, number];

/** Grid, objects, and the index rectangle worth visiting (two cells around every object). */
class GridContext {
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

function clamp(v: number, lo: number, hi: number): number {
  return Math.min(hi, Math.max(lo, v));
}

/** Merge index boxes into runs per row, in k order. */
function runsOf(boxes: { i0: number; i1: number; j0: number; j1: number }[], j0: number, j1: number): Run[] {
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
interface PartCover { objects: number[]; areas: number[] }

/**
 * One component's sample points over the visited rectangle: the staircase owner of each
 * (last object holding it, −1 for none) and, for the blending fills, how the objects cover
 * the dx × dy cell around it (`whole`: the last object covering all of it, −1 for none;
 * `part`: the objects after that one covering some of it).
 */
class LatticeView {
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
function paintOwners(v: LatticeView, o: SceneObject, k: number): void {
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
function paintCells(v: LatticeView, o: SceneObject, k: number): void {
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
function coveredArea(o: Shape, x0: number, y0: number, x1: number, y1: number, cellArea: number): number {
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

/**
 * The medium at a sample point outside the metal under the blending fills: ε∞ and σ
 * averaged over the cell's non-metal area, poles those of `poleOwner` (an object, or −1
 * for the background). Undefined when the result is the background itself.
 */
function blendAt(v: LatticeView, i: number, j: number, poleOwner: number): Medium | undefined {
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

/**
 * Patches of one electric component, in k order: conductors by the staircase rule, media by
 * the fill's rule; counts each object's sample points into `counts`.
 */
function sweep(v: LatticeView, counts: number[]): ComponentPatch[] {
  const g = v.g;
  const blending = v.whole.length > 0;
  const out: ComponentPatch[] = [];
  for (const [j, from, to] of g.runs) {
    for (let i = from; i <= to; i++) {
      const li = g.local(i, j);
      const owner = v.owner[li];
      const k = j * g.nx + i;
      if (g.isPec(owner)) { out.push({ k, kind: 'pec' }); counts[owner]++; continue; }
      if (owner >= 0) counts[owner]++;
      const m = !blending ? (owner >= 0 ? g.mediumOf(owner) : undefined) : mediumAround(v, i, j, li, owner);
      if (m !== undefined) out.push({ k, kind: 'medium', medium: m });
    }
  }
  return out;
}

/** The blended medium at a sample point outside the metal, skipping the work deep inside one medium or clear of all objects. */
function mediumAround(v: LatticeView, i: number, j: number, li: number, poleOwner: number): Medium | undefined {
  const partly = v.part.has(li);
  const whole = v.whole[li];
  if (!partly && whole === poleOwner) return poleOwner >= 0 ? v.g.mediumOf(poleOwner) : undefined;
  return blendAt(v, i, j, poleOwner);
}

/** Patches in k order, with replacements at some k. */
function mergePatches(base: ComponentPatch[], replace: Map<number, ComponentPatch>): ComponentPatch[] {
  if (replace.size === 0) return base;
  const out = base.filter((p) => !replace.has(p.k));
  out.push(...replace.values());
  return out.sort((p, q) => p.k - q.k);
}

/** Length of a segment in the metal (the parts whose last covering object is a conductor), m. */
function metalLength(g: GridContext, ax: number, ay: number, bx: number, by: number): number {
  const near = g.objectsNear({ x0: Math.min(ax, bx), x1: Math.max(ax, bx), y0: Math.min(ay, by), y1: Math.max(ay, by) });
  if (!near.some((k) => g.isPec(k))) return 0;
  const lengths = layeredLengths(near.map((k) => g.objects[k]), ax, ay, bx, by);
  let metal = 0;
  near.forEach((k, q) => { if (g.isPec(k)) metal += lengths[q]; });
  return metal;
}

/**
 * Dey–Mittra in TMz: the H edges from a node outside the metal to one inside get their
 * length fraction; a node whose Gershgorin row fails dt²·R ≤ 4 joins the metal instead.
 */
function conformalTMz(g: GridContext, a: LatticeView, counts: number[]) {
  interface Cut { k: number; f: number; onB: boolean; metalOwner: number }
  const replaceA = new Map<number, ComponentPatch>();
  const kept: Cut[] = [];
  let dropped = 0;
  const metalAt = (i: number, j: number) => g.inside(i, j) && g.isPec(a.owner[g.local(i, j)]);
  for (const [j, from, to] of g.metalRuns) {
    for (let i = from; i <= to; i++) {
      const owner = a.owner[g.local(i, j)];
      if (g.isPec(owner)) continue;
      if (!metalAt(i + 1, j) && !metalAt(i - 1, j) && !metalAt(i, j + 1) && !metalAt(i, j - 1)) continue;
      // Edges from node (i, j): to (i+1, j) is c(i, j), to (i−1, j) c(i−1, j), to (i, j+1) b(i, j), to (i, j−1) b(i, j−1).
      const edges: [number, number, boolean, number, number][] = [
        [i + 1, j, false, j * g.nx + i, g.dx], [i - 1, j, false, j * g.nx + i - 1, g.dx],
        [i, j + 1, true, j * g.nx + i, g.dy], [i, j - 1, true, (j - 1) * g.nx + i, g.dy],
      ];
      const cuts: Cut[] = [];
      let rowSum = 0;
      for (const [ni, nj, onB, k, len] of edges) {
        if (!metalAt(ni, nj)) { rowSum += 2 / (len * len); continue; }
        const f = Math.max(0, 1 - metalLength(g, i * g.dx, j * g.dy, ni * g.dx, nj * g.dy) / len);
        if (f >= 1 - WHOLE) { rowSum += 1 / (len * len); continue; }
        cuts.push({ k, f, onB, metalOwner: a.owner[g.local(ni, nj)] });
        rowSum += f > 0 ? 1 / (f * len * len) : Infinity;
      }
      if (cuts.length === 0) continue;
      const epsR = (a.whole.length > 0 ? mediumAround(a, i, j, g.local(i, j), owner) : undefined)?.epsR ?? g.mediumOf(owner).epsR;
      if (courantSquared(epsR, g.dt) * rowSum <= 4 * (1 + WHOLE)) { kept.push(...cuts); continue; }
      dropped++;
      const k = j * g.nx + i;
      replaceA.set(k, { k, kind: 'pec' });
      if (owner >= 0) counts[owner]--;
      counts[cuts.reduce((p, q) => (q.f < p.f ? q : p)).metalOwner]++;
    }
  }
  // A cut edge from a node that joined the metal now runs between two conductor nodes: no patch.
  const b: ComponentPatch[] = [];
  const c: ComponentPatch[] = [];
  for (const cut of kept) {
    const ends = cut.onB ? [cut.k, cut.k + g.nx] : [cut.k, cut.k + 1];
    if (ends.some((k) => replaceA.has(k))) continue;
    (cut.onB ? b : c).push({ k: cut.k, kind: 'conformal', lengthFraction: cut.f });
  }
  const byK = (p: ComponentPatch, q: ComponentPatch) => p.k - q.k;
  return { replaceA, b: b.sort(byK), c: c.sort(byK), dropped };
}

/**
 * Dey–Mittra in TEz: each Hz cell cut by a conductor gets its area fraction outside the
 * metal and its four edge fractions; an edge wholly in the metal is 'pec'; a cut cell whose
 * Gershgorin row fails dt²·R ≤ 4 is dropped (its Hz held at zero).
 */
function conformalTEz(g: GridContext, cells: LatticeView, b: LatticeView, c: LatticeView, counts: number[]) {
  const cellArea = g.dx * g.dy;
  // Metal share of each Hz cell that a conductor covers some of (1: wholly metal).
  const metalShare = new Float64Array(cells.whole.length);
  const nearMetal = new Uint8Array(cells.whole.length);
  for (const [j, from, to] of g.metalRuns) {
    for (let i = from; i <= to; i++) {
      const li = g.local(i, j);
      if (!cells.covered(li)) continue;
      if (!cells.part.has(li) && g.isPec(cells.whole[li])) { nearMetal[li] = 1; metalShare[li] = 1; continue; }
      const { objects, areas } = cells.shares(i, j);
      let metal = 0;
      let any = false;
      objects.forEach((k, q) => { if (g.isPec(k)) { metal += areas[q]; any = true; } });
      if (!any) continue;
      nearMetal[li] = 1;
      metalShare[li] = Math.min(1, metal / cellArea);
    }
  }
  const allMetal = (i: number, j: number) => g.inside(i, j) && metalShare[g.local(i, j)] >= 1 - WHOLE;
  const touchesMetal = (i: number, j: number) => g.inside(i, j) && nearMetal[g.local(i, j)] === 1;

  // Fraction of an edge outside the metal. Edge b(i, j) runs along y = (j+½)dy between the
  // Hz cells (i, j) and (i, j+1); edge c(i, j) along x = (i+½)dx between (i, j) and (i+1, j).
  const nearEdge = (onB: boolean, i: number, j: number) => touchesMetal(i, j) || touchesMetal(onB ? i : i + 1, onB ? j + 1 : j);
  const edgeFraction = (onB: boolean, i: number, j: number): number => {
    const pi = onB ? i : i + 1;
    const pj = onB ? j + 1 : j;
    if (allMetal(i, j) || allMetal(pi, pj)) return 0;
    const metal = onB
      ? metalLength(g, (i - 0.5) * g.dx, (j + 0.5) * g.dy, (i + 0.5) * g.dx, (j + 0.5) * g.dy) / g.dx
      : metalLength(g, (i + 0.5) * g.dx, (j - 0.5) * g.dy, (i + 0.5) * g.dx, (j + 0.5) * g.dy) / g.dy;
    return Math.max(0, 1 - metal);
  };

  // The E edges: a conductor where the whole edge is metal, otherwise the average fill.
  const electric = (v: LatticeView) => {
    const onB = v.l.name === 'b';
    const fractions = new Map<number, number>();
    const epsR = new Map<number, number>();
    const out: ComponentPatch[] = [];
    for (const [j, from, to] of g.runs) {
      for (let i = from; i <= to; i++) {
        const li = g.local(i, j);
        const owner = v.owner[li];
        const k = j * g.nx + i;
        const near = nearEdge(onB, i, j);
        const f = near ? edgeFraction(onB, i, j) : 1;
        if (f < 1) fractions.set(k, f);
        if (f <= WHOLE) {
          out.push({ k, kind: 'pec' });
          const top = g.isPec(owner) ? owner : largestShare(v, i, j, true);
          if (top >= 0) counts[top]++;
          continue;
        }
        if (owner >= 0 && !g.isPec(owner)) counts[owner]++;
        const poleOwner = g.isPec(owner) ? largestShare(v, i, j, false) : owner;
        const m = mediumAround(v, i, j, li, poleOwner);
        if (m === undefined) continue;
        out.push({ k, kind: 'medium', medium: m });
        if (near) epsR.set(k, m.epsR);
      }
    }
    return { out, fractions, epsR };
  };
  const eb = electric(b);
  const ec = electric(c);

  const a: ComponentPatch[] = [];
  let dropped = 0;
  for (const [j, from, to] of g.metalRuns) {
    for (let i = from; i <= to; i++) {
      if (!touchesMetal(i, j) && !touchesMetal(i + 1, j) && !touchesMetal(i - 1, j) && !touchesMetal(i, j + 1) && !touchesMetal(i, j - 1)) continue;
      const k = j * g.nx + i;
      // Order c(i), c(i−1), b(j), b(j−1), as the material map has it.
      const edgeK = [k, k - 1, k, k - g.nx];
      const fr: [number, number, number, number] = [
        ec.fractions.get(edgeK[0]) ?? 1, ec.fractions.get(edgeK[1]) ?? 1,
        eb.fractions.get(edgeK[2]) ?? 1, eb.fractions.get(edgeK[3]) ?? 1,
      ];
      const area = 1 - metalShare[g.local(i, j)];
      const anyCut = fr.some((f) => f < 1);
      if (area >= 1 - WHOLE && !anyCut) continue;
      if (area <= WHOLE) {
        // Wholly metal: its Hz stays zero by itself unless an edge still carries field.
        if (fr.some((f) => f > WHOLE)) a.push({ k, kind: 'pec' });
        continue;
      }
      const across: [number, number][] = [[i + 1, j], [i - 1, j], [i, j + 1], [i, j - 1]];
      let rowSum = 0;
      for (let e = 0; e < 4; e++) {
        const spacing = e < 2 ? g.dx : g.dy;
        const eps = (e < 2 ? ec.epsR : eb.epsR).get(edgeK[e]) ?? g.background.epsR;
        const weight = allMetal(across[e][0], across[e][1]) ? 1 : 2;
        rowSum += (courantSquared(eps, g.dt) * fr[e] * weight) / (spacing * spacing);
      }
      if (rowSum / area <= 4 * (1 + WHOLE)) {
        a.push({ k, kind: 'conformal', areaFraction: area, edgeFractions: fr });
        continue;
      }
      dropped++;
      a.push({ k, kind: 'pec' });
    }
  }
  return { a, b: eb.out, c: ec.out, dropped };
}

/**
 * The object with the largest share of the cell among conductors (`metal`), or among media
 * and the background (otherwise, −1 for the background): whom an edge is credited to, or
 * whose poles a live edge with its midpoint in the metal takes.
 */
function largestShare(v: LatticeView, i: number, j: number, metal: boolean): number {
  const g = v.g;
  const { objects, areas } = v.shares(i, j);
  let best = -1;
  let bestArea = metal ? 0 : g.dx * g.dy - areas.reduce((p, q) => p + q, 0);
  objects.forEach((k, q) => {
    if (g.isPec(k) === metal && areas[q] > bestArea) { best = k; bestArea = areas[q]; }
  });
  return best;
}
