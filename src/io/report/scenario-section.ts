/**
 * The scenario in the report: a table a reviewer can read without the file format (grid,
 * polarization, medium, absorber, source and waveform, probes, lines, frequencies, steps,
 * objects and their materials when present), and the whole scenario as JSON in the appendix.
 */
import type { Material, Medium, Pole, Scenario, SceneObject, Waveform } from '../../scenario/types.ts';
import { dataTable, html, keyValueTable, numCell, si, sig, type Html } from './html.ts';

function poleText(p: Pole): string {
  switch (p.kind) {
    case 'debye': return `Debye pole: Δε ${sig(p.deltaEps, 4)}, τ ${si(p.tau, 's')}`;
    case 'drude': return `Drude pole: ωp ${si(p.omegaP, 'rad/s')}, γ ${si(p.gamma, 'rad/s')}`;
    case 'lorentz': return `Lorentz pole: Δε ${sig(p.deltaEps, 4)}, ω0 ${si(p.omega0, 'rad/s')}, δ ${si(p.delta, 'rad/s')}`;
    default: return 'unknown pole';
  }
}

/**
 * A medium in words: εr (ε∞ when there are poles), conductivity, poles.
 *
 * @example
 * mediumText({ epsR: 2.2 }); // 'εr 2.2'
 */
export function mediumText(m: Medium): string {
  const parts = [`${m.poles?.length ? 'ε∞' : 'εr'} ${sig(m.epsR, 4)}`];
  if (m.sigma !== undefined) parts.push(`σ ${sig(m.sigma, 4)} S/m`);
  for (const p of m.poles ?? []) parts.push(poleText(p));
  return parts.join('; ');
}

const materialText = (m: Material) => (m === 'pec' ? 'perfect electric conductor' : mediumText(m));

function waveformText(w: Waveform): string {
  switch (w.kind) {
    case 'gaussian': return `Gaussian pulse, τ ${si(w.tau, 's')}, centred at t0 ${si(w.t0, 's')}`;
    case 'modulated-gaussian': return `modulated Gaussian, f0 ${si(w.f0, 'Hz')}, τ ${si(w.tau, 's')}, centred at t0 ${si(w.t0, 's')}`;
    case 'ricker': return `Ricker wavelet, f0 ${si(w.f0, 'Hz')}, centred at t0 ${si(w.t0, 's')}`;
    default: return 'unknown waveform';
  }
}

const point = (x: number, y: number) => `(${si(x, 'm')}, ${si(y, 'm')})`;

function geometryText(o: SceneObject): string {
  switch (o.shape) {
    case 'circle': return `circle, centre ${point(o.x, o.y)}, radius ${si(o.radius, 'm')}`;
    case 'rectangle': return `rectangle from ${point(o.x0, o.y0)} to ${point(o.x1, o.y1)}`;
    case 'polygon': return `polygon of ${o.points.length} vertices${o.points.length ? `, first ${point(o.points[0][0], o.points[0][1])}` : ''}`;
    default: return 'unknown shape';
  }
}

/**
 * The scenario section: the settings as a table, then probes, lines and objects as their own tables.
 *
 * @example
 * scenarioSection(demoScenario(), 1200).text; // '<h2>…'
 */
export function scenarioSection(s: Scenario, stepsTaken: number): Html {
  const { grid, absorber, source } = s;
  const rows: [string, string][] = [
    ['Grid', `${grid.nx} × ${grid.ny} nodes, dx ${si(grid.dx, 'm')}, dy ${si(grid.dy, 'm')}; extent ${si((grid.nx - 1) * grid.dx, 'm')} × ${si((grid.ny - 1) * grid.dy, 'm')}, absorber included`],
    ['Courant number', `${sig(grid.courant, 4)} (c·dt/min(dx, dy))`],
    ['Polarization', s.polarization ? s.polarization : 'TMz (default)'],
    ['Medium', mediumText(s.medium)],
    ['Absorber', absorber.cells > 0
      ? `CPML, ${absorber.cells} cells on every side; grading order m ${sig(absorber.order, 4)}, sigmaScale ${sig(absorber.sigmaScale, 4)}, κmax ${sig(absorber.kappaMax, 4)}, αmax ${sig(absorber.alphaMax, 4)} S/m`
      : 'none: PEC walls at the grid edge'],
    ['Source', `line current at ${point(source.x, source.y)}, amplitude ${si(source.amplitude, 'A')}`],
    ['Waveform', waveformText(source.waveform)],
    ['Analysis frequencies', s.frequencies.length ? s.frequencies.map((f) => si(f, 'Hz')).join(', ') : 'none'],
    ['Steps', stepsTaken === s.steps ? String(s.steps) : `${s.steps} planned, ${stepsTaken} taken (the run stopped early)`],
  ];
  if (s.fill) rows.push(['Objects enter the grid by', s.fill]);
  if (s.objects) rows.push(['Objects', s.objects.length ? `${s.objects.length}, listed below` : 'none']);
  return html`<h2 id="scenario">Scenario</h2>
<p>The settings checked, as run. Positions are measured from node (0, 0), the lower-left corner of the whole grid (absorber included).</p>
${keyValueTable(rows)}
<h3>Probes</h3>
${s.probes.length ? dataTable(['name', numCell('x'), numCell('y')], s.probes.map((p) => [{ value: p.name, className: 'name' }, numCell(si(p.x, 'm')), numCell(si(p.y, 'm'))])) : html`<p class="note">No probes.</p>`}
<h3>Probe lines</h3>
${s.lines.length ? dataTable(['name', 'from', 'to'], s.lines.map((l) => [{ value: l.name, className: 'name' }, point(l.x0, l.y0), point(l.x1, l.y1)])) : html`<p class="note">No probe lines.</p>`}
${s.objects?.length ? html`<h3>Objects and materials</h3>${dataTable(['name', 'shape', 'material'], s.objects.map((o, k) => [{ value: o.name ?? `object ${k + 1}`, className: 'name' }, geometryText(o), materialText(o.material)]))}` : ''}`;
}

/**
 * The appendix: the whole scenario as JSON, every default written out, as it was run.
 *
 * @example
 * scenarioAppendix(demoScenario()).text; // '<h2 id="appendix">…'
 */
export function scenarioAppendix(s: Scenario): Html {
  return html`<h2 id="appendix">Appendix: the scenario as JSON</h2>
<p>The scenario exactly as run, every default filled in. Saved as a file, it runs again with <code>gridgauge run FILE</code> or <code>gridgauge report FILE</code>.</p>
<pre class="json">${JSON.stringify(s, null, 2)}</pre>`;
}
