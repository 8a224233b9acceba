import { describe, expect, it } from 'vitest';
import {
  cubicPhaseLagDeg,
  numericalWavenumber3d,
  phaseLagPerWavelength3dDeg,
  project3d,
  stabilityLimit3d,
  type Projection3dInput,
} from '../../src/exact/dispersion3d.ts';
import { numericalWavenumber } from '../../src/exact/dispersion.ts';

const c = 299792458;
const d = 1e-3;
const DIAGONAL_THETA = Math.acos(1 / Math.sqrt(3));

describe('3D Yee dispersion relation', () => {
  it('reduces to the 1D relation sin(k̃Δ/2) = (Δ/(c·dt))·sin(ω·dt/2) along each axis', () => {
    const [dx, dy, dz] = [1e-3, 1.7e-3, 2.3e-3];
    const dt = (0.4 * dx) / c;
    const axes: [number, number, number][] = [[Math.PI / 2, 0, dx], [Math.PI / 2, Math.PI / 2, dy], [0, 0, dz]];
    for (const [theta, phi, delta] of axes) {
      for (const cells of [4, 10, 20, 100]) {
        const f = c / (cells * delta);
        const oneD = (2 / delta) * Math.asin((delta / (c * dt)) * Math.sin(Math.PI * f * dt));
        const kt = numericalWavenumber3d(f, theta, phi, dx, dy, dz, dt, c);
        expect(Math.abs(kt / oneD - 1)).toBeLessThan(1e-14); // Taflove & Hagness ch. 4, from memory
      }
    }
  });

  it('agrees with the 2D relation for directions in the xy plane (θ = π/2)', () => {
    const dt = (0.5 * d) / c;
    for (const phi of [0.1, 0.5, Math.PI / 4, 1.3]) {
      const f = c / (12 * d);
      const k2 = numericalWavenumber(f, phi, d, 1.5 * d, dt, c);
      const k3 = numericalWavenumber3d(f, Math.PI / 2, phi, d, 1.5 * d, 9 * d, dt, c);
      expect(Math.abs(k3 / k2 - 1)).toBeLessThan(1e-13); // src/exact/dispersion.ts: no z term when k̃z = 0 (cos(π/2) ≈ 6e-17)
    }
  });

  it('is exact along the body diagonal of cubic cells at the magic time step S = 1/√3', () => {
    const dt = d / (Math.sqrt(3) * c);
    for (const cells of [3, 5, 10, 20, 200]) {
      const f = c / (cells * d);
      const k = (2 * Math.PI * f) / c;
      for (const phi of [Math.PI / 4, (3 * Math.PI) / 4, -Math.PI / 4]) {
        const kt = numericalWavenumber3d(f, DIAGONAL_THETA, phi, d, d, d, dt, c);
        expect(Math.abs(kt / k - 1)).toBeLessThan(1e-14); // Taflove & Hagness ch. 4: magic time step along the diagonal, from memory
      }
      expect(Math.abs(cubicPhaseLagDeg(cells, 1 / Math.sqrt(3), 'diagonal'))).toBeLessThan(1e-11); // Taflove & Hagness ch. 4: magic time step along the diagonal, from memory
      expect(cubicPhaseLagDeg(cells, 1 / Math.sqrt(3), 'axis')).toBeGreaterThan(0); // the axis still lags (1D relation at S < 1)
    }
  });

  it('lags most along an axis: a sweep of directions over the octant never exceeds the axis lag', () => {
    for (const courant of [0.1, 0.3, 0.5, 0.57]) {
      for (const cells of [5, 10, 20, 40]) {
        const axis = cubicPhaseLagDeg(cells, courant, 'axis');
        const diagonal = cubicPhaseLagDeg(cells, courant, 'diagonal');
        let worst = Number.NEGATIVE_INFINITY;
        let best = Number.POSITIVE_INFINITY;
        for (let i = 0; i <= 24; i++) {
          for (let j = 0; j <= 24; j++) {
            const lag = phaseLagPerWavelength3dDeg(1 / cells, (i * Math.PI) / 48, (j * Math.PI) / 48, 1, 1, 1, courant, 1);
            worst = Math.max(worst, lag);
            best = Math.min(best, lag);
          }
        }
        expect(worst).toBeLessThanOrEqual(axis * (1 + 1e-12)); // numerical check of the anisotropy (Taflove & Hagness ch. 4, from memory)
        expect(worst).toBeGreaterThanOrEqual(axis * (1 - 1e-12)); // the sweep includes the axis
        expect(best).toBeGreaterThanOrEqual(diagonal * (1 - 1e-9) - 1e-12); // the body diagonal lags least (Taflove & Hagness ch. 4, from memory)
        expect(diagonal).toBeLessThan(axis);
      }
    }
  });

  it('has the leading error −(kΔ)²(1 − S²)/24 of ṽp/c − 1 along an axis', () => {
    const courant = 0.5;
    const cells = 1000;
    const kd = (2 * Math.PI) / cells;
    const lagFraction = cubicPhaseLagDeg(cells, courant, 'axis') / 360; // k̃/k − 1 = −(ṽp/c − 1) to first order
    expect(Math.abs(lagFraction / ((kd * kd * (1 - courant * courant)) / 24) - 1)).toBeLessThan(1e-4); // Taflove & Hagness ch. 4, small-kΔ expansion, from memory
  });

  it('gives the stability limit 1/√3 for cubes and 1/(Δmin·√Σ1/Δ²) otherwise', () => {
    expect(stabilityLimit3d(d, d, d)).toBeCloseTo(1 / Math.sqrt(3), 15); // Taflove & Hagness ch. 4, from memory
    // dx = 1, dy = 2, dz = 4 mm: 1/(1·√(1 + 1/4 + 1/16)) = 1/√1.3125 = 0.872871560943970
    expect(stabilityLimit3d(1e-3, 2e-3, 4e-3)).toBeCloseTo(0.872871560943970, 14); // Taflove & Hagness ch. 4, from memory; hand arithmetic
    expect(stabilityLimit3d(4e-3, 1e-3, 2e-3)).toBe(stabilityLimit3d(1e-3, 2e-3, 4e-3));
  });

  it('returns NaN above the cutoff and rejects bad arguments by name', () => {
    const dt = (0.5 * d) / c;
    const cutoff = Math.asin(0.5) / (Math.PI * dt); // along an axis (1D relation)
    expect(numericalWavenumber3d(1.01 * cutoff, 0, 0, d, d, d, dt, c)).toBeNaN();
    expect(numericalWavenumber3d(0.99 * cutoff, 0, 0, d, d, d, dt, c) * d).toBeGreaterThan(2.5);
    expect(numericalWavenumber3d(0.6 / dt, DIAGONAL_THETA, Math.PI / 4, d, d, d, dt, c)).toBeNaN(); // above 1/(2·dt)
    expect(numericalWavenumber3d(0, 0.3, 0.2, d, d, d, dt, c)).toBe(0);
    expect(phaseLagPerWavelength3dDeg(0, 0.3, 0.2, d, d, d, dt, c)).toBe(0);
    for (const bad of [0, -1, Number.NaN, Number.POSITIVE_INFINITY]) {
      expect(() => numericalWavenumber3d(1e10, 0, 0, bad, d, d, dt, c)).toThrow(/dx/);
      expect(() => numericalWavenumber3d(1e10, 0, 0, d, bad, d, dt, c)).toThrow(/dy/);
      expect(() => numericalWavenumber3d(1e10, 0, 0, d, d, bad, dt, c)).toThrow(/dz/);
      expect(() => numericalWavenumber3d(1e10, 0, 0, d, d, d, bad, c)).toThrow(/dt/);
      expect(() => numericalWavenumber3d(1e10, 0, 0, d, d, d, dt, bad)).toThrow(/c must/);
      expect(() => stabilityLimit3d(d, d, bad)).toThrow(/dz/);
      expect(() => cubicPhaseLagDeg(bad, 0.5, 'axis')).toThrow(/cellsPerWavelength/);
    }
    expect(() => numericalWavenumber3d(-1, 0, 0, d, d, d, dt, c)).toThrow(/f must/);
    expect(() => numericalWavenumber3d(1e10, Number.NaN, 0, d, d, d, dt, c)).toThrow(/theta/);
    expect(() => numericalWavenumber3d(1e10, 0, Number.NaN, d, d, d, dt, c)).toThrow(/phi/);
  });
});

