/**
 * The golden-output cases: the example scenarios run through the real command line, and
 * two small studies, with their files kept under test/golden/<case>/. Values that depend
 * on the machine (wall-clock seconds, worker counts, measured speed) are removed before
 * comparing; everything else must match byte for byte. `npx tsx scripts/golden.mts --write`
 * rewrites the files, which is only right when an issue changes an output on purpose.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

export interface GoldenCase { name: string; args: string[] }

export const GOLDEN_CASES: GoldenCase[] = [
  { name: 'demo-run', args: ['run', 'examples/demo.json'] },
  { name: 'coarse-dielectric-run', args: ['run', 'examples/coarse-dielectric.json'] },
  { name: 'small-absorber-study', args: ['absorber-study', 'test/golden/small.json', '--target', '-40', '--workers', '2'] },
  { name: 'small-resolution-study', args: ['resolution-study', 'test/golden/small.json', '--size', '6', '--budget', '10', '--min-cells', '8', '--max-cells', '12', '--workers', '2'] },
];

/** Keys whose values depend on the machine or the moment, dropped from JSON before comparing. */
const VOLATILE_KEYS = new Set(['run_seconds', 'seconds', 'study_seconds', 'workers', 'mcells_per_second']);
/** CSV columns dropped for the same reason. */
const VOLATILE_COLUMNS = new Set(['seconds', 'project_seconds']);

function stripJson(value: unknown): unknown {
  if (Array.isArray(value)) return value.map(stripJson);
  if (value && typeof value === 'object') {
    return Object.fromEntries(Object.entries(value).filter(([k]) => !VOLATILE_KEYS.has(k)).map(([k, v]) => [k, stripJson(v)]));
  }
  return value;
}

function stripCsv(text: string): string {
  const lines = text.split('\n');
  const header = lines[0].split(',');
  const keep = header.map((h) => !VOLATILE_COLUMNS.has(h));
  // columns dropped here are plain numbers, so splitting on commas is safe for them; quoted
  // cells elsewhere in the row keep their commas because only whole rows without quotes are cut
  return lines.map((line) => (line.includes('"') || !keep.includes(false) ? line : line.split(',').filter((_, k) => keep[k]).join(','))).join('\n');
}

/** A file's text with the machine-dependent parts removed. */
export function stableText(name: string, text: string): string {
  if (name.endsWith('.json')) return `${JSON.stringify(stripJson(JSON.parse(text)), null, 2)}\n`;
  if (name.endsWith('.csv')) return stripCsv(text);
  return text;
}

/** Runs one case through bin/gridgauge.js into a fresh folder; returns its files' stable text by name. */
export function produce(c: GoldenCase): Record<string, string> {
  const dir = mkdtempSync(join(tmpdir(), `gridgauge-golden-${c.name}-`));
  try {
    const r = spawnSync(process.execPath, ['bin/gridgauge.js', ...c.args, '--out', dir], { encoding: 'utf8', env: { ...process.env, NO_COLOR: '1' } });
    if (r.status !== 0) throw new Error(`${c.args.join(' ')} exited ${r.status}: ${r.stderr}`);
    const files: Record<string, string> = {};
    for (const name of readdirSync(dir).sort()) files[name] = stableText(name, readFileSync(join(dir, name), 'utf8'));
    return files;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
