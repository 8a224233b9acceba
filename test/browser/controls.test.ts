/**
 * Running in the built page: pause, resume, stop (which still gives results) and reset;
 * the page stays responsive while the worker steps; a crashed worker is reported and
 * replaced without a reload; the field view works from the keyboard; the page carries
 * its Content-Security-Policy.
 */
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoScenario } from '../../src/scenario/defaults.ts';
import { startHarness, waitForCompareDrawn, waitForRunEnd, type Harness } from './harness.ts';

let h: Harness;

const phase = (page: Page) => page.evaluate(() => (document.querySelector('gg-app') as HTMLElement).dataset.phase);
const stepsDone = (page: Page) => page.evaluate(() =>
  (document.querySelector('gg-app') as unknown as { store: { state: { run: { stepsDone: number } } } }).store.state.run.stepsDone);
const command = (page: Page, name: string) => page.locator(`gg-run-controls button[data-command="${name}"]`);

async function openPage(): Promise<{ page: Page; errors: string[] }> {
  const { page, errors } = await h.newPage();
  await page.goto(`${h.url}?autorun=0`);
  await page.locator('gg-setup #f-steps').waitFor();
  return { page, errors };
}

beforeAll(async () => {
  h = await startHarness();
});

afterAll(async () => {
  await h?.close();
});

describe('run controls', () => {
  it('pause, resume and stop a long run; stop still gives results', async () => {
    const { page, errors } = await openPage();
    await page.locator('#f-steps').fill('30000'); // long enough to catch it running
    await command(page, 'run').click();
    await expect.poll(() => stepsDone(page), { timeout: 30_000 }).toBeGreaterThan(0);
    expect(await phase(page)).toBe('running');

    await command(page, 'pause').click();
    expect(await phase(page)).toBe('paused');
    await page.waitForTimeout(300);
    const pausedAt = await stepsDone(page);
    await page.waitForTimeout(600);
    expect(await stepsDone(page)).toBe(pausedAt);

    // The page answers while the worker holds a run: typing into the form still works.
    await page.locator('#f-medium-epsR').fill('1.5');
    expect(await page.locator('#f-medium-epsR').inputValue()).toBe('1.5');
    await page.locator('#f-medium-epsR').fill('1');

    await command(page, 'resume').click();
    expect(await phase(page)).toBe('running');
    await expect.poll(() => stepsDone(page), { timeout: 30_000 }).toBeGreaterThan(pausedAt);

    await command(page, 'stop').click();
    expect(await waitForRunEnd(page)).toBe('stopped');
    await waitForCompareDrawn(page);
    const done = await stepsDone(page);
    expect(done).toBeGreaterThan(0);
    expect(done).toBeLessThan(30000);
    expect(await page.locator('gg-run-controls .message').textContent()).toContain(`stopped at step ${done}`);
    for (const probe of demoScenario().probes) {
      expect(await page.locator(`gg-summary-table tr[data-probe="${probe.name}"] td.relerr`).count()).toBe(1);
    }
    expect(await page.locator('gg-run-controls .steps-per-second').textContent()).toMatch(/steps\/s/);

    await command(page, 'reset').click();
    expect(await phase(page)).toBe('idle');
    expect(await page.locator('gg-summary-table td.relerr').count()).toBe(0);
    expect(errors).toEqual([]);
  });

  it('reports a crashed worker and runs again without a reload', async () => {
    const { page, errors } = await openPage();
    await page.evaluate(() => (document.querySelector('gg-app') as unknown as { controller: { crashWorkerForTest(): void } }).controller.crashWorkerForTest());
    await expect.poll(() => page.locator('.notice').count(), { timeout: 20_000 }).toBe(1);
    expect(await page.locator('.notice').textContent()).toContain('crashed');
    await command(page, 'run').click();
    expect(await waitForRunEnd(page)).toBe('done');
    await waitForCompareDrawn(page);
    expect(await page.locator('gg-summary-table td.relerr').count()).toBe(demoScenario().probes.length);
    // Only the deliberate fault may have been logged.
    expect(errors.filter((e) => !e.includes('deliberate worker fault'))).toEqual([]);
  });
});

describe('keyboard and page set-up', () => {
  it('adds and moves a probe on the field view from the keyboard', async () => {
    const { page } = await openPage();
    const probes = () => page.evaluate(() =>
      ((document.querySelector('gg-app') as unknown as { store: { state: { draft: { probes: { x: number; y: number }[] } } } }).store.state.draft.probes));
    const before = (await probes()).length;
    await page.locator('gg-field-view canvas.map').focus();
    await page.keyboard.press('a');
    await expect.poll(async () => (await probes()).length).toBe(before + 1);
    const added = (await probes())[before];
    await page.keyboard.press('ArrowUp');
    await expect.poll(async () => (await probes())[before].y).toBeCloseTo(added.y + demoScenario().grid.dy, 12);
    await page.keyboard.press('Delete');
    await expect.poll(async () => (await probes()).length).toBe(before);
  });

  it('reaches the Run button and every set-up field by Tab, each with a label', async () => {
    const { page } = await openPage();
    const unlabelled = await page.evaluate(() => {
      const out: string[] = [];
      const visit = (root: Document | ShadowRoot) => {
        for (const el of root.querySelectorAll<HTMLElement>('input, select, button, canvas[tabindex]')) {
          if (el.getAttribute('aria-hidden') === 'true') continue;
          const id = el.id;
          const labelled = el.getAttribute('aria-label') || el.getAttribute('aria-labelledby')
            || (id && (el.getRootNode() as ShadowRoot).querySelector(`label[for="${id}"]`))
            || el.closest('label') || (el.tagName === 'BUTTON' && el.textContent?.trim());
          if (!labelled) out.push(el.outerHTML.slice(0, 80));
        }
        for (const host of root.querySelectorAll('*')) if (host.shadowRoot) visit(host.shadowRoot);
      };
      visit(document);
      return out;
    });
    expect(unlabelled).toEqual([]);
    let reached = false;
    for (let k = 0; k < 200 && !reached; k++) {
      await page.keyboard.press('Tab');
      reached = await page.evaluate(() => {
        let el: Element | null = document.activeElement;
        while (el?.shadowRoot?.activeElement) el = el.shadowRoot.activeElement;
        return el?.getAttribute('data-command') === 'run';
      });
    }
    expect(reached).toBe(true);
    await page.keyboard.press('Enter');
    expect(await waitForRunEnd(page)).toBe('done');
  });

  it('carries a Content-Security-Policy that allows only its own origin', async () => {
    const { page } = await openPage();
    const csp = await page.locator('meta[http-equiv="Content-Security-Policy"]').getAttribute('content');
    expect(csp).toContain("default-src 'self'");
    expect(csp).toContain("script-src 'self' 'wasm-unsafe-eval'");
    expect(csp).not.toContain('unsafe-inline');
    expect(csp).not.toContain("'unsafe-eval'");
  });
});
