import { describe, expect, it } from 'vitest';
import { PlainKernel } from '../../src/engine/plain-kernel.ts';
import { Simulation } from '../../src/engine/simulation.ts';
import { makeScenario } from '../fixtures/scenarios.ts';

// The benchmark's plain-TypeScript kernel must be the same algorithm as the engine, or its
// ratio means nothing. It stores float32 but does its arithmetic in double precision, so
// after n steps the fields may differ by accumulated float32 rounding, a few ulp of the
// largest field per step at most: 300 steps × 2^−24 ≈ 2e−5 relative (common practice, no
// source). A wrong coefficient or a missing CPML term shows up at 1e−3 or more.
describe('plain-TypeScript kernel', () => {
  for (const [nx, ny, cells] of [[64, 52, 10], [57, 45, 6], [26, 26, 10], [37, 41, 0]] as const) {
    it(`${nx} × ${ny}, CPML ${cells}: the engine's fields to float32 rounding after 300 steps`, async () => {
      const s = makeScenario({
        grid: { nx, ny }, absorber: { cells }, steps: 300,
        source: { x: (cells + 4) * 1e-3, y: (cells + 6) * 1e-3, waveform: { kind: 'ricker', f0: 4e10, t0: 5e-11 } },
      });
      const sim = await Simulation.create(s);
      const plain = PlainKernel.fromScenario(s);
      // Rounding errors made while the pulse was strong stay after it has drained away:
      // measure them against the largest field of the run, sampled early and at the end.
      const peaks = new Map<string, number>();
      const notePeaks = () => {
        for (const [name, a] of [['ez', sim.ezView()], ['hx', sim.hxView()], ['hy', sim.hyView()]] as const) {
          let m = peaks.get(name) ?? 0;
          for (const v of a) m = Math.max(m, Math.abs(v));
          peaks.set(name, m);
        }
      };
      for (const upTo of [40, 80, 300]) {
        sim.step(upTo - sim.stepsDone);
        plain.step(upTo - plain.stepsDone);
        notePeaks();
      }
      expect(plain.stepsDone).toBe(300);
      const total = nx * ny;
      for (const [name, a, b] of [
        ['ez', sim.ezView(), plain.ez], ['hx', sim.hxView(), plain.hx], ['hy', sim.hyView(), plain.hy],
      ] as const) {
        const peak = peaks.get(name) as number;
        let worst = 0;
        let nonzero = 0;
        for (let k = 0; k < total; k++) {
          worst = Math.max(worst, Math.abs(a[k] - b[k]));
          if (b[k] !== 0) nonzero++;
        }
        expect(nonzero, `${name} has been reached by the wave`).toBeGreaterThan(total / 4);
        expect(worst / peak, `${name}: largest difference relative to the peak`).toBeLessThan(2e-5);
      }
      sim.dispose();
    });
  }

  it('a kernel with a wrong coefficient is caught by the same comparison', async () => {
    const s = makeScenario({ grid: { nx: 64, ny: 52 }, steps: 300 });
    const sim = await Simulation.create(s);
    sim.step(300);
    const wrong = PlainKernel.fromScenario({ ...s, grid: { ...s.grid, courant: 0.5 * (1 + 1e-3) } });
    wrong.step(300);
    const a = sim.ezView();
    let peak = 0;
    let worst = 0;
    for (let k = 0; k < a.length; k++) {
      peak = Math.max(peak, Math.abs(a[k]));
      worst = Math.max(worst, Math.abs(a[k] - wrong.ez[k]));
    }
    expect(worst / peak).toBeGreaterThan(1e-4);
    sim.dispose();
  });
});
