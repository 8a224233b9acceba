/**
 * The convergence study in the report, from convergence.json (src/studies/convergence-study.ts):
 * the recommended level against the GCI budgets, the GCI of phase and magnitude against the
 * cell size on log–log axes with a slope-2 guide (the Yee scheme's formal order), the true
 * error beside it where an exact reference exists, the caveats and the levels.
 */
import { formatBytes } from '../../scenario/units.ts';
import { svgPlot } from '../svg-plot.ts';
import { dataTable, dB, deg, html, keyValueTable, numCell, si, sig, trusted, type Cell, type Html } from './html.ts';
import { field, isRecommended, list, num, obj, studyVerdict, text, type ReportStudy } from './study-data.ts';

/** Caveats printed in full; the rest are counted. */
const CAVEATS_SHOWN = 12;

function gciChart(d: unknown, id: string, title: string, unit: string, gciKey: string, trueKey: string): string | null {
  const levels = list(d, 'candidates').filter((l) => num(l, 'dx_m') > 0 && num(l, gciKey) > 0);
  if (levels.length < 2) return null;
  const x = levels.map((l) => num(l, 'dx_m'));
  const finest = levels.reduce((a, b) => (num(a, 'dx_m') < num(b, 'dx_m') ? a : b));
  const guide = x.map((dx) => num(finest, gciKey) * (dx / num(finest, 'dx_m')) ** 2);
  const exact = text(d, 'exact') !== '' && text(d, 'exact') !== 'none';
  return svgPlot({
    id, title, width: 430, height: 290, xmlns: false,
    x: { label: 'cell size dx', unit: 'm', log: true }, y: { label: `${title} (${unit})`, log: true },
    series: [
      { label: 'GCI (worst)', x, y: levels.map((l) => num(l, gciKey)), style: 'points', colour: 'fdtd' },
      ...(exact ? [{ label: 'true error (worst)', x, y: levels.map((l) => Math.abs(num(l, trueKey))), style: 'points' as const, colour: 'exact' as const }] : []),
      { label: 'slope 2', x, y: guide, style: 'dashed', colour: 'predicted' },
    ],
  });
}

/**
 * The convergence study's section.
 *
 * @example
 * convergenceSection({ file: 'convergence.json', folder: 'out', data }, 'study-2');
 */
export function convergenceSection(s: ReportStudy, id: string): Html {
  const d = s.data;
  const rec = obj(d, 'recommended');
  const caveats = list(d, 'caveats').filter((c): c is string => typeof c === 'string');
  const bounds = obj(d, 'gci_bounds_true_error');
  const phase = gciChart(d, `${id}-phase`, 'phase uncertainty', '°', 'worst_gci_phase_deg', 'worst_true_phase_err_deg');
  const magnitude = gciChart(d, `${id}-magnitude`, 'magnitude uncertainty', 'dB', 'worst_gci_mag_dB', 'worst_true_mag_err_dB');
  const candidates = list(d, 'candidates');
  const rows = candidates.map((l): Cell[] => {
    const picked = isRecommended(l, rec);
    return [
      numCell(sig(num(l, 'level'), 4)), numCell(si(num(l, 'dx_m'), 'm')), numCell(`${sig(num(l, 'nx'), 6)} × ${sig(num(l, 'ny'), 6)}`),
      numCell(sig(num(l, 'steps'), 6)), numCell(formatBytes(num(l, 'memory_bytes'))),
      numCell(dB(num(l, 'worst_gci_mag_dB'))), numCell(deg(num(l, 'worst_gci_phase_deg'))),
      numCell(dB(num(l, 'worst_true_mag_err_dB'))), numCell(deg(num(l, 'worst_true_phase_err_deg'))),
      [picked ? 'recommended' : '', num(l, 'level') === 0 ? 'your grid' : '', text(l, 'error')].filter(Boolean).join('; '),
    ];
  });
  const charts = [phase, magnitude].filter((c): c is string => c !== null);
  return html`<p class="verdict"><strong>${studyVerdict(s)}</strong></p>
<p>The convergence study runs the scenario on grids each finer by the same ratio, holding every physical quantity, and compares magnitude and phase at every probe and frequency across them by Richardson extrapolation. The Grid Convergence Index (GCI, Roache 1998; Celik et al. 2008) is the resulting uncertainty band of each grid's value; the recommendation is the coarsest grid whose worst GCI meets both budgets, given only when the values are in the asymptotic range.</p>
${keyValueTable([
    ['Grids; refinement ratio', `${sig(num(d, 'levels'), 4)}; ${sig(num(d, 'ratio'), 4)}`],
    ['Budgets (GCI)', `${dB(num(d, 'budget_dB'))} in magnitude, ${deg(num(d, 'budget_deg'))} in phase`],
    ['Exact reference', text(d, 'exact') || '—'],
    ['Polarization', text(d, 'polarization') || '—'],
    ['Finest grid\'s GCI bounds the true error', bounds ? `in ${sig(num(bounds, 'bounded'), 6)} of ${sig(num(bounds, 'rows'), 6)} quantities` : 'no exact reference to check it against'],
    ['Levels', `${candidates.length} of ${sig(num(d, 'planned'), 6)} planned${field(d, 'complete') === false ? ' (interrupted)' : ''}`],
  ])}
${charts.length ? html`<div class="plots">${charts.map((c, k) => html`<figure>${trusted(c)}<figcaption>Worst ${k === 0 ? 'phase' : 'magnitude'} GCI over probes and frequencies against the cell size${text(d, 'exact') && text(d, 'exact') !== 'none' ? ', with the worst true error' : ''}; dashed: slope 2 through the finest grid. Both axes logarithmic.</figcaption></figure>`)}</div>` : ''}
${caveats.length ? html`<h3>Caveats</h3><ul>${caveats.slice(0, CAVEATS_SHOWN).map((c) => html`<li>${c}</li>`)}${caveats.length > CAVEATS_SHOWN ? html`<li>${caveats.length - CAVEATS_SHOWN} more in ${s.file}.</li>` : ''}</ul>` : ''}
<h3>Levels</h3>
${dataTable([
    { value: 'level', numeric: true }, { value: 'dx', numeric: true }, { value: 'grid', numeric: true }, { value: 'steps', numeric: true },
    { value: 'memory', numeric: true }, { value: 'GCI |dB|', numeric: true }, { value: 'GCI °', numeric: true },
    { value: 'true |dB|', numeric: true }, { value: 'true °', numeric: true }, '',
  ], rows, 'data compact', candidates.map((l) => isRecommended(l, rec)))}`;
}
