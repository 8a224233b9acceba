import { describe, expect, it } from 'vitest';
import { MediaPlainKernel } from '../../src/engine/media-plain-kernel.ts';
import { MediaSimulation, mediaTables } from '../../src/engine/media-simulation.ts';
import { mediaScenario, patchedMap, pecMap, TEST_MEDIA } from '../fixtures/media.ts';

// The plain-TypeScript kernel rounds every operation to float32 (Math.fround) in the
// engine's order, so its fields must equal the engine's bit for bit: IEEE 754 single
// precision add, subtract and multiply are correctly rounded, and double arithmetic
// followed by rounding to single gives the correctly rounded single result for each of
// them (common practice, no source). Any difference in formula, order or coefficient shows.
describe('media engine against the plain-TypeScript kernel of the same scheme', () => {
  const scenarioFor = (medium: string, polarization: 'TMz' | 'TEz', nx: number, ny: number, cells: number) =>
    mediaScenario(TEST_MEDIA[medium], polarization, {
      grid: { nx, ny }, absorber: { cells }, steps: 250,
      source: { x: (cells + 4) * 1e-3, y: (cells + 6) * 1e-3, waveform: { kind: 'ricker', f0: 4e10, t0: 5e-11 } },
    });

  function compare(sim: MediaSimulation, plain: MediaPlainKernel): { differing: number; nonzero: number } {
    let differing = 0;
    let nonzero = 0;
    const total = plain.nx * plain.ny;
    for (const [x, y] of [[sim.ezView(), plain.a], [sim.hxView(), plain.b], [sim.hyView(), plain.c]] as const) {
      for (let k = 0; k < total; k++) {
        if (!Object.is(x[k], y[k])) differing++;
        if (x[k] !== 0) nonzero++;
      }
    }
    return { differing, nonzero };
  }

  for (const polarization of ['TMz', 'TEz'] as const) {
    for (const medium of Object.keys(TEST_MEDIA)) {
      it(`${polarization}, ${medium}, without patches, with patches of every kind and with PEC only: a, b and c bit for bit after 250 steps`, async () => {
        const shapes = [[64, 52, 10, undefined], [57, 45, 6, patchedMap], [37, 41, 0, patchedMap], [61, 52, 10, pecMap]] as const;
        for (const [nx, ny, cells, make] of shapes) {
          const patched = make !== undefined;
          const s = scenarioFor(medium, polarization, nx, ny, cells);
          const map = make ? make(polarization, TEST_MEDIA[medium], nx, 15, 15) : undefined;
          const sim = await MediaSimulation.create(s, {}, map);
          const plain = MediaPlainKernel.fromScenario(s, map);
          // Two batches of uneven length: the engine's batch boundary must not matter.
          sim.step(113);
          plain.step(113);
          sim.step(250 - 113);
          plain.step(250 - 113);
          expect(plain.stepsDone).toBe(250); // common practice, no source
          const { differing, nonzero } = compare(sim, plain);
          expect(nonzero, 'the wave has filled the grid').toBeGreaterThan(nx * ny); // common practice, no source
          expect(differing, `${nx} × ${ny}, CPML ${cells}${patched ? ', patched' : ''}`).toBe(0); // common practice, no source
          expect(plain.maxAbsA()).toBe(sim.maxAbsEz()); // common practice, no source
          sim.dispose();
        }
      });
    }
  }

  it('a kernel with one pole constant off by one part in a million is caught by the same comparison', async () => {
    const s = scenarioFor('debye', 'TMz', 64, 52, 10);
    const sim = await MediaSimulation.create(s);
    sim.step(250);
    const tables = mediaTables(s);
    tables.poles[0] = { ...tables.poles[0], k1: tables.poles[0].k1 * (1 + 1e-6) };
    const wrong = new MediaPlainKernel(tables);
    wrong.step(250);
    expect(compare(sim, wrong).differing).toBeGreaterThan(100); // common practice, no source
    sim.dispose();
  });
});
