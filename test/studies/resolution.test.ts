import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { engineMemoryBytes } from '../../src/scenario/memory.ts';
import { phaseErrorPerWavelengthDeg } from '../../src/exact/dispersion.ts';
import { layoutOf, timeStep, waveSpeed } from '../../src/scenario/layout.ts';
import { createNodePool } from '../../src/studies/node-pool.ts';
import { fitLine, unwrapDegrees } from '../../src/studies/phase-fit.ts';
import type { StudyPool } from '../../src/studies/pool.ts';
import {
  applyResolution, measurementScenario, MEASUREMENT, planResolutionStudy, projectEstimate, recommendResolution, resolutionList,
  runResolutionStudy, studyFrequency, type ResolutionStudyResult,
} from '../../src/studies/resolution-study.ts';
import { makeScenario } from '../fixtures/scenarios.ts';

// A user scenario of square 1 mm cells, S = 0.5, vacuum, analysed up to 10 GHz.
const user = makeScenario({ frequencies: [5e9, 1e10], grid: { nx: 301, ny: 301 } });
const CELLS = [10, 14, 20, 28, 30, 32, 34, 36, 40];

describe('resolution study: measured phase lag against the dispersion relation', () => {
  let pool: StudyPool;
  let study: ResolutionStudyResult;

  beforeAll(async () => {
    pool = createNodePool(2);
    study = await runResolutionStudy(planResolutionStudy(user, { size_wavelengths: 12, budget_deg: 5, cellsPerWavelength: CELLS }), pool);
    for (const c of study.candidates) {
      console.log(`${String(c.cellsPerWavelength).padStart(3)} cells/λ: x ${c.x_deg_per_wavelength.toFixed(4)}, y ${c.y_deg_per_wavelength.toFixed(4)}, ` +
        `axis predicted ${c.predicted_axis_deg_per_wavelength.toFixed(4)}; diagonal ${c.diagonal_deg_per_wavelength.toFixed(4)}, ` +
        `predicted ${c.predicted_diagonal_deg_per_wavelength.toFixed(4)} °/λ; over 12 λ ${c.projected_error_deg.toFixed(2)}°; fit residual ${c.fit_residual_deg.toFixed(4)}°`);
    }
    console.log(`recommended ${study.recommended?.cellsPerWavelength} cells/λ, ${study.mcells_per_second.toFixed(0)} Mcells/s`);
  }, 120_000);
  afterAll(() => pool?.dispose());

  it('agrees with the Yee dispersion relation within 10 % from 10 to 40 cells per wavelength', () => {
    // 2D Yee dispersion relation (Taflove & Hagness, Computational Electrodynamics, ch. 4)
    expect(study.complete).toBe(true);
    for (const c of study.candidates) {
      expect(Math.abs(c.axis_deg_per_wavelength / c.predicted_axis_deg_per_wavelength - 1)).toBeLessThan(0.1);
      expect(Math.abs(c.diagonal_deg_per_wavelength / c.predicted_diagonal_deg_per_wavelength - 1)).toBeLessThan(0.1);
    }
  });

  it('on square cells the x and y lines agree and the diagonal lags less than the axis at S = 0.5', () => {
    // symmetry of the square Yee grid; axis is the worst direction below the 2D limit (Taflove & Hagness ch. 4)
    for (const c of study.candidates) {
      expect(Math.abs(c.x_deg_per_wavelength / c.y_deg_per_wavelength - 1)).toBeLessThan(1e-3);
      expect(c.diagonal_deg_per_wavelength).toBeLessThan(c.axis_deg_per_wavelength);
    }
  });

  it('halving the cell roughly quarters the lag (second-order scheme)', () => {
    // the Yee scheme is second-order accurate (Taflove & Hagness ch. 4)
    const at = (n: number) => study.candidates.find((c) => c.cellsPerWavelength === n)!;
    const ratio = at(20).axis_deg_per_wavelength / at(40).axis_deg_per_wavelength;
    expect(ratio).toBeGreaterThan(3.8);
    expect(ratio).toBeLessThan(4.2);
  });

  it('recommends the coarsest resolution that keeps 12 wavelengths within 5°', () => {
    // the study's own rule (issue text), cross-checked with the dispersion relation's own coarsest choice
    const rec = study.recommended;
    expect(rec).not.toBeNull();
    expect(rec!.projected_error_deg).toBeLessThanOrEqual(5);
    for (const c of study.candidates) if (c.cellsPerWavelength < rec!.cellsPerWavelength) expect(c.projected_error_deg).toBeGreaterThan(5);
    const predictedChoice = study.candidates.find((c) => 12 * Math.max(c.predicted_axis_deg_per_wavelength, c.predicted_diagonal_deg_per_wavelength) <= 5);
    expect(rec!.cellsPerWavelength).toBe(predictedChoice?.cellsPerWavelength);
    expect(rec!.cellsPerWavelength).toBe(34);
  });

  it('reports the memory and time of the 12-wavelength project grid at the recommendation', () => {
    // engine memory estimate of the same sizes (src/scenario/memory.ts); common practice, no source
    const rec = study.recommended!;
    const side = 12 * 34 + 1 + 2 * user.absorber.cells;
    expect([rec.project.nx, rec.project.ny]).toEqual([side, side]);
    expect(rec.project.memory_bytes).toBe(engineMemoryBytes({ nx: side, ny: side, cells: 10, steps: rec.project.steps, probes: 0, dftPoints: 0, frequencies: 0, fullGridDft: false }));
    expect(rec.project.seconds).toBeCloseTo((side * side * rec.project.steps) / (study.mcells_per_second * 1e6), 9);
    expect(study.mcells_per_second).toBeGreaterThan(10);
  });
});

