#!/usr/bin/env node
// Runs the unit/reference suite and the browser suite with Vitest, then prints one closing
// line "N passed, N failed" that CI reads, and exits non-zero when any test failed or a
// suite could not run. Set GRIDGAUGE_SKIP_BROWSER=1 to run only the Node suite.
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, rmSync } from 'node:fs';

mkdirSync('out', { recursive: true });
const suites = [{ name: 'node', args: [] }];
if (!process.env.GRIDGAUGE_SKIP_BROWSER) suites.push({ name: 'browser', args: ['--config', 'vitest.browser.config.ts'] });

let passed = 0;
let failed = 0;
let broken = false;
for (const suite of suites) {
  const report = `out/test-${suite.name}.json`;
  rmSync(report, { force: true });
  const run = spawnSync('npx', ['vitest', 'run', ...suite.args, '--reporter=default', '--reporter=json', `--outputFile.json=${report}`], {
    stdio: 'inherit', env: { ...process.env, NO_COLOR: '1' },
  });
  if (!existsSync(report)) {
    console.error(`${suite.name} suite produced no report (exit ${run.status}); counting it as failed`);
    broken = true;
    continue;
  }
  const r = JSON.parse(readFileSync(report, 'utf8'));
  passed += r.numPassedTests;
  failed += r.numFailedTests;
  if (r.numTotalTests === 0 || (run.status !== 0 && r.numFailedTests === 0)) broken = true;
}
console.log(`${passed} passed, ${failed} failed`);
process.exit(failed > 0 || broken ? 1 : 0);
