/**
 * The report's first page: what it is, what gridgauge checks and why, the caution, the main
 * findings at a glance (settings, worst errors, warnings, each study's recommendation) and
 * the contents. The closing section repeats the caution and gives the conventions.
 */
import type { RunResults } from '../../compare/results.ts';
import type { DerivedQuantities } from '../../scenario/derived.ts';
import type { Scenario } from '../../scenario/types.ts';
import type { Warning } from '../../scenario/warnings.ts';
import { deg, html, keyValueTable, notation, si, sig, type Html, type Part } from './html.ts';
import { studyTitle, studyVerdict, type ReportStudy } from './study-data.ts';
import { CAUTION, conventionsFor, JOB_PARAGRAPHS } from './texts.ts';

/** The worst phase error over reached probes and frequencies, with where it was and its prediction. */
function worstPhase(r: RunResults): string | null {
  let best: { value: number; probe: string; f: number; predicted: number } | null = null;
  for (const p of r.probes) {
    if (!p.reached) continue;
    for (const s of p.spectra) {
      if (Number.isFinite(s.phase_err_deg) && (!best || Math.abs(s.phase_err_deg) > Math.abs(best.value))) {
        best = { value: s.phase_err_deg, probe: p.name, f: s.f_Hz, predicted: s.predicted_phase_err_deg };
      }
    }
  }
  return best && `${deg(best.value)} at probe “${best.probe}”, ${si(best.f, 'Hz')} (predicted ${deg(best.predicted)})`;
}

function worstTimeError(r: RunResults): string | null {
  const reached = r.probes.filter((p) => p.reached && Number.isFinite(p.relErrMax));
  if (reached.length === 0) return null;
  const worst = reached.reduce((a, b) => (b.relErrMax > a.relErrMax ? b : a));
  return `${sig(worst.relErrMax, 3)} at probe “${worst.name}”`;
}

export interface CoverInput {
  title: string;
  scenarioName: string;
  scenario: Scenario;
  results: RunResults;
  derived: DerivedQuantities;
  warnings: readonly Warning[];
  studies: readonly ReportStudy[];
  contents: readonly [id: string, title: string][];
  stopped?: { step: number; reason: string };
  versionLine: string;
}

/**
 * The cover section.
 *
 * @example
 * coverSection({ title: 'Design-review report', scenarioName: 'demo.json', … });
 */
export function coverSection(c: CoverInput): Html {
  const d = c.derived;
  const g = c.scenario.grid;
  const unreached = c.results.probes.filter((p) => !p.reached).length;
  const phase = worstPhase(c.results);
  const time = worstTimeError(c.results);
  const glance: [Part, Part][] = [
    ['Grid', `${g.nx} × ${g.ny} nodes of ${si(g.dx, 'm')} × ${si(g.dy, 'm')}, ${c.results.steps} steps of ${si(d.dt_s, 's')}`],
    ['Courant number', `${sig(d.courant, 4)}, limit ${sig(d.stabilityLimit, 4)} (margin ${sig(100 * d.stabilityMarginFraction, 3)} % of the limit)`],
    ['Cells per wavelength', `${sig(d.cellsPerWavelengthAtF0, 3)} at f0 = ${si(d.f0_Hz, 'Hz')}, ${sig(d.cellsPerWavelengthAtBandEdge, 3)} at the −40 dB band edge ${si(d.bandEdge_Hz, 'Hz')}`],
    ['Worst phase error at a probe', phase ?? 'none measured'],
    ['Worst time-domain error (relErrMax)', time ?? 'none measured'],
    ['Warnings', c.warnings.length ? `${c.warnings.length}: ${[...new Set(c.warnings.map((w) => w.code))].join(', ')} (see “Derived quantities and warnings”)` : 'none'],
  ];
  if (unreached) glance.push(['Probes not reached', `${unreached} of ${c.results.probes.length}: the run ended before the pulse arrived`]);
  if (c.stopped) glance.push(['Run', `stopped at step ${c.stopped.step}: ${c.stopped.reason}`]);
  for (const s of c.studies) glance.push([studyTitle(s), studyVerdict(s)]);
  if (c.studies.length === 0) glance.push(['Studies', 'none included (add study output folders with --with DIR)']);
  return html`<header>
<h1>${c.title}</h1>
<p class="subtitle">Scenario <strong>${c.scenarioName}</strong> · ${c.versionLine}</p>
</header>
${JOB_PARAGRAPHS.map((p) => html`<p>${p}</p>`)}
<div class="caution"><strong>Caution.</strong> ${CAUTION}</div>
<h3>At a glance</h3>
<div class="glance">${keyValueTable(glance)}</div>
<h3>Contents</h3>
<ol>${c.contents.map(([id, title]) => html`<li><a href="#${id}">${title}</a></li>`)}</ol>`;
}

/**
 * The closing section: conventions, the caution again, versions and date.
 *
 * @example
 * closingSection('gridgauge 0.1.0 · Node v20.20.2 · 2025-01-01');
 */
export function closingSection(versionLine: string, polarization?: string): Html {
  return html`<h2 id="conventions">Conventions and cautions</h2>
<p>Every figure in this report is measured in these conventions (they are the trade's; where texts differ, the choice is stated).</p>
<ul>${conventionsFor(polarization).map((c) => html`<li>${notation(c)}</li>`)}</ul>
<div class="caution"><strong>Caution.</strong> ${CAUTION}</div>
<p>The exact field is that of an idealised line current in a homogeneous medium, or beside one circular object: the check measures the grid, not a design. Studies recommend settings for a stated budget; a project with other sources, materials or geometry may need finer settings than they show.</p>
<p class="versions">Made by ${versionLine}.</p>`;
}
