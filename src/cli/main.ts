import { collectResults, type RunResults } from '../compare/results.ts';
import { makeSimulation } from '../engine/create-simulation.ts';
import { jsonForOutput } from '../io/csv.ts';
import { runExtras, runFiles } from '../io/outputs.ts';
import { fieldNames } from '../scenario/field-names.ts';
import { figureOrNote, formatBytes, formatSI, formatSig } from '../scenario/units.ts';
import { deriveQuantities } from '../scenario/derived.ts';
import { scenarioWarnings, type Warning } from '../scenario/warnings.ts';
import { parseArgs, UsageError, type ParsedArgs } from './args.ts';
import { InvalidInput, loadScenarioFile } from './load.ts';
import { out, writeFiles } from './output.ts';
import { runWithProgress } from './run-loop.ts';
import { commandReport } from './report-command.ts';
import { cliOptions, COMMON_STUDY_OPTIONS, studyCommand } from './study-commands.ts';
import type { AnyStudyDefinition } from '../studies/definition.ts';
import { STUDIES } from '../studies/registry.ts';

const HELP = () => `gridgauge — check FDTD cell size, time step and CPML absorbers against the exact
field of a pulsed line current (2D Yee grid, TMz or TEz, WebAssembly engine).

Usage:
  gridgauge run FILE [--out DIR] [--json]
      Run the scenario; print FDTD-vs-exact errors per probe. With --out, write
      timeseries.csv, spectra.csv, lines.csv and summary.json to DIR.
      --json prints summary.json on stdout instead of the table. Ctrl-C stops the run
      and still writes what was computed.
  gridgauge check FILE [--json]
      Validate the scenario and print derived quantities (dt, cells per wavelength,
      stability margin, memory).
${studyUsage()}
  --emit DIR writes every run of a study as a scenario file plus study.json for a batch
  scheduler (and runs nothing unless --out or --json is given too); run each with
  "gridgauge run FILE --out DIR/<name without .json>", then score them all with
  --from DIR instead of running them here. --workers sets the pool size (default: one per
  hardware thread).
  gridgauge report FILE [--out report.html] [--with DIR]...
      Run the scenario and write a design-review report: one self-contained HTML file
      (scenario, derived quantities, warnings, FDTD-vs-exact summary, plots, error map,
      conventions) that prints on A4 or Letter. Each --with DIR (repeatable) adds the
      studies whose files are in DIR (absorber.json, resolution.json, convergence.json).
  gridgauge bench [--json]
      Measure engine speed (Mcells/s) against a plain TypeScript kernel.

Options take a value as "--name value" or "--name=value".
Exit codes: 0 success, 2 invalid input, 1 failure, 130 interrupted (files still written).
Results check numerical method only; they are not evidence for RF-exposure or EMC compliance.`;

/** Usage lines of every study verb, from its definition. */
function studyUsage(): string {
  return STUDIES.map((d) => {
    const own = cliOptions(d).map((o) => {
      const text = o.flag ? `--${o.name}` : `--${o.name} ${o.metavar ?? 'N'}`;
      return o.required ? text : `[${text}]`;
    });
    const usage = `  gridgauge ${d.verb} FILE ${[...own, '[--out DIR]', '[--json]', '[--emit DIR]', '[--from DIR]', '[--workers N]'].join(' ')}`;
    return `${usage}\n${wrap(d.summary, 6)}`;
  }).join('\n');
}

/** Text wrapped at 90 columns, each line indented by `indent` spaces. */
function wrap(text: string, indent: number): string {
  const lines: string[] = [];
  let line = '';
  for (const word of text.split(/\s+/)) {
    if (line && line.length + 1 + word.length > 90 - indent) { lines.push(line); line = word; } else line = line ? `${line} ${word}` : word;
  }
  if (line) lines.push(line);
  return lines.map((l) => ' '.repeat(indent) + l).join('\n');
}

/** Wall-clock seconds since `t0` (performance.now()). */
const secondsSince = (t0: number) => (performance.now() - t0) / 1000;

