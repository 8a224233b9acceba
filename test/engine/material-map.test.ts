import { describe, expect, it } from 'vitest';
import { buildMaterialMap, type MaterialScenario } from '../../src/engine/build-material-map.ts';
import type { ComponentPatch, MaterialMap } from '../../src/engine/material-map.ts';
import { C0 } from '../../src/scenario/constants.ts';
import { containsPoint, polygonSignedArea } from '../../src/scenario/geometry.ts';
import { areaInBox } from '../../src/scenario/geometry-area.ts';
import { lengthOutside } from '../../src/scenario/geometry-segments.ts';
import { timeStep, waveSpeed, type Layout } from '../../src/scenario/layout.ts';
import type { Fill, Medium, Polarization, SceneObject } from '../../src/scenario/types.ts';

const D = 0.001;

/** A square grid of 1 mm cells in vacuum (or `medium`), and the map of its objects. */
function build(objects: SceneObject[], opts: { fill?: Fill; polarization?: Polarization; n?: number; courant?: number; medium?: Medium } = {}): { map: MaterialMap; layout: Layout } {
  const n = opts.n ?? 200;
  const courant = opts.courant ?? 0.5;
  const medium = opts.medium ?? { epsR: 1 };
  const layout: Layout = {
    nx: n, ny: n, dx: D, dy: D, dt: timeStep(courant, D, D, medium.epsR), c: waveSpeed(medium.epsR),
    source: { i: 0, j: 0, x: 0, y: 0 }, probes: [], lines: [],
  };
  const s: MaterialScenario = { grid: { nx: n, ny: n, dx: D, dy: D, courant }, medium, objects, fill: opts.fill, polarization: opts.polarization };
  return { map: buildMaterialMap(s, layout), layout };
}

const circle = (x: number, y: number, radius: number, material: SceneObject['material']): SceneObject => ({ shape: 'circle', x, y, radius, material });
const rect = (x0: number, y0: number, x1: number, y1: number, material: SceneObject['material']): SceneObject => ({ shape: 'rectangle', x0, y0, x1, y1, material });

/** Sample points (i, j) of a lattice offset (ox, oy) cells whose position the test predicate holds. */
function pointsWhere(n: number, ox: number, oy: number, holds: (x: number, y: number) => boolean): number[] {
  const out: number[] = [];
  for (let j = 0; j < n; j++) for (let i = 0; i < n; i++) if (holds((i + ox) * D, (j + oy) * D)) out.push(j * n + i);
  return out;
}

const ks = (patches: ComponentPatch[], kind?: ComponentPatch['kind']) => patches.filter((p) => kind === undefined || p.kind === kind).map((p) => p.k);

function expectSortedUnique(map: MaterialMap): void {
  for (const list of [map.a, map.b, map.c]) {
    for (let q = 1; q < list.length; q++) expect(list[q].k).toBeGreaterThan(list[q - 1].k); // material-map.ts: sorted by k, one patch per k
  }
}

