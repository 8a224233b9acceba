/**
 * Running in the built page: pause, resume, stop (which still gives results) and reset;
 * the page stays responsive while the worker steps; a crashed worker is reported and
 * replaced without a reload; the field view works from the keyboard; the page carries
 * its Content-Security-Policy.
 */
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoScenario } from '../../src/scenario/defaults.ts';
import type { Scenario } from '../../src/scenario/types.ts';
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
    await expect.poll(() => stepsDone(page), { timeout: 30_000 }).toBeGreaterThan(0); // common practice, no source
    expect(await phase(page)).toBe('running'); // common practice, no source

    await command(page, 'pause').click();
    expect(await phase(page)).toBe('paused'); // common practice, no source
    await page.waitForTimeout(300);
    const pausedAt = await stepsDone(page);
    await page.waitForTimeout(600);
    expect(await stepsDone(page)).toBe(pausedAt); // common practice, no source

    // The page answers while the worker holds a run: typing into the form still works.
    await page.locator('#f-medium-epsR').fill('1.5');
    expect(await page.locator('#f-medium-epsR').inputValue()).toBe('1.5'); // common practice, no source
    await page.locator('#f-medium-epsR').fill('1');

    await command(page, 'resume').click();
    expect(await phase(page)).toBe('running'); // common practice, no source
    await expect.poll(() => stepsDone(page), { timeout: 30_000 }).toBeGreaterThan(pausedAt); // common practice, no source

    await command(page, 'stop').click();
    expect(await waitForRunEnd(page)).toBe('stopped'); // common practice, no source
    await waitForCompareDrawn(page);
    const done = await stepsDone(page);
    expect(done).toBeGreaterThan(0); // common practice, no source
    expect(done).toBeLessThan(30000); // common practice, no source
    expect(await page.locator('gg-run-controls .message').textContent()).toContain(`stopped at step ${done}`); // common practice, no source
    for (const probe of demoScenario().probes) {
      expect(await page.locator(`gg-summary-table tr[data-probe="${probe.name}"] td.relerr`).count()).toBe(1); // common practice, no source
    }
    expect(await page.locator('gg-run-controls .steps-per-second').textContent()).toMatch(/steps\/s/); // common practice, no source

    await command(page, 'reset').click();
    expect(await phase(page)).toBe('idle'); // common practice, no source
    expect(await page.locator('gg-summary-table td.relerr').count()).toBe(0); // common practice, no source
    expect(errors).toEqual([]); // common practice, no source
  });

  it('reports a crashed worker and runs again without a reload', async () => {
    const { page, errors } = await openPage();
    await page.evaluate(() => (document.querySelector('gg-app') as unknown as { controller: { crashWorkerForTest(): void } }).controller.crashWorkerForTest());
    await expect.poll(() => page.locator('.notice').count(), { timeout: 20_000 }).toBe(1); // common practice, no source
    expect(await page.locator('.notice').textContent()).toContain('crashed'); // common practice, no source
    await command(page, 'run').click();
    expect(await waitForRunEnd(page)).toBe('done'); // common practice, no source
    await waitForCompareDrawn(page);
    expect(await page.locator('gg-summary-table td.relerr').count()).toBe(demoScenario().probes.length); // common practice, no source
    // Only the deliberate fault may have been logged.
    expect(errors.filter((e) => !e.includes('deliberate worker fault'))).toEqual([]); // common practice, no source
  });
});

