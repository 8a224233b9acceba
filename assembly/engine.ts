// 2D TMz Yee engine with CPML strips. Knows arrays and coefficients, nothing of units,
// JSON or pages: the TypeScript side (src/engine/simulation.ts) fills every table.
//
// Layout, row-major with i fastest: Ez(i, j) at k = j·nx + i; Hx(i, j+½) and Hy(i+½, j)
// share that index. Memory is claimed once in `allocate` and never grows afterwards, so
// the views JavaScript holds stay valid for the life of the instance.

// ---- grid and coefficients ------------------------------------------------------------
let nx: i32 = 0;
let ny: i32 = 0;
let layer: i32 = 0; // CPML cells per side

let cex: f32 = 0; // dt/(ε·dx)
let cey: f32 = 0; // dt/(ε·dy)
let chx: f32 = 0; // dt/(μ·dx)
let chy: f32 = 0; // dt/(μ·dy)
let sourceScale: f32 = 0; // dt/(ε·dx·dy)
let sourceIndex: i32 = 0;

let stepCount: i32 = 0; // Ez samples so far are n = 0..stepCount
let sourceLength: i32 = 0;
let seriesLength: i32 = 0; // samples per probe the series buffer holds

// ---- memory -----------------------------------------------------------------------------
let ez: usize = 0;
let hx: usize = 0;
let hy: usize = 0;
// CPML tables: b, a and g = 1/κ − 1; E tables along x hold nx entries (node i), H tables
// along x hold nx entries (node i+½); likewise along y with ny entries.
let bEx: usize = 0; let aEx: usize = 0; let gEx: usize = 0;
let bHx: usize = 0; let aHx: usize = 0; let gHx: usize = 0;
let bEy: usize = 0; let aEy: usize = 0; let gEy: usize = 0;
let bHy: usize = 0; let aHy: usize = 0; let gHy: usize = 0;
// ψ arrays, sized to the strips: x strips hold 2·layer columns per row, y strips 2·layer rows.
let psiEzX: usize = 0; // Ez's ∂Hy/∂x memory, ny rows × 2·layer columns
let psiHyX: usize = 0; // Hy's ∂Ez/∂x memory, ny rows × 2·layer columns
let psiEzY: usize = 0; // Ez's ∂Hx/∂y memory, 2·layer rows × nx
let psiHxY: usize = 0; // Hx's ∂Ez/∂y memory, 2·layer rows × nx

let source: usize = 0; // f64 per step: I((n+½)dt)
let probeCount: i32 = 0;
let probeIndex: usize = 0; // i32 node index per probe
let series: usize = 0; // f32, probe-major, seriesLength samples each
let pointCount: i32 = 0;
let pointIndex: usize = 0; // i32 node index per DFT point
let frequencyCount: i32 = 0;
let omegaDt: usize = 0; // f64 ω·dt per frequency
let dft: usize = 0; // f64 (re, im) per frequency per point, frequency-major
let fullOmegaDt: f64 = 0; // ω·dt of the full-grid DFT; 0 = off
let fullRe: usize = 0;
let fullIm: usize = 0;

let top: usize = 0;

function claim(bytes: usize): usize {
  const p = (top + 15) & ~(<usize>15);
  top = p + bytes;
  return p;
}

/**
 * Claims memory for one simulation. Returns the bytes claimed, or 0 when the memory cannot
 * grow that far (the caller reports it; nothing is half-built).
 */
