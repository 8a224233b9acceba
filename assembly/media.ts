// 2D Yee engine for lossy and dispersive media, TMz or TEz, with objects, CPML strips, PEC
// outer walls. Knows arrays and coefficients, nothing of units, JSON or pages: the
// TypeScript side (src/engine/media-simulation.ts) fills every table.
//
// Fields, row-major with i fastest, all at k = j·nx + i:
//   a: the node field, Ez (TMz) or Hz (TEz), at (i, j);
//   b: Hx (TMz) or −Ex (TEz), at (i, j+½);
//   c: Hy (TMz) or −Ey (TEz), at (i+½, j).
// Storing −E in TEz makes both polarizations one update with the roles of ε and μ swapped:
//   b ← ca_b·b − cb_b·(a(j+1) − a(j))       (cb_b holds 1/dy)
//   c ← ca_c·c + cb_c·(a(i+1) − a(i))       (cb_c holds 1/dx)
//   a ← ca_a·a + cbx·(c(i) − c(i−1)) − cby·(b(j) − b(j−1)) − (source)
// each plus its CPML terms (ψ and (1/κ − 1)·∂, multiplied by the same cb, so they sit
// inside the curl before the medium's coefficients) and, on an electric component, its
// pole terms. The electric component(s) carry the medium: a in TMz, b and c in TEz; the
// magnetic ones have ca = 1, cb = dt/(μ0·Δ) and no poles. The source enters a as −s·I
// (TMz) or −s·M (TEz), s = the point's cb over dx·dy, at (n+½)dt.
//
// Outer walls: a = 0 on the outermost nodes, as in assembly/engine.ts. In TMz that is a
// PEC wall; in TEz it would be a magnetic one, so TEz instead holds tangential E at zero
// on the edges half a cell inside: c (−Ey) on columns 0 and nx−2, b (−Ex) on rows 0 and
// ny−2 (never updated). The outermost Hz nodes lie outside that PEC box and stay zero.
//
// Pole states are stored scaled so that their updates need the fewest operations: Drude
// Ĵ = J·dt/ε0 and Lorentz P̂ = P/ε0 (volts per metre), Debye Ŝ = P/(ε0·κ') with κ' the
// weight of (E^{n+1} + E^n) in the Debye update. Per node, with e = E^n and v the curl part
// of E^{n+1} (CPML terms included), for each pole in its order:
//   Drude    Ĵ ← k1·Ĵ + k2·e,                 v ← v − cq·Ĵ
//   Lorentz  P̂n = (k1·P̂ + k2·P̂m) + k3·e,     v ← v − cq·(P̂n − P̂),  P̂m ← P̂, P̂ ← P̂n
//   Debye                                     v ← v − (cq·k3)·Ŝ      (k3 = (β − 1)·κ')
// then E^{n+1} = v, and each Debye pole Ŝ ← k1·Ŝ + (E^{n+1} + e) (k1 = β). cq·k3 is the
// float32 product of the two. A background with one pole runs a copy of the loops made for
// that pole's kind, with its constants in registers; with several, a loop over the pole
// table. Both do the above.
//
// Memory is claimed once in `allocate` and never grows afterwards, so the views JavaScript
// holds stay valid for the life of the simulation (an instance may be allocated again for
// the next one, which clears the memory the last one used).
//
// One time step is one sweep over the rows. Row j: b and c of row j (they read a of rows j
// and j+1, both still old), then a of row j (it reads b of rows j−1 and j and c of row j,
// all new). In rows outside the y strips without patched b/c points the two run in one
// pass per vector (as in assembly/engine.ts), x strips included; the y-strip rows, rows
// with patched b/c points and the TEz rows next to a wall run b and c over the row first
// and then a. Each node sees the same operations in the same order either way.
//
// Patches (objects) are lists of points per component, sorted by k, with per-row starts.
// A patched b/c point's new value is computed from the old fields before its row is swept
// and written back after b and c of the row; a patched a point's old value is kept before
// the row and its new value computed after the row, from the new b and c. Background pole
// states at a patched point are reset to zero (the point keeps its own states in the pool).
//
// The same source builds twice: with SIMD enabled (release) the row loops run on f32x4
// vectors, with SIMD disabled (scalar target) only the scalar loops remain. Every vector
// lane performs exactly the scalar node's operations (no fused multiply-add exists in
// wasm), so the two builds agree bit for bit; test/engine/media-simd-scalar.test.ts checks it.

// ---- grid and coefficients ------------------------------------------------------------
import { fullDftPass, maxAbsOf, prepareFullWeights, recordPoints } from './running-dft';

let nx: i32 = 0;
let ny: i32 = 0;
let layer: i32 = 0; // CPML cells per side
let te = false; // TEz

// Update coefficients (see the header); b's cb includes 1/dy, c's 1/dx.
let caA: f32 = 1; let cbxA: f32 = 0; let cbyA: f32 = 0; let cqA: f32 = 0;
let caB: f32 = 1; let cbB: f32 = 0; let cqB: f32 = 0;
let caC: f32 = 1; let cbC: f32 = 0; let cqC: f32 = 0;
// The same, each splatted over a vector, at these byte offsets of `coefficientVectors`.
const V_CAA = 0; const V_CBXA = 16; const V_CBYA = 32; const V_CQA = 48;
const V_CAB = 64; const V_CBB = 80; const V_CQB = 96;
const V_CAC = 112; const V_CBC = 128; const V_CQC = 144;
const COEFFICIENT_BYTES = 160;
const STRIP_BYTES = 112; // per vector of strip columns in `stripCoefficients`

let sourceScale: f32 = 0; // cb of the source point over dx·dy
let sourceIndex: i32 = 0;
let sourceRow: i32 = 0;
let sourceCorrectionCount: i32 = 0; // Debye states at the source point (see `sweep`)

let stepCount: i32 = 0; // a samples so far are n = 0..stepCount
let sourceLength: i32 = 0;
let seriesLength: i32 = 0;

// Columns with x-strip corrections, row-relative, as in assembly/engine.ts: [0, leftEnd)
// and [rightStart, nx), both starting on a multiple of 4; strip column c numbers them from 0.
let leftEnd: i32 = 0;
let rightStart: i32 = 0;
let stripVectors: i32 = 0;
let rowVectors: i32 = 0;

// Poles. Each pole is a 64-byte record of the pole table: kind (i32) at 0, then its three
// constants k1, k2, k3, each as four equal lanes at 16, 32 and 48. The background's poles
// come first (bgPoleCount of them); patches name their own range of the table.
const DRUDE = 1;
const LORENTZ = 2;
const DEBYE = 3;
// How the row loops treat the background's poles: none, one of a kind (DRUDE, LORENTZ,
// DEBYE), or any number through the pole table (MANY).
const NONE = 0;
const MANY = 4;
let bgMode: i32 = NONE;
let bgPoleCount: i32 = 0;
let bgSlots: i32 = 0; // state values per node: one per Drude or Debye pole, two per Lorentz pole
let bgDebye = false;

// Patch kinds and records (48 bytes): k (i32) at 0, kind at 4, first pole at 8, pole count
// at 12, first state (float index into the pool) at 16; coefficients c0..c3 (f32) at 32..44.
//   PEC        the point is held at zero;
//   MEDIUM     electric point with its own medium: c0 = ca, c1 = cb (TEz b/c, with 1/Δ) or
//              cbx (TMz a), c2 = cby (TMz a), c3 = cq;
//   EDGE       TMz b/c edge cut by a conductor: c0 = its cb;
//   CELL       TEz a cell cut by a conductor: c0..c3 weigh c(i), c(i−1), b(j), b(j−1).
const PEC = 0;
const MEDIUM = 1;
const EDGE = 2;
const CELL = 3;
const PATCH_BYTES = 48;

// ---- memory -----------------------------------------------------------------------------
let coefficientVectors: usize = 0;
let a: usize = 0;
let b: usize = 0;
let c: usize = 0;
let bEx: usize = 0; let aEx: usize = 0; let gEx: usize = 0;
let bHx: usize = 0; let aHx: usize = 0; let gHx: usize = 0;
let bEy: usize = 0; let aEy: usize = 0; let gEy: usize = 0;
let bHy: usize = 0; let aHy: usize = 0; let gHy: usize = 0;
// x-strip tables regrouped per vector of strip columns: bH, aH, gH, bE, aE, gE (4 lanes each),
// then a lane mask for c: all ones, but zero on the TEz wall columns 0 and nx−2.
let stripCoefficients: usize = 0;
let stripCoefficientsReady = false;
// ψ as in assembly/engine.ts: x strips (c's ∂a/∂x, a's ∂c/∂x), y strips (b's ∂a/∂y, a's ∂b/∂y),
// 8 floats per vector of columns: 4 for the b/c value, then 4 for a's.
let psiX: usize = 0;
let psiY: usize = 0;
// Background pole states of the electric components, per row rowVectors vectors, per vector
// bgSlots groups of 4 floats (one group per state, lanes = columns).
let statesA: usize = 0;
let statesB: usize = 0;
let statesC: usize = 0;
let poleTable: usize = 0;
let patchesA: usize = 0; let patchesB: usize = 0; let patchesC: usize = 0;
// i32 per row j = 0..ny: index of the row's first patch; the row's patches end at the next.
let rowStartA: usize = 0; let rowStartB: usize = 0; let rowStartC: usize = 0;
// f32 per patch: a's old value (a) or the new value (b, c) between the row's passes.
let scratchA: usize = 0; let scratchB: usize = 0; let scratchC: usize = 0;
let patchPool: usize = 0; // patch pole states, f32
let sourceCorrections: usize = 0; // i32 byte address of each Debye state at the source point
// PEC points, per component, as runs of consecutive k within a row: (first k, length) as two
// i32, sorted, with per-row starts like the patches. Each row with PEC b or c points also
// has a mask row (built at the first step): nx lanes for b, then nx for c, all ones but
// zero at PEC points; maskRowOf holds its number for each row, or −1.
let pecRunsA: usize = 0; let pecRunsB: usize = 0; let pecRunsC: usize = 0;
let pecStartA: usize = 0; let pecStartB: usize = 0; let pecStartC: usize = 0;
let maskRowCount: i32 = 0;
let maskRowOf: usize = 0;
let maskRows: usize = 0;
// Per mask row, the columns its PEC points span, widened to whole vectors: [first, end).
let maskSpans: usize = 0;
let masksReady = false;

