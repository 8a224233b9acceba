/**
 * `gridgauge report FILE [--out report.html] [--with DIR…]` (README "Design-review report"):
 * runs the scenario as `run` does, with the full-grid running DFT at the first analysis
 * frequency for the error map when the memory cap allows, reads every study file found in
 * each --with folder (absorber.json, resolution.json, convergence.json, or any *.json with
 * a `candidates` list and a `recommended` entry), builds the report (src/io/report.ts) and
 * writes it as one HTML file.
 */
import { readdir, readFile, stat, mkdir, writeFile } from 'node:fs/promises';
import { basename, dirname, join } from 'node:path';
import { errorMapOf } from '../compare/error-map.ts';
import { collectResults } from '../compare/results.ts';
import { makeSimulation } from '../engine/create-simulation.ts';
import { buildReport, type ReportStudy } from '../io/report.ts';
import { isStudyJson, studyKind } from '../io/report/study-data.ts';
import { deriveQuantities, scenarioMemoryBytes } from '../scenario/derived.ts';
import { MEMORY_CAP_BYTES } from '../scenario/memory.ts';
import type { Scenario } from '../scenario/types.ts';
import { formatBytes } from '../scenario/units.ts';
import { energyLeftWarning, scenarioWarnings } from '../scenario/warnings.ts';
import packageJson from '../../package.json' with { type: 'json' };
import { listOption, type ParsedArgs } from './args.ts';
import { InvalidInput, loadScenarioFile } from './load.ts';
import { note, out } from './output.ts';
import { runWithProgress } from './run-loop.ts';

/** The report's file when --out is not given. */
export const DEFAULT_REPORT_FILE = 'report.html';

/** Whether a folder's file is one of the studies' own files (a broken one is an error, not skipped). */
const isNamedStudy = (file: string) => studyKind({ file, folder: '', data: null }) !== 'other';

/**
 * Every study file in the given folders, in the order given, files by name within a folder.
 * Throws InvalidInput for a folder that is missing, is not a folder, or holds no study file,
 * and for a study's own file (absorber.json, …) that is not valid JSON or not a study.
 *
 * @example
 * await readStudyFolders(['out/absorber', 'out/resolution']); // [{ file: 'absorber.json', … }, { file: 'resolution.json', … }]
 */
export async function readStudyFolders(folders: readonly string[]): Promise<ReportStudy[]> {
  const studies: ReportStudy[] = [];
  for (const folder of folders) {
    const info = await stat(folder).catch(() => undefined);
    if (!info?.isDirectory()) {
      throw new InvalidInput([{ path: `--with ${folder}`, message: `${info ? 'is not a folder' : 'no such folder'}; give the --out folder of a study (e.g. the folder absorber.json was written to)` }]);
    }
    const names = (await readdir(folder)).filter((n) => n.toLowerCase().endsWith('.json')).sort();
    const found: ReportStudy[] = [];
    for (const file of names) {
      const path = join(folder, file);
      if (!(await stat(path)).isFile()) continue;
      let data: unknown;
      try {
        data = JSON.parse(await readFile(path, 'utf8'));
      } catch (e) {
        if (isNamedStudy(file)) throw new InvalidInput([{ path, message: `is not valid JSON (${e instanceof Error ? e.message : String(e)}); write it again with the study's --out` }]);
        continue;
      }
      if (isStudyJson(data)) found.push({ file, folder, data });
      else if (isNamedStudy(file)) throw new InvalidInput([{ path, message: 'has no "candidates" list and "recommended" entry, so it is not a study\'s result; write it again with the study\'s --out' }]);
    }
    if (found.length === 0) {
      throw new InvalidInput([{ path: `--with ${folder}`, message: 'holds no study file (absorber.json, resolution.json, convergence.json, or another .json with "candidates" and "recommended"); give the --out folder of a study' }]);
    }
    studies.push(...found);
  }
  return studies;
}