describe('resolution study on cells twice as tall as wide', () => {
  it('measures x and y separately and still matches the dispersion relation within 10 %', async () => {
    // anisotropic Yee dispersion (Taflove & Hagness ch. 4): with dy = 2dx the y direction
    // has half the cells per wavelength and lags about four times more
    const tall = makeScenario({ frequencies: [1e10], grid: { nx: 301, ny: 151, dx: 1e-3, dy: 2e-3, courant: 0.5 } });
    const pool = createNodePool(2);
    try {
      const r = await runResolutionStudy(planResolutionStudy(tall, { size_wavelengths: 4, budget_deg: 10, cellsPerWavelength: [20, 30] }), pool);
      for (const c of r.candidates) {
        const { dx_m: dx, dy_m: dy } = c;
        const dt = timeStep(0.5, dx, dy, 1);
        const c0 = waveSpeed(1);
        const px = phaseErrorPerWavelengthDeg(1e10, 0, dx, dy, dt, c0);
        const py = phaseErrorPerWavelengthDeg(1e10, Math.PI / 2, dx, dy, dt, c0);
        console.log(`dy = 2dx, ${c.cellsPerWavelength} cells/λ along x: x ${c.x_deg_per_wavelength.toFixed(4)} (predicted ${px.toFixed(4)}), y ${c.y_deg_per_wavelength.toFixed(4)} (predicted ${py.toFixed(4)}), diagonal ${c.diagonal_deg_per_wavelength.toFixed(4)} (predicted ${c.predicted_diagonal_deg_per_wavelength.toFixed(4)})`);
        expect(dy).toBeCloseTo(2 * dx, 15);
        expect(Math.abs(c.x_deg_per_wavelength / px - 1)).toBeLessThan(0.1);
        expect(Math.abs(c.y_deg_per_wavelength / py - 1)).toBeLessThan(0.1);
        expect(Math.abs(c.diagonal_deg_per_wavelength / c.predicted_diagonal_deg_per_wavelength - 1)).toBeLessThan(0.1);
        expect(c.axis_deg_per_wavelength).toBe(c.y_deg_per_wavelength);
      }
    } finally {
      pool.dispose();
    }
  }, 60_000);
});

