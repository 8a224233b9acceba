/**
 * A study through a batch scheduler (README "Batch scheduler round trip"): every run of the
 * plan becomes a scenario file named by the study (`--emit DIR`), each is run anywhere with
 * `gridgauge run FILE --out DIR/<name without .json>` (a job array), and `--from DIR` reads
 * the finished runs back and scores them exactly as a local study would. Each run is
 * identified by its scenario's fingerprint, so a run of another scenario is never taken
 * for it.
 */
import { validateScenario } from '../scenario/parse.ts';
import { scenarioHash } from '../scenario/hash.ts';
import type { Scenario } from '../scenario/types.ts';
import type { AnyStudyDefinition, EmitPlan, StudyPlan } from './definition.ts';
import type { StudyJob } from './jobs.ts';

/** One run of a plan as a file. */
export interface PlannedRun {
  file: string;
  /** Folder the run's outputs go to, inside the emit folder. */
  folder: string;
  job: StudyJob;
  /** The candidate's key, or null for a shared run (a reference). */
  candidate: string | null;
  /** Fingerprint of the scenario as `gridgauge run` reads it. */
  hash: string;
}

/** The scenario as `gridgauge run` will see it after reading the emitted file. */
function asRead(s: Scenario): Scenario {
  const r = validateScenario(JSON.parse(JSON.stringify(s)));
  if (!r.ok) throw new Error(`a planned run is not a valid scenario: ${r.problems.map((p) => `${p.path}: ${p.message}`).join('; ')}`);
  return r.scenario;
}

/** Every run of a plan with its file name, output folder and fingerprint. */
export function plannedRuns(d: AnyStudyDefinition, plan: StudyPlan): PlannedRun[] {
  const names = d.jobFiles(plan);
  const run = (job: StudyJob, file: string, candidate: string | null): PlannedRun => ({
    file, folder: file.replace(/\.json$/, ''), job, candidate, hash: scenarioHash(asRead(job.scenario)),
  });
  return [
    ...plan.shared.map((job, k) => run(job, names.shared[k], null)),
    ...plan.candidates.flatMap((c, i) => c.jobs.map((job, k) => run(job, names.candidates[i][k], c.key))),
  ];
}

/** The files of `--emit`: every run's scenario and study.json (the study's own manifest plus the runs). */
export function emitPlan(d: AnyStudyDefinition, plan: StudyPlan): EmitPlan {
  const runs = plannedRuns(d, plan);
  const scenarios: Record<string, Scenario> = {};
  for (const r of runs) scenarios[r.file] = r.job.scenario;
  return {
    scenarios,
    manifest: {
      ...d.manifest(plan),
      runs: runs.map((r) => ({ file: r.file, out: r.folder, candidate: r.candidate, scenario_hash: r.hash })),
      how_to_run: 'for each file: gridgauge run FILE --out DIR/<file name without .json>; then: gridgauge <study> SCENARIO --from DIR',
    },
  };
}
