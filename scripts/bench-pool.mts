// Times one study on a pool of 1 worker and on a pool of 2 workers (best of N runs each,
// alternating, worker start-up included) and prints the speed-up. Exits 1 when 2 workers
// are not at least 1.6 times faster, so it can stand as a check on a 2-core machine.
//
//   npx tsx scripts/bench-pool.mts [--study absorber|resolution] [--repeats 3] [--file examples/demo.json]
import { readFileSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { parseArgs } from 'node:util';
import { parseScenarioText } from '../src/scenario/parse.ts';
import { planAbsorberStudy, runAbsorberStudy } from '../src/studies/absorber-study.ts';
import { createNodePool } from '../src/studies/node-pool.ts';
import { planResolutionStudy, runResolutionStudy } from '../src/studies/resolution-study.ts';

const REQUIRED_SPEEDUP = 1.6;

const { values } = parseArgs({
  options: {
    study: { type: 'string', default: 'absorber' },
    repeats: { type: 'string', default: '3' },
    file: { type: 'string', default: 'examples/demo.json' },
  },
});
const parsed = parseScenarioText(readFileSync(values.file as string, 'utf8'));
if (!parsed.ok) {
  for (const p of parsed.problems) console.error(`${p.path}: ${p.message}`);
  process.exit(2);
}
const scenario = parsed.scenario;
const repeats = Math.max(1, Number(values.repeats));

/**
 * Runs the study once on a fresh pool of `workers`; returns wall-clock seconds and workers
 * used. Cold: the clock includes starting the workers (what a command-line user waits for).
 * Warm: the workers are started and ready first (the page keeps its pool between studies).
 */
async function once(workers: number, warm: boolean): Promise<{ seconds: number; used: number; jobs: number }> {
  const pool = createNodePool(workers);
  if (warm) await pool.warm();
  const t0 = performance.now();
  try {
    if (values.study === 'resolution') {
      const plan = planResolutionStudy(scenario, { size_wavelengths: 12, budget_deg: 5 });
      const r = await runResolutionStudy(plan, pool);
      return { seconds: (performance.now() - t0) / 1000, used: r.workers.length, jobs: plan.candidates.length };
    }
    const plan = planAbsorberStudy(scenario, {});
    const r = await runAbsorberStudy(plan, pool);
    return { seconds: (performance.now() - t0) / 1000, used: r.workers.length, jobs: plan.candidates.length + 1 };
  } finally {
    pool.dispose();
  }
}

console.log(`${values.study} study of ${values.file} on a machine with ${availableParallelism()} hardware threads, best of ${repeats}`);
const figures: Record<string, number> = {};
let used2 = 0;
for (const warm of [false, true]) {
  const best = { 1: Infinity, 2: Infinity };
  for (let k = 0; k < repeats; k++) {
    for (const workers of [1, 2] as const) {
      const r = await once(workers, warm);
      best[workers] = Math.min(best[workers], r.seconds);
      if (workers === 2) used2 = Math.max(used2, r.used);
      console.log(`  ${warm ? 'warm' : 'cold'} run ${k + 1}: ${workers} worker${workers === 1 ? ' ' : 's'} ${r.seconds.toFixed(2)} s (${r.jobs} jobs, ${r.used} worker${r.used === 1 ? '' : 's'} used)`);
    }
  }
  const label = warm ? 'warm' : 'cold';
  figures[`${label}_one_worker_s`] = best[1];
  figures[`${label}_two_workers_s`] = best[2];
  figures[`${label}_speedup`] = best[1] / best[2];
  console.log(`${label} (${warm ? 'workers ready before the clock starts' : 'worker start-up included'}): 1 worker ${best[1].toFixed(2)} s, 2 workers ${best[2].toFixed(2)} s: ${(best[1] / best[2]).toFixed(2)}×`);
}
const speedup = figures.cold_speedup;
console.log(`required: ${REQUIRED_SPEEDUP}× with start-up included; measured ${speedup.toFixed(2)}×`);
console.log(JSON.stringify({ study: values.study, ...figures, workers_used: used2 }));
process.exit(speedup >= REQUIRED_SPEEDUP && used2 > 1 ? 0 : 1);