describe('resolution study rules', () => {
  it('measurement runs hold the Courant number and dy/dx, count cells along x at the highest frequency', () => {
    // docs/outputs.md "Study files": common practice, no source
    const s = makeScenario({ frequencies: [3e9, 1.2e10, 6e9], grid: { dx: 1e-3, dy: 1.5e-3, courant: 0.4 } });
    expect(studyFrequency(s)).toBe(1.2e10);
    const m = measurementScenario(s, 20, 1.2e10);
    expect(m.grid.courant).toBe(0.4);
    expect(m.grid.dy / m.grid.dx).toBeCloseTo(1.5, 12);
    expect(waveSpeed(1) / 1.2e10 / m.grid.dx).toBeCloseTo(20, 9);
    expect(m.absorber.cells).toBeGreaterThanOrEqual(MEASUREMENT.minimumCells);
    const layout = layoutOf(m);
    const L = m.absorber.cells;
    for (const line of layout.lines) {
      for (const n of line.nodes) {
        expect(n.i).toBeGreaterThanOrEqual(L);
        expect(n.i).toBeLessThanOrEqual(m.grid.nx - 1 - L);
        expect(n.j).toBeGreaterThanOrEqual(L);
        expect(n.j).toBeLessThanOrEqual(m.grid.ny - 1 - L);
      }
    }
    // a gaussian without analysis frequencies works at its −40 dB band edge
    const bare = makeScenario();
    expect(studyFrequency(bare)).toBeGreaterThan(0);
  });

  it('default resolutions span 8..60 and honour min/max', () => {
    // issue text: default 8..60 cells per wavelength; common practice, no source
    const all = resolutionList({});
    expect(all[0]).toBe(8);
    expect(all[all.length - 1]).toBe(60);
    expect(resolutionList({ minCells: 11, maxCells: 30 })).toEqual([11, 12, 14, 16, 18, 20, 24, 28, 30]);
  });

  it('recommendation: the coarsest within budget, null when none is', () => {
    // the study's own rule (issue text): common practice, no source
    const c = (cellsPerWavelength: number, projected_error_deg: number) => ({ cellsPerWavelength, projected_error_deg });
    const list = [c(40, 2), c(10, 30), c(30, 4.9), c(20, 9), c(36, NaN)];
    expect(recommendResolution(list, 5)).toEqual(c(30, 4.9));
    expect(recommendResolution(list, 1)).toBeNull();
    expect(recommendResolution(list, 2)).toEqual(c(40, 2)); // meeting the budget exactly counts
  });

  it('rejects a missing, zero or negative budget and size', () => {
    // common practice, no source
    expect(() => planResolutionStudy(user, { size_wavelengths: 12, budget_deg: 0 })).toThrow(/budget/);
    expect(() => planResolutionStudy(user, { size_wavelengths: -1, budget_deg: 5 })).toThrow(/size/);
    expect(() => planResolutionStudy(user, { size_wavelengths: 12, budget_deg: NaN })).toThrow(/budget/);
    expect(() => planResolutionStudy(user, { size_wavelengths: 12, budget_deg: 5, minCells: 40, maxCells: 20 })).toThrow(/min-cells/);
  });

  it('applying a resolution keeps the interior, the places in it, the Courant number and the simulated time', () => {
    // the study's own contract (issue text: apply the recommendation); common practice, no source
    const s = makeScenario({
      grid: { nx: 121, ny: 81, dx: 1e-3, dy: 2e-3, courant: 0.5 }, steps: 600, frequencies: [1e10],
      source: { x: 0.05, y: 0.08 }, probes: [{ name: 'p', x: 0.09, y: 0.1 }], lines: [{ name: 'l', x0: 0.06, y0: 0.08, x1: 0.1, y1: 0.08 }],
    });
    const t = applyResolution(s, 60, 1e10);
    const L = s.absorber.cells;
    expect(waveSpeed(1) / 1e10 / t.grid.dx).toBeCloseTo(60, 9);
    expect(t.grid.dy / t.grid.dx).toBeCloseTo(2, 12);
    expect(t.grid.courant).toBe(0.5);
    expect(t.absorber.cells).toBe(L);
    const span = (n: number, d: number) => (n - 1 - 2 * L) * d;
    expect(span(t.grid.nx, t.grid.dx)).toBeGreaterThanOrEqual(span(s.grid.nx, s.grid.dx) - 1e-12);
    expect(span(t.grid.nx, t.grid.dx) - span(s.grid.nx, s.grid.dx)).toBeLessThan(t.grid.dx);
    expect(t.source.x - L * t.grid.dx).toBeCloseTo(s.source.x - L * s.grid.dx, 12);
    expect(t.probes[0].y - L * t.grid.dy).toBeCloseTo(s.probes[0].y - L * s.grid.dy, 12);
    const duration = (x: typeof s) => x.steps * timeStep(x.grid.courant, x.grid.dx, x.grid.dy, 1);
    expect(duration(t)).toBeGreaterThanOrEqual(duration(s) - 1e-18);
    expect(duration(t) - duration(s)).toBeLessThan(timeStep(0.5, t.grid.dx, t.grid.dy, 1));
  });

  it('project estimate scales with the square of the size in cells', () => {
    // 2D grid memory ∝ cells (common practice, no source)
    const a = projectEstimate(10, 20, 1, 0.5, 0, 100);
    const b = projectEstimate(20, 20, 1, 0.5, 0, 100);
    expect(a.nx).toBe(201);
    expect(b.nx).toBe(401);
    expect(b.memory_bytes / a.memory_bytes).toBeGreaterThan(3.5);
  });

  it('phase fit: unwrapping and least squares', () => {
    // least-squares line: normal equations (any statistics handbook); unwrap: common practice
    expect(Array.from(unwrapDegrees([170, -175, -160, 175]))).toEqual([170, 185, 200, 175]);
    expect(Array.from(unwrapDegrees([-170, 170, NaN, 150]))).toEqual([-170, -190, NaN, -210]);
    const fit = fitLine([0, 1, 2, 3], [1, 3, 5, 7]);
    expect(fit.slope).toBeCloseTo(2, 14);
    expect(fit.intercept).toBeCloseTo(1, 14);
    expect(fit.residualRms).toBeCloseTo(0, 14);
    expect(Number.isNaN(fitLine([1, 1], [2, 3]).slope)).toBe(true);
    expect(Number.isNaN(fitLine([1], [2]).slope)).toBe(true);
  });
});