describe('staircase fill', () => {
  // Centre and radius chosen so that no node lies within 1e-6 m of the circle.
  const rod = circle(0.1003, 0.0996, 0.0207, 'pec');
  const inRod = (x: number, y: number) => Math.hypot(x - 0.1003, y - 0.0996) <= 0.0207;

  it('TMz: the conductor takes exactly the Ez nodes within the radius', () => {
    const { map } = build([rod]);
    const expected = pointsWhere(200, 0, 0, inRod); // README "Objects": a node belongs to the object holding its position
    expect(ks(map.a, 'pec')).toEqual(expected); // direct count above
    expect(map.a.length).toBe(expected.length); // direct count above
    expect(map.b).toEqual([]);
    expect(map.c).toEqual([]);
    expect(map.nodesPerObject).toEqual([expected.length]); // direct count above
    expect(map.smallCells).toBeUndefined();
  });

  it('TEz: the conductor takes the Ex points at (i, j+½) and the Ey points at (i+½, j), and no Hz node', () => {
    const { map } = build([rod], { polarization: 'TEz' });
    const ex = pointsWhere(200, 0, 0.5, inRod); // material-map.ts: b at (i·dx, (j+½)·dy)
    const ey = pointsWhere(200, 0.5, 0, inRod); // material-map.ts: c at ((i+½)·dx, j·dy)
    expect(ks(map.b, 'pec')).toEqual(ex); // direct count above
    expect(ks(map.c, 'pec')).toEqual(ey); // direct count above
    expect(map.a).toEqual([]); // Hz inside the metal has a zero curl for ever; no patch needed
    expect(map.nodesPerObject).toEqual([ex.length + ey.length]); // direct count above
    expect(map.polarization).toBe('TEz');
  });

  it('a polygon takes the nodes its closed outline holds, vertices and edges on nodes included', () => {
    const wedge: SceneObject = { shape: 'polygon', points: [[0.05, 0.05], [0.12, 0.06], [0.09, 0.13], [0.07, 0.08]], material: { epsR: 3 } };
    const { map } = build([wedge]);
    const expected = pointsWhere(200, 0, 0, (x, y) => containsPoint(wedge, x, y)); // README "Objects": closed shapes
    expect(ks(map.a)).toEqual(expected); // direct test with containsPoint above
    expect(expected).toContain(50 * 200 + 50); // the vertex (0.05, 0.05) sits on node (50, 50)
    expect(map.a.every((p) => p.kind === 'medium' && p.medium === wedge.material)).toBe(true);
  });

  it('later objects cover earlier ones', () => {
    const block = rect(0.05, 0.05, 0.15, 0.15, 'pec');
    const core = circle(0.1, 0.1, 0.02, { epsR: 4, sigma: 0.01, poles: [{ kind: 'debye', deltaEps: 10, tau: 8e-12 }] });
    const { map } = build([block, core]);
    const inCore = pointsWhere(200, 0, 0, (x, y) => Math.hypot(x - 0.1, y - 0.1) <= 0.02 * (1 + 1e-12));
    const inBlock = pointsWhere(200, 0, 0, (x, y) => x >= 0.05 - 1e-12 && x <= 0.15 + 1e-12 && y >= 0.05 - 1e-12 && y <= 0.15 + 1e-12);
    expect(ks(map.a, 'medium')).toEqual(inCore); // direct count above
    expect(map.nodesPerObject).toEqual([inBlock.length - inCore.length, inCore.length]); // README "Objects": later objects overlap earlier ones
    const patch = map.a.find((p) => p.kind === 'medium');
    expect(patch).toMatchObject({ medium: core.material }); // the object's medium, poles and all
    expectSortedUnique(map);
  });

  it('gives an empty map without objects', () => {
    const { map } = build([]);
    expect(map).toEqual({ polarization: 'TMz', background: { epsR: 1 }, a: [], b: [], c: [], nodesPerObject: [] });
  });
});

/** Σ over patches of (ε − εbg)·dx·dy: the area-weighted excess permittivity the map carries, m². */
function excessEps(patches: ComponentPatch[], epsBackground = 1): number {
  return patches.reduce((sum, p) => sum + (p.kind === 'medium' ? (p.medium.epsR - epsBackground) * D * D : 0), 0);
}

