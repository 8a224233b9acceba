/**
 * The absorber study in the report, from absorber.json (src/studies/absorber-study.ts
 * `absorberJsonObject`): the recommendation and the target, the reflection against layer
 * cells for every grading swept over two or more thicknesses, and the candidates.
 */
import { formatBytes } from '../../scenario/units.ts';
import { svgPlot, type PlotSeries } from '../svg-plot.ts';
import { dataTable, dB, html, keyValueTable, numCell, sig, trusted, type Cell, type Html } from './html.ts';
import { gradingText, isRecommended, list, num, obj, studyVerdict, text, type ReportStudy } from './study-data.ts';

const gradingKey = (c: unknown) => ['order', 'sigmaScale', 'kappaMax', 'alphaMax'].map((k) => num(c, k)).join('|');
const gradingLabel = (c: unknown) => `m ${sig(num(c, 'order'), 4)}, σ×${sig(num(c, 'sigmaScale'), 4)}, κ ${sig(num(c, 'kappaMax'), 4)}, α ${sig(num(c, 'alphaMax'), 4)}`;

/** The figure the recommendation rests on: the worst case, or the user's probes. */
const basisFigure = (basis: string) => (c: unknown) => (basis === 'probes' ? num(c, 'reflection_dB') : num(c, 'reflection_worst_dB'));

/** Reflection against layer cells, one curve per grading with two or more thicknesses, the target dashed. */
function reflectionChart(d: unknown, id: string): string | null {
  const candidates = list(d, 'candidates');
  const basis = text(d, 'basis') || 'worst-case';
  const figure = basisFigure(basis);
  const groups = new Map<string, unknown[]>();
  for (const c of candidates) groups.set(gradingKey(c), [...(groups.get(gradingKey(c)) ?? []), c]);
  const series: PlotSeries[] = [];
  for (const group of groups.values()) {
    const rows = group.filter((c) => Number.isFinite(num(c, 'cells'))).sort((a, b) => num(a, 'cells') - num(b, 'cells'));
    if (new Set(rows.map((c) => num(c, 'cells'))).size < 2) continue;
    series.push({ label: gradingLabel(rows[0]), x: rows.map((c) => num(c, 'cells')), y: rows.map(figure), colour: series.length, markers: true });
  }
  if (series.length === 0) return null;
  const target = num(d, 'target_dB');
  return svgPlot({
    id, title: 'Reflection against layer cells', width: 640, height: 330, xmlns: false,
    x: { label: 'layer cells' }, y: { label: `reflection, ${basis === 'probes' ? 'at your probes' : 'worst case'} (dB)` },
    series,
    limits: Number.isFinite(target) ? [{ axis: 'y', value: target, label: `target ${dB(target)}` }] : [],
  });
}

/**
 * The absorber study's section.
 *
 * @example
 * absorberSection({ file: 'absorber.json', folder: 'out', data }, 'study-0');
 */
export function absorberSection(s: ReportStudy, id: string): Html {
  const d = s.data;
  const rec = obj(d, 'recommended');
  const current = obj(d, 'current');
  const basis = text(d, 'basis') || 'worst-case';
  const reference = obj(d, 'reference');
  const chart = reflectionChart(d, `${id}-reflection`);
  const candidates = list(d, 'candidates');
  const rows = candidates.map((c): Cell[] => {
    const notes = [isRecommended(c, rec) ? 'recommended' : '', (c as { current?: unknown }).current === true ? 'your setting' : '', text(c, 'error')].filter(Boolean).join('; ');
    return [
      numCell(sig(num(c, 'cells'), 4)), numCell(sig(num(c, 'order'), 4)), numCell(sig(num(c, 'sigmaScale'), 4)), numCell(sig(num(c, 'kappaMax'), 4)),
      numCell(sig(num(c, 'alphaMax'), 4)), numCell(dB(num(c, 'reflection_dB'))), numCell(dB(num(c, 'reflection_worst_dB'))), numCell(dB(num(c, 'theory_dB'))),
      numCell(formatBytes(num(c, 'memory_bytes'))), notes,
    ];
  });
  return html`<p class="verdict"><strong>${studyVerdict(s)}</strong></p>
${current ? html`<p>Your setting: ${gradingText(current)}: ${dB(num(current, 'reflection_dB'))} at your probes, ${dB(num(current, 'reflection_worst_dB'))} worst case.</p>` : ''}
<p>The absorber study measures the reflection of CPML layers by the reference-grid method: each candidate layer runs the scenario, and a grid so large that nothing returns from its edges within the run gives the reflection-free field; the worst probe's max|E − Eref| / max|Eref| is the candidate's reflection in dB. The recommendation is the thinnest layer meeting the target, ties broken by margin.</p>
${keyValueTable([
    ['Target', dB(num(d, 'target_dB'))],
    ['Recommendation rests on', basis === 'probes' ? 'your own probes' : 'the worst case: your probes, probes one cell inside the layer on every side and corner, and a long window against a thick layer'],
    ['Steps per run; long window', `${sig(num(d, 'steps'), 6)}; ${num(d, 'long_steps') > 0 ? `${sig(num(d, 'long_steps'), 6)} steps` : 'none'}`],
    ['Reference grid', reference ? `${sig(num(reference, 'nx'), 6)} × ${sig(num(reference, 'ny'), 6)}` : '—'],
    ['Candidates', `${candidates.length} of ${sig(num(d, 'planned'), 6)} planned${(d as { complete?: unknown })?.complete === false ? ' (interrupted: the recommendation is among those that finished)' : ''}`],
  ])}
${chart ? html`<figure class="wide">${trusted(chart)}<figcaption>Reflection of each grading swept over layer thicknesses (${basis === 'probes' ? 'at your probes' : 'worst case, the figure the recommendation rests on'}); dashed: the target.</figcaption></figure>` : ''}
<h3>Candidates</h3>
${dataTable([
    { value: 'cells', numeric: true }, { value: 'm', numeric: true }, { value: 'sigmaScale', numeric: true }, { value: 'κmax', numeric: true },
    { value: 'αmax (S/m)', numeric: true }, { value: 'at probes', numeric: true }, { value: 'worst case', numeric: true }, { value: 'theory', numeric: true },
    { value: 'memory', numeric: true }, '',
  ], rows, 'data compact', candidates.map((c) => isRecommended(c, rec)))}`;
}
