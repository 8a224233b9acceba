/**
 * Error maps: each node's figure is the scheme's transfer against the exact one at that node;
 * and the full-grid DFTs sampled every m-th step (m chosen from the pulse's band,
 * src/exact/dft-decimation.ts) against the same DFTs sampled at every step: the engines
 * compute the decimated sum they should, and on the demo, a ricker and a gaussian pulse (the
 * widest bands) the maps agree to the stated level, −80 dB.
 */
import { readFileSync } from 'node:fs';
import { beforeAll, describe, expect, it } from 'vitest';
import { errorMapOf } from '../../src/compare/error-map.ts';
import { relativeErrorDb, schemeTransfer } from '../../src/compare/metrics.ts';
import { exactReference } from '../../src/compare/reference.ts';
import { createSimulation, loadEngineModules, type AnySimulation, type EngineModules } from '../../src/engine/create-simulation.ts';
import { DECIMATION_LEVEL_DB } from '../../src/exact/dft-decimation.ts';
import { parseScenarioText } from '../../src/scenario/parse.ts';
import type { Scenario } from '../../src/scenario/types.ts';
import { mediaScenario, TEST_MEDIA } from '../fixtures/media.ts';

const LEVEL = 10 ** (-DECIMATION_LEVEL_DB / 20);

function demo(): Scenario {
  const r = parseScenarioText(readFileSync(new URL('../../examples/demo.json', import.meta.url), 'utf8'));
  if (!r.ok) throw new Error('examples/demo.json does not validate');
  return r.scenario;
}

let modules: EngineModules;
beforeAll(async () => {
  modules = await loadEngineModules();
});

/** The decimated and the every-step run of `s`, mapping all its frequencies. */
function pair(s: Scenario): [AnySimulation, AnySimulation] {
  const decimated = createSimulation(modules, s, { fullGridFrequencies: s.frequencies });
  const everyStep = createSimulation(modules, s, { fullGridFrequencies: s.frequencies, fullGridDecimation: 1 });
  decimated.run();
  everyStep.run();
  return [decimated, everyStep];
}

describe('errorMapOf', () => {
  it('gives every node 20·log10|FDTD/exact − 1| from its own exact value, the source off-centre, lossless and lossy, TMz and TEz', () => {
    const d = 1e-3;
    const cases: Scenario[] = [
      { ...demo(), steps: 300, source: { ...demo().source, x: 0.05, y: 0.21 } },
      mediaScenario(TEST_MEDIA.conductive, 'TEz', {
        grid: { nx: 45, ny: 38 }, absorber: { cells: 8 }, steps: 200, frequencies: [1.5e10],
        source: { x: 12 * d, y: 25 * d, waveform: { kind: 'modulated-gaussian', f0: 1.5e10, tau: 6e-11, t0: 3e-10 } },
      }),
    ];
    for (const s of cases) {
      const sim = createSimulation(modules, s, { fullGridFrequencies: s.frequencies });
      sim.run();
      const reference = exactReference(s);
      const { nx, ny, dx, dy } = sim.layout;
      s.frequencies.forEach((f, k) => {
        const map = errorMapOf(sim, k);
        const full = sim.fullGridDft(k);
        if (!map || !full) throw new Error('no map');
        const current = sim.currentDft(f);
        for (let n = 0; n < nx * ny; n += 7) {
          const node = { i: n % nx, j: Math.floor(n / nx), x: (n % nx) * dx, y: Math.floor(n / nx) * dy };
          const expected = relativeErrorDb(schemeTransfer([full.re[n], full.im[n]], current), reference.transfer(f, [node])[0]);
          if (Number.isNaN(expected)) expect(map.db[n]).toBeNaN(); // the source node, common practice, no source
          else expect(map.db[n]).toBe(Math.fround(expected)); // the same arithmetic, common practice, no source
        }
      });
      expect(errorMapOf(sim, s.frequencies.length)).toBeUndefined(); // no such DFT, common practice, no source
      expect(errorMapOf(sim, -1)).toBeUndefined(); // common practice, no source
      sim.dispose();
    }
  });
});

