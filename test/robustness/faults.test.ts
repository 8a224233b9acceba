import { spawn, spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { BlowUpWatch } from '../../src/engine/blow-up.ts';
import { Simulation } from '../../src/engine/simulation.ts';
import { collectResults } from '../../src/compare/results.ts';
import { parseCsv } from '../../src/io/csv.ts';
import { runFiles } from '../../src/io/outputs.ts';
import { demoScenario } from '../../src/scenario/defaults.ts';
import { parseScenarioText } from '../../src/scenario/parse.ts';
import { makeScenario } from '../fixtures/scenarios.ts';

const runUntilStopped = async (courant: number, cells: number, steps: number) => {
  const sim = await Simulation.create(makeScenario({
    grid: { nx: 61, ny: 61, courant }, absorber: { cells }, probes: [{ name: 'p', x: 0.04, y: 0.03 }], frequencies: [1e10], steps,
  }));
  const watch = new BlowUpWatch(sim);
  let stop;
  while (sim.stepsLeft > 0 && !stop) { sim.step(50); stop = watch.check(); }
  return { sim, stop };
};

describe('blow-up detection', () => {
  it('stops a run above the stability limit, names the step and the cause, and keeps what was recorded', async () => {
    // S = 0.75 > 1/√2 grows without bound (Taflove & Hagness ch. 4)
    const { sim, stop } = await runUntilStopped(0.75, 10, 20_000);
    expect(stop).toBeDefined();
    expect(stop!.step).toBeLessThan(20_000);
    expect(stop!.reason).toMatch(/step \d+/);
    // what was recorded up to that step is still exportable
    const files = runFiles(collectResults(sim));
    const rows = parseCsv(files['timeseries.csv']);
    expect(rows.length).toBe(1 + sim.stepsDone + 1);
  });

  it('catches slow growth through the energy before any NaN', async () => {
    const { sim, stop } = await runUntilStopped(0.709, 10, 20_000);
    expect(stop?.reason).toMatch(/energy kept growing/);
    expect(Number.isFinite(sim.maxAbsEz())).toBe(true);
  });

  it('raises no false alarm on a stable run with CPML or in a PEC box', async () => {
    // common practice, no source: a lossless scheme inside its limit cannot gain energy
    expect((await runUntilStopped(0.7, 10, 6000)).stop).toBeUndefined();
    expect((await runUntilStopped(0.7, 0, 6000)).stop).toBeUndefined();
  });
});

describe('nothing lost', () => {
  it('an export round-trips exactly: every CSV number reads back to the same double', async () => {
    // ECMAScript Number::toString gives the shortest round-tripping decimal (ECMA-262, 6.1.6.1.20); RFC 4180 for the CSV
    const sim = await Simulation.create(demoScenario());
    sim.run();
    const r = collectResults(sim);
    const files = runFiles(r);
    const ts = parseCsv(files['timeseries.csv']);
    for (let n = 0; n <= r.steps; n++) {
      expect(Number(ts[n + 1][0])).toBe(n * r.dt_s);
      r.probes.forEach((p, k) => {
        expect(Number(ts[n + 1][1 + 2 * k])).toBe(p.fdtd[n]);
        expect(Number(ts[n + 1][2 + 2 * k])).toBe(p.exact[n]);
      });
    }
    const sp = parseCsv(files['spectra.csv']);
    r.probes.forEach((p, k) => p.spectra.forEach((s, f) => {
      const row = sp[1 + k * r.frequencies.length + f];
      expect(row[0]).toBe(p.name);
      expect(row.slice(1, -1).map(Number)).toEqual([s.f_Hz, s.rho_m, ...s.fdtd, ...s.exact, s.mag_err_dB, s.phase_err_deg, s.predicted_phase_err_deg, s.predicted_mag_err_dB]);
      expect(row[row.length - 1]).toBe(s.note);
    }));
    const summary = JSON.parse(files['summary.json']);
    expect(summary.probes.map((p: { relErrMax: number }) => p.relErrMax)).toEqual(r.probes.map((p) => p.relErrMax));
  });

  it('a scenario round-trips exactly through its JSON text', () => {
    // RFC 8259 JSON numbers with ECMAScript's shortest round-trip formatting (ECMA-262)
    const s = demoScenario();
    const back = parseScenarioText(JSON.stringify(s, null, 2));
    expect(back.ok && back.scenario).toEqual(s);
  });

  it('a file of a newer format version is refused as newer, not guessed at', () => {
    // contract: docs/scenario.md (version above 1 is an error)
    const r = parseScenarioText(JSON.stringify({ ...demoScenario(), version: 2 }));
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.problems[0].message).toMatch(/newer/);
  });
});