let source: usize = 0; // f64 per step: I or M at (n+½)dt
let probeCount: i32 = 0;
let probeIndex: usize = 0;
let series: usize = 0;
let pointCount: i32 = 0;
let pointIndex: usize = 0;
let pointValue: usize = 0;
let frequencyCount: i32 = 0;
let omegaDt: usize = 0;
let dft: usize = 0;
// Full-grid running DFTs of a (the error maps), as in assembly/engine.ts: fullCount
// frequencies, each a real and an imaginary block of nx·ny floats claimed one after the
// other (block b at fullRe + b·fullStride); frequency f takes sample n when n ≡ r (mod m),
// weighted by m; ω·dt, m, r and the weights of the step in hand in static tables.
const FULL_GRID_MAX = 1024;
const fullTable = memory.data(FULL_GRID_MAX << 4, 16); // f64 ω·dt, i32 m, i32 r per frequency
const fullWeights = memory.data(FULL_GRID_MAX << 4, 16); // i32 f, f32 m·cos, f32 m·sin per sampled frequency
let fullCount: i32 = 0;
let fullActive: i32 = 0;
let fullStride: usize = 0;
let fullRe: usize = 0;
let fullIm: usize = 0;

let top: usize = 0;

// Every block starts on a cache line; src/engine/media-memory.ts mirrors this to estimate the total.
function claim(bytes: usize): usize {
  const p = (top + 63) & ~(<usize>63);
  top = p + bytes;
  return p;
}

/**
 * Claims memory for one simulation. Returns the bytes claimed, or 0 when the memory cannot
 * grow that far or `fullGrid` (full-grid running DFTs, 0 to 1024) is out of range. `polarization` 0 = TMz, 1 = TEz; `slots` background state values per node
 * of each electric component (0 = no background poles); `poles` records in the pole table;
 * `patchA/B/C` patch counts (PEC points apart); `poolSlots` patch state values;
 * `corrections` Debye states at the source point; `runsA/B/C` runs of PEC points;
 * `maskRowsIn` rows with PEC b or c points.
 */
export function allocate(
  nxIn: i32, nyIn: i32, layerIn: i32, steps: i32,
  probes: i32, points: i32, frequencies: i32, fullGrid: i32,
  polarization: i32, slots: i32, poles: i32,
  patchA: i32, patchB: i32, patchC: i32, poolSlots: i32, corrections: i32,
  runsA: i32, runsB: i32, runsC: i32, maskRowsIn: i32,
): f64 {
  if (fullGrid < 0 || fullGrid > FULL_GRID_MAX) return 0;
  nx = nxIn; ny = nyIn; layer = layerIn;
  te = polarization == 1;
  bgSlots = slots;
  probeCount = probes; pointCount = points; frequencyCount = frequencies;
  sourceLength = steps; seriesLength = steps + 1;
  sourceCorrectionCount = corrections;
  stepCount = 0;
  stripCoefficientsReady = false;
  if (layer == 0) {
    leftEnd = 0; rightStart = nx;
  } else {
    leftEnd = (layer + 3) & ~3;
    rightStart = (nx - 1 - layer) & ~3;
    if (rightStart < leftEnd) { leftEnd = nx; rightStart = nx; }
  }
  stripVectors = (leftEnd + nx - rightStart + 3) >> 2;
  rowVectors = (nx + 3) >> 2;
  // An instance may serve one simulation after another (the page's run worker reuses its
  // memory, which the system has already backed): clear what the last one used, so the new
  // one starts from zeros as on fresh pages.
  const used = min(top, <usize>memory.size() << 16);
  if (used > __heap_base) memory.fill(__heap_base, 0, used - __heap_base);
  top = __heap_base;
  coefficientVectors = claim(COEFFICIENT_BYTES);
  const cells = <usize>nx * <usize>ny;
  // 16 spare bytes after each field: a vector read one node past the last row stays inside.
  a = claim((cells << 2) + 16);
  b = claim((cells << 2) + 16);
  c = claim((cells << 2) + 16);
  bEx = claim(<usize>nx << 2); aEx = claim(<usize>nx << 2); gEx = claim(<usize>nx << 2);
  bHx = claim(<usize>nx << 2); aHx = claim(<usize>nx << 2); gHx = claim(<usize>nx << 2);
  bEy = claim(<usize>ny << 2); aEy = claim(<usize>ny << 2); gEy = claim(<usize>ny << 2);
  bHy = claim(<usize>ny << 2); aHy = claim(<usize>ny << 2); gHy = claim(<usize>ny << 2);
  stripCoefficients = claim(<usize>stripVectors * STRIP_BYTES);
  psiX = claim(<usize>ny * <usize>stripVectors * 32);
  psiY = claim(<usize>(2 * layer) * <usize>rowVectors * 32);
  const stateBytes = <usize>ny * <usize>rowVectors * <usize>slots * 16;
  statesA = claim(te ? 0 : stateBytes);
  statesB = claim(te ? stateBytes : 0);
  statesC = claim(te ? stateBytes : 0);
  poleTable = claim(<usize>poles * 64);
  patchesA = claim(<usize>patchA * PATCH_BYTES);
  patchesB = claim(<usize>patchB * PATCH_BYTES);
  patchesC = claim(<usize>patchC * PATCH_BYTES);
  rowStartA = claim(<usize>(ny + 1) << 2);
  rowStartB = claim(<usize>(ny + 1) << 2);
  rowStartC = claim(<usize>(ny + 1) << 2);
  scratchA = claim(<usize>patchA << 2);
  scratchB = claim(<usize>patchB << 2);
  scratchC = claim(<usize>patchC << 2);
  patchPool = claim(<usize>poolSlots << 2);
  sourceCorrections = claim(<usize>corrections << 2);
  pecRunsA = claim(<usize>runsA << 3);
  pecRunsB = claim(<usize>runsB << 3);
  pecRunsC = claim(<usize>runsC << 3);
  pecStartA = claim(<usize>(ny + 1) << 2);
  pecStartB = claim(<usize>(ny + 1) << 2);
  pecStartC = claim(<usize>(ny + 1) << 2);
  maskRowCount = maskRowsIn;
  maskRowOf = claim(<usize>ny << 2);
  maskRows = claim(<usize>maskRowsIn * <usize>nx << 3);
  maskSpans = claim(<usize>maskRowsIn << 3);
  masksReady = false;
  source = claim(<usize>steps << 3);
  probeIndex = claim(<usize>probes << 2);
  series = claim((<usize>probes * <usize>seriesLength) << 2);
  pointIndex = claim(<usize>points << 2);
  pointValue = claim(<usize>points << 3);
  omegaDt = claim(<usize>frequencies << 3);
  dft = claim((<usize>points * <usize>frequencies) << 4);
  fullCount = fullGrid;
  fullActive = 0;
  fullStride = ((cells << 2) + 63) & ~(<usize>63);
  fullRe = 0; fullIm = 0;
  for (let b = 0; b < 2 * fullGrid; b++) {
    const p = claim(cells << 2);
    if (b == 0) fullRe = p;
    if (b == 1) fullIm = p;
  }
  const needPages = <i32>((top + 0xffff) >> 16);
  const havePages = memory.size();
  if (needPages > havePages) {
    if (memory.grow(needPages - havePages) < 0) return 0;
  }
  // Fresh pages are zero and the pages used before were cleared above: nothing else to clear.
  return <f64>(top - __heap_base);
}

/**
 * Sets the update coefficients (see the header), the background's pole count (its records
 * must already be in the pole table), and the source point and its scale.
 */
export function setCoefficients(
  caAIn: f32, cbxAIn: f32, cbyAIn: f32, cqAIn: f32,
  caBIn: f32, cbBIn: f32, cqBIn: f32,
  caCIn: f32, cbCIn: f32, cqCIn: f32,
  backgroundPoles: i32, sourceScaleIn: f32, sourceNode: i32,
): void {
  caA = caAIn; cbxA = cbxAIn; cbyA = cbyAIn; cqA = cqAIn;
  caB = caBIn; cbB = cbBIn; cqB = cqBIn;
  caC = caCIn; cbC = cbCIn; cqC = cqCIn;
  bgPoleCount = backgroundPoles;
  bgDebye = false;
  for (let p = 0; p < bgPoleCount; p++) {
    if (load<i32>(poleTable + (<usize>p << 6)) == DEBYE) bgDebye = true;
  }
  bgMode = bgPoleCount == 0 ? NONE : bgPoleCount == 1 ? load<i32>(poleTable) : MANY;
  sourceScale = sourceScaleIn; sourceIndex = sourceNode;
  sourceRow = nx > 0 ? sourceNode / nx : 0;
  const v = coefficientVectors;
  store<f32>(v + V_CAA, caA); store<f32>(v + V_CBXA, cbxA); store<f32>(v + V_CBYA, cbyA); store<f32>(v + V_CQA, cqA);
  store<f32>(v + V_CAB, caB); store<f32>(v + V_CBB, cbB); store<f32>(v + V_CQB, cqB);
  store<f32>(v + V_CAC, caC); store<f32>(v + V_CBC, cbC); store<f32>(v + V_CQC, cqC);
  if (ASC_FEATURE_SIMD) {
    for (let o: usize = 0; o < <usize>COEFFICIENT_BYTES; o += 16) v128.store(v + o, f32x4.splat(load<f32>(v + o)));
  }
}

// Pointers for JavaScript's typed-array views, in the order of `allocate` where it matters.
export function pointerTo(which: i32): usize {
  switch (which) {
    case 0: return a;
    case 1: return b;
    case 2: return c;
    case 3: return bEx; case 4: return aEx; case 5: return gEx;
    case 6: return bHx; case 7: return aHx; case 8: return gHx;
    case 9: return bEy; case 10: return aEy; case 11: return gEy;
    case 12: return bHy; case 13: return aHy; case 14: return gHy;
    case 15: return source;
    case 16: return probeIndex;
    case 17: return series;
    case 18: return pointIndex;
    case 19: return omegaDt;
    case 20: return dft;
    case 21: return fullRe;
    case 22: return fullIm;
    case 23: return psiX;
    case 24: return psiY;
    case 25: return pointValue;
    case 26: return poleTable;
    case 27: return statesA;
    case 28: return statesB;
    case 29: return statesC;
    case 30: return patchesA;
    case 31: return patchesB;
    case 32: return patchesC;
    case 33: return rowStartA;
    case 34: return rowStartB;
    case 35: return rowStartC;
    case 36: return patchPool;
    case 37: return sourceCorrections;
    case 38: return pecRunsA;
    case 39: return pecRunsB;
    case 40: return pecRunsC;
    case 41: return pecStartA;
    case 42: return pecStartB;
    case 43: return pecStartC;
  }
  return 0;
}