describe('field frames', () => {
  it('come only while the field view is on screen, the last field always, and the controls still answer', async () => {
    const { page, errors } = await openPage();
    await page.locator('#f-steps').fill('6000');
    const frames = () => page.evaluate(() => (document.querySelector('gg-app') as unknown as { store: { frameCosts: { count: number } } }).store.frameCosts.count);
    // the Results section on show: the field view is out of sight
    await page.getByRole('tab', { name: 'Results' }).click();
    await page.waitForTimeout(300);
    let before = await frames();
    await command(page, 'run').click();
    expect(await waitForRunEnd(page)).toBe('done'); // common practice, no source
    expect((await frames()) - before).toBe(1); // the last field only, common practice, no source
    // back on the set-up: replay frames and frames at the display's rate
    await page.getByRole('tab', { name: 'Set-up' }).click();
    await page.locator('#f-steps').fill('30000'); // long enough to catch it running
    await page.waitForTimeout(300);
    before = await frames();
    await command(page, 'run').click();
    await expect.poll(async () => (await frames()) - before, { timeout: 30_000 }).toBeGreaterThan(3); // common practice, no source
    await command(page, 'pause').click();
    expect(await phase(page)).toBe('paused'); // common practice, no source
    await command(page, 'resume').click();
    expect(await waitForRunEnd(page)).toBe('done'); // common practice, no source
    expect((await frames()) - before).toBeGreaterThan(10); // about 40 replay frames a run, common practice, no source
    expect(errors).toEqual([]); // common practice, no source
  });
});

describe('blow-up in the page', () => {
  it('stops a run that blows up, names the step and cause, and keeps the results so far', async () => {
    const { page, errors } = await openPage();
    // Fault injection: a Courant number above 1/√2 (Taflove & Hagness ch. 4) that the form would refuse
    const s: Scenario = { ...demoScenario(), grid: { ...demoScenario().grid, courant: 0.75 }, steps: 3000 };
    await page.evaluate((sc) => (document.querySelector('gg-app') as unknown as { controller: { runUncheckedForTest(s: unknown): void } })
      .controller.runUncheckedForTest(sc), s);
    expect(await waitForRunEnd(page)).toBe('stopped'); // common practice, no source
    const message = await page.locator('gg-run-controls .message').textContent();
    expect(message).toMatch(/run stopped: the field (became|energy)/);
    expect(message).toMatch(/step \d+/);
    const kept = await page.evaluate(() =>
      (document.querySelector('gg-app') as unknown as { store: { state: { results?: { steps: number } } } }).store.state.results?.steps ?? 0);
    expect(kept).toBeGreaterThan(0);
    expect(kept).toBeLessThan(3000);
    expect(errors).toEqual([]);
  });
});

