/**
 * Pure helpers behind the page's media, polarization and objects (src/app), which need no
 * browser: the εr(ω) chart's samples, the conductivity unit in field messages, the starting
 * values of a new pole, the labels by polarization, and the plane geometry of editing
 * objects (move, handles, growing, what the draft holds).
 */
import { describe, expect, it } from 'vitest';
import { messageInUnit } from '../../src/app/field-messages.ts';
import { fieldNames } from '../../src/scenario/field-names.ts';
import { newPole } from '../../src/app/new-pole.ts';
import {
  drawableObject, faultyObjectIndices, grown, handlesOf, newObject, newObjectSpot, objectsValue, placementOfDraft, translated, withHandleAt,
} from '../../src/app/object-shapes.ts';
import { permittivityCurves } from '../../src/app/permittivity-curves.ts';
import { textToSi, siToText, UNIT_EXPONENT } from '../../src/app/draft.ts';
import { EPS0 } from '../../src/scenario/constants.ts';
import { demoScenario } from '../../src/scenario/defaults.ts';
import { validateScenario } from '../../src/scenario/parse.ts';
import type { Scenario, SceneObject } from '../../src/scenario/types.ts';

function withMedium(medium: Scenario['medium']): Scenario {
  const s = demoScenario();
  s.medium = medium;
  const r = validateScenario(s);
  if (!r.ok) throw new Error(r.problems.map((p) => `${p.path}: ${p.message}`).join('; '));
  return r.scenario;
}

describe('the εr(ω) chart\'s curves', () => {
  it('leaves a lossless medium without poles out (εr is the constant ε∞)', () => {
    expect(permittivityCurves(demoScenario())).toBeUndefined(); // common practice, no source
  });

  it('gives a conductor Im εr = −σ/(ωε0) and skips 0 Hz, where it diverges', () => {
    const c = permittivityCurves(withMedium({ epsR: 3, sigma: 0.05 }), 101);
    if (!c) throw new Error('a conductor has curves');
    expect(c.mediumRe[0]).toBeNull(); // σ/(ωε0) is infinite at ω = 0
    expect(c.schemeIm[0]).toBeNull(); // common practice, no source
    const k = 40;
    const w = 2 * Math.PI * c.f_Hz[k];
    expect(c.mediumRe[k]).toBe(3); // Re εr = ε∞ for a pure conductor (Balanis, Advanced Engineering Electromagnetics, §2.8.1, from memory)
    expect(c.mediumIm[k] as number).toBeCloseTo(-0.05 / (w * EPS0), 10); // εr = ε∞ − jσ/(ωε0), e^{+jωt} (Balanis §2.8.1, from memory)
    // the range follows the band above a tenth of the edge, not the 1/f growth near 0 Hz
    expect(c.range[0]).toBeGreaterThan(c.mediumIm[1] as number); // common practice, no source
    expect(c.range[0]).toBeLessThanOrEqual(c.mediumIm[10] as number); // common practice, no source
    expect(c.range[1]).toBeGreaterThanOrEqual(3); // common practice, no source
  });

  it('puts a Debye pole\'s loss peak at ωτ = 1 with Re εr halfway, and the scheme close to it below the band edge', () => {
    const f0 = demoScenario().source.waveform.kind === 'modulated-gaussian' ? 1e10 : NaN;
    const tau = 1 / (2 * Math.PI * f0);
    const c = permittivityCurves(withMedium({ epsR: 2, poles: [{ kind: 'debye', deltaEps: 8, tau }] }), 401);
    if (!c) throw new Error('a Debye medium has curves');
    let peak = 1;
    for (let k = 1; k < c.f_Hz.length; k++) if ((c.mediumIm[k] as number) < (c.mediumIm[peak] as number)) peak = k;
    const step = c.f_Hz[1] - c.f_Hz[0];
    expect(Math.abs(c.f_Hz[peak] - f0)).toBeLessThanOrEqual(step); // −Im of Δε/(1 + jωτ) peaks at ωτ = 1 (Debye, Polar Molecules, 1929, from memory)
    expect(c.mediumIm[peak] as number).toBeCloseTo(-4, 3); // −Δε/2 at the peak (Debye 1929, from memory)
    expect(c.mediumRe[peak] as number).toBeCloseTo(2 + 4, 1); // ε∞ + Δε/2 at ωτ = 1, the sample within 0.5 % of it (Debye 1929, from memory)
    const half = Math.round((c.f_Hz.length - 1) / 2);
    const gap = Math.hypot((c.schemeRe[half] as number) - (c.mediumRe[half] as number), (c.schemeIm[half] as number) - (c.mediumIm[half] as number));
    expect(gap).toBeGreaterThan(0); // the grid's ε̃r is not the medium's (Taflove & Hagness ch. 9, from memory)
    expect(gap / Math.hypot(c.mediumRe[half] as number, c.mediumIm[half] as number)).toBeLessThan(1e-2); // ω·dt ≈ 0.09 here: second-order close, common practice, no source
    expect(c.f0_Hz).toBe(1e10); // common practice, no source
  });
});

