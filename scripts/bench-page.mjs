#!/usr/bin/env node
// Page benchmark (a measurement, not a test): loads the built page in headless Chromium
// and reports
//   - for the demo scenario, the time from pressing Run to the drawn comparison (charts,
//     table and error map), first press and the median of the following presses, and the
//     time from opening the page (which runs the demo by itself) to the drawn comparison;
//   - for a 1000 × 1000 grid with two probes, a probe line, three analysis frequencies and
//     error maps on, the page's speed by the wall clock and where that time went: the
//     engine's field update, probe and line DFTs and full-grid DFTs (the engine's time in
//     the run, shared out by timing the same scenario three ways on bench.html in the same
//     browser), frame capture and posting, progress messages, idle time between batches,
//     the blow-up watch; and on the page's main thread, frame figures and painting;
//   - the engine's own speed at 1024²: on bench.html in the same browser right after each
//     1000² run (the machine may be shared: each run is set against the engine figure of
//     the same moment, and the median of those ratios is reported), and from
//     `gridgauge bench --json` in Node unless --no-cli-bench.
// Usage: node scripts/bench-page.mjs [--json] [--repeats N] [--big-runs N] [--no-cli-bench] [--off-screen]   (npm run bench:page builds dist/ first)
import { execFileSync } from 'node:child_process';
import { loadavg } from 'node:os';
import { register } from 'tsx/esm/api';

register();
const { ROOT, startHarness, waitForCompareDrawn, waitForRunEnd } = await import('../test/browser/harness.ts');
const { demoScenario } = await import('../src/scenario/defaults.ts');

const args = process.argv.slice(2);
const json = args.includes('--json');
const cliBench = !args.includes('--no-cli-bench');
// --off-screen: the 1000² runs with the Results section on show, so the field view paints nothing
const offScreen = args.includes('--off-screen');
const repeatsAt = args.indexOf('--repeats');
const repeats = repeatsAt >= 0 ? Math.max(1, Number(args[repeatsAt + 1]) || 5) : 5;
const bigAt = args.indexOf('--big-runs');
const bigRuns = bigAt >= 0 ? Math.max(1, Number(args[bigAt + 1]) || 7) : 7;
const BIG_STEPS = 2000;
const say = (line) => process.stderr.write(`${line}\n`);
const load = () => loadavg().map((x) => Number(x.toFixed(2)));

const appState = (page) => page.evaluate(() => {
  const app = document.querySelector('gg-app');
  return { ...app.dataset, run: app.store.state.run };
});

/** Main-thread frame costs so far: frames received and their figures (store), pictures painted (field view). */
const mainThreadCosts = (page) => page.evaluate(() => {
  const app = document.querySelector('gg-app');
  const view = app.shadowRoot.querySelector('gg-field-view');
  return { frames: app.store.frameCosts.count, statsMs: app.store.frameCosts.ms, paints: view.paintStats.count, paintMs: view.paintStats.ms };
});

async function pressRunAndWait(page) {
  const before = Number((await appState(page)).drawnRun ?? 0);
  await page.locator('gg-run-controls button[data-command="run"]').click();
  await page.waitForFunction((n) => Number(document.querySelector('gg-app').dataset.drawnRun ?? 0) > n, before, { timeout: 300_000 });
  return Number((await appState(page)).compareMs);
}

function median(values) {
  const s = [...values].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
}

/** A 1000 × 1000 grid of 1 mm cells with the demo's source, first two probes and line moved to its centre. */
function bigScenario(steps) {
  const s = demoScenario();
  const shift = 0.5 - s.source.x;
  s.grid.nx = 1000;
  s.grid.ny = 1000;
  s.source.x += shift;
  s.source.y += shift;
  s.probes = s.probes.slice(0, 2).map((p) => ({ ...p, x: Number((p.x + shift).toFixed(6)), y: Number((p.y + shift).toFixed(6)) }));
  s.lines = s.lines.map((l) => ({ ...l, x0: Number((l.x0 + shift).toFixed(6)), y0: Number((l.y0 + shift).toFixed(6)), x1: Number((l.x1 + shift).toFixed(6)), y1: Number((l.y1 + shift).toFixed(6)) }));
  s.steps = steps;
  return s;
}

/** `gridgauge bench --json` in Node: the engine's Mcells/s at 1024². */
function cliEngineFigure() {
  const out = execFileSync(process.execPath, ['bin/gridgauge.js', 'bench', '--json'], { cwd: ROOT, encoding: 'utf8', stdio: ['ignore', 'pipe', 'ignore'], timeout: 600_000 });
  const report = JSON.parse(out);
  const r = report.results.find((x) => x.nx === 1024);
  return { mcells: r.engine_mcells, runs: r.engine_runs_mcells };
}