describe('average fill', () => {
  const disc = circle(0.1003, 0.0996, 0.0207, { epsR: 5, sigma: 0.02 });
  const discArea = Math.PI * 0.0207 ** 2;

  it('blends ε∞ and σ so that their excess over the background sums to the object\'s area', () => {
    for (const polarization of ['TMz', 'TEz'] as const) {
      const { map } = build([disc], { fill: 'average', polarization });
      for (const list of polarization === 'TMz' ? [map.a] : [map.b, map.c]) {
        expect(excessEps(list) / (5 - 1)).toBeCloseTo(discArea, 12); // closed form: πr², cells tile the plane
        const sigma = list.reduce((s, p) => s + (p.kind === 'medium' ? (p.medium.sigma ?? 0) * D * D : 0), 0);
        expect(sigma / 0.02).toBeCloseTo(discArea, 12); // closed form: πr²
        for (const p of list) if (p.kind === 'medium') expect(p.medium.epsR).toBeGreaterThanOrEqual(1); // blends lie between 1 and 5 (a sliver may round to 1)
        for (const p of list) if (p.kind === 'medium') expect(p.medium.epsR).toBeLessThanOrEqual(5); // blends are weighted means of 1 and 5
      }
      expectSortedUnique(map);
    }
  });

  it('blends a polygon to its shoelace area, and overlapping objects in order', () => {
    const points: [number, number][] = [[0.05, 0.05], [0.1237, 0.0581], [0.0903, 0.1311], [0.0712, 0.0804]];
    const wedge: SceneObject = { shape: 'polygon', points, material: { epsR: 3 } };
    const { map } = build([wedge], { fill: 'average' });
    expect(excessEps(map.a) / 2).toBeCloseTo(Math.abs(polygonSignedArea(points)), 12); // shoelace formula
    const slab = rect(0.02, 0.02, 0.1, 0.1, { epsR: 2 });
    const plug = circle(0.06, 0.06, 0.015, { epsR: 6 });
    const both = build([slab, plug], { fill: 'average' }).map;
    const plugArea = Math.PI * 0.015 ** 2;
    expect(excessEps(both.a)).toBeCloseTo((2 - 1) * (0.08 * 0.08 - plugArea) + (6 - 1) * plugArea, 12); // closed form: the plug replaces the slab under it
  });

  it('keeps the poles of the medium holding each point, and leaves a conductor staircased', () => {
    const debye = { kind: 'debye' as const, deltaEps: 10, tau: 8e-12 };
    const lossy = circle(0.1, 0.1, 0.0123, { epsR: 4, poles: [debye] });
    const { map } = build([lossy], { fill: 'average' });
    for (const p of map.a) {
      if (p.kind !== 'medium') continue;
      const inside = containsPoint(lossy, (p.k % 200) * D, Math.floor(p.k / 200) * D);
      expect(p.medium.poles).toEqual(inside ? [debye] : undefined); // module comment: poles are not blended
    }
    const metal = build([rect(0.0503, 0.0503, 0.0897, 0.0897, 'pec')], { fill: 'average' }).map;
    expect(metal.a.every((p) => p.kind === 'pec')).toBe(true); // the metal share is left out, the rest is background
    expect(metal.a.length).toBe(39 * 39); // nodes 51..89 in each direction
  });
});

describe('conformal fill, TMz', () => {
  it('gives a cut H edge the part of its length outside the metal', () => {
    // Circle of radius 10.4 mm around node (100, 100): it crosses y = 0.1 at x = 0.1104 and x = 0.0896.
    const { map } = build([circle(0.1, 0.1, 0.0104, 'pec')], { fill: 'conformal' });
    const at = (list: ComponentPatch[], i: number, j: number) => list.find((p) => p.k === j * 200 + i);
    expect(at(map.c, 110, 100)).toMatchObject({ kind: 'conformal' });
    expect((at(map.c, 110, 100) as { lengthFraction: number }).lengthFraction).toBeCloseTo((0.111 - 0.1104) / D, 8); // closed form: (x₁₁₁ − (x_c + r))/dx = 0.6, less the 1e-12 rounding band (~1e-10 of a cell)
    expect((at(map.c, 89, 100) as { lengthFraction: number }).lengthFraction).toBeCloseTo((0.0896 - 0.089) / D, 8); // closed form: 0.6
    expect((at(map.b, 100, 110) as { lengthFraction: number }).lengthFraction).toBeCloseTo(0.6, 8); // closed form, the same along y
    expect(at(map.a, 100, 100)).toEqual({ k: 100 * 200 + 100, kind: 'pec' });
    expect(map.smallCells?.threshold).toBeCloseTo(0.25, 12); // ν² = (0.5·√2)² = 0.5; threshold ν²/2
  });

  it('puts every cut edge between a conductor node and a live one, with a fraction in (0, 1)', () => {
    const { map } = build([circle(0.1003, 0.0996, 0.0207, 'pec'), { shape: 'polygon', points: [[0.03, 0.03], [0.07, 0.035], [0.04, 0.07]], material: 'pec' }], { fill: 'conformal' });
    const metal = new Set(ks(map.a, 'pec'));
    expect(map.b.length + map.c.length).toBeGreaterThan(100);
    for (const [list, step] of [[map.b, 200], [map.c, 1]] as const) {
      for (const p of list) {
        expect(p.kind).toBe('conformal');
        const f = (p as { lengthFraction: number }).lengthFraction;
        expect(f).toBeGreaterThan(0); // material-map.ts: 0 < f ≤ 1
        expect(f).toBeLessThan(1); // an edge with f = 1 needs no patch
        expect(metal.has(p.k) !== metal.has(p.k + step)).toBe(true); // Dey & Mittra 1997: only edges with one end in the metal
      }
    }
    expectSortedUnique(map);
  });

  it('drops a node whose cut edge is too short into the metal, unless the time step is small enough', () => {
    // Radius 10.95 mm: the edge from node (110, 100), inside, to (111, 100) keeps 0.05 of its length.
    const rod = circle(0.1, 0.1, 0.01095, 'pec');
    const coarse = build([rod], { fill: 'conformal' }).map;
    // Row of node (111, 100): c²dt²/dx²·(1/0.05 + 3·2) = 0.25·26 = 6.5 > 4 (module comment)
    expect(ks(coarse.a, 'pec')).toContain(100 * 200 + 111); // row above fails dt²·R ≤ 4
    expect(ks(coarse.c)).not.toContain(100 * 200 + 110);
    expect(coarse.smallCells?.dropped).toBeGreaterThanOrEqual(4); // the four symmetric nodes at least
    const fine = build([rod], { fill: 'conformal', courant: 0.1 }).map;
    expect(ks(fine.a, 'pec')).not.toContain(100 * 200 + 111); // row 0.01·26 = 0.26 ≤ 4
    expect((fine.c.find((p) => p.k === 100 * 200 + 110) as { lengthFraction: number }).lengthFraction).toBeCloseTo(0.05, 8); // closed form: (0.111 − 0.11095)/0.001
    expect(fine.smallCells?.threshold).toBeCloseTo(0.01, 12); // ν² = (0.1·√2)² = 0.02; threshold ν²/2
  });
});

