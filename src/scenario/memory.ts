/**
 * Bytes the engine allocates for one simulation, computed block by block the way
 * assembly/engine.ts `allocate` claims them (each block starts on a 64-byte line): the
 * update coefficients as vectors (64 bytes); float32 fields Ez, Hx, Hy (nx·ny each, plus 16
 * spare bytes); per-index CPML coefficient tables (b, a, 1/κ − 1 for E and H nodes, along x
 * and y) and the x-strip ones regrouped by vector; CPML ψ arrays sized to the four strips
 * (x strips: ny rows of whole vectors covering the layer's columns on each side; y strips:
 * 2·cells rows of nx, rounded to vectors); the source table (float64 per step); the probe time series
 * (float32 per probe per sample); the running DFTs (index, float64 scratch value and two
 * float64 per frequency per point); and the full-grid DFTs, none, one or several (two
 * float32 per node each).
 * The engine's own figure can exceed this by at most 63 bytes (alignment of the first block).
 */
export interface MemoryInput {
  nx: number; ny: number; cells: number; steps: number;
  probes: number; dftPoints: number; frequencies: number;
  /** Full-grid running DFTs (error maps): how many, or true for one. */
  fullGridDft: boolean | number;
}

/** The number of full-grid DFTs a `fullGridDft` entry stands for. */
export function fullGridDftCount(fullGridDft: boolean | number): number {
  return typeof fullGridDft === 'number' ? Math.max(0, Math.floor(fullGridDft)) : fullGridDft ? 1 : 0;
}

/** Cap on the estimate, bytes: 2 GiB, which both Node and Chromium can give one wasm instance. */
export const MEMORY_CAP_BYTES = 2 * 1024 ** 3;

/** Vectors of four columns per row whose ψ the engine keeps in the x strips (assembly/engine.ts `allocate`). */
export function stripVectorsPerRow(nx: number, cells: number): number {
  if (cells === 0) return 0;
  let left = (cells + 3) & ~3;
  let right = (nx - 1 - cells) & ~3;
  if (right < left) { left = nx; right = nx; }
  return Math.ceil((left + nx - right) / 4);
}

/**
 * The blocks both engines claim last, in their order: source samples, probe indices and
 * series, DFT point indices, values, ω·dt and sums, and the full-grid DFTs.
 */
export function recordingBlocks(m: MemoryInput): number[] {
  return [
    m.steps * 8,
    m.probes * 4, m.probes * (m.steps + 1) * 4,
    m.dftPoints * 4, m.dftPoints * 8, m.frequencies * 8, m.dftPoints * m.frequencies * 16,
    ...Array<number>(2 * fullGridDftCount(m.fullGridDft)).fill(m.nx * m.ny * 4),
  ];
}

/** Bytes an engine claims for `blocks` in order: each starts on a 64-byte line; the last is counted to its end. */
export function claimedBytes(blocks: readonly number[]): number {
  const line = (bytes: number) => Math.ceil(bytes / 64) * 64;
  return blocks.slice(0, -1).reduce((sum, b) => sum + line(b), 0) + (blocks[blocks.length - 1] ?? 0);
}

export function engineMemoryBytes(m: MemoryInput): number {
  const cells = m.nx * m.ny;
  const strip = stripVectorsPerRow(m.nx, m.cells);
  const blocks = [
    64, // the four update coefficients as vectors
    cells * 4 + 16, cells * 4 + 16, cells * 4 + 16,
    ...Array<number>(6).fill(m.nx * 4), ...Array<number>(6).fill(m.ny * 4),
    strip * 96, // x-strip coefficients regrouped by vector
    m.ny * strip * 32, // ψ of the x strips: 4 Hy and 4 Ez values per vector of columns
    2 * m.cells * Math.ceil(m.nx / 4) * 32, // ψ of the y strips: 4 Hx and 4 Ez values per vector
    ...recordingBlocks(m),
  ];
  return claimedBytes(blocks);
}
