/**
 * The materials, polarization and objects of a scenario (docs/scenario.md): each new field
 * refused with its full path and a fix, and a scenario without them read exactly as before.
 * The rules are the format's own: common practice, no source.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { demoScenario } from '../../src/scenario/defaults.ts';
import { validateScenario } from '../../src/scenario/parse.ts';

const refused = (patch: (s: Record<string, any>) => void) => {
  const s = structuredClone(demoScenario()) as unknown as Record<string, any>;
  patch(s);
  const r = validateScenario(s);
  return r.ok ? [] : r.problems;
};
const at = (problems: { path: string; message: string }[], path: string) => problems.find((p) => p.path === path)?.message ?? '';

describe('medium: conductivity and poles', () => {
  it('a negative conductivity, τ, Δε, γ or δ is refused naming the path', () => {
    expect(at(refused((s) => { s.medium.sigma = -1; }), 'medium.sigma')).toMatch(/below 0; .*conductivity/);
    expect(at(refused((s) => { s.medium.poles = [{ kind: 'debye', deltaEps: 2, tau: -1e-12 }]; }), 'medium.poles[0].tau')).toMatch(/not above 0/);
    expect(at(refused((s) => { s.medium.poles = [{ kind: 'debye', deltaEps: -2, tau: 1e-12 }]; }), 'medium.poles[0].deltaEps')).toMatch(/below 0/);
    expect(at(refused((s) => { s.medium.poles = [{ kind: 'drude', omegaP: 1e10, gamma: -1 }]; }), 'medium.poles[0].gamma')).toMatch(/below 0/);
    expect(at(refused((s) => { s.medium.poles = [{ kind: 'lorentz', deltaEps: 1, omega0: 1e10, delta: -5 }]; }), 'medium.poles[0].delta')).toMatch(/below 0/);
  });
  it('ω0 and ωp must be above 0', () => {
    expect(at(refused((s) => { s.medium.poles = [{ kind: 'drude', omegaP: 0 }]; }), 'medium.poles[0].omegaP')).toMatch(/not above 0/);
    expect(at(refused((s) => { s.medium.poles = [{ kind: 'lorentz', deltaEps: 1, omega0: 0 }]; }), 'medium.poles[0].omega0')).toMatch(/not above 0/);
  });
  it('values so large the float32 coefficients would overflow are refused with the largest accepted (found by fuzzing)', () => {
    const big = (pole: Record<string, unknown>, field: string) => at(refused((s) => { s.medium.poles = [pole]; }), `medium.poles[0].${field}`);
    expect(big({ kind: 'debye', deltaEps: 1.5e40, tau: 1e-11 }, 'deltaEps')).toBe('is 1.5e40, above the largest accepted 1e4 (the grid\'s float32 coefficients stay finite below it); use 1e4 or less'); // common practice, no source
    expect(big({ kind: 'debye', deltaEps: 1, tau: 1e300 }, 'tau')).toMatch(/^is 1e300 s, above the largest accepted 1 s .*; use 1 s or less$/); // common practice, no source
    expect(big({ kind: 'drude', omegaP: 1e20 }, 'omegaP')).toMatch(/above the largest accepted 1e18 rad\/s/); // common practice, no source
    expect(big({ kind: 'drude', omegaP: 1e10, gamma: 1e19 }, 'gamma')).toMatch(/use 1e18 1\/s or less/); // common practice, no source
    expect(big({ kind: 'lorentz', deltaEps: 1, omega0: 1e19 }, 'omega0')).toMatch(/use 1e18 rad\/s or less/); // common practice, no source
    expect(big({ kind: 'lorentz', deltaEps: 1, omega0: 1e10, delta: 1e19 }, 'delta')).toMatch(/use 1e18 1\/s or less/); // common practice, no source
    expect(refused((s) => { s.medium.poles = [{ kind: 'debye', deltaEps: 1e4, tau: 1 }]; })).toEqual([]); // the bounds themselves are accepted, common practice, no source
  });
  it('an unknown kind, a field of another kind, a missing field and more than six poles', () => {
    expect(at(refused((s) => { s.medium.poles = [{ kind: 'debey', deltaEps: 1, tau: 1e-12 }]; }), 'medium.poles[0].kind')).toMatch(/did you mean debye/);
    expect(at(refused((s) => { s.medium.poles = [{ kind: 'drude', omegaP: 1e10, tau: 1 }]; }), 'medium.poles[0].tau')).toMatch(/does not apply to a drude pole/);
    expect(at(refused((s) => { s.medium.poles = [{ kind: 'lorentz', deltaEps: 1 }]; }), 'medium.poles[0].omega0')).toMatch(/required for a lorentz pole/);
    expect(at(refused((s) => { s.medium.poles = Array(7).fill({ kind: 'debye', deltaEps: 1, tau: 1e-12 }); }), 'medium.poles')).toMatch(/at most 6/);
  });
  it('a Drude pole beyond its stability bound at this time step is refused with the fix', () => {
    // ωp·dt < 2√ε∞·√(1 − s²) (the media engine's von Neumann bound; README "Materials")
    expect(at(refused((s) => { s.medium.poles = [{ kind: 'drude', omegaP: 1e13, gamma: 0 }]; }), 'medium.poles[0].omegaP')).toMatch(/Drude update stays stable.*smaller grid.courant/);
  });
  it('a scenario without the new fields reads back without them', () => {
    const r = validateScenario(structuredClone(demoScenario()));
    expect(r.ok).toBe(true);
    if (r.ok) {
      expect('sigma' in r.scenario.medium).toBe(false);
      expect('poles' in r.scenario.medium).toBe(false);
      expect('polarization' in r.scenario || 'objects' in r.scenario || 'fill' in r.scenario).toBe(false);
    }
  });
});

describe('polarization and objects', () => {
  it('an unknown polarization and fill are refused with the choices', () => {
    expect(at(refused((s) => { s.polarization = 'TE'; }), 'polarization')).toMatch(/"TMz".*"TEz"/);
    expect(refused((s) => { s.fill = 'smooth'; }).map((p) => p.path)).toContain('fill');
  });
  it('objects reaching the absorber, over the source, or with no area are refused naming objects[i]', () => {
    expect(refused((s) => { s.objects = [{ shape: 'circle', x: 0.15, y: 0.15, radius: 0.005, material: 'pec' }]; }).map((p) => p.path).join(' ')).toMatch(/objects\[0\]/);
    expect(refused((s) => { s.objects = [{ shape: 'circle', x: 0.005, y: 0.15, radius: 0.003, material: 'pec' }]; }).map((p) => p.path).join(' ')).toMatch(/objects\[0\]/);
    expect(refused((s) => { s.objects = [{ shape: 'rectangle', x0: 0.2, y0: 0.2, x1: 0.2, y1: 0.25, material: 'pec' }]; }).map((p) => p.path).join(' ')).toMatch(/objects\[0\]/);
    expect(refused((s) => { s.objects = [{ shape: 'polygon', points: [[0.2, 0.2], [0.25, 0.25], [0.25, 0.2], [0.2, 0.25]], material: 'pec' }]; }).map((p) => p.message).join(' ')).toMatch(/cross/);
  });
  it('nothing is run or written for a refused scenario (exit 2, no output folder)', () => {
    const dir = mkdtempSync(join(tmpdir(), 'gridgauge-refused-'));
    const s = { ...demoScenario(), objects: [{ shape: 'circle', x: 0.15, y: 0.15, radius: 0.005, material: 'pec' }] };
    writeFileSync(join(dir, 's.json'), JSON.stringify(s));
    const r = spawnSync(process.execPath, ['bin/gridgauge.js', 'run', join(dir, 's.json'), '--out', join(dir, 'out')], { encoding: 'utf8' });
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/^objects\[0\]/m);
    expect(existsSync(join(dir, 'out'))).toBe(false);
  });
});
