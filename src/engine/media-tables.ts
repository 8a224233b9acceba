/**
 * The media engine's tables from a scenario and its material map: update coefficients of
 * each component, the pole table, patch records and pole state slots (see
 * assembly/media.ts for how the engine reads them). Pure arithmetic; no wasm.
 */
import { EPS0, MU0 } from '../scenario/constants.ts';
import { layoutOf } from '../scenario/layout.ts';
import type { Medium, Pole, Scenario } from '../scenario/types.ts';
import { cpmlAxisTables } from './cpml-profile.ts';
import type { ComponentPatch, MaterialMap } from './material-map.ts';
import { waveformValue } from '../scenario/waveforms.ts';

/** Pole kinds and patch kinds as assembly/media.ts numbers them. */
const POLE_KIND = { drude: 1, lorentz: 2, debye: 3 } as const;
export const PATCH_KIND = { pec: 0, medium: 1, edge: 2, cell: 3 } as const;

/** One record of the engine's pole table: its kind and three constants (see assembly/media.ts). */
export interface PoleRecord { kind: 1 | 2 | 3; k1: number; k2: number; k3: number }

/**
 * One patched point as the engine takes it: index k, kind, its range of the pole table,
 * its first state value in the patch pool, and four coefficients (meaning by kind, see
 * assembly/media.ts).
 */
export interface PatchRecord {
  k: number; kind: 0 | 1 | 2 | 3; poleFirst: number; poleCount: number; state: number;
  coefficients: [number, number, number, number];
}

/** Where a Debye state of the source point lives: the background block of `a` or the patch pool (float index). */
export interface StateLocation { block: 'background' | 'pool'; index: number }

/**
 * Every number the media engine needs, in double precision (the engine and the plain
 * kernel round them to float32): coefficients of the three components, the pole table
 * (background poles first), the patches, the source and the CPML tables.
 */
export interface MediaTables {
  nx: number; ny: number; layer: number; dx: number; dy: number; dt: number;
  te: boolean;
  a: { ca: number; cbx: number; cby: number; cq: number };
  b: { ca: number; cb: number; cq: number };
  c: { ca: number; cb: number; cq: number };
  poles: PoleRecord[];
  backgroundPoles: number;
  /** Background state values per node of each electric component. */
  slots: number;
  patches: { a: PatchRecord[]; b: PatchRecord[]; c: PatchRecord[] };
  poolSlots: number;
  sourceIndex: number;
  sourceScale: number;
  sourceStates: StateLocation[];
  /** I (TMz, A) or M (TEz, V) at (n+½)·dt for n = 0..steps−1. */
  current: Float64Array;
  x: ReturnType<typeof cpmlAxisTables>;
  y: ReturnType<typeof cpmlAxisTables>;
}

/**
 * State values a pole list needs per node: one per Drude or Debye pole, two per Lorentz
 * pole (P^n and P^{n−1} of its second-order update).
 *
 * @example
 * stateSlots([{ kind: 'lorentz', deltaEps: 1, omega0: 1e11, delta: 1e9 }]); // 2
 */
export function stateSlots(poles: Pole[] | undefined): number {
  return (poles ?? []).reduce((n, p) => n + (p.kind === 'lorentz' ? 2 : 1), 0);
}

/**
 * Update coefficients of an electric component in a medium at time step dt, from the
 * auxiliary-differential-equation updates (README "Materials"; Taflove & Hagness,
 * Computational Electrodynamics, 3rd ed., ch. 9, from memory):
 * D = ε∞ + σ·dt/2 + Σ ε0·κ'(Debye) (F/m), ca = (ε∞ − σ·dt/2 − Σ ε0·κ')/D, cq = ε0/D, and
 * cb = dt/D, which the callers divide by a cell size as dt/(D·Δ); and the pole records
 * for the scaled states of assembly/media.ts: Drude Ĵ = J·dt/ε0 (k1 = (1 − γdt/2)/(1 + γdt/2),
 * k2 = ωp²dt²/(1 + γdt/2)), Lorentz P̂ = P/ε0 (k1 = (2 − ω0²dt²)/(1 + δdt),
 * k2 = −(1 − δdt)/(1 + δdt), k3 = Δε·ω0²dt²/(1 + δdt)), Debye Ŝ = P/(ε0κ') with
 * κ' = (Δε/2)/(τ/dt + ½) (k1 = β = (τ/dt − ½)/(τ/dt + ½), k3 = (β − 1)·κ').
 * Units: σ in S/m, τ in s, ωp, γ, ω0, δ in rad/s (1/s), dt in s.
 *
 * @example
 * electricCoefficients({ epsR: 4 }, 1e-12).ca; // 1
 */
