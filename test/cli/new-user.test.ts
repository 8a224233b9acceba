/**
 * What a new user hit, each as it was reported (README "Warnings"; docs/scenario.md): a unit
 * slip that hung `check`, silent nonsense that now warns, advice that broke its own rule,
 * an ignored extra argument and a message printed twice. Common practice, no source.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { demoScenario } from '../../src/scenario/defaults.ts';

const gridgauge = (...args: string[]) => {
  const r = spawnSync(process.execPath, ['bin/gridgauge.js', ...args], { encoding: 'utf8', timeout: 60_000 });
  return { code: r.status, stdout: r.stdout, stderr: r.stderr };
};
const dir = mkdtempSync(join(tmpdir(), 'gridgauge-new-user-'));
const file = (name: string, value: unknown) => {
  const path = join(dir, name);
  writeFileSync(path, JSON.stringify(value));
  return path;
};
const board = (grid: Record<string, number>, extra: Record<string, unknown> = {}) => ({
  grid: { nx: 100, ny: 100, dx: 0.001, dy: 0.001, courant: 0.5, ...grid },
  medium: { epsR: 4.4 },
  source: { x: 0.05, y: 0.05, waveform: { kind: 'modulated-gaussian', f0: 5e9 } },
  probes: [{ name: 'p', x: 0.07, y: 0.05 }],
  steps: 600,
  ...extra,
});

describe('what a new user hit', () => {
  it('f0 typed as 5 (GHz meant) with tau 0.2 ns: check answers at once instead of hanging', () => {
    const s = board({}, { source: { x: 0.05, y: 0.05, waveform: { kind: 'modulated-gaussian', f0: 5, tau: 2e-10 } } });
    const r = gridgauge('check', file('slow-f0.json', s));
    expect(r.code).toBe(0); // a hang would hit the 60 s timeout and give a null status
  });

  it('millimetres typed as metres (dx = 1 at 5 GHz): the first line says so', () => {
    const r = gridgauge('check', file('metres.json', board({ dx: 1, dy: 1 }, { source: { x: 50, y: 50, waveform: { kind: 'modulated-gaussian', f0: 5e9 } }, probes: [] })));
    expect(r.code).toBe(0);
    const first = r.stdout.split('\n')[0];
    expect(first).toMatch(/^warning: grid\.dx: .*did you mean 1 mm/);
  });

  it('the same slip with an analysis frequency: the refusal says so too', () => {
    const r = gridgauge('check', file('metres-f.json', board({ dx: 1, dy: 1 }, { source: { x: 50, y: 50, waveform: { kind: 'modulated-gaussian', f0: 5e9 } }, probes: [], frequencies: [5e9] })));
    expect(r.code).toBe(2);
    expect(r.stderr.split('\n')[0]).toMatch(/did you mean 1 mm/);
  });

  it('a run too short for the pulse: warnings in check, run and summary.json, and the probe is "not reached"', () => {
    const path = file('short.json', board({}, { frequencies: [5e9], steps: 40 }));
    expect(gridgauge('check', path).stdout).toMatch(/warning: probes\[0\]: .*before the pulse reaches this probe/);
    const r = gridgauge('run', path, '--json');
    expect(r.code).toBe(0);
    const summary = JSON.parse(r.stdout);
    expect(summary.warnings.map((w: { code: string }) => w.code)).toContain('not-reached');
    expect(summary.probes[0].reached).toBe(false);
    expect(summary.probes[0].relErrMax).toBeNull();
    expect(summary.probes[0].spectra[0].note).toBe('not reached');
    expect(summary.probes[0].spectra[0].phase_err_deg).toBeNull();
    const table = gridgauge('run', path).stdout;
    expect(table).toMatch(/not reached/);
    expect(table).not.toMatch(/−3\d\d dB|180°/);
  });

  it('a valid, resolved run has no warnings', () => {
    const r = gridgauge('run', 'examples/demo.json', '--json');
    expect(JSON.parse(r.stdout).warnings).toEqual([]);
  });

  it('run FILE extra.json refuses the extra argument instead of ignoring it', () => {
    const r = gridgauge('run', 'examples/demo.json', 'extra.json');
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/"extra\.json" was given too/);
  });

  it('--target=-70dB suggests -70, a target the rule accepts', () => {
    const r = gridgauge('absorber-study', 'examples/demo.json', '--target=-70dB');
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/e\.g\. -70\b/);
  });

  it('a grid too large: grid.nx and grid.ny each say what to change, not the same line twice', () => {
    const s = demoScenario();
    const r = gridgauge('check', file('huge.json', { ...s, grid: { ...s.grid, nx: 40000, ny: 40000 } }));
    expect(r.code).toBe(2);
    const lines = r.stderr.trim().split('\n');
    expect(lines.length).toBe(2);
    expect(lines[0]).toMatch(/^grid\.nx: /);
    expect(lines[1]).toMatch(/^grid\.ny: /);
    expect(lines[0].replace('grid.nx: ', '')).not.toBe(lines[1].replace('grid.ny: ', ''));
  });

  it('the resolution table shows dy when the cells are not square', () => {
    const s = { ...demoScenario(), grid: { ...demoScenario().grid, dy: 0.002, ny: 150 }, probes: [], lines: [] };
    s.source = { ...s.source, y: 0.15 };
    const r = gridgauge('resolution-study', file('aspect.json', s), '--size', '4', '--budget', '20', '--min-cells', '8', '--max-cells', '10', '--workers', '1');
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/\bdy\b/);
  });
});
