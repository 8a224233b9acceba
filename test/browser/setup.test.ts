/**
 * Editing a scenario in the built page: invalid entries are marked with the scenario
 * model's message and block the run; a scenario survives a trip through the page's link,
 * through a saved JSON file and through a reload; files that are too big or carry markup
 * are refused or shown as plain text.
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoScenario } from '../../src/scenario/defaults.ts';
import { validateScenario } from '../../src/scenario/parse.ts';
import type { Scenario } from '../../src/scenario/types.ts';
import { startHarness, type Harness } from './harness.ts';

let h: Harness;
let dir: string;

/** The page's current valid scenario, or the problems of its draft. */
function pageScenario(page: Page): Promise<Scenario | { problems: unknown }> {
  return page.evaluate(() => {
    const app = document.querySelector('gg-app') as unknown as { store: { state: { check: { ok: boolean; scenario?: unknown; problems?: unknown } } } };
    const c = app.store.state.check;
    return (c.ok ? c.scenario : { problems: c.problems }) as Scenario | { problems: unknown };
  });
}

async function openPage(query = '?autorun=0', hash = ''): Promise<{ page: Page; errors: string[] }> {
  const { page, errors } = await h.newPage();
  await page.goto(`${h.url}${query}${hash}`);
  await page.locator('gg-setup #f-grid-courant').waitFor();
  return { page, errors };
}

/** Waits for the debounced save of the draft (localStorage and the link). */
const settle = (page: Page) => page.waitForTimeout(400);

beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'gridgauge-page-'));
  h = await startHarness();
});

afterAll(async () => {
  await h?.close();
  if (dir) rmSync(dir, { recursive: true, force: true });
});

describe('an invalid entry', () => {
  it('shows the scenario model\'s message at the field and blocks the run', async () => {
    const { page, errors } = await openPage();
    const run = page.locator('gg-run-controls button[data-command="run"]');
    await expect.poll(() => run.isEnabled()).toBe(true); // common practice, no source
    await page.locator('#f-grid-courant').fill('0.9');
    const bad = structuredClone(demoScenario());
    bad.grid.courant = 0.9;
    const expected = validateScenario(bad);
    if (expected.ok) throw new Error('Courant 0.9 should be invalid for square cells'); // 2D limit 1/√2
    const message = expected.problems.find((p) => p.path === 'grid.courant')?.message as string;
    expect(message).toBeTruthy(); // docs/physics.md: 2D stability limit 1/√2 for square cells
    await expect.poll(() => page.locator('#f-grid-courant-problem').textContent()).toBe(message); // common practice, no source
    expect(await page.locator('#f-grid-courant').getAttribute('aria-invalid')).toBe('true'); // common practice, no source
    expect(await run.isDisabled()).toBe(true); // common practice, no source
    expect(await page.locator('gg-run-controls .blocked').textContent()).toContain('Fix'); // common practice, no source
    // Even a forced click does not start a run.
    await run.click({ force: true });
    await page.waitForTimeout(300);
    expect(await page.evaluate(() => (document.querySelector('gg-app') as HTMLElement).dataset.phase)).toBe('idle'); // common practice, no source
    // Putting it right unblocks the run.
    await page.locator('#f-grid-courant').fill('0.5');
    await expect.poll(() => run.isEnabled()).toBe(true); // common practice, no source
    expect(await page.locator('#f-grid-courant-problem').count()).toBe(0); // common practice, no source
    expect(errors).toEqual([]); // common practice, no source
  });

  it('reports text that is not a number', async () => {
    const { page } = await openPage();
    await page.locator('#f-grid-nx').fill('three hundred');
    await expect.poll(() => page.locator('#f-grid-nx-problem').count()).toBe(1); // common practice, no source
    expect(await page.locator('#f-grid-nx-problem').textContent()).toMatch(/number/); // common practice, no source
    expect(await page.locator('gg-run-controls button[data-command="run"]').isDisabled()).toBe(true); // common practice, no source
  });
});

