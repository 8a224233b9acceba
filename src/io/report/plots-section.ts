/**
 * The report's plots of the run: per probe the FDTD time series over the exact one and their
 * difference; per probe line the magnitude and phase errors along the line, measured and
 * predicted, one curve per analysis frequency; the error map. Plots are inline SVG
 * (src/io/svg-plot.ts), the map a PNG (error-map-image.ts).
 */
import type { ErrorMap } from '../../compare/error-map.ts';
import type { LineResult, ProbeResult, RunResults } from '../../compare/results.ts';
import { fieldNames, type FieldNames } from '../../scenario/field-names.ts';
import type { Scenario } from '../../scenario/types.ts';
import { svgPlot, type PlotSeries, type PlotSpec } from '../svg-plot.ts';
import { errorMapFigure } from './error-map-image.ts';
import { html, si, sig, trusted, type Html } from './html.ts';

/** Size of a plot in a two-column row, SVG units (text stays about 7 pt when printed 87 mm wide). */
const HALF = { width: 430, height: 270 };

function figure(spec: PlotSpec, caption: string): Html {
  return html`<figure>${trusted(svgPlot({ ...HALF, ...spec, xmlns: false }))}<figcaption>${caption}</figcaption></figure>`;
}

function probeFigures(p: ProbeResult, k: number, dt: number, names: FieldNames): Html {
  const n = Math.min(p.fdtd.length, p.exact.length);
  const t = Array.from({ length: n }, (_, i) => i * dt);
  const diff = Array.from({ length: n }, (_, i) => p.fdtd[i] - p.exact[i]);
  const status = p.reached ? `relErrMax ${sig(p.relErrMax, 3)}` : 'not reached: the run ended before the pulse arrived';
  return html`${figure({
    id: `probe-${k}-series`, title: `Probe “${p.name}”: ${names.field}`,
    x: { label: 't', unit: 's', min: 0, max: t[n - 1] }, y: { label: names.field, unit: names.unit },
    series: [
      { label: 'exact', x: t, y: p.exact, colour: 'exact' },
      { label: 'FDTD', x: t, y: p.fdtd, colour: 'fdtd', style: 'dashed' },
    ],
  }, `${names.field} at probe “${p.name}”, ρ = ${si(p.rho_m, 'm')}: FDTD (dashed) over the exact transient field; ${status}.`)}
${figure({
    id: `probe-${k}-difference`, title: `Probe “${p.name}”: FDTD − exact`,
    x: { label: 't', unit: 's', min: 0, max: t[n - 1] }, y: { label: 'FDTD − exact', unit: names.unit },
    series: [{ label: 'FDTD − exact', x: t, y: diff, colour: 'error' }],
  }, `The difference of the two curves at probe “${p.name}”, same time axis.`)}`;
}

/** The points of one line at one frequency, in order along the line. */
const pointsAt = (line: LineResult, f: number) => line.points.filter((pt) => pt.f_Hz === f);

function lineFigures(line: LineResult, k: number, frequencies: readonly number[], names: FieldNames): Html {
  const magnitude: PlotSeries[] = [];
  const phase: PlotSeries[] = [];
  frequencies.forEach((f, c) => {
    const pts = pointsAt(line, f);
    const s = pts.map((pt) => pt.s_m);
    const name = si(f, 'Hz');
    magnitude.push({ label: `measured, ${name}`, x: s, y: pts.map((pt) => pt.mag_err_dB), colour: c });
    magnitude.push({ label: `predicted, ${name}`, x: s, y: pts.map((pt) => pt.predicted_mag_err_dB), colour: c, style: 'dashed' });
    phase.push({ label: `measured, ${name}`, x: s, y: pts.map((pt) => pt.phase_err_deg), colour: c });
    phase.push({ label: `predicted, ${name}`, x: s, y: pts.map((pt) => pt.predicted_phase_err_deg), colour: c, style: 'dashed' });
  });
  const first = line.points[0];
  const length = Math.max(0, ...line.points.map((pt) => pt.s_m));
  const along = { label: 'distance along the line', unit: 'm', min: 0, ...(length > 0 ? { max: length } : {}) };
  const where = first ? ` from (${si(first.x_m, 'm')}, ${si(first.y_m, 'm')})` : '';
  return html`${figure({
    id: `line-${k}-magnitude`, title: `Line “${line.name}”: magnitude error`,
    x: along, y: { label: `|${names.ratio}| error (dB)` }, series: magnitude,
  }, `20·log10|FDTD/exact| along line “${line.name}”${where}; dashed: the dispersion relation's prediction (0 dB without loss).`)}
${figure({
    id: `line-${k}-phase`, title: `Line “${line.name}”: phase error`,
    x: along, y: { label: 'phase error (°)' }, series: phase,
  }, `arg(FDTD) − arg(exact) along line “${line.name}”; dashed: predicted by the dispersion relation. Negative: the grid lags.`)}`;
}

/**
 * The plots section.
 *
 * @example
 * plotsSection(results, scenario, errorMapOf(sim), undefined);
 */
export function plotsSection(r: RunResults, s: Scenario, map: ErrorMap | undefined, mapNote: string | undefined): Html {
  const names = fieldNames(s.polarization);
  return html`<h2 id="plots">Plots</h2>
<h3>Probes: time series</h3>
${r.probes.length ? html`<div class="plots">${r.probes.map((p, k) => probeFigures(p, k, r.dt_s, names))}</div>` : html`<p class="note">No probes.</p>`}
<h3>Probe lines: errors along each line</h3>
${r.lines.length && r.frequencies.length ? html`<div class="plots">${r.lines.map((l, k) => lineFigures(l, k, r.frequencies, names))}</div>`
    : html`<p class="note">${r.lines.length ? 'No analysis frequencies: nothing to plot along the lines.' : 'No probe lines.'}</p>`}
<h3>Error map</h3>
${errorMapFigure(map, mapNote, s.grid.dx, s.grid.dy, s.absorber.cells)}`;
}
