import { spawn } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it, vi } from 'vitest';
import { main } from '../../src/cli/main.ts';
import { parseCsv } from '../../src/io/csv.ts';
import { validateScenario } from '../../src/scenario/parse.ts';
import { makeScenario } from '../fixtures/scenarios.ts';

// README "Command line" and docs/outputs.md "Study files" are the contract checked here.
const dir = mkdtempSync(join(tmpdir(), 'gridgauge-studies-'));
const file = join(dir, 'small.json');
writeFileSync(file, JSON.stringify(makeScenario({
  grid: { nx: 81, ny: 81 }, steps: 300, frequencies: [3e10],
  source: { x: 0.03, y: 0.04, waveform: { kind: 'modulated-gaussian', f0: 3e10, tau: 1 / 3e10, t0: 5 / 3e10 } },
  probes: [{ name: 'east', x: 0.06, y: 0.04 }, { name: 'corner', x: 0.065, y: 0.065 }],
})));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** Runs the command line in a child process, through bin/gridgauge.js as a user would. */
function spawnCli(...args: string[]): Promise<{ code: number | null; stdout: string; stderr: string }> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, ['bin/gridgauge.js', ...args], { env: { ...process.env, NO_COLOR: '1' } });
    let stdout = '';
    let stderr = '';
    child.stdout.setEncoding('utf8').on('data', (d: string) => { stdout += d; });
    child.stderr.setEncoding('utf8').on('data', (d: string) => { stderr += d; });
    child.on('error', reject);
    child.on('close', (code) => resolve({ code, stdout, stderr }));
  });
}

/** Runs the command line's main() in this process, capturing what it writes (no start-up cost). */
async function cli(...args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  let stdout = '';
  let stderr = '';
  const out = vi.spyOn(process.stdout, 'write').mockImplementation((chunk: string | Uint8Array) => { stdout += String(chunk); return true; });
  const err = vi.spyOn(process.stderr, 'write').mockImplementation((chunk: string | Uint8Array) => { stderr += String(chunk); return true; });
  try {
    const code = await main(args);
    return { code, stdout, stderr };
  } finally {
    out.mockRestore();
    err.mockRestore();
  }
}

describe('gridgauge absorber-study', () => {
  it('through bin/gridgauge.js: --target=-70 --json --out DIR prints only the JSON and writes the contract files', async () => {
    // contract: README "Command line" and docs/outputs.md "Study files" (no outside source applies)
    // README "Command line" (--json: the result and nothing else on stdout) and docs/outputs.md "Study files"
    const out = join(dir, 'absorber');
    const r = await spawnCli('absorber-study', file, '--target=-70', '--json', '--workers', '2', '--out', out);
    expect(r.code).toBe(0);
    const json = JSON.parse(r.stdout);
    expect(json.target_dB).toBe(-70);
    expect(Object.keys(json).slice(0, 4)).toEqual(['target_dB', 'recommended', 'current', 'candidates']);
    for (const key of ['cells', 'order', 'sigmaScale', 'kappaMax', 'alphaMax', 'reflection_dB']) {
      expect(json.current).toHaveProperty(key);
      expect(json.candidates[0]).toHaveProperty(key);
    }
    expect(json.candidates.length).toBeGreaterThan(20);
    if (json.recommended) expect(json.recommended.reflection_dB).toBeLessThanOrEqual(-70);
    const rows = parseCsv(readFileSync(join(out, 'absorber.csv'), 'utf8'));
    expect(rows[0].slice(0, 9).join(',')).toBe('cells,order,sigmaScale,kappaMax,alphaMax,reflection_dB,theory_dB,memory_bytes,seconds');
    expect(rows.length).toBe(json.candidates.length + 1);
    expect(rows.slice(1).every((row) => Number.isFinite(Number(row[5])))).toBe(true);
    expect(JSON.parse(readFileSync(join(out, 'absorber.json'), 'utf8'))).toEqual(json);
    expect(readFileSync(join(out, 'absorber-error.csv'), 'utf8').split('\n')[0]).toMatch(/^t_s,current /);
  });

  it('--target -70 (value as the next argument) prints the table and the recommendation', async () => {
    // contract: README "Command line" and docs/outputs.md "Study files" (no outside source applies)
    // README "Command line": both --target -70 and --target=-70 work
    const r = await cli('absorber-study', file, '--target', '-70');
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/^recommended: .* \(target -70 dB/m);
    expect(r.stdout).toMatch(/^current: /m);
  });

  it('a target nothing meets exits 0 with recommended null and says so', async () => {
    // contract: README "Command line" and docs/outputs.md "Study files" (no outside source applies)
    // README "Command line": such a study exits 0 with recommended: null and says so
    const r = await cli('absorber-study', file, '--target', '-400', '--json');
    expect(r.code).toBe(0);
    expect(JSON.parse(r.stdout).recommended).toBeNull();
    expect(r.stderr).toMatch(/no candidate meets/);
  });

  it('invalid input exits 2: a positive target, a missing file, a bad worker count', async () => {
    // contract: README "Command line" and docs/outputs.md "Study files" (no outside source applies)
    // README "Command line": exit 2 on invalid input
    const runs = [
      await cli('absorber-study', file, '--target', '5'),
      await cli('absorber-study', join(dir, 'missing.json')),
      await cli('absorber-study', file, '--workers', '0'),
    ];
    expect(runs.map((r) => r.code)).toEqual([2, 2, 2]);
    expect(runs.every((r) => r.stdout === '')).toBe(true);
  });

  it('--emit DIR writes valid scenario files and a manifest without running', async () => {
    // contract: README "Command line" and docs/outputs.md "Study files" (no outside source applies)
    // issue text: a study is a list of independent scenarios for any batch scheduler
    const emit = join(dir, 'emit-absorber');
    const r = await cli('absorber-study', file, '--emit', emit, '--long-run', '0'); // one run per candidate, as the emitted set was before the long window
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/not run here/);
    const names = readdirSync(emit);
    expect(names).toContain('reference.json');
    expect(names).toContain('study.json');
    const manifest = JSON.parse(readFileSync(join(emit, 'study.json'), 'utf8'));
    expect(names.length).toBe(manifest.candidates.length + 2);
    for (const name of names.filter((n) => n !== 'study.json')) {
      const check = validateScenario(JSON.parse(readFileSync(join(emit, name), 'utf8')));
      expect(check.ok, `${name}: ${JSON.stringify(check)}`).toBe(true);
    }
  });
});

