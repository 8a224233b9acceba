import { describe, expect, it } from 'vitest';
import { Simulation } from '../../src/engine/simulation.ts';
import { planAbsorberStudy, runAbsorberStudy, type AbsorberCandidateResult } from '../../src/studies/absorber-study.ts';
import type { ProbeSeriesResult, StudyJob } from '../../src/studies/jobs.ts';
import { createNodePool, makeNodeWorkerFactory } from '../../src/studies/node-pool.ts';
import { StudyCancelled, StudyPool, type WorkerFactory, type WorkerHandlers } from '../../src/studies/pool.ts';
import type { ToWorker } from '../../src/studies/protocol.ts';
import { makeScenario } from '../fixtures/scenarios.ts';

const small = (steps = 300) => makeScenario({
  grid: { nx: 81, ny: 81 }, steps,
  probes: [{ name: 'a', x: 0.05, y: 0.04 }, { name: 'b', x: 0.06, y: 0.06 }],
});

describe('study pool on worker threads', () => {
  it('spreads jobs over more than one worker and returns what a direct run gives, bit for bit', async () => {
    // worker results must not depend on the thread that ran them: common practice, no source
    const pool = createNodePool(2);
    try {
      await pool.warm(); // else, on a busy machine, the first worker to start may take every job
      const jobs = [0, 1, 2, 3].map((k): StudyJob => ({ kind: 'probe-series', scenario: { ...small(400), source: { ...small().source, amplitude: k + 1 } } }));
      const outcomes = await Promise.all(jobs.map((job) => pool.run(job)));
      expect(new Set(outcomes.map((o) => o.worker)).size).toBe(2);
      expect(pool.workersStarted).toBe(2);
      const direct = await Simulation.create(jobs[2].scenario);
      direct.run();
      const series = (outcomes[2].result as ProbeSeriesResult).series;
      expect(Array.from(series[1])).toEqual(Array.from(direct.probeSeries(1)));
      direct.dispose();
      expect(outcomes.every((o) => o.result.kind === 'probe-series' && o.result.finite)).toBe(true);
    } finally {
      pool.dispose();
    }
  });

  it('workers started through tsx (when esbuild is missing) give the same results as bundled ones', async () => {
    // common practice, no source
    const job: StudyJob = { kind: 'probe-series', scenario: small(200) };
    const viaTsx = new StudyPool(makeNodeWorkerFactory('tsx'), 1);
    const bundled = new StudyPool(makeNodeWorkerFactory('bundle'), 1);
    try {
      const [a, b] = await Promise.all([viaTsx.run(job), bundled.run(job)]);
      expect(Array.from((a.result as ProbeSeriesResult).series[0])).toEqual(Array.from((b.result as ProbeSeriesResult).series[0]));
    } finally {
      viaTsx.dispose();
      bundled.dispose();
    }
  });

  it('cancelling stops running and waiting jobs at once, and the pool works again afterwards', async () => {
    // common practice, no source
    const pool = createNodePool(1);
    try {
      const long = makeScenario({ grid: { nx: 1500, ny: 1500 }, steps: 4000, probes: [{ name: 'a', x: 0.7, y: 0.7 }] });
      let progressed = false;
      const running = pool.run({ kind: 'probe-series', scenario: long }, () => { progressed = true; });
      const waiting = pool.run({ kind: 'probe-series', scenario: small() });
      while (!progressed) await new Promise((r) => setTimeout(r, 20));
      const t0 = performance.now();
      pool.cancel();
      await expect(running).rejects.toBeInstanceOf(StudyCancelled);
      await expect(waiting).rejects.toBeInstanceOf(StudyCancelled);
      expect(performance.now() - t0).toBeLessThan(1000); // the 9-billion-update run did not finish
      const again = await pool.run({ kind: 'probe-series', scenario: small() });
      expect(again.result.kind).toBe('probe-series');
    } finally {
      pool.dispose();
    }
  });

  it('an interrupted absorber study keeps the candidates that finished', async () => {
    // issue text: interrupted studies keep finished candidates; common practice, no source
    const pool = createNodePool(2);
    try {
      const plan = planAbsorberStudy(small(600), { cells: [4, 6, 8, 10, 12, 16, 20, 24], gradingCells: [8] });
      const controller = new AbortController();
      const seen: AbsorberCandidateResult[] = [];
      const study = await runAbsorberStudy(plan, pool, {
        signal: controller.signal,
        onCandidate: (c) => { seen.push(c); if (seen.length === 3) controller.abort(); },
      });
      expect(study.complete).toBe(false);
      expect(study.candidates.length).toBeGreaterThanOrEqual(3);
      expect(study.candidates.length).toBeLessThan(plan.candidates.length);
      expect(study.candidates.every((c) => Number.isFinite(c.reflection_dB))).toBe(true);
      expect(study.recommended === null || study.candidates.includes(study.recommended)).toBe(true);
    } finally {
      pool.dispose();
    }
  });
});

