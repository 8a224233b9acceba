import { describe, expect, it } from 'vitest';
import { PlainKernel } from '../../src/engine/plain-kernel.ts';
import { Simulation } from '../../src/engine/simulation.ts';
import { makeScenario } from '../fixtures/scenarios.ts';

// The benchmark's plain-TypeScript kernel must be the same algorithm as the engine, or its
// ratio means nothing: every intermediate is rounded to float32, so the fields must match
// the engine's bit for bit (common practice, no source).
describe('plain-TypeScript kernel', () => {
  for (const [nx, ny, cells] of [[64, 52, 10], [57, 45, 6], [26, 26, 10], [37, 41, 0]] as const) {
    it(`${nx} × ${ny}, CPML ${cells}: the same fields as the engine after 300 steps`, async () => {
      const s = makeScenario({
        grid: { nx, ny }, absorber: { cells }, steps: 300,
        source: { x: (cells + 4) * 1e-3, y: (cells + 6) * 1e-3, waveform: { kind: 'ricker', f0: 4e10, t0: 5e-11 } },
      });
      const sim = await Simulation.create(s);
      sim.step(300);
      const plain = PlainKernel.fromScenario(s);
      plain.step(300);
      expect(plain.stepsDone).toBe(300);
      const cellsTotal = nx * ny;
      for (const [name, a, b] of [
        ['ez', sim.ezView(), plain.ez], ['hx', sim.hxView(), plain.hx], ['hy', sim.hyView(), plain.hy],
      ] as const) {
        const wa = new Uint32Array(a.slice(0, cellsTotal).buffer);
        const wb = new Uint32Array(b.slice(0, cellsTotal).buffer);
        let differing = 0;
        for (let k = 0; k < cellsTotal; k++) if (wa[k] !== wb[k]) differing++;
        expect(differing, `${name}: ${differing} nodes differ`).toBe(0);
      }
      let nonzero = 0;
      for (const v of plain.ez) if (v !== 0) nonzero++;
      expect(nonzero).toBeGreaterThan(cellsTotal / 4);
      sim.dispose();
    });
  }
});
