/**
 * From the 2D answer to the 3D project (README "3D projection"): the feature floor and the
 * 3D projection of a resolution study, scored on made-up measured rows so the arithmetic is
 * checked by hand here (the measured lags equal the predicted ones: a measured/predicted
 * ratio of 1). Common practice, no source, unless a line says otherwise.
 */
import { describe, expect, it } from 'vitest';
import { cubicPhaseLagDeg } from '../../src/exact/dispersion3d.ts';
import { demoScenario } from '../../src/scenario/defaults.ts';
import { planResolutionStudy, resolutionStudy, type ResolutionCandidateResult } from '../../src/studies/resolution-study.ts';

function scored(projection: Record<string, unknown>) {
  const plan = planResolutionStudy(demoScenario(), { size_wavelengths: 12, budget_deg: 5, minCells: 20, maxCells: 60, projection });
  const rows = plan.candidates.map((c): ResolutionCandidateResult => ({
    cellsPerWavelength: c.cellsPerWavelength, dx_m: c.dx_m, dy_m: c.dy_m,
    axis_deg_per_wavelength: Math.max(c.predicted.x, c.predicted.y), diagonal_deg_per_wavelength: c.predicted.diagonal,
    predicted_axis_deg_per_wavelength: Math.max(c.predicted.x, c.predicted.y), predicted_diagonal_deg_per_wavelength: c.predicted.diagonal,
    x_deg_per_wavelength: c.predicted.x, y_deg_per_wavelength: c.predicted.y,
    projected_error_deg: Math.max(c.predicted.x, c.predicted.y, c.predicted.diagonal) * 12, fit_residual_deg: 0,
    seconds: 1, cellUpdates: 1e9, project: { nx: 0, ny: 0, steps: 0, memory_bytes: 0, seconds: NaN },
  }));
  return { plan, result: resolutionStudy.finish(plan, rows, { planned: rows.length, complete: true, workers: [1], seconds: 1, shared: [] }) };
}

describe('feature floor and 3D projection', () => {
  it('the thinnest feature governs when it asks for finer cells than the budget, and says so', () => {
    const { result: free } = scored({});
    const budgetCells = free.recommended?.cellsPerWavelength as number;
    // 15 GHz in vacuum: λ = 19.986 mm; a 0.2 mm gap over 4 cells asks for dx = 0.05 mm, about 400 cells per wavelength
    const { plan, result } = scored({ feature_m: 2e-4, cellsPerFeature: 4 });
    expect(result.governedBy).toBe('feature');
    expect(result.recommended?.dx_m).toBeCloseTo(5e-5, 15);
    expect(result.recommended?.cellsPerWavelength).toBeCloseTo(plan.wavelength_m / 5e-5, 9);
    expect(result.recommended?.cellsPerWavelength).toBeGreaterThan(budgetCells);
    expect(resolutionStudy.json(result)).toMatchObject({ recommended: { governed_by: 'feature' } });
    // a feature coarser than the budget's cell leaves the budget in charge
    expect(scored({ feature_m: 0.01, cellsPerFeature: 4 }).result.governedBy).toBe('dispersion');
  });

  it('projects onto a 3D grid with the hand-checked cell count and memory', () => {
    const { plan, result } = scored({ dims: 3, volume: [0.2, 0.1, 0.05], mcells3d: 300 });
    const p = result.projection3d;
    expect(p).not.toBeNull();
    if (!p) return;
    // the user's S = 0.5 is 0.5/0.7071 of the 2D limit; the same fraction of the 3D limit 1/√3
    const S3 = (0.5 / Math.SQRT1_2) / Math.sqrt(3);
    expect(p.courant).toBeCloseTo(S3, 12);
    // the coarsest whole number of cells per wavelength whose 3D axis lag × 12 λ stays within 5° (Taflove & Hagness ch. 4, from memory)
    expect(cubicPhaseLagDeg(p.cellsPerWavelength, S3, 'axis') * 12).toBeLessThanOrEqual(5);
    expect(cubicPhaseLagDeg(p.cellsPerWavelength - 1, S3, 'axis') * 12).toBeGreaterThan(5);
    // cells by hand: ⌈X/dx⌉ + 2·10 absorber cells on each axis (the scenario's 10-cell layer)
    const dx = plan.wavelength_m / p.cellsPerWavelength;
    expect(p.dx_m).toBeCloseTo(dx, 15);
    const n = (len: number) => Math.ceil(len / dx - 1e-9) + 20;
    expect([p.nx, p.ny, p.nz]).toEqual([n(0.2), n(0.1), n(0.05)]);
    expect(p.cells).toBe(p.nx * p.ny * p.nz);
    // 6 float32 fields per cell, and 4 ψ values of 4 bytes per cell in every layer (2 layers per axis of 10 cells)
    const psi = 16 * 2 * 10 * (p.ny * p.nz + p.nx * p.nz + p.nx * p.ny);
    expect(p.memory_bytes).toBe(24 * p.cells + psi);
    expect(p.seconds).toBeCloseTo((p.cells * p.steps) / 300e6, 9);
    expect(p.speed_source).toBe('given');
    expect(p.note).toMatch(/not a 3D run/);
  });

  it('without a given speed, the 3D speed is half the measured 2D speed and labelled an estimate', () => {
    const { result } = scored({ dims: 3, volume: [0.1, 0.1, 0.1] });
    expect(result.projection3d?.mcells_per_second).toBeCloseTo(1e9 / 1 / 1e6 / 2, 9); // rows: 1e9 updates in 1 s each
    expect(result.projection3d?.speed_source).toMatch(/^estimate/);
  });

  it('--dims 3 without a volume is refused with the fix', () => {
    const { problems } = resolutionStudy.readOptions({ size: '12', budget: '5', dims: '3' });
    expect(problems.join(' ')).toMatch(/volume: .*e\.g\. --volume 0\.2,0\.1,0\.05/);
  });
});
