/**
 * `gridgauge absorber-study` and `gridgauge resolution-study`: plan the runs, run them on a
 * pool of worker threads with progress on stderr, print a table (or the JSON with --json),
 * and write the study files with --out. `--emit DIR` writes the runs as scenario files;
 * the study then runs here only if --out or --json asks for results too. Ctrl-C cancels
 * and still reports and writes the candidates that finished (exit 130).
 */
import { jsonForOutput } from '../io/csv.ts';
import { formatBytes, formatSI, formatSig } from '../io/units.ts';
import {
  planAbsorberStudy, runAbsorberStudy, type AbsorberCandidateResult, type AbsorberStudyResult,
} from '../studies/absorber-study.ts';
import { createNodePool, hardwareThreads } from '../studies/node-pool.ts';
import type { StudyProgress } from '../studies/progress.ts';
import type { StudyPool } from '../studies/pool.ts';
import type { Scenario } from '../scenario/types.ts';
import { planResolutionStudy, runResolutionStudy, type ResolutionStudyResult } from '../studies/resolution-study.ts';
import {
  absorberEmitFiles, absorberFiles, absorberJsonObject, resolutionEmitFiles, resolutionFiles, resolutionJsonObject,
} from '../studies/study-files.ts';
import { numberOption, UsageError, type ParsedArgs } from './args.ts';
import { loadScenarioFile } from './load.ts';
import { note, out, writeFiles } from './output.ts';
import { ProgressBar } from './progress.ts';


function workerCount(args: ParsedArgs): number {
  const n = numberOption(args, 'workers', hardwareThreads()) as number;
  if (!Number.isInteger(n) || n < 1 || n > 256) throw new UsageError(`--workers: ${n} is not a whole number of workers from 1 to 256`);
  return n;
}

function textOption(args: ParsedArgs, name: string): string | undefined {
  const v = args.options.get(name);
  return typeof v === 'string' ? v : undefined;
}

/** Plans with the study's own option checks reported as usage errors. */
function plan<T>(make: () => T): T {
  try {
    return make();
  } catch (e) {
    if (e instanceof RangeError) throw new UsageError(e.message);
    throw e;
  }
}

/**
 * Runs `study` with a progress bar on stderr and Ctrl-C wired to cancel; resolves with its
 * result and whether it was interrupted.
 */
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

/** What differs between the two study commands; `runStudyCommand` does the rest. */
interface StudyCommand<P, R extends { recommended: unknown }> {
  label: string;
  makePlan(scenario: Scenario): P;
  emitFiles(plan: P): Record<string, string>;
  /** What --emit wrote, after "wrote N files to DIR: ". */
  emitted(plan: P): string;
  run(plan: P, pool: StudyPool, options: { signal: AbortSignal; onProgress: (p: StudyProgress) => void }): Promise<R>;
  files(result: R): Record<string, string>;
  json(result: R): unknown;
  /** The stderr note for --json when nothing meets the target. */
  noneMeets: string;
  print(result: R, outDir: string | undefined): void;
}

/**
 * The shape both study commands share: load and plan, optionally write the candidates as
 * scenario files (--emit), run on a worker pool with progress and Ctrl-C, write the files
 * (--out), then print the JSON (--json) or the table. Exit 130 when interrupted.
 */
async function runStudyCommand<P, R extends { recommended: unknown }>(args: ParsedArgs, c: StudyCommand<P, R>): Promise<number> {
  const workers = workerCount(args);
  const outDir = textOption(args, 'out');
  const emitDir = textOption(args, 'emit');
  const json = args.options.has('json');
  const scenario = await loadScenarioFile(args.positional[0]);
  const studyPlan = plan(() => c.makePlan(scenario));

  if (emitDir) {
    const files = c.emitFiles(studyPlan);
    await writeFiles(emitDir, files);
    const message = `wrote ${Object.keys(files).length} files to ${emitDir}: ${c.emitted(studyPlan)}`;
    if (!outDir && !json) {
      out(`${message}; the study was not run here (add --out or --json to run it too)`);
      return 0;
    }
    note(message);
  }

  const pool = createNodePool(workers);
  let run: { result: R; interrupted: boolean };
  try {
    run = await withProgress(c.label, (signal, onProgress) => c.run(studyPlan, pool, { signal, onProgress }));
  } finally {
    pool.dispose();
  }
  const { result, interrupted } = run;
  if (outDir) await writeFiles(outDir, c.files(result));
  if (json) {
    process.stdout.write(jsonForOutput(c.json(result)));
    if (!result.recommended) note(c.noneMeets);
  } else {
    c.print(result, outDir);
  }
  return interrupted ? 130 : 0;
}

