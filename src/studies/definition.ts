/**
 * What a study is, as one object: its options (read the same way from the command line and
 * the page's form), how it plans runs, how it scores a finished candidate, how it picks the
 * recommendation, the table it shows, the files it writes and the scenarios it emits for a
 * batch scheduler. `runStudy` (run-study.ts) runs any definition on a worker pool; the CLI
 * verbs (src/cli/study-commands.ts), the study files (src/io/study-files.ts) and the page's
 * studies panel are driven by the definitions in registry.ts. Adding a study is one new file
 * with a definition and one line in the registry.
 */
import type { Scenario } from '../scenario/types.ts';
import type { StudyJob, StudyJobResult } from './jobs.ts';

/** One option of a study, as text: a command-line flag `--name` and a field of the page's form. */
export interface StudyOption {
  /** Flag name and key of the values map, e.g. "target". */
  name: string;
  /** Label in the page's form, with its unit. */
  label: string;
  /** One line of help: what it is and its unit. */
  help: string;
  /** The default, as the form shows it; absent when the option is required or optional without default. */
  defaultText?: string;
  /** Where the option is offered (default both). */
  where?: 'cli' | 'page' | 'both';
  /** A flag without a value (--name). */
  flag?: boolean;
  /** The value's name in usage lines, e.g. "DB" (default N). */
  metavar?: string;
  /** Required on the command line. */
  required?: boolean;
  /** Allowed values, for a menu; the first is the default. */
  choices?: readonly string[];
}

/** Option values as typed: flag name → text (undefined when not given; "" for a flag). */
export type OptionValues = Readonly<Record<string, string | undefined>>;

/** A study's file as data; src/io/study-files.ts writes it as text. */
export type StudyOutput =
  | { name: string; kind: 'csv'; header: readonly string[]; rows: readonly (readonly (string | number)[])[] }
  | { name: string; kind: 'json'; value: unknown };

/** A column of the study's table, in the terminal and on the page. */
export interface StudyColumn<C> {
  label: string;
  value(c: C): string;
  /** Text columns are left-aligned; numbers (the default) right-aligned. */
  text?: boolean;
}

/** One curve or point set of a study chart. */
export interface ChartSeries {
  label: string;
  x: readonly number[];
  /** null where the curve has no value (a failed candidate). */
  y: readonly (number | null)[];
  /** "line" (default), "points" (markers only), "dashed" (a limit or budget). */
  style?: 'line' | 'points' | 'dashed';
  /** Theme colour role, or an index into the page's list of curve colours. */
  colour?: 'fdtd' | 'exact' | 'error' | 'predicted' | number;
}

/** A chart a study shows, as data: the page draws it without knowing the physics. */
export interface StudyChart {
  id: string;
  title: string;
  /** Axis label with its unit, and whether the axis is logarithmic. */
  x: { label: string; unit?: string; log?: boolean };
  y: { label: string; unit?: string; log?: boolean };
  series: ChartSeries[];
}

/** What every planned candidate has: a stable key and the runs it needs. */
export interface PlannedCandidate { key: string; jobs: StudyJob[] }

/** What every plan has: the candidates, and runs every candidate's score needs (e.g. a reference). */
export interface StudyPlan<CP extends PlannedCandidate = PlannedCandidate> {
  candidates: CP[];
  shared: StudyJob[];
}

/** How the study's runs went, for `finish`. */
export interface RunInfo {
  planned: number;
  /** False when cancelled before every candidate finished. */
  complete: boolean;
  /** Serial numbers of the workers that ran jobs. */
  workers: number[];
  /** Wall-clock seconds of the whole study. */
  seconds: number;
  /** Results of the shared runs (an entry is missing when the study was cancelled before it finished). */
  shared: (StudyJobResult | undefined)[];
}

/** The scenario files of `--emit`: file name → scenario, and the manifest written as study.json. */
export interface EmitPlan { scenarios: Record<string, Scenario>; manifest: Record<string, unknown> }