describe('a scenario round trip', () => {
  it('through the page link', async () => {
    const { page } = await openPage();
    await page.locator('#f-grid-courant').fill('0.45');
    await page.locator('#f-grid-nx').fill('320');
    await page.locator('gg-setup button', { hasText: 'Add probe' }).click();
    await settle(page);
    const edited = await pageScenario(page) as Scenario;
    expect(edited.grid.courant).toBe(0.45); // common practice, no source
    expect(edited.grid.nx).toBe(320); // common practice, no source
    expect(edited.probes.length).toBe(demoScenario().probes.length + 1); // common practice, no source
    const link = page.url();
    expect(link).toMatch(/#s=[A-Za-z0-9_-]+$/); // RFC 4648 section 5 alphabet (base64url)
    // A fresh browser context has no saved draft: only the link can carry the scenario.
    const { page: other } = await h.newPage();
    await other.goto(link);
    await other.locator('#f-grid-courant').waitFor();
    expect(await pageScenario(other)).toEqual(edited); // common practice, no source
    expect(await other.locator('#f-grid-nx').inputValue()).toBe('320'); // common practice, no source
    expect(await other.locator('#f-grid-courant').inputValue()).toBe('0.45'); // common practice, no source
  });

  it('through a link pasted into the open page', async () => {
    const { page } = await openPage();
    const wanted = structuredClone(demoScenario());
    wanted.grid.courant = 0.4;
    wanted.steps = 1000;
    const encoded = Buffer.from(JSON.stringify(wanted)).toString('base64url'); // RFC 4648 section 5, as src/scenario/url.ts
    await page.evaluate((e) => { window.location.hash = `s=${e}`; }, encoded);
    await expect.poll(async () => (await pageScenario(page) as Scenario).grid.courant).toBe(0.4); // common practice, no source
    expect(await pageScenario(page)).toEqual(validateScenario(wanted).ok ? wanted : undefined); // common practice, no source
    expect(await page.locator('#f-steps').inputValue()).toBe('1000'); // common practice, no source
  });

  it('through a saved JSON file', async () => {
    const { page } = await openPage();
    await page.locator('#f-medium-epsR').fill('2.2');
    await page.locator('#f-steps').fill('900');
    await settle(page);
    const edited = await pageScenario(page) as Scenario;
    const [download] = await Promise.all([page.waitForEvent('download'), page.locator('header button', { hasText: 'Save scenario' }).click()]);
    expect(download.suggestedFilename()).toBe('scenario.json'); // common practice, no source
    const file = join(dir, 'saved.json');
    await download.saveAs(file);
    const parsed = validateScenario(JSON.parse(readFileSync(file, 'utf8')));
    expect(parsed.ok && parsed.scenario).toEqual(edited); // common practice, no source

    const { page: other } = await openPage();
    expect((await pageScenario(other) as Scenario).medium.epsR).toBe(1); // common practice, no source
    await other.locator('#open-file').setInputFiles(file);
    await expect.poll(async () => (await pageScenario(other) as Scenario).medium.epsR).toBe(2.2); // common practice, no source
    expect(await pageScenario(other)).toEqual(edited); // common practice, no source
    expect(await other.locator('.notice').textContent()).toContain('Loaded saved.json'); // common practice, no source
  });

  it('through a reload, even while invalid (saved in the browser)', async () => {
    const { page } = await openPage();
    await page.locator('#f-absorber-cells').fill('12');
    await page.locator('#f-grid-courant').fill('0.95');
    await settle(page);
    await page.goto(`${h.url}?autorun=0`); // no link in the address: the saved draft is used
    await page.locator('#f-grid-courant').waitFor();
    expect(await page.locator('#f-grid-courant').inputValue()).toBe('0.95'); // common practice, no source
    expect(await page.locator('#f-absorber-cells').inputValue()).toBe('12'); // common practice, no source
    expect(await page.locator('#f-grid-courant-problem').count()).toBe(1); // common practice, no source
  });
});

describe('untrusted files and links', () => {
  it('refuses a file above 5 MiB with a message', async () => {
    const { page } = await openPage();
    const file = join(dir, 'big.json');
    writeFileSync(file, `{"pad": "${'x'.repeat(5 * 1024 * 1024 + 10)}"}`);
    await page.locator('#open-file').setInputFiles(file);
    await expect.poll(() => page.locator('.notice').count()).toBe(1); // common practice, no source
    const text = await page.locator('.notice').textContent();
    expect(text).toContain('big.json was not loaded'); // common practice, no source
    expect(text).toContain('5 MiB'); // robustness issue: files above 5 MiB are refused
    expect((await pageScenario(page) as Scenario).grid.nx).toBe(demoScenario().grid.nx); // common practice, no source
  });

  it('shows markup in a file as text and runs none of it', async () => {
    const { page } = await openPage();
    let dialogs = 0;
    page.on('dialog', (d) => { dialogs++; void d.dismiss(); });
    const hostile = structuredClone(demoScenario()) as unknown as Record<string, unknown>;
    (hostile.probes as { name: string }[])[0].name = '<img src=x onerror="window.__owned=1">';
    hostile['<script>window.__owned=2</script>'] = 1;
    const file = join(dir, 'hostile.json');
    writeFileSync(file, JSON.stringify(hostile));
    await page.locator('#open-file').setInputFiles(file);
    await expect.poll(() => page.locator('.notice').count()).toBe(1); // common practice, no source
    const text = await page.locator('.notice').textContent();
    expect(text).toContain('<img src=x onerror='); // common practice, no source
    expect(text).toContain('<script>'); // common practice, no source
    await page.waitForTimeout(200);
    expect(await page.locator('img').count()).toBe(0); // common practice, no source
    expect(await page.locator('.notice script').count()).toBe(0); // common practice, no source
    expect(await page.evaluate(() => (window as unknown as { __owned?: number }).__owned)).toBeUndefined(); // common practice, no source
    expect(dialogs).toBe(0); // common practice, no source
  });

  it('reports a damaged link and keeps the page usable', async () => {
    const { page, errors } = await h.newPage();
    await page.goto(`${h.url}?autorun=0#s=%3Cb%3Enot-a-scenario`);
    await page.locator('#f-grid-courant').waitFor();
    const text = await page.locator('.notice').textContent();
    expect(text).toContain('could not be used'); // common practice, no source
    expect(await page.locator('.notice b').count()).toBe(0); // common practice, no source
    expect((await pageScenario(page) as Scenario).grid.nx).toBe(demoScenario().grid.nx); // common practice, no source
    expect(errors).toEqual([]); // common practice, no source
  });
});