const dB = (x: number) => (Number.isFinite(x) ? `${x.toFixed(1)} dB` : x === -Infinity ? '−∞ dB' : '—');

function describeAbsorber(c: AbsorberCandidateResult): string {
  return `${c.cells} cells, m ${c.order}, sigmaScale ${c.sigmaScale}, kappaMax ${c.kappaMax}, alphaMax ${c.alphaMax}`;
}

function printAbsorberTable(r: AbsorberStudyResult, outDir: string | undefined): void {
  out(`absorber study: ${r.candidates.length} of ${r.planned} candidates, ${r.steps} steps each; reference grid ${r.reference.nx} × ${r.reference.ny}`);
  out(`probes: ${r.probes.map((p) => p.name).join(', ')}${r.probes.some((p) => p.added) ? ' (placed by the study: the scenario has none)' : ''}`);
  out('reflection = worst probe of max|E − Eref| / max|Eref|; theory = exp(−2σmax·d/((m+1)εc)) of the continuous profile');
  out('');
  const head = ['cells', 'm', 'sigmaScale', 'kappaMax', 'alphaMax', 'reflection', 'theory', 'worst probe', 'memory', 'time', ''];
  const rows = r.candidates.map((c) => [
    String(c.cells), String(c.order), String(c.sigmaScale), String(c.kappaMax), String(c.alphaMax),
    dB(c.reflection_dB), dB(c.theory_dB), c.worst_probe || '—', formatBytes(c.memory_bytes),
    Number.isFinite(c.seconds) ? `${c.seconds.toFixed(2)} s` : '—',
    [c === r.recommended ? 'recommended' : '', c.isCurrent ? 'current' : '', c.error ?? ''].filter(Boolean).join(', '),
  ]);
  const widths = head.map((h, k) => Math.max(h.length, ...rows.map((row) => row[k].length)));
  const line = (cells: string[]) => cells.map((cell, k) => (k === 7 || k === 10 ? cell.padEnd(widths[k]) : cell.padStart(widths[k]))).join('  ').trimEnd();
  out(line(head));
  for (const row of rows) out(line(row));
  out('');
  if (!r.complete) {
    out(r.candidates.length === 0
      ? 'interrupted before any candidate could be scored (the reference run had not finished)'
      : `interrupted: ${r.candidates.length} of ${r.planned} candidates finished; the recommendation is among those`);
  }
  if (r.recommended) {
    out(`recommended: ${describeAbsorber(r.recommended)}: ${dB(r.recommended.reflection_dB)} ` +
      `(target ${r.target_dB} dB, margin ${(r.target_dB - r.recommended.reflection_dB).toFixed(1)} dB), ${formatBytes(r.recommended.memory_bytes)}`);
  } else if (r.candidates.length > 0) {
    out(`no candidate meets the target ${r.target_dB} dB: recommended is null; try more cells or a less strict target`);
  }
  if (r.current) out(`current:     ${describeAbsorber(r.current)}: ${dB(r.current.reflection_dB)}`);
  out(`${r.workers.length} worker${r.workers.length === 1 ? '' : 's'}, ${r.seconds.toFixed(1)} s${r.complete ? '' : ' (interrupted: not every candidate finished)'}`);
  if (outDir) out(`wrote absorber.csv, absorber.json, absorber-error.csv to ${outDir}`);
}

/** `gridgauge absorber-study FILE [--target DB] [--out DIR] [--json] [--emit DIR] [--workers N]`. */
export async function absorberStudyCommand(args: ParsedArgs): Promise<number> {
  const target = numberOption(args, 'target', -60) as number;
  if (!(target < 0)) throw new UsageError(`--target: ${target} dB is not a negative number of dB; give e.g. --target -60`);
  return runStudyCommand(args, {
    label: 'absorber study',
    makePlan: (scenario) => planAbsorberStudy(scenario, { target_dB: target }),
    emitFiles: absorberEmitFiles,
    emitted: (p) => `reference.json, ${p.candidates.length} candidate scenarios and study.json`,
    run: runAbsorberStudy,
    files: absorberFiles,
    json: absorberJsonObject,
    noneMeets: `no candidate meets the target ${target} dB: recommended is null`,
    print: printAbsorberTable,
  });
}

