import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { layoutOf } from '../../src/scenario/layout.ts';
import {
  absorberCandidates, applyAbsorber, DEFAULT_GRADING, planAbsorberStudy, PLAIN_GRADING, recommendAbsorber,
  runAbsorberStudy, studyProbes, type AbsorberCandidateResult, type AbsorberStudyResult,
} from '../../src/studies/absorber-study.ts';
import { theoreticalReflectionDb } from '../../src/studies/cpml-theory.ts';
import { createNodePool } from '../../src/studies/node-pool.ts';
import type { StudyPool } from '../../src/studies/pool.ts';
import { reflectionGeometry } from '../fixtures/reflection.ts';
import { makeScenario } from '../fixtures/scenarios.ts';

// The foundation issue's reference-grid geometry (test/fixtures/reflection.ts): interior
// 100 × 50 cells of 1 mm, S = 0.5, a Gaussian pulse e^−9 down at 10 cells per wavelength,
// source 5 cells from a layer, probes one cell from the layers, the far corner included.
const STEPS = 2000;
const SIGMA_SCALES = [0.25, 0.5, 0.75, 1, 1.25, 1.5, 2];

describe('absorber study in the reference-grid geometry', () => {
  let pool: StudyPool;
  let study: AbsorberStudyResult;
  const find = (cells: number, order: number, sigmaScale: number, kappaMax: number, alphaMax: number): AbsorberCandidateResult => {
    const c = study.candidates.find((x) => x.cells === cells && x.order === order && x.sigmaScale === sigmaScale && x.kappaMax === kappaMax && x.alphaMax === alphaMax);
    if (!c) throw new Error(`no candidate ${cells}/${order}/${sigmaScale}/${kappaMax}/${alphaMax}`);
    return c;
  };

  beforeAll(async () => {
    pool = createNodePool(2);
    const user = reflectionGeometry({ cells: 10 }, STEPS, false);
    // this geometry's figures are the user's probes' (the study's worst case is tested in absorber-worst.test.ts)
    const plan = planAbsorberStudy(user, {
      basis: 'probes',
      longFactor: 0,
      target_dB: -80,
      cells: [4, 6, 8, 10, 12, 16, 20],
      sweepGradings: [DEFAULT_GRADING, PLAIN_GRADING],
      gradingCells: [6, 10],
      orders: [2, 3, 4, 5],
      sigmaScales: SIGMA_SCALES,
      kappaMaxes: [1, 5, 10],
      alphaMaxes: [0, 0.05, 0.2],
    });
    study = await runAbsorberStudy(plan, pool);
    // every figure, for the closing note
    for (const c of study.candidates) {
      console.log(`${c.key.padEnd(18)} ${c.reflection_dB.toFixed(1).padStart(7)} dB (theory ${c.theory_dB.toFixed(1)}) ` +
        Object.entries(c.per_probe_dB).map(([name, v]) => `${name} ${v.toFixed(1)}`).join(', '));
    }
  }, 120_000);
  afterAll(() => pool?.dispose());

  it('finishes every candidate on more than one worker', () => {
    expect(study.complete).toBe(true);
    expect(study.candidates.length).toBe(study.planned);
    expect(study.workers.length).toBeGreaterThan(1); // common practice, no source
    expect(study.candidates.every((c) => Number.isFinite(c.reflection_dB))).toBe(true);
  });

  it('uses the same reference grid as the engine test fixture', () => {
    // reference-grid method (Taflove & Hagness ch. 7): one enlarged grid, same cells and window
    const reference = reflectionGeometry({ cells: 10 }, STEPS, true);
    expect(study.reference.nx).toBe(reference.grid.nx);
    expect(study.reference.ny).toBe(reference.grid.ny);
  });

  it('measured reflection falls as the layer grows, for both swept gradings', () => {
    // thicker graded layers reflect less (Taflove & Hagness ch. 7; Berenger 1994)
    for (const g of [DEFAULT_GRADING, PLAIN_GRADING]) {
      const curve = [4, 6, 8, 10, 12, 16, 20].map((cells) => find(cells, g.order, g.sigmaScale, g.kappaMax, g.alphaMax).reflection_dB);
      console.log(`m ${g.order}, κmax ${g.kappaMax}, αmax ${g.alphaMax}: ${curve.map((v) => v.toFixed(1)).join(', ')} dB for 4..20 cells`);
      for (let k = 1; k < curve.length; k++) expect(curve[k]).toBeLessThan(curve[k - 1]);
      expect(curve[curve.length - 1] - curve[0]).toBeLessThan(-40);
    }
  });

  it('is lowest near sigmaScale 1 (σopt) for m = 3 and 4', () => {
    // σopt = 0.8(m+1)/(ηΔ) minimises reflection for polynomial grading
    // (Taflove & Hagness ch. 7, eq. for σopt; Gedney's CPML chapter)
    for (const cells of [6, 10]) {
      for (const m of [3, 4]) {
        const curve = SIGMA_SCALES.map((s) => find(cells, m, s, DEFAULT_GRADING.kappaMax, DEFAULT_GRADING.alphaMax).reflection_dB);
        const best = SIGMA_SCALES[curve.indexOf(Math.min(...curve))];
        console.log(`${cells} cells, m ${m}: ${curve.map((v, k) => `${SIGMA_SCALES[k]}→${v.toFixed(1)}`).join(', ')}; lowest at ${best}`);
        expect(best).toBeGreaterThanOrEqual(0.75);
        expect(best).toBeLessThanOrEqual(1.25);
        expect(Math.min(...curve)).toBeLessThan(curve[0] - 20); // far below the weak layer
        expect(Math.min(...curve)).toBeLessThan(curve[curve.length - 1]); // and below the over-lossy one
      }
    }
  });

  it('a 10-cell CPML, m 3, sigmaScale 1, kappaMax 5, alphaMax 0.05 reaches −80 dB or better', () => {
    // about −80 dB for a 10-cell CPML is the published figure (Taflove & Hagness ch. 7, from memory)
    const c = find(10, 3, 1, 5, 0.05);
    expect(c.reflection_dB).toBeLessThanOrEqual(-80);
  });

  it('κ > 1 with α > 0 beats κ = 1, α = 0 at the grazing corner probe', () => {
    // the complex-frequency-shifted stretch absorbs grazing and evanescent waves better
    // (Roden & Gedney 2000; Taflove & Hagness ch. 7)
    for (const cells of [4, 6, 8, 10, 12, 16, 20]) {
      const cfs = find(cells, 3, 1, 5, 0.05).per_probe_dB.corner;
      const plain = find(cells, 3, 1, 1, 0).per_probe_dB.corner;
      console.log(`${cells} cells, corner probe: κ5 α0.05 ${cfs.toFixed(1)} dB vs κ1 α0 ${plain.toFixed(1)} dB`);
      expect(cfs).toBeLessThan(plain);
    }
    expect(find(10, 3, 1, 5, 0.05).per_probe_dB.corner).toBeLessThan(find(10, 3, 1, 1, 0).per_probe_dB.corner - 15);
  });

  it('recommends the fewest cells meeting the target, with the theory beside each figure', () => {
    // the study's own rule (issue text), checked against the table: common practice, no source
    const meeting = study.candidates.filter((c) => c.reflection_dB <= -80);
    const fewest = Math.min(...meeting.map((c) => c.cells));
    expect(study.recommended?.cells).toBe(fewest);
    expect(study.recommended?.reflection_dB).toBe(Math.min(...meeting.filter((c) => c.cells === fewest).map((c) => c.reflection_dB)));
    expect(study.current?.key).toBe('10/3/1/5/0.05');
    for (const c of study.candidates) {
      expect(c.theory_dB).toBeCloseTo(theoreticalReflectionDb(c, 1e-3, 1), 12);
    }
  });

  it('keeps the interior: the grid changes by the change in cells and nodes shift with it', () => {
    // the study's own contract (issue text): common practice, no source
    const user = reflectionGeometry({ cells: 10 }, STEPS, false);
    const base = layoutOf(user);
    for (const c of study.candidates) {
      expect(c.nx).toBe(user.grid.nx + 2 * (c.cells - 10));
      expect(c.ny).toBe(user.grid.ny + 2 * (c.cells - 10));
    }
    const grown = layoutOf(applyAbsorber(user, { ...user.absorber, cells: 16 }));
    expect(grown.source.i - base.source.i).toBe(6);
    expect(grown.probes.map((p) => [p.i - 16, p.j - 16])).toEqual(base.probes.map((p) => [p.i - 10, p.j - 10]));
  });

  it('error against time is kept for the recommended and current settings', () => {
    expect(study.recommended?.errorSeries.length).toBe(STEPS + 1);
    const peak = Math.max(...(study.current as AbsorberCandidateResult).errorSeries);
    expect(20 * Math.log10(peak)).toBeCloseTo((study.current as AbsorberCandidateResult).reflection_dB, 4);
  });
});