export function allocate(
  nxIn: i32, nyIn: i32, layerIn: i32, steps: i32,
  probes: i32, points: i32, frequencies: i32, fullGrid: i32,
): f64 {
  nx = nxIn; ny = nyIn; layer = layerIn;
  probeCount = probes; pointCount = points; frequencyCount = frequencies;
  sourceLength = steps; seriesLength = steps + 1;
  stepCount = 0;
  top = __heap_base;
  const cells = <usize>nx * <usize>ny;
  ez = claim(cells << 2);
  hx = claim(cells << 2);
  hy = claim(cells << 2);
  bEx = claim(<usize>nx << 2); aEx = claim(<usize>nx << 2); gEx = claim(<usize>nx << 2);
  bHx = claim(<usize>nx << 2); aHx = claim(<usize>nx << 2); gHx = claim(<usize>nx << 2);
  bEy = claim(<usize>ny << 2); aEy = claim(<usize>ny << 2); gEy = claim(<usize>ny << 2);
  bHy = claim(<usize>ny << 2); aHy = claim(<usize>ny << 2); gHy = claim(<usize>ny << 2);
  const stripX = <usize>ny * <usize>(2 * layer);
  const stripY = <usize>nx * <usize>(2 * layer);
  psiEzX = claim(stripX << 2);
  psiHyX = claim(stripX << 2);
  psiEzY = claim(stripY << 2);
  psiHxY = claim(stripY << 2);
  source = claim(<usize>steps << 3);
  probeIndex = claim(<usize>probes << 2);
  series = claim((<usize>probes * <usize>seriesLength) << 2);
  pointIndex = claim(<usize>points << 2);
  omegaDt = claim(<usize>frequencies << 3);
  dft = claim((<usize>points * <usize>frequencies) << 4);
  if (fullGrid != 0) {
    fullRe = claim(cells << 2);
    fullIm = claim(cells << 2);
  } else {
    fullRe = 0; fullIm = 0;
  }
  const needPages = <i32>((top + 0xffff) >> 16);
  const havePages = memory.size();
  if (needPages > havePages) {
    if (memory.grow(needPages - havePages) < 0) return 0;
  }
  // Fresh pages are zero; an instance is used for one simulation, so nothing else to clear.
  return <f64>(top - __heap_base);
}

export function setUpdateCoefficients(
  cexIn: f32, ceyIn: f32, chxIn: f32, chyIn: f32, sourceScaleIn: f32, sourceNode: i32, fullOmegaDtIn: f64,
): void {
  cex = cexIn; cey = ceyIn; chx = chxIn; chy = chyIn;
  sourceScale = sourceScaleIn; sourceIndex = sourceNode;
  fullOmegaDt = fullOmegaDtIn;
}

// Pointers for JavaScript's typed-array views, in the order of `allocate`.
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
    case 23: return psiEzX;
    case 24: return psiHyX;
    case 25: return psiEzY;
    case 26: return psiHxY;
  }
  return 0;
}

export function stepsDone(): i32 {
  return stepCount;
}

// ---- updates ----------------------------------------------------------------------------

@inline function f32At(base: usize, k: i32): f32 {
  return load<f32>(base + (<usize>k << 2));
}
@inline function f32Set(base: usize, k: i32, v: f32): void {
  store<f32>(base + (<usize>k << 2), v);
}

function updateH(): void {
  const w = nx;
  for (let j = 0; j < ny - 1; j++) {
    const row = j * w;
    for (let i = 0; i < w; i++) {
      const k = row + i;
      f32Set(hx, k, f32At(hx, k) - chy * (f32At(ez, k + w) - f32At(ez, k)));
    }
  }
  for (let j = 0; j < ny; j++) {
    const row = j * w;
    for (let i = 0; i < w - 1; i++) {
      const k = row + i;
      f32Set(hy, k, f32At(hy, k) + chx * (f32At(ez, k + 1) - f32At(ez, k)));
    }
  }
}

// CPML corrections for H: the interior update above has applied the κ = 1, ψ = 0 form.
function cpmlH(): void {
  const w = nx;
  const two = 2 * layer;
  // Hy in the x strips: columns i = 0..layer−1 and nx−1−layer..nx−2.
  for (let j = 0; j < ny; j++) {
    const row = j * w;
    for (let c = 0; c < two; c++) {
      const i = c < layer ? c : w - 1 - layer + (c - layer);
      const k = row + i;
      const d = f32At(ez, k + 1) - f32At(ez, k);
      const q = j * two + c;
      const p = f32At(bHx, i) * f32At(psiHyX, q) + f32At(aHx, i) * d;
      f32Set(psiHyX, q, p);
      f32Set(hy, k, f32At(hy, k) + chx * (f32At(gHx, i) * d + p));
    }
  }
  // Hx in the y strips: rows j = 0..layer−1 and ny−1−layer..ny−2.
  for (let r = 0; r < two; r++) {
    const j = r < layer ? r : ny - 1 - layer + (r - layer);
    const row = j * w;
    const b = f32At(bHy, j);
    const a = f32At(aHy, j);
    const g = f32At(gHy, j);
    const prow = r * w;
    for (let i = 0; i < w; i++) {
      const k = row + i;
      const d = f32At(ez, k + w) - f32At(ez, k);
      const p = b * f32At(psiHxY, prow + i) + a * d;
      f32Set(psiHxY, prow + i, p);
      f32Set(hx, k, f32At(hx, k) - chy * (g * d + p));
    }
  }
}