/**
 * The table of the full-grid DFTs for JavaScript to fill, 16 bytes per frequency: ω·dt (f64),
 * then m and r (i32): the DFT takes the samples n ≡ r (mod m), n ≥ 1, each weighted by m.
 */
export function fullGridTable(): usize {
  return fullTable;
}

/** Address of the real (`imaginary` = 0) or imaginary part of full-grid DFT `k` (nx·ny floats). */
export function fullGridAt(k: i32, imaginary: i32): usize {
  if (k < 0 || k >= fullCount) return 0;
  return fullRe + (<usize>(2 * k + (imaginary != 0 ? 1 : 0))) * fullStride;
}

export function stepsDone(): i32 {
  return stepCount;
}

// ---- memory access ------------------------------------------------------------------------
// Every index below is in range by construction of the loops, so loads and stores go
// straight to memory.

@inline function f32At(base: usize, k: i32): f32 {
  return load<f32>(base + (<usize>k << 2));
}
@inline function f32Set(base: usize, k: i32, v: f32): void {
  store<f32>(base + (<usize>k << 2), v);
}
@inline function i32At(base: usize, k: i32): i32 {
  return load<i32>(base + (<usize>k << 2));
}

@inline function psiIndex(row: i32, vectors: i32, col: i32): i32 {
  return ((row * vectors + (col >> 2)) << 3) + (col & 3);
}

@inline function psiYRow(j: i32): i32 {
  return j < layer ? j : layer + j - (ny - 1 - layer);
}

// Byte offset, in a background state block, of the first state of column i of row j.
@inline function stateOffset(j: i32, i: i32): usize {
  return ((<usize>(j * rowVectors + (i >> 2)) * <usize>bgSlots) << 4) + (<usize>(i & 3) << 2);
}

// Regroups the x-strip coefficient tables for the vector loops (release build only).
// Builds the mask rows from the PEC runs of b and c.
function prepareMasks(): void {
  let next = 0;
  for (let j = 0; j < ny; j++) {
    const any = i32At(pecStartB, j + 1) > i32At(pecStartB, j) || i32At(pecStartC, j + 1) > i32At(pecStartC, j);
    store<i32>(maskRowOf + (<usize>j << 2), any ? next : -1);
    if (!any) continue;
    const row = maskRows + (<usize>next * <usize>nx << 3);
    for (let i = 0; i < 2 * nx; i++) store<i32>(row + (<usize>i << 2), -1);
    let first = nx;
    let end = 0;
    for (let pass = 0; pass < 2; pass++) {
      const runs = pass == 0 ? pecRunsB : pecRunsC;
      const starts = pass == 0 ? pecStartB : pecStartC;
      const base = row + (pass == 0 ? 0 : <usize>nx << 2);
      for (let r = i32At(starts, j); r < i32At(starts, j + 1); r++) {
        const i0 = load<i32>(runs + (<usize>r << 3)) - j * nx;
        const length = load<i32>(runs + (<usize>r << 3), 4);
        for (let i = i0; i < i0 + length; i++) store<i32>(base + (<usize>i << 2), 0);
        if (i0 < first) first = i0;
        if (i0 + length > end) end = i0 + length;
      }
    }
    store<i32>(maskSpans + (<usize>next << 3), first & ~3);
    store<i32>(maskSpans + (<usize>next << 3), (end + 3) & ~3, 4);
    next++;
  }
  masksReady = true;
}

function prepareStripCoefficients(): void {
  if (ASC_FEATURE_SIMD) {
    for (let col = 0; col < stripVectors << 2; col++) {
      const i = col < leftEnd ? col : rightStart + col - leftEnd;
      const at = stripCoefficients + <usize>(col >> 2) * STRIP_BYTES + (<usize>(col & 3) << 2);
      const inside = i < nx;
      store<i32>(at, te && (i == 0 || i == nx - 2) ? 0 : -1, 96);
      store<f32>(at, inside ? f32At(bHx, i) : 0);
      store<f32>(at, inside ? f32At(aHx, i) : 0, 16);
      store<f32>(at, inside ? f32At(gHx, i) : 0, 32);
      store<f32>(at, inside ? f32At(bEx, i) : 0, 48);
      store<f32>(at, inside ? f32At(aEx, i) : 0, 64);
      store<f32>(at, inside ? f32At(gEx, i) : 0, 80);
    }
  }
  stripCoefficientsReady = true;
}

// ---- poles ----------------------------------------------------------------------------------

// The background poles' terms applied to v (see the header) at one vector of nodes whose
// old field is `e` and whose states start at `ps`; advances the Drude and Lorentz states.
@inline function polesManyV(v: v128, e: v128, ps: usize, cq: v128): v128 {
  let rec = poleTable;
  for (let p = 0; p < bgPoleCount; p++) {
    const kind = load<i32>(rec);
    if (kind == DRUDE) {
      const j = f32x4.add(f32x4.mul(v128.load(rec, 16), v128.load(ps)), f32x4.mul(v128.load(rec, 32), e));
      v128.store(ps, j);
      v = f32x4.sub(v, f32x4.mul(cq, j));
      ps += 16;
    } else if (kind == LORENTZ) {
      const pNow = v128.load(ps);
      const pNew = f32x4.add(
        f32x4.add(f32x4.mul(v128.load(rec, 16), pNow), f32x4.mul(v128.load(rec, 32), v128.load(ps, 16))),
        f32x4.mul(v128.load(rec, 48), e));
      v128.store(ps, pNew);
      v128.store(ps, pNow, 16);
      v = f32x4.sub(v, f32x4.mul(cq, f32x4.sub(pNew, pNow)));
      ps += 32;
    } else {
      v = f32x4.sub(v, f32x4.mul(f32x4.mul(cq, v128.load(rec, 48)), v128.load(ps)));
      ps += 16;
    }
    rec += 64;
  }
  return v;
}

// Debye states of the background poles from the new field `v` and the old `e`.
@inline function debyeManyV(v: v128, e: v128, ps: usize): void {
  const sum = f32x4.add(v, e);
  let rec = poleTable;
  for (let p = 0; p < bgPoleCount; p++) {
    const kind = load<i32>(rec);
    if (kind == DEBYE) v128.store(ps, f32x4.add(f32x4.mul(v128.load(rec, 16), v128.load(ps)), sum));
    ps += kind == LORENTZ ? 32 : 16;
    rec += 64;
  }
}

// The same for a background of one pole of kind `mode` (its constants k1..k3 and cq·k3
// splatted), or of any number (MANY).
@inline function polesV(mode: i32, v: v128, e: v128, ps: usize, cq: v128, cqk: v128, k1: v128, k2: v128, k3: v128): v128 {
  if (mode == DRUDE) {
    const j = f32x4.add(f32x4.mul(k1, v128.load(ps)), f32x4.mul(k2, e));
    v128.store(ps, j);
    return f32x4.sub(v, f32x4.mul(cq, j));
  }
  if (mode == LORENTZ) {
    const pNow = v128.load(ps);
    const pNew = f32x4.add(f32x4.add(f32x4.mul(k1, pNow), f32x4.mul(k2, v128.load(ps, 16))), f32x4.mul(k3, e));
    v128.store(ps, pNew);
    v128.store(ps, pNow, 16);
    return f32x4.sub(v, f32x4.mul(cq, f32x4.sub(pNew, pNow)));
  }
  if (mode == DEBYE) return f32x4.sub(v, f32x4.mul(cqk, v128.load(ps)));
  return polesManyV(v, e, ps, cq);
}

@inline function debyeV(mode: i32, v: v128, e: v128, ps: usize, k1: v128): void {
  if (mode == DEBYE) v128.store(ps, f32x4.add(f32x4.mul(k1, v128.load(ps)), f32x4.add(v, e)));
  else if (mode == MANY && bgDebye) debyeManyV(v, e, ps);
}

// The scalar form of both, for `count` poles from record `rec`, states `stride` bytes apart.
@inline function polesS(v: f32, e: f32, ps: usize, stride: usize, rec: usize, count: i32, cq: f32): f32 {
  for (let p = 0; p < count; p++) {
    const kind = load<i32>(rec);
    if (kind == DRUDE) {
      const j = load<f32>(rec, 16) * load<f32>(ps) + load<f32>(rec, 32) * e;
      store<f32>(ps, j);
      v = v - cq * j;
      ps += stride;
    } else if (kind == LORENTZ) {
      const pNow = load<f32>(ps);
      const pNew = (load<f32>(rec, 16) * pNow + load<f32>(rec, 32) * load<f32>(ps + stride)) + load<f32>(rec, 48) * e;
      store<f32>(ps, pNew);
      store<f32>(ps + stride, pNow);
      v = v - cq * (pNew - pNow);
      ps += stride << 1;
    } else {
      v = v - (cq * load<f32>(rec, 48)) * load<f32>(ps);
      ps += stride;
    }
    rec += 64;
  }
  return v;
}

@inline function debyeS(v: f32, e: f32, ps: usize, stride: usize, rec: usize, count: i32): void {
  const sum = v + e;
  for (let p = 0; p < count; p++) {
    const kind = load<i32>(rec);
    if (kind == DEBYE) store<f32>(ps, load<f32>(rec, 16) * load<f32>(ps) + sum);
    ps += kind == LORENTZ ? stride << 1 : stride;
    rec += 64;
  }
}

// Zeroes the background states of one node.
@inline function clearStates(block: usize, j: i32, i: i32): void {
  const at = block + stateOffset(j, i);
  for (let s = 0; s < bgSlots; s++) store<f32>(at + (<usize>s << 4), 0);
}

// ---- b, c and a over a range of columns (two passes) ----------------------------------------

