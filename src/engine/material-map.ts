/**
 * What the general engine needs to know about the grid's materials, as plain data: the
 * background medium everywhere, and the sample points of each field component that differ
 * from it (objects). Built once per run from the scenario by `buildMaterialMap`
 * (src/engine/build-material-map.ts) and turned into update coefficients by the engine
 * driver; nothing here depends on wasm.
 *
 * Field components, with the engine's naming (README "Polarization"):
 *  - `a`: the node field, Ez (TMz) or Hz (TEz), node (i, j) at (i·dx, j·dy);
 *  - `b`: Hx (TMz) or Ex (TEz), at (i·dx, (j+½)·dy);
 *  - `c`: Hy (TMz) or Ey (TEz), at ((i+½)·dx, j·dy).
 * Every component uses the index k = j·nx + i. The electric components carry the
 * materials: `a` in TMz, `b` and `c` in TEz.
 */
import type { Medium, Polarization } from '../scenario/types.ts';

/** One sample point of one component that is not plain background. */
export type ComponentPatch =
  /** Inside a perfect conductor: the component is held at zero. */
  | { k: number; kind: 'pec' }
  /**
   * An electric component in another medium (staircase), or with ε∞ and σ blended over
   * its cell (average fill: `medium.epsR`/`sigma` are the blends, `poles` those of the
   * object containing the sample point, if any).
   */
  | { k: number; kind: 'medium'; medium: Medium }
  /**
   * A magnetic component whose Faraday contour is cut by a conductor (conformal fill).
   * TMz (`b`, `c` edges): `lengthFraction` = length of the edge between the two `a` nodes
   * lying outside the metal, over the full edge length (0 < f ≤ 1); the update uses
   * dt/(μ0·f·Δ) for that edge. TEz (`a` cells): `areaFraction` = area of the cell around
   * the Hz node outside the metal over dx·dy, and `edgeFractions` the fractions outside
   * the metal of its four edges in the order c(i), c(i−1), b(j), b(j−1).
   */
  | { k: number; kind: 'conformal'; lengthFraction?: number; areaFraction?: number; edgeFractions?: [number, number, number, number] };

export interface MaterialMap {
  polarization: Polarization;
  /** The scenario's medium, everywhere no patch says otherwise (absorber included). */
  background: Medium;
  /** Patches per component, each list sorted by k, at most one patch per k. */
  a: ComponentPatch[];
  b: ComponentPatch[];
  c: ComponentPatch[];
  /** Component sample points each object took (after later objects overlapped it), in object order. */
  nodesPerObject: number[];
  /**
   * Conformal fill only: cut cells whose outside fraction fell below the small-cell
   * threshold, and the threshold used. In TMz such an edge is treated as inside the metal
   * (Ez = 0 is the conductor's own condition); in TEz the cell keeps its Hz and its area is
   * raised to the threshold, lent by open neighbours (build-material-map.ts says why).
   */
  smallCells?: { dropped: number; threshold: number };
}
