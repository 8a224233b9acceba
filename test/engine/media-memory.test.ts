import { describe, expect, it } from 'vitest';
import { mediaMemoryBytes, type MediaMemoryInput } from '../../src/scenario/media-memory.ts';
import { fullGridDftCount } from '../../src/scenario/memory.ts';
import { MediaSimulation, PATCH_KIND } from '../../src/engine/media-simulation.ts';
import { instantiateMedia, loadMediaModule } from '../../src/engine/wasm.ts';
import { mediaScenario, patchedMap, TEST_MEDIA } from '../fixtures/media.ts';

// The scenario checker will refuse runs by this estimate before the engine is ever asked,
// so it must match what `allocate` really claims (common practice, no source).
describe('media engine memory estimate', () => {
  const base = {
    probes: 3, dftPoints: 150, frequencies: 2, fullGridDft: true, patches: [0, 0, 0] as [number, number, number],
    poolSlots: 0, sourceCorrections: 0, pecRuns: [0, 0, 0] as [number, number, number], maskRows: 0,
  };
  const cases: MediaMemoryInput[] = [
    { ...base, nx: 301, ny: 300, cells: 10, steps: 1200, polarization: 'TMz', stateSlots: 0, poleRecords: 0 },
    { ...base, nx: 301, ny: 300, cells: 10, steps: 1200, polarization: 'TMz', stateSlots: 1, poleRecords: 1, sourceCorrections: 1 },
    { ...base, nx: 257, ny: 211, cells: 7, steps: 900, polarization: 'TEz', stateSlots: 5, poleRecords: 7, patches: [13, 400, 399], poolSlots: 3000, sourceCorrections: 0, pecRuns: [20, 41, 40], maskRows: 21 },
    { ...base, nx: 64, ny: 64, cells: 0, steps: 10, polarization: 'TEz', stateSlots: 0, poleRecords: 0, fullGridDft: false, probes: 0, dftPoints: 0, frequencies: 0 },
    { ...base, nx: 25, ny: 2000, cells: 11, steps: 50_000, polarization: 'TMz', stateSlots: 2, poleRecords: 3, patches: [1, 0, 5], poolSlots: 2, sourceCorrections: 2 },
    { ...base, nx: 1024, ny: 1024, cells: 10, steps: 4000, polarization: 'TMz', stateSlots: 4, poleRecords: 4, patches: [5000, 2500, 2500], poolSlots: 12000, sourceCorrections: 2, pecRuns: [300, 7, 9], maskRows: 16 },
    { ...base, nx: 257, ny: 211, cells: 7, steps: 900, polarization: 'TEz', stateSlots: 2, poleRecords: 2, fullGridDft: 4 },
  ];
  for (const m of cases) {
    it(`${m.nx} × ${m.ny} ${m.polarization}, ${m.stateSlots} state(s) a node, patches ${m.patches.join('/')}, PEC runs ${m.pecRuns.join('/')}: estimate within one cache line of the claim`, async () => {
      const e = instantiateMedia(await loadMediaModule());
      const claimed = e.allocate(m.nx, m.ny, m.cells, m.steps, m.probes, m.dftPoints, m.frequencies, fullGridDftCount(m.fullGridDft),
        m.polarization === 'TEz' ? 1 : 0, m.stateSlots, m.poleRecords, ...m.patches, m.poolSlots, m.sourceCorrections, ...m.pecRuns, m.maskRows);
      const estimate = mediaMemoryBytes(m);
      expect(claimed).toBeGreaterThan(0); // common practice, no source
      expect(claimed - estimate).toBeGreaterThanOrEqual(0); // common practice, no source
      expect(claimed - estimate).toBeLessThan(64); // common practice, no source
    });
  }

  it('the background states cost 16 bytes a vector of four nodes per state value and electric component', () => {
    const one = { ...cases[0], nx: 1024, ny: 1024, cells: 10, fullGridDft: false };
    const cells = 1024 * 1024;
    expect((mediaMemoryBytes({ ...one, stateSlots: 1, poleRecords: 1 }) - mediaMemoryBytes(one)) / cells).toBeCloseTo(4, 3); // common practice, no source
    expect((mediaMemoryBytes({ ...one, stateSlots: 2, poleRecords: 1 }) - mediaMemoryBytes(one)) / cells).toBeCloseTo(8, 3); // common practice, no source
    expect((mediaMemoryBytes({ ...one, polarization: 'TEz', stateSlots: 1, poleRecords: 1 }) - mediaMemoryBytes(one)) / cells).toBeCloseTo(8, 3); // common practice, no source
  });

  it('a simulation reports the estimate for its own tables, and the engine claims it', async () => {
    const module = await loadMediaModule();
    for (const polarization of ['TMz', 'TEz'] as const) {
      const s = mediaScenario(TEST_MEDIA.several, polarization, {
        grid: { nx: 64, ny: 56 }, steps: 50, probes: [{ name: 'p', x: 0.03, y: 0.03 }], frequencies: [1e10],
        source: { x: 24e-3, y: 20e-3 }, // inside the patched block: Debye states of the object at the source
      });
      const sim = new MediaSimulation(module, s, { fullGridFrequency: 1e10 }, patchedMap(polarization, TEST_MEDIA.several, 64, 20, 16));
      const t = sim.tables;
      const pec = (list: typeof t.patches.a) => list.filter((p) => p.kind === PATCH_KIND.pec);
      const other = (list: typeof t.patches.a) => list.length - pec(list).length;
      // the map's PEC points of a component lie in one run per row of the block (patchedMap)
      const runs = (list: typeof t.patches.a) => new Set(pec(list).map((p) => Math.floor(p.k / 64))).size;
      expect(sim.memoryBytes).toBe(mediaMemoryBytes({ // common practice, no source
        nx: 64, ny: 56, cells: 10, steps: 50, probes: 1, dftPoints: 1, frequencies: 1, fullGridDft: true, polarization,
        stateSlots: 5, poleRecords: t.poles.length, patches: [other(t.patches.a), other(t.patches.b), other(t.patches.c)],
        poolSlots: t.poolSlots, sourceCorrections: t.sourceStates.length,
        pecRuns: [runs(t.patches.a), runs(t.patches.b), runs(t.patches.c)], maskRows: polarization === 'TEz' ? 10 : 0,
      }));
      expect(t.poolSlots).toBeGreaterThan(0); // common practice, no source
      if (polarization === 'TMz') expect(t.sourceStates).toEqual([{ block: 'pool', index: expect.any(Number) }]); // common practice, no source
      sim.dispose();
    }
  });

  it('refuses, before allocating, a run beyond what one WebAssembly engine can address', async () => {
    const module = await loadMediaModule();
    // 15 000² cells in TEz with one Debye pole: three fields and the b and c state arrays of
    // float32 are 4.2 GiB (lossless, 2.5 GiB would be addressable)
    const s = mediaScenario(TEST_MEDIA.debye, 'TEz', { grid: { nx: 15_000, ny: 15_000 }, steps: 10 });
    expect(() => new MediaSimulation(module, s)).toThrow(/needs 4\.2 GiB, beyond the 4 GiB one WebAssembly engine can address/); // common practice, no source
  });
});
