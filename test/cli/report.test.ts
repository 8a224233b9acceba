/**
 * `gridgauge report` through the real command line (README "Design-review report"): the file
 * written where --out says (a file or a folder), studies from every --with folder in the order
 * given, and exit code 2 with a message naming the problem for a missing folder, a folder
 * without a study, a broken study file or a missing scenario. Also the repeatable option of
 * the argument parser. Contract tests: no outside source applies.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { listOption, parseArgs, UsageError } from '../../src/cli/args.ts';
import { errorMapPlan } from '../../src/cli/report-command.ts';
import { scenarioMemoryBytes } from '../../src/scenario/derived.ts';
import { demoScenario } from '../../src/scenario/defaults.ts';
import { MEMORY_CAP_BYTES } from '../../src/scenario/memory.ts';

const gridgauge = (...args: string[]) => {
  const r = spawnSync(process.execPath, ['bin/gridgauge.js', ...args], { encoding: 'utf8', env: { ...process.env, NO_COLOR: '1' } });
  return { code: r.status, stdout: r.stdout, stderr: r.stderr };
};
const tmp = () => mkdtempSync(join(tmpdir(), 'gridgauge-report-'));

describe('gridgauge report', () => {
  it('runs the scenario and writes one HTML file with the studies of every --with folder, in order', () => {
    const out = join(tmp(), 'nested', 'review.html');
    const r = gridgauge('report', 'test/golden/small.json', '--with', 'test/golden/small-resolution-study', '--out', out, '--with=test/golden/small-absorber-study');
    expect(r.code, r.stderr).toBe(0);
    expect(r.stdout).toContain(`wrote ${out}`);
    expect(r.stdout).toContain('2 studies');
    const html = readFileSync(out, 'utf8');
    expect(html.startsWith('<!DOCTYPE html>')).toBe(true);
    expect(html.indexOf('>Resolution study</h2>')).toBeGreaterThan(0);
    expect(html.indexOf('>Absorber study</h2>')).toBeGreaterThan(html.indexOf('>Resolution study</h2>'));
    expect(html).toContain('No resolution meets the budget 10° across 6 wavelengths'); // the golden study recommends nothing
    expect(html).toContain('Recommended: 4 cells, m 3');
    expect(html).toMatch(/<img src="data:image\/png;base64,/);
    expect(html).toContain('gridgauge 0.1.0 · Node v');
  });

  it('writes report.html into --out when it names a folder', () => {
    const dir = tmp();
    const r = gridgauge('report', 'test/golden/small.json', '--out', `${dir}/`);
    expect(r.code, r.stderr).toBe(0);
    expect(existsSync(join(dir, 'report.html'))).toBe(true);
    expect(readFileSync(join(dir, 'report.html'), 'utf8')).toContain('none included (add study output folders with --with DIR)');
  });

  it('exits 2 naming the folder or file at fault', () => {
    const missing = gridgauge('report', 'test/golden/small.json', '--with', 'no/such/folder', '--out', join(tmp(), 'r.html'));
    expect(missing.code).toBe(2);
    expect(missing.stderr).toContain('--with no/such/folder: no such folder');
    const empty = gridgauge('report', 'test/golden/small.json', '--with', 'test/golden/demo-run', '--out', join(tmp(), 'r.html'));
    expect(empty.code).toBe(2);
    expect(empty.stderr).toContain('holds no study file');
    const broken = tmp();
    writeFileSync(join(broken, 'absorber.json'), '{ "candidates": [');
    const bad = gridgauge('report', 'test/golden/small.json', '--with', broken, '--out', join(tmp(), 'r.html'));
    expect(bad.code).toBe(2);
    expect(bad.stderr).toContain('absorber.json: is not valid JSON');
    const noFile = gridgauge('report', '--out', join(tmp(), 'r.html'));
    expect(noFile.code).toBe(2);
    expect(gridgauge('report', 'test/golden/small.json', '--width', '3').code).toBe(2);
  });

  it('skips JSON files that are not studies but keeps one a later study wrote', () => {
    const dir = tmp();
    mkdirSync(join(dir, 'later'));
    writeFileSync(join(dir, 'later', 'study.json'), JSON.stringify({ study: 'x', candidates: [{ file: 'a.json' }] })); // an --emit manifest
    writeFileSync(join(dir, 'later', 'staircase.json'), JSON.stringify({ budget_deg: 3, recommended: { cells: 12 }, candidates: [{ cells: 12 }] }));
    const out = join(dir, 'r.html');
    const r = gridgauge('report', 'test/golden/small.json', '--with', join(dir, 'later'), '--out', out);
    expect(r.code, r.stderr).toBe(0);
    const html = readFileSync(out, 'utf8');
    expect(html).toContain('>Study: staircase</h2>');
    expect(html).not.toContain('Study: study<');
  });
});

describe('error map plan', () => {
  it('maps the first analysis frequency, unless there is none or the full-grid DFT would pass the memory cap', () => {
    expect(errorMapPlan(demoScenario())).toEqual({ frequency: 5e9 });
    expect(errorMapPlan({ ...demoScenario(), frequencies: [] }).note).toBe('the scenario has no analysis frequency to map');
    // 12 000² nodes: fields fit under the 2 GiB cap (12 bytes a node), fields and map do not (20 bytes a node)
    const big = { ...demoScenario(), grid: { ...demoScenario().grid, nx: 12_000, ny: 12_000 }, probes: [], lines: [] };
    expect(scenarioMemoryBytes(big)).toBeLessThan(MEMORY_CAP_BYTES);
    const plan = errorMapPlan(big);
    expect(plan.frequency).toBeUndefined();
    expect(plan.note).toMatch(/above the 2 GiB memory cap/);
  });
});

describe('repeatable options', () => {
  it('keeps every value in order, and the last one for single-valued use', () => {
    const a = parseArgs(['f.json', '--with', 'a', '--with=b', '--out', 'x', '--with', 'c'], ['with', 'out'], ['json']);
    expect(listOption(a, 'with')).toEqual(['a', 'b', 'c']);
    expect(a.options.get('with')).toBe('c');
    expect(listOption(a, 'out')).toEqual(['x']);
    expect(listOption(a, 'json')).toEqual([]);
    expect(listOption({ positional: [], options: new Map([['with', 'z']]) }, 'with')).toEqual(['z']); // built without `repeated`
    expect(() => parseArgs(['--with'], ['with'], [])).toThrow(UsageError);
  });
});