export function electricCoefficients(m: Medium, dt: number): { ca: number; denominator: number; cq: number; poles: PoleRecord[] } {
  const eps = EPS0 * m.epsR;
  const halfSigma = ((m.sigma ?? 0) * dt) / 2;
  let kappaSum = 0;
  const poles: PoleRecord[] = (m.poles ?? []).map((p): PoleRecord => {
    if (p.kind === 'debye') {
      const r = p.tau / dt + 0.5;
      kappaSum += (EPS0 * (p.deltaEps / 2)) / r;
      return { kind: POLE_KIND.debye, k1: (p.tau / dt - 0.5) / r, k2: 0, k3: -(p.deltaEps / 2) / (r * r) };
    }
    if (p.kind === 'drude') {
      const g = (p.gamma * dt) / 2;
      return { kind: POLE_KIND.drude, k1: (1 - g) / (1 + g), k2: (p.omegaP * p.omegaP * dt * dt) / (1 + g), k3: 0 };
    }
    const d = p.delta * dt;
    const w = p.omega0 * p.omega0 * dt * dt;
    return { kind: POLE_KIND.lorentz, k1: (2 - w) / (1 + d), k2: -(1 - d) / (1 + d), k3: (p.deltaEps * w) / (1 + d) };
  });
  const denominator = eps + halfSigma + kappaSum;
  return { ca: (eps - halfSigma - kappaSum) / denominator, denominator, cq: EPS0 / denominator, poles };
}

/**
 * Float index of state `slot` of node (i, j) in a background state block of assembly/media.ts:
 * per row ⌈nx/4⌉ vectors of four columns, per vector `slots` groups of four lanes.
 *
 * @example
 * backgroundStateIndex(10, 2, 5, 1, 1); // ((1·3 + 1)·2 + 1)·4 + 1 = 37
 */
export function backgroundStateIndex(nx: number, slots: number, i: number, j: number, slot: number): number {
  const rowVectors = Math.ceil(nx / 4);
  return (j * rowVectors + (i >> 2)) * slots * 4 + slot * 4 + (i & 3);
}

/**
 * The tables of one run from a scenario and a material map (without a map: the scenario's
 * medium and polarization, no patches). The time step is the scenario's (its medium is the
 * map's background). Throws when the map's polarization is not the scenario's, when a
 * patch does not suit its component and polarization, when patches are not sorted by k,
 * or when a patch lies where its component takes CPML terms or on the outer wall (objects
 * must stay out of the absorber).
 *
 * @example
 * mediaTables(scenario).a.ca; // 1 for a lossless TMz scenario
 */
