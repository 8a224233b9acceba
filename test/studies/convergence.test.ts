/**
 * The convergence study (README "Convergence study") on free space, where the exact field is
 * known: the Yee scheme is second order (Taflove & Hagness, Computational Electrodynamics,
 * ch. 4), so the observed order of the phase far from the source must be near 2, and the GCI
 * of the finest grid should bound the true error (Roache 1998: the safety factor 1.25 is set
 * so that it does in most cases).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoScenario } from '../../src/scenario/defaults.ts';
import { convergenceStudy, planConvergenceStudy, refineScenario, type ConvergenceResult } from '../../src/studies/convergence-study.ts';
import { createNodePool } from '../../src/studies/node-pool.ts';
import type { StudyPool } from '../../src/studies/pool.ts';
import { runStudy } from '../../src/studies/run-study.ts';
import { layoutOf } from '../../src/scenario/layout.ts';

describe('convergence study on the demo (free space)', () => {
  let pool: StudyPool;
  let result: ConvergenceResult;
  beforeAll(async () => {
    pool = createNodePool(2);
    result = await runStudy(convergenceStudy, planConvergenceStudy(demoScenario(), { levels: 3, ratio: 2 }), pool);
    for (const l of result.candidates) console.log(`level ${l.level} dx ${l.dx_m}: GCI ${l.worst_gci_mag_dB} dB ${l.worst_gci_phase_deg}°, true ${l.worst_true_mag_err_dB} dB ${l.worst_true_phase_err_deg}°`);
    for (const v of result.candidates[2].values) console.log(`${v.probe} ${v.f_Hz}: p_mag ${v.p_mag.toFixed(3)} p_phase ${v.p_phase.toFixed(3)}`);
  }, 240_000);
  afterAll(() => pool?.dispose());

  it('observes second order in the phase far from the source', () => {
    // far probe: 'far' and 'diagonal' sit 4-5 wavelengths out at 10 GHz
    const far = result.candidates[2].values.filter((v) => v.probe !== 'near');
    for (const v of far) {
      expect(v.p_phase).toBeGreaterThan(1.8); // Taflove & Hagness ch. 4: second-order scheme
      expect(v.p_phase).toBeLessThan(2.2);
    }
  });

  it('the finest grid\'s GCI bounds the true error in nearly every quantity', () => {
    const b = result.gciBoundsTrueError as { bounded: number; rows: number };
    console.log(`GCI bounds the true error in ${b.bounded} of ${b.rows}`);
    expect(b.rows).toBe(2 * 3 * 3);
    expect(b.bounded / b.rows).toBeGreaterThanOrEqual(0.9); // Roache 1998: Fs = 1.25 gives about 95 % coverage
  });

  it('holds the physics: each level is twice as fine, same positions, same simulated time, same Courant number', () => {
    const base = layoutOf(demoScenario());
    for (const c of planConvergenceStudy(demoScenario()).candidates) {
      const l = layoutOf(c.scenario);
      expect(l.dt * c.steps).toBeCloseTo(base.dt * 1200, 18);
      expect(c.scenario.grid.courant).toBe(0.5);
      expect(l.source.x).toBeCloseTo(base.source.x, 15);
      l.probes.forEach((p, k) => { expect(p.x).toBeCloseTo(base.probes[k].x, 15); expect(p.y).toBeCloseTo(base.probes[k].y, 15); });
      expect(c.scenario.absorber.cells * c.dx_m).toBeCloseTo(10e-3, 15);
    }
  });

  it('recommends the coarsest level meeting the budgets, and writes the documented columns', () => {
    const meeting = result.candidates.filter((l) => l.worst_gci_mag_dB <= 0.1 && l.worst_gci_phase_deg <= 1);
    expect(result.recommended?.level).toBe(Math.min(...meeting.map((l) => l.level)));
    const csv = convergenceStudy.outputs(result).find((o) => o.name === 'convergence.csv');
    expect(csv && csv.kind === 'csv' && csv.header.slice(0, 12).join(',')).toBe(
      'probe,f_Hz,level,dx_m,mag_dB,phase_deg,p_mag,p_phase,gci_mag_dB,gci_phase_deg,true_mag_err_dB,true_phase_err_deg'); // README "Convergence study" columns
  });
});

describe('convergence study refusals', () => {
  it('a non-integer ratio that moves a node is refused with the reason', () => {
    // on a 301-node grid × 1.5: the source at node 150 → 225, fine; probe 'diagonal' moved to node 171 → 256.5, not a node
    const s = demoScenario();
    s.probes[2] = { ...s.probes[2], x: 0.171 };
    expect(() => planConvergenceStudy({ ...s, grid: { ...s.grid, nx: 301, ny: 301 } }, { ratio: 1.5, levels: 2 }))
      .toThrow(/probes\[2\] sits on node 171, which is not a node of the finer grid/);
  });
  it('a non-integer ratio where everything still lands on nodes is allowed', () => {
    const s = demoScenario();
    s.probes = s.probes.slice(0, 2); // nodes 180 and 240, even
    s.steps = 1200; // × 1.5 = 1800
    const plan = planConvergenceStudy({ ...s, grid: { ...s.grid, nx: 301, ny: 301 } }, { ratio: 1.5, levels: 2 });
    expect(plan.candidates[1].scenario.grid.nx).toBe(451);
    expect(() => refineScenario(s, 1.5, 1)).toThrow(/grid.nx − 1 = 299 times 1.5 is not a whole number/);
  });
  it('a level above the memory cap is refused naming the level, before anything runs', () => {
    const s = demoScenario();
    expect(() => planConvergenceStudy({ ...s, grid: { ...s.grid, nx: 3000, ny: 3000 }, source: { ...s.source } }, { levels: 4 }))
      .toThrow(/level [23] .* above the 2.00 GiB cap; use fewer levels/);
  });
});