/**
 * A symmetric operator as rows: diagonal entry and off-diagonal (column, value) pairs.
 * Rows of held sample points are all zero.
 */
interface SparseRows { diag: Float64Array; cols: number[][]; vals: number[][] }

function emptyRows(size: number): SparseRows {
  return { diag: new Float64Array(size), cols: Array.from({ length: size }, () => []), vals: Array.from({ length: size }, () => []) };
}

/**
 * Rayleigh quotient after power iteration: a lower bound on the largest eigenvalue of a
 * symmetric positive semi-definite operator, converging to it (Golub & Van Loan, Matrix
 * Computations, §7.3.1; from memory).
 */
function largestEigenvalue(rows: SparseRows, iterations = 3000): number {
  const size = rows.diag.length;
  let v = new Float64Array(size).map((_, q) => 1 + ((q * 7919) % 13) / 13);
  let out = new Float64Array(size);
  let lambda = 0;
  for (let it = 0; it < iterations; it++) {
    let dot = 0;
    let vv = 0;
    let norm2 = 0;
    for (let q = 0; q < size; q++) {
      let s = rows.diag[q] * v[q];
      const cols = rows.cols[q];
      const vals = rows.vals[q];
      for (let e = 0; e < cols.length; e++) s += vals[e] * v[cols[e]];
      out[q] = s;
      dot += v[q] * s;
      vv += v[q] * v[q];
      norm2 += s * s;
    }
    lambda = dot / vv;
    const norm = Math.sqrt(norm2);
    for (let q = 0; q < size; q++) out[q] /= norm;
    [v, out] = [out, v];
  }
  return lambda;
}

/**
 * The TMz leapfrog operator on Ez, u'' = −A·u: nodes in `metal` and on the grid's edge are
 * held at zero, and the H edge from node p to a neighbour has length fraction f, so it adds
 * c²/(f·Δ²) to the diagonal and −c²/(f·Δ²) off it.
 */
function tmzOperator(n: number, metal: (i: number, j: number) => boolean, fraction: (i: number, j: number, onB: boolean) => number): SparseRows {
  const rows = emptyRows(n * n);
  const c2 = C0 * C0;
  const held = (i: number, j: number) => i <= 0 || j <= 0 || i >= n - 1 || j >= n - 1 || metal(i, j);
  for (let j = 0; j < n; j++) {
    for (let i = 0; i < n; i++) {
      if (held(i, j)) continue;
      const k = j * n + i;
      const edges: [number, number, number][] = [
        [i + 1, j, fraction(i, j, false)], [i - 1, j, fraction(i - 1, j, false)],
        [i, j + 1, fraction(i, j, true)], [i, j - 1, fraction(i, j - 1, true)],
      ];
      for (const [ni, nj, f] of edges) {
        const w = c2 / (f * D * D);
        rows.diag[k] += w;
        if (!held(ni, nj)) { rows.cols[k].push(nj * n + ni); rows.vals[k].push(-w); }
      }
    }
  }
  return rows;
}