describe('conductivity in the field\'s unit', () => {
  it('converts S/m and mS/m exactly and rewrites the model\'s message', () => {
    expect(textToSi('20', UNIT_EXPONENT['mS/m'])).toBe(0.02); // 1 mS/m = 1e-3 S/m, BIPM SI Brochure Table 7
    expect(siToText(0.004, UNIT_EXPONENT['mS/m'])).toBe('4'); // BIPM SI Brochure Table 7
    const s = demoScenario() as unknown as { medium: Record<string, unknown> };
    s.medium.sigma = -0.001;
    const r = validateScenario(s);
    if (r.ok) throw new Error('a negative conductivity should be refused');
    const m = r.problems.find((p) => p.path === 'medium.sigma')?.message as string;
    expect(m).toMatch(/^-0\.001 is below 0; .* in S\/m/); // the model writes SI (README "Scenario file")
    const shown = messageInUnit(m, 'conductivity', 'mS/m');
    expect(shown).toMatch(/^-1 mS\/m is below 0; /); // −0.001 S/m = −1 mS/m, BIPM SI Brochure Table 7
    expect(shown).toContain('in mS/m, 0 or more, e.g. 10'); // e.g. 0.01 S/m = 10 mS/m
    expect(shown).not.toContain(' S/m'); // common practice, no source
    expect(messageInUnit(m, 'conductivity', 'S/m')).toBe(m); // common practice, no source
  });
});

describe('a new pole', () => {
  it('starts inside the band of a 10 GHz pulse, and keeps Δε across a change of kind', () => {
    const debye = newPole('debye', 1e10);
    expect(debye.kind === 'debye' && 2 * Math.PI * 1e10 * debye.tau).toBeCloseTo(1, 10); // relaxation at f0: ωτ = 1 (Debye 1929, from memory)
    const lorentz = newPole('lorentz', 1e10, { kind: 'debye', deltaEps: 7 });
    expect(lorentz).toMatchObject({ kind: 'lorentz', deltaEps: 7 }); // common practice, no source
    expect(lorentz.kind === 'lorentz' && lorentz.omega0 / (2 * Math.PI)).toBeCloseTo(2e10, 0); // resonance at 2·f0, common practice, no source
    const drude = newPole('drude', undefined);
    expect(drude.kind === 'drude' && drude.omegaP).toBeGreaterThan(0); // a fallback frequency when f0 is unknown
    for (const p of [debye, lorentz, drude]) {
      const s = demoScenario();
      s.medium = { epsR: 1, poles: [p] };
      expect(validateScenario(s).ok, p.kind).toBe(true); // stable on the demo's grid (src/scenario/media-rules.ts)
    }
  });
});

describe('labels by polarization', () => {
  it('names Ez over I in TMz and Hz over M in TEz', () => {
    expect(fieldNames('TEz')).toMatchObject({ field: 'Hz', unit: 'A/m', source: 'M', sourceUnit: 'V', ratio: 'Hz/M' }); // magnetic line current in volts (Balanis §6.3 duality, from memory)
    expect(fieldNames(undefined)).toMatchObject({ field: 'Ez', unit: 'V/m', source: 'I', sourceUnit: 'A', ratio: 'Ez/I' }); // TMz is the default (README "Scenario file")
    expect(fieldNames('tez').field).toBe('Ez'); // only the exact spelling switches, common practice, no source
  });
});