// b of row j over columns [i0, i1) (i0 a multiple of 4), with the y-strip term when asked.
// `electric`: TEz (ca and poles apply); `mode`: how the background's poles run (NONE in TMz).
@inline function bSeg(j: i32, i0: i32, i1: i32, yStrip: bool, electric: bool, mode: i32): void {
  const k0 = j * nx;
  const r = yStrip ? psiYRow(j) : 0;
  const yb = yStrip ? f32At(bHy, j) : 0;
  const ya = yStrip ? f32At(aHy, j) : 0;
  const yg = yStrip ? f32At(gHy, j) : 0;
  let i = i0;
  if (ASC_FEATURE_SIMD) {
    const row = <usize>nx << 2;
    let pA = a + (<usize>(k0 + i) << 2);
    let pB = b + (<usize>(k0 + i) << 2);
    let pPsi = psiY + (<usize>psiIndex(r, rowVectors, i0) << 2);
    let pS = statesB + stateOffset(j, i0);
    const sStep: usize = mode == LORENTZ ? 32 : mode == DRUDE || mode == DEBYE ? 16 : <usize>bgSlots << 4;
    const ca = v128.load(coefficientVectors, V_CAB);
    const cb = v128.load(coefficientVectors, V_CBB);
    const cq = v128.load(coefficientVectors, V_CQB);
    const k1 = v128.load(poleTable, 16);
    const k2 = v128.load(poleTable, 32);
    const k3 = v128.load(poleTable, 48);
    const cqk = f32x4.mul(cq, k3);
    const bv = f32x4.splat(yb);
    const av = f32x4.splat(ya);
    const gv = f32x4.splat(yg);
    for (; i + 4 <= i1; i += 4) {
      const old = v128.load(pB);
      const d = f32x4.sub(v128.load(pA + row), v128.load(pA));
      let v = electric ? f32x4.sub(f32x4.mul(ca, old), f32x4.mul(cb, d)) : f32x4.sub(old, f32x4.mul(cb, d));
      if (yStrip) {
        const p = f32x4.add(f32x4.mul(bv, v128.load(pPsi)), f32x4.mul(av, d));
        v128.store(pPsi, p);
        v = f32x4.sub(v, f32x4.mul(cb, f32x4.add(f32x4.mul(gv, d), p)));
      }
      if (mode != NONE) v = polesV(mode, v, old, pS, cq, cqk, k1, k2, k3);
      v128.store(pB, v);
      if (mode != NONE) debyeV(mode, v, old, pS, k1);
      pA += 16; pB += 16; pPsi += 32; pS += sStep;
    }
  }
  for (; i < i1; i++) {
    const k = k0 + i;
    const old = f32At(b, k);
    const d = f32At(a, k + nx) - f32At(a, k);
    let v = electric ? caB * old - cbB * d : old - cbB * d;
    if (yStrip) {
      const q = psiIndex(r, rowVectors, i);
      const p = yb * f32At(psiY, q) + ya * d;
      f32Set(psiY, q, p);
      v = v - cbB * (yg * d + p);
    }
    const ps = statesB + stateOffset(j, i);
    if (mode != NONE) v = polesS(v, old, ps, 16, poleTable, bgPoleCount, cqB);
    f32Set(b, k, v);
    if (mode != NONE && bgDebye) debyeS(v, old, ps, 16, poleTable, bgPoleCount);
  }
}

// c of row j over columns [i0, i1) (i0 a multiple of 4 and strip column c0 when `xStrip`).
@inline function cSeg(j: i32, i0: i32, i1: i32, c0: i32, xStrip: bool, electric: bool, mode: i32): void {
  const k0 = j * nx;
  let i = i0;
  if (ASC_FEATURE_SIMD) {
    let pA = a + (<usize>(k0 + i) << 2);
    let pC = c + (<usize>(k0 + i) << 2);
    let pCoef = stripCoefficients + <usize>(c0 >> 2) * STRIP_BYTES;
    let pPsi = psiX + (<usize>psiIndex(j, stripVectors, c0) << 2);
    let pS = statesC + stateOffset(j, i0);
    const sStep: usize = mode == LORENTZ ? 32 : mode == DRUDE || mode == DEBYE ? 16 : <usize>bgSlots << 4;
    const ca = v128.load(coefficientVectors, V_CAC);
    const cb = v128.load(coefficientVectors, V_CBC);
    const cq = v128.load(coefficientVectors, V_CQC);
    const k1 = v128.load(poleTable, 16);
    const k2 = v128.load(poleTable, 32);
    const k3 = v128.load(poleTable, 48);
    const cqk = f32x4.mul(cq, k3);
    for (; i + 4 <= i1; i += 4) {
      const old = v128.load(pC);
      const d = f32x4.sub(v128.load(pA, 4), v128.load(pA));
      let v = electric ? f32x4.add(f32x4.mul(ca, old), f32x4.mul(cb, d)) : f32x4.add(old, f32x4.mul(cb, d));
      if (xStrip) {
        const p = f32x4.add(f32x4.mul(v128.load(pCoef), v128.load(pPsi)), f32x4.mul(v128.load(pCoef, 16), d));
        v128.store(pPsi, p);
        v = f32x4.add(v, f32x4.mul(cb, f32x4.add(f32x4.mul(v128.load(pCoef, 32), d), p)));
      }
      if (mode != NONE) v = polesV(mode, v, old, pS, cq, cqk, k1, k2, k3);
      v128.store(pC, v);
      if (mode != NONE) debyeV(mode, v, old, pS, k1);
      pA += 16; pC += 16; pCoef += STRIP_BYTES; pPsi += 32; pS += sStep;
    }
  }
  for (; i < i1; i++) {
    const k = k0 + i;
    const old = f32At(c, k);
    const d = f32At(a, k + 1) - f32At(a, k);
    let v = electric ? caC * old + cbC * d : old + cbC * d;
    if (xStrip) {
      const q = psiIndex(j, stripVectors, c0 + i - i0);
      const p = f32At(bHx, i) * f32At(psiX, q) + f32At(aHx, i) * d;
      f32Set(psiX, q, p);
      v = v + cbC * (f32At(gHx, i) * d + p);
    }
    const ps = statesC + stateOffset(j, i);
    if (mode != NONE) v = polesS(v, old, ps, 16, poleTable, bgPoleCount, cqC);
    f32Set(c, k, v);
    if (mode != NONE && bgDebye) debyeS(v, old, ps, 16, poleTable, bgPoleCount);
  }
}

// a of row j over columns [i0, i1), with the x-strip (from strip column c0) and y-strip
// (ψ row r) terms when asked. `electric`: TMz (ca and poles apply).
@inline function aSeg(
  j: i32, i0: i32, i1: i32, c0: i32, r: i32, xStrip: bool, yStrip: bool, electric: bool, mode: i32,
): void {
  const k0 = j * nx;
  const yb = yStrip ? f32At(bEy, j) : 0;
  const ya = yStrip ? f32At(aEy, j) : 0;
  const yg = yStrip ? f32At(gEy, j) : 0;
  let i = i0;
  if (ASC_FEATURE_SIMD) {
    const row = <usize>nx << 2;
    let pA = a + (<usize>(k0 + i) << 2);
    let pB = b + (<usize>(k0 + i) << 2);
    let pC = c + (<usize>(k0 + i) << 2);
    let pCoef = stripCoefficients + <usize>(c0 >> 2) * STRIP_BYTES;
    let pPsiX = psiX + (<usize>psiIndex(j, stripVectors, c0) << 2);
    let pPsiY = psiY + (<usize>psiIndex(r, rowVectors, i0) << 2);
    let pS = statesA + stateOffset(j, i0);
    const sStep: usize = mode == LORENTZ ? 32 : mode == DRUDE || mode == DEBYE ? 16 : <usize>bgSlots << 4;
    const ca = v128.load(coefficientVectors, V_CAA);
    const cbx = v128.load(coefficientVectors, V_CBXA);
    const cby = v128.load(coefficientVectors, V_CBYA);
    const cq = v128.load(coefficientVectors, V_CQA);
    const k1 = v128.load(poleTable, 16);
    const k2 = v128.load(poleTable, 32);
    const k3 = v128.load(poleTable, 48);
    const cqk = f32x4.mul(cq, k3);
    const bv = f32x4.splat(yb);
    const av = f32x4.splat(ya);
    const gv = f32x4.splat(yg);
    for (; i + 4 <= i1; i += 4) {
      const e = v128.load(pA);
      const dC = f32x4.sub(v128.load(pC), v128.load(pC - 4));
      const dB = f32x4.sub(v128.load(pB), v128.load(pB - row));
      let v = f32x4.sub(
        f32x4.add(electric ? f32x4.mul(ca, e) : e, f32x4.mul(cbx, dC)),
        f32x4.mul(cby, dB));
      if (xStrip) {
        const p = f32x4.add(f32x4.mul(v128.load(pCoef, 48), v128.load(pPsiX, 16)), f32x4.mul(v128.load(pCoef, 64), dC));
        v128.store(pPsiX, p, 16);
        v = f32x4.add(v, f32x4.mul(cbx, f32x4.add(f32x4.mul(v128.load(pCoef, 80), dC), p)));
      }
      if (yStrip) {
        const p = f32x4.add(f32x4.mul(bv, v128.load(pPsiY, 16)), f32x4.mul(av, dB));
        v128.store(pPsiY, p, 16);
        v = f32x4.sub(v, f32x4.mul(cby, f32x4.add(f32x4.mul(gv, dB), p)));
      }
      if (mode != NONE) v = polesV(mode, v, e, pS, cq, cqk, k1, k2, k3);
      v128.store(pA, v);
      if (mode != NONE) debyeV(mode, v, e, pS, k1);
      pA += 16; pB += 16; pC += 16; pCoef += STRIP_BYTES; pPsiX += 32; pPsiY += 32; pS += sStep;
    }
  }
  for (; i < i1; i++) {
    const k = k0 + i;
    const e = f32At(a, k);
    const dC = f32At(c, k) - f32At(c, k - 1);
    const dB = f32At(b, k) - f32At(b, k - nx);
    let v = ((electric ? caA * e : e) + cbxA * dC) - cbyA * dB;
    if (xStrip) {
      const q = psiIndex(j, stripVectors, c0 + i - i0) + 4;
      const p = f32At(bEx, i) * f32At(psiX, q) + f32At(aEx, i) * dC;
      f32Set(psiX, q, p);
      v = v + cbxA * (f32At(gEx, i) * dC + p);
    }
    if (yStrip) {
      const q = psiIndex(r, rowVectors, i) + 4;
      const p = yb * f32At(psiY, q) + ya * dB;
      f32Set(psiY, q, p);
      v = v - cbyA * (yg * dB + p);
    }
    const ps = statesA + stateOffset(j, i);
    if (mode != NONE) v = polesS(v, e, ps, 16, poleTable, bgPoleCount, cqA);
    f32Set(a, k, v);
    if (mode != NONE && bgDebye) debyeS(v, e, ps, 16, poleTable, bgPoleCount);
  }
}