/**
 * The error map's frequency (the first analysis frequency), or why there is none: no
 * analysis frequency, or the full-grid DFT (8 bytes per node) would take the run above the
 * memory cap.
 *
 * @example
 * errorMapPlan(demoScenario()); // { frequency: 5e9 }
 */
export function errorMapPlan(s: Scenario): { frequency?: number; note?: string } {
  const f = s.frequencies[0];
  if (f === undefined) return { note: 'the scenario has no analysis frequency to map' };
  const bytes = scenarioMemoryBytes(s, true);
  if (bytes > MEMORY_CAP_BYTES) {
    return { note: `the full-grid DFT would take the run to ${formatBytes(bytes)}, above the ${formatBytes(MEMORY_CAP_BYTES, 3, true)} memory cap, so the run was made without it` };
  }
  return { frequency: f };
}

/** Where the report goes: --out as a file, or report.html inside --out when it names a folder. */
async function reportPath(args: ParsedArgs): Promise<string> {
  const given = args.options.get('out');
  if (typeof given !== 'string') return DEFAULT_REPORT_FILE;
  if (/[\\/]$/.test(given) || (await stat(given).catch(() => undefined))?.isDirectory()) return join(given, DEFAULT_REPORT_FILE);
  return given;
}

/** The date and time as the report prints it: "2025-06-01 14:03 UTC". */
const reportDate = (d: Date) => `${d.toISOString().slice(0, 16).replace('T', ' ')} UTC`;

/**
 * Runs `gridgauge report`; returns the exit code (0, 1 blow-up, 130 interrupted; invalid input throws).
 *
 * @example
 * await commandReport(parseArgs(['examples/demo.json', '--with', 'out/absorber'], ['out', 'with'], []));
 */
export async function commandReport(args: ParsedArgs): Promise<number> {
  const file = args.positional[0];
  const scenario = await loadScenarioFile(file);
  const studies = await readStudyFolders(listOption(args, 'with'));
  const target = await reportPath(args);
  const map = errorMapPlan(scenario);
  if (map.note) note(`gridgauge: no error map: ${map.note}`);

  const t0 = performance.now();
  const sim = await makeSimulation(scenario, map.frequency !== undefined ? { fullGridFrequency: map.frequency } : {});
  const { outcome, interrupted } = await runWithProgress(sim, 'reporting what was computed');
  const blowUp = outcome.blowUp;
  if (blowUp) note(`gridgauge: run stopped: ${blowUp.reason}; the report covers the steps up to ${blowUp.step}`);
  const runSeconds = (performance.now() - t0) / 1000;

  const t1 = performance.now();
  const results = collectResults(sim);
  const energyLeft = energyLeftWarning(outcome.energyLeftDb, scenario.steps);
  const stopped = blowUp ? { step: blowUp.step, reason: blowUp.reason } : interrupted ? { step: sim.stepsDone, reason: 'interrupted (Ctrl-C)' } : undefined;
  const text = buildReport({
    scenarioName: basename(file as string),
    scenario,
    results,
    derived: deriveQuantities(scenario),
    warnings: [...scenarioWarnings(scenario), ...(energyLeft ? [energyLeft] : [])],
    errorMap: errorMapOf(sim),
    errorMapNote: map.note,
    studies,
    run: { seconds: runSeconds, memory_bytes: sim.memoryBytes, ...(stopped ? { stopped } : {}) },
    version: packageJson.version,
    runtime: `Node ${process.version}`,
    date: reportDate(new Date()),
  });
  const buildSeconds = (performance.now() - t1) / 1000;
  sim.dispose();
  await mkdir(dirname(target), { recursive: true });
  await writeFile(target, text);
  out(`wrote ${target} (${formatBytes(Buffer.byteLength(text))}; ${studies.length} ${studies.length === 1 ? 'study' : 'studies'}${map.note ? ', no error map' : ''}): ` +
    `run ${runSeconds.toFixed(2)} s, report built in ${buildSeconds.toFixed(2)} s`);
  return blowUp ? 1 : interrupted ? 130 : 0;
}
