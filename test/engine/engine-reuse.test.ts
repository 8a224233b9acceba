/**
 * A simulation that takes over the engine instance of a finished one (SimulationOptions.reuse,
 * as the page's run worker does between runs) computes exactly what a fresh instance does:
 * `allocate` clears the memory the last simulation used, whatever it held.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { createSimulation, loadEngineModules, type AnySimulation, type EngineModules } from '../../src/engine/create-simulation.ts';
import type { Scenario } from '../../src/scenario/types.ts';
import { mediaScenario, TEST_MEDIA } from '../fixtures/media.ts';
import { makeScenario } from '../fixtures/scenarios.ts';

let modules: EngineModules;
beforeAll(async () => {
  modules = await loadEngineModules();
});

function words(sim: AnySimulation): Uint32Array[] {
  const out = [sim.ezView(), sim.hxView(), sim.hyView(), ...sim.scenario.probes.map((_, p) => sim.probeSeries(p))]
    .map((a) => new Uint32Array(a.slice().buffer));
  sim.fullGridFrequencies.forEach((_, k) => {
    const full = sim.fullGridDft(k);
    if (full) out.push(new Uint32Array(full.re.slice().buffer), new Uint32Array(full.im.slice().buffer));
  });
  out.push(new Uint32Array(new Float64Array(sim.scenario.frequencies.flatMap((_, f) => sim.probeDft(0, f))).buffer));
  return out;
}

function scenarios(): [string, Scenario, Scenario][] {
  const d = 1e-3;
  const small = (over: Parameters<typeof makeScenario>[0]) => makeScenario({
    grid: { nx: 61, ny: 47 }, absorber: { cells: 8 }, steps: 150, frequencies: [1.5e10, 2.5e10],
    source: { x: 20 * d, y: 20 * d, waveform: { kind: 'modulated-gaussian', f0: 2e10, tau: 5e-11, t0: 2.5e-10 } },
    probes: [{ name: 'p', x: 30 * d, y: 25 * d }], ...over,
  });
  const big = makeScenario({
    grid: { nx: 120, ny: 90 }, absorber: { cells: 10 }, steps: 300, frequencies: [1e10, 2e10, 3e10],
    source: { x: 50 * d, y: 40 * d, waveform: { kind: 'ricker', f0: 2e10, t0: 1e-10 } },
    probes: [{ name: 'q', x: 70 * d, y: 40 * d }],
  });
  return [
    ['lossless after a bigger lossless run', big, small({})],
    ['lossless after a smaller one (the memory grows)', small({}), big],
    ['media TEz after a media TMz run', mediaScenario(TEST_MEDIA.several, 'TMz', { grid: { nx: 90, ny: 70 }, steps: 200, frequencies: [2e10] }),
      mediaScenario(TEST_MEDIA.debye, 'TEz', { grid: { nx: 61, ny: 47 }, steps: 150, frequencies: [1.5e10, 2.5e10], probes: [{ name: 'p', x: 0.03, y: 0.025 }] })],
  ];
}

describe('an engine instance serves one simulation after another', () => {
  for (const [name, first, second] of scenarios()) {
    it(`${name}: bit for bit what a fresh instance gives`, () => {
      const before = createSimulation(modules, first, { fullGridFrequencies: first.frequencies });
      before.run();
      const reused = createSimulation(modules, second, { fullGridFrequencies: second.frequencies, reuse: before });
      expect(before.disposed).toBe(true); // the old one gave up its instance, common practice, no source
      const fresh = createSimulation(modules, second, { fullGridFrequencies: second.frequencies });
      reused.run();
      fresh.run();
      const a = words(reused);
      const b = words(fresh);
      expect(a.length).toBe(b.length); // common practice, no source
      a.forEach((w, k) => expect(w.every((x, n) => x === b[k][n]), `array ${k}`).toBe(true)); // zeros as on fresh pages, common practice, no source
      expect(reused.ezView().some((v) => v !== 0)).toBe(true); // the comparison is not of zeros, common practice, no source
      reused.dispose();
      fresh.dispose();
    });
  }

  it('a simulation on the other engine does not take the instance, and nothing breaks', () => {
    const lossless = createSimulation(modules, scenarios()[0][1]);
    const media = createSimulation(modules, mediaScenario(TEST_MEDIA.conductive, 'TMz', { steps: 20 }), { reuse: lossless });
    media.run();
    expect(lossless.disposed).toBe(true); // common practice, no source
    expect(media.stepsDone).toBe(20); // common practice, no source
    media.dispose();
  });
});