// Dispatchers: each inlined copy of the segments above has constant flags and mode.
@inline function bRangeAs(j: i32, i0: i32, i1: i32, yStrip: bool, mode: i32): void {
  if (yStrip) bSeg(j, i0, i1, true, true, mode); else bSeg(j, i0, i1, false, true, mode);
}

function bRange(j: i32, i0: i32, i1: i32, yStrip: bool): void {
  if (!te) {
    if (yStrip) bSeg(j, i0, i1, true, false, NONE); else bSeg(j, i0, i1, false, false, NONE);
    return;
  }
  switch (bgMode) {
    case NONE: bRangeAs(j, i0, i1, yStrip, NONE); break;
    case DRUDE: bRangeAs(j, i0, i1, yStrip, DRUDE); break;
    case LORENTZ: bRangeAs(j, i0, i1, yStrip, LORENTZ); break;
    case DEBYE: bRangeAs(j, i0, i1, yStrip, DEBYE); break;
    default: bRangeAs(j, i0, i1, yStrip, MANY);
  }
}

@inline function cRangeAs(j: i32, i0: i32, i1: i32, c0: i32, xStrip: bool, mode: i32): void {
  if (xStrip) cSeg(j, i0, i1, c0, true, true, mode); else cSeg(j, i0, i1, c0, false, true, mode);
}

function cRange(j: i32, i0: i32, i1: i32, c0: i32, xStrip: bool): void {
  if (!te) {
    if (xStrip) cSeg(j, i0, i1, c0, true, false, NONE); else cSeg(j, i0, i1, c0, false, false, NONE);
    return;
  }
  switch (bgMode) {
    case NONE: cRangeAs(j, i0, i1, c0, xStrip, NONE); break;
    case DRUDE: cRangeAs(j, i0, i1, c0, xStrip, DRUDE); break;
    case LORENTZ: cRangeAs(j, i0, i1, c0, xStrip, LORENTZ); break;
    case DEBYE: cRangeAs(j, i0, i1, c0, xStrip, DEBYE); break;
    default: cRangeAs(j, i0, i1, c0, xStrip, MANY);
  }
}

@inline function aRangeAs(j: i32, i0: i32, i1: i32, c0: i32, r: i32, xStrip: bool, yStrip: bool, electric: bool, mode: i32): void {
  if (xStrip) {
    if (yStrip) aSeg(j, i0, i1, c0, r, true, true, electric, mode); else aSeg(j, i0, i1, c0, r, true, false, electric, mode);
  } else {
    if (yStrip) aSeg(j, i0, i1, c0, r, false, true, electric, mode); else aSeg(j, i0, i1, c0, r, false, false, electric, mode);
  }
}

function aRangeTMNone(j: i32, i0: i32, i1: i32, c0: i32, r: i32, xStrip: bool, yStrip: bool): void { aRangeAs(j, i0, i1, c0, r, xStrip, yStrip, true, NONE); }
function aRangeTMDrude(j: i32, i0: i32, i1: i32, c0: i32, r: i32, xStrip: bool, yStrip: bool): void { aRangeAs(j, i0, i1, c0, r, xStrip, yStrip, true, DRUDE); }
function aRangeTMLorentz(j: i32, i0: i32, i1: i32, c0: i32, r: i32, xStrip: bool, yStrip: bool): void { aRangeAs(j, i0, i1, c0, r, xStrip, yStrip, true, LORENTZ); }
function aRangeTMDebye(j: i32, i0: i32, i1: i32, c0: i32, r: i32, xStrip: bool, yStrip: bool): void { aRangeAs(j, i0, i1, c0, r, xStrip, yStrip, true, DEBYE); }
function aRangeTMMany(j: i32, i0: i32, i1: i32, c0: i32, r: i32, xStrip: bool, yStrip: bool): void { aRangeAs(j, i0, i1, c0, r, xStrip, yStrip, true, MANY); }
function aRangeTE(j: i32, i0: i32, i1: i32, c0: i32, r: i32, xStrip: bool, yStrip: bool): void { aRangeAs(j, i0, i1, c0, r, xStrip, yStrip, false, NONE); }

function aRange(j: i32, i0: i32, i1: i32, c0: i32, r: i32, xStrip: bool, yStrip: bool): void {
  if (te) {
    aRangeTE(j, i0, i1, c0, r, xStrip, yStrip);
    return;
  }
  switch (bgMode) {
    case NONE: aRangeTMNone(j, i0, i1, c0, r, xStrip, yStrip); break;
    case DRUDE: aRangeTMDrude(j, i0, i1, c0, r, xStrip, yStrip); break;
    case LORENTZ: aRangeTMLorentz(j, i0, i1, c0, r, xStrip, yStrip); break;
    case DEBYE: aRangeTMDebye(j, i0, i1, c0, r, xStrip, yStrip); break;
    default: aRangeTMMany(j, i0, i1, c0, r, xStrip, yStrip);
  }
}

// TEz outer wall: tangential E is zero on the edges half a cell inside the outermost nodes,
// c on columns 0 and nx−2 (b on rows 0 and ny−2 is never updated). Applied to the c values
// of row j in columns [i0, i1) just computed.
function cWalls(j: i32, i0: i32, i1: i32): void {
  if (!te) return;
  const k0 = j * nx;
  if (i0 == 0 && i1 > 0) {
    f32Set(c, k0, 0);
    if (bgPoleCount > 0) clearStates(statesC, j, 0);
  }
  const right = nx - 2;
  if (right > 0 && i0 <= right && right < i1) {
    f32Set(c, k0 + right, 0);
    if (bgPoleCount > 0) clearStates(statesC, j, right);
  }
}

// ---- one pass over a range (middle of a row without patched b/c points) ----------------------

// b, c and then a of one vector of 4 nodes, as bSeg, cSeg and aSeg would do them (no CPML).
// The right neighbour of a and the left neighbour of c come from the adjacent vectors by a
// shuffle. Returns the new c.
@inline function fusedVector(
  d: usize, aHere: v128, aNext: v128, cLeft: v128,
  pA: usize, pAUp: usize, pB: usize, pBDown: usize, pC: usize, pSA: usize, pSB: usize, pSC: usize,
  cab: v128, cbb: v128, cqb: v128, cqkb: v128, cac: v128, cbc: v128, cqc: v128, cqkc: v128,
  caa: v128, cbx: v128, cby: v128, cqa: v128, cqka: v128, k1: v128, k2: v128, k3: v128,
  dMB: usize, dMC: usize, tez: bool, mode: i32, masked: bool,
): v128 {
  // b of row j−1 is read before b of row j is written (see assembly/engine.ts fusedVector).
  const bDown = v128.load(pBDown + d);
  const dy = f32x4.sub(v128.load(pAUp + d), aHere);
  const dx = f32x4.sub(f32x4.shuffle(aHere, aNext, 1, 2, 3, 4), aHere);
  const bOld = v128.load(pB + d);
  const cOld = v128.load(pC + d);
  let bNew: v128;
  let cNew: v128;
  if (tez) {
    bNew = f32x4.sub(f32x4.mul(cab, bOld), f32x4.mul(cbb, dy));
    cNew = f32x4.add(f32x4.mul(cac, cOld), f32x4.mul(cbc, dx));
    if (mode != NONE) {
      bNew = polesV(mode, bNew, bOld, pSB, cqb, cqkb, k1, k2, k3);
      cNew = polesV(mode, cNew, cOld, pSC, cqc, cqkc, k1, k2, k3);
    }
  } else {
    bNew = f32x4.sub(bOld, f32x4.mul(cbb, dy));
    cNew = f32x4.add(cOld, f32x4.mul(cbc, dx));
  }
  if (masked) {
    // PEC points of b and c: zero before use (their states stay zero, as after zeroRuns)
    bNew = v128.and(bNew, v128.load(pA + dMB + d));
    cNew = v128.and(cNew, v128.load(pA + dMC + d));
  }
  v128.store(pB + d, bNew);
  v128.store(pC + d, cNew);
  if (tez && mode != NONE) {
    debyeV(mode, bNew, bOld, pSB, k1);
    debyeV(mode, cNew, cOld, pSC, k1);
  }
  const dC = f32x4.sub(cNew, f32x4.shuffle(cLeft, cNew, 3, 4, 5, 6));
  const dB = f32x4.sub(bNew, bDown);
  let v = f32x4.sub(f32x4.add(tez ? aHere : f32x4.mul(caa, aHere), f32x4.mul(cbx, dC)), f32x4.mul(cby, dB));
  if (!tez && mode == DEBYE) {
    // The state is read once and kept for its own update.
    const sNow = v128.load(pSA);
    v = f32x4.sub(v, f32x4.mul(cqka, sNow));
    v128.store(pA + d, v);
    v128.store(pSA, f32x4.add(f32x4.mul(k1, sNow), f32x4.add(v, aHere)));
    return cNew;
  }
  if (!tez && mode != NONE) v = polesV(mode, v, aHere, pSA, cqa, cqka, k1, k2, k3);
  v128.store(pA + d, v);
  if (!tez && mode != NONE) debyeV(mode, v, aHere, pSA, k1);
  return cNew;
}

