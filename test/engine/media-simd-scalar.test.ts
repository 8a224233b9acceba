import { beforeAll, describe, expect, it } from 'vitest';
import type { MaterialMap } from '../../src/engine/material-map.ts';
import { MediaSimulation } from '../../src/engine/media-simulation.ts';
import type { SimulationOptions } from '../../src/engine/simulation.ts';
import { loadMediaModule } from '../../src/engine/wasm.ts';
import type { Polarization, Scenario } from '../../src/scenario/types.ts';
import { mediaScenario, patchedMap, pecMap, TEST_MEDIA } from '../fixtures/media.ts';

// The release media engine runs its rows on f32x4 vectors, the scalar build (asconfig target
// "media-scalar") the same source node by node. IEEE 754 single-precision add, subtract and
// multiply are correctly rounded lane by lane and wasm has no fused multiply-add, so with
// the same operation order the two agree bit for bit (common practice, no source). The
// release build also has loops made for one pole of each kind; the scalar build has only
// the loop over the pole table, so this also holds those copies to the general order.

const scalarUrl = new URL('../../build/media-scalar.wasm', import.meta.url);

/** A scenario with probes, lines, DFTs and a modulated pulse, in a medium and polarization. */
function fullScenario(nx: number, ny: number, cells: number, medium: string, polarization: Polarization): Scenario {
  const d = 1e-3;
  const at = (i: number, j: number) => ({ x: i * d, y: j * d });
  return mediaScenario(TEST_MEDIA[medium], polarization, {
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
    frequencies: [1e10, 2.5e10],
    steps: 300,
  });
}

interface Outcome { words: Map<string, Uint32Array>; nonzero: number }

function runOn(module: WebAssembly.Module, s: Scenario, map?: MaterialMap, options: SimulationOptions = { fullGridFrequency: 2e10 }): Outcome {
  const sim = new MediaSimulation(module, s, options, map);
  sim.run(undefined, 37); // uneven batches: a batch boundary must not matter either
  const words = new Map<string, Uint32Array>();
  const f32 = (name: string, a: Float32Array) => words.set(name, new Uint32Array(a.slice().buffer));
  const f64 = (name: string, a: number[]) => words.set(name, new Uint32Array(new Float64Array(a).buffer));
  f32('a', sim.ezView()); f32('b', sim.hxView()); f32('c', sim.hyView());
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

function differing(a: Outcome, b: Outcome): string[] {
  const out: string[] = [];
  expect([...a.words.keys()]).toEqual([...b.words.keys()]); // common practice, no source
  for (const [name, words] of a.words) {
    const other = b.words.get(name) as Uint32Array;
    let n = 0;
    for (let k = 0; k < words.length; k++) if (words[k] !== other[k]) n++;
    if (n > 0) out.push(`${name}: ${n} of ${words.length} words differ`);
  }
  return out;
}

describe('media engine: SIMD build against the scalar build', () => {
  let simd: WebAssembly.Module;
  let scalar: WebAssembly.Module;
  beforeAll(async () => {
    simd = await loadMediaModule();
    scalar = await loadMediaModule(scalarUrl);
  });

  it('the two builds really differ: only the release build holds SIMD code', async () => {
    const fs = await import('node:fs/promises');
    const text = async (name: string) => fs.readFile(new URL(`../../build/${name}`, import.meta.url), 'utf8');
    expect(await text('media.wat')).toContain('f32x4.mul'); // common practice, no source
    expect(await text('media-scalar.wat')).not.toContain('f32x4'); // common practice, no source
  });

  // Shapes: rows a whole number of vectors or not, strips that meet in the middle, no absorber.
  const shapes: [number, number, number][] = [[64, 48, 10], [61, 47, 7], [30, 30, 12], [41, 33, 0]];
  for (const polarization of ['TMz', 'TEz'] as const) {
    for (const medium of Object.keys(TEST_MEDIA)) {
      it(`${polarization}, ${medium}: fields, series and DFTs agree bit for bit on four grid shapes`, () => {
        for (const [nx, ny, cells] of shapes) {
          const s = fullScenario(nx, ny, cells, medium, polarization);
          const a = runOn(simd, s);
          const b = runOn(scalar, s);
          expect(a.nonzero, `${nx} × ${ny}: the pulse has spread`).toBeGreaterThan((nx * ny) / 4); // common practice, no source
          expect(differing(a, b), `${nx} × ${ny}, CPML ${cells}`).toEqual([]); // common practice, no source
        }
      });

      it(`${polarization}, ${medium}, with patches of every kind, and with PEC only: agree bit for bit`, () => {
        for (const [nx, ny, cells, make] of [[64, 48, 10, patchedMap], [57, 45, 0, patchedMap], [61, 48, 10, pecMap], [57, 45, 0, pecMap]] as const) {
          const s = fullScenario(nx, ny, cells, medium, polarization);
          const map = make(polarization, TEST_MEDIA[medium], nx, 20, 14);
          const a = runOn(simd, s, map);
          const b = runOn(scalar, s, map);
          expect(a.nonzero).toBeGreaterThan((nx * ny) / 4); // common practice, no source
          expect(differing(a, b), `${nx} × ${ny}, CPML ${cells}`).toEqual([]); // common practice, no source
        }
      });
    }
  }

  it('several full-grid DFTs, decimated (chosen, and forced to 3 and 7 steps), agree bit for bit, with patches too', () => {
    const options: SimulationOptions[] = [
      { fullGridFrequencies: [1e10, 2e10, 3.5e10] },
      { fullGridFrequencies: [2e10, 1e10], fullGridDecimation: 3 },
      { fullGridFrequencies: [1.5e10], fullGridDecimation: 7 },
    ];
    for (const polarization of ['TMz', 'TEz'] as const) {
      for (const [nx, ny, cells] of [[64, 48, 10], [61, 47, 7]] as const) {
        const s = fullScenario(nx, ny, cells, 'several', polarization);
        const map = patchedMap(polarization, TEST_MEDIA.several, nx, 20, 14);
        for (const o of options) {
          expect(differing(runOn(simd, s, undefined, o), runOn(scalar, s, undefined, o)), `${polarization} ${nx} × ${ny} ${JSON.stringify(o)}`).toEqual([]); // common practice, no source
          expect(differing(runOn(simd, s, map, o), runOn(scalar, s, map, o)), `${polarization} ${nx} × ${ny} patched ${JSON.stringify(o)}`).toEqual([]); // common practice, no source
        }
      }
    }
  });

  it('the smallest grids (vectors reach past short rows) agree too, in both polarizations with poles', () => {
    for (const polarization of ['TMz', 'TEz'] as const) {
      for (const [n, cells] of [[3, 0], [5, 1], [6, 1], [7, 2], [9, 3], [11, 4]]) {
        const mid = Math.floor(n / 2) * 1e-3;
        const s = mediaScenario(TEST_MEDIA.several, polarization, {
          grid: { nx: n, ny: n + 1 }, absorber: { cells }, steps: 60,
          source: { x: mid, y: mid, waveform: { kind: 'ricker', f0: 6e10, t0: 3e-11 } },
          probes: [{ name: 'centre', x: mid, y: mid }], frequencies: [2e10],
        });
        expect(differing(runOn(simd, s), runOn(scalar, s)), `${polarization} ${n} × ${n + 1}, CPML ${cells}`).toEqual([]); // common practice, no source
      }
    }
  });
});