const scenario = bigScenario(BIG_STEPS);
const cells = scenario.grid.nx * scenario.grid.ny;
const runs = [];
let mapFrequencies = [];
const h = await startHarness();
const report = { load_before: load() };
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
        `(worker ${(st.run.runSeconds * 1000).toFixed(0)} ms: ${['setup', 'stepping', 'results', 'errorMap'].map((key) => `${key} ${st.run.timings[key].toFixed(0)}`).join(', ')}; ` +
        `drawing after results ${Number(st.drawingMs).toFixed(0)} ms)`);
    }
    const state = await appState(page);
    report.demo = {
      nx: 300, ny: 300, steps: demoScenario().steps,
      first_press_to_compare_ms: Math.round(times[0]),
      median_press_to_compare_ms: Math.round(median(times.slice(1).length ? times.slice(1) : times)),
      press_to_compare_ms: times.map(Math.round),
      run_seconds_in_worker: Number(state.run.runSeconds.toFixed(3)),
      steps_per_second: Math.round(state.run.stepsPerSecond),
      target_ms: 300,
    };
    await page.context().close();
  }
  // The 1000 × 1000 scenario, run `bigRuns` times on one page, each followed by the engine's
  // 1024² figure on the bench page; the split of each run.
  const { page: benchPage } = await h.newPage();
  await benchPage.goto(`${h.url}bench.html?size=1024&runs=0`);
  await benchPage.waitForFunction(() => ['ready', 'error'].includes(document.body.dataset.state ?? ''), null, { timeout: 120_000 });
  const engineNow = async () => {
    const count = 120;
    const rates = [];
    for (let r = 0; r < 5; r++) rates.push((1024 * 1024 * count) / (await benchPage.evaluate((c) => window.gridgaugeBench.run(c), count)) / 1e6);
    return median(rates);
  };
  await engineNow();
  {
    const link = Buffer.from(JSON.stringify(scenario)).toString('base64url');
    const { page, errors } = await h.newPage();
    await page.goto(`${h.url}?autorun=0#s=${link}`);
    await page.evaluate(() => document.querySelector('gg-app').controller.whenReady());
    const ok = await page.evaluate(() => document.querySelector('gg-app').store.state.check.ok);
    if (!ok) throw new Error('the 1000 × 1000 scenario did not validate in the page');
    if (offScreen) {
      await page.getByRole('tab', { name: 'Results' }).click();
      await page.waitForTimeout(300);
    }
    for (let k = 0; k < bigRuns; k++) {
      const before = await mainThreadCosts(page);
      const compareMs = await pressRunAndWait(page);
      const after = await mainThreadCosts(page);
      const state = await appState(page);
      const maps = await page.evaluate(() => document.querySelector('gg-app').store.state.errorMaps.map((m) => m.f_Hz));
      mapFrequencies = maps;
      const t = state.run.timings;
      const engine1024 = await engineNow();
      runs.push({
        engine_1024_mcells: engine1024,
        compare_ms: compareMs, split: t.split, results_ms: t.results, error_maps_ms: t.errorMap, setup_ms: t.setup,
        maps: maps.length,
        main: { frames: after.frames - before.frames, stats_ms: after.statsMs - before.statsMs, paints: after.paints - before.paints, paint_ms: after.paintMs - before.paintMs },
      });
      const s = t.split;
      say(`1000² run ${k + 1}: ${(BIG_STEPS / s.wall * 1000).toFixed(0)} steps/s by the wall clock (${(BIG_STEPS * cells / s.wall / 1e3).toFixed(0)} Mcells/s), ` +
        `engine ${s.engine.toFixed(0)} of ${s.wall.toFixed(0)} ms, ${s.batches} batches, ${s.frameCount} frames (${s.frames.toFixed(0)} ms), ${maps.length} maps; ` +
        `engine at 1024² just after: ${engine1024.toFixed(0)} Mcells/s, ratio ${((BIG_STEPS * cells / s.wall / 1e3) / engine1024).toFixed(2)}; load ${load().join(' ')}`);
    }
    if (errors.length) say(`console errors: ${errors.join(' | ')}`);
    await page.context().close();
  }
  // The engine on the same scenario three ways, in this browser.
  report.engine_split = await benchPage.evaluate(([s, f]) => window.gridgaugeBench.split(s, f), [scenario, mapFrequencies]);
  await benchPage.context().close();
} finally {
  await h.close();
}
if (cliBench) {
  say('gridgauge bench --json (Node), for the engine figure at 1024² …');
  report.engine_1024_node = cliEngineFigure();
}
report.load_after = load();

