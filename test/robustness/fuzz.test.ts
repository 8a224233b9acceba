import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { mutated, type Mutation } from '../fixtures/mutate.ts';
import { loadEngineModule } from '../../src/engine/wasm.ts';
import { Simulation } from '../../src/engine/simulation.ts';
import { parseScenarioText, validateScenario } from '../../src/scenario/parse.ts';
import { decodeScenario } from '../../src/scenario/url.ts';

// Property-based testing of untrusted scenario input (common practice, no source): 10 000
// generated and mutated scenarios through every entry point (object from a form, file text,
// link), never a throw past the boundary, every rejection names a field and a fix, and every
// accepted scenario runs 50 steps with a finite field.

/** A small valid scenario to mutate, so that many mutants are still valid and get run. */
const base = {
  format: 'gridgauge-scenario', version: 1,
  grid: { nx: 60, ny: 50, dx: 0.001, dy: 0.001, courant: 0.5 },
  medium: { epsR: 1 },
  absorber: { cells: 8, order: 3, sigmaScale: 1, kappaMax: 5, alphaMax: 0.05 },
  source: { x: 0.03, y: 0.025, amplitude: 1, waveform: { kind: 'modulated-gaussian', f0: 3e10 } },
  probes: [{ name: 'a', x: 0.04, y: 0.025 }],
  lines: [{ name: 'l', x0: 0.031, y0: 0.025, x1: 0.045, y1: 0.03 }],
  frequencies: [3e10],
  steps: 60,
};

const leafPaths = [
  ['format'], ['version'], ['grid', 'nx'], ['grid', 'ny'], ['grid', 'dx'], ['grid', 'dy'], ['grid', 'courant'],
  ['medium', 'epsR'], ['absorber', 'cells'], ['absorber', 'order'], ['absorber', 'sigmaScale'], ['absorber', 'kappaMax'],
  ['absorber', 'alphaMax'], ['source', 'x'], ['source', 'y'], ['source', 'amplitude'], ['source', 'waveform', 'kind'],
  ['source', 'waveform', 'f0'], ['source', 'waveform', 'tau'], ['source', 'waveform', 't0'], ['probes', 0, 'name'],
  ['probes', 0, 'x'], ['probes', 0, 'y'], ['lines', 0, 'x1'], ['lines', 0, 'name'], ['frequencies', 0], ['steps'],
  ['grid'], ['source'], ['probes'], ['lines'], ['frequencies'], ['source', 'waveform'],
] as const;

const oddValue = fc.oneof(
  fc.constantFrom(0, -1, 1, 2, 3, 0.5, 0.7071067811865476, 0.7072, 1e-300, 1e300, -0, NaN, Infinity, -Infinity,
    1e9, 2 ** 31, 40, 100, 1e10, 3e10, 1e-11, 'gaussian', 'ricker', 'modulated-gaussian', 'square', '',
    'x'.repeat(41), '=cmd()', '<img src=x onerror=alert(1)>', null, true, [], {}, [1, 2], { nx: 1 }),
  fc.integer({ min: -5, max: 200 }),
  fc.double({ noNaN: false }),
  fc.string({ maxLength: 12 }),
);

const mutation: fc.Arbitrary<Mutation> = fc.record({
  path: fc.constantFrom(...leafPaths),
  value: oddValue,
  remove: fc.boolean(),
});

function mutate(m: Mutation[], extraKey: string | undefined): unknown {
  const s = mutated(base, m);
  if (extraKey) s[extraKey] = 1;
  return s;
}

describe('untrusted scenario input', () => {
  it('10 000 generated and mutated scenarios: no throw, rejections name a path and a fix, accepted ones run', async () => {
    const module = await loadEngineModule();
    let accepted = 0;
    let rejected = 0;
    const check = (value: unknown, via: 'object' | 'text' | 'link') => {
      let result;
      if (via === 'object') result = validateScenario(value);
      else if (via === 'text') result = parseScenarioText(typeof value === 'string' ? value : JSON.stringify(value) ?? 'undefined');
      else result = decodeScenario(typeof value === 'string' ? value : Buffer.from(JSON.stringify(value) ?? '').toString('base64url'));
      if (!result.ok) {
        rejected++;
        expect(result.problems.length).toBeGreaterThan(0);
        for (const p of result.problems) {
          expect(p.path.length).toBeGreaterThan(0);
          expect(p.message.length).toBeGreaterThan(10);
        }
        return;
      }
      accepted++;
      const sim = new Simulation(module, result.scenario);
      sim.step(50);
      expect(Number.isFinite(sim.maxAbsEz())).toBe(true);
      sim.dispose();
    };
    fc.assert(
      fc.property(
        fc.array(mutation, { minLength: 0, maxLength: 4 }),
        fc.option(fc.constantFrom('grdi', 'probe', 'stpes', '__proto__', 'constructor'), { nil: undefined }),
        fc.constantFrom('object', 'text', 'link') as fc.Arbitrary<'object' | 'text' | 'link'>,
        (m, extra, via) => { check(mutate(m, extra), via); },
      ),
      { numRuns: 8_000, seed: 20261201 },
    );
    fc.assert(
      fc.property(fc.oneof(fc.anything(), fc.string(), fc.json()), fc.constantFrom('object', 'text', 'link') as fc.Arbitrary<'object' | 'text' | 'link'>,
        (v, via) => { check(v, via); }),
      { numRuns: 2_000, seed: 7 },
    );
    console.log(`fuzz: ${accepted} accepted and run 50 steps, ${rejected} rejected`);
    expect(accepted + rejected).toBe(10_000);
    expect(accepted).toBeGreaterThan(500); // the generator really exercises the run path
  }, 120_000);
});
