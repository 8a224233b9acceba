import { describe, expect, it } from 'vitest';
import { engineMemoryBytes, fullGridDftCount } from '../../src/scenario/memory.ts';
import { instantiateEngine, loadEngineModule } from '../../src/engine/wasm.ts';

// The scenario checker rejects runs by this estimate before the engine is ever asked, so it
// must match what `allocate` really claims (common practice, no source).
describe('engine memory estimate', () => {
  const cases = [
    { nx: 301, ny: 300, cells: 10, steps: 1200, probes: 3, dftPoints: 150, frequencies: 2, fullGridDft: true },
    { nx: 64, ny: 64, cells: 0, steps: 10, probes: 0, dftPoints: 0, frequencies: 0, fullGridDft: false },
    { nx: 25, ny: 2000, cells: 11, steps: 50_000, probes: 12, dftPoints: 12, frequencies: 7, fullGridDft: false },
    { nx: 1024, ny: 1024, cells: 10, steps: 4000, probes: 10, dftPoints: 410, frequencies: 3, fullGridDft: true },
    { nx: 301, ny: 257, cells: 10, steps: 900, probes: 2, dftPoints: 60, frequencies: 3, fullGridDft: 3 },
    { nx: 1000, ny: 1000, cells: 10, steps: 2000, probes: 2, dftPoints: 123, frequencies: 5, fullGridDft: 5 },
  ];
  for (const m of cases) {
    it(`${m.nx} × ${m.ny}, CPML ${m.cells}, ${m.steps} steps: estimate within one cache line of the claim`, async () => {
      const e = instantiateEngine(await loadEngineModule());
      const claimed = e.allocate(m.nx, m.ny, m.cells, m.steps, m.probes, m.dftPoints, m.frequencies, fullGridDftCount(m.fullGridDft));
      const estimate = engineMemoryBytes(m);
      expect(claimed).toBeGreaterThan(0);
      expect(claimed - estimate).toBeGreaterThanOrEqual(0);
      expect(claimed - estimate).toBeLessThan(64);
    });
  }

  it('each full-grid DFT adds its two float32 blocks; more than 1024 are refused rather than half-built', async () => {
    const e = instantiateEngine(await loadEngineModule());
    const m = { nx: 301, ny: 257, cells: 10, steps: 100, probes: 1, dftPoints: 1, frequencies: 1 };
    const per = engineMemoryBytes({ ...m, fullGridDft: 3 }) - engineMemoryBytes({ ...m, fullGridDft: 2 });
    expect(per).toBe(2 * Math.ceil((4 * 301 * 257) / 64) * 64); // two blocks on 64-byte lines, common practice, no source
    expect(engineMemoryBytes({ ...m, fullGridDft: true })).toBe(engineMemoryBytes({ ...m, fullGridDft: 1 })); // common practice, no source
    expect(engineMemoryBytes({ ...m, fullGridDft: false })).toBe(engineMemoryBytes({ ...m, fullGridDft: 0 })); // common practice, no source
    expect(e.allocate(64, 64, 0, 10, 0, 0, 0, 1025)).toBe(0); // common practice, no source
    expect(e.allocate(64, 64, 0, 10, 0, 0, 0, -1)).toBe(0); // common practice, no source
  });
});
