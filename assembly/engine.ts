// 2D TMz Yee engine with CPML strips. Knows arrays and coefficients, nothing of units,
// JSON or pages: the TypeScript side (src/engine/simulation.ts) fills every table.
//
// Layout, row-major with i fastest: Ez(i, j) at k = j·nx + i; Hx(i, j+½) and Hy(i+½, j)
// share that index. Memory is claimed once in `allocate` and never grows afterwards, so
// the views JavaScript holds stay valid for the life of the simulation (an instance may be
// allocated again for the next one, which clears the memory the last one used).
//
// One time step is one sweep over the rows: row j gets its H update (Hx, Hy, their CPML
// corrections) and then at once its E update, while the rows it touches are still in
// cache. That order is legal because H of row j reads Ez of rows j and j+1 before either
// is updated, and E of row j reads H of rows j−1 and j after both are. Each node sees the
// same operations in the same order as in three separate sweeps (H, then E, then source).
//
// The same source builds twice: with SIMD enabled (release) the row loops run on f32x4
// vectors, with SIMD disabled (scalar target) only the scalar loops remain. Every vector
// lane performs exactly the scalar node's operations (no fused multiply-add exists in
// wasm), so the two builds agree bit for bit; test/engine/simd-scalar.test.ts checks it.

// ---- grid and coefficients ------------------------------------------------------------
import { fullDftPass, maxAbsOf, prepareFullWeights, recordPoints } from './running-dft';

let nx: i32 = 0;
let ny: i32 = 0;
let layer: i32 = 0; // CPML cells per side

let cex: f32 = 0; // dt/(ε·dx)
let cey: f32 = 0; // dt/(ε·dy)
let chx: f32 = 0; // dt/(μ·dx)
let chy: f32 = 0; // dt/(μ·dy)
let sourceScale: f32 = 0; // dt/(ε·dx·dy)
let sourceIndex: i32 = 0;
let sourceRow: i32 = 0;

let stepCount: i32 = 0; // Ez samples so far are n = 0..stepCount
let sourceLength: i32 = 0;
let seriesLength: i32 = 0; // samples per probe the series buffer holds

// Columns that get x-strip corrections, row-relative: [0, leftEnd) and [rightStart, nx).
// Both start on a multiple of 4, so every vector of a row covers the same four columns
// whichever loop handles it; the columns added by the rounding have zero coefficients,
// which leaves them unchanged. When the strips would overlap (a narrow grid), one range
// covers the whole row. Strip column c numbers the corrected columns of a row from 0:
// c = i on the left, c = leftEnd + i − rightStart on the right.
let leftEnd: i32 = 0;
let rightStart: i32 = 0;
let stripVectors: i32 = 0; // vectors of strip columns per row: ⌈(leftEnd + nx − rightStart)/4⌉
let rowVectors: i32 = 0; // ⌈nx/4⌉

// ---- memory -----------------------------------------------------------------------------
let ez: usize = 0;
let hx: usize = 0;
let hy: usize = 0;
// CPML tables as JavaScript fills them: b, a and g = 1/κ − 1; E tables along x hold nx
// entries (node i), H tables along x hold nx entries (node i+½); likewise along y with ny.
let bEx: usize = 0; let aEx: usize = 0; let gEx: usize = 0;
let bHx: usize = 0; let aHx: usize = 0; let gHx: usize = 0;
let bEy: usize = 0; let aEy: usize = 0; let gEy: usize = 0;
let bHy: usize = 0; let aHy: usize = 0; let gHy: usize = 0;
// The x-strip tables again, regrouped at the first step so that one pointer walks them:
// per vector of strip columns, the 24 floats bH, aH, gH, bE, aE, gE (four lanes each).
let stripCoefficients: usize = 0;
let stripCoefficientsReady = false;
// ψ, sized to the strips, Hy's and Ez's values interleaved by vector (8 floats per vector
// of columns: 4 for H, then 4 for E):
let psiX: usize = 0; // x strips: row j holds stripVectors vectors (Hy ∂Ez/∂x, Ez ∂Hy/∂x)
let psiY: usize = 0; // y strips: 2·layer rows of rowVectors vectors (Hx ∂Ez/∂y, Ez ∂Hx/∂y);
// ψ row r = j for rows j < layer, r = layer + j − (ny − 1 − layer) for the rows below.