describe('projection of a resolution choice onto a 3D run', () => {
  const S = 0.99 / Math.sqrt(3);
  /** Axis lag per wavelength from the 1D closed form, independent of the Newton solver. */
  const axisLag = (cells: number) => 360 * ((Math.asin(Math.sin((Math.PI * S) / cells) / S) * cells) / Math.PI - 1);
  const base: Projection3dInput = {
    budgetDeg: 4 * axisLag(22.5), // the budget that 22.5 cells per wavelength meets exactly
    sizeWavelengths: 4,
    courantFraction: 0.99,
    frequency: c / 0.023, // λ = 23 mm in vacuum
    waveSpeed: c,
    volume: [0.1, 0.05, 0.02],
    absorberCells: 8,
    simulatedTime: 3e-9,
    mcellsPerSecond: 100,
  };

  it('finds the coarsest resolution, then counts cells, memory, steps and time as written out by hand', () => {
    const p = project3d(base);
    expect(Math.abs(p.cellsPerWavelengthMin - 22.5)).toBeLessThan(1e-9); // Taflove & Hagness ch. 4 (1D closed form along the axis), from memory
    expect(p.cellsPerWavelength).toBe(23); // 22.5 rounded up to a whole cell count
    expect(p.dx_m).toBeCloseTo(0.001, 15); // 23 mm / 23
    expect(p.courant).toBeCloseTo(S, 15);
    // hand arithmetic: 100 + 2·8 = 116, 50 + 16 = 66, 20 + 16 = 36 cells
    expect([p.nx, p.ny, p.nz]).toEqual([116, 66, 36]);
    // 116·66 = 7656; 7656·36 = 275 616 cells
    expect(p.cells).toBe(275_616);
    // fields: 275 616·24 = 6 614 784 B
    // ψ: 16 B·2·8·(66·36 + 116·36 + 116·66) = 256·(2376 + 4176 + 7656) = 256·14 208 = 3 637 248 B
    // total: 6 614 784 + 3 637 248 = 10 252 032 B
    expect(p.memory_bytes).toBe(10_252_032);
    // dt = (0.99/√3)·1 mm / c = 1.906575e-12 s; 3 ns / dt = 1573.50 → 1574 steps
    expect(p.dt_s).toBeCloseTo(1.906575e-12, 17);
    expect(p.steps).toBe(1574);
    // 275 616·1574 = 433 819 584 cell updates at 1e8 per second = 4.33819584 s
    expect(p.seconds).toBeCloseTo(4.33819584, 10);
    expect(p.mcells_per_second).toBe(100);
  });

  it('meets the budget with the rounded resolution and misses it just below the real root', () => {
    const p = project3d(base);
    const lag = (cells: number) => cubicPhaseLagDeg(cells, p.courant, 'axis') * base.sizeWavelengths;
    expect(lag(p.cellsPerWavelength)).toBeLessThanOrEqual(base.budgetDeg);
    expect(lag(p.cellsPerWavelengthMin * (1 - 1e-6))).toBeGreaterThan(base.budgetDeg);
    // a whole-number root is kept, not pushed to the next cell
    const whole = project3d({ ...base, budgetDeg: 4 * axisLag(20) });
    expect(whole.cellsPerWavelength).toBe(20);
  });

  it('rounds lengths up to whole cells, but not for a rounding-level excess', () => {
    expect(project3d({ ...base, volume: [0.1 + 1e-14, 0.05, 0.02] }).nx).toBe(116); // 100.00000000001 cells count as 100
    expect(project3d({ ...base, volume: [0.1002, 0.05, 0.02] }).nx).toBe(117); // 100.2 cells need 101
    const bare = project3d({ ...base, absorberCells: 0 });
    expect(bare.cells).toBe(100 * 50 * 20);
    expect(bare.memory_bytes).toBe(24 * 100 * 50 * 20); // no absorber, no ψ
  });

  it('rejects inputs out of range by name, and an unreachable budget', () => {
    expect(() => project3d({ ...base, budgetDeg: 0 })).toThrow(/budgetDeg/);
    expect(() => project3d({ ...base, sizeWavelengths: Number.NaN })).toThrow(/sizeWavelengths/);
    expect(() => project3d({ ...base, courantFraction: 1.2 })).toThrow(/courantFraction/);
    expect(() => project3d({ ...base, courantFraction: 0 })).toThrow(/courantFraction/);
    expect(() => project3d({ ...base, volume: [0.1, -1, 0.02] })).toThrow(/volume\[1\]/);
    expect(() => project3d({ ...base, absorberCells: 2.5 })).toThrow(/absorberCells/);
    expect(() => project3d({ ...base, absorberCells: -1 })).toThrow(/absorberCells/);
    expect(() => project3d({ ...base, mcellsPerSecond: Number.POSITIVE_INFINITY })).toThrow(/mcellsPerSecond/);
    expect(() => project3d({ ...base, budgetDeg: 1e-12 })).toThrow(/1e7 cells/);
  });
});