describe('the engines take the decimated sum', () => {
  // Oppenheim & Schafer, Discrete-Time Signal Processing, §4.6: m·Σ_q x[qm + r]·e^{−jω(qm + r)·dt}
  const check = (sim: AnySimulation) => {
    sim.layout.probes.forEach((node, p) => {
      const x = sim.probeSeries(p);
      const k = node.j * sim.layout.nx + node.i;
      sim.fullGridFrequencies.forEach((f, q) => {
        const m = sim.fullGridDecimations[q];
        const r = sim.fullGridOffsets[q];
        const w = 2 * Math.PI * f * sim.dt;
        let re = 0;
        let im = 0;
        let scale = 0;
        for (let n = r === 0 ? m : r; n < x.length; n += m) {
          re += m * x[n] * Math.cos(w * n);
          im -= m * x[n] * Math.sin(w * n);
          scale += m * Math.abs(x[n]);
        }
        const full = sim.fullGridDft(q);
        if (!full) throw new Error('no full-grid DFT');
        // float32 accumulation: a few units in the last place of the sum of |terms| (IEEE 754 binary32), common practice, no source
        expect(Math.hypot(full.re[k] - re, full.im[k] - im), `probe ${p}, ${f} Hz, m = ${m}`).toBeLessThan(1e-5 * scale);
        expect(Math.hypot(re, im)).toBeGreaterThan(1e-3 * scale); // the check is not of zeros, common practice, no source
      });
    });
  };

  it('lossless engine: m·Σ x[qm + r]·e^{−jω(qm + r)·dt} at every probe, m forced to 5 and chosen per frequency, offsets spread', () => {
    const s = { ...demo(), steps: 600 };
    for (const options of [{ fullGridFrequencies: s.frequencies, fullGridDecimation: 5 }, { fullGridFrequencies: s.frequencies }]) {
      const sim = createSimulation(modules, s, options);
      sim.run();
      expect(Math.min(...sim.fullGridDecimations)).toBeGreaterThan(1); // common practice, no source
      check(sim);
      sim.dispose();
    }
    const chosen = createSimulation(modules, s, { fullGridFrequencies: s.frequencies });
    // each frequency its own largest m (src/exact/dft-decimation.ts), offsets k·m/F apart
    expect(chosen.fullGridDecimations).toEqual(s.frequencies.map((f) => createSimulation(modules, s, { fullGridFrequencies: [f] }).fullGridDecimations[0])); // common practice, no source
    expect(chosen.fullGridDecimations).toEqual([22, 19, 16]); // lower frequencies lie further from the aliases of the band, common practice, no source
    expect(chosen.fullGridOffsets).toEqual([0, 6, 10]); // common practice, no source
    chosen.dispose();
  });

  it('media engine, TMz and TEz in a lossy medium: the same sum of the node field', () => {
    for (const polarization of ['TMz', 'TEz'] as const) {
      const d = 1e-3;
      const s = mediaScenario(TEST_MEDIA.several, polarization, {
        grid: { nx: 80, ny: 70 }, absorber: { cells: 10 },
        source: { x: 30 * d, y: 30 * d, waveform: { kind: 'modulated-gaussian', f0: 3e10, tau: 3e-11, t0: 1.5e-10 } },
        probes: [{ name: 'a', x: 40 * d, y: 34 * d }, { name: 'b', x: 55 * d, y: 50 * d }],
        frequencies: [2e10, 3e10], steps: 400,
      });
      const sim = createSimulation(modules, s, { fullGridFrequencies: s.frequencies, fullGridDecimation: 4 });
      sim.run();
      check(sim);
      sim.dispose();
    }
  });

  it('several frequencies in one pass give each the map it would have alone', () => {
    const s = { ...demo(), steps: 500 };
    const together = createSimulation(modules, s, { fullGridFrequencies: s.frequencies, fullGridDecimation: 6 });
    together.run();
    s.frequencies.forEach((f, k) => {
      const alone = createSimulation(modules, s, { fullGridFrequencies: [f], fullGridDecimation: 6 });
      alone.run();
      const a = alone.fullGridDft(0);
      const b = together.fullGridDft(k);
      expect(a && b && a.re.every((v, n) => v === b.re[n]) && a.im.every((v, n) => v === b.im[n])).toBe(true); // same operations, common practice, no source
      alone.dispose();
    });
    together.dispose();
  });
});