/**
 * The TEz leapfrog operator on Hz in the symmetric form D^½·A·D^-½, D = diag(area
 * fractions): cell p's update is (c²/F_p)·Σ_e f_e·(h_p − h_q)/Δ'² over its four edges.
 */
function tezOperator(n: number, held: (i: number, j: number) => boolean, area: (k: number) => number, edges: (k: number) => number[]): SparseRows {
  const rows = emptyRows(n * n);
  const c2 = C0 * C0;
  const dead = (i: number, j: number) => i <= 0 || j <= 0 || i >= n - 1 || j >= n - 1 || held(i, j) || area(j * n + i) <= 0;
  for (let j = 0; j < n; j++) {
    for (let i = 0; i < n; i++) {
      if (dead(i, j)) continue;
      const k = j * n + i;
      const f = edges(k);
      const across = [[i + 1, j], [i - 1, j], [i, j + 1], [i, j - 1]];
      for (let e = 0; e < 4; e++) {
        const w = (c2 * f[e]) / (D * D);
        rows.diag[k] += w / area(k);
        const [ni, nj] = across[e];
        const m = nj * n + ni;
        if (w > 0 && !dead(ni, nj)) { rows.cols[k].push(m); rows.vals[k].push(-w / Math.sqrt(area(k) * area(m))); }
      }
    }
  }
  return rows;
}