// The four update coefficients, each splatted over a vector (chy, chx, cex, cey). Loops read
// them from memory once, which keeps them in registers rather than re-splatted each turn.
let coefficientVectors: usize = 0;

let source: usize = 0; // f64 per step: I((n+½)dt)
let probeCount: i32 = 0;
let probeIndex: usize = 0; // i32 node index per probe
let series: usize = 0; // f32, probe-major, seriesLength samples each
let pointCount: i32 = 0;
let pointIndex: usize = 0; // i32 node index per DFT point
let pointValue: usize = 0; // f64 scratch: Ez at each DFT point this step
let frequencyCount: i32 = 0;
let omegaDt: usize = 0; // f64 ω·dt per frequency
let dft: usize = 0; // f64 (re, im) per frequency per point, frequency-major
// Full-grid running DFTs (the error maps): fullCount frequencies, each a real and an
// imaginary block of nx·ny floats, claimed one after the other (so block b starts at
// fullRe + b·fullStride). Frequency f takes Ez sample n when n ≡ r (mod m), weighted by m,
// with m and r its own. Static tables: per frequency ω·dt (f64), m and r (i32), which
// JavaScript fills; and per frequency sampled at the step in hand its number and weighted
// cosine and sine.
const FULL_GRID_MAX = 1024;
const fullTable = memory.data(FULL_GRID_MAX << 4, 16); // f64 ω·dt, i32 m, i32 r per frequency
const fullWeights = memory.data(FULL_GRID_MAX << 4, 16); // i32 f, f32 m·cos, f32 m·sin per sampled frequency
let fullCount: i32 = 0;
let fullActive: i32 = 0; // frequencies sampled at the step in hand
let fullStride: usize = 0;
let fullRe: usize = 0; // first block: real part of frequency 0
let fullIm: usize = 0; // imaginary part of frequency 0

let top: usize = 0;

// Every block starts on a cache line; src/engine/memory.ts mirrors this to estimate the total.
function claim(bytes: usize): usize {
  const p = (top + 63) & ~(<usize>63);
  top = p + bytes;
  return p;
}

/**
 * Claims memory for one simulation, with `fullGrid` full-grid running DFTs (0 to 1024).
 * Returns the bytes claimed, or 0 when the memory cannot grow that far or `fullGrid` is out
 * of range (the caller reports it; nothing is half-built).
 */
