import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { GOLDEN_CASES, produce } from './cases.ts';

// The outputs users' scripts read must not change unless an issue says so: each case's files
// as the command line writes them now, against the committed copy (machine-dependent timing
// fields removed). Common practice, no source.
describe('golden outputs', () => {
  for (const c of GOLDEN_CASES) {
    it(`${c.name}: ${c.args.join(' ')}`, () => {
      const dir = join('test/golden', c.name);
      const expected = Object.fromEntries(readdirSync(dir).sort().map((name) => [name, readFileSync(join(dir, name), 'utf8')]));
      const actual = produce(c);
      expect(Object.keys(actual)).toEqual(Object.keys(expected));
      for (const name of Object.keys(expected)) expect(actual[name], `${c.name}/${name}`).toBe(expected[name]);
    }, 240_000);
  }
});
