import { describe, expect, it } from 'vitest';
import {
  DispersionCutoffError,
  dispersionCutoff,
  numericalWavenumber,
  numericalWavenumberOrNaN,
  phaseErrorPerWavelengthDeg,
  phaseVelocityError,
  predictedPhaseErrorDeg,
  predictedPhaseErrorWrappedDeg,
} from '../../src/exact/dispersion.ts';
import { wrapDegrees } from '../../src/exact/angles.ts';

const c = 299792458;
const dx = 1e-3;
/** Frequency with N cells per wavelength along a cell of size d. */
const frequencyAt = (cells: number, d = dx) => c / (cells * d);
/** Along an axis: k̃ = (2/Δ)·asin(sin(πS/N)/S), S = c·dt/Δ (Taflove & Hagness, ch. 4). */
const axisClosedForm = (cells: number, courant: number, d = dx) =>
  (2 / d) * Math.asin(Math.sin((Math.PI * courant) / cells) / courant);

describe('Yee 2D TMz numerical dispersion', () => {
  it('is dispersion-free along an axis at the magic time step S = 1 (the 1D relation)', () => {
    // Along θ = 0 the y term vanishes and the relation is the 1D one; at S = 1 it gives k̃ = k.
    const dt = dx / c;
    for (const cells of [3, 4, 10, 20, 100, 1000]) {
      const f = frequencyAt(cells);
      const k = (2 * Math.PI * f) / c;
      expect(Math.abs(numericalWavenumber(f, 0, dx, 7 * dx, dt, c) / k - 1)).toBeLessThan(4e-15); // Taflove & Hagness ch. 4, magic time step
    }
  });

  it('is dispersion-free along the diagonal of square cells at S = 1/√2', () => {
    const dt = dx / (Math.SQRT2 * c);
    for (const theta of [Math.PI / 4, (3 * Math.PI) / 4, -Math.PI / 4]) {
      for (const cells of [5, 10, 20, 200]) {
        const f = frequencyAt(cells);
        const k = (2 * Math.PI * f) / c;
        expect(Math.abs(numericalWavenumber(f, theta, dx, dx, dt, c) / k - 1)).toBeLessThan(4e-15); // Taflove & Hagness ch. 4, 2D magic time step on the diagonal
      }
    }
  });

  it('matches the closed form along the axes at 10 and 20 cells per wavelength', () => {
    for (const courant of [0.25, 0.5, 0.7]) {
      const dt = (courant * dx) / c;
      for (const cells of [10, 20]) {
        const f = frequencyAt(cells);
        const k = (2 * Math.PI * f) / c;
        const exact = axisClosedForm(cells, courant);
        const kt = numericalWavenumber(f, 0, dx, dx, dt, c);
        expect(Math.abs(kt / exact - 1)).toBeLessThan(1e-14); // Taflove & Hagness, Computational Electrodynamics, ch. 4
        const reference = k / exact - 1;
        const error = phaseVelocityError(f, 0, dx, dx, dt, c);
        expect(Math.abs(error / reference - 1)).toBeLessThan(1e-12); // Taflove & Hagness, Computational Electrodynamics, ch. 4
      }
    }
    // Rectangular cells, along y: the same form with Δ = dy and S_y = c·dt/dy.
    const dy = 2.5e-3;
    const dt = (0.5 * dx) / c;
    const f = frequencyAt(10, dy);
    const kt = numericalWavenumber(f, Math.PI / 2, dx, dy, dt, c);
    expect(Math.abs(kt / axisClosedForm(10, (c * dt) / dy, dy) - 1)).toBeLessThan(1e-14); // Taflove & Hagness ch. 4
  });

  it('has the known leading error at fine resolution: ṽp/c − 1 ≈ −(kΔ)²(1 − S²)/24', () => {
    // Taylor expansion of the axis closed form; next term is O((kΔ)⁴), relative 1e-5 here.
    const courant = 0.5;
    const cells = 1000;
    const f = frequencyAt(cells);
    const kd = (2 * Math.PI) / cells;
    const leading = -(kd * kd * (1 - courant * courant)) / 24;
    const error = phaseVelocityError(f, 0, dx, dx, (courant * dx) / c, c);
    expect(Math.abs(error / leading - 1)).toBeLessThan(1e-4); // Taflove & Hagness ch. 4, small-kΔ expansion, from memory
  });

  it('lags more along the axis than along the diagonal (S = 0.5, square cells)', () => {
    const dt = (0.5 * dx) / c;
    const f = frequencyAt(10);
    const axis = phaseErrorPerWavelengthDeg(f, 0, dx, dx, dt, c);
    const diagonal = phaseErrorPerWavelengthDeg(f, Math.PI / 4, dx, dx, dt, c);
    expect(axis).toBeGreaterThan(diagonal); // Taflove & Hagness ch. 4, anisotropy of the Yee grid
    expect(diagonal).toBeGreaterThan(0); // the grid lags in every direction below the magic step
  });

  it('predicts about −3.4° after 3 wavelengths at 20 cells per wavelength, S = 0.5', () => {
    const dt = (0.5 * dx) / c;
    const f = frequencyAt(20);
    const wavelength = 20 * dx;
    const predicted = predictedPhaseErrorDeg(f, 3 * wavelength, 0, dx, dx, dt, c);
    const k = (2 * Math.PI * f) / c;
    const closed = (-(axisClosedForm(20, 0.5) - k) * 3 * wavelength * 180) / Math.PI; // = −3.3674°
    expect(Math.abs(predicted - closed)).toBeLessThan(1e-11); // Taflove & Hagness ch. 4, closed form
    expect(predicted).toBeGreaterThan(-3.5); // sanity: about a degree per wavelength, common practice
    expect(predicted).toBeLessThan(-3.2); // sanity, common practice
    const perWavelength = phaseErrorPerWavelengthDeg(f, 0, dx, dx, dt, c);
    expect(Math.abs(predicted + 3 * perWavelength)).toBeLessThan(1e-12); // definitions agree, no source
  });

  it('wraps the predicted phase error into (−180, 180]', () => {
    const dt = (0.5 * dx) / c;
    const f = frequencyAt(20);
    for (const rho of [0.06, 4, 10, 37.3]) {
      const raw = predictedPhaseErrorDeg(f, rho, 0, dx, dx, dt, c);
      const wrapped = predictedPhaseErrorWrappedDeg(f, rho, 0, dx, dx, dt, c);
      expect(wrapped).toBe(wrapDegrees(raw)); // definition, no source
      expect(wrapped).toBeGreaterThan(-180);
      expect(wrapped).toBeLessThanOrEqual(180);
      expect(Math.abs((((wrapped - raw) % 360) + 360) % 360)).toBeLessThan(1e-9); // same direction, common practice
    }
    expect(predictedPhaseErrorWrappedDeg(f, 4, 0, dx, dx, dt, c)).toBeCloseTo(135.5036, 3); // −224.4964° unwrapped, closed form (Taflove & Hagness ch. 4)
  });

  it('solves the relation to rounding everywhere below the cutoff', () => {
    for (const [ddx, ddy, courant] of [[1e-3, 1e-3, 0.5], [1e-3, 2e-3, 0.6], [2e-3, 1e-3, 0.3], [1e-3, 1e-3, 0.7]]) {
      const dt = (courant * Math.min(ddx, ddy)) / c;
      for (let degrees = 0; degrees <= 180; degrees += 7.5) {
        const theta = (degrees * Math.PI) / 180;
        const cutoff = dispersionCutoff(theta, ddx, ddy, dt, c);
        for (const fraction of [1e-4, 0.01, 0.2, 0.5, 0.9, 0.999, 1 - 1e-9]) {
          const f = fraction * cutoff;
          const kt = numericalWavenumber(f, theta, ddx, ddy, dt, c);
          const lhs = (Math.sin(Math.PI * f * dt) / (c * dt)) ** 2;
          const rhs = (Math.sin((kt * Math.cos(theta) * ddx) / 2) / ddx) ** 2 + (Math.sin((kt * Math.sin(theta) * ddy) / 2) / ddy) ** 2;
          expect(Math.abs(rhs / lhs - 1)).toBeLessThan(1e-13); // the Yee relation itself, Taflove & Hagness ch. 4
          expect(kt).toBeGreaterThanOrEqual((2 * Math.PI * f) / c); // the grid never leads below the magic step
        }
      }
    }
  });

  it('reports clearly that no real solution exists above the cutoff', () => {
    const dt = (0.5 * dx) / c;
    // Along an axis the zone edge k̃ = π/Δ is reached at sin(πf·dt) = S: f = asin(S)/(π·dt).
    const cutoff = dispersionCutoff(0, dx, dx, dt, c);
    expect(Math.abs(cutoff / (Math.asin(0.5) / (Math.PI * dt)) - 1)).toBeLessThan(1e-14); // Taflove & Hagness ch. 4, axis cutoff
    expect(numericalWavenumber(cutoff * (1 - 1e-12), 0, dx, dx, dt, c) * dx).toBeCloseTo(Math.PI, 4); // zone edge
    const f = 1.01 * cutoff;
    expect(() => numericalWavenumber(f, 0, dx, dx, dt, c)).toThrow(DispersionCutoffError);
    expect(() => numericalWavenumber(f, 0, dx, dx, dt, c)).toThrow(/cutoff/);
    expect(() => numericalWavenumber(f, 0, dx, dx, dt, c)).toThrow(RangeError);
    try {
      numericalWavenumber(f, 0, dx, dx, dt, c);
    } catch (error) {
      expect((error as DispersionCutoffError).cutoff).toBe(cutoff);
      expect((error as DispersionCutoffError).frequency).toBe(f);
    }
    expect(numericalWavenumberOrNaN(f, 0, dx, dx, dt, c)).toBeNaN();
    expect(phaseVelocityError(f, 0, dx, dx, dt, c)).toBeNaN();
    expect(predictedPhaseErrorDeg(f, 0.1, 0, dx, dx, dt, c)).toBeNaN();
    expect(predictedPhaseErrorWrappedDeg(f, 0.1, 0, dx, dx, dt, c)).toBeNaN();
    expect(phaseErrorPerWavelengthDeg(f, 0, dx, dx, dt, c)).toBeNaN();
    // The diagonal carries the same frequency: its zone edge is further out.
    expect(Number.isFinite(numericalWavenumber(f, Math.PI / 4, dx, dx, dt, c))).toBe(true);
    // Above the temporal Nyquist frequency 1/(2·dt) nothing propagates.
    expect(() => numericalWavenumber(0.6 / dt, Math.PI / 4, dx, dx, dt, c)).toThrow(DispersionCutoffError);
  });

  it('handles zero, negative, NaN and infinite inputs as documented', () => {
    const dt = (0.5 * dx) / c;
    expect(numericalWavenumber(0, 0.3, dx, dx, dt, c)).toBe(0); // documented
    expect(phaseVelocityError(0, 0.3, dx, dx, dt, c)).toBe(0); // documented: long-wave limit
    expect(predictedPhaseErrorDeg(0, 1, 0.3, dx, dx, dt, c)).toBe(0); // documented
    expect(phaseErrorPerWavelengthDeg(0, 0.3, dx, dx, dt, c)).toBe(0); // documented
    expect(predictedPhaseErrorDeg(1e10, 0, 0.3, dx, dx, dt, c)).toBe(0); // no distance, no error
    for (const f of [-1e9, Number.NaN, Number.POSITIVE_INFINITY]) {
      expect(() => numericalWavenumber(f, 0, dx, dx, dt, c)).toThrow(RangeError); // documented
      expect(numericalWavenumberOrNaN(f, 0, dx, dx, dt, c)).toBeNaN(); // documented
      expect(phaseErrorPerWavelengthDeg(f, 0, dx, dx, dt, c)).toBeNaN(); // documented
    }
    for (const bad of [0, -1e-3, Number.NaN, Number.POSITIVE_INFINITY]) {
      expect(() => numericalWavenumber(1e10, 0, bad, dx, dt, c)).toThrow(/dx/); // documented
      expect(() => numericalWavenumber(1e10, 0, dx, bad, dt, c)).toThrow(/dy/); // documented
      expect(() => numericalWavenumber(1e10, 0, dx, dx, bad, c)).toThrow(/dt/); // documented
      expect(() => numericalWavenumber(1e10, 0, dx, dx, dt, bad)).toThrow(/c must/); // documented
      expect(() => dispersionCutoff(0, bad, dx, dt, c)).toThrow(RangeError); // documented
      expect(phaseVelocityError(1e10, 0, bad, dx, dt, c)).toBeNaN(); // documented
    }
    expect(() => numericalWavenumber(1e10, Number.NaN, dx, dx, dt, c)).toThrow(/theta/); // documented
    expect(predictedPhaseErrorDeg(1e10, -1, 0, dx, dx, dt, c)).toBeNaN(); // documented: ρ < 0
    expect(predictedPhaseErrorDeg(1e10, Number.POSITIVE_INFINITY, 0, dx, dx, dt, c)).toBeNaN(); // documented
    // Direction enters through |cos θ| and |sin θ|: θ and θ + π, −θ give the same k̃.
    const a = numericalWavenumber(2e10, 0.4, dx, 2 * dx, dt, c);
    expect(numericalWavenumber(2e10, 0.4 + Math.PI, dx, 2 * dx, dt, c)).toBeCloseTo(a, 9); // symmetry of the Yee cell, common practice
    expect(numericalWavenumber(2e10, -0.4, dx, 2 * dx, dt, c)).toBeCloseTo(a, 9); // symmetry of the Yee cell, common practice
  });
});