describe('conformal fill: the small-cell rule keeps the scheme stable', () => {
  const n = 48;
  // Radius 10.95 mm around (24, 24) mm leaves edges with 5 % of their length outside.
  const rod = circle(0.024, 0.024, 0.01095, 'pec');

  it('TMz: dt²·λmax ≤ 4 with the map, > 4 with every cut kept', () => {
    const { map, layout } = build([rod], { fill: 'conformal', n });
    const pec = new Set(ks(map.a, 'pec'));
    const fr = (list: ComponentPatch[]) => new Map(list.map((p) => [p.k, (p as { lengthFraction: number }).lengthFraction]));
    const fb = fr(map.b);
    const fc = fr(map.c);
    const withMap = layout.dt ** 2 * largestEigenvalue(tmzOperator(n, (i, j) => pec.has(j * n + i), (i, j, onB) => (onB ? fb : fc).get(j * n + i) ?? 1));
    expect(withMap).toBeGreaterThan(1.9); // the iteration reached the top of the grid's band, 4ν² = 2 (README stability limit)
    expect(withMap).toBeLessThanOrEqual(4); // leapfrog stability: dt²·λmax ≤ 4 (module comment)
    // The same geometry with every cut kept at its true length fraction.
    const inside = (i: number, j: number) => containsPoint(rod, i * D, j * D);
    const raw = layout.dt ** 2 * largestEigenvalue(tmzOperator(n, inside, (i, j, onB) => {
      const [ni, nj] = onB ? [i, j + 1] : [i + 1, j];
      if (inside(i, j) === inside(ni, nj)) return 1;
      return lengthOutside(rod, i * D, j * D, ni * D, nj * D) / D;
    }));
    expect(raw).toBeGreaterThan(4); // a Rayleigh quotient above 4 proves the drops were needed
    expect(map.smallCells?.dropped).toBeGreaterThan(0);
  });

  it('TEz: dt²·λmax ≤ 4 with the map\'s cut cells, > 4 with each cut cell at its true area', () => {
    const { map, layout } = build([rod], { fill: 'conformal', polarization: 'TEz', n });
    expect(map.smallCells?.threshold).toBeCloseTo(0.5, 12); // ν² = 0.5
    const cut = new Map<number, { areaFraction: number; edgeFractions: number[] }>();
    const heldA = new Set<number>();
    for (const p of map.a) {
      if (p.kind === 'conformal') cut.set(p.k, p as { areaFraction: number; edgeFractions: number[] });
      else heldA.add(p.k);
    }
    // Only cells wholly in the metal are held at zero: a cut cell keeps its field (module comment).
    for (const k of heldA) expect(cellFractions(rod, k, n).areaFraction).toBeLessThan(1e-9); // geometry: no area outside the metal
    const enlarged: number[] = [];
    const lenders: number[] = [];
    let moved = 0;
    for (const [k, p] of cut) {
      const truth = cellFractions(rod, k, n);
      p.edgeFractions.forEach((f, e) => expect(f).toBeCloseTo(truth.edgeFractions[e], 9)); // geometry (lengthOutside): edges keep their true fractions
      if (p.areaFraction > truth.areaFraction + 1e-9) enlarged.push(k);
      if (p.areaFraction < truth.areaFraction - 1e-9) lenders.push(k);
      moved += p.areaFraction - truth.areaFraction;
    }
    expect(enlarged.length).toBe(map.smallCells?.dropped); // smallCells.dropped counts the enlarged cells in TEz (module comment)
    expect(enlarged.length).toBeGreaterThan(0);
    expect(lenders.length).toBeGreaterThan(0);
    for (const k of lenders) expect([k + 1, k - 1, k + n, k - n].some((q) => enlarged.includes(q))).toBe(true); // area is lent only to a neighbour (module comment)
    expect(Math.abs(moved)).toBeLessThan(1e-9 * cut.size); // the area outside the metal is kept: lent, not created (module comment)
    const pecB = new Set(ks(map.b, 'pec'));
    const pecC = new Set(ks(map.c, 'pec'));
    const growth = (trueAreas: boolean) => {
      const area = (k: number) => {
        const p = cut.get(k);
        if (p === undefined) return 1;
        return trueAreas ? cellFractions(rod, k, n).areaFraction : p.areaFraction;
      };
      // Fractions of the four edges of cell k, c(i), c(i−1), b(j), b(j−1); 0 where the edge is a conductor.
      const edges = (k: number) => cut.get(k)?.edgeFractions ?? [pecC.has(k) ? 0 : 1, pecC.has(k - 1) ? 0 : 1, pecB.has(k) ? 0 : 1, pecB.has(k - n) ? 0 : 1];
      return layout.dt ** 2 * largestEigenvalue(tezOperator(n, (i, j) => heldA.has(j * n + i), area, edges));
    };
    const withMap = growth(false);
    expect(withMap).toBeGreaterThan(1.9); // the top of the grid's band, 4ν² = 2
    expect(withMap).toBeLessThanOrEqual(4); // leapfrog stability, module comment
    expect(growth(true)).toBeGreaterThan(4); // a Rayleigh quotient above 4 proves the changed areas were needed
  });
});

/** A TEz cell's area and edge fractions outside a conductor circle, from the geometry. */
function cellFractions(rod: SceneObject, k: number, n: number): { areaFraction: number; edgeFractions: number[] } {
  const i = k % n;
  const j = Math.floor(k / n);
  const x0 = (i - 0.5) * D; const x1 = (i + 0.5) * D;
  const y0 = (j - 0.5) * D; const y1 = (j + 0.5) * D;
  return {
    areaFraction: 1 - areaInBox(rod, { x0, y0, x1, y1 }) / (D * D),
    edgeFractions: [lengthOutside(rod, x1, y0, x1, y1) / D, lengthOutside(rod, x0, y0, x0, y1) / D, lengthOutside(rod, x0, y1, x1, y1) / D, lengthOutside(rod, x0, y0, x1, y0) / D],
  };
}

