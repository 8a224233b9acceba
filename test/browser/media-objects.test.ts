/**
 * Media, polarization and objects in the built page: a Debye medium set through the form
 * runs and is compared, with its εr(ω) chart; a wrong pole field carries the model's
 * message in the field's unit and blocks the run; a circle drawn on the field view, made
 * a perfect conductor in a TEz grid, runs with Hz in the summary and its node count shown;
 * two objects leave the comparison without an exact reference and point to the
 * convergence study.
 */
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { messageInUnit } from '../../src/app/field-messages.ts';
import { buildMaterialMap } from '../../src/engine/build-material-map.ts';
import { demoScenario } from '../../src/scenario/defaults.ts';
import { deriveQuantities } from '../../src/scenario/derived.ts';
import { layoutOf } from '../../src/scenario/layout.ts';
import { validateScenario } from '../../src/scenario/parse.ts';
import type { Scenario } from '../../src/scenario/types.ts';
import { formatSig } from '../../src/scenario/units.ts';
import { ARTIFACTS, startHarness, waitForCompareDrawn, waitForRunEnd, type Harness } from './harness.ts';

let h: Harness;
beforeAll(async () => { h = await startHarness(); });
afterAll(async () => { await h?.close(); });

type AppHandle = HTMLElement & { store: { state: { draft: Scenario; check: { ok: boolean; scenario?: Scenario } } } };

const draft = (page: Page) => page.evaluate(() => (document.querySelector('gg-app') as unknown as AppHandle).store.state.draft);
const checked = (page: Page) => page.evaluate(() => (document.querySelector('gg-app') as unknown as AppHandle).store.state.check.scenario);
const run = (page: Page) => page.locator('gg-run-controls button[data-command="run"]');

async function openPage(): Promise<{ page: Page; errors: string[] }> {
  const { page, errors } = await h.newPage();
  await page.goto(`${h.url}?autorun=0`);
  await page.locator('gg-setup #f-medium-epsR').waitFor();
  return { page, errors };
}

/** Canvas pixels that are not transparent and differ from the first pixel. */
function inked(page: Page, selector: string): Promise<number> {
  return page.locator(selector).first().evaluate((canvas: HTMLCanvasElement) => {
    const { data } = (canvas.getContext('2d') as CanvasRenderingContext2D).getImageData(0, 0, canvas.width, canvas.height);
    let n = 0;
    for (let k = 0; k < data.length; k += 4) if (data[k + 3] > 0 && (data[k] !== data[0] || data[k + 1] !== data[1] || data[k + 2] !== data[2])) n++;
    return n;
  });
}

