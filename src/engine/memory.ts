/**
 * Bytes the engine allocates for one simulation, computed from the same sizes the engine
 * uses (assembly/engine.ts): float32 fields Ez, Hx, Hy (nx·ny each); CPML ψ arrays sized to
 * the four strips (two per field component pair); per-index CPML coefficient tables
 * (b, a, 1/κ − 1 for E and H nodes, along x and y); the source table (float64 per step);
 * the probe time series (float32 per probe per sample); running DFT accumulators (two
 * float64 per point per frequency); and optionally a full-grid DFT (two float32 per node).
 */
export interface MemoryInput {
  nx: number; ny: number; cells: number; steps: number;
  probes: number; dftPoints: number; frequencies: number; fullGridDft: boolean;
}

/** Cap on the estimate, bytes: 2 GiB, which both Node and Chromium can give one wasm instance. */
export const MEMORY_CAP_BYTES = 2 * 1024 ** 3;

export function engineMemoryBytes(m: MemoryInput): number {
  const fields = 3 * m.nx * m.ny * 4;
  // ψ for Ez∂x and Hy in the x strips (2·cells columns × ny), for Ez∂y and Hx in the y strips (2·cells rows × nx)
  const psi = m.cells > 0 ? 2 * (2 * m.cells * m.ny + 2 * m.cells * m.nx) * 4 : 0;
  const coefficients = 6 * (m.nx + m.ny) * 4;
  const source = m.steps * 8;
  const series = m.probes * (m.steps + 1) * 4;
  const dft = m.dftPoints * m.frequencies * 16 + m.dftPoints * 4;
  const fullGrid = m.fullGridDft ? 2 * m.nx * m.ny * 4 : 0;
  return fields + psi + coefficients + source + series + dft + fullGrid;
}
