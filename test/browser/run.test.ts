/**
 * The demo scenario in the built page: it runs to the end on its own, every comparison
 * view draws, the summary table carries relErrMax for each probe, the exported files
 * match what the command line writes for the same scenario, and nothing is logged as an
 * error on the way.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoScenario } from '../../src/scenario/defaults.ts';
import { ARTIFACTS, ROOT, startHarness, waitForCompareDrawn, waitForRunEnd, type Harness } from './harness.ts';

let h: Harness;
let page: Page;
let errors: string[];
let cliDir: string;

/** Number of canvas pixels that are not fully transparent and differ from the corner pixel. */
async function inkedPixels(page: Page, selector: string, index = 0): Promise<number> {
  return page.locator(selector).nth(index).evaluate((canvas: HTMLCanvasElement) => {
    const ctx = canvas.getContext('2d') as CanvasRenderingContext2D;
    const { data } = ctx.getImageData(0, 0, canvas.width, canvas.height);
    const [r0, g0, b0, a0] = data;
    let n = 0;
    for (let k = 0; k < data.length; k += 4) {
      if (data[k + 3] > 0 && (data[k] !== r0 || data[k + 1] !== g0 || data[k + 2] !== b0 || data[k + 3] !== a0)) n++;
    }
    return n;
  });
}

function parseCsv(text: string): { header: string[]; rows: number[][] } {
  const lines = text.trimEnd().split(/\r?\n/);
  return {
    header: lines[0].split(','),
    rows: lines.slice(1).map((l) => l.split(',').map((v) => (v === 'NaN' ? NaN : Number(v)))),
  };
}

beforeAll(async () => {
  cliDir = mkdtempSync(join(tmpdir(), 'gridgauge-cli-'));
  // The command line's files for the same scenario, to hold the page's export against.
  execFileSync(process.execPath, [join(ROOT, 'bin/gridgauge.js'), 'run', join(ROOT, 'examples/demo.json'), '--out', cliDir], {
    cwd: ROOT, stdio: 'pipe', timeout: 120_000,
  });
  h = await startHarness();
  ({ page, errors } = await h.newPage());
  await page.goto(h.url);
  await waitForRunEnd(page);
  await waitForCompareDrawn(page);
  await page.getByRole('tab', { name: 'Results' }).click(); // the comparison is in the Results section
});

afterAll(async () => {
  await h?.close();
  if (cliDir) rmSync(cliDir, { recursive: true, force: true });
});