function updateE(): void {
  const w = nx;
  for (let j = 1; j < ny - 1; j++) {
    const row = j * w;
    for (let i = 1; i < w - 1; i++) {
      const k = row + i;
      f32Set(ez, k, f32At(ez, k)
        + cex * (f32At(hy, k) - f32At(hy, k - 1))
        - cey * (f32At(hx, k) - f32At(hx, k - w)));
    }
  }
}

function cpmlE(): void {
  const w = nx;
  const two = 2 * layer;
  // x strips: columns i = 1..layer−1 (ψ column i) and nx−layer..nx−2 (ψ column layer + i − (nx−layer)).
  for (let j = 1; j < ny - 1; j++) {
    const row = j * w;
    for (let c = 1; c < two - 1; c++) {
      const i = c < layer ? c : w - layer + (c - layer);
      const k = row + i;
      const d = f32At(hy, k) - f32At(hy, k - 1);
      const q = j * two + c;
      const p = f32At(bEx, i) * f32At(psiEzX, q) + f32At(aEx, i) * d;
      f32Set(psiEzX, q, p);
      f32Set(ez, k, f32At(ez, k) + cex * (f32At(gEx, i) * d + p));
    }
  }
  // y strips: rows j = 1..layer−1 and ny−layer..ny−2.
  for (let r = 1; r < two - 1; r++) {
    const j = r < layer ? r : ny - layer + (r - layer);
    const row = j * w;
    const b = f32At(bEy, j);
    const a = f32At(aEy, j);
    const g = f32At(gEy, j);
    const prow = r * w;
    for (let i = 1; i < w - 1; i++) {
      const k = row + i;
      const d = f32At(hx, k) - f32At(hx, k - w);
      const p = b * f32At(psiEzY, prow + i) + a * d;
      f32Set(psiEzY, prow + i, p);
      f32Set(ez, k, f32At(ez, k) - cey * (g * d + p));
    }
  }
}

function record(n: i32): void {
  if (n < seriesLength) {
    for (let p = 0; p < probeCount; p++) {
      const k = load<i32>(probeIndex + (<usize>p << 2));
      f32Set(series, p * seriesLength + n, f32At(ez, k));
    }
  }
  for (let f = 0; f < frequencyCount; f++) {
    const phase = load<f64>(omegaDt + (<usize>f << 3)) * <f64>n;
    const c = Math.cos(phase);
    const s = Math.sin(phase);
    let acc = dft + ((<usize>f * <usize>pointCount) << 4);
    for (let p = 0; p < pointCount; p++) {
      const v = <f64>f32At(ez, load<i32>(pointIndex + (<usize>p << 2)));
      store<f64>(acc, load<f64>(acc) + v * c);
      store<f64>(acc + 8, load<f64>(acc + 8) - v * s);
      acc += 16;
    }
  }
  if (fullRe != 0) {
    const phase = fullOmegaDt * <f64>n;
    const c = <f32>Math.cos(phase);
    const s = <f32>Math.sin(phase);
    const total = nx * ny;
    for (let k = 0; k < total; k++) {
      const v = f32At(ez, k);
      f32Set(fullRe, k, f32At(fullRe, k) + v * c);
      f32Set(fullIm, k, f32At(fullIm, k) - v * s);
    }
  }
}

/** Advances `count` time steps: H to n+½, E to n+1 with the source current at (n+½)dt. */
export function step(count: i32): void {
  for (let s = 0; s < count; s++) {
    updateH();
    if (layer > 0) cpmlH();
    updateE();
    if (layer > 0) cpmlE();
    const n = stepCount;
    if (n < sourceLength) {
      const current = <f32>load<f64>(source + (<usize>n << 3));
      f32Set(ez, sourceIndex, f32At(ez, sourceIndex) - sourceScale * current);
    }
    stepCount = n + 1;
    record(n + 1);
  }
}

/** Largest |Ez| over the grid; NaN if any node is NaN (blow-up detection). */
export function maxAbsEz(): f32 {
  let m: f32 = 0;
  const total = nx * ny;
  for (let k = 0; k < total; k++) {
    const v = f32At(ez, k);
    if (v != v) return NaN;
    const a = Mathf.abs(v);
    if (a > m) m = a;
  }
  return m;
}