describe('a dispersive medium', () => {
  it('is set through the form, drawn as εr(ω) with four curves, run and compared', async () => {
    const { page, errors } = await openPage();
    await page.locator('#f-medium-epsR').fill('2');
    await page.locator('gg-setup button', { hasText: 'Add pole' }).first().click();
    await page.locator('#f-medium-poles-0-deltaEps').fill('4');
    await page.locator('#f-medium-poles-0-tau').fill('20'); // ps, the page's default time unit
    await expect.poll(async () => (await checked(page))?.medium).toEqual({ epsR: 2, poles: [{ kind: 'debye', deltaEps: 4, tau: 2e-11 }] }); // 20 ps = 2e-11 s, BIPM SI Brochure Table 7
    const chart = page.locator('gg-permittivity-chart');
    await expect.poll(() => chart.evaluate((el) => (el as unknown as { chart?: { series: unknown[] } }).chart?.series.length ?? 0)).toBe(5); // x + Re, Im of εr and of the scheme's ε̃r
    expect(await inked(page, 'gg-permittivity-chart canvas')).toBeGreaterThan(2000); // common practice, no source
    const d = deriveQuantities((await checked(page)) as Scenario);
    const f0 = page.locator('gg-setup [data-figure="eps-f0"]');
    expect(await f0.textContent()).toBe(`${formatSig(d.epsRAtF0_re, 4)} − j${formatSig(-d.epsRAtF0_im, 4)}`); // the page shows the scenario layer's εr at f0
    expect(d.epsRAtF0_im).toBeLessThan(0); // a Debye pole is lossy with e^{+jωt}: Im εr < 0 (README "Physics conventions")
    await page.screenshot({ path: join(ARTIFACTS, 'media-debye-setup.png'), fullPage: true });

    await run(page).click();
    expect(await waitForRunEnd(page)).toBe('done'); // common practice, no source
    await waitForCompareDrawn(page);
    await page.getByRole('tab', { name: 'Results' }).click();
    for (const probe of demoScenario().probes) {
      const rel = Number((await page.locator(`gg-summary-table tr[data-probe="${probe.name}"] td.relerr`).textContent())?.trim());
      expect(rel, probe.name).toBeGreaterThan(0); // common practice, no source
      expect(rel, probe.name).toBeLessThan(0.2); // common practice, no source
    }
    const predicted = await page.locator('gg-summary-table tbody tr td:last-child').allTextContents();
    expect(predicted.length).toBe(demoScenario().probes.length * demoScenario().frequencies.length); // one row per probe and frequency, docs/outputs.md
    expect(predicted.filter((t) => /^−?\d/.test(t.trim())).length).toBe(predicted.length); // every row has a predicted phase error (lossy dispersion relation)
    expect(await page.locator('gg-summary-table [data-note="no-exact"]').count()).toBe(0); // a homogeneous medium has its exact field (Hankel function)
    expect(errors).toEqual([]); // common practice, no source
  });

  it('shows a wrong pole field\'s message at the field, in its unit, and blocks the run', async () => {
    const { page } = await openPage();
    await page.locator('gg-setup button', { hasText: 'Add pole' }).first().click();
    await page.locator('#f-medium-poles-0-tau').fill('-8');
    const problem = page.locator('#f-medium-poles-0-tau-problem');
    await expect.poll(() => problem.count()).toBe(1); // common practice, no source
    const model = validateScenario(await draft(page));
    if (model.ok) throw new Error('a negative relaxation time should be refused');
    const message = model.problems.find((p) => p.path === 'medium.poles[0].tau')?.message as string;
    expect(message).toMatch(/in seconds/); // the model writes SI (README "Scenario file")
    const text = (await problem.textContent())?.trim();
    expect(text).toBe(messageInUnit(message, 'time', 'ps')); // the field's own unit, as every field of the form
    expect(text).toMatch(/^-8 ps is not above 0; .* in ps, e\.g\. 8$/); // −8 ps typed; example 8e-12 s = 8 ps, BIPM SI Brochure Table 7
    expect(await page.locator('#f-medium-poles-0-tau').getAttribute('aria-invalid')).toBe('true'); // common practice, no source
    expect(await run(page).isDisabled()).toBe(true); // common practice, no source
  });
});