@inline function fusedSeg(j: i32, i0: i32, i1: i32, tez: bool, mode: i32, masked: bool): void {
  const k0 = j * nx;
  let i = i0;
  // byte distance from a's node k to the b and c mask lanes of its column
  const maskRow = masked ? maskRows + (<usize>i32At(maskRowOf, j) * <usize>nx << 3) : 0;
  const dMB = maskRow - (a + (<usize>k0 << 2));
  const dMC = dMB + (<usize>nx << 2);
  if (ASC_FEATURE_SIMD) {
    const cv = coefficientVectors;
    const cab = v128.load(cv, V_CAB); const cbb = v128.load(cv, V_CBB); const cqb = v128.load(cv, V_CQB);
    const cac = v128.load(cv, V_CAC); const cbc = v128.load(cv, V_CBC); const cqc = v128.load(cv, V_CQC);
    const caa = v128.load(cv, V_CAA); const cbx = v128.load(cv, V_CBXA); const cby = v128.load(cv, V_CBYA);
    const cqa = v128.load(cv, V_CQA);
    const k1 = v128.load(poleTable, 16); const k2 = v128.load(poleTable, 32); const k3 = v128.load(poleTable, 48);
    const cqka = f32x4.mul(cqa, k3); const cqkb = f32x4.mul(cqb, k3); const cqkc = f32x4.mul(cqc, k3);
    const row = <usize>nx << 2;
    const o = <usize>(k0 + i) << 2;
    let pA = a + o;
    let pAUp = pA + row;
    let pB = b + o;
    let pBDown = pB - row;
    let pC = c + o;
    const so = stateOffset(j, i0);
    let pSA = statesA + so;
    let pSB = statesB + so;
    let pSC = statesC + so;
    const sStep: usize = mode == LORENTZ ? 32 : mode == DRUDE || mode == DEBYE ? 16 : <usize>bgSlots << 4;
    let a0 = v128.load(pA);
    let cLeft = v128.load(pC - 16);
    const whole = (i1 - i) & ~3;
    const pEnd8 = pA + (<usize>((i1 - i) & ~7) << 2);
    const pEnd4 = pA + (<usize>whole << 2);
    i += whole;
    // Two vectors per turn without poles: the loop's own work is spread over 8 nodes. With
    // poles one vector per turn keeps the constants in registers.
    const pEnd16 = pA + (<usize>((i1 - i0) & ~15) << 2);
    while (mode != NONE && mode != MANY && pA < pEnd16) {
      const a1 = v128.load(pA, 16);
      const a2 = v128.load(pA, 32);
      const a3 = v128.load(pA, 48);
      const a4 = v128.load(pA, 64);
      const c1 = fusedVector(0, a0, a1, cLeft, pA, pAUp, pB, pBDown, pC, pSA, pSB, pSC,
        cab, cbb, cqb, cqkb, cac, cbc, cqc, cqkc, caa, cbx, cby, cqa, cqka, k1, k2, k3, dMB, dMC, tez, mode, masked);
      const c2 = fusedVector(16, a1, a2, c1, pA, pAUp, pB, pBDown, pC, pSA + sStep, pSB + sStep, pSC + sStep,
        cab, cbb, cqb, cqkb, cac, cbc, cqc, cqkc, caa, cbx, cby, cqa, cqka, k1, k2, k3, dMB, dMC, tez, mode, masked);
      const c3 = fusedVector(32, a2, a3, c2, pA, pAUp, pB, pBDown, pC, pSA + 2 * sStep, pSB + 2 * sStep, pSC + 2 * sStep,
        cab, cbb, cqb, cqkb, cac, cbc, cqc, cqkc, caa, cbx, cby, cqa, cqka, k1, k2, k3, dMB, dMC, tez, mode, masked);
      cLeft = fusedVector(48, a3, a4, c3, pA, pAUp, pB, pBDown, pC, pSA + 3 * sStep, pSB + 3 * sStep, pSC + 3 * sStep,
        cab, cbb, cqb, cqkb, cac, cbc, cqc, cqkc, caa, cbx, cby, cqa, cqka, k1, k2, k3, dMB, dMC, tez, mode, masked);
      a0 = a4;
      pA += 64; pAUp += 64; pB += 64; pBDown += 64; pC += 64;
      pSA += sStep << 2; pSB += sStep << 2; pSC += sStep << 2;
    }
    while (mode != MANY && pA < pEnd8) {
      const a1 = v128.load(pA, 16);
      const a2 = v128.load(pA, 32);
      const c1 = fusedVector(0, a0, a1, cLeft, pA, pAUp, pB, pBDown, pC, pSA, pSB, pSC,
        cab, cbb, cqb, cqkb, cac, cbc, cqc, cqkc, caa, cbx, cby, cqa, cqka, k1, k2, k3, dMB, dMC, tez, mode, masked);
      cLeft = fusedVector(16, a1, a2, c1, pA, pAUp, pB, pBDown, pC, pSA + sStep, pSB + sStep, pSC + sStep,
        cab, cbb, cqb, cqkb, cac, cbc, cqc, cqkc, caa, cbx, cby, cqa, cqka, k1, k2, k3, dMB, dMC, tez, mode, masked);
      a0 = a2;
      pA += 32; pAUp += 32; pB += 32; pBDown += 32; pC += 32;
      pSA += sStep << 1; pSB += sStep << 1; pSC += sStep << 1;
    }
    while (pA < pEnd4) {
      const a1 = v128.load(pA, 16);
      cLeft = fusedVector(0, a0, a1, cLeft, pA, pAUp, pB, pBDown, pC, pSA, pSB, pSC,
        cab, cbb, cqb, cqkb, cac, cbc, cqc, cqkc, caa, cbx, cby, cqa, cqka, k1, k2, k3, dMB, dMC, tez, mode, masked);
      a0 = a1;
      pA += 16; pAUp += 16; pB += 16; pBDown += 16; pC += 16;
      pSA += sStep; pSB += sStep; pSC += sStep;
    }
  }
  for (; i < i1; i++) {
    const k = k0 + i;
    const e = f32At(a, k);
    const dy = f32At(a, k + nx) - e;
    const dx = f32At(a, k + 1) - e;
    const bOld = f32At(b, k);
    const cOld = f32At(c, k);
    const so = stateOffset(j, i);
    let bNew: f32;
    let cNew: f32;
    if (tez) {
      bNew = caB * bOld - cbB * dy;
      cNew = caC * cOld + cbC * dx;
      if (mode != NONE) {
        bNew = polesS(bNew, bOld, statesB + so, 16, poleTable, bgPoleCount, cqB);
        cNew = polesS(cNew, cOld, statesC + so, 16, poleTable, bgPoleCount, cqC);
      }
    } else {
      bNew = bOld - cbB * dy;
      cNew = cOld + cbC * dx;
    }
    if (masked) {
      bNew = reinterpret<f32>(reinterpret<i32>(bNew) & load<i32>(maskRow + (<usize>i << 2)));
      cNew = reinterpret<f32>(reinterpret<i32>(cNew) & load<i32>(maskRow + (<usize>(nx + i) << 2)));
    }
    f32Set(b, k, bNew);
    f32Set(c, k, cNew);
    if (tez && mode != NONE && bgDebye) {
      debyeS(bNew, bOld, statesB + so, 16, poleTable, bgPoleCount);
      debyeS(cNew, cOld, statesC + so, 16, poleTable, bgPoleCount);
    }
    const dC = cNew - f32At(c, k - 1);
    const dB = bNew - f32At(b, k - nx);
    let v = ((tez ? e : caA * e) + cbxA * dC) - cbyA * dB;
    if (!tez && mode != NONE) v = polesS(v, e, statesA + so, 16, poleTable, bgPoleCount, cqA);
    f32Set(a, k, v);
    if (!tez && mode != NONE && bgDebye) debyeS(v, e, statesA + so, 16, poleTable, bgPoleCount);
  }
}