function printProbeTable(r: RunResults, ratio: string, out: (line: string) => void): void {
  if (r.probes.length === 0) out('no probes in this scenario: add "probes" to compare FDTD with the exact field');
  for (const p of r.probes) {
    out(`probe ${JSON.stringify(p.name)} at (${formatSI(p.x_m, 'm')}, ${formatSI(p.y_m, 'm')}), ρ = ${formatSI(p.rho_m, 'm')}` +
      (p.reached ? `, time-domain relErrMax ${formatSig(p.relErrMax, 3)}` : ': not reached (the run ended before the pulse arrived)'));
    if (p.spectra.length === 0 || !p.reached) continue;
    out(`  frequency     ρ (λ)    |${ratio}| error   phase error   predicted`);
    for (let k = 0; k < p.spectra.length; k++) {
      const s = p.spectra[k];
      out(`  ${formatSI(s.f_Hz, 'Hz').padEnd(12)}${formatSig(p.rho_wavelengths[k], 3).padStart(7)}` +
        `${`${formatSig(s.mag_err_dB, 3)} dB`.padStart(15)}${`${formatSig(s.phase_err_deg, 3)}°`.padStart(14)}` +
        `${figureOrNote(s.predicted_phase_err_deg, '°', s.note).padStart(12)}`);
    }
  }
  out('phase: arg(FDTD/exact) with e^{+jωt}; negative = the grid lags the exact wave.');
  const unpredicted = r.probes.some((p) => p.reached && p.spectra.some((s) => !Number.isFinite(s.predicted_phase_err_deg) && !s.note));
  if (unpredicted) out('predicted —: no plane-wave prediction there (objects in the grid scatter the wave, or the frequency is past what the grid carries).');
}

async function commandRun(args: ParsedArgs): Promise<number> {
  const scenario = await loadScenarioFile(args.positional[0]);
  const json = args.options.has('json');
  const outDir = args.options.get('out') as string | undefined;
  const t0 = performance.now();
  const sim = await makeSimulation(scenario);
  const { outcome, interrupted } = await runWithProgress(sim, 'writing what was computed');
  const blowUp = outcome.blowUp;
  if (blowUp) process.stderr.write(`gridgauge: run stopped: ${blowUp.reason}; what was recorded up to step ${blowUp.step} is kept\n`);
  const runSeconds = secondsSince(t0);
  const results = collectResults(sim);
  const extras = runExtras(scenario, results, {
    runSeconds, energyLeftDb: outcome.energyLeftDb,
    stopped: blowUp ?? (interrupted ? { step: sim.stepsDone, reason: 'interrupted' } : undefined),
  });
  const warnings = extras.warnings as Warning[];
  const files = runFiles(results, extras);
  if (outDir) await writeFiles(outDir, files);
  if (json) {
    process.stdout.write(files['summary.json']);
  } else {
    printWarnings(warnings);
    out(`${sim.layout.nx} × ${sim.layout.ny} grid, ${results.steps} steps of ${formatSI(results.dt_s, 's')} in ${runSeconds.toFixed(2)} s`);
    printProbeTable(results, fieldNames(scenario.polarization).ratio, out);
    if (outDir) out(`wrote timeseries.csv, spectra.csv, lines.csv, summary.json to ${outDir}`);
  }
  sim.dispose();
  return blowUp ? 1 : interrupted ? 130 : 0;
}

/** Key suffixes of derived quantities and the unit each is shown in. */
const UNIT_SUFFIXES: [string, string][] = [['_m_per_s', 'm/s'], ['_Hz', 'Hz'], ['_s', 's'], ['_m', 'm']];

/** Warnings first, each on its own line: the field to change, then what and how. */
function printWarnings(warnings: readonly Warning[]): void {
  for (const w of warnings) out(`warning: ${w.path}: ${w.message}`);
}

async function commandCheck(args: ParsedArgs): Promise<number> {
  const scenario = await loadScenarioFile(args.positional[0]);
  const d = deriveQuantities(scenario);
  const warnings = scenarioWarnings(scenario);
  if (args.options.has('json')) {
    process.stdout.write(jsonForOutput({ ok: true, derived: d, warnings }));
    return 0;
  }
  printWarnings(warnings);
  out(`scenario is valid${warnings.length ? ` (${warnings.length} warning${warnings.length === 1 ? '' : 's'} above)` : ''}`);
  for (const [key, value] of Object.entries(d)) {
    const unit = UNIT_SUFFIXES.find(([suffix]) => key.endsWith(suffix))?.[1];
    const shown = typeof value !== 'number' ? JSON.stringify(value)
      : key.endsWith('_bytes') ? `${formatBytes(value)} (${value} bytes)`
      : unit ? formatSI(value, unit, 4) : formatSig(value, 4);
    out(`  ${key.padEnd(34)} ${shown}`);
  }
  return 0;
}

