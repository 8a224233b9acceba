// Rewrites test/golden/<case>/ from the current build: run it only when an issue changes an
// output on purpose, and say so in the commit. Usage: npx tsx scripts/golden.mts --write
import { mkdirSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { GOLDEN_CASES, produce } from '../test/golden/cases.ts';

if (!process.argv.includes('--write')) {
  console.error('usage: npx tsx scripts/golden.mts --write   (rewrites the golden files)');
  process.exit(2);
}
for (const c of GOLDEN_CASES) {
  const dir = join('test/golden', c.name);
  rmSync(dir, { recursive: true, force: true });
  mkdirSync(dir, { recursive: true });
  const files = produce(c);
  for (const [name, text] of Object.entries(files)) writeFileSync(join(dir, name), text);
  console.log(`${c.name}: ${Object.keys(files).join(', ')}`);
}
