/**
 * Every study verb (`absorber-study`, `resolution-study`, …) from its definition
 * (src/studies/registry.ts): read the options, plan the runs, optionally write them as
 * scenario files (--emit), run them on a pool of worker threads with progress on stderr,
 * write the study's files (--out), then print the JSON (--json) or the table. Ctrl-C
 * cancels and still reports and writes the candidates that finished (exit 130).
 */
import { jsonForOutput } from '../io/csv.ts';
import { folderRunner } from '../io/run-folders.ts';
import { emitFiles, studyFiles } from '../io/study-files.ts';
import { emitPlan, plannedRuns } from '../studies/batch.ts';
import type { AnyStudyDefinition, StudyPlan } from '../studies/definition.ts';
import { createNodePool, hardwareThreads } from '../studies/node-pool.ts';
import type { StudyProgress } from '../studies/progress.ts';
import { runStudy } from '../studies/run-study.ts';
import { numberOption, UsageError, type ParsedArgs } from './args.ts';
import { loadScenarioFile } from './load.ts';
import { note, out, writeFiles } from './output.ts';
import { ProgressBar } from './progress.ts';

/** Options every study verb takes besides its own. */
export const COMMON_STUDY_OPTIONS = { valued: ['out', 'emit', 'workers', 'from'], flags: ['json'] } as const;

/** The study's own options offered on the command line. */
export function cliOptions(d: AnyStudyDefinition) {
  return d.options.filter((o) => (o.where ?? 'both') !== 'page');
}

function workerCount(args: ParsedArgs): number {
  const n = numberOption(args, 'workers', hardwareThreads()) as number;
  if (!Number.isInteger(n) || n < 1 || n > 256) throw new UsageError(`--workers: ${n} is not a whole number of workers from 1 to 256`);
  return n;
}

function textOption(args: ParsedArgs, name: string): string | undefined {
  const v = args.options.get(name);
  return typeof v === 'string' ? v : undefined;
}

/** A study's option problems in command-line words: "target: …" becomes "--target: …". */
function asFlags(d: AnyStudyDefinition, problems: string[]): string {
  const names = cliOptions(d).map((o) => o.name).sort((a, b) => b.length - a.length);
  return problems.map((p) => {
    const name = names.find((n) => p.startsWith(`${n}:`) || p.startsWith(`${n} `));
    return name ? `--${p}` : p;
  }).join('; ');
}

/** Runs `study` with a progress bar on stderr and Ctrl-C wired to cancel. */
async function withProgress<R>(label: string, study: (signal: AbortSignal, onProgress: (p: StudyProgress) => void) => Promise<R>): Promise<{ result: R; interrupted: boolean }> {
  const controller = new AbortController();
  const onSignal = () => controller.abort();
  process.on('SIGINT', onSignal);
  const bar = new ProgressBar(label);
  try {
    const result = await study(controller.signal, (p) => bar.update(p.finished, p.total, 'runs'));
    bar.done(controller.signal.aborted ? 'interrupted; reporting the runs that finished' : '');
    return { result, interrupted: controller.signal.aborted };
  } finally {
    process.off('SIGINT', onSignal);
  }
}

/** A table of strings with columns padded to their widest cell; text columns left-aligned. */
export function textTable(head: string[], rows: string[][], leftAligned: boolean[]): string[] {
  const widths = head.map((h, k) => Math.max(h.length, ...rows.map((row) => row[k].length)));
  const line = (cells: string[]) => cells.map((cell, k) => (leftAligned[k] ? cell.padEnd(widths[k]) : cell.padStart(widths[k]))).join('  ').trimEnd();
  return [line(head), ...rows.map(line)];
}

function printResult(d: AnyStudyDefinition, result: unknown, outDir: string | undefined, files: string[]): void {
  for (const line of d.heading(result)) out(line);
  out('');
  const recommended = d.recommended(result);
  const head = [...d.columns.map((c) => c.label), ''];
  const rows = d.rows(result).map((c: unknown) => [...d.columns.map((col) => col.value(c)), d.rowNotes({ recommended }, c).join(', ')]);
  for (const line of textTable(head, rows, [...d.columns.map((c) => !!c.text), true])) out(line);
  out('');
  for (const line of d.verdict(result)) out(line);
  const r = result as { workers: number[]; seconds: number; complete: boolean };
  out(`${r.workers.length} worker${r.workers.length === 1 ? '' : 's'}, ${r.seconds.toFixed(1)} s${r.complete ? '' : ' (interrupted: not every candidate finished)'}`);
  if (outDir) out(`wrote ${files.join(', ')} to ${outDir}`);
}

/**
 * The shape every study command shares: load and plan, optionally write the candidates as
 * scenario files (--emit), run on a worker pool with progress and Ctrl-C, write the files
 * (--out), then print the JSON (--json) or the table. Exit 130 when interrupted.
 */
export async function studyCommand(d: AnyStudyDefinition, args: ParsedArgs): Promise<number> {
  const values: Record<string, string | undefined> = {};
  for (const o of cliOptions(d)) {
    const v = args.options.get(o.name);
    values[o.name] = v === true ? '' : v;
  }
  const { options, problems } = d.readOptions(values);
  if (!options || problems.length > 0) throw new UsageError(asFlags(d, problems));
  const workers = workerCount(args);
  const outDir = textOption(args, 'out');
  const emitDir = textOption(args, 'emit');
  const json = args.options.has('json');
  const scenario = await loadScenarioFile(args.positional[0]);
  let plan: unknown;
  try {
    plan = d.plan(scenario, options);
  } catch (e) {
    if (e instanceof RangeError) throw new UsageError(e.message);
    throw e;
  }

  if (emitDir) {
    const files = emitFiles(emitPlan(d, plan as StudyPlan));
    await writeFiles(emitDir, files);
    const message = `wrote ${Object.keys(files).length} files to ${emitDir}: ${d.emitted(plan)}`;
    if (!outDir && !json) {
      out(`${message}; the study was not run here (add --out or --json to run it too)`);
      return 0;
    }
    note(message);
  }

  for (const line of d.preview?.(plan) ?? []) note(line);
  const fromDir = textOption(args, 'from');
  const runner = fromDir ? folderRunner(fromDir, plannedRuns(d, plan as StudyPlan)) : createNodePool(workers);
  const planned = plan as StudyPlan;
  const runs = planned.candidates.reduce((n, c) => n + c.jobs.length, 0) + planned.shared.length;
  note(`${d.id} study: ${runs} runs${fromDir ? ` read from ${fromDir}` : ''}: ${planned.candidates.length} candidates${planned.shared.length && d.sharedRuns ? ` and ${d.sharedRuns}` : ''}`);
  const failures: string[] = [];
  let run: { result: unknown; interrupted: boolean };
  try {
    run = await withProgress(`${d.id} study`, (signal, onProgress) => runStudy(d, plan, runner, {
      signal, onProgress,
      onCandidate: (c) => { const e = (c as { error?: string }).error; if (fromDir && e) failures.push(e); },
    }));
  } finally {
    if ('dispose' in runner) (runner as { dispose(): void }).dispose();
  }
  for (const f of failures) note(`failed: ${f}`);
  const { result, interrupted } = run;
  const files = studyFiles(d.outputs(result));
  if (outDir) await writeFiles(outDir, files);
  if (json) {
    process.stdout.write(jsonForOutput(d.json(result)));
    if (!d.recommended(result)) note(d.noneMeets(result));
  } else {
    printResult(d, result, outDir, Object.keys(files));
  }
  return interrupted ? 130 : 0;
}