describe('decimated against every-step maps, to −80 dB', () => {
  // Widest bands: the ricker's spectrum falls as x·e^{−x}, x = (f/f0)², and the gaussian's
  // peaks at DC. A pulse carrying charge (the gaussian) leaves a 2D wake that decays only as
  // 1/t², so its run is long enough for the wake to die: a run cut short adds the end-of-run
  // term src/exact/dft-decimation.ts states.
  const cases: [string, (s: Scenario) => Scenario][] = [
    ['demo', (s) => s],
    ['ricker 10 GHz', (s) => ({ ...s, source: { ...s.source, waveform: { kind: 'ricker', f0: 1e10, t0: 2e-10 } } })],
    ['gaussian τ = 30 ps', (s) => ({ ...s, steps: 3600, source: { ...s.source, waveform: { kind: 'gaussian', tau: 3e-11, t0: 1.5e-10 } } })],
  ];
  for (const [name, make] of cases) {
    it(`${name}: every node within −80 dB of the map's peak, interior nodes within −80 dB of their own value, the error map's figures within 1e-4`, () => {
      const s = make(demo());
      const [decimated, everyStep] = pair(s);
      expect(Math.min(...decimated.fullGridDecimations)).toBeGreaterThanOrEqual(8); // the point of it: common practice, no source
      const { nx, ny } = s.grid;
      const L = s.absorber.cells;
      s.frequencies.forEach((f, k) => {
        const a = decimated.fullGridDft(k);
        const b = everyStep.fullGridDft(k);
        if (!a || !b) throw new Error('no full-grid DFT');
        let peak = 0;
        let worst = 0;
        let worstInterior = 0;
        for (let n = 0; n < nx * ny; n++) {
          const size = Math.hypot(b.re[n], b.im[n]);
          const diff = Math.hypot(a.re[n] - b.re[n], a.im[n] - b.im[n]);
          peak = Math.max(peak, size);
          worst = Math.max(worst, diff);
          const i = n % nx;
          const j = Math.floor(n / nx);
          if (i >= L && j >= L && i < nx - L && j < ny - L && size > 0) worstInterior = Math.max(worstInterior, diff / size);
        }
        expect(worst, `${f} Hz, m = ${decimated.fullGridDecimations[k]}`).toBeLessThanOrEqual(LEVEL * peak); // the stated level, src/exact/dft-decimation.ts
        expect(worstInterior, `${f} Hz interior`).toBeLessThanOrEqual(LEVEL); // the stated level, src/exact/dft-decimation.ts
        const mapA = errorMapOf(decimated, k);
        const mapB = errorMapOf(everyStep, k);
        if (!mapA || !mapB) throw new Error('no error map');
        expect(mapA.f_Hz).toBe(f); // common practice, no source
        let figure = 0;
        let defined = 0;
        for (let n = 0; n < nx * ny; n++) {
          if (!Number.isFinite(mapB.db[n])) continue;
          defined++;
          figure = Math.max(figure, Math.abs(10 ** (mapA.db[n] / 20) - 10 ** (mapB.db[n] / 20)));
        }
        expect(defined).toBe(nx * ny - 1); // all but the source node, common practice, no source
        expect(figure, `${f} Hz: |FDTD/exact − 1| changes by`).toBeLessThanOrEqual(LEVEL); // the stated level, src/exact/dft-decimation.ts
      });
      decimated.dispose();
      everyStep.dispose();
    }, 60_000);
  }
});
