#!/usr/bin/env node
// Browser figure of the engine benchmark: the built bench page (dist/bench.html, from
// `npx vite build`; this script builds nothing) is served by Vite's preview server on
// 127.0.0.1 and stepped in headless Chromium. Runs in the page alternate with runs of the
// same grid in this Node process, so both figures see the same machine load.
//
//   node scripts/bench-browser.mjs [--size 1024] [--runs 9] [--seconds 0.3] [--no-node] [--json]
import { existsSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { chromium } from 'playwright-core';
import { preview } from 'vite';

const ROOT = resolve(dirname(fileURLToPath(import.meta.url)), '..');
const CHROMIUM = '/usr/bin/chromium';
const CHROMIUM_ARGS = [
  '--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run',
  '--disable-background-networking', '--disable-component-update', '--disable-sync',
];

function option(name, fallback) {
  const args = process.argv.slice(2);
  const k = args.findIndex((a) => a === `--${name}` || a.startsWith(`--${name}=`));
  if (k < 0) return fallback;
  const value = args[k].includes('=') ? args[k].split('=')[1] : args[k + 1];
  const number = Number(value);
  if (!Number.isFinite(number) || number <= 0) {
    console.error(`bench-browser: --${name} needs a positive number`);
    process.exit(2);
  }
  return number;
}
const flag = (name) => process.argv.includes(`--${name}`);

const size = option('size', 1024);
const runs = option('runs', 9);
const seconds = option('seconds', 0.3);
const withNode = !flag('no-node');
const json = flag('json');
const say = (msg) => process.stderr.write(`${msg}\n`);

const median = (xs) => {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
};

async function nodeRunner() {
  // The engine wrapper is TypeScript; tsx (a dependency) loads it in this process.
  const { tsImport } = await import('tsx/esm/api');
  const { Simulation } = await tsImport('../src/engine/simulation.ts', import.meta.url);
  const { benchScenario } = await tsImport('../src/engine/bench-scenario.ts', import.meta.url);
  const sim = await Simulation.create(benchScenario(size, 1_000_000));
  return (count) => {
    const t0 = performance.now();
    sim.step(count);
    return (performance.now() - t0) / 1e3;
  };
}

async function main() {
  if (!existsSync(join(ROOT, 'dist', 'bench.html'))) {
    console.error('bench-browser: dist/bench.html is missing; run "npx vite build" first');
    process.exit(2);
  }
  if (!existsSync(CHROMIUM)) {
    console.error(`bench-browser: ${CHROMIUM} is missing; install it with "apt-get install -y chromium"`);
    process.exit(2);
  }
  const server = await preview({ root: ROOT, logLevel: 'silent', preview: { host: '127.0.0.1', port: 0, strictPort: false, open: false } });
  const base = server.resolvedUrls?.local?.[0];
  if (!base) throw new Error('the preview server did not report its address');
  const browser = await chromium.launch({ executablePath: CHROMIUM, args: CHROMIUM_ARGS });
  try {
    const page = await browser.newPage();
    const errors = [];
    page.on('pageerror', (e) => errors.push(e.message));
    page.on('console', (m) => { if (m.type() === 'error') errors.push(m.text()); });
    say(`bench-browser: ${base}bench.html, ${size} × ${size}`);
    await page.goto(`${base}bench.html?size=${size}&runs=0`);
    await page.waitForFunction(() => ['ready', 'error'].includes(document.body.dataset.state ?? ''), null, { timeout: 120_000 });
    const state = await page.evaluate(() => document.body.dataset.state);
    if (state !== 'ready') throw new Error(`the bench page failed: ${await page.evaluate(() => window.gridgaugeBench?.error)}`);
    const browserVersion = browser.version();

    const cells = size * size;
    const nodeRun = withNode ? await nodeRunner() : undefined;
    const pageRun = (count) => page.evaluate((c) => window.gridgaugeBench.run(c), count);
    // Warm-up on both sides, then steps per run from one timed run.
    const warm = Math.max(4, Math.round(2e6 / cells));
    for (let r = 0; r < 4; r++) { await pageRun(warm); nodeRun?.(warm); }
    const steps = Math.max(1, Math.round((seconds / Math.max(await pageRun(warm), 1e-6)) * warm));
    const inPage = [];
    const inNode = [];
    for (let r = 0; r < runs; r++) {
      inPage.push(cells * steps / (await pageRun(steps)) / 1e6);
      if (nodeRun) inNode.push(cells * steps / nodeRun(steps) / 1e6);
      say(`  run ${r + 1}/${runs}: Chromium ${inPage.at(-1).toFixed(0)}${nodeRun ? `, Node ${inNode.at(-1).toFixed(0)}` : ''} Mcells/s`);
    }
    if (errors.length) throw new Error(`the page reported errors: ${errors.join('; ')}`);
    const mcells = median(inPage);
    const nodeMcells = nodeRun ? median(inNode) : null;
    const result = {
      nx: size, ny: size, steps_per_run: steps, runs,
      chromium: browserVersion,
      steps_per_second: Number(((mcells * 1e6) / cells).toFixed(1)),
      mcells: Math.round(mcells),
      node_mcells: nodeMcells === null ? null : Math.round(nodeMcells),
      browser_to_node: nodeMcells === null ? null : Number((mcells / nodeMcells).toFixed(2)),
      runs_mcells: inPage.map(Math.round),
      node_runs_mcells: inNode.map(Math.round),
    };
    if (json) {
      process.stdout.write(`${JSON.stringify(result)}\n`);
    } else {
      console.log(`headless Chromium ${browserVersion}, ${size} × ${size}, 10-cell CPML, median of ${runs} runs of ${steps} steps:`);
      console.log(`  ${result.steps_per_second} steps/s = ${result.mcells} Mcells/s`);
      if (nodeMcells !== null) console.log(`  Node ${process.versions.node} in alternation: ${result.node_mcells} Mcells/s; Chromium / Node = ${result.browser_to_node}`);
    }
  } finally {
    await browser.close();
    await new Promise((done) => server.httpServer.close(done));
  }
}

main().catch((e) => {
  console.error(`bench-browser: ${e instanceof Error ? e.message : e}`);
  process.exit(1);
});
