/**
 * The conformal fill for perfect conductors (Dey & Mittra, IEEE Microwave and Guided Wave
 * Letters 7(9), 1997), with the small-cell rule described in build-material-map.ts: cut
 * H edges in TMz, cut Hz cells in TEz.
 */
import { layeredLengths } from '../scenario/geometry-segments.ts';
import type { ComponentPatch } from './material-map.ts';
import { WHOLE, GridContext, LatticeView, courantSquared, mediumAround } from './material-lattice.ts';

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
export function conformalTMz(g: GridContext, a: LatticeView, counts: number[]) {
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
 * Gershgorin row fails dt²·R ≤ 4 keeps its field, its edges and their E updates, with its
 * area fraction raised to the least that meets the bound, the area taken from neighbours
 * that can spare it (module comment of build-material-map.ts for why).
 */
export function conformalTEz(g: GridContext, cells: LatticeView, b: LatticeView, c: LatticeView, counts: number[]) {
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

  // The cells near the metal: area fraction outside it, edge fractions, and `load`, dt² times
  // the Gershgorin row of the cell times its area fraction (the row is load/F, so a cell meets
  // the bound while F ≥ load/4).
  interface Cell { area: number; fr: [number, number, number, number]; load: number; cut: boolean }
  const near = new Map<number, Cell>();
  const a: ComponentPatch[] = [];
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
      if (area <= WHOLE) {
        // Wholly metal: its Hz stays zero by itself unless an edge still carries field.
        if (fr.some((f) => f > WHOLE)) a.push({ k, kind: 'pec' });
        continue;
      }
      const across: [number, number][] = [[i + 1, j], [i - 1, j], [i, j + 1], [i, j - 1]];
      let load = 0;
      for (let e = 0; e < 4; e++) {
        const spacing = e < 2 ? g.dx : g.dy;
        const eps = (e < 2 ? ec.epsR : eb.epsR).get(edgeK[e]) ?? g.background.epsR;
        const weight = allMetal(across[e][0], across[e][1]) ? 1 : 2;
        load += (courantSquared(eps, g.dt) * fr[e] * weight) / (spacing * spacing);
      }
      near.set(k, { area, fr, load, cut: area < 1 - WHOLE || fr.some((f) => f < 1) });
    }
  }

  // Cells failing the bound get the missing area from live neighbours that can spare it
  // (module comment of build-material-map.ts); what none can spare they are given anyway.
  const areas = new Map<number, number>();
  for (const [k, cell] of near) areas.set(k, cell.area);
  const spare = (k: number) => (areas.get(k) as number) - (near.get(k) as Cell).load / 4;
  let enlarged = 0;
  for (const [k, cell] of near) {
    if (cell.load / cell.area <= 4 * (1 + WHOLE)) continue;
    enlarged++;
    let missing = cell.load / 4 - cell.area;
    areas.set(k, cell.load / 4);
    const donors = [k + 1, k - 1, k + g.nx, k - g.nx].filter((q, e) => cell.fr[e] > WHOLE && near.has(q) && spare(q) > 0);
    donors.sort((p, q) => spare(q) - spare(p));
    for (const q of donors) {
      if (!(missing > 0)) break;
      const share = Math.min(missing, spare(q));
      areas.set(q, (areas.get(q) as number) - share);
      missing -= share;
    }
  }
  for (const [k, cell] of near) {
    const area = areas.get(k) as number;
    if (cell.cut || area !== cell.area) a.push({ k, kind: 'conformal', areaFraction: area, edgeFractions: cell.fr });
  }
  a.sort((p, q) => p.k - q.k);
  return { a, b: eb.out, c: ec.out, enlarged };
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
