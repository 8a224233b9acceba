/**
 * What a new user meets in the built page: the sections (Set-up, Results, Studies, Report)
 * one click away with the address remembering which; messages in the field's own unit;
 * unit menus down to Hz, s and µm; the memory readout split into the run and the error
 * map; a theme button that says what it does; no sideways scrolling at 390 px; maps with
 * axes, readouts and PNGs that keep the axes; legends with values; labels that do not
 * collide; and an error-map menu that never disagrees with its picture.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoScenario } from '../../src/scenario/defaults.ts';
import { deriveQuantities } from '../../src/scenario/derived.ts';
import { validateScenario } from '../../src/scenario/parse.ts';
import type { Scenario } from '../../src/scenario/types.ts';
import { formatBytes } from '../../src/scenario/units.ts';
import { ARTIFACTS, startHarness, waitForCompareDrawn, waitForRunEnd, type Harness } from './harness.ts';

let h: Harness;
beforeAll(async () => { h = await startHarness(); });
afterAll(async () => { await h?.close(); });

type AppHandle = HTMLElement & { store: { state: Record<string, any>; set(patch: Record<string, unknown>): void }; showView(v: string): void };

const tab = (page: Page, name: string) => page.getByRole('tab', { name });
/** Opens the Results section (the comparison and the error map live there). */
const openResults = async (page: Page) => { if (await tab(page, 'Results').count()) await tab(page, 'Results').click(); };
const draft = (page: Page) => page.evaluate(() => (document.querySelector('gg-app') as unknown as AppHandle).store.state.draft as Scenario);

async function openPage(query = '?autorun=0', hash = '', viewport?: { width: number; height: number }): Promise<{ page: Page; errors: string[] }> {
  const { page, errors } = await h.newPage();
  if (viewport) await page.setViewportSize(viewport);
  await page.goto(`${h.url}${query}${hash}`);
  await page.locator('gg-app').waitFor();
  return { page, errors };
}

/** A page that has run the demo to the end, with the comparison drawn. */
async function demoRun(viewport?: { width: number; height: number }): Promise<{ page: Page; errors: string[] }> {
  const opened = await openPage('', '', viewport);
  await waitForRunEnd(opened.page);
  await waitForCompareDrawn(opened.page);
  return opened;
}

/** Non-transparent pixels of a canvas that differ from its first pixel. */
function inked(page: Page, selector: string): Promise<number> {
  return page.locator(selector).first().evaluate((canvas: HTMLCanvasElement) => {
    const { data } = (canvas.getContext('2d') as CanvasRenderingContext2D).getImageData(0, 0, canvas.width, canvas.height);
    let n = 0;
    for (let k = 0; k < data.length; k += 4) if (data[k + 3] > 0 && (data[k] !== data[0] || data[k + 1] !== data[1] || data[k + 2] !== data[2] || data[k + 3] !== data[3])) n++;
    return n;
  });
}

/** Width and height of a PNG from its IHDR chunk (RFC 2083 section 4.1.1). */
function pngSize(bytes: Buffer): [number, number] {
  return [bytes.readUInt32BE(16), bytes.readUInt32BE(20)];
}

