import { css, html, LitElement, type PropertyValues } from 'lit';
import { customElement, property } from 'lit/decorators.js';
import type { LinePoint, LineResult } from '../compare/results.ts';
import { cAbs, cArg, type Complex } from '../exact/complex.ts';
import { formatSI } from '../scenario/units.ts';
import { ResizeController, TeardownController } from './controllers.ts';
import { fileSafe, saveBlob } from './download.ts';
import { fieldNames, type FieldNames } from '../scenario/field-names.ts';
import { controlStyles, palettes, type ThemeName } from './theme.ts';
import { chartsPng, fitCharts, lastIndex, restingLegend, series, siAxis, uPlot, uplotStyles } from './uplot-kit.ts';

/** Height of each chart, px: room for the longest rotated axis label over the plot. */
const HEIGHT = 210;

const finite = (v: number) => (Number.isFinite(v) ? v : null);
const degrees = (z: Complex) => (cArg(z) * 180) / Math.PI;

/** Phases along the line made continuous (±360° steps removed), so the lag reads as a slope. */
function unwrap(phases: (number | null)[]): (number | null)[] {
  const out: (number | null)[] = [];
  let offset = 0;
  let last: number | undefined;
  for (const p of phases) {
    if (p === null) { out.push(null); continue; }
    if (last !== undefined) {
      const jump = p + offset - last;
      if (jump > 180) offset -= 360 * Math.round(jump / 360);
      else if (jump < -180) offset += 360 * Math.round(-jump / 360);
    }
    last = p + offset;
    out.push(last);
  }
  return out;
}

/**
 * Ez/I (Hz/M in TEz) along one probe line at one analysis frequency: magnitude and phase, FDTD beside
 * exact, then the magnitude error (dB) and phase error (degrees) with the phase error the
 * dispersion relation predicts. Three charts, made once per theme, fed with setData.
 */
@customElement('gg-line-chart')
export class GgLineChart extends LitElement {
  static styles = [controlStyles, uplotStyles, css`
    :host { display: block; }
    .head { display: flex; gap: 0.5rem; align-items: baseline; flex-wrap: wrap; }
    h3 { font-size: 0.95rem; margin: 0; margin-right: auto; }
    .plots { display: grid; gap: 0.25rem; }
    .plot { min-height: ${HEIGHT}px; }
    .u-legend { font-size: 0.8rem; color: var(--gg-ink); }
    .note { font-size: 0.8rem; margin: 0.25rem 0 0; }
  `];

  @property({ attribute: false }) line: LineResult | undefined;
  /** Analysis frequency to show, Hz. */
  @property({ type: Number }) frequency = 0;
  @property() theme: ThemeName = 'light';
  /** What the field and its source are called (by polarization). */
  @property({ attribute: false }) names: FieldNames = fieldNames('TMz');

  private charts: uPlot[] = [];

  constructor() {
    super();
    new ResizeController(this, () => this.renderRoot.querySelector('.plots'), (rect) => fitCharts(this.charts, rect.width, HEIGHT));
    new TeardownController(this, () => this.destroyCharts());
  }

  render() {
    const l = this.line;
    return html`
      <div class="head">
        <h3>Line “${l?.name ?? ''}” at ${formatSI(this.frequency, 'Hz')}</h3>
        <button class="small" @click=${this.savePng} ?disabled=${!l} aria-label="Save the charts of line ${l?.name ?? ''} as PNG">PNG</button>
      </div>
      <div class="plots">
        <div class="plot" data-k="0" role="img" aria-label="Magnitude of ${this.names.ratio} along line ${l?.name ?? ''}, FDTD and exact"></div>
        <div class="plot" data-k="1" role="img" aria-label="Phase of ${this.names.ratio} along line ${l?.name ?? ''}, FDTD and exact"></div>
        <div class="plot" data-k="2" role="img" aria-label="Magnitude and phase error along line ${l?.name ?? ''}, with the predicted phase error"></div>
      </div>
      <p class="note muted">Phase of ${this.names.ratio} with the e<sup>+jωt</sup> convention, made continuous along the line; a negative phase error means the grid lags the exact wave. Legends: values under the pointer, or at the end of the line.</p>
    `;
  }

