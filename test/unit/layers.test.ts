import { readdirSync, readFileSync, statSync } from 'node:fs';
import { dirname, join, normalize, relative } from 'node:path';
import { describe, expect, it } from 'vitest';

/**
 * The layers of src/, bottom first (DEVELOPERS.md "Layout"). A file may import from its own
 * folder and from any folder of a lower group; within a group only the bottom one (scenario
 * and exact, side by side) may import across. Anything else is an upward import.
 * Common practice, no source.
 */
const LAYERS: string[][] = [['scenario', 'exact'], ['engine'], ['compare'], ['studies'], ['io'], ['cli', 'app']];
/** Longest a file in src/ may grow, lines (DEVELOPERS.md: split a file that outgrows it). */
const MAX_LINES = 400;

const groupOf = (folder: string) => LAYERS.findIndex((g) => g.includes(folder));

function sourceFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    return statSync(path).isDirectory() ? sourceFiles(path) : /\.(ts|mts|mjs|js)$/.test(name) ? [path] : [];
  });
}

/** Every module a file names: static imports and re-exports, import(), and new URL(…, import.meta.url). */
export function importedPaths(text: string): string[] {
  const found: string[] = [];
  const patterns = [
    /(?:^|\n)\s*(?:import|export)\b[^'"`;]*?from\s*['"]([^'"]+)['"]/g,
    /(?:^|\n)\s*import\s*['"]([^'"]+)['"]/g,
    /\bimport\(\s*(?:\/\*[^*]*\*\/\s*)?['"]([^'"]+)['"]\s*\)/g,
    /new URL\(\s*['"]([^'"]+)['"]\s*,\s*import\.meta\.url\s*\)/g,
  ];
  for (const p of patterns) for (const m of text.matchAll(p)) found.push(m[1]);
  return found;
}

function folderOf(file: string): string | undefined {
  const parts = relative('src', file).split(/[\\/]/);
  return parts.length > 1 ? parts[0] : undefined;
}

describe('layers', () => {
  const files = sourceFiles('src');

  it('every folder of src/ has a place in the order', () => {
    const folders = new Set(files.map(folderOf).filter((f): f is string => f !== undefined));
    for (const f of folders) expect(groupOf(f), `src/${f} is not in LAYERS`).toBeGreaterThanOrEqual(0);
  });

  it('imports only run downward', () => {
    const upward: string[] = [];
    for (const file of files) {
      const from = folderOf(file);
      if (!from) continue;
      for (const spec of importedPaths(readFileSync(file, 'utf8'))) {
        if (!spec.startsWith('.')) continue;
        const target = normalize(join(dirname(file), spec));
        const to = folderOf(target);
        if (!to || to === from || !target.startsWith('src')) continue;
        const a = groupOf(from);
        const b = groupOf(to);
        if (b > a || (b === a && a !== 0)) upward.push(`${file} → ${spec}`);
      }
    }
    expect(upward).toEqual([]);
  });

  it('the import reader sees every form of import', () => {
    const text = "import a from '../x/a.ts';\nexport { b } from './b.ts';\nimport './c.ts';\nconst d = await import('../d/d.ts');\nnew URL('../e/e.ts', import.meta.url);";
    expect(importedPaths(text).sort()).toEqual(['../d/d.ts', '../e/e.ts', '../x/a.ts', './b.ts', './c.ts']);
  });

  it(`no file in src/ is longer than ${MAX_LINES} lines`, () => {
    const long = files
      .map((f) => ({ f, lines: readFileSync(f, 'utf8').split('\n').length }))
      .filter((x) => x.lines > MAX_LINES)
      .map((x) => `${x.f}: ${x.lines}`);
    expect(long).toEqual([]);
  });
});