describe('editing objects', () => {
  const circle: SceneObject = { shape: 'circle', x: 0.1, y: 0.2, radius: 0.01, material: 'pec' };
  const rect: SceneObject = { shape: 'rectangle', x0: 0.06, y0: 0.02, x1: 0.04, y1: 0.05, material: { epsR: 4 } };

  it('moves by whole cells without float noise', () => {
    expect(translated(circle, 0.02, -0.001)).toMatchObject({ x: 0.12, y: 0.199 }); // 0.1 + 0.02 written as 0.12, common practice, no source
    expect(translated(rect, 0.001, 0.001)).toMatchObject({ x0: 0.061, y0: 0.021, x1: 0.041, y1: 0.051 }); // common practice, no source
  });

  it('reshapes by a handle: a circle\'s radius is the distance from its centre', () => {
    expect(handlesOf(circle)).toEqual([[0.11, 0.2]]); // common practice, no source
    expect(withHandleAt(circle, 0, 0.103, 0.204)).toMatchObject({ x: 0.1, y: 0.2, radius: 0.005 }); // 3-4-5 right triangle (Pythagoras)
    expect(withHandleAt(rect, 2, 0.03, 0.07)).toMatchObject({ x0: 0.06, y0: 0.02, x1: 0.03, y1: 0.07 }); // the opposite corner stays
    expect(withHandleAt(rect, 0, 0.07, 0.01)).toMatchObject({ x0: 0.07, y0: 0.01, x1: 0.04, y1: 0.05 }); // common practice, no source
  });

  it('grows every side by a cell, and refuses to shrink to nothing', () => {
    expect(grown(circle, 1, 0.001, 0.002)).toMatchObject({ radius: 0.011 }); // by the finer cell, common practice, no source
    expect(grown(rect, 1, 0.001, 0.001)).toMatchObject({ x0: 0.061, x1: 0.039, y0: 0.019, y1: 0.051 }); // x0 > x1 kept as written
    expect(grown({ ...circle, radius: 0.001 }, -1, 0.001, 0.001)).toMatchObject({ radius: 0.001 }); // would be 0: unchanged
    const tri: SceneObject = { shape: 'polygon', points: [[0, 0], [0.02, 0], [0.01, 0.01]], material: 'pec' };
    expect(grown(tri, 1, 0.001, 0.001)).toMatchObject({ points: [[-0.001, -0.001], [0.021, -0.001], [0.01, 0.011]] }); // box 20 × 10 cells → 22 × 12 about its centre
  });

  it('reads what the draft holds, and places new objects clear of each other', () => {
    expect(drawableObject({ shape: 'circle', x: 0.1, y: 0.1, radius: 'x' })).toBeUndefined(); // common practice, no source
    expect(drawableObject({ shape: 'square', x: 0.1 })).toBeUndefined(); // common practice, no source
    expect(drawableObject({ shape: 'polygon', points: [[0, 0], 'x', [1, 1]], material: 'pec' })).toMatchObject({ points: [[0, 0], [1, 1]] }); // common practice, no source
    expect(objectsValue([])).toBeUndefined(); // no objects: the field is left out (README "Scenario file")
    const { grid, source } = placementOfDraft(demoScenario() as unknown as Record<string, unknown>);
    expect(grid).toEqual({ nx: 300, ny: 300, dx: 0.001, dy: 0.001, cells: 10 }); // common practice, no source
    expect(placementOfDraft({ grid: { dx: -1 } }).grid.dx).toBe(1e-3); // stand-in for a wrong cell size
    const a = newObjectSpot(grid, source, 0);
    const b = newObjectSpot(grid, source, 1);
    expect(b[0] - a[0]).toBeCloseTo(0.012, 12); // 12 cells apart, common practice, no source
    const s = demoScenario();
    s.objects = [newObject('circle', a, grid, []), newObject('rectangle', b, grid, ['circle 1']), newObject('polygon', newObjectSpot(grid, source, 2), grid, [])];
    const r = validateScenario(s);
    expect(r.ok ? [] : r.problems).toEqual([]); // the demo accepts three new objects where they are placed
    expect(s.objects.map((o) => o.name)).toEqual(['circle 1', 'rectangle 1', 'polygon 1']); // common practice, no source
  });

  it('finds the objects a list of problems names', () => {
    const problems = [{ path: 'objects[2].radius', message: '' }, { path: 'grid.nx', message: '' }, { path: 'objects[0]', message: '' }, { path: 'objects[2]', message: '' }];
    expect(faultyObjectIndices(problems)).toEqual([0, 2]); // common practice, no source
  });
});
