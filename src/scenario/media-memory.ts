import { claimedBytes, recordingBlocks, stripVectorsPerRow, type MemoryInput } from './memory.ts';

/**
 * What the media engine's memory depends on beyond the lossless engine's: the polarization,
 * the background's pole state values per node (one per Drude or Debye pole, two per Lorentz
 * pole; 0 without background poles), the records of the pole table, the patched points of
 * each component, the patches' pole state values and the Debye states at the source point.
 */
export interface MediaMemoryInput extends MemoryInput {
  polarization: 'TMz' | 'TEz';
  stateSlots: number;
  poleRecords: number;
  /** Patched points of a, b, c other than PEC. */
  patches: [number, number, number];
  poolSlots: number;
  sourceCorrections: number;
  /** Runs of consecutive PEC points within a row, of a, b, c. */
  pecRuns: [number, number, number];
  /** Rows with PEC points of b or c. */
  maskRows: number;
}

/**
 * Bytes the media engine (assembly/media.ts) allocates for one simulation, block by block
 * the way its `allocate` claims them, each block starting on a 64-byte line: the update
 * coefficients as vectors (160 bytes); the float32 fields a, b, c (nx·ny each plus 16 spare
 * bytes); the CPML tables and ψ as in the lossless engine (src/scenario/memory.ts), the
 * x-strip tables regrouped with a lane mask (112 bytes per vector of strip columns);
 * background pole states for each electric component (a in TMz, b and c in TEz), ny rows
 * of ⌈nx/4⌉ vectors of 16 bytes per state value; the pole table (64 bytes a pole); per
 * component its patch records (48 bytes each), row starts (an int32 per row and one more)
 * and one float32 of scratch per patch; the patch state pool (float32); the addresses of
 * the source point's Debye states (int32); per component its PEC runs (two int32 each) and
 * their row starts; the mask row number of each row (int32), the mask rows (2·nx int32
 * each) and the column span of each (two int32); then source table, probe series, running
 * DFTs and the full-grid DFTs as in the lossless engine. The engine's own figure
 * can exceed this by at most 63 bytes (alignment of the first block).
 *
 * @example
 * mediaMemoryBytes({ nx: 100, ny: 100, cells: 10, steps: 500, probes: 1, dftPoints: 1, frequencies: 1,
 *   fullGridDft: false, polarization: 'TMz', stateSlots: 1, poleRecords: 1, patches: [0, 0, 0],
 *   poolSlots: 0, sourceCorrections: 1, pecRuns: [0, 0, 0], maskRows: 0 }); // 211280
 */
export function mediaMemoryBytes(m: MediaMemoryInput): number {
  const cells = m.nx * m.ny;
  const strip = stripVectorsPerRow(m.nx, m.cells);
  const rowVectors = Math.ceil(m.nx / 4);
  const states = m.ny * rowVectors * m.stateSlots * 16;
  const te = m.polarization === 'TEz';
  const [pa, pb, pc] = m.patches;
  const blocks = [
    160,
    cells * 4 + 16, cells * 4 + 16, cells * 4 + 16,
    ...Array<number>(6).fill(m.nx * 4), ...Array<number>(6).fill(m.ny * 4),
    strip * 112,
    m.ny * strip * 32,
    2 * m.cells * rowVectors * 32,
    te ? 0 : states, te ? states : 0, te ? states : 0,
    m.poleRecords * 64,
    pa * 48, pb * 48, pc * 48,
    (m.ny + 1) * 4, (m.ny + 1) * 4, (m.ny + 1) * 4,
    pa * 4, pb * 4, pc * 4,
    m.poolSlots * 4,
    m.sourceCorrections * 4,
    m.pecRuns[0] * 8, m.pecRuns[1] * 8, m.pecRuns[2] * 8,
    (m.ny + 1) * 4, (m.ny + 1) * 4, (m.ny + 1) * 4,
    m.ny * 4, m.maskRows * m.nx * 8, m.maskRows * 8,
    ...recordingBlocks(m),
  ];
  return claimedBytes(blocks);
}
