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
 * A cut node or cell is kept as it is when dt²·R ≤ 4. Otherwise:
 *  - TMz: the Ez node is dropped into the metal (it becomes 'pec' and its cut edges lose
 *    their patch). Ez = 0 is the conductor's own condition, so this only moves the surface
 *    to that node, less than ν²/2 of an edge from it. Dropping only lowers the rows of
 *    its neighbours, so one pass suffices.
 *  - TEz: the cell keeps its Hz, its edges and their E updates, and its area fraction is
 *    raised to the least that meets the bound, F' = dt²·(F·R)/4. Holding such an Hz at zero
 *    instead (dropping the cell) would put a magnetic wall, Hz = 0, at a point outside the
 *    conductor, whose condition for Hz is ∂Hz/∂n = 0: a wrong boundary condition rather
 *    than a moved surface. The dropped cells' edges still fed on that Hz = 0, and their
 *    number grows as the cells shrink, so the error against the exact series grew with the
 *    resolution (examples/metal-post.json, a post of radius 0.13 λ: 0.06 of the incident
 *    field at 20 cells per wavelength, 0.4 at 40). The area F' − F the cell is given comes
 *    from its neighbours across its live edges (a fraction above zero), the one with the
 *    most to spare first, each keeping at least the area its own bound needs; whatever
 *    they cannot spare the cell is given anyway. Taking it from the neighbours keeps the
 *    area outside the metal, so a raised area does not act as a surface moved into the
 *    metal: given without taking, it left a first-order part in the error (a PEC circle,
 *    TEz, S = 0.5: observed order 1.6 from 20 to 80 cells per wavelength, 2.0 with the
 *    area taken; test/studies/circle-accuracy.test.ts). Enlarging small cells with area
 *    borrowed from their neighbours is the enlarged-cell technique of Xiao & Liu
 *    ("Enlarged cells for the conformal FDTD method to avoid the time step reduction",
 *    IEEE MWCL 14(12), 2004), which also mixes the neighbours' contour integrals into the
 *    small cell's update; here only the areas move, each cell keeping its own contour.
 *    A cell's row depends on its own area alone (row i of the operator scales with 1/F_i),
 *    and no area falls below what its own bound needs, so one pass suffices here too.
 * Uncut points have dt²·R = 4ν² ≤ 4, with ν = S/S_limit the Courant number over its 2D
 * limit at the fastest medium present (README "Physics conventions"). Consequently no cut
 * whose fraction is at least ν²/2 (TMz edges) or ν² (TEz cell areas) is ever dropped or
 * enlarged: that value is reported as `smallCells.threshold`; below it a cut is changed only
 * when its own row fails the bound (a TEz cell of any area may lend area, down to what its
 * own bound needs). `smallCells.dropped` counts dropped Ez nodes (TMz) or enlarged Hz cells
 * (TEz).
 *
 * Only sample points within two cells of an object's bounding box are visited.
 */
import type { Layout } from '../scenario/layout.ts';
import type { Polarization } from '../scenario/types.ts';
import type { ComponentPatch, MaterialMap } from './material-map.ts';
import { LATTICE_A, LATTICE_B, LATTICE_C, GridContext, LatticeView, courantSquared, mediumAround, type MaterialScenario } from './material-lattice.ts';

export type { MaterialScenario } from './material-lattice.ts';
import { conformalTEz, conformalTMz } from './conformal-fill.ts';


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
  smallCells.dropped = cut.enlarged;
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


/** Patches in k order, with replacements at some k. */
function mergePatches(base: ComponentPatch[], replace: Map<number, ComponentPatch>): ComponentPatch[] {
  if (replace.size === 0) return base;
  const out = base.filter((p) => !replace.has(p.k));
  out.push(...replace.values());
  return out.sort((p, q) => p.k - q.k);
}
