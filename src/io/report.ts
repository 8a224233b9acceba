/**
 * The design-review report (README "Design-review report"): one self-contained HTML document
 * a reviewer can read on screen or print on A4 or Letter. It holds the job and the caution,
 * the scenario, the derived quantities and warnings, the comparison with the exact field and
 * its plots, every study given (its recommendation, budget, candidates, chart, and for the
 * resolution study the 3D projection), the conventions, and the scenario as JSON. No script,
 * no link to anything outside the file: plots are inline SVG, the error map a PNG data: URI.
 * Everything that came from a user (names, study files) is escaped.
 */
import type { ErrorMap } from '../compare/error-map.ts';
import type { RunResults } from '../compare/results.ts';
import type { DerivedQuantities } from '../scenario/derived.ts';
import type { Scenario } from '../scenario/types.ts';
import type { Warning } from '../scenario/warnings.ts';
import { absorberSection } from './report/absorber-section.ts';
import { convergenceSection } from './report/convergence-section.ts';
import { closingSection, coverSection } from './report/cover-section.ts';
import { genericSection } from './report/generic-section.ts';
import { html, trusted, type Html } from './report/html.ts';
import { plotsSection } from './report/plots-section.ts';
import { resolutionSection } from './report/resolution-section.ts';
import { comparisonSection, derivedSection, type RunInfo } from './report/run-section.ts';
import { scenarioAppendix, scenarioSection } from './report/scenario-section.ts';
import { studyKind, studyTitle, type ReportStudy } from './report/study-data.ts';
import { REPORT_CSS } from './report/style.ts';

export type { ReportStudy } from './report/study-data.ts';
export type { RunInfo } from './report/run-section.ts';

/** Title of every report. */
export const REPORT_TITLE = 'FDTD settings check: design-review report';

export interface ReportInput {
  /** How the scenario is named in the report (its file name). */
  scenarioName: string;
  scenario: Scenario;
  results: RunResults;
  derived: DerivedQuantities;
  warnings: readonly Warning[];
  /** The full-grid error map of the run, when it had one. */
  errorMap?: ErrorMap;
  /** Why there is no error map (e.g. the memory cap), shown in its place. */
  errorMapNote?: string;
  studies: readonly ReportStudy[];
  run: RunInfo;
  /** gridgauge's version (package.json). */
  version: string;
  /** What built the report: "Node v20.20.2", or the browser's user agent. */
  runtime: string;
  /** When, as the report should print it (e.g. an ISO 8601 date and time). */
  date: string;
}

/** The section of one study, by its kind. */
function studySection(s: ReportStudy, index: number): Html {
  const id = `study-${index}`;
  const body = (() => {
    switch (studyKind(s)) {
      case 'absorber': return absorberSection(s, id);
      case 'resolution': return resolutionSection(s, id);
      case 'convergence': return convergenceSection(s, id);
      default: return genericSection(s);
    }
  })();
  const source = `${s.folder.replace(/[\\/]+$/, '')}/${s.file}`;
  return html`<h2 id="${id}">${studyTitle(s)}</h2><p class="note">From ${source}.</p>${body}`;
}

const page = (body: Html) => html`<section class="page">${body}</section>`;

/**
 * The report as one HTML document (a string). The same input gives the same text.
 *
 * @example
 * const text = buildReport({ scenarioName: 'demo.json', scenario, results: collectResults(sim),
 *   derived: deriveQuantities(scenario), warnings: [], errorMap: errorMapOf(sim), studies: [],
 *   run: { seconds: 1.2 }, version: '0.1.0', runtime: `Node ${process.version}`, date: new Date().toISOString() });
 */
export function buildReport(input: ReportInput): string {
  const versionLine = `gridgauge ${input.version} · ${input.runtime} · ${input.date}`;
  const studies = input.studies.map((s, k) => ({ s, k, title: studyTitle(s) }));
  const contents: [string, string][] = [
    ['scenario', 'Scenario'],
    ['derived', 'Derived quantities and warnings'],
    ['comparison', 'FDTD against the exact field'],
    ['plots', 'Plots'],
    ...studies.map(({ k, title }): [string, string] => [`study-${k}`, title]),
    ['conventions', 'Conventions and cautions'],
    ['appendix', 'Appendix: the scenario as JSON'],
  ];
  const body = [
    page(coverSection({
      title: REPORT_TITLE, scenarioName: input.scenarioName, scenario: input.scenario, results: input.results, derived: input.derived,
      warnings: input.warnings, studies: input.studies, contents, stopped: input.run.stopped, versionLine,
    })),
    page(scenarioSection(input.scenario, input.results.steps)),
    page(derivedSection(input.derived, input.warnings, input.run)),
    page(comparisonSection(input.results, input.scenario.polarization)),
    page(plotsSection(input.results, input.scenario, input.errorMap, input.errorMapNote)),
    ...studies.map(({ s, k }) => page(studySection(s, k))),
    page(closingSection(versionLine, input.scenario.polarization)),
    page(scenarioAppendix(input.scenario)),
  ];
  return `<!DOCTYPE html>
${html`<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta name="generator" content="gridgauge ${input.version}">
<title>${REPORT_TITLE}: ${input.scenarioName}</title>
<style>${trusted(REPORT_CSS)}</style>
</head>
<body>
${body}
</body>
</html>`.text}
`;
}
