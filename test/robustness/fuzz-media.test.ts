import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { mutated, type Mutation } from '../fixtures/mutate.ts';
import { createSimulation, loadEngineModules } from '../../src/engine/create-simulation.ts';
import { parseScenarioText, validateScenario } from '../../src/scenario/parse.ts';
import { scenarioWarnings } from '../../src/scenario/warnings.ts';

// Property-based testing of the fields added for media, polarization and objects (common
// practice, no source): generated mutations of a scenario with a lossy dispersive medium, TEz
// and two objects, through the object and text entry points. Never a throw past the boundary;
// every rejection names a path and says what to do; every accepted scenario gets its warnings
// and runs 40 steps on whichever engine it needs, with a finite field.

/** A small valid scenario with every new field in use, so that many mutants stay valid and run. */
const base = {
  format: 'gridgauge-scenario', version: 1,
  polarization: 'TEz',
  fill: 'conformal',
  grid: { nx: 60, ny: 50, dx: 0.001, dy: 0.001, courant: 0.5 },
  medium: { epsR: 2, sigma: 0.01, poles: [
    { kind: 'debye', deltaEps: 1, tau: 1e-11 },
    { kind: 'drude', omegaP: 1e10, gamma: 1e9 },
    { kind: 'lorentz', deltaEps: 0.5, omega0: 2e11, delta: 1e10 },
  ] },
  absorber: { cells: 8, order: 3, sigmaScale: 1, kappaMax: 5, alphaMax: 0.05 },
  source: { x: 0.02, y: 0.025, amplitude: 1, waveform: { kind: 'modulated-gaussian', f0: 3e10 } },
  probes: [{ name: 'a', x: 0.045, y: 0.025 }],
  lines: [{ name: 'l', x0: 0.021, y0: 0.03, x1: 0.03, y1: 0.035 }],
  objects: [
    { shape: 'circle', name: 'post', x: 0.033, y: 0.025, radius: 0.004, material: 'pec' },
    { shape: 'polygon', name: 'wedge', points: [[0.026, 0.012], [0.034, 0.012], [0.03, 0.018]], material: { epsR: 4, sigma: 0.1 } },
  ],
  frequencies: [3e10],
  steps: 40,
};

const leafPaths = [
  ['polarization'], ['fill'], ['medium', 'sigma'], ['medium', 'poles'], ['medium', 'poles', 0, 'kind'],
  ['medium', 'poles', 0, 'deltaEps'], ['medium', 'poles', 0, 'tau'], ['medium', 'poles', 1, 'omegaP'],
  ['medium', 'poles', 1, 'gamma'], ['medium', 'poles', 2, 'omega0'], ['medium', 'poles', 2, 'delta'],
  ['medium', 'poles', 2, 'deltaEps'], ['objects'], ['objects', 0], ['objects', 0, 'shape'], ['objects', 0, 'x'],
  ['objects', 0, 'radius'], ['objects', 0, 'material'], ['objects', 1, 'points'], ['objects', 1, 'points', 0],
  ['objects', 1, 'points', 2, 0], ['objects', 1, 'material'], ['objects', 1, 'material', 'epsR'],
  ['objects', 1, 'material', 'sigma'], ['objects', 1, 'material', 'poles'], ['objects', 0, 'name'], ['medium', 'epsR'],
] as const;

const oddValue = fc.oneof(
  fc.constantFrom(0, -1, 1, 2, 0.5, 1e-300, 1e300, -0, NaN, Infinity, -Infinity, 1e9, 1e12, 1e15, 1e-11, 1e-20,
    'TMz', 'TEz', 'tez', 'staircase', 'average', 'conformal', 'pec', 'circle', 'rectangle', 'polygon', 'debye', 'drude',
    'lorentz', '', '=cmd()', '<b>x</b>', null, true, [], {}, [0.03, 0.02], [[0, 0], [1, 1], [0, 1], [1, 0]],
    { epsR: 3 }, { epsR: 1, poles: [{ kind: 'drude', omegaP: 1e12 }] }, [{ kind: 'debye', deltaEps: 1, tau: 1e-12 }]),
  fc.double({ noNaN: false }),
  fc.string({ maxLength: 8 }),
);

const mutation: fc.Arbitrary<Mutation> = fc.record({ path: fc.constantFrom(...leafPaths), value: oddValue, remove: fc.boolean() });

function mutate(m: Mutation[]): unknown {
  return mutated(base, m);
}

describe('untrusted media, polarization and object input', () => {
  it('3 000 mutated scenarios: no throw, rejections name a path and a fix, accepted ones warn and run', async () => {
    const engines = await loadEngineModules();
    let accepted = 0;
    let rejected = 0;
    fc.assert(
      fc.property(fc.array(mutation, { minLength: 0, maxLength: 3 }), fc.boolean(), (m, asText) => {
        const value = mutate(m);
        const result = asText ? parseScenarioText(JSON.stringify(value)) : validateScenario(value);
        if (!result.ok) {
          rejected++;
          expect(result.problems.length).toBeGreaterThan(0); // common practice, no source
          for (const p of result.problems) {
            expect(p.path.length).toBeGreaterThan(0); // common practice, no source
            expect(p.message.length).toBeGreaterThan(10); // common practice, no source
          }
          return;
        }
        accepted++;
        for (const w of scenarioWarnings(result.scenario)) expect(w.message.length).toBeGreaterThan(10); // common practice, no source
        const sim = createSimulation(engines, result.scenario);
        sim.step(40);
        expect(Number.isFinite(sim.maxAbsEz())).toBe(true); // common practice, no source
        sim.dispose();
      }),
      { numRuns: 3_000, seed: 20261202 },
    );
    console.log(`fuzz (media, objects): ${accepted} accepted and run 40 steps, ${rejected} rejected`);
    expect(accepted + rejected).toBe(3_000); // common practice, no source
    expect(accepted).toBeGreaterThan(300); // the generator really exercises the run path, common practice, no source
  }, 180_000);
});