describe('sections of the page', () => {
  it('puts each section one click away and keeps the one on show in the address', async () => {
    const { page, errors } = await openPage();
    await expect.poll(() => page.locator('gg-setup').isVisible()).toBe(true); // common practice, no source
    expect(await page.locator('gg-studies-panel').isVisible()).toBe(false); // common practice, no source
    expect(page.url()).toMatch(/#s=[A-Za-z0-9_-]+$/); // the set-up needs no view in the link, RFC 4648 section 5 alphabet
    await tab(page, 'Studies').click();
    await expect.poll(() => page.locator('gg-studies-panel').isVisible()).toBe(true); // common practice, no source
    expect(await page.locator('gg-setup').isVisible()).toBe(false); // common practice, no source
    expect(await tab(page, 'Studies').getAttribute('aria-selected')).toBe('true'); // WAI-ARIA tabs pattern
    expect(page.url()).toMatch(/#view=studies&s=[A-Za-z0-9_-]+$/); // common practice, no source
    // the link opens the same section and the same scenario in a fresh browser
    const edited = await draft(page);
    const { page: other } = await h.newPage();
    await other.goto(page.url());
    await expect.poll(() => other.locator('gg-studies-panel').isVisible()).toBe(true); // common practice, no source
    expect(await draft(other)).toEqual(edited); // common practice, no source
    await tab(page, 'Report').click();
    await expect.poll(() => page.locator('#view-report').getByText('One self-contained HTML file for a design review').isVisible()).toBe(true); // common practice, no source
    await tab(page, 'Results').click();
    await expect.poll(() => page.locator('gg-error-map').isVisible()).toBe(true); // common practice, no source
    expect(page.url()).toContain('view=results'); // common practice, no source
    // arrow keys move between the tabs (WAI-ARIA Authoring Practices, tabs pattern)
    await tab(page, 'Results').focus();
    await page.keyboard.press('ArrowRight');
    await expect.poll(() => tab(page, 'Studies').getAttribute('aria-selected')).toBe('true'); // WAI-ARIA tabs pattern
    await page.keyboard.press('Home');
    await expect.poll(() => tab(page, 'Set-up').getAttribute('aria-selected')).toBe('true'); // WAI-ARIA tabs pattern
    expect(page.url()).toMatch(/#s=/); // common practice, no source
    expect(errors).toEqual([]); // common practice, no source
  });

  it('does not scroll sideways at 390 px in any section', async () => {
    const { page, errors } = await demoRun({ width: 390, height: 844 });
    for (const view of ['setup', 'results', 'studies', 'report']) {
      await page.evaluate((v) => (document.querySelector('gg-app') as unknown as AppHandle).showView(v), view);
      await page.waitForTimeout(400);
      const [scrollWidth, width] = await page.evaluate(() => [document.scrollingElement?.scrollWidth ?? 0, window.innerWidth]);
      expect(scrollWidth, `${view}: ${scrollWidth} px wide`).toBeLessThanOrEqual(width); // common practice, no source
      await page.screenshot({ path: join(ARTIFACTS, `page-390-${view}.png`), fullPage: true });
    }
    expect(errors).toEqual([]); // common practice, no source
  });
});

describe('set-up', () => {
  it('explains a bad cell size in the unit of the field', async () => {
    const { page } = await openPage();
    expect(await page.locator('label[for="f-grid-dx"]').textContent()).toContain('(mm)'); // the page's default length unit
    await page.locator('#f-grid-dx').fill('-2');
    await expect.poll(() => page.locator('#f-grid-dx-problem').count()).toBe(1); // common practice, no source
    const text = (await page.locator('#f-grid-dx-problem').textContent()) ?? '';
    expect(text).toBe('-2 mm is not above 0; give the cell size along x in mm, e.g. 1'); // README "Scenario file": dx in metres, here shown in mm
    expect(text).not.toMatch(/metres|0\.001/); // common practice, no source
    await page.getByLabel('Lengths unit').selectOption('µm');
    await page.locator('#f-grid-dx').fill('0');
    await expect.poll(() => page.locator('#f-grid-dx-problem').textContent()).toContain('in µm, e.g. 1000'); // 1 mm = 1000 µm, BIPM SI Brochure Table 7
  });

  it('offers Hz to THz, s to fs and m to µm, so a ground-probing pulse is typed as it is said', async () => {
    const { page } = await openPage();
    const options = (label: string) => page.getByLabel(label).locator('option').allTextContents();
    expect(await options('Frequencies unit')).toEqual(['Hz', 'kHz', 'MHz', 'GHz', 'THz']); // BIPM SI Brochure Table 7 prefixes
    expect(await options('Times unit')).toEqual(['s', 'ms', 'µs', 'ns', 'ps', 'fs']); // BIPM SI Brochure Table 7 prefixes
    expect(await options('Lengths unit')).toEqual(['m', 'mm', 'µm']); // BIPM SI Brochure Table 7 prefixes
    await page.getByLabel('Frequencies unit').selectOption('MHz');
    await page.getByLabel('Times unit').selectOption('µs');
    await page.getByLabel('Lengths unit').selectOption('m');
    expect(await page.locator('#f-source-waveform-f0').inputValue()).toBe('10000'); // 10 GHz in MHz
    await page.locator('#f-source-waveform-f0').fill('400');
    await page.locator('#f-source-waveform-t0').fill('0.02');
    await page.locator('#f-grid-dx').fill('0.01');
    await expect.poll(async () => (await draft(page)).source.waveform).toMatchObject({ f0: 4e8, t0: 2e-8 }); // 400 MHz, 0.02 µs
    expect((await draft(page)).grid.dx).toBe(0.01); // common practice, no source
    await page.getByLabel('Frequencies unit').selectOption('Hz');
    expect(await page.locator('#f-source-waveform-f0').inputValue()).toBe('400000000'); // common practice, no source
  });

  it('splits the memory readout into the run (as check reports it) and the error maps, one per analysis frequency', async () => {
    const { page } = await openPage();
    const d = deriveQuantities(demoScenario());
    const maps = demoScenario().frequencies.length;
    const map = maps * 8 * demoScenario().grid.nx * demoScenario().grid.ny; // a full-grid DFT: two float32 a node (IEEE 754 binary32)
    const readout = page.locator('gg-setup .readouts');
    await expect.poll(() => readout.textContent()).toContain(`${formatBytes(d.memory_bytes)} for the run + ${formatBytes(map)} for ${maps} error maps`); // common practice, no source
    const text = (await readout.textContent()) ?? '';
    expect(text).toContain(formatBytes(d.memory_bytes + map)); // common practice, no source
    expect(text).not.toMatch(/e\+\d/); // never "1.02e+3 KiB", common practice, no source
    // other grids: every figure stays within three digits and its unit
    await page.locator('#f-grid-nx').fill('361');
    await page.locator('#f-grid-ny').fill('361');
    await page.waitForTimeout(200);
    expect(await readout.textContent()).not.toMatch(/\d{4} [KMG]iB|e\+/); // common practice, no source
  });

  it('labels the theme button with the theme it switches to', async () => {
    const { page } = await openPage();
    const button = page.locator('header button', { hasText: 'theme' });
    expect(await button.textContent()).toBe('Dark theme'); // common practice, no source
    await button.click();
    expect(await page.locator('gg-app').getAttribute('theme')).toBe('dark'); // common practice, no source
    expect(await button.textContent()).toBe('Light theme'); // common practice, no source
    await button.click();
    expect(await page.locator('gg-app').getAttribute('theme')).toBe('light'); // common practice, no source
    expect(await button.textContent()).toBe('Dark theme'); // common practice, no source
  });
});

describe('maps and charts after the demo run', () => {
  it('gives both maps axes in the length unit, a readout under the pointer and PNGs with the axes', async () => {
    const { page, errors } = await demoRun();
    expect(await inked(page, 'gg-field-view canvas.axes')).toBeGreaterThan(300); // common practice, no source
    const map = page.locator('gg-field-view canvas.map');
    const box = await map.boundingBox();
    if (!box) throw new Error('no field map');
    const { nx, ny } = demoScenario().grid;
    await page.mouse.move(box.x + (150.5 / nx) * box.width, box.y + box.height - (120.5 / ny) * box.height);
    await expect.poll(() => page.locator('gg-field-view .readout').textContent()).toContain('x = 150 mm, y = 120 mm'); // common practice, no source
    expect(await page.locator('gg-field-view .readout').textContent()).toMatch(/Ez = .*V\/m/); // common practice, no source
    await page.getByLabel('Lengths unit').selectOption('µm');
    await page.mouse.move(box.x + (100.5 / nx) * box.width, box.y + box.height - (120.5 / ny) * box.height);
    await expect.poll(() => page.locator('gg-field-view .readout').textContent()).toContain('x = 100000 µm'); // common practice, no source
    const [fieldPng] = await Promise.all([page.waitForEvent('download'), page.locator('gg-field-view button', { hasText: 'PNG' }).click()]);
    const [pw, ph] = pngSize(readFileSync(await fieldPng.path()));
    const [cw, chh] = await map.evaluate((c: HTMLCanvasElement) => [c.width, c.height]);
    expect(pw).toBeGreaterThan(cw + 40); // the y axis and its labels sit left of the map, common practice, no source
    expect(ph).toBeGreaterThan(chh + 30); // the x axis sits below, common practice, no source

    await openResults(page);
    await expect.poll(() => inked(page, 'gg-error-map canvas.axes')).toBeGreaterThan(300); // common practice, no source
    const em = await page.locator('gg-error-map canvas.map').boundingBox();
    if (!em) throw new Error('no error map');
    await page.mouse.move(em.x + (200.5 / nx) * em.width, em.y + em.height - (150.5 / ny) * em.height);
    await expect.poll(() => page.locator('gg-error-map .readout').textContent()).toMatch(/x = 200000 µm, y = 150000 µm · error −?\d.* dB/); // common practice, no source
    const [mapPng] = await Promise.all([page.waitForEvent('download'), page.locator('gg-error-map button', { hasText: 'PNG' }).click()]);
    const [mw] = pngSize(readFileSync(await mapPng.path()));
    expect(mw).toBeGreaterThan(await page.locator('gg-error-map canvas.map').evaluate((c: HTMLCanvasElement) => c.width + 40)); // common practice, no source
    expect(errors).toEqual([]); // common practice, no source
  });

  it('shows legend values without hovering and keeps every axis label inside its chart', async () => {
    const { page } = await demoRun();
    await openResults(page);
    const values = await page.locator('gg-timeseries-chart .u-legend .u-value, gg-line-chart .u-legend .u-value').allTextContents();
    expect(values.length).toBeGreaterThan(10); // common practice, no source
    expect(values.filter((v) => v.trim() === '—' || v.trim() === '--' || v.trim() === '')).toEqual([]); // common practice, no source
    // a rotated y label is centred on the plot: half its length must fit above and below the centre
    const clipped = await page.locator('gg-line-chart, gg-timeseries-chart').evaluateAll((hosts) => hosts.flatMap((host) => {
      const el = host as unknown as { charts?: any[]; chart?: any };
      const charts = el.charts ?? (el.chart ? [el.chart] : []);
      return charts.flatMap((u: any) => u.axes.flatMap((a: any, i: number) => {
        if (i === 0 || a.label == null) return [];
        const label = typeof a.label === 'function' ? a.label(u, i) : a.label;
        u.ctx.save();
        u.ctx.font = a.labelFont[0];
        const half = u.ctx.measureText(label).width / 2;
        u.ctx.restore();
        const centre = u.bbox.top + u.bbox.height / 2;
        return centre - half < 0 || centre + half > u.ctx.canvas.height ? [label] : [];
      }));
    }));
    expect(clipped).toEqual([]); // common practice, no source
  });

  it('never prints probe names over each other on a probe line', async () => {
    const { page } = await openPage();
    const s = structuredClone(demoScenario());
    s.probes = [0.18, 0.181, 0.182, 0.2, 0.201].map((x, k) => ({ name: `probe ${k + 1}`, x, y: 0.15 }));
    if (!validateScenario(s).ok) throw new Error('the crowded scenario should be valid');
    await page.evaluate((sc) => (document.querySelector('gg-app') as unknown as { controller: { applyScenario(s: unknown, n: string): void } }).controller.applyScenario(sc, 'crowded'), s);
    await page.waitForTimeout(300);
    const labels = await page.locator('gg-field-view').evaluate((el) => (el as unknown as { labels: { text: string; box: { x: number; y: number; width: number; height: number } }[] }).labels);
    expect(labels.length).toBeGreaterThanOrEqual(3); // common practice, no source
    for (let a = 0; a < labels.length; a++) {
      for (let b = a + 1; b < labels.length; b++) {
        const p = labels[a].box;
        const q = labels[b].box;
        const overlap = p.x < q.x + q.width && q.x < p.x + p.width && p.y < q.y + q.height && q.y < p.y + p.height;
        expect(overlap, `${labels[a].text} / ${labels[b].text}`).toBe(false); // common practice, no source
      }
    }
  });

  it('keeps the error map menu in step with the picture, and switches maps without a rerun', async () => {
    const { page, errors } = await demoRun();
    await openResults(page);
    const menu = page.getByLabel('Frequency of the error map');
    const legend = page.locator('gg-error-map .legend');
    const chosenLabel = () => menu.evaluate((s: HTMLSelectElement) => s.selectedOptions[0]?.textContent ?? '');
    const phase = () => page.evaluate(() => (document.querySelector('gg-app') as HTMLElement).dataset.phase);
    expect(await chosenLabel()).toBe('5 GHz'); // the demo's first frequency is mapped
    expect(await legend.textContent()).toContain('at 5 GHz'); // common practice, no source
    // one run maps every analysis frequency that fits: the menu switches without a rerun
    for (const [value, label] of [['10000000000', '10 GHz'], ['15000000000', '15 GHz']]) {
      await menu.selectOption({ value });
      await expect.poll(chosenLabel).toBe(label); // common practice, no source
      expect(await legend.textContent()).toContain(`at ${label}`); // common practice, no source
      expect(await page.locator('gg-error-map [data-note="next-run"]').count()).toBe(0); // common practice, no source
      await expect.poll(() => inked(page, 'gg-error-map canvas.map')).toBeGreaterThan(10_000); // common practice, no source
      expect(await phase()).toBe('done'); // no run was started
    }
    // a frequency added after the run has no map until the next run, and says so
    const s = { ...demoScenario(), frequencies: [...demoScenario().frequencies, 2e10] };
    await page.evaluate((sc) => (document.querySelector('gg-app') as unknown as { controller: { applyScenario(s: unknown, n: string): void } }).controller.applyScenario(sc, 'one more frequency'), s);
    await menu.selectOption({ value: '20000000000' });
    await expect.poll(chosenLabel).toBe('20 GHz (next run)'); // common practice, no source
    expect(await legend.textContent()).not.toContain('15 GHz'); // the picture no longer claims another frequency
    expect(await page.locator('gg-error-map [data-note="next-run"]').textContent()).toContain('applies to the next run'); // common practice, no source
    expect(await page.locator('gg-error-map canvas.map').getAttribute('aria-label')).toContain('empty'); // common practice, no source
    await page.locator('gg-run-controls button[data-command="run"]').click();
    await waitForRunEnd(page);
    await waitForCompareDrawn(page);
    await expect.poll(chosenLabel).toBe('20 GHz'); // common practice, no source
    expect(await legend.textContent()).toContain('at 20 GHz'); // common practice, no source
    expect(await page.evaluate(() => (document.querySelector('gg-app') as unknown as AppHandle).store.state.errorMaps.map((m: { f_Hz: number }) => m.f_Hz))).toEqual([2e10, 5e9, 1e10, 1.5e10]); // the chosen one first, then the others in order
    expect(errors).toEqual([]); // common practice, no source
  });
});