// The split: medians over the 1000² runs; the engine's time shared out by the per-step costs.
const e = report.engine_split;
// a part whose timing difference falls below zero is within the noise of the three timings: counted as 0
const parts = { bare: e.bare_ms, points: Math.max(0, e.points_ms - e.bare_ms), maps: Math.max(0, e.maps_ms - Math.max(e.points_ms, e.bare_ms)) };
const whole = parts.bare + parts.points + parts.maps;
const shares = { bare: parts.bare / whole, points: parts.points / whole, maps: parts.maps / whole };
const m = (f) => median(runs.map(f));
const wall = m((r) => r.split.wall);
const engine = m((r) => r.split.engine);
const rows = [
  ['field update (engine)', engine * shares.bare],
  ['probe and line DFTs (engine)', engine * shares.points],
  ['full-grid DFTs for the error maps (engine)', engine * shares.maps],
  ['frame capture and posting', m((r) => r.split.frames)],
  ['progress messages', m((r) => r.split.progress)],
  ['idle between batches (event loop)', m((r) => r.split.idle)],
  ['blow-up watch and batch loop (the rest)', m((r) => r.split.wall - r.split.engine - r.split.frames - r.split.progress - r.split.idle)],
];
const pageMcells = (BIG_STEPS * cells) / wall / 1e3;
report.grid_1000 = {
  nx: 1000, ny: 1000, steps: BIG_STEPS, probes: scenario.probes.length, lines: scenario.lines.length,
  frequencies: scenario.frequencies.length, maps: runs[0]?.maps ?? 0, runs: runs.length,
  stepping_wall_ms: Math.round(wall),
  steps_per_second_wall: Math.round((BIG_STEPS / wall) * 1000),
  mcells_per_second_wall: Math.round(pageMcells),
  split_ms: Object.fromEntries(rows.map(([k, v]) => [k, Number(v.toFixed(1))])),
  batches: m((r) => r.split.batches), frames: m((r) => r.split.frameCount),
  after_stepping_ms: { results: Math.round(m((r) => r.results_ms)), error_maps: Math.round(m((r) => r.error_maps_ms)) },
  main_thread_ms: { frame_figures: Math.round(m((r) => r.main.stats_ms)), painting: Math.round(m((r) => r.main.paint_ms)), paints: m((r) => r.main.paints) },
  press_to_compare_ms: Math.round(m((r) => r.compare_ms)),
};
report.engine_1024_browser_mcells = Math.round(m((r) => r.engine_1024_mcells));
report.ratio_to_engine_browser = Number(m((r) => (BIG_STEPS * cells) / r.split.wall / 1e3 / r.engine_1024_mcells).toFixed(2));
if (report.engine_1024_node) report.ratio_to_engine_node = Number((pageMcells / report.engine_1024_node.mcells).toFixed(2));

if (json) {
  process.stdout.write(`${JSON.stringify(report, null, 2)}\n`);
} else {
  const d = report.demo;
  const g = report.grid_1000;
  const pct = (v) => `${((100 * v) / wall).toFixed(1)} %`;
  const lines = [
    `load average before ${report.load_before.join(' ')}, after ${report.load_after.join(' ')}`,
    `demo ${d.nx} × ${d.ny}, ${d.steps} steps: Run → drawn comparison ${d.first_press_to_compare_ms} ms first press, ` +
      `${d.median_press_to_compare_ms} ms median after (target < ${d.target_ms} ms); ${d.steps_per_second} steps/s`,
    `demo on opening the page (load, worker start, run, drawing): ${report.demo_open_to_compare_ms} ms`,
    `1000 × 1000, ${g.steps} steps, ${g.probes} probes, ${g.lines} line, ${g.frequencies} frequencies, ${g.maps} error maps; medians of ${g.runs} runs:`,
    `  ${g.steps_per_second_wall} steps/s by the wall clock = ${g.mcells_per_second_wall} M node updates/s; Run → drawn comparison ${g.press_to_compare_ms} ms`,
    `  | where the stepping phase's ${g.stepping_wall_ms} ms went | ms | share |`,
    `  |---|---:|---:|`,
    ...rows.map(([k, v]) => `  | ${k} | ${v.toFixed(0)} | ${pct(v)} |`),
    `  ${g.batches} batches, ${g.frames} frames; after stepping: results ${g.after_stepping_ms.results} ms, error maps ${g.after_stepping_ms.error_maps} ms`,
    `  main thread meanwhile: frame figures ${g.main_thread_ms.frame_figures} ms, painting ${g.main_thread_ms.painting} ms (${g.main_thread_ms.paints} pictures)`,
    `  engine per step on this scenario: ${e.bare_ms.toFixed(3)} ms bare, ${e.points_ms.toFixed(3)} ms with probe/line DFTs, ${e.maps_ms.toFixed(3)} ms with ${mapFrequencies.length} full-grid DFTs`,
    `engine at 1024²: ${report.engine_1024_browser_mcells} Mcells/s in this browser (median of the figures taken after each run)` +
      (report.engine_1024_node ? `, ${report.engine_1024_node.mcells} Mcells/s in Node (gridgauge bench, after the runs)` : ''),
    `page / engine: ${report.ratio_to_engine_browser} (median over the runs of each run's speed over the browser figure taken just after it)` +
      (report.ratio_to_engine_node !== undefined ? `, ${report.ratio_to_engine_node} (median page speed over the gridgauge bench figure)` : ''),
  ];
  process.stdout.write(`${lines.join('\n')}\n`);
}