export function mediaTables(scenario: Scenario, map?: MaterialMap): MediaTables {
  const layout = layoutOf(scenario);
  const { nx, ny, dx, dy, dt } = layout;
  const L = scenario.absorber.cells;
  const background = map?.background ?? scenario.medium;
  const polarization = scenario.polarization ?? 'TMz';
  if (map && map.polarization !== polarization) {
    throw new Error(`material map: built for ${map.polarization}, but the scenario runs ${polarization}`);
  }
  const te = polarization === 'TEz';
  const medium = electricCoefficients(background, dt);
  const poles: PoleRecord[] = [...medium.poles];
  const poleSets = new Map<string, number>();
  const slots = stateSlots(background.poles);
  let poolSlots = 0;

  // For the lossless medium D = ε and these are dt/(ε·dx), dt/(ε·dy), as the lossless engine has them.
  const D = medium.denominator;
  const a = te
    ? { ca: 1, cbx: dt / (MU0 * dx), cby: dt / (MU0 * dy), cq: 0 }
    : { ca: medium.ca, cbx: dt / (D * dx), cby: dt / (D * dy), cq: medium.cq };
  const b = te ? { ca: medium.ca, cb: dt / (D * dy), cq: medium.cq } : { ca: 1, cb: dt / (MU0 * dy), cq: 0 };
  const c = te ? { ca: medium.ca, cb: dt / (D * dx), cq: medium.cq } : { ca: 1, cb: dt / (MU0 * dx), cq: 0 };

  const poleSetOf = (m: Medium): { first: number; count: number } => {
    const list = m.poles ?? [];
    if (list.length === 0) return { first: 0, count: 0 };
    const key = JSON.stringify(list);
    let first = poleSets.get(key);
    if (first === undefined) {
      first = poles.length;
      poles.push(...electricCoefficients({ epsR: 1, poles: list }, dt).poles);
      poleSets.set(key, first);
    }
    return { first, count: list.length };
  };

  // Bounds of the points a patch may take per component: no CPML term, not on the outer wall.
  const edge = Math.max(L, 1);
  const bounds = {
    a: [edge, nx - 1 - edge, edge, ny - 1 - edge],
    b: [edge, nx - 1 - edge, edge, ny - 2 - edge],
    c: [edge, nx - 2 - edge, edge, ny - 1 - edge],
  } as const;

  const records = (name: 'a' | 'b' | 'c', list: ComponentPatch[]): PatchRecord[] => {
    let previous = -1;
    return list.map((patch): PatchRecord => {
      const { k } = patch;
      const i = k % nx;
      const j = Math.floor(k / nx);
      const [i0, i1, j0, j1] = bounds[name];
      if (!Number.isInteger(k) || k <= previous) throw new Error(`material map: ${name} patches must be sorted by k, each k once (k = ${k})`);
      previous = k;
      if (i < i0 || i > i1 || j < j0 || j > j1) {
        throw new Error(`material map: ${name} patch at (${i}, ${j}) lies in the absorber or on the outer wall; objects must stay inside ${i0} ≤ i ≤ ${i1}, ${j0} ≤ j ≤ ${j1}`);
      }
      const base = { k, poleFirst: 0, poleCount: 0, state: 0 };
      const electric = te ? name !== 'a' : name === 'a';
      if (patch.kind === 'pec') return { ...base, kind: PATCH_KIND.pec, coefficients: [0, 0, 0, 0] };
      if (patch.kind === 'medium') {
        if (!electric) throw new Error(`material map: a medium patch on ${name} in ${te ? 'TEz' : 'TMz'}, which is a magnetic component (μ = μ0 everywhere)`);
        const m = electricCoefficients(patch.medium, dt);
        const d = m.denominator;
        const set = poleSetOf(patch.medium);
        const state = poolSlots;
        poolSlots += stateSlots(patch.medium.poles);
        const coefficients: [number, number, number, number] = name === 'a'
          ? [m.ca, dt / (d * dx), dt / (d * dy), m.cq]
          : [m.ca, dt / (d * (name === 'b' ? dy : dx)), 0, m.cq];
        return { k, kind: PATCH_KIND.medium, poleFirst: set.first, poleCount: set.count, state, coefficients };
      }
      if (electric) throw new Error(`material map: a conformal patch on ${name} in ${te ? 'TEz' : 'TMz'}, which is an electric component`);
      if (!te) {
        const f = patch.lengthFraction;
        if (f === undefined || !(f > 0 && f <= 1)) throw new Error(`material map: conformal ${name} patch at k = ${k} needs 0 < lengthFraction ≤ 1, got ${f}`);
        return { ...base, kind: PATCH_KIND.edge, coefficients: [dt / (MU0 * f * (name === 'b' ? dy : dx)), 0, 0, 0] };
      }
      const area = patch.areaFraction;
      const edges = patch.edgeFractions;
      if (area === undefined || !(area > 0 && area <= 1) || !edges || !edges.every((l) => l >= 0 && l <= 1)) {
        throw new Error(`material map: conformal a patch at k = ${k} needs 0 < areaFraction ≤ 1 and four edge fractions in [0, 1]`);
      }
      const w = dt / (MU0 * area);
      return { ...base, kind: PATCH_KIND.cell, coefficients: [(w * edges[0]) / dx, (w * edges[1]) / dx, (w * edges[2]) / dy, (w * edges[3]) / dy] };
    });
  };
  const patches = { a: records('a', map?.a ?? []), b: records('b', map?.b ?? []), c: records('c', map?.c ?? []) };

  // The source: J = I/(dx·dy) (TMz) or M/(dx·dy) (TEz) with the cb of the point's own update.
  const sourceIndex = layout.source.j * nx + layout.source.i;
  const sourcePatch = (map?.a ?? []).find((p) => p.k === sourceIndex);
  const sourceRecord = patches.a.find((p) => p.k === sourceIndex);
  const sourceStates: StateLocation[] = [];
  const debyeStates = (records: PoleRecord[], at: (slot: number) => StateLocation['index'], block: StateLocation['block']) => {
    let slot = 0;
    for (const record of records) {
      if (record.kind === POLE_KIND.debye) sourceStates.push({ block, index: at(slot) });
      slot += record.kind === POLE_KIND.lorentz ? 2 : 1;
    }
  };
  let sourceScale: number;
  if (sourcePatch?.kind === 'pec') {
    sourceScale = 0;
  } else if (te) {
    const area = sourcePatch?.kind === 'conformal' ? (sourcePatch.areaFraction as number) : 1;
    sourceScale = dt / (MU0 * area * dx * dy);
  } else if (sourcePatch?.kind === 'medium' && sourceRecord) {
    const m = electricCoefficients(sourcePatch.medium, dt);
    sourceScale = dt / (m.denominator * dx * dy);
    debyeStates(m.poles, (slot) => sourceRecord.state + slot, 'pool');
  } else {
    sourceScale = dt / (D * dx * dy);
    debyeStates(medium.poles, (slot) => backgroundStateIndex(nx, slots, layout.source.i, layout.source.j, slot), 'background');
  }

  const current = new Float64Array(scenario.steps);
  for (let n = 0; n < scenario.steps; n++) {
    current[n] = waveformValue(scenario.source.waveform, scenario.source.amplitude, (n + 0.5) * dt);
  }
  return {
    nx, ny, layer: L, dx, dy, dt, te, a, b, c, poles, backgroundPoles: medium.poles.length, slots,
    patches, poolSlots, sourceIndex, sourceScale, sourceStates, current,
    x: cpmlAxisTables(nx, scenario.absorber, dx, dt, background.epsR),
    y: cpmlAxisTables(ny, scenario.absorber, dy, dt, background.epsR),
  };
}

// Indices of engine buffers, as in assembly/media.ts `pointerTo`.