  protected updated(changed: PropertyValues<this>): void {
    if (changed.has('theme') || changed.has('names')) this.destroyCharts();
    if (!this.line) return;
    if (this.charts.length === 0) this.create();
    else if (changed.has('line') || changed.has('frequency')) {
      const d = this.data();
      this.charts.forEach((c, k) => c.setData(d[k]));
    }
  }

  private destroyCharts(): void {
    for (const c of this.charts) c.destroy();
    this.charts = [];
  }

  private points(): LinePoint[] {
    return (this.line?.points ?? []).filter((p) => p.f_Hz === this.frequency).sort((a, b) => a.s_m - b.s_m);
  }

  private data(): uPlot.AlignedData[] {
    const pts = this.points();
    const s = pts.map((p) => p.s_m);
    const magF = pts.map((p) => finite(cAbs(p.fdtd)));
    const magE = pts.map((p) => finite(cAbs(p.exact)));
    const phF = unwrap(pts.map((p) => finite(degrees(p.fdtd))));
    const phE = unwrap(pts.map((p) => finite(degrees(p.exact))));
    const magErr = pts.map((p) => finite(p.mag_err_dB));
    const phErr = pts.map((p) => finite(p.phase_err_deg));
    const predicted = pts.map((p) => finite(p.predicted_phase_err_deg));
    return [
      [s, magF, magE],
      [s, phF, phE],
      [s, magErr, phErr, predicted],
    ] as uPlot.AlignedData[];
  }

  private create(): void {
    const palette = () => palettes[this.theme];
    const hosts = [...this.renderRoot.querySelectorAll<HTMLElement>('.plot')];
    const width = Math.max(200, Math.floor(hosts[0].getBoundingClientRect().width) || 480);
    const d = this.data();
    const xAxis = () => siAxis(palette, 's', 'm', 'x');
    const sSeries: uPlot.Series = { label: 's', value: (_u, v) => (v === null ? '—' : formatSI(v, 'm', 4)) };
    const base = { width, height: HEIGHT, scales: { x: { time: false } }, cursor: { drag: { x: true, y: false } }, ...restingLegend((u) => lastIndex(u, 1)) };
    this.charts = [
      new uPlot({
        ...base,
        axes: [xAxis(), siAxis(palette, `|${this.names.ratio}|`, this.names.ratioUnit, 'y')],
        series: [sSeries, series({ label: '|FDTD|', colour: () => palette().fdtd, width: 2 }), series({ label: '|exact|', colour: () => palette().exact, dash: [6, 4] })],
      }, d[0], hosts[0]),
      new uPlot({
        ...base,
        axes: [xAxis(), siAxis(palette, `arg ${this.names.ratio} (°)`, '', 'y')],
        series: [sSeries, series({ label: 'arg FDTD (°)', colour: () => palette().fdtd, width: 2 }), series({ label: 'arg exact (°)', colour: () => palette().exact, dash: [6, 4] })],
      }, d[1], hosts[1]),
      new uPlot({
        ...base,
        scales: { x: { time: false }, db: {}, deg: {} },
        axes: [xAxis(), siAxis(palette, 'magnitude error (dB)', '', 'db'), { ...siAxis(palette, 'phase error (°)', '', 'deg', 1), grid: { show: false } }],
        series: [
          sSeries,
          series({ label: 'magnitude error (dB)', colour: () => palette().fdtd, scale: 'db', width: 2 }),
          series({ label: 'phase error (°)', colour: () => palette().exact, scale: 'deg', width: 2 }),
          series({ label: 'predicted phase error (°)', colour: () => palette().predicted, scale: 'deg', dash: [3, 3] }),
        ],
      }, d[2], hosts[2]),
    ];
  }

  private async savePng(): Promise<void> {
    if (this.charts.length === 0 || !this.line) return;
    const title = `Line ${this.line.name} at ${formatSI(this.frequency, 'Hz')}: |${this.names.ratio}|, phase, errors (FDTD vs exact)`;
    saveBlob(`line-${fileSafe(this.line.name)}.png`, await chartsPng(this.charts, palettes[this.theme], title));
  }
}

declare global {
  interface HTMLElementTagNameMap { 'gg-line-chart': GgLineChart }
}