export interface StudyDefinition<O = unknown, CP extends PlannedCandidate = PlannedCandidate, P extends StudyPlan<CP> = StudyPlan<CP>, C = unknown, R = unknown> {
  /** Short name: "absorber". */
  id: string;
  /** Title of the page's tab. */
  title: string;
  /** Command-line verb: "absorber-study". */
  verb: string;
  /** One paragraph for --help and the page. */
  summary: string;
  options: readonly StudyOption[];
  /** Options from their text, or the problems (each naming the option and the fix). */
  readOptions(values: OptionValues): { options?: O; problems: string[] };
  /** The runs of the study. Throws RangeError on options that do not fit the scenario. */
  plan(scenario: Scenario, options: O): P;
  /** Called once the shared runs are done; throws when the study cannot go on (e.g. the reference blew up). */
  checkShared?(plan: P, shared: StudyJobResult[]): void;
  /** The figures of a candidate whose runs (and the shared runs) finished. */
  evaluate(plan: P, candidate: CP, results: StudyJobResult[], shared: StudyJobResult[]): C;
  /** The row of a candidate whose run failed. */
  failed(plan: P, candidate: CP, message: string): C;
  /** Table order. */
  compare(a: C, b: C): number;
  /** The recommendation among candidates finished so far; null if none qualifies. */
  pick(plan: P, candidates: readonly C[]): C | null;
  /** The whole result, once the runs are over (or cancelled). */
  finish(plan: P, candidates: C[], info: RunInfo): R;
  /** The finished candidates of a result, in table order. */
  rows(result: R): readonly C[];
  /** The result's recommendation. */
  recommended(result: R): C | null;
  columns: readonly StudyColumn<C>[];
  /** Notes on one row: "recommended", "current", an error. */
  rowNotes(result: { recommended: C | null }, candidate: C): string[];
  /** Lines of text above the table: what was measured and how. */
  heading(result: R): string[];
  /** Lines of text under the table: the recommendation with its budget, and caveats. */
  verdict(result: R): string[];
  /** The note for stderr when `--json` is asked and nothing meets the budget. */
  noneMeets(result: R): string;
  /** Files of `--out` and the page's download. */
  outputs(result: R): StudyOutput[];
  /** What `--json` prints (the study's JSON file's object). */
  json(result: R): unknown;
  /**
   * File names of the runs for a batch scheduler (`--emit`): one per shared run and one per
   * candidate run, in the plan's order. Each is run anywhere with
   * `gridgauge run FILE --out DIR/<name without .json>` and read back by `--from DIR`.
   */
  jobFiles(plan: P): { shared: string[]; candidates: string[][] };
  /** The study's own part of study.json: what it is, its budget, how each run is scored. */
  manifest(plan: P): Record<string, unknown>;
  /** What `--emit` wrote, in words (after "wrote N files to DIR: "). */
  emitted(plan: P): string;
  /** The user's scenario with a recommendation applied (the page's Apply button). */
  apply?(scenario: Scenario, plan: P, pick: C): Scenario;
  /** Charts of the candidates so far (the result once finished), as data for the page. */
  charts?(plan: P, rows: readonly C[], result: R | undefined): StudyChart[];
  /** Lines to show before running: memory and time of the runs. */
  preview?(plan: P): string[];
  /** What the shared runs are, in words, for progress ("the reference grid"). */
  sharedRuns?: string;
  /** A note under the page's form: how the study measures. */
  pageNote?: string;
  /** Row attributes for the page's table (data-* names without the prefix). */
  rowData?(candidate: C): Record<string, string>;
}

/** Any definition, for registries and generic code. */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
export type AnyStudyDefinition = StudyDefinition<any, any, any, any, any>;

/**
 * A number typed into an option: plain decimal or exponent notation. Units are not
 * accepted, so the message says how to write the number without one.
 */
export function readNumberOption(name: string, text: string | undefined, unit: string, example: string): { value?: number; problem?: string } {
  if (text === undefined || text.trim() === '') return {};
  const value = Number(text.trim());
  if (Number.isFinite(value)) return { value };
  const number = text.trim().replace(/\s*[a-zA-Z°µ/%]+$/u, '');
  if (number !== '' && number !== text.trim() && Number.isFinite(Number(number))) {
    return { problem: `${name}: "${text}" has a unit in it; write the number of ${unit} alone, e.g. ${Number(number)}` };
  }
  return { problem: `${name}: "${text}" is not a number of ${unit}; write e.g. ${example}` };
}

/** A list typed into an option: "4, 6, 8" → [4, 6, 8]. */
export function readListOption(name: string, text: string | undefined, unit: string, example: string): { value?: number[]; problem?: string } {
  if (text === undefined || text.trim() === '') return {};
  const parts = text.split(/[,;\s]+/).filter((p) => p !== '');
  const values = parts.map(Number);
  if (parts.length > 0 && values.every(Number.isFinite)) return { value: values };
  return { problem: `${name}: "${text}" is not a list of ${unit}; write numbers separated by commas, e.g. ${example}` };
}

/**
 * `num` and `list` readers of a study's option texts that gather every problem in
 * `problems`, in the order the options are read.
 *
 * @example
 * const problems: string[] = [];
 * const { num } = optionReaders({ target: '-70dB' }, problems);
 * num('target', 'dB', '-60'); // undefined; problems[0] says to write the number alone
 */
export function optionReaders(values: Readonly<Record<string, string | undefined>>, problems: string[]) {
  const keep = <T>(r: { value?: T; problem?: string }): T | undefined => {
    if (r.problem) problems.push(r.problem);
    return r.value;
  };
  return {
    num: (name: string, unit: string, example: string) => keep(readNumberOption(name, values[name], unit, example)),
    list: (name: string, unit: string, example: string) => keep(readListOption(name, values[name], unit, example)),
  };
}