// b, c and then a of row j over strip columns [i0, i1) (i0 a multiple of 4, strip column
// c0) in one pass, with the x-strip terms of c and a: the strips of rows outside the y
// strips. Per node the operations of bSeg, cSeg and aSeg, in their order; TEz wall columns
// of c are masked to zero before their Debye update, so their states stay zero.
@inline function stripFusedSeg(j: i32, i0: i32, i1: i32, c0: i32, tez: bool, mode: i32): void {
  const k0 = j * nx;
  let i = i0;
  if (ASC_FEATURE_SIMD) {
    const cv = coefficientVectors;
    const cab = v128.load(cv, V_CAB); const cbb = v128.load(cv, V_CBB); const cqb = v128.load(cv, V_CQB);
    const cac = v128.load(cv, V_CAC); const cbc = v128.load(cv, V_CBC); const cqc = v128.load(cv, V_CQC);
    const caa = v128.load(cv, V_CAA); const cbx = v128.load(cv, V_CBXA); const cby = v128.load(cv, V_CBYA);
    const cqa = v128.load(cv, V_CQA);
    const k1 = v128.load(poleTable, 16); const k2 = v128.load(poleTable, 32); const k3 = v128.load(poleTable, 48);
    const cqka = f32x4.mul(cqa, k3); const cqkb = f32x4.mul(cqb, k3); const cqkc = f32x4.mul(cqc, k3);
    const row = <usize>nx << 2;
    let pA = a + (<usize>(k0 + i) << 2);
    let pB = b + (<usize>(k0 + i) << 2);
    let pC = c + (<usize>(k0 + i) << 2);
    let pCoef = stripCoefficients + <usize>(c0 >> 2) * STRIP_BYTES;
    let pPsi = psiX + (<usize>psiIndex(j, stripVectors, c0) << 2);
    const so = stateOffset(j, i0);
    let pSA = statesA + so;
    let pSB = statesB + so;
    let pSC = statesC + so;
    const sStep: usize = mode == LORENTZ ? 32 : mode == DRUDE || mode == DEBYE ? 16 : <usize>bgSlots << 4;
    let aHere = v128.load(pA);
    let cLeft = v128.load(pC - 16);
    for (; i + 4 <= i1; i += 4) {
      const aNext = v128.load(pA, 16);
      const bDown = v128.load(pB - row);
      const dy = f32x4.sub(v128.load(pA + row), aHere);
      const dx = f32x4.sub(f32x4.shuffle(aHere, aNext, 1, 2, 3, 4), aHere);
      const bOld = v128.load(pB);
      const cOld = v128.load(pC);
      let bNew = tez ? f32x4.sub(f32x4.mul(cab, bOld), f32x4.mul(cbb, dy)) : f32x4.sub(bOld, f32x4.mul(cbb, dy));
      let cNew = tez ? f32x4.add(f32x4.mul(cac, cOld), f32x4.mul(cbc, dx)) : f32x4.add(cOld, f32x4.mul(cbc, dx));
      const pc = f32x4.add(f32x4.mul(v128.load(pCoef), v128.load(pPsi)), f32x4.mul(v128.load(pCoef, 16), dx));
      v128.store(pPsi, pc);
      cNew = f32x4.add(cNew, f32x4.mul(cbc, f32x4.add(f32x4.mul(v128.load(pCoef, 32), dx), pc)));
      if (tez) {
        if (mode != NONE) {
          bNew = polesV(mode, bNew, bOld, pSB, cqb, cqkb, k1, k2, k3);
          cNew = polesV(mode, cNew, cOld, pSC, cqc, cqkc, k1, k2, k3);
        }
        cNew = v128.and(cNew, v128.load(pCoef, 96));
      }
      v128.store(pB, bNew);
      v128.store(pC, cNew);
      if (tez && mode != NONE) {
        debyeV(mode, bNew, bOld, pSB, k1);
        debyeV(mode, cNew, cOld, pSC, k1);
      }
      const dC = f32x4.sub(cNew, f32x4.shuffle(cLeft, cNew, 3, 4, 5, 6));
      const dB = f32x4.sub(bNew, bDown);
      let v = f32x4.sub(f32x4.add(tez ? aHere : f32x4.mul(caa, aHere), f32x4.mul(cbx, dC)), f32x4.mul(cby, dB));
      const pa = f32x4.add(f32x4.mul(v128.load(pCoef, 48), v128.load(pPsi, 16)), f32x4.mul(v128.load(pCoef, 64), dC));
      v128.store(pPsi, pa, 16);
      v = f32x4.add(v, f32x4.mul(cbx, f32x4.add(f32x4.mul(v128.load(pCoef, 80), dC), pa)));
      if (!tez && mode != NONE) v = polesV(mode, v, aHere, pSA, cqa, cqka, k1, k2, k3);
      v128.store(pA, v);
      if (!tez && mode != NONE) debyeV(mode, v, aHere, pSA, k1);
      cLeft = cNew;
      aHere = aNext;
      pA += 16; pB += 16; pC += 16; pCoef += STRIP_BYTES; pPsi += 32;
      pSA += sStep; pSB += sStep; pSC += sStep;
    }
  }
  for (; i < i1; i++) {
    const k = k0 + i;
    const e = f32At(a, k);
    const dy = f32At(a, k + nx) - e;
    const dx = f32At(a, k + 1) - e;
    const bOld = f32At(b, k);
    const cOld = f32At(c, k);
    const so = stateOffset(j, i);
    const q = psiIndex(j, stripVectors, c0 + i - i0);
    let bNew = tez ? caB * bOld - cbB * dy : bOld - cbB * dy;
    let cNew = tez ? caC * cOld + cbC * dx : cOld + cbC * dx;
    const pc = f32At(bHx, i) * f32At(psiX, q) + f32At(aHx, i) * dx;
    f32Set(psiX, q, pc);
    cNew = cNew + cbC * (f32At(gHx, i) * dx + pc);
    if (tez) {
      if (mode != NONE) {
        bNew = polesS(bNew, bOld, statesB + so, 16, poleTable, bgPoleCount, cqB);
        cNew = polesS(cNew, cOld, statesC + so, 16, poleTable, bgPoleCount, cqC);
      }
      if (i == 0 || i == nx - 2) cNew = 0;
    }
    f32Set(b, k, bNew);
    f32Set(c, k, cNew);
    if (tez && mode != NONE && bgDebye) {
      debyeS(bNew, bOld, statesB + so, 16, poleTable, bgPoleCount);
      debyeS(cNew, cOld, statesC + so, 16, poleTable, bgPoleCount);
    }
    const dC = cNew - f32At(c, k - 1);
    const dB = bNew - f32At(b, k - nx);
    let v = ((tez ? e : caA * e) + cbxA * dC) - cbyA * dB;
    const pa = f32At(bEx, i) * f32At(psiX, q + 4) + f32At(aEx, i) * dC;
    f32Set(psiX, q + 4, pa);
    v = v + cbxA * (f32At(gEx, i) * dC + pa);
    if (!tez && mode != NONE) v = polesS(v, e, statesA + so, 16, poleTable, bgPoleCount, cqA);
    f32Set(a, k, v);
    if (!tez && mode != NONE && bgDebye) debyeS(v, e, statesA + so, 16, poleTable, bgPoleCount);
  }
}

function stripTMNone(j: i32, i0: i32, i1: i32, c0: i32): void { stripFusedSeg(j, i0, i1, c0, false, NONE); }
function stripTMDrude(j: i32, i0: i32, i1: i32, c0: i32): void { stripFusedSeg(j, i0, i1, c0, false, DRUDE); }
function stripTMLorentz(j: i32, i0: i32, i1: i32, c0: i32): void { stripFusedSeg(j, i0, i1, c0, false, LORENTZ); }
function stripTMDebye(j: i32, i0: i32, i1: i32, c0: i32): void { stripFusedSeg(j, i0, i1, c0, false, DEBYE); }
function stripTMMany(j: i32, i0: i32, i1: i32, c0: i32): void { stripFusedSeg(j, i0, i1, c0, false, MANY); }
function stripTENone(j: i32, i0: i32, i1: i32, c0: i32): void { stripFusedSeg(j, i0, i1, c0, true, NONE); }
function stripTEDrude(j: i32, i0: i32, i1: i32, c0: i32): void { stripFusedSeg(j, i0, i1, c0, true, DRUDE); }
function stripTELorentz(j: i32, i0: i32, i1: i32, c0: i32): void { stripFusedSeg(j, i0, i1, c0, true, LORENTZ); }
function stripTEDebye(j: i32, i0: i32, i1: i32, c0: i32): void { stripFusedSeg(j, i0, i1, c0, true, DEBYE); }
function stripTEMany(j: i32, i0: i32, i1: i32, c0: i32): void { stripFusedSeg(j, i0, i1, c0, true, MANY); }

function stripFusedRange(j: i32, i0: i32, i1: i32, c0: i32): void {
  if (te) {
    switch (bgMode) {
      case NONE: stripTENone(j, i0, i1, c0); break;
      case DRUDE: stripTEDrude(j, i0, i1, c0); break;
      case LORENTZ: stripTELorentz(j, i0, i1, c0); break;
      case DEBYE: stripTEDebye(j, i0, i1, c0); break;
      default: stripTEMany(j, i0, i1, c0);
    }
  } else {
    switch (bgMode) {
      case NONE: stripTMNone(j, i0, i1, c0); break;
      case DRUDE: stripTMDrude(j, i0, i1, c0); break;
      case LORENTZ: stripTMLorentz(j, i0, i1, c0); break;
      case DEBYE: stripTMDebye(j, i0, i1, c0); break;
      default: stripTMMany(j, i0, i1, c0);
    }
  }
}

// One function per variant keeps each function small enough for the optimizer.
function fusedTMNone(j: i32, i0: i32, i1: i32): void { fusedSeg(j, i0, i1, false, NONE, false); }
function fusedTMDrude(j: i32, i0: i32, i1: i32): void { fusedSeg(j, i0, i1, false, DRUDE, false); }
function fusedTMLorentz(j: i32, i0: i32, i1: i32): void { fusedSeg(j, i0, i1, false, LORENTZ, false); }
function fusedTMDebye(j: i32, i0: i32, i1: i32): void { fusedSeg(j, i0, i1, false, DEBYE, false); }
function fusedTMMany(j: i32, i0: i32, i1: i32): void { fusedSeg(j, i0, i1, false, MANY, false); }
function fusedTMNoneMasked(j: i32, i0: i32, i1: i32): void { fusedSeg(j, i0, i1, false, NONE, true); }
function fusedTMManyMasked(j: i32, i0: i32, i1: i32): void { fusedSeg(j, i0, i1, false, MANY, true); }
function fusedTENone(j: i32, i0: i32, i1: i32): void { fusedSeg(j, i0, i1, true, NONE, false); }
function fusedTEDrude(j: i32, i0: i32, i1: i32): void { fusedSeg(j, i0, i1, true, DRUDE, false); }
function fusedTELorentz(j: i32, i0: i32, i1: i32): void { fusedSeg(j, i0, i1, true, LORENTZ, false); }
function fusedTEDebye(j: i32, i0: i32, i1: i32): void { fusedSeg(j, i0, i1, true, DEBYE, false); }
function fusedTEMany(j: i32, i0: i32, i1: i32): void { fusedSeg(j, i0, i1, true, MANY, false); }
function fusedTENoneMasked(j: i32, i0: i32, i1: i32): void { fusedSeg(j, i0, i1, true, NONE, true); }
function fusedTEManyMasked(j: i32, i0: i32, i1: i32): void { fusedSeg(j, i0, i1, true, MANY, true); }

// The columns between the strips of row j in one pass, with the PEC masks of b and c when
// the row has PEC b or c points (then a one-pole background takes the loop over the pole
// table, which does the same operations).
function fusedRange(j: i32, i0: i32, i1: i32): void {
  const m = maskRowCount > 0 ? i32At(maskRowOf, j) : -1;
  if (m >= 0) {
    // the masked loop over the columns the PEC points span, the plain one either side
    const m0 = max(i0, load<i32>(maskSpans + (<usize>m << 3)));
    const m1 = min(i1, load<i32>(maskSpans + (<usize>m << 3), 4));
    if (m0 < m1) {
      fusedUnmasked(j, i0, m0);
      if (te) {
        if (bgMode == NONE) fusedTENoneMasked(j, m0, m1); else fusedTEManyMasked(j, m0, m1);
      } else {
        if (bgMode == NONE) fusedTMNoneMasked(j, m0, m1); else fusedTMManyMasked(j, m0, m1);
      }
      fusedUnmasked(j, m1, i1);
      return;
    }
  }
  fusedUnmasked(j, i0, i1);
}

function fusedUnmasked(j: i32, i0: i32, i1: i32): void {
  if (i0 >= i1) return;
  if (te) {
    switch (bgMode) {
      case NONE: fusedTENone(j, i0, i1); break;
      case DRUDE: fusedTEDrude(j, i0, i1); break;
      case LORENTZ: fusedTELorentz(j, i0, i1); break;
      case DEBYE: fusedTEDebye(j, i0, i1); break;
      default: fusedTEMany(j, i0, i1);
    }
  } else {
    switch (bgMode) {
      case NONE: fusedTMNone(j, i0, i1); break;
      case DRUDE: fusedTMDrude(j, i0, i1); break;
      case LORENTZ: fusedTMLorentz(j, i0, i1); break;
      case DEBYE: fusedTMDebye(j, i0, i1); break;
      default: fusedTMMany(j, i0, i1);
    }
  }
}

