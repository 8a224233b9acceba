import { describe, expect, it } from 'vitest';
import { demoScenario } from '../../src/scenario/defaults.ts';
import { validateScenario } from '../../src/scenario/parse.ts';
import { absorberStudy } from '../../src/studies/absorber-study.ts';
import { resolutionStudy } from '../../src/studies/resolution-study.ts';

/**
 * Every message that offers an example ("e.g. 0.001") must offer one its own rule accepts:
 * each case below puts a wrong value in one field, takes the example from the message for
 * that field, puts the example in its place, and validates again. Common practice, no source.
 */
const example = (message: string): number | undefined => {
  const m = /(?:e\.g\.|such as) (?:--[a-z-]+[= ])?(-?[0-9][0-9.]*(?:e[-+]?[0-9]+)?)/.exec(message);
  return m ? Number(m[1]) : undefined;
};

function setAt(target: Record<string, unknown>, path: (string | number)[], value: unknown): void {
  let o = target as Record<string | number, unknown>;
  for (const key of path.slice(0, -1)) o = o[key] as Record<string | number, unknown>;
  o[path[path.length - 1]] = value;
}

const render = (path: (string | number)[]) => path.map((p, k) => (typeof p === 'number' ? `[${p}]` : k === 0 ? p : `.${p}`)).join('');

const CASES: [(string | number)[], unknown][] = [
  [['grid', 'nx'], 'wide'], [['grid', 'nx'], 1.5], [['grid', 'ny'], -4], [['grid', 'dx'], 0], [['grid', 'dx'], 'thin'], [['grid', 'dy'], -1],
  [['grid', 'courant'], 0], [['grid', 'courant'], 'fast'], [['medium', 'epsR'], 0.5], [['medium', 'epsR'], 'glass'],
  [['absorber', 'cells'], -2], [['absorber', 'cells'], 2.5], [['absorber', 'order'], 0], [['absorber', 'sigmaScale'], -1],
  [['absorber', 'kappaMax'], 0.5], [['absorber', 'alphaMax'], -0.1],
  [['source', 'x'], 'middle'], [['source', 'amplitude'], 'big'], [['source', 'waveform', 'f0'], 0], [['source', 'waveform', 'tau'], -1e-10],
  [['source', 'waveform', 't0'], -1e-9], [['frequencies', 0], -5], [['steps'], 0], [['steps'], 'many'],
];

describe('every example in a scenario message passes its own rule', () => {
  for (const [path, bad] of CASES) {
    it(`${render(path)} = ${JSON.stringify(bad)}`, () => {
      const s = structuredClone(demoScenario()) as unknown as Record<string, unknown>;
      setAt(s, path, bad);
      const r = validateScenario(s);
      expect(r.ok).toBe(false);
      const message = r.ok ? '' : r.problems.find((p) => p.path === render(path))?.message ?? '';
      const value = example(message);
      expect(value, message).toBeDefined();
      setAt(s, path, value);
      const again = validateScenario(s);
      expect(again.ok ? [] : again.problems.filter((p) => p.path === render(path)).map((p) => p.message)).toEqual([]);
    });
  }
});

describe('every example in a study option message passes its own rule', () => {
  const cases: [typeof absorberStudy | typeof resolutionStudy, Record<string, string>, string][] = [
    [absorberStudy, { target: '-70dB' }, 'target'],
    [absorberStudy, { target: 'deep' }, 'target'],
    [absorberStudy, { cells: '4, eight' }, 'cells'],
    [resolutionStudy, { size: '12 wavelengths', budget: '5' }, 'size'],
    [resolutionStudy, { size: '12', budget: '5°' }, 'budget'],
    [resolutionStudy, { size: '12', budget: '5', 'min-cells': 'few' }, 'min-cells'],
  ];
  for (const [study, values, name] of cases) {
    it(`${study.verb} --${name}=${values[name]}`, () => {
      const { problems } = study.readOptions(values);
      const message = problems.find((p) => p.startsWith(`${name}:`)) ?? '';
      expect(message).not.toBe('');
      const text = /e\.g\. ([-0-9., ]*[0-9])/.exec(message)?.[1];
      expect(text, message).toBeDefined();
      const again = study.readOptions({ ...values, [name]: text });
      expect(again.problems.filter((p) => p.startsWith(`${name}:`))).toEqual([]);
    });
  }
});
