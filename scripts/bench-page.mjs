#!/usr/bin/env node
// Page benchmark (a measurement, not a test): loads the built page in headless Chromium
// and reports
//   - for the demo scenario, the time from pressing Run to the drawn comparison (charts,
//     table and error map), first press and the median of the following presses, and the
//     time from opening the page (which runs the demo by itself) to the drawn comparison;
//   - for a 1000 × 1000 grid, time steps per second as the page's worker reports them.
// Usage: node scripts/bench-page.mjs [--json] [--repeats N]   (builds dist/ if missing)
import { register } from 'tsx/esm/api';

register();
const { startHarness, waitForCompareDrawn, waitForRunEnd } = await import('../test/browser/harness.ts');
const { demoScenario } = await import('../src/scenario/defaults.ts');

const args = process.argv.slice(2);
const json = args.includes('--json');
const repeatsAt = args.indexOf('--repeats');
const repeats = repeatsAt >= 0 ? Math.max(1, Number(args[repeatsAt + 1]) || 5) : 5;
const say = (line) => process.stderr.write(`${line}\n`);

const appState = (page) => page.evaluate(() => {
  const app = document.querySelector('gg-app');
  return { ...app.dataset, run: app.store.state.run };
});

async function pressRunAndWait(page) {
  const before = Number((await appState(page)).drawnRun ?? 0);
  await page.locator('gg-run-controls button[data-command="run"]').click();
  await page.waitForFunction((n) => Number(document.querySelector('gg-app').dataset.drawnRun ?? 0) > n, before, { timeout: 120_000 });
  return Number((await appState(page)).compareMs);
}

function median(values) {
  const s = [...values].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
}

/** A 1000 × 1000 grid of 1 mm cells with the demo's source, probes and line moved to its centre. */
function bigScenario(steps) {
  const s = demoScenario();
  const shift = 0.5 - s.source.x;
  s.grid.nx = 1000;
  s.grid.ny = 1000;
  s.source.x += shift;
  s.source.y += shift;
  s.probes = s.probes.map((p) => ({ ...p, x: Number((p.x + shift).toFixed(6)), y: Number((p.y + shift).toFixed(6)) }));
  s.lines = s.lines.map((l) => ({ ...l, x0: Number((l.x0 + shift).toFixed(6)), y0: Number((l.y0 + shift).toFixed(6)), x1: Number((l.x1 + shift).toFixed(6)), y1: Number((l.y1 + shift).toFixed(6)) }));
  s.steps = steps;
  return s;
}

const h = await startHarness();
const report = {};
try {
  // Opening the page runs the demo by itself: page load, worker start, run, drawing.
  {
    const { page, errors } = await h.newPage();
    await page.goto(h.url);
    await waitForRunEnd(page);
    await waitForCompareDrawn(page);
    const openToCompare = await page.evaluate(() => performance.getEntriesByName('gg-compare-drawn')[0]?.startTime);
    report.demo_open_to_compare_ms = Math.round(openToCompare);
    if (errors.length) say(`console errors: ${errors.join(' | ')}`);
    await page.context().close();
  }
  // Pressing Run on a loaded page, worker ready.
  {
    const { page } = await h.newPage();
    await page.goto(`${h.url}?autorun=0`);
    await page.evaluate(() => document.querySelector('gg-app').controller.whenReady());
    const times = [];
    for (let k = 0; k < repeats; k++) {
      times.push(await pressRunAndWait(page));
      const st = await appState(page);
      say(`demo run ${k + 1}: ${times[k].toFixed(0)} ms from Run to drawn comparison ` +
        `(worker ${(st.run.runSeconds * 1000).toFixed(0)} ms: ${Object.entries(st.run.timings).map(([k, v]) => `${k} ${v.toFixed(0)}`).join(', ')}; ` +
        `drawing after results ${Number(st.drawingMs).toFixed(0)} ms)`);
    }
    const state = await appState(page);
    report.demo = {
      nx: 300, ny: 300, steps: demoScenario().steps,
      first_press_to_compare_ms: Math.round(times[0]),
      median_press_to_compare_ms: Math.round(median(times.slice(1).length ? times.slice(1) : times)),
      run_seconds_in_worker: Number(state.run.runSeconds.toFixed(3)),
      steps_per_second: Math.round(state.run.stepsPerSecond),
      target_ms: 1500,
    };
    await page.context().close();
  }
  // Speed on a 1000 × 1000 grid (the error map's full-grid DFT included, as the page runs it).
  {
    const steps = 400;
    const scenario = bigScenario(steps);
    const link = Buffer.from(JSON.stringify(scenario)).toString('base64url');
    const { page } = await h.newPage();
    await page.goto(`${h.url}?autorun=0#s=${link}`);
    await page.evaluate(() => document.querySelector('gg-app').controller.whenReady());
    const ok = await page.evaluate(() => document.querySelector('gg-app').store.state.check.ok);
    if (!ok) throw new Error('the 1000 × 1000 scenario did not validate in the page');
    const compareMs = await pressRunAndWait(page);
    const state = await appState(page);
    report.grid_1000 = {
      nx: 1000, ny: 1000, steps,
      steps_per_second: Number(state.run.stepsPerSecond.toFixed(1)),
      mcells_per_second: Number(((state.run.stepsPerSecond * 1000 * 1000) / 1e6).toFixed(1)),
      press_to_compare_ms: Math.round(compareMs),
    };
    await page.context().close();
  }
} finally {
  await h.close();
}

if (json) {
  process.stdout.write(`${JSON.stringify(report, null, 2)}\n`);
} else {
  const d = report.demo;
  const g = report.grid_1000;
  process.stdout.write([
    `demo ${d.nx} × ${d.ny}, ${d.steps} steps: Run → drawn comparison ${d.first_press_to_compare_ms} ms first press, ` +
      `${d.median_press_to_compare_ms} ms median after (target < ${d.target_ms} ms); ${d.steps_per_second} steps/s`,
    `demo on opening the page (load, worker start, run, drawing): ${report.demo_open_to_compare_ms} ms`,
    `1000 × 1000, ${g.steps} steps: ${g.steps_per_second} steps/s (${g.mcells_per_second} M node updates/s), ` +
      `Run → drawn comparison ${g.press_to_compare_ms} ms`,
  ].join('\n') + '\n');
}
