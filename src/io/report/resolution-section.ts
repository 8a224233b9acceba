/**
 * The resolution study in the report, from resolution.json (src/studies/resolution-study.ts
 * `resolutionJsonObject`): the recommendation against the phase budget, the measured phase
 * lag per wavelength beside the dispersion relation's, the candidates, and the projection
 * onto a 3D grid when the study made one (src/studies/projection.ts).
 */
import { formatBytes } from '../../scenario/units.ts';
import { svgPlot } from '../svg-plot.ts';
import { dataTable, deg, html, keyValueTable, numCell, si, sig, trusted, type Cell, type Html } from './html.ts';
import { isRecommended, list, num, obj, studyVerdict, text, type ReportStudy } from './study-data.ts';

/** The sentence the 3D projection always carries. */
export const PROJECTION_SENTENCE = 'These 3D figures are a projection by the 3D dispersion relation, not a 3D run.';

function lagChart(d: unknown, id: string): string | null {
  const rows = list(d, 'candidates').filter((c) => num(c, 'cellsPerWavelength') > 0).sort((a, b) => num(a, 'cellsPerWavelength') - num(b, 'cellsPerWavelength'));
  if (rows.length === 0) return null;
  const x = rows.map((c) => num(c, 'cellsPerWavelength'));
  const limit = num(d, 'budget_deg') / num(d, 'size_wavelengths');
  return svgPlot({
    id, title: 'Phase lag per wavelength against cells per wavelength', width: 640, height: 330, xmlns: false,
    x: { label: 'cells per wavelength', log: true }, y: { label: 'phase lag (° per wavelength)', log: true },
    series: [
      { label: 'measured, axis', x, y: rows.map((c) => num(c, 'axis_deg_per_wavelength')), style: 'points', colour: 'fdtd' },
      { label: 'measured, diagonal', x, y: rows.map((c) => num(c, 'diagonal_deg_per_wavelength')), style: 'points', colour: 'exact' },
      { label: 'predicted, axis', x, y: rows.map((c) => num(c, 'predicted_axis_deg_per_wavelength')), colour: 'fdtd' },
      { label: 'predicted, diagonal', x, y: rows.map((c) => num(c, 'predicted_diagonal_deg_per_wavelength')), colour: 'exact' },
    ],
    limits: Number.isFinite(limit) && limit > 0 ? [{ axis: 'y', value: limit, label: `budget / size = ${deg(limit)} per wavelength` }] : [],
  });
}

function projectionTable(p: unknown): Html {
  return html`${keyValueTable([
    ['Cells per wavelength', `${sig(num(p, 'cellsPerWavelength'), 4)} (at least ${sig(num(p, 'cellsPerWavelengthMin'), 4)})`],
    ['Cell size dx = dy = dz', si(num(p, 'dx_m'), 'm')],
    ['Courant number c·dt/dx', sig(num(p, 'courant'), 4)],
    ['Time step dt', si(num(p, 'dt_s'), 's')],
    ['Cells', `${sig(num(p, 'nx'), 6)} × ${sig(num(p, 'ny'), 6)} × ${sig(num(p, 'nz'), 6)} = ${sig(num(p, 'cells'), 3)}, absorber included`],
    ['Memory', formatBytes(num(p, 'memory_bytes'))],
    ['Steps', sig(num(p, 'steps'), 6)],
    ['Time', `about ${sig(num(p, 'seconds'), 2)} s`],
    ['Speed assumed', `${sig(num(p, 'mcells_per_second'), 3)} Mcells/s (${text(p, 'speed_source') || 'source not given'})`],
    ['Governed by', text(p, 'governedBy') === 'feature' ? 'the thinnest feature' : 'dispersion (the phase budget)'],
    ['2D measured over predicted lag', sig(num(p, 'measured_over_predicted'), 4)],
  ])}
<p><strong>${PROJECTION_SENTENCE}</strong> The 3D relation along an axis, scaled by what the 2D runs measured against the 2D prediction, meets the same budget over the same size; the time step sits at the same fraction of the 3D stability limit as the 2D Courant number of the 2D limit.</p>`;
}

/**
 * The resolution study's section.
 *
 * @example
 * resolutionSection({ file: 'resolution.json', folder: 'out', data }, 'study-1');
 */