export function allocate(
  nxIn: i32, nyIn: i32, layerIn: i32, steps: i32,
  probes: i32, points: i32, frequencies: i32, fullGrid: i32,
): f64 {
  if (fullGrid < 0 || fullGrid > FULL_GRID_MAX) return 0;
  nx = nxIn; ny = nyIn; layer = layerIn;
  probeCount = probes; pointCount = points; frequencyCount = frequencies;
  sourceLength = steps; seriesLength = steps + 1;
  stepCount = 0;
  stripCoefficientsReady = false;
  if (layer == 0) {
    leftEnd = 0; rightStart = nx;
  } else {
    leftEnd = (layer + 3) & ~3; // H columns 0..layer−1, E columns 1..layer−1
    rightStart = (nx - 1 - layer) & ~3; // H columns nx−1−layer..nx−2, E nx−layer..nx−2
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
  coefficientVectors = claim(64);
  const cells = <usize>nx * <usize>ny;
  // 16 spare bytes after each field: a vector read of the neighbour one node past the
  // last row stays inside the block (and reads zero).
  ez = claim((cells << 2) + 16);
  hx = claim((cells << 2) + 16);
  hy = claim((cells << 2) + 16);
  bEx = claim(<usize>nx << 2); aEx = claim(<usize>nx << 2); gEx = claim(<usize>nx << 2);
  bHx = claim(<usize>nx << 2); aHx = claim(<usize>nx << 2); gHx = claim(<usize>nx << 2);
  bEy = claim(<usize>ny << 2); aEy = claim(<usize>ny << 2); gEy = claim(<usize>ny << 2);
  bHy = claim(<usize>ny << 2); aHy = claim(<usize>ny << 2); gHy = claim(<usize>ny << 2);
  stripCoefficients = claim(<usize>stripVectors * 96);
  psiX = claim(<usize>ny * <usize>stripVectors * 32);
  psiY = claim(<usize>(2 * layer) * <usize>rowVectors * 32);
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

export function setUpdateCoefficients(
  cexIn: f32, ceyIn: f32, chxIn: f32, chyIn: f32, sourceScaleIn: f32, sourceNode: i32,
): void {
  cex = cexIn; cey = ceyIn; chx = chxIn; chy = chyIn;
  sourceScale = sourceScaleIn; sourceIndex = sourceNode;
  sourceRow = nx > 0 ? sourceNode / nx : 0;
  if (ASC_FEATURE_SIMD) {
    v128.store(coefficientVectors, f32x4.splat(chy));
    v128.store(coefficientVectors, f32x4.splat(chx), 16);
    v128.store(coefficientVectors, f32x4.splat(cex), 32);
    v128.store(coefficientVectors, f32x4.splat(cey), 48);
  }
}

// Pointers for JavaScript's typed-array views, in the order of `allocate`. The ψ blocks
// (23–26) are internal working memory, Hy/Ez (x strips) and Hx/Ez (y strips) interleaved
// by vector as described above; 23 and 24 name the same block, as do 25 and 26.
export function pointerTo(which: i32): usize {
  switch (which) {
    case 0: return ez;
    case 1: return hx;
    case 2: return hy;
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
    case 24: return psiX;
    case 25: return psiY;
    case 26: return psiY;
    case 27: return pointValue;
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
// Every index below is in range by construction of the loops (rows 0..ny−1, columns
// 0..nx−1, ψ rows sized in `allocate`), so loads and stores go straight to memory.

@inline function f32At(base: usize, k: i32): f32 {
  return load<f32>(base + (<usize>k << 2));
}
@inline function f32Set(base: usize, k: i32, v: f32): void {
  store<f32>(base + (<usize>k << 2), v);
}
@inline function vAt(base: usize, k: i32): v128 {
  return v128.load(base + (<usize>k << 2));
}
@inline function vSet(base: usize, k: i32, v: v128): void {
  v128.store(base + (<usize>k << 2), v);
}

// Index (in floats) of the ψ value of column `c` in a block with `vectors` vectors per
// row: Hy's or Hx's value; Ez's is 4 further.
@inline function psiIndex(row: i32, vectors: i32, c: i32): i32 {
  return ((row * vectors + (c >> 2)) << 3) + (c & 3);
}

@inline function psiYRow(j: i32): i32 {
  return j < layer ? j : layer + j - (ny - 1 - layer);
}

// Regroups the x-strip coefficient tables for the vector loops (release build only).
function prepareStripCoefficients(): void {
  if (ASC_FEATURE_SIMD) {
    for (let c = 0; c < stripVectors << 2; c++) {
      const i = c < leftEnd ? c : rightStart + c - leftEnd;
      const at = stripCoefficients + ((<usize>(c >> 2) * 24 + <usize>(c & 3)) << 2);
      const inside = i < nx;
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

// ---- rows 0 and ny−1: H only (their Ez nodes are PEC) ---------------------------------------

function boundaryRow(j: i32, k0: i32): void {
  const withHx = j < ny - 1;
  let i = 0;
  if (ASC_FEATURE_SIMD) {
    const hxc = v128.load(coefficientVectors);
    const hyc = v128.load(coefficientVectors, 16);
    const row = <usize>nx << 2;
    let pEz = ez + (<usize>k0 << 2);
    let pHx = hx + (<usize>k0 << 2);
    let pHy = hy + (<usize>k0 << 2);
    for (; i + 4 <= nx; i += 4) {
      const e = v128.load(pEz);
      if (withHx) v128.store(pHx, f32x4.sub(v128.load(pHx), f32x4.mul(hxc, f32x4.sub(v128.load(pEz + row), e))));
      v128.store(pHy, f32x4.add(v128.load(pHy), f32x4.mul(hyc, f32x4.sub(v128.load(pEz, 4), e))));
      pEz += 16; pHx += 16; pHy += 16;
    }
  }
  for (; i < nx; i++) {
    const k = k0 + i;
    if (withHx) f32Set(hx, k, f32At(hx, k) - chy * (f32At(ez, k + nx) - f32At(ez, k)));
    f32Set(hy, k, f32At(hy, k) + chx * (f32At(ez, k + 1) - f32At(ez, k)));
  }
  if (layer == 0) return;
  if (withHx) boundaryHxStrip(j, k0); // row 0 lies in the top y strip
  boundaryHyStrip(j, k0, 0, leftEnd, 0);
  boundaryHyStrip(j, k0, rightStart, nx, leftEnd);
}

// CPML term of Hx over row 0 (y strip): ψ ← b·ψ + a·∂, Hx −= chy·(g·∂ + ψ).
function boundaryHxStrip(j: i32, k0: i32): void {
  const b = f32At(bHy, j);
  const a = f32At(aHy, j);
  const g = f32At(gHy, j);
  const r = psiYRow(j);
  let i = 0;
  if (ASC_FEATURE_SIMD) {
    const hxc = v128.load(coefficientVectors);
    const bv = f32x4.splat(b);
    const av = f32x4.splat(a);
    const gv = f32x4.splat(g);
    const row = <usize>nx << 2;
    let pEz = ez + (<usize>k0 << 2);
    let pHx = hx + (<usize>k0 << 2);
    let pPsi = psiY + (<usize>psiIndex(r, rowVectors, 0) << 2);
    for (; i + 4 <= nx; i += 4) {
      const d = f32x4.sub(v128.load(pEz + row), v128.load(pEz));
      const p = f32x4.add(f32x4.mul(bv, v128.load(pPsi)), f32x4.mul(av, d));
      v128.store(pPsi, p);
      v128.store(pHx, f32x4.sub(v128.load(pHx), f32x4.mul(hxc, f32x4.add(f32x4.mul(gv, d), p))));
      pEz += 16; pHx += 16; pPsi += 32;
    }
  }
  for (; i < nx; i++) {
    const k = k0 + i;
    const q = psiIndex(r, rowVectors, i);
    const d = f32At(ez, k + nx) - f32At(ez, k);
    const p = b * f32At(psiY, q) + a * d;
    f32Set(psiY, q, p);
    f32Set(hx, k, f32At(hx, k) - chy * (g * d + p));
  }
}

// CPML term of Hy over columns [i0, i1) of row 0 or ny−1 (x strip; i0 is strip column c0).
function boundaryHyStrip(j: i32, k0: i32, i0: i32, i1: i32, c0: i32): void {
  let i = i0;
  if (ASC_FEATURE_SIMD) {
    const hyc = v128.load(coefficientVectors, 16);
    let pEz = ez + (<usize>(k0 + i0) << 2);
    let pHy = hy + (<usize>(k0 + i0) << 2);
    let pCoef = stripCoefficients + <usize>(c0 >> 2) * 96;
    let pPsi = psiX + (<usize>psiIndex(j, stripVectors, c0) << 2);
    for (; i + 4 <= i1; i += 4) {
      const d = f32x4.sub(v128.load(pEz, 4), v128.load(pEz));
      const p = f32x4.add(f32x4.mul(v128.load(pCoef), v128.load(pPsi)), f32x4.mul(v128.load(pCoef, 16), d));
      v128.store(pPsi, p);
      v128.store(pHy, f32x4.add(v128.load(pHy), f32x4.mul(hyc, f32x4.add(f32x4.mul(v128.load(pCoef, 32), d), p))));
      pEz += 16; pHy += 16; pCoef += 96; pPsi += 32;
    }
  }
  for (; i < i1; i++) {
    const k = k0 + i;
    const q = psiIndex(j, stripVectors, c0 + i - i0);
    const d = f32At(ez, k + 1) - f32At(ez, k);
    const p = f32At(bHx, i) * f32At(psiX, q) + f32At(aHx, i) * d;
    f32Set(psiX, q, p);
    f32Set(hy, k, f32At(hy, k) + chx * (f32At(gHx, i) * d + p));
  }
}

// ---- rows 1..ny−2 ---------------------------------------------------------------------------

// H and then E of one node range in a single pass, for rows and columns outside every strip:
// Hx and Hy of a vector are computed, stored and used for its Ez at once; the Ez neighbour
// to the right and the Hy neighbour to the left come from the adjacent vector by a shuffle.
// Each of the five streams has its own pointer, so every access is one pointer plus a
// constant offset.
@inline function fusedVector(
  d: usize, ezHere: v128, ezNext: v128, hyLeft: v128,
  pEz: usize, pEzUp: usize, pHx: usize, pHxDown: usize, pHy: usize,
  hxc: v128, hyc: v128, ecx: v128, ecy: v128,
): v128 {
  // Hx of row j−1 is read before Hx of row j is written: on grids whose rows are a multiple
  // of 4 KiB apart the two addresses look alike to the processor's store checks, and a read
  // issued after the write would wait for it.
  const hxDown = v128.load(pHxDown + d);
  const hxNew = f32x4.sub(v128.load(pHx + d), f32x4.mul(hxc, f32x4.sub(v128.load(pEzUp + d), ezHere)));
  const hyNew = f32x4.add(v128.load(pHy + d), f32x4.mul(hyc, f32x4.sub(f32x4.shuffle(ezHere, ezNext, 1, 2, 3, 4), ezHere)));
  v128.store(pHx + d, hxNew);
  v128.store(pHy + d, hyNew);
  v128.store(pEz + d, f32x4.sub(
    f32x4.add(ezHere, f32x4.mul(ecx, f32x4.sub(hyNew, f32x4.shuffle(hyLeft, hyNew, 3, 4, 5, 6)))),
    f32x4.mul(ecy, f32x4.sub(hxNew, hxDown))));
  return hyNew;
}

@inline function fusedRange(k0: i32, i0: i32, i1: i32): void {
  let i = i0;
  if (ASC_FEATURE_SIMD) {
    const hxc = v128.load(coefficientVectors);
    const hyc = v128.load(coefficientVectors, 16);
    const ecx = v128.load(coefficientVectors, 32);
    const ecy = v128.load(coefficientVectors, 48);
    const row = <usize>nx << 2;
    const o = <usize>(k0 + i) << 2;
    let pEz = ez + o;
    let pEzUp = pEz + row; // Ez of row j+1
    let pHx = hx + o;
    let pHxDown = pHx - row; // Hx of row j−1
    let pHy = hy + o;
    let ez0 = v128.load(pEz); // old Ez of the next vector
    let hyLeft = v128.load(pHy - 16); // new Hy of the vector to the left
    const pEnd32 = pEz + (<usize>((i1 - i) & ~31) << 2);
    const pEnd4 = pEz + (<usize>((i1 - i) & ~3) << 2);
    i += (i1 - i) & ~3;
    // Eight vectors per turn: the loop's own work (pointer steps, the bound and stack
    // checks) is spread over 32 nodes.
    while (pEz < pEnd32) {
      const ez1 = v128.load(pEz, 16);
      const ez2 = v128.load(pEz, 32);
      const ez3 = v128.load(pEz, 48);
      const ez4 = v128.load(pEz, 64);
      const hy0 = fusedVector(0, ez0, ez1, hyLeft, pEz, pEzUp, pHx, pHxDown, pHy, hxc, hyc, ecx, ecy);
      const hy1 = fusedVector(16, ez1, ez2, hy0, pEz, pEzUp, pHx, pHxDown, pHy, hxc, hyc, ecx, ecy);
      const hy2 = fusedVector(32, ez2, ez3, hy1, pEz, pEzUp, pHx, pHxDown, pHy, hxc, hyc, ecx, ecy);
      const hy3 = fusedVector(48, ez3, ez4, hy2, pEz, pEzUp, pHx, pHxDown, pHy, hxc, hyc, ecx, ecy);
      const ez5 = v128.load(pEz, 80);
      const ez6 = v128.load(pEz, 96);
      const ez7 = v128.load(pEz, 112);
      const ez8 = v128.load(pEz, 128);
      const hy4 = fusedVector(64, ez4, ez5, hy3, pEz, pEzUp, pHx, pHxDown, pHy, hxc, hyc, ecx, ecy);
      const hy5 = fusedVector(80, ez5, ez6, hy4, pEz, pEzUp, pHx, pHxDown, pHy, hxc, hyc, ecx, ecy);
      const hy6 = fusedVector(96, ez6, ez7, hy5, pEz, pEzUp, pHx, pHxDown, pHy, hxc, hyc, ecx, ecy);
      hyLeft = fusedVector(112, ez7, ez8, hy6, pEz, pEzUp, pHx, pHxDown, pHy, hxc, hyc, ecx, ecy);
      ez0 = ez8;
      pEz += 128; pEzUp += 128; pHx += 128; pHxDown += 128; pHy += 128;
    }
    while (pEz < pEnd4) {
      const ez1 = v128.load(pEz, 16);
      hyLeft = fusedVector(0, ez0, ez1, hyLeft, pEz, pEzUp, pHx, pHxDown, pHy, hxc, hyc, ecx, ecy);
      ez0 = ez1;
      pEz += 16; pEzUp += 16; pHx += 16; pHxDown += 16; pHy += 16;
    }
  }
  for (; i < i1; i++) {
    const k = k0 + i;
    const e = f32At(ez, k);
    const hxNew = f32At(hx, k) - chy * (f32At(ez, k + nx) - e);
    const hyNew = f32At(hy, k) + chx * (f32At(ez, k + 1) - e);
    f32Set(hx, k, hxNew);
    f32Set(hy, k, hyNew);
    f32Set(ez, k, e + cex * (hyNew - f32At(hy, k - 1)) - cey * (hxNew - f32At(hx, k - nx)));
  }
}

// H and then E of columns [i0, i1) of row j in one pass, with the CPML corrections the
// flags ask for: x strip (Hy and Ez; i0 is strip column c0), y strip of Hx and y strip of
// Ez (ψ row r). i0 is a multiple of 4. Per node the order is that of separate sweeps: the
// κ = 1, ψ = 0 update, then the x-strip term, then the y-strip term. Call sites pass
// constant flags, so each inlined copy keeps only the work it needs.
@inline function stripSegment(
  j: i32, k0: i32, i0: i32, i1: i32, c0: i32, r: i32,
  xStrip: bool, hxStrip: bool, ezStrip: bool,
): void {
  let i = i0;
  if (ASC_FEATURE_SIMD) {
    const row = <usize>nx << 2;
    const o = <usize>(k0 + i) << 2;
    let pEz = ez + o;
    let pEzUp = pEz + row;
    let pHx = hx + o;
    let pHxDown = pHx - row;
    let pHy = hy + o;
    let pCoef = stripCoefficients + <usize>(c0 >> 2) * 96;
    let pPsiX = psiX + (<usize>psiIndex(j, stripVectors, c0) << 2);
    let pPsiY = psiY + (<usize>psiIndex(r, rowVectors, i0) << 2);
    const hxc = v128.load(coefficientVectors);
    const hyc = v128.load(coefficientVectors, 16);
    const ecx = v128.load(coefficientVectors, 32);
    const ecy = v128.load(coefficientVectors, 48);
    const bH = f32x4.splat(hxStrip ? f32At(bHy, j) : 0);
    const aH = f32x4.splat(hxStrip ? f32At(aHy, j) : 0);
    const gH = f32x4.splat(hxStrip ? f32At(gHy, j) : 0);
    const bE = f32x4.splat(ezStrip ? f32At(bEy, j) : 0);
    const aE = f32x4.splat(ezStrip ? f32At(aEy, j) : 0);
    const gE = f32x4.splat(ezStrip ? f32At(gEy, j) : 0);
    let ezHere = v128.load(pEz);
    let hyLeft = v128.load(pHy - 16);
    const whole = (i1 - i0) & ~3;
    const pEnd = pEz + (<usize>whole << 2);
    i += whole;
    while (pEz < pEnd) {
      const ezNext = v128.load(pEz, 16);
      const dy = f32x4.sub(v128.load(pEzUp), ezHere);
      let hxNew = f32x4.sub(v128.load(pHx), f32x4.mul(hxc, dy));
      if (hxStrip) {
        const p = f32x4.add(f32x4.mul(bH, v128.load(pPsiY)), f32x4.mul(aH, dy));
        v128.store(pPsiY, p);
        hxNew = f32x4.sub(hxNew, f32x4.mul(hxc, f32x4.add(f32x4.mul(gH, dy), p)));
      }
      const dx = f32x4.sub(f32x4.shuffle(ezHere, ezNext, 1, 2, 3, 4), ezHere);
      let hyNew = f32x4.add(v128.load(pHy), f32x4.mul(hyc, dx));
      if (xStrip) {
        const p = f32x4.add(f32x4.mul(v128.load(pCoef), v128.load(pPsiX)), f32x4.mul(v128.load(pCoef, 16), dx));
        v128.store(pPsiX, p);
        hyNew = f32x4.add(hyNew, f32x4.mul(hyc, f32x4.add(f32x4.mul(v128.load(pCoef, 32), dx), p)));
      }
      v128.store(pHx, hxNew);
      v128.store(pHy, hyNew);
      const dHy = f32x4.sub(hyNew, f32x4.shuffle(hyLeft, hyNew, 3, 4, 5, 6));
      const dHx = f32x4.sub(hxNew, v128.load(pHxDown));
      let ezNew = f32x4.sub(f32x4.add(ezHere, f32x4.mul(ecx, dHy)), f32x4.mul(ecy, dHx));
      if (xStrip) {
        const p = f32x4.add(f32x4.mul(v128.load(pCoef, 48), v128.load(pPsiX, 16)), f32x4.mul(v128.load(pCoef, 64), dHy));
        v128.store(pPsiX, p, 16);
        ezNew = f32x4.add(ezNew, f32x4.mul(ecx, f32x4.add(f32x4.mul(v128.load(pCoef, 80), dHy), p)));
      }
      if (ezStrip) {
        const p = f32x4.add(f32x4.mul(bE, v128.load(pPsiY, 16)), f32x4.mul(aE, dHx));
        v128.store(pPsiY, p, 16);
        ezNew = f32x4.sub(ezNew, f32x4.mul(ecy, f32x4.add(f32x4.mul(gE, dHx), p)));
      }
      v128.store(pEz, ezNew);
      ezHere = ezNext;
      hyLeft = hyNew;
      pEz += 16; pEzUp += 16; pHx += 16; pHxDown += 16; pHy += 16;
      pCoef += 96; pPsiX += 32; pPsiY += 32;
    }
  }
  for (; i < i1; i++) {
    const k = k0 + i;
    const qx = psiIndex(j, stripVectors, c0 + i - i0);
    const qy = psiIndex(r, rowVectors, i);
    const e = f32At(ez, k);
    const dy = f32At(ez, k + nx) - e;
    let hxNew = f32At(hx, k) - chy * dy;
    if (hxStrip) {
      const p = f32At(bHy, j) * f32At(psiY, qy) + f32At(aHy, j) * dy;
      f32Set(psiY, qy, p);
      hxNew = hxNew - chy * (f32At(gHy, j) * dy + p);
    }
    const dx = f32At(ez, k + 1) - e;
    let hyNew = f32At(hy, k) + chx * dx;
    if (xStrip) {
      const p = f32At(bHx, i) * f32At(psiX, qx) + f32At(aHx, i) * dx;
      f32Set(psiX, qx, p);
      hyNew = hyNew + chx * (f32At(gHx, i) * dx + p);
    }
    f32Set(hx, k, hxNew);
    f32Set(hy, k, hyNew);
    const dHy = hyNew - f32At(hy, k - 1);
    const dHx = hxNew - f32At(hx, k - nx);
    let ezNew = e + cex * dHy - cey * dHx;
    if (xStrip) {
      const p = f32At(bEx, i) * f32At(psiX, qx + 4) + f32At(aEx, i) * dHy;
      f32Set(psiX, qx + 4, p);
      ezNew = ezNew + cex * (f32At(gEx, i) * dHy + p);
    }
    if (ezStrip) {
      const p = f32At(bEy, j) * f32At(psiY, qy + 4) + f32At(aEy, j) * dHx;
      f32Set(psiY, qy + 4, p);
      ezNew = ezNew - cey * (f32At(gEy, j) * dHx + p);
    }
    f32Set(ez, k, ezNew);
  }
}

// A row of a grid without absorber.
function plainRow(k0: i32): void {
  fusedRange(k0, 0, nx);
}

// A row between the y strips: left x strip, the plain columns, right x strip.
function middleRow(j: i32, k0: i32): void {
  stripSegment(j, k0, 0, leftEnd, 0, 0, true, false, false);
  fusedRange(k0, leftEnd, rightStart);
  stripSegment(j, k0, rightStart, nx, leftEnd, 0, true, false, false);
}

// A row in the y strips of both Hx and Ez.
function yStripRow(j: i32, k0: i32): void {
  const r = psiYRow(j);
  stripSegment(j, k0, 0, leftEnd, 0, r, true, true, true);
  stripSegment(j, k0, leftEnd, rightStart, 0, r, false, true, true);
  stripSegment(j, k0, rightStart, nx, leftEnd, r, true, true, true);
}

// Row ny−1−layer lies in the y strip of Hx (which sits half a cell higher) but not of Ez.
function hxStripRow(j: i32, k0: i32): void {
  const r = psiYRow(j);
  stripSegment(j, k0, 0, leftEnd, 0, r, true, true, false);
  stripSegment(j, k0, leftEnd, rightStart, 0, r, false, true, false);
  stripSegment(j, k0, rightStart, nx, leftEnd, r, true, true, false);
}


// ---- one time step ------------------------------------------------------------------------

function sweep(n: i32): void {
  const last = ny - 1;
  for (let j = 0; j <= last; j++) {
    const k0 = j * nx;
    if (j == 0 || j == last) {
      boundaryRow(j, k0);
    } else {
      if (layer == 0) plainRow(k0);
      else if (j >= layer && j < last - layer) middleRow(j, k0);
      else if (j == last - layer) hxStripRow(j, k0);
      else yStripRow(j, k0);
      f32Set(ez, k0, 0);
      f32Set(ez, k0 + nx - 1, 0);
      if (j == sourceRow && n < sourceLength) {
        const current = <f32>load<f64>(source + (<usize>n << 3));
        f32Set(ez, sourceIndex, f32At(ez, sourceIndex) - sourceScale * current);
      }
    }
  }
  // The full-grid DFTs take the field at step n+1, source included, once the sweep is done.
  if (fullCount > 0) {
    fullActive = prepareFullWeights(fullTable, fullCount, fullWeights, n + 1);
    if (fullActive > 0) fullDftPass(ez, nx * ny, fullWeights, fullActive, fullRe, fullStride);
  }
}


/** Advances `count` time steps: H to n+½, E to n+1 with the source current at (n+½)dt. */
export function step(count: i32): void {
  if (!stripCoefficientsReady) prepareStripCoefficients();
  for (let s = 0; s < count; s++) {
    const n = stepCount;
    sweep(n);
    stepCount = n + 1;
    recordPoints(ez, n + 1, seriesLength, probeCount, probeIndex, series, frequencyCount, pointCount, pointIndex, pointValue, omegaDt, dft);
  }
}

/** Largest |Ez| over the grid; NaN if any node is NaN (blow-up detection). */
export function maxAbsEz(): f32 {
  return maxAbsOf(ez, nx * ny);
}

/**
 * Reads and rewrites Ez, Hx and Hy in one pass `passes` times, multiplying by one (values
 * stay exactly as they were). The benchmark times it as the memory traffic of a step
 * without its arithmetic: three streams read and three written, like the fused sweep.
 */
export function streamFields(passes: i32): void {
  const total = nx * ny;
  for (let r = 0; r < passes; r++) {
    let k = 0;
    if (ASC_FEATURE_SIMD) {
      const one = f32x4.splat(1);
      for (; k + 4 <= total; k += 4) {
        vSet(ez, k, f32x4.mul(vAt(ez, k), one));
        vSet(hx, k, f32x4.mul(vAt(hx, k), one));
        vSet(hy, k, f32x4.mul(vAt(hy, k), one));
      }
    }
    for (; k < total; k++) {
      f32Set(ez, k, f32At(ez, k) * 1);
      f32Set(hx, k, f32At(hx, k) * 1);
      f32Set(hy, k, f32At(hy, k) * 1);
    }
  }
}