describe('conformal fill, TEz', () => {
  it('gives a cell cut by a straight metal side its area and edge fractions', () => {
    // Metal for x ≤ 0.1003: the Hz cell around node (100, 100), x from 0.0995 to 0.1005, keeps 0.2 of its area.
    const { map } = build([rect(0.05, 0.05, 0.1003, 0.15, 'pec')], { fill: 'conformal', polarization: 'TEz' });
    const k = 100 * 200 + 100;
    const cell = map.a.find((p) => p.k === k) as { kind: string; areaFraction: number; edgeFractions: number[] };
    expect(cell.kind).toBe('conformal');
    expect(cell.areaFraction).toBeCloseTo(0.2, 8); // closed form: (0.1005 − 0.1003)/0.001, less the rounding band
    const [right, left, top, bottom] = cell.edgeFractions;
    expect(right).toBe(1); // x = 0.1005 lies outside the metal
    expect(left).toBe(0); // x = 0.0995 lies in it
    expect(top).toBeCloseTo(0.2, 8); // closed form, as the area
    expect(bottom).toBeCloseTo(0.2, 8); // closed form, as the area
    expect(map.c.find((p) => p.k === k - 1)).toEqual({ k: k - 1, kind: 'pec' }); // the left edge is wholly metal
    expect(map.b.find((p) => p.k === k)).toBeUndefined(); // the top edge keeps its field
    expect(map.a.find((p) => p.k === k - 1)).toBeUndefined(); // a wholly metal cell needs no patch
    // Its row: (1/0.2)·0.25·(1·2 + 0 + 0.2·2 + 0.2·2) = 3.5 ≤ 4 (module comment), kept though 0.2 < ν² = 0.5.
    expect(map.smallCells?.threshold).toBeCloseTo(0.5, 12); // ν² = 0.5 (S = 0.5, square cells)
  });

  it('raises the area of a cut cell whose row fails the bound, and keeps its edges', () => {
    // Metal for x ≤ 0.1004: area 0.1, row (1/0.1)·0.25·(1·2 + 0 + 0.1·2 + 0.1·2) = 6 > 4.
    const { map } = build([rect(0.05, 0.05, 0.1004, 0.15, 'pec')], { fill: 'conformal', polarization: 'TEz' });
    const k = 100 * 200 + 100;
    const cell = map.a.find((p) => p.k === k) as { kind: string; areaFraction: number; edgeFractions: number[] };
    expect(cell.kind).toBe('conformal'); // the cell keeps its field: Hz = 0 would be a magnetic wall outside the metal (module comment)
    expect(cell.areaFraction).toBeCloseTo(0.15, 8); // the least meeting the bound: 0.1·6/4 (module comment)
    const [right, left, top, bottom] = cell.edgeFractions;
    expect(right).toBe(1); // x = 0.1005 lies outside the metal
    expect(left).toBe(0); // x = 0.0995 lies in it
    expect(top).toBeCloseTo(0.1, 8); // closed form: (0.1005 − 0.1004)/0.001
    expect(bottom).toBeCloseTo(0.1, 8); // closed form, as the top
    expect(map.b.find((p) => p.k === k)).toBeUndefined(); // the top edge keeps its E update, its midpoint in the metal notwithstanding
    expect(map.smallCells?.dropped).toBeGreaterThan(90); // the cells along the side, j = 51 … 149, all enlarged
    // The 0.05 comes from the whole cell to the right (spare 1 − 0.25·(4·2)/4 = 0.5), module comment.
    const lender = map.a.find((p) => p.k === k + 1) as { kind: string; areaFraction: number; edgeFractions: number[] };
    expect(lender.areaFraction).toBeCloseTo(0.95, 8); // 1 − (0.15 − 0.1)
    expect(lender.edgeFractions).toEqual([1, 1, 1, 1]); // its contour is untouched
  });

  it('keeps every fraction in [0, 1] and each area fraction in (0, 1]', () => {
    const { map } = build([circle(0.1003, 0.0996, 0.0207, 'pec'), circle(0.05, 0.15, 0.01, { epsR: 3 })], { fill: 'conformal', polarization: 'TEz' });
    const cuts = map.a.filter((p) => p.kind === 'conformal') as { areaFraction: number; edgeFractions: number[] }[];
    expect(cuts.length).toBeGreaterThan(100);
    for (const p of cuts) {
      expect(p.areaFraction).toBeGreaterThan(0); // material-map.ts: area fraction in (0, 1]
      expect(p.areaFraction).toBeLessThanOrEqual(1); // material-map.ts: area fraction in (0, 1]
      for (const f of p.edgeFractions) { expect(f).toBeGreaterThanOrEqual(0); expect(f).toBeLessThanOrEqual(1); } // fractions of a length lie in [0, 1]
    }
    expectSortedUnique(map);
  });
});
