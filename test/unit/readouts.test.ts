import { describe, expect, it } from 'vitest';
import { demoScenario } from '../../src/scenario/defaults.ts';
import { deriveQuantities, scenarioMemoryBytes } from '../../src/scenario/derived.ts';
import { engineMemoryBytes, MEMORY_CAP_BYTES } from '../../src/scenario/memory.ts';
import {
  errorMapsThatFit, fullGridDftBytes, newLineSpot, newProbeSpot, nextAnalysisFrequency, runMemory, runTimeEstimate,
  stabilityLimitOfDraft, waveformDefaultsOfDraft, waveformForKind, waveformOfDraft,
} from '../../src/scenario/readouts.ts';

const wave = (w: Record<string, unknown>) => ({ source: { waveform: w } });

describe('memory of a page run with its error maps', () => {
  it('costs two float32 per node for each full-grid DFT, as the engine allocates it', () => {
    expect(fullGridDftBytes(300, 300)).toBe(720_000); // 2 × 4 bytes per node, IEEE 754 binary32
    expect(fullGridDftBytes(0, 300)).toBe(0); // common practice, no source
    const input = { nx: 301, ny: 257, cells: 10, steps: 500, probes: 2, dftPoints: 9, frequencies: 2, fullGridDft: false };
    const extra = engineMemoryBytes({ ...input, fullGridDft: true }) - engineMemoryBytes(input);
    // the engine starts each of the two arrays on a 64-byte line (src/scenario/memory.ts)
    expect(extra).toBeGreaterThanOrEqual(fullGridDftBytes(301, 257)); // common practice, no source
    expect(extra).toBeLessThanOrEqual(fullGridDftBytes(301, 257) + 126); // common practice, no source
  });

  it('fits as many maps as the cap leaves room for, first frequencies first', () => {
    const each = fullGridDftBytes(1000, 1000);
    expect(errorMapsThatFit(MEMORY_CAP_BYTES - 2 * each, 1000, 1000, 5)).toBe(2); // common practice, no source
    expect(errorMapsThatFit(MEMORY_CAP_BYTES - 2 * each + 1, 1000, 1000, 5)).toBe(1); // common practice, no source
    expect(errorMapsThatFit(MEMORY_CAP_BYTES - 2 * each, 1000, 1000, 1)).toBe(1); // no more maps than frequencies, common practice, no source
    expect(errorMapsThatFit(MEMORY_CAP_BYTES, 1000, 1000, 5)).toBe(0); // common practice, no source
    expect(errorMapsThatFit(MEMORY_CAP_BYTES + 1, 1000, 1000, 5)).toBe(0); // common practice, no source
    expect(errorMapsThatFit(1e6, 1000, 1000, 0)).toBe(0); // common practice, no source
    expect(errorMapsThatFit(NaN, 1000, 1000, 3)).toBe(0); // common practice, no source
    expect(errorMapsThatFit(1e6, 1000, 1000, 3, 100)).toBe(0); // a cap below the run, common practice, no source
  });

  it('splits the page figure into the run (what check reports) and the error maps', () => {
    const s = demoScenario();
    const d = deriveQuantities(s);
    expect(d.memory_bytes).toBe(scenarioMemoryBytes(s)); // common practice, no source
    expect(d.fullGridDft_bytes).toBe(8 * 300 * 300); // common practice, no source
    expect(d.errorMapsFitting).toBe(3); // the demo's three frequencies all fit, common practice, no source
    expect(d.nodeUpdates).toBe(300 * 300 * 1200); // common practice, no source
    const one = runMemory(d, 1);
    expect(one).toEqual({ run_bytes: d.memory_bytes, maps: 1, errorMaps_bytes: 720_000, total_bytes: d.memory_bytes + 720_000 }); // common practice, no source
    expect(runMemory(d, 10).maps).toBe(3); // clipped to the frequencies, common practice, no source
    expect(runMemory(d, 0).total_bytes).toBe(d.memory_bytes); // common practice, no source
    expect(runMemory(d, -2).maps).toBe(0); // common practice, no source
    const none = deriveQuantities({ ...s, frequencies: [] });
    expect(runMemory(none, 1).maps).toBe(0); // no frequency, no map, common practice, no source
  });
});

describe('run-time estimate', () => {
  it('is node updates over the rate, and NaN without a rate', () => {
    const d = deriveQuantities(demoScenario());
    expect(runTimeEstimate(d, 150e6)).toBeCloseTo(0.72, 12); // 300·300·1200 / 1.5e8, common practice, no source
    expect(runTimeEstimate(d, 0)).toBeNaN(); // common practice, no source
    expect(runTimeEstimate(d, -1)).toBeNaN(); // common practice, no source
    expect(runTimeEstimate(d, NaN)).toBeNaN(); // common practice, no source
    expect(runTimeEstimate(d, Infinity)).toBe(0); // common practice, no source
  });
});

describe('stability limit from a draft', () => {
  it('follows dx and dy and gives nothing for missing or bad cells', () => {
    expect(stabilityLimitOfDraft({ grid: { dx: 1e-3, dy: 1e-3 } })).toBeCloseTo(Math.SQRT1_2, 15); // Taflove & Hagness §4.7: 1/√2 for square cells
    expect(stabilityLimitOfDraft({ grid: { dx: 1e-3, dy: 2e-3 } })).toBeCloseTo(1 / Math.sqrt(1.25), 15); // Taflove & Hagness §4.7 (1/(dx·√(1/dx² + 1/dy²)))
    expect(stabilityLimitOfDraft({ grid: { dx: 1e-3 } })).toBeUndefined(); // common practice, no source
    expect(stabilityLimitOfDraft({ grid: { dx: -1e-3, dy: 1e-3 } })).toBeUndefined(); // common practice, no source
    expect(stabilityLimitOfDraft({ grid: { dx: 'abc', dy: 1e-3 } })).toBeUndefined(); // common practice, no source
    expect(stabilityLimitOfDraft(null)).toBeUndefined(); // common practice, no source
  });
});