describe('absorber study rules', () => {
  it('theoretical normal-incidence reflection is exp(−1.6·sigmaScale·cells) whatever Δ and εr', () => {
    // R(0) = exp(−2σmax·d/((m+1)εc)) with σmax = σopt (Taflove & Hagness ch. 7; Berenger 1994)
    const a = { cells: 10, order: 3, sigmaScale: 1, kappaMax: 5, alphaMax: 0.05 };
    const closed = (20 / Math.LN10) * -1.6 * 10;
    expect(theoreticalReflectionDb(a, 1e-3, 1)).toBeCloseTo(closed, 9);
    expect(theoreticalReflectionDb(a, 0.37e-3, 4)).toBeCloseTo(closed, 9);
    expect(theoreticalReflectionDb({ ...a, order: 5, sigmaScale: 0.5 }, 1e-3, 1)).toBeCloseTo(closed / 2, 9);
    expect(theoreticalReflectionDb({ ...a, cells: 0 }, 1e-3, 1)).toBe(0);
  });

  it('recommendation: fewest cells, then the larger margin; null when nothing meets the target', () => {
    // the study's own rule (issue text): common practice, no source
    const c = (cells: number, reflection_dB: number) => ({ cells, order: 3, sigmaScale: 1, kappaMax: 5, alphaMax: 0.05, reflection_dB });
    const list = [c(12, -90), c(8, -61), c(8, -65), c(6, -59), c(4, NaN)];
    expect(recommendAbsorber(list, -60)).toEqual(c(8, -65));
    expect(recommendAbsorber(list, -95)).toBeNull();
    expect(recommendAbsorber([], -60)).toBeNull();
    expect(recommendAbsorber([c(6, -60)], -60)).toEqual(c(6, -60)); // meeting the target exactly counts
  });

  it('the default grid stays small and includes the user setting once', () => {
    // design note: well under a minute on 2 cores; common practice, no source
    const s = makeScenario();
    const all = absorberCandidates(s.absorber);
    expect(new Set(all.map((a) => JSON.stringify(a))).size).toBe(all.length);
    expect(all.length).toBeLessThan(60);
    expect(all.filter((a) => a.cells === 10 && a.kappaMax === 5 && a.alphaMax === 0.05 && a.order === 3 && a.sigmaScale === 1)).toHaveLength(1);
    const odd = absorberCandidates({ cells: 7, order: 2.5, sigmaScale: 0.8, kappaMax: 3, alphaMax: 0.01 });
    expect(odd.some((a) => a.cells === 7 && a.order === 2.5)).toBe(true);
    expect(odd.filter((a) => a.order === 2.5).length).toBe(9); // the user's grading swept over 8 thicknesses plus its own 7
  });

  it('places probes near the layers when the scenario has none', () => {
    // common practice, no source: probe where the reflection is strongest
    const s = makeScenario({ grid: { nx: 61, ny: 41 }, source: { x: 0.02, y: 0.02 } });
    const probes = studyProbes(s);
    expect(probes.map((p) => p.name)).toEqual(['left', 'right', 'bottom', 'top', 'corner']);
    expect(probes.every((p) => p.added)).toBe(true);
    const layout = layoutOf({ ...s, probes });
    const L = s.absorber.cells;
    for (const p of layout.probes) {
      const nearest = Math.min(p.i - L, s.grid.nx - 1 - L - p.i, p.j - L, s.grid.ny - 1 - L - p.j);
      expect(nearest).toBe(1);
    }
    const corner = layout.probes[4];
    expect([corner.i, corner.j]).toEqual([s.grid.nx - 2 - L, s.grid.ny - 2 - L]); // far from the source at (20, 20)
  });

  it('rejects bad options with messages naming them', () => {
    // common practice, no source
    const s = makeScenario();
    expect(() => planAbsorberStudy(s, { target_dB: 3 })).toThrow(/target/);
    expect(() => planAbsorberStudy(s, { cells: [4, 2.5] })).toThrow(/cells: 2.5/);
    expect(() => planAbsorberStudy(s, { kappaMaxes: [0.5] })).toThrow(/kappaMaxes/);
    expect(() => planAbsorberStudy(s, { sigmaScales: [NaN] })).toThrow(/sigmaScales/);
  });

  it('refuses a reference grid above the memory cap, naming steps', () => {
    // docs/outputs.md: memory is estimated first and capped; common practice, no source
    const long = makeScenario({ steps: 40_000 });
    expect(() => planAbsorberStudy(long)).toThrow(/^steps: .* cap; study fewer steps/);
    expect(() => planAbsorberStudy(long, { steps: 2000 })).not.toThrow();
  });
});
