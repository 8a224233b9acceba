import { beforeAll, describe, expect, it } from 'vitest';
import { Simulation, type SimulationOptions } from '../../src/engine/simulation.ts';
import { loadEngineModule } from '../../src/engine/wasm.ts';
import type { Scenario } from '../../src/scenario/types.ts';
import { makeScenario } from '../fixtures/scenarios.ts';

// The release engine runs its rows on f32x4 vectors, the scalar build (asconfig target
// "scalar", SIMD disabled) runs the same source node by node. IEEE 754 single-precision
// add, subtract and multiply are correctly rounded lane by lane, and wasm has no fused
// multiply-add, so with the same operation order the two must agree bit for bit
// (common practice, no source).

const scalarUrl = new URL('../../build/engine-scalar.wasm', import.meta.url);

/** A scenario with everything the engine records: probes, lines, DFTs, a modulated pulse. */
function fullScenario(nx: number, ny: number, cells: number): Scenario {
  const d = 1e-3;
  const at = (i: number, j: number) => ({ x: i * d, y: j * d });
  return makeScenario({
    grid: { nx, ny },
    absorber: { cells },
    source: { ...at(cells + 7, cells + 5), waveform: { kind: 'modulated-gaussian', f0: 3e10, tau: 3e-11, t0: 1.5e-10 } },
    probes: [
      { name: 'near', ...at(cells + 2, cells + 3) },
      { name: 'far', ...at(nx - cells - 2, ny - cells - 2) },
      { name: 'edge', ...at(cells, ny - 1 - cells) },
    ],
    lines: [
      { name: 'diagonal', x0: (cells + 1) * d, y0: (cells + 1) * d, x1: (nx - cells - 2) * d, y1: (ny - cells - 3) * d },
      { name: 'row', x0: cells * d, y0: (cells + 5) * d, x1: (nx - 1 - cells) * d, y1: (cells + 5) * d },
    ],
    frequencies: [1e10, 2.5e10, 4e10],
    steps: 360,
  });
}

interface Outcome { words: Map<string, Uint32Array>; nonzero: number }

async function runOn(module: WebAssembly.Module, s: Scenario, options: SimulationOptions = { fullGridFrequency: 2e10 }): Promise<Outcome> {
  const sim = new Simulation(module, s, options);
  sim.run(undefined, 37); // uneven batches: a batch boundary must not matter either
  const words = new Map<string, Uint32Array>();
  const f32 = (name: string, a: Float32Array) => words.set(name, new Uint32Array(a.slice().buffer));
  const f64 = (name: string, a: number[]) => words.set(name, new Uint32Array(new Float64Array(a).buffer));
  f32('ez', sim.ezView()); f32('hx', sim.hxView()); f32('hy', sim.hyView());
  sim.fullGridFrequencies.forEach((_, k) => {
    const full = sim.fullGridDft(k);
    if (!full) throw new Error(`full-grid DFT ${k} missing`);
    f32(`fullRe ${k}`, full.re); f32(`fullIm ${k}`, full.im);
  });
  s.probes.forEach((_, p) => f32(`series ${p}`, sim.probeSeries(p)));
  s.frequencies.forEach((_, k) => {
    f64(`probe dft f${k}`, s.probes.flatMap((_, p) => sim.probeDft(p, k)));
    sim.layout.lines.forEach((line, l) => f64(`line ${l} dft f${k}`, line.nodes.flatMap((_, n) => sim.lineDft(l, n, k))));
  });
  let nonzero = 0;
  for (const v of sim.ezView()) if (v !== 0) nonzero++;
  sim.dispose();
  return { words, nonzero };
}

describe('SIMD engine against the scalar build of the same kernel', () => {
  let simd: WebAssembly.Module;
  let scalar: WebAssembly.Module;
  beforeAll(async () => {
    simd = await loadEngineModule();
    scalar = await loadEngineModule(scalarUrl);
  });

  it('the two builds really differ: only the release build holds SIMD code', async () => {
    const fs = await import('node:fs/promises');
    const size = async (name: string) => (await fs.stat(new URL(`../../build/${name}`, import.meta.url))).size;
    expect(WebAssembly.validate(await fs.readFile(new URL('../../build/engine.wasm', import.meta.url)))).toBe(true);
    expect(await size('engine.wasm')).not.toBe(await size('engine-scalar.wasm'));
  });

  it('the smallest grids the scenario rules allow (vectors reach past short rows) agree too', async () => {
    for (const [n, cells] of [[3, 0], [5, 1], [6, 1], [7, 2], [9, 3], [11, 4]]) {
      const mid = Math.floor(n / 2) * 1e-3;
      const s = makeScenario({
        grid: { nx: n, ny: n + 1 }, absorber: { cells }, steps: 60,
        source: { x: mid, y: mid, waveform: { kind: 'ricker', f0: 6e10, t0: 3e-11 } },
        probes: [{ name: 'centre', x: mid, y: mid }], frequencies: [2e10],
      });
      const a = await runOn(simd, s);
      const b = await runOn(scalar, s);
      expect(a.nonzero, `${n}: the pulse is there`).toBeGreaterThan(0);
      for (const [name, words] of a.words) {
        const other = b.words.get(name) as Uint32Array;
        expect(words.every((w, k) => w === other[k]), `${n} × ${n + 1}, CPML ${cells}: ${name}`).toBe(true);
      }
    }
  });

  it('several full-grid DFTs, decimated (chosen, and forced to 3 and 7 steps), agree bit for bit', async () => {
    const options: SimulationOptions[] = [
      { fullGridFrequencies: [1e10, 2e10, 3.5e10] },
      { fullGridFrequencies: [2e10, 1e10], fullGridDecimation: 3 },
      { fullGridFrequencies: [1.5e10], fullGridDecimation: 7 },
    ];
    for (const [nx, ny, cells] of [[64, 48, 10], [61, 47, 10], [41, 33, 0]] as const) {
      for (const o of options) {
        const a = await runOn(simd, fullScenario(nx, ny, cells), o);
        const b = await runOn(scalar, fullScenario(nx, ny, cells), o);
        expect(a.words.size).toBe(b.words.size); // common practice, no source
        for (const [name, words] of a.words) {
          const other = b.words.get(name) as Uint32Array;
          expect(words.every((w, k) => w === other[k]), `${nx} × ${ny}, ${JSON.stringify(o)}: ${name}`).toBe(true); // common practice, no source
        }
      }
    }
  });

  // Shapes: rows a whole number of vectors or not, strips that meet in the middle,
  // no absorber at all, and a tall narrow grid.
  const shapes: [number, number, number][] = [[64, 48, 10], [61, 47, 10], [83, 50, 7], [30, 30, 12], [41, 33, 0], [29, 71, 13]];
  for (const [nx, ny, cells] of shapes) {
    it(`${nx} × ${ny}, CPML ${cells}: fields, series and DFTs agree bit for bit`, async () => {
      const s = fullScenario(nx, ny, cells);
      const a = await runOn(simd, s);
      const b = await runOn(scalar, s);
      expect(a.nonzero).toBeGreaterThan(nx * ny / 4); // the pulse has filled the grid
      expect([...a.words.keys()]).toEqual([...b.words.keys()]);
      for (const [name, words] of a.words) {
        const other = b.words.get(name) as Uint32Array;
        let differing = 0;
        for (let k = 0; k < words.length; k++) if (words[k] !== other[k]) differing++;
        expect(differing, `${name}: ${differing} of ${words.length} words differ`).toBe(0);
      }
    }, 60_000);
  }
});