function printResolutionTable(r: ResolutionStudyResult, outDir: string | undefined): void {
  out(`resolution study at ${formatSI(r.frequency_Hz, 'Hz')} (wavelength ${formatSI(r.wavelength_m, 'm')} in the medium), ` +
    `Courant number ${r.courant}, dy/dx ${formatSig(r.aspect, 4)}; ${r.candidates.length} of ${r.planned} resolutions`);
  out(`phase lag per wavelength: measured (slope of the phase error from 2 to 5 wavelengths) and predicted by the dispersion relation`);
  out('');
  const head = ['cells/λ', 'dx', 'axis °/λ', 'predicted', 'diagonal °/λ', 'predicted', `over ${r.size_wavelengths} λ`, 'project grid', 'memory', 'time', ''];
  const deg = (x: number) => formatSig(x, 3);
  const rows = r.candidates.map((c) => [
    String(c.cellsPerWavelength), formatSI(c.dx_m, 'm'),
    deg(c.axis_deg_per_wavelength), deg(c.predicted_axis_deg_per_wavelength),
    deg(c.diagonal_deg_per_wavelength), deg(c.predicted_diagonal_deg_per_wavelength),
    `${deg(c.projected_error_deg)}°`, `${c.project.nx} × ${c.project.ny}`, formatBytes(c.project.memory_bytes),
    Number.isFinite(c.project.seconds) ? `${formatSig(c.project.seconds, 2)} s` : '—',
    [c === r.recommended ? 'recommended' : '', c.error ?? ''].filter(Boolean).join(', '),
  ]);
  const widths = head.map((h, k) => Math.max(h.length, ...rows.map((row) => row[k].length)));
  const line = (cells: string[]) => cells.map((cell, k) => (k === 10 ? cell : cell.padStart(widths[k]))).join('  ').trimEnd();
  out(line(head));
  for (const row of rows) out(line(row));
  out('');
  const rec = r.recommended;
  if (!r.complete) out(`interrupted: ${r.candidates.length} of ${r.planned} resolutions finished; the recommendation is among those`);
  if (rec) {
    out(`recommended: ${rec.cellsPerWavelength} cells per wavelength (dx = ${formatSI(rec.dx_m, 'm')}): ` +
      `${formatSig(rec.projected_error_deg, 3)}° across ${r.size_wavelengths} wavelengths, budget ${r.budget_deg}°`);
    out(`  a ${r.size_wavelengths} × ${r.size_wavelengths} wavelength 2D grid: ${rec.project.nx} × ${rec.project.ny} cells, ${rec.project.steps} steps, ` +
      `${formatBytes(rec.project.memory_bytes)}, about ${formatSig(rec.project.seconds, 2)} s at ${formatSig(r.mcells_per_second, 3)} Mcells/s`);
  } else {
    out(`no resolution meets the budget ${r.budget_deg}° across ${r.size_wavelengths} wavelengths: recommended is null; try finer cells (--max-cells) or a larger budget`);
  }
  out(`${r.workers.length} worker${r.workers.length === 1 ? '' : 's'}, ${r.seconds.toFixed(1)} s${r.complete ? '' : ' (interrupted: not every resolution finished)'}`);
  if (outDir) out(`wrote resolution.csv, resolution.json to ${outDir}`);
}

/** `gridgauge resolution-study FILE --size WAVELENGTHS --budget DEGREES [--min-cells N] [--max-cells N] [--out DIR] [--json] [--emit DIR] [--workers N]`. */
export async function resolutionStudyCommand(args: ParsedArgs): Promise<number> {
  const size = numberOption(args, 'size');
  const budget = numberOption(args, 'budget');
  if (size === undefined) throw new UsageError('--size is required: the largest distance in the project in wavelengths at the highest frequency, e.g. --size 12');
  if (budget === undefined) throw new UsageError('--budget is required: the phase error allowed across that distance in degrees, e.g. --budget 5');
  if (!(size > 0)) throw new UsageError(`--size: ${size} is not a positive number of wavelengths; give e.g. --size 12`);
  if (!(budget > 0)) throw new UsageError(`--budget: ${budget} is not a positive number of degrees; give e.g. --budget 5`);
  const minCells = numberOption(args, 'min-cells');
  const maxCells = numberOption(args, 'max-cells');
  return runStudyCommand(args, {
    label: 'resolution study',
    makePlan: (scenario) => planResolutionStudy(scenario, { size_wavelengths: size, budget_deg: budget, minCells, maxCells }),
    emitFiles: resolutionEmitFiles,
    emitted: (p) => `${p.candidates.length} measurement scenarios and study.json`,
    run: runResolutionStudy,
    files: resolutionFiles,
    json: resolutionJsonObject,
    noneMeets: `no resolution meets the budget ${budget}° across ${size} wavelengths: recommended is null`,
    print: printResolutionTable,
  });
}