describe('gridgauge resolution-study', () => {
  it('--size 4 --budget 20 --json prints the JSON with the contract keys; --out writes the CSV header', async () => {
    // contract: README "Command line" and docs/outputs.md "Study files" (no outside source applies)
    // docs/outputs.md "Study files"
    const out = join(dir, 'resolution');
    const r = await cli('resolution-study', file, '--size', '4', '--budget=20', '--min-cells', '10', '--max-cells', '16', '--json', '--out', out);
    expect(r.code).toBe(0);
    const json = JSON.parse(r.stdout);
    expect(Object.keys(json).slice(0, 4)).toEqual(['budget_deg', 'size_wavelengths', 'recommended', 'candidates']);
    expect(json.budget_deg).toBe(20);
    expect(json.size_wavelengths).toBe(4);
    expect(json.candidates.map((c: { cellsPerWavelength: number }) => c.cellsPerWavelength)).toEqual([10, 12, 14, 16]);
    expect(Object.keys(json.recommended).slice(0, 3)).toEqual(['cellsPerWavelength', 'dx_m', 'projected_error_deg']);
    for (const c of json.candidates) expect(c.axis_deg_per_wavelength).toBeGreaterThan(0); // magnitudes of the lag
    const header = readFileSync(join(out, 'resolution.csv'), 'utf8').split('\n')[0];
    expect(header.startsWith('cellsPerWavelength,dx_m,axis_deg_per_wavelength,diagonal_deg_per_wavelength,predicted_axis_deg_per_wavelength,predicted_diagonal_deg_per_wavelength')).toBe(true);
  });

  it('a missing, zero or negative budget or size exits 2', async () => {
    // contract: README "Command line" and docs/outputs.md "Study files" (no outside source applies)
    // issue text and README "Command line": exit 2 on invalid input
    const runs = [
      await cli('resolution-study', file, '--size', '12'),
      await cli('resolution-study', file, '--budget', '5'),
      await cli('resolution-study', file, '--size', '12', '--budget', '0'),
      await cli('resolution-study', file, '--size', '12', '--budget=-3'),
    ];
    expect(runs.map((r) => r.code)).toEqual([2, 2, 2, 2]);
    const negative = runs[3];
    expect(negative.code).toBe(2);
    expect(negative.stderr).toMatch(/--budget/);
    expect(negative.stdout).toBe('');
  });

  it('a budget nothing meets exits 0 with recommended null', async () => {
    // contract: README "Command line" and docs/outputs.md "Study files" (no outside source applies)
    // README "Command line"
    const r = await cli('resolution-study', file, '--size', '100', '--budget', '0.01', '--min-cells', '8', '--max-cells', '8', '--json');
    expect(r.code).toBe(0);
    expect(JSON.parse(r.stdout).recommended).toBeNull();
  });

  it('--emit DIR writes one valid measurement scenario per resolution', async () => {
    // contract: README "Command line" and docs/outputs.md "Study files" (no outside source applies)
    // issue text: studies can be written out as scenario files
    const emit = join(dir, 'emit-resolution');
    expect((await cli('resolution-study', file, '--size', '12', '--budget', '5', '--emit', emit)).code).toBe(0);
    const names = readdirSync(emit).filter((n) => n !== 'study.json');
    expect(names.length).toBe(16);
    for (const name of names) {
      const check = validateScenario(JSON.parse(readFileSync(join(emit, name), 'utf8')));
      expect(check.ok, `${name}: ${JSON.stringify(check)}`).toBe(true);
    }
  });
});