describe('the demo scenario in the page', () => {
  it('runs to the end on opening the page', async () => {
    // common practice, no source: the page reports its run phase on gg-app
    expect(await page.evaluate(() => (document.querySelector('gg-app') as HTMLElement).dataset.phase)).toBe('done'); // common practice, no source
    await expect.poll(() => page.locator('gg-run-controls .phase').textContent()).toBe('Finished'); // common practice, no source
    expect(await page.locator('gg-run-controls .status').textContent()).toContain(`step ${demoScenario().steps} of ${demoScenario().steps}`); // common practice, no source
  });

  it('shows relErrMax for every probe in the summary table', async () => {
    for (const probe of demoScenario().probes) {
      const cell = page.locator(`gg-summary-table tr[data-probe="${probe.name}"] td.relerr`);
      const text = (await cell.textContent())?.trim() ?? '';
      // relErrMax is a small positive number for a resolved demo (docs/outputs.md summary.json)
      expect(Number(text), `relErrMax of ${probe.name}: "${text}"`).toBeGreaterThan(0); // common practice, no source
      expect(Number(text)).toBeLessThan(0.2); // common practice, no source
    }
  });

  it('draws the time series, line charts, field and error map', async () => {
    const probes = demoScenario().probes.length;
    expect(await page.locator('gg-timeseries-chart').count()).toBe(probes); // common practice, no source
    for (let k = 0; k < probes; k++) {
      expect(await inkedPixels(page, 'gg-timeseries-chart canvas', k)).toBeGreaterThan(2000); // common practice, no source
    }
    expect(await page.locator('gg-line-chart canvas').count()).toBe(3); // common practice, no source
    for (let k = 0; k < 3; k++) expect(await inkedPixels(page, 'gg-line-chart canvas', k)).toBeGreaterThan(2000);
    expect(await inkedPixels(page, 'gg-field-view canvas.map')).toBeGreaterThan(10_000); // common practice, no source
    expect(await inkedPixels(page, 'gg-error-map canvas.map')).toBeGreaterThan(10_000); // common practice, no source
  });

  it('logs no console errors', () => {
    expect(errors).toEqual([]); // common practice, no source
  });

  it('exports timeseries.csv matching the command line within float32 precision', async () => {
    const [download] = await Promise.all([
      page.waitForEvent('download'),
      page.locator('button[data-file="timeseries.csv"]').click(),
    ]);
    expect(download.suggestedFilename()).toBe('timeseries.csv'); // common practice, no source
    const pageCsv = parseCsv(readFileSync(await download.path(), 'utf8'));
    const cliCsv = parseCsv(readFileSync(join(cliDir, 'timeseries.csv'), 'utf8'));
    expect(pageCsv.header).toEqual(cliCsv.header); // docs/outputs.md "Files of a run", timeseries.csv header
    expect(pageCsv.rows.length).toBe(cliCsv.rows.length); // docs/outputs.md: one row per sample n = 0..steps
    for (let c = 0; c < cliCsv.header.length; c++) {
      let peak = 0;
      for (const row of cliCsv.rows) peak = Math.max(peak, Math.abs(row[c]));
      const tolerance = 2 ** -23 * 4 * peak; // a few float32 ulps of the column's peak (IEEE 754 binary32)
      for (let r = 0; r < cliCsv.rows.length; r++) {
        const a = pageCsv.rows[r][c];
        const b = cliCsv.rows[r][c];
        if (Number.isNaN(b)) expect(a).toBeNaN(); // common practice, no source
        else expect(Math.abs(a - b), `${cliCsv.header[c]} row ${r}`).toBeLessThanOrEqual(tolerance); // common practice, no source
      }
    }
  });

  it('exports spectra.csv and lines.csv with the command line layout and figures', async () => {
    for (const name of ['spectra.csv', 'lines.csv']) {
      const [download] = await Promise.all([page.waitForEvent('download'), page.locator(`button[data-file="${name}"]`).click()]);
      const text = readFileSync(await download.path(), 'utf8');
      const cli = readFileSync(join(cliDir, name), 'utf8');
      const a = text.trimEnd().split(/\r?\n/);
      const b = cli.trimEnd().split(/\r?\n/);
      expect(a[0]).toBe(b[0]); // same header (docs/outputs.md "Files of a run")
      expect(a.length).toBe(b.length); // common practice, no source
      for (let r = 1; r < b.length; r++) {
        const x = a[r].split(',');
        const y = b[r].split(',');
        expect(x.length).toBe(y.length); // common practice, no source
        x.forEach((v, k) => {
          const p = Number(v);
          const q = Number(y[k]);
          if (Number.isNaN(q) || Number.isNaN(p)) expect(v).toBe(y[k]);
          else expect(Math.abs(p - q)).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(q))); // common practice, no source
        });
      }
    }
  });

  it('exports summary.json with the same figures as the command line', async () => {
    const [download] = await Promise.all([page.waitForEvent('download'), page.locator('button[data-file="summary.json"]').click()]);
    const pageSummary = JSON.parse(readFileSync(await download.path(), 'utf8'));
    const cliSummary = JSON.parse(readFileSync(join(cliDir, 'summary.json'), 'utf8'));
    expect(Object.keys(pageSummary).sort()).toEqual(Object.keys(cliSummary).sort()); // docs/outputs.md summary.json fields
    expect(pageSummary.steps).toBe(cliSummary.steps); // common practice, no source
    expect(pageSummary.dt_s).toBe(cliSummary.dt_s); // common practice, no source
    pageSummary.probes.forEach((p: { name: string; relErrMax: number }, k: number) => {
      expect(p.name).toBe(cliSummary.probes[k].name); // common practice, no source
      expect(p.relErrMax).toBeCloseTo(cliSummary.probes[k].relErrMax, 6); // common practice, no source
    });
  });

  it('saves a PNG of a chart', async () => {
    const [download] = await Promise.all([
      page.waitForEvent('download'),
      page.locator('gg-timeseries-chart').first().locator('button', { hasText: 'PNG' }).click(),
    ]);
    const bytes = readFileSync(await download.path());
    expect([...bytes.subarray(0, 8)]).toEqual([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]); // PNG signature, RFC 2083
    expect(download.suggestedFilename()).toMatch(/\.png$/); // common practice, no source
  });

  it('saves screenshots of the page after a run, light and dark', async () => {
    await page.screenshot({ path: join(ARTIFACTS, 'page-after-run-light.png'), fullPage: true });
    await page.locator('header button', { hasText: 'Dark theme' }).click();
    expect(await page.locator('gg-app').getAttribute('theme')).toBe('dark'); // common practice, no source
    await page.waitForTimeout(200);
    await page.screenshot({ path: join(ARTIFACTS, 'page-after-run-dark.png'), fullPage: true });
    expect(errors).toEqual([]); // common practice, no source
  });
});
