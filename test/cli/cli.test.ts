import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseCsv } from '../../src/io/csv.ts';

const gridgauge = (...args: string[]) => {
  const r = spawnSync(process.execPath, ['bin/gridgauge.js', ...args], { encoding: 'utf8', env: { ...process.env, NO_COLOR: '1' } });
  return { code: r.status, stdout: r.stdout, stderr: r.stderr };
};
const tmp = () => mkdtempSync(join(tmpdir(), 'gridgauge-'));

describe('gridgauge run', () => {
  it('writes the four files with the documented columns for the demo', () => {
    // contract: docs/outputs.md "Files of a run" and README "Command line" (no outside source applies)
    const out = tmp();
    const r = gridgauge('run', 'examples/demo.json', '--out', out);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/probe "near"/);
    expect(r.stdout).toMatch(/relErrMax/);
    const ts = parseCsv(readFileSync(join(out, 'timeseries.csv'), 'utf8'));
    expect(ts[0]).toEqual(['t_s', 'near.fdtd', 'near.exact', 'far.fdtd', 'far.exact', 'diagonal.fdtd', 'diagonal.exact']);
    expect(ts.length).toBe(1 + 1201); // header + samples n = 0..steps
    const sp = parseCsv(readFileSync(join(out, 'spectra.csv'), 'utf8'));
    // the contract's columns, then the additions at the end (predicted magnitude error, note)
    expect(sp[0].join(',')).toBe('probe,f_Hz,rho_m,fdtd_re,fdtd_im,exact_re,exact_im,mag_err_dB,phase_err_deg,predicted_phase_err_deg,predicted_mag_err_dB,note');
    expect(sp.length).toBe(1 + 3 * 3);
    const ln = parseCsv(readFileSync(join(out, 'lines.csv'), 'utf8'));
    expect(ln[0].join(',')).toBe('line,s_m,x_m,y_m,rho_m,f_Hz,fdtd_re,fdtd_im,exact_re,exact_im,mag_err_dB,phase_err_deg');
    // a line of 121 nodes (0.16..0.28 m at 1 mm) at three frequencies, ordered by frequency then s_m
    expect(ln.length).toBe(1 + 3 * 121);
    expect(Number(ln[1][1])).toBe(0);
    expect(Number(ln[2][1])).toBeCloseTo(0.001, 15);
    const summary = JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8'));
    expect(summary.steps).toBe(1200);
    expect(summary.source).toEqual({ i: 150, j: 150, x_m: 0.15, y_m: 0.15 });
    expect(summary.probes.map((p: { name: string }) => p.name)).toEqual(['near', 'far', 'diagonal']);
    for (const p of summary.probes) expect(p.relErrMax).toBeGreaterThan(0);
    expect(summary.probes[0].relErrMax).toBeLessThan(0.05);
  }, 60_000);

  it('with an object in the grid, the predicted column says there is no prediction, and why', () => {
    const r = gridgauge('run', 'examples/metal-post.json');
    expect(r.code).toBe(0); // common practice, no source
    const rows = r.stdout.split('\n').filter((l) => /^\s+10 GHz/.test(l));
    expect(rows.length).toBeGreaterThan(0); // common practice, no source
    for (const row of rows) expect(row.trimEnd().endsWith('—')).toBe(true); // no degree sign on a missing value, common practice, no source
    expect(r.stdout).toContain('predicted —: no plane-wave prediction there'); // common practice, no source
    const demo = gridgauge('run', 'examples/demo.json');
    expect(demo.stdout).not.toContain('predicted —'); // common practice, no source
  });

  it('--json prints summary.json on stdout and nothing else', () => {
    // contract: docs/outputs.md "Files of a run" and README "Command line" (no outside source applies)
    const r = gridgauge('run', 'examples/demo.json', '--json');
    expect(r.code).toBe(0);
    const parsed = JSON.parse(r.stdout);
    expect(parsed.dt_s).toBeCloseTo(0.5 * 1e-3 / 299_792_458, 20);
    expect(r.stderr).toMatch(/run/); // progress went to stderr
  }, 60_000);

  it('refuses invalid input with exit 2, one message per problem, no stack trace', () => {
    // contract: docs/outputs.md "Files of a run" and README "Command line" (no outside source applies)
    const dir = tmp();
    const bad = join(dir, 'bad.json');
    const demo = JSON.parse(readFileSync('examples/demo.json', 'utf8'));
    demo.grid.courant = 0.75;
    demo.grid.courrant = 0.5;
    writeFileSync(bad, JSON.stringify(demo));
    const r = gridgauge('run', bad, '--out', join(dir, 'o'));
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/grid\.courant: 0\.75 is above the 2D stability limit 0\.7071/);
    expect(r.stderr).toMatch(/grid\.courrant: .*did you mean grid\.courant/);
    expect(r.stderr).not.toMatch(/\n\s+at /);
  });

  it('reports a missing file and malformed JSON with exit 2', () => {
    // contract: docs/outputs.md "Files of a run" and README "Command line" (no outside source applies)
    expect(gridgauge('check', 'no/such/file.json').code).toBe(2);
    const dir = tmp();
    const broken = join(dir, 'broken.json');
    writeFileSync(broken, '{\n  "grid": { "nx": 10,,\n}');
    const r = gridgauge('check', broken);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/line 2/);
    expect(r.stderr).toMatch(/column/);
  });

  it('rejects unknown commands and options with exit 2', () => {
    // contract: docs/outputs.md "Files of a run" and README "Command line" (no outside source applies)
    expect(gridgauge('fly').code).toBe(2);
    const r = gridgauge('run', 'examples/demo.json', '--speed=3');
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/unknown option --speed/);
  });
});

describe('gridgauge check', () => {
  it('prints derived quantities, and JSON with --json', () => {
    // contract: docs/outputs.md "Files of a run" and README "Command line" (no outside source applies)
    const r = gridgauge('check', 'examples/demo.json', '--json');
    expect(r.code).toBe(0);
    const d = JSON.parse(r.stdout).derived;
    // 1 mm cells, S = 0.5: dt = 0.5·1e-3/c0 (docs/physics.md definition of S)
    expect(d.dt_s).toBeCloseTo(1.6678204759907604e-12, 24);
    expect(d.cellsPerWavelengthAtF0).toBeCloseTo(29.98, 2);
    expect(gridgauge('check', 'examples/demo.json').stdout).toMatch(/cellsPerWavelengthAtBandEdge/);
  });

  it('--help lists every verb', () => {
    // contract: docs/outputs.md "Files of a run" and README "Command line" (no outside source applies)
    const r = gridgauge('--help');
    expect(r.code).toBe(0);
    for (const verb of ['run', 'check', 'absorber-study', 'resolution-study', 'bench']) expect(r.stdout).toContain(`gridgauge ${verb}`);
  });
});