describe('a run too big for the engine', () => {
  it('fails with a message naming the grid and the bytes, and the page runs again afterwards', async () => {
    const { page, errors } = await openPage();
    // Fault injection: 20 000² nodes (≈ 8 GiB) past validation; wasm32 addresses 4 GiB (WebAssembly core spec, memory32)
    const s: Scenario = { ...demoScenario(), grid: { ...demoScenario().grid, nx: 20_000, ny: 20_000 } };
    await page.evaluate((sc) => (document.querySelector('gg-app') as unknown as { controller: { runUncheckedForTest(s: unknown): void } })
      .controller.runUncheckedForTest(sc), s);
    expect(await waitForRunEnd(page)).toBe('failed'); // common practice, no source
    expect(await page.locator('gg-run-controls .message').textContent()).toMatch(/grid\.nx: .*GiB/);
    await command(page, 'run').click();
    expect(await waitForRunEnd(page)).toBe('done'); // the tab survived and recovers
    expect(errors).toEqual([]);
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
    await expect.poll(async () => (await probes()).length).toBe(before + 1); // common practice, no source
    const added = (await probes())[before];
    await page.keyboard.press('ArrowUp');
    await expect.poll(async () => (await probes())[before].y).toBeCloseTo(added.y + demoScenario().grid.dy, 12); // common practice, no source
    await page.keyboard.press('Delete');
    await expect.poll(async () => (await probes()).length).toBe(before); // common practice, no source
  });

  it('adds a probe by click, draws a line by drag and moves the source by drag on the field view', async () => {
    const { page } = await openPage();
    const draft = () => page.evaluate(() =>
      (document.querySelector('gg-app') as unknown as { store: { state: { draft: Scenario } } }).store.state.draft);
    const canvas = page.locator('gg-field-view canvas.map');
    const box = await canvas.boundingBox();
    if (!box) throw new Error('the field canvas has no box');
    const { nx, ny, dx, dy } = demoScenario().grid;
    // Centre of node (i, j) on the canvas, j = 0 at the bottom (the view's own convention).
    const at = (i: number, j: number) => [box.x + ((i + 0.5) / nx) * box.width, box.y + box.height - ((j + 0.5) / ny) * box.height] as const;

    const probesBefore = (await draft()).probes.length;
    await page.mouse.click(...at(100, 100));
    await expect.poll(async () => (await draft()).probes.length).toBe(probesBefore + 1); // common practice, no source
    const added = (await draft()).probes[probesBefore];
    expect([added.x, added.y]).toEqual([Number((100 * dx).toPrecision(12)), Number((100 * dy).toPrecision(12))]); // common practice, no source

    const linesBefore = (await draft()).lines.length;
    await page.mouse.move(...at(100, 200));
    await page.mouse.down();
    await page.mouse.move(...at(150, 200), { steps: 5 });
    await page.mouse.move(...at(200, 200), { steps: 5 });
    await page.mouse.up();
    await expect.poll(async () => (await draft()).lines.length).toBe(linesBefore + 1); // common practice, no source
    const line = (await draft()).lines[linesBefore];
    expect([line.x0, line.y0, line.x1, line.y1]).toEqual([0.1, 0.2, 0.2, 0.2]); // common practice, no source

    const source = demoScenario().source;
    await page.mouse.move(...at(Math.round(source.x / dx), Math.round(source.y / dy)));
    await page.mouse.down();
    await page.mouse.move(...at(140, 160), { steps: 6 });
    await page.mouse.up();
    await expect.poll(async () => [(await draft()).source.x, (await draft()).source.y]).toEqual([0.14, 0.16]); // common practice, no source
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
    expect(unlabelled).toEqual([]); // common practice, no source
    let reached = false;
    for (let k = 0; k < 200 && !reached; k++) {
      await page.keyboard.press('Tab');
      reached = await page.evaluate(() => {
        let el: Element | null = document.activeElement;
        while (el?.shadowRoot?.activeElement) el = el.shadowRoot.activeElement;
        return el?.getAttribute('data-command') === 'run';
      });
    }
    expect(reached).toBe(true); // common practice, no source
    await page.keyboard.press('Enter');
    expect(await waitForRunEnd(page)).toBe('done'); // common practice, no source
  });

  it('requests nothing beyond its own files during a full run and export, and the CSP blocks any other origin', async () => {
    const { page, context } = await h.newPage();
    const requested: string[] = [];
    context.on('request', (r) => requested.push(r.url()));
    await page.goto(h.url);
    expect(await waitForRunEnd(page)).toBe('done'); // common practice, no source
    await waitForCompareDrawn(page);
    const origin = new URL(h.url).origin;
    const foreign = requested.filter((u) => !u.startsWith(origin) && !u.startsWith('data:') && !u.startsWith('blob:'));
    expect(requested.length).toBeGreaterThan(2);
    expect(foreign).toEqual([]); // CSP Level 3 (W3C): default-src 'self'
    // a script that tried to reach another origin is stopped by the policy before any traffic
    const violation = await page.evaluate(async () => {
      const seen = new Promise<string>((resolve) => {
        document.addEventListener('securitypolicyviolation', (e) => resolve(`${e.effectiveDirective} ${e.blockedURI}`), { once: true });
      });
      await fetch('http://127.0.0.2:9/leak').catch(() => undefined);
      return Promise.race([seen, new Promise<string>((resolve) => setTimeout(() => resolve('no violation'), 2000))]);
    });
    expect(violation).toMatch(/^connect-src http:\/\/127\.0\.0\.2:9/);
  });

  it('carries a Content-Security-Policy that allows only its own origin', async () => {
    const { page } = await openPage();
    const csp = await page.locator('meta[http-equiv="Content-Security-Policy"]').getAttribute('content');
    expect(csp).toContain("default-src 'self'"); // CSP Level 3 (W3C), default-src
    expect(csp).toContain("script-src 'self' 'wasm-unsafe-eval'"); // CSP Level 3, 'wasm-unsafe-eval' for WebAssembly compilation
    expect(csp).not.toContain('unsafe-inline'); // common practice, no source
    expect(csp).not.toContain("'unsafe-eval'"); // common practice, no source
  });
});
