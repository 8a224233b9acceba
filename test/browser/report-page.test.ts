/**
 * The page's Report section: after a run and a study, "Build report" makes the same kind of
 * file `gridgauge report` writes, in a worker, and offers it as report.html. Common
 * practice, no source.
 */
import { readFileSync } from 'node:fs';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startHarness, type Harness } from './harness.ts';

let h: Harness;
beforeAll(async () => { h = await startHarness(); });
afterAll(async () => { await h?.close(); });

const tab = (page: Page, name: string) => page.getByRole('tab', { name }).click();

describe('report from the page', () => {
  it('builds report.html with the run and the studies finished on the page', async () => {
    const { page, errors } = await h.newPage();
    await page.goto(h.url); // the demo runs as the page opens
    await page.waitForFunction(() => (document.querySelector('gg-app') as HTMLElement | null)?.dataset.drawnRun !== undefined, undefined, { timeout: 60_000 });
    await tab(page, 'Studies');
    const studies = page.locator('gg-studies-panel');
    await studies.getByRole('button', { name: 'Resolution' }).click();
    await studies.getByLabel('Project size (wavelengths)').fill('6');
    await studies.getByLabel('Phase budget (degrees)').fill('10');
    await studies.getByLabel('Coarsest cells per wavelength').fill('10');
    await studies.getByLabel('Finest cells per wavelength').fill('14');
    await studies.getByRole('button', { name: 'Run study' }).click();
    await studies.locator('.verdict').waitFor({ timeout: 120_000 });
    await tab(page, 'Report');
    const panel = page.locator('gg-report-panel');
    await expect.poll(() => panel.locator('li').nth(1).textContent()).toMatch(/resolution\.json/);
    const [download] = await Promise.all([page.waitForEvent('download', { timeout: 60_000 }), panel.getByRole('button', { name: 'Build report' }).click()]);
    expect(download.suggestedFilename()).toBe('report.html');
    const text = readFileSync(await download.path(), 'utf8');
    expect(text.startsWith('<!DOCTYPE html>') || text.startsWith('<!doctype html>')).toBe(true);
    expect(text).not.toMatch(/<script/i);
    for (const probe of ['near', 'far', 'diagonal']) expect(text).toContain(probe);
    expect(text).toMatch(/Resolution study/i);
    expect(text).toMatch(/not evidence for RF-exposure or EMC compliance/);
    expect(errors).toEqual([]);
  }, 240_000);
});