describe('objects', () => {
  it('draws a circle by dragging on the field view, runs it as a PEC post in TEz and counts its nodes', async () => {
    const { page, errors } = await openPage();
    await page.locator('gg-field-view button', { hasText: 'Circle' }).click();
    const canvas = page.locator('gg-field-view canvas.map');
    const box = await canvas.boundingBox();
    if (!box) throw new Error('the field canvas has no box');
    const { nx, ny, dx, dy } = demoScenario().grid;
    const at = (i: number, j: number) => [box.x + ((i + 0.5) / nx) * box.width, box.y + box.height - ((j + 0.5) / ny) * box.height] as const;
    await page.mouse.move(...at(100, 220));
    await page.mouse.down();
    await page.mouse.move(...at(105, 220), { steps: 4 });
    await page.mouse.move(...at(110, 220), { steps: 4 });
    await page.mouse.up();
    await expect.poll(async () => (await draft(page)).objects?.length ?? 0).toBe(1); // common practice, no source
    expect((await draft(page)).objects?.[0]).toMatchObject({ shape: 'circle', x: 100 * dx, y: Number((220 * dy).toPrecision(12)), radius: 10 * dx }); // centre at the press, radius to the release: 10 cells
    await page.locator('#f-objects-0-material').selectOption('pec');
    await page.locator('#f-polarization').selectOption('TEz');
    await expect.poll(async () => (await checked(page))?.polarization).toBe('TEz'); // common practice, no source
    const scenario = (await checked(page)) as Scenario;
    expect(scenario.objects?.[0].material).toBe('pec'); // common practice, no source
    const expected = buildMaterialMap(scenario, layoutOf(scenario)).nodesPerObject[0];
    expect(expected).toBeGreaterThan(0); // a 10-cell radius holds about π·10² sample points (area of a disc)
    const readout = page.locator('gg-setup .count-readout').first();
    await expect.poll(() => readout.getAttribute('data-nodes')).toBe(String(expected)); // the page shows the material map's own count
    expect(await readout.textContent()).toContain(`${expected} Ex/Ey points`); // TEz's electric components are Ex and Ey (README "Physics conventions")
    expect(await page.locator('gg-setup label[for="f-source-amplitude"]').textContent()).toContain('(V)'); // a magnetic line current in volts drives TEz

    await run(page).click();
    expect(await waitForRunEnd(page)).toBe('done'); // common practice, no source
    await waitForCompareDrawn(page);
    await page.getByRole('tab', { name: 'Results' }).click();
    const head = await page.locator('gg-summary-table thead').textContent();
    expect(head).toContain('|Hz/M| error'); // TEz compares Hz over the magnetic current M
    expect(head).not.toContain('Ez'); // common practice, no source
    expect(await page.locator('gg-summary-table [data-note="no-exact"]').count()).toBe(0); // one circle has its exact field (the cylinder series)
    const rel = Number((await page.locator(`gg-summary-table tr[data-probe="near"] td.relerr`).textContent())?.trim());
    expect(rel).toBeGreaterThan(0); // common practice, no source
    const predictedCells = await page.locator('gg-summary-table td.predicted').allTextContents();
    expect(predictedCells.length).toBeGreaterThan(0); // common practice, no source
    expect(predictedCells.every((t) => t.trim() === '—')).toBe(true); // no plane-wave prediction beside an object, and no "—°", common practice, no source
    expect(await page.locator('gg-timeseries-chart .plot').first().getAttribute('aria-label')).toMatch(/^Hz against time/); // common practice, no source
    await page.getByRole('tab', { name: 'Set-up' }).click();
    await expect.poll(() => page.locator('gg-field-view .scale-label').textContent()).toContain('A/m'); // Hz in A/m
    expect((await draft(page)).objects?.[0]).toMatchObject({ shape: 'circle', radius: 10 * dx }); // the dragged radius is kept through the run
    await page.screenshot({ path: join(ARTIFACTS, 'objects-tez-circle.png'), fullPage: true });
    expect(errors).toEqual([]); // common practice, no source
  });

  it('draws a rectangle and polygons, moves and reshapes by the pointer, and edits from the keyboard', async () => {
    const { page, errors } = await openPage();
    const canvas = page.locator('gg-field-view canvas.map');
    const box = await canvas.boundingBox();
    if (!box) throw new Error('the field canvas has no box');
    const { nx, ny } = demoScenario().grid;
    const at = (i: number, j: number) => [box.x + ((i + 0.5) / nx) * box.width, box.y + box.height - ((j + 0.5) / ny) * box.height] as const;
    const drag = async (from: readonly [number, number], to: readonly [number, number]) => {
      await page.mouse.move(...from);
      await page.mouse.down();
      await page.mouse.move((from[0] + to[0]) / 2, (from[1] + to[1]) / 2, { steps: 3 });
      await page.mouse.move(...to, { steps: 3 });
      await page.mouse.up();
    };
    const objects = async () => (await draft(page)).objects ?? [];
    const mm = (n: number) => Number((n * 1e-3).toPrecision(12)); // node n of 1 mm cells, in metres

    await page.locator('gg-field-view button', { hasText: 'Rectangle' }).click();
    await drag(at(40, 200), at(60, 230));
    await expect.poll(async () => (await objects()).length).toBe(1); // common practice, no source
    expect((await objects())[0]).toMatchObject({ shape: 'rectangle', x0: mm(40), y0: mm(200), x1: mm(60), y1: mm(230) }); // corner to corner

    await page.locator('gg-field-view button', { hasText: 'Polygon' }).click();
    await page.mouse.click(...at(40, 40));
    await page.mouse.click(...at(70, 40));
    await page.mouse.dblclick(...at(55, 70));
    await expect.poll(async () => (await objects()).length).toBe(2); // a double-click closes the polygon
    expect((await objects())[1]).toMatchObject({ shape: 'polygon', points: [[mm(40), mm(40)], [mm(70), mm(40)], [mm(55), mm(70)]] }); // the repeated click of the double-click adds no vertex

    await page.mouse.click(...at(200, 40));
    await page.mouse.click(...at(230, 40));
    await page.mouse.click(...at(215, 70));
    await page.keyboard.press('Enter');
    await expect.poll(async () => (await objects()).length).toBe(3); // Enter closes it too
    await page.keyboard.press('Delete');
    await expect.poll(async () => (await objects()).length).toBe(2); // the new polygon was selected; Delete removes it

    await drag(at(50, 215), at(60, 215));
    await expect.poll(async () => (await objects())[0]).toMatchObject({ x0: mm(50), x1: mm(70), y0: mm(200), y1: mm(230) }); // moved 10 cells right, whole
    await drag(at(70, 230), at(80, 240));
    await expect.poll(async () => (await objects())[0]).toMatchObject({ x0: mm(50), y0: mm(200), x1: mm(80), y1: mm(240) }); // the corner handle moved, the opposite corner stayed

    await canvas.focus();
    await page.keyboard.press('n');
    await page.keyboard.press('ArrowRight');
    await expect.poll(async () => (await objects())[1]).toMatchObject({ points: [[mm(41), mm(40)], [mm(71), mm(40)], [mm(56), mm(70)]] }); // N selected the polygon, an arrow moved it one cell
    await page.keyboard.press('n');
    await page.keyboard.press('+');
    await expect.poll(async () => (await objects())[0]).toMatchObject({ x0: mm(49), y0: mm(199), x1: mm(81), y1: mm(241) }); // + grows every side by a cell
    await page.keyboard.press('Delete');
    await expect.poll(async () => (await objects()).map((o) => o.shape)).toEqual(['polygon']); // common practice, no source
    await page.keyboard.press('a');
    await expect.poll(async () => (await objects()).length).toBe(2); // A adds an object of the tool's shape
    expect((await objects())[1].shape).toBe('polygon'); // common practice, no source
    expect(errors).toEqual([]); // common practice, no source
  });

  it('with two objects says there is no exact reference and opens the convergence study', async () => {
    const { page, errors } = await openPage();
    await page.locator('gg-setup button', { hasText: 'Add circle' }).click();
    await page.locator('gg-setup button', { hasText: 'Add rectangle' }).click();
    await expect.poll(async () => (await checked(page))?.objects?.length ?? 0).toBe(2); // both placed where the scenario model accepts them
    await run(page).click();
    expect(await waitForRunEnd(page)).toBe('done'); // common practice, no source
    await waitForCompareDrawn(page);
    await page.getByRole('tab', { name: 'Results' }).click();
    const note = page.locator('gg-summary-table [data-note="no-exact"]');
    await expect.poll(() => note.count()).toBe(1); // src/compare/reference.ts: no exact field beside two objects
    expect(await note.textContent()).toContain('No exact reference: use the convergence study'); // common practice, no source
    expect(await page.locator('gg-summary-table td.relerr').count()).toBe(0); // no errors shown without a reference
    await page.screenshot({ path: join(ARTIFACTS, 'objects-no-exact.png'), fullPage: true });
    await note.locator('button').click();
    await expect.poll(() => page.locator('gg-studies-panel').isVisible()).toBe(true); // common practice, no source
    await expect.poll(() => page.locator('gg-studies-panel .tabs button[aria-pressed="true"]').textContent()).toMatch(/onvergence/); // the convergence study's tab
    expect(errors).toEqual([]); // common practice, no source
  });
});
