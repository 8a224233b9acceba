import { describe, expect, it } from 'vitest';
import { engineMemoryBytes } from '../../src/scenario/memory.ts';
import { instantiateEngine, loadEngineModule } from '../../src/engine/wasm.ts';

// The scenario checker rejects runs by this estimate before the engine is ever asked, so it
// must match what `allocate` really claims (common practice, no source).
describe('engine memory estimate', () => {
  const cases = [
    { nx: 301, ny: 300, cells: 10, steps: 1200, probes: 3, dftPoints: 150, frequencies: 2, fullGridDft: true },
    { nx: 64, ny: 64, cells: 0, steps: 10, probes: 0, dftPoints: 0, frequencies: 0, fullGridDft: false },
    { nx: 25, ny: 2000, cells: 11, steps: 50_000, probes: 12, dftPoints: 12, frequencies: 7, fullGridDft: false },
    { nx: 1024, ny: 1024, cells: 10, steps: 4000, probes: 10, dftPoints: 410, frequencies: 3, fullGridDft: true },
  ];
  for (const m of cases) {
    it(`${m.nx} × ${m.ny}, CPML ${m.cells}, ${m.steps} steps: estimate within one cache line of the claim`, async () => {
      const e = instantiateEngine(await loadEngineModule());
      const claimed = e.allocate(m.nx, m.ny, m.cells, m.steps, m.probes, m.dftPoints, m.frequencies, m.fullGridDft ? 1 : 0);
      const estimate = engineMemoryBytes(m);
      expect(claimed).toBeGreaterThan(0);
      expect(claimed - estimate).toBeGreaterThanOrEqual(0);
      expect(claimed - estimate).toBeLessThan(64);
    });
  }
});