/** A stand-in worker run on the calling thread, for the pool's bookkeeping. */
function fakeFactory(behaviour: (message: ToWorker, handlers: WorkerHandlers) => void, startup: 'ready' | 'fatal' = 'ready'): { factory: WorkerFactory; started: () => number; terminated: () => number } {
  let started = 0;
  let terminated = 0;
  const factory: WorkerFactory = (handlers) => {
    started++;
    setTimeout(() => handlers.message(startup === 'ready' ? { type: 'ready' } : { type: 'fatal', message: 'engine not built' }), 1);
    return {
      post: (message) => setTimeout(() => behaviour(message, handlers), 1),
      terminate: () => { terminated++; },
    };
  };
  return { factory, started: () => started, terminated: () => terminated };
}

const job = (steps: number): StudyJob => ({ kind: 'probe-series', scenario: small(steps) });
const answer = (id: number, steps: number) => ({
  type: 'result' as const, id, result: { kind: 'probe-series' as const, series: [], finite: true, seconds: steps, cellUpdates: 0 },
});

describe('study pool bookkeeping', () => {
  it('a failing job rejects alone; the worker keeps serving', async () => {
    // common practice, no source
    const fake = fakeFactory((m, h) => {
      if (m.job.scenario.steps === 13) h.message({ type: 'failed', id: m.id, message: 'grid.nx: too big' });
      else h.message(answer(m.id, m.job.scenario.steps));
    });
    const pool = new StudyPool(fake.factory, 1);
    const results = await Promise.allSettled([pool.run(job(1)), pool.run(job(13)), pool.run(job(2))]);
    expect(results.map((r) => r.status)).toEqual(['fulfilled', 'rejected', 'fulfilled']);
    expect((results[1] as PromiseRejectedResult).reason.message).toBe('grid.nx: too big');
    expect(fake.started()).toBe(1);
  });

  it('an engine that cannot load fails every waiting job with its message, without retrying forever', async () => {
    // common practice, no source
    const fake = fakeFactory(() => {}, 'fatal');
    const pool = new StudyPool(fake.factory, 2);
    const results = await Promise.allSettled([pool.run(job(1)), pool.run(job(2)), pool.run(job(3))]);
    expect(results.every((r) => r.status === 'rejected' && /engine not built/.test(String(r.reason)))).toBe(true);
    expect(fake.started()).toBeLessThanOrEqual(2);
  });

  it('a worker that dies fails its own job and is replaced for the next', async () => {
    // common practice, no source
    let crashed = false;
    const fake = fakeFactory((m, h) => {
      if (m.job.scenario.steps === 13 && !crashed) { crashed = true; h.error(new Error('out of memory')); return; }
      h.message(answer(m.id, m.job.scenario.steps));
    });
    const pool = new StudyPool(fake.factory, 1);
    const results = await Promise.allSettled([pool.run(job(13)), pool.run(job(5))]);
    expect(results.map((r) => r.status)).toEqual(['rejected', 'fulfilled']);
    expect(fake.started()).toBe(2);
    expect(fake.terminated()).toBe(1);
  });

  it('warm() starts every worker at once and resolves when all are ready; it fails if the engine cannot load', async () => {
    // common practice, no source
    const fake = fakeFactory((m, h) => h.message(answer(m.id, 1)));
    const pool = new StudyPool(fake.factory, 3);
    await pool.warm();
    expect(fake.started()).toBe(3);
    await pool.run(job(1));
    expect(fake.started()).toBe(3);
    const dead = new StudyPool(fakeFactory(() => {}, 'fatal').factory, 2);
    await expect(dead.warm()).rejects.toThrow(/engine not built/);
    const cancelled = new StudyPool(fakeFactory(() => {}).factory, 2);
    const waiting = cancelled.warm();
    cancelled.cancel();
    await expect(waiting).rejects.toBeInstanceOf(StudyCancelled);
  });

  it('starts no more workers than jobs, and at most its size', async () => {
    // common practice, no source
    const fake = fakeFactory((m, h) => h.message(answer(m.id, 1)));
    const pool = new StudyPool(fake.factory, 8);
    await pool.run(job(1));
    expect(fake.started()).toBe(1);
    await Promise.all(Array.from({ length: 20 }, () => pool.run(job(1))));
    expect(fake.started()).toBeLessThanOrEqual(8);
    expect(pool.pending).toBe(0);
  });
});