// ---- patches ----------------------------------------------------------------------------------

@inline function patchAt(block: usize, p: i32): usize {
  return block + <usize>p * PATCH_BYTES;
}

// New values of the patched b and c points of row j, from the old fields, into the scratch.
function computeEdgePatches(j: i32): void {
  for (let pass = 0; pass < 2; pass++) {
    const isB = pass == 0;
    const block = isB ? patchesB : patchesC;
    const starts = isB ? rowStartB : rowStartC;
    const scratch = isB ? scratchB : scratchC;
    const field = isB ? b : c;
    const p1 = i32At(starts, j + 1);
    for (let p = i32At(starts, j); p < p1; p++) {
      const rec = patchAt(block, p);
      const k = load<i32>(rec);
      const kind = load<i32>(rec, 4);
      const old = f32At(field, k);
      const d = isB ? f32At(a, k + nx) - f32At(a, k) : f32At(a, k + 1) - f32At(a, k);
      let v: f32 = 0;
      if (kind == MEDIUM) {
        v = isB ? load<f32>(rec, 32) * old - load<f32>(rec, 36) * d : load<f32>(rec, 32) * old + load<f32>(rec, 36) * d;
        const count = load<i32>(rec, 12);
        if (count > 0) {
          const poles = poleTable + (<usize>load<i32>(rec, 8) << 6);
          const ps = patchPool + (<usize>load<i32>(rec, 16) << 2);
          v = polesS(v, old, ps, 4, poles, count, load<f32>(rec, 44));
          debyeS(v, old, ps, 4, poles, count);
        }
      } else if (kind == EDGE) {
        v = isB ? old - load<f32>(rec, 32) * d : old + load<f32>(rec, 32) * d;
      }
      f32Set(scratch, p, v);
    }
  }
}

// Writes the patched b and c values of row j over what the row's pass left there.
function writeEdgePatches(j: i32): void {
  for (let pass = 0; pass < 2; pass++) {
    const isB = pass == 0;
    const block = isB ? patchesB : patchesC;
    const starts = isB ? rowStartB : rowStartC;
    const scratch = isB ? scratchB : scratchC;
    const field = isB ? b : c;
    const states = isB ? statesB : statesC;
    const p1 = i32At(starts, j + 1);
    for (let p = i32At(starts, j); p < p1; p++) {
      const k = load<i32>(patchAt(block, p));
      f32Set(field, k, f32At(scratch, p));
      if (te && bgPoleCount > 0) clearStates(states, j, k - j * nx);
    }
  }
}

// Zeroes the PEC runs of one component in row j, and the background states there.
function zeroRuns(field: usize, runs: usize, starts: usize, states: usize, j: i32): void {
  const r1 = i32At(starts, j + 1);
  for (let r = i32At(starts, j); r < r1; r++) {
    const k0 = load<i32>(runs + (<usize>r << 3));
    const length = load<i32>(runs + (<usize>r << 3), 4);
    let k = k0;
    if (ASC_FEATURE_SIMD) {
      const zero = f32x4.splat(0);
      for (; k + 4 <= k0 + length; k += 4) v128.store(field + (<usize>k << 2), zero);
    }
    for (; k < k0 + length; k++) f32Set(field, k, 0);
    if (states != 0) {
      for (let i = k0 - j * nx; i < k0 - j * nx + length; i++) clearStates(states, j, i);
    }
  }
}

function saveNodePatches(j: i32): void {
  const p1 = i32At(rowStartA, j + 1);
  for (let p = i32At(rowStartA, j); p < p1; p++) {
    f32Set(scratchA, p, f32At(a, load<i32>(patchAt(patchesA, p))));
  }
}

// New values of the patched a points of row j, from their kept old values and the new b, c.
function applyNodePatches(j: i32): void {
  const p1 = i32At(rowStartA, j + 1);
  for (let p = i32At(rowStartA, j); p < p1; p++) {
    const rec = patchAt(patchesA, p);
    const k = load<i32>(rec);
    const kind = load<i32>(rec, 4);
    const e = f32At(scratchA, p);
    let v: f32 = 0;
    if (kind == MEDIUM) {
      const dC = f32At(c, k) - f32At(c, k - 1);
      const dB = f32At(b, k) - f32At(b, k - nx);
      v = (load<f32>(rec, 32) * e + load<f32>(rec, 36) * dC) - load<f32>(rec, 40) * dB;
      const count = load<i32>(rec, 12);
      if (count > 0) {
        const poles = poleTable + (<usize>load<i32>(rec, 8) << 6);
        const ps = patchPool + (<usize>load<i32>(rec, 16) << 2);
        v = polesS(v, e, ps, 4, poles, count, load<f32>(rec, 44));
        debyeS(v, e, ps, 4, poles, count);
      }
    } else if (kind == CELL) {
      v = (e + (load<f32>(rec, 32) * f32At(c, k) - load<f32>(rec, 36) * f32At(c, k - 1)))
        - (load<f32>(rec, 40) * f32At(b, k) - load<f32>(rec, 44) * f32At(b, k - nx));
    }
    f32Set(a, k, v);
    if (!te && bgPoleCount > 0) clearStates(statesA, j, k - j * nx);
  }
}

// ---- rows -------------------------------------------------------------------------------------

// Rows 0 and ny−1: b and c only (their a nodes are PEC). TEz never updates b of row 0 (wall).
function boundaryRow(j: i32): void {
  const withB = j < ny - 1 && !te;
  const yStrip = layer > 0;
  if (withB) bRange(j, 0, nx, yStrip);
  if (layer == 0) {
    cRange(j, 0, nx, 0, false);
  } else {
    cRange(j, 0, leftEnd, 0, true);
    cRange(j, leftEnd, rightStart, 0, false);
    cRange(j, rightStart, nx, leftEnd, true);
  }
}

// An interior row with b and c first over the whole row, then a.
function twoPassRow(j: i32): void {
  const bY = layer > 0 && (j < layer || j >= ny - 1 - layer);
  const aY = layer > 0 && (j < layer || j > ny - 1 - layer);
  const r = bY ? psiYRow(j) : 0;
  if (!(te && j == ny - 2)) bRange(j, 0, nx, bY);
  if (layer == 0) {
    cRange(j, 0, nx, 0, false);
  } else {
    cRange(j, 0, leftEnd, 0, true);
    cRange(j, leftEnd, rightStart, 0, false);
    cRange(j, rightStart, nx, leftEnd, true);
  }
  cWalls(j, 0, nx);
  writeEdgePatches(j);
  zeroRuns(b, pecRunsB, pecStartB, te && bgPoleCount > 0 ? statesB : 0, j);
  zeroRuns(c, pecRunsC, pecStartC, te && bgPoleCount > 0 ? statesC : 0, j);
  if (layer == 0) {
    aRange(j, 0, nx, 0, r, false, aY);
  } else {
    aRange(j, 0, leftEnd, 0, r, true, aY);
    aRange(j, leftEnd, rightStart, 0, r, false, aY);
    aRange(j, rightStart, nx, leftEnd, r, true, aY);
  }
}

// An interior row outside the y strips without patched b/c points: each x strip and the
// columns between them in one pass.
function fusedRow(j: i32): void {
  if (leftEnd > 0) stripFusedRange(j, 0, leftEnd, 0);
  fusedRange(j, leftEnd, rightStart);
  if (rightStart < nx) stripFusedRange(j, rightStart, nx, leftEnd);
}


// ---- one time step ------------------------------------------------------------------------

function sweep(n: i32): void {
  const last = ny - 1;
  for (let j = 0; j <= last; j++) {
    const k0 = j * nx;
    if (j == 0 || j == last) {
      boundaryRow(j);
    } else {
      const edgePatches = i32At(rowStartB, j + 1) > i32At(rowStartB, j) || i32At(rowStartC, j + 1) > i32At(rowStartC, j);
      const nodePatches = i32At(rowStartA, j + 1) > i32At(rowStartA, j);
      if (edgePatches) computeEdgePatches(j);
      if (nodePatches) saveNodePatches(j);
      const yStripRow = layer > 0 && (j < layer || j >= last - layer);
      if (edgePatches || yStripRow || (te && (layer == 0 || j == last - 1))) twoPassRow(j);
      else fusedRow(j);
      f32Set(a, k0, 0);
      f32Set(a, k0 + nx - 1, 0);
      if (!te && bgPoleCount > 0) {
        clearStates(statesA, j, 0);
        clearStates(statesA, j, nx - 1);
      }
      if (nodePatches) applyNodePatches(j);
      zeroRuns(a, pecRunsA, pecStartA, !te && bgPoleCount > 0 ? statesA : 0, j);
      if (j == sourceRow && n < sourceLength) {
        // The source enters after the row: a −= s·I, and each Debye state at the point takes
        // the −s·I it would have taken had the row's update included it.
        const d = sourceScale * <f32>load<f64>(source + (<usize>n << 3));
        f32Set(a, sourceIndex, f32At(a, sourceIndex) - d);
        for (let s = 0; s < sourceCorrectionCount; s++) {
          const state = <usize>load<i32>(sourceCorrections + (<usize>s << 2));
          store<f32>(state, load<f32>(state) - d);
        }
      }
    }
  }
  // The full-grid DFTs take the field at step n+1, source included, once the sweep is done.
  if (fullCount > 0) {
    fullActive = prepareFullWeights(fullTable, fullCount, fullWeights, n + 1);
    if (fullActive > 0) fullDftPass(a, nx * ny, fullWeights, fullActive, fullRe, fullStride);
  }
}


/** Advances `count` time steps: b and c to n+½, a to n+1 with the source at (n+½)dt. */
export function step(count: i32): void {
  if (!stripCoefficientsReady) prepareStripCoefficients();
  if (!masksReady) prepareMasks();
  for (let s = 0; s < count; s++) {
    const n = stepCount;
    sweep(n);
    stepCount = n + 1;
    recordPoints(a, n + 1, seriesLength, probeCount, probeIndex, series, frequencyCount, pointCount, pointIndex, pointValue, omegaDt, dft);
  }
}

/** Largest |a| over the grid; NaN if any node is NaN (blow-up detection). */
export function maxAbsA(): f32 {
  return maxAbsOf(a, nx * ny);
}