describe('limits and interruption', () => {
  it('Ctrl-C during a long CLI run still writes what it has and says it is incomplete', async () => {
    // exit status 128 + SIGINT(2) = 130 for a run ended by Ctrl-C (POSIX shell convention, common practice)
    const dir = mkdtempSync(join(tmpdir(), 'gridgauge-int-'));
    const scenario = { ...demoScenario(), grid: { ...demoScenario().grid, nx: 600, ny: 600 }, steps: 400_000 };
    writeFileSync(join(dir, 'long.json'), JSON.stringify(scenario));
    const child = spawn(process.execPath, ['bin/gridgauge.js', 'run', join(dir, 'long.json'), '--out', join(dir, 'out')], { stdio: ['ignore', 'pipe', 'pipe'] });
    let stderr = '';
    child.stderr.on('data', (d) => { stderr += String(d); });
    // wait until the run has made progress, then interrupt it as a terminal's Ctrl-C would
    await new Promise<void>((resolve) => {
      const poll = setInterval(() => { if (/run: \d+%|run \[/.test(stderr)) { clearInterval(poll); resolve(); } }, 100);
    });
    child.kill('SIGINT');
    const code = await new Promise<number | null>((resolve) => child.on('exit', resolve));
    expect(code).toBe(130);
    expect(stderr).toMatch(/interrupted at step \d+/);
    const summary = JSON.parse(readFileSync(join(dir, 'out', 'summary.json'), 'utf8'));
    expect(summary.complete).toBe(false);
    expect(summary.steps).toBeGreaterThan(0);
    expect(summary.steps).toBeLessThan(400_000);
    const rows = parseCsv(readFileSync(join(dir, 'out', 'timeseries.csv'), 'utf8'));
    expect(rows.length).toBe(summary.steps + 2);
  }, 60_000);

  it('a grid above the memory cap is refused before anything is allocated, with the figure', () => {
    // contract: docs/scenario.md "Format 1" (memory estimated first, error names grid.nx and the bytes)
    const dir = mkdtempSync(join(tmpdir(), 'gridgauge-cap-'));
    const s = { ...demoScenario(), grid: { ...demoScenario().grid, nx: 20_000, ny: 20_000 } };
    writeFileSync(join(dir, 'huge.json'), JSON.stringify(s));
    const r = spawnSync(process.execPath, ['bin/gridgauge.js', 'run', join(dir, 'huge.json'), '--out', join(dir, 'o')], { encoding: 'utf8' });
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/grid\.nx: .*\d.*bytes/);
    expect(existsSync(join(dir, 'o'))).toBe(false);
  });

  it('a grid beyond what a 32-bit engine can address is refused before allocation, not wrapped', async () => {
    // wasm32 linear memory is at most 4 GiB (WebAssembly core specification, memory32)
    const s = makeScenario({ grid: { nx: 20_000, ny: 20_000 } });
    await expect(Simulation.create(s)).rejects.toThrow(/grid\.nx: a 20000 × 20000 grid needs \d+\.\d GiB, beyond the 4 GiB/);
  });

  it('50 runs created and cancelled give their memory back', () => {
    // measured in a child with --expose-gc so collection can be forced (common practice, no source)
    const r = spawnSync(process.execPath, ['--expose-gc', '--import', 'tsx', 'test/fixtures/cancel-loop.ts'], { encoding: 'utf8' });
    expect(r.status, r.stderr).toBe(0);
    const { before, after, peak } = JSON.parse(r.stdout);
    console.log(`cancel loop: rss before ${(before / 2 ** 20).toFixed(0)} MiB, peak ${(peak / 2 ** 20).toFixed(0)} MiB, after ${(after / 2 ** 20).toFixed(0)} MiB`);
    expect(peak - before).toBeGreaterThan(40 * 2 ** 20); // each run really held its grid
    expect(after - before).toBeLessThan(0.5 * (peak - before) + 32 * 2 ** 20);
  }, 60_000);
});