export function resolutionSection(s: ReportStudy, id: string): Html {
  const d = s.data;
  const rec = obj(d, 'recommended');
  const project = obj(rec, 'project');
  const size = num(d, 'size_wavelengths');
  const chart = lagChart(d, `${id}-lag`);
  const projection = obj(d, 'projection3d');
  const candidates = list(d, 'candidates');
  const rows = candidates.map((c): Cell[] => {
    const p = obj(c, 'project');
    const picked = isRecommended(c, rec);
    return [
      numCell(sig(num(c, 'cellsPerWavelength'), 4)), numCell(si(num(c, 'dx_m'), 'm')), numCell(deg(num(c, 'axis_deg_per_wavelength'))),
      numCell(deg(num(c, 'predicted_axis_deg_per_wavelength'))), numCell(deg(num(c, 'diagonal_deg_per_wavelength'))),
      numCell(deg(num(c, 'predicted_diagonal_deg_per_wavelength'))), numCell(deg(num(c, 'projected_error_deg'))),
      numCell(`${sig(num(p, 'nx'), 6)} × ${sig(num(p, 'ny'), 6)}`), numCell(formatBytes(num(p, 'memory_bytes'))),
      numCell(Number.isFinite(num(p, 'seconds')) ? `${sig(num(p, 'seconds'), 2)} s` : '—'),
      [picked ? 'recommended' : '', text(c, 'error')].filter(Boolean).join('; '),
    ];
  });
  return html`<p class="verdict"><strong>${studyVerdict(s)}</strong></p>
${project ? html`<p>A ${sig(size, 4)} × ${sig(size, 4)} wavelength 2D grid at that resolution: ${sig(num(project, 'nx'), 6)} × ${sig(num(project, 'ny'), 6)} cells, ${sig(num(project, 'steps'), 6)} steps, ${formatBytes(num(project, 'memory_bytes'))}, about ${sig(num(project, 'seconds'), 2)} s at ${sig(num(d, 'mcells_per_second'), 3)} Mcells/s.</p>` : ''}
<p>The resolution study runs a line current at a range of cells per wavelength and fits the phase error along probe lines 2 to 5 wavelengths out along x, y and the diagonal; the slope is the phase the grid loses per wavelength. The worst direction's lag times the project's size is the phase error across the project; the recommendation is the coarsest resolution keeping it within the budget.</p>
${keyValueTable([
    ['Phase budget across the project', deg(num(d, 'budget_deg'))],
    ['Project size', `${sig(size, 4)} wavelengths`],
    ['Frequency; wavelength in the medium', `${si(num(d, 'frequency_Hz'), 'Hz')}; ${si(num(d, 'wavelength_m'), 'm')}`],
    ['Courant number; dy/dx (held)', `${sig(num(d, 'courant'), 4)}; ${sig(num(d, 'dy_over_dx'), 4)}`],
    ['Measured engine speed', `${sig(num(d, 'mcells_per_second'), 3)} Mcells/s per worker`],
    ['Resolutions', `${candidates.length} of ${sig(num(d, 'planned'), 6)} planned${(d as { complete?: unknown })?.complete === false ? ' (interrupted)' : ''}`],
  ])}
${chart ? html`<figure class="wide">${trusted(chart)}<figcaption>Measured phase lag per wavelength (points) beside the Yee dispersion relation (lines), along an axis (the worse of x and y) and the diagonal; dashed: the budget spread over the project's size. Both axes logarithmic.</figcaption></figure>` : ''}
<h3>Candidates</h3>
${dataTable([
    { value: 'cells/λ', numeric: true }, { value: 'dx', numeric: true }, { value: 'axis °/λ', numeric: true }, { value: 'predicted', numeric: true },
    { value: 'diagonal °/λ', numeric: true }, { value: 'predicted', numeric: true }, { value: 'across project', numeric: true },
    { value: '2D grid', numeric: true }, { value: 'memory', numeric: true }, { value: 'time', numeric: true }, '',
  ], rows, 'data compact', candidates.map((c) => isRecommended(c, rec)))}
<h3>3D projection</h3>
${projection ? projectionTable(projection) : html`<p class="note">The study made no 3D projection (run it with --dims 3 --volume X,Y,Z to add one).</p>`}`;
}