describe('waveform defaults and kind changes on a draft', () => {
  it('fills the defaults the scenario model gives', () => {
    // README "Scenario file": τ = 1/f0, t0 = 5τ (modulated Gaussian); t0 = 2/f0 (Ricker)
    expect(waveformOfDraft(wave({ kind: 'ricker', f0: 1e9 }))).toEqual({ kind: 'ricker', f0: 1e9, t0: 2e-9 });
    expect(waveformOfDraft(wave({ kind: 'modulated-gaussian', f0: 1e10 }))).toEqual({ kind: 'modulated-gaussian', f0: 1e10, tau: 1e-10, t0: 5e-10 });
    expect(waveformOfDraft(wave({ kind: 'gaussian', tau: 2e-10, t0: 3e-9 }))).toEqual({ kind: 'gaussian', tau: 2e-10, t0: 3e-9 }); // common practice, no source
    expect(waveformOfDraft(wave({ kind: 'gaussian', f0: 1e9 }))).toBeUndefined(); // a gaussian needs τ, common practice, no source
    expect(waveformOfDraft(wave({ kind: 'sinc', f0: 1e9 }))).toBeUndefined(); // common practice, no source
    expect(waveformOfDraft(wave({ kind: 'ricker', f0: -1 }))).toBeUndefined(); // common practice, no source
    expect(waveformOfDraft({})).toBeUndefined(); // common practice, no source
  });

  it('names the defaults for the placeholders', () => {
    // README "Scenario file" defaults
    expect(waveformDefaultsOfDraft(wave({ kind: 'modulated-gaussian', f0: 1e10 }))).toEqual({ tau: 1e-10, t0: 5e-10 });
    expect(waveformDefaultsOfDraft(wave({ kind: 'modulated-gaussian', f0: 1e10, tau: 3e-10 }))).toEqual({ tau: 1e-10, t0: 1.5e-9 });
    expect(waveformDefaultsOfDraft(wave({ kind: 'gaussian', tau: 1e-10 }))).toEqual({ t0: 5e-10 });
    expect(waveformDefaultsOfDraft(wave({ kind: 'ricker', f0: 1e9 }))).toEqual({ t0: 2e-9 });
    expect(waveformDefaultsOfDraft(wave({ kind: 'ricker' }))).toEqual({}); // common practice, no source
    expect(waveformDefaultsOfDraft(wave({ kind: 'other', f0: 1e9 }))).toEqual({}); // common practice, no source
  });

  it('converts f0 and τ as τ = 1/f0 and drops the fields the new kind refuses', () => {
    // README "Scenario file": τ defaults to 1/f0; gaussian takes no f0, ricker no τ
    expect(waveformForKind(wave({ kind: 'modulated-gaussian', f0: 1e10, tau: 1e-10 }), 'gaussian')).toEqual({ kind: 'gaussian', tau: 1e-10 });
    expect(waveformForKind(wave({ kind: 'modulated-gaussian', f0: 1e10, tau: 2e-10 }), 'ricker')).toEqual({ kind: 'ricker', f0: 1e10 });
    expect(waveformForKind(wave({ kind: 'gaussian', tau: 2e-10 }), 'ricker')).toEqual({ kind: 'ricker', f0: 5e9 });
    expect(waveformForKind(wave({ kind: 'gaussian', tau: 2e-10 }), 'modulated-gaussian')).toEqual({ kind: 'modulated-gaussian', f0: 5e9, tau: 2e-10 });
    expect(waveformForKind(wave({ kind: 'ricker', f0: 3e9 }), 'gaussian')).toEqual({ kind: 'gaussian', tau: 3.33333e-10 }); // 6 digits
    expect(waveformForKind(wave({ kind: 'ricker', f0: 3e9 }), 'modulated-gaussian')).toEqual({ kind: 'modulated-gaussian', f0: 3e9 });
    expect(waveformForKind({}, 'gaussian')).toEqual({ kind: 'gaussian', tau: undefined }); // nothing to convert, common practice, no source
    expect(waveformForKind(wave({ kind: 'ricker', f0: 0 }), 'gaussian')).toEqual({ kind: 'gaussian', tau: undefined }); // common practice, no source
  });
});

describe('spots for new probes, lines and frequencies', () => {
  it('puts a probe a sixth of the interior right of the source, inside the interior', () => {
    expect(newProbeSpot(demoScenario())).toEqual([0.197, 0.15]); // 0.15 + round(280/6)·1 mm, common practice, no source
    const nearEdge = { ...demoScenario(), source: { ...demoScenario().source, x: 0.28 } };
    expect(newProbeSpot(nearEdge)).toEqual([0.289, 0.15]); // last interior node i = 289, common practice, no source
    expect(newProbeSpot({})).toEqual([0.013, 0]); // fallbacks: 1 mm, 100 nodes, 10 cells; common practice, no source
    expect(newLineSpot(demoScenario())).toEqual({ x0: 0.155, y0: 0.15, x1: 0.197, y1: 0.15 }); // common practice, no source
  });

  it('adds a frequency 1.5 times the last', () => {
    expect(nextAnalysisFrequency({ frequencies: [1e10] })).toBe(1.5e10); // common practice, no source
    expect(nextAnalysisFrequency({ frequencies: [] }, 2e9)).toBe(3e9); // common practice, no source
    expect(nextAnalysisFrequency({ frequencies: ['x'] })).toBe(1.5e9); // common practice, no source
    expect(nextAnalysisFrequency({})).toBe(1.5e9); // common practice, no source
  });
});