async function commandBench(args: ParsedArgs): Promise<number> {
  const bench = await import('../engine/bench.ts');
  const report = await bench.runBench({ onProgress: (msg: string) => process.stderr.write(`${msg}\n`) });
  if (args.options.has('json')) process.stdout.write(`${JSON.stringify(report, null, 2)}\n`);
  else process.stdout.write(`${bench.formatBenchReport(report)}\n`);
  return 0;
}

function studyVerb(d: AnyStudyDefinition) {
  return {
    valued: [...cliOptions(d).filter((o) => !o.flag).map((o) => o.name), ...COMMON_STUDY_OPTIONS.valued],
    flags: [...cliOptions(d).filter((o) => o.flag).map((o) => o.name), ...COMMON_STUDY_OPTIONS.flags],
    run: (a: ParsedArgs) => studyCommand(d, a),
  };
}

interface Command { valued: string[]; flags: string[]; run: (a: ParsedArgs) => Promise<number>; files?: number }
/** Verbs, their options, and how many files each takes (default one scenario file). */
const COMMANDS: Record<string, Command> = {
  run: { valued: ['out'], flags: ['json'], run: commandRun },
  check: { valued: [], flags: ['json'], run: commandCheck },
  ...Object.fromEntries(STUDIES.map((d) => [d.verb, studyVerb(d)])),
  report: { valued: ['out', 'with'], flags: [], run: commandReport },
  bench: { valued: [], flags: ['json'], run: commandBench, files: 0 },
};

/** Refuses arguments a verb would otherwise ignore, e.g. a second scenario file. */
function checkFileCount(verb: string, command: Command, args: ParsedArgs): void {
  const allowed = command.files ?? 1;
  const extra = args.positional.slice(allowed);
  if (extra.length === 0) return;
  const takes = allowed === 0 ? 'takes no file' : 'takes one scenario file';
  throw new UsageError(`${verb} ${takes}, but ${extra.map((e) => JSON.stringify(e)).join(', ')} ${extra.length === 1 ? 'was' : 'were'} given too; ` +
    (allowed === 0 ? 'remove it' : 'run one scenario per call, or remove the extra argument'));
}

/** Runs the command line; returns the exit code. */
export async function main(argv: readonly string[]): Promise<number> {
  const [verb, ...rest] = argv;
  if (!verb || verb === '--help' || verb === '-h' || verb === 'help') {
    process.stdout.write(`${HELP()}\n`);
    return verb ? 0 : 2;
  }
  if (verb === '--version') {
    process.stdout.write('gridgauge 0.1.0\n');
    return 0;
  }
  const command = COMMANDS[verb];
  try {
    if (!command) throw new UsageError(`unknown command "${verb}"; the commands are ${Object.keys(COMMANDS).join(', ')} (see gridgauge --help)`);
    if (rest.includes('--help') || rest.includes('-h')) {
      process.stdout.write(`${HELP()}\n`);
      return 0;
    }
    const args = parseArgs(rest, command.valued, command.flags);
    checkFileCount(verb, command, args);
    return await command.run(args);
  } catch (e) {
    if (e instanceof InvalidInput) {
      for (const p of e.problems) process.stderr.write(`${p.path}: ${p.message}\n`);
      if (rest.includes('--json')) process.stdout.write(jsonForOutput({ ok: false, problems: e.problems }));
      return 2;
    }
    if (e instanceof UsageError) {
      process.stderr.write(`gridgauge: ${e.message}\n`);
      return 2;
    }
    process.stderr.write(`gridgauge: ${e instanceof Error ? e.message : String(e)}\n`);
    if (process.env.GRIDGAUGE_DEBUG) console.error(e);
    return 1;
  }
}
