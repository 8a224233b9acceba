/**
 * Reading finished runs back from their output folders (README "Batch scheduler round
 * trip"): the numbers a study job returns are exactly numbers a run's files hold —
 * timeseries.csv's FDTD columns, spectra.csv's and lines.csv's FDTD transfer function —
 * written as the shortest decimal that reads back to the same double, so a study scored
 * from files gives the figures of a local study to the last digit. A missing folder, a run
 * that did not finish, or a run of another scenario is refused by name.
 */
import { readFile } from 'node:fs/promises';
import { join } from 'node:path';
import { layoutOf } from '../scenario/layout.ts';
import type { PlannedRun } from '../studies/batch.ts';
import type { StudyJob, StudyJobResult } from '../studies/jobs.ts';
import type { JobOutcome } from '../studies/pool.ts';
import type { JobRunner } from '../studies/run-study.ts';
import { parseCsv } from './csv.ts';

const number = (text: string) => (text === 'NaN' ? NaN : Number(text));

async function readText(path: string, what: string): Promise<string> {
  try {
    return await readFile(path, 'utf8');
  } catch {
    throw new Error(`${what} is missing (${path})`);
  }
}

/** A run's result as a study job returns it, read from its output folder. */
export async function readRun(dir: string, run: PlannedRun): Promise<StudyJobResult> {
  const folder = join(dir, run.folder);
  const summary = JSON.parse(await readText(join(folder, 'summary.json'), `run ${run.folder}: summary.json`)) as {
    complete?: boolean; scenario_hash?: string; run_seconds?: number; steps: number;
  };
  if (summary.scenario_hash !== run.hash) {
    throw new Error(`run ${run.folder} is of another scenario (fingerprint ${summary.scenario_hash ?? 'none'}, expected ${run.hash} for ${run.file})`);
  }
  if (summary.complete !== true) throw new Error(`run ${run.folder} did not finish (complete: false); run ${run.file} again`);
  const s = run.job.scenario;
  const cost = { seconds: summary.run_seconds ?? NaN, cellUpdates: s.grid.nx * s.grid.ny * s.steps };
  if (run.job.kind === 'probe-series') {
    const rows = parseCsv(await readText(join(folder, 'timeseries.csv'), `run ${run.folder}: timeseries.csv`)).slice(1);
    const series = s.probes.map((_, p) => Float32Array.from(rows, (row) => number(row[1 + 2 * p])));
    return { kind: 'probe-series', series, finite: series.every((x) => x.every(Number.isFinite)), ...cost };
  }
  const layout = layoutOf(s);
  const spectra = parseCsv(await readText(join(folder, 'spectra.csv'), `run ${run.folder}: spectra.csv`)).slice(1);
  const lines = parseCsv(await readText(join(folder, 'lines.csv'), `run ${run.folder}: lines.csv`)).slice(1);
  const F = s.frequencies.length;
  const points = layout.probes.length + layout.lines.reduce((n, l) => n + l.nodes.length, 0);
  const transfer = new Float64Array(2 * points * F);
  const put = (f: number, point: number, re: string, im: string) => {
    transfer[2 * (f * points + point)] = number(re);
    transfer[2 * (f * points + point) + 1] = number(im);
  };
  // spectra.csv: rows by probe, then frequency; lines.csv: by line, then frequency, then node
  spectra.forEach((row, k) => put(k % F, Math.floor(k / F), row[3], row[4]));
  let row = 0;
  let first = layout.probes.length;
  for (const line of layout.lines) {
    for (let f = 0; f < F; f++) for (let n = 0; n < line.nodes.length; n++, row++) put(f, first + n, lines[row][6], lines[row][7]);
    first += line.nodes.length;
  }
  // a run that blew up stops and is not complete, so a run read here ended finite
  return { kind: 'spectra', transfer, points, finite: true, ...cost };
}

/** A job runner that takes each job's result from its run folder instead of running it. */
export function folderRunner(dir: string, runs: readonly PlannedRun[]): JobRunner {
  const byJob = new Map<StudyJob, PlannedRun>(runs.map((r) => [r.job, r]));
  return {
    run: ((job: StudyJob, onProgress?: (done: number, total: number) => void) => {
      const planned = byJob.get(job);
      if (!planned) return Promise.reject(new Error('a run of this study has no file in the plan'));
      return readRun(dir, planned).then((result): JobOutcome => {
        onProgress?.(1, 1);
        return { result, worker: 1 };
      });
    }) as JobRunner['run'],
    cancel: () => {},
  };
}
