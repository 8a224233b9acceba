import { css, html, type PropertyValues } from 'lit';
import { customElement, property } from 'lit/decorators.js';
import type { ProbeResult } from '../compare/results.ts';
import { formatSI, formatSig } from '../scenario/units.ts';
import { fileSafe, saveBlob } from './download.ts';
import { fieldNames, type FieldNames } from '../scenario/field-names.ts';
import { controlStyles, palettes, type Palette } from './theme.ts';
import { SingleChartElement } from './single-chart.ts';
import { chartsPng, peakIndex, restingLegend, series, siAxis, uPlot, uplotStyles } from './uplot-kit.ts';

const HEIGHT = 220;

/**
 * The field (Ez, or Hz in TEz) at one probe against time: FDTD and the exact transient
 * field laid over each other, and their difference. The chart is made once per theme and
 * polarization; new runs only call setData.
 */
@customElement('gg-timeseries-chart')
export class GgTimeseriesChart extends SingleChartElement {
  static styles = [controlStyles, uplotStyles, css`
    :host { display: block; }
    .head { display: flex; gap: 0.5rem; align-items: baseline; flex-wrap: wrap; }
    h3 { font-size: 0.95rem; margin: 0; }
    .figures { font-size: 0.85rem; margin-right: auto; }
    .plot { min-height: ${HEIGHT}px; }
    .uplot { font-family: var(--gg-font); }
    .u-legend { font-size: 0.8rem; color: var(--gg-ink); }
    .note { font-size: 0.75rem; margin: 0; }
  `];

  @property({ attribute: false }) probe: ProbeResult | undefined;
  @property({ type: Number }) dt = 0;
  /** What the field and its source are called (by polarization). */
  @property({ attribute: false }) names: FieldNames = fieldNames('TMz');
  protected readonly chartHeight = HEIGHT;

  protected updated(changed: PropertyValues<this>): void {
    if (changed.has('names')) this.destroyChart();
    super.updated(changed);
  }

  render() {
    const p = this.probe;
    return html`
      <div class="head">
        <h3>Probe “${p?.name ?? ''}”</h3>
        <span class="figures muted num">
          ρ = ${p ? formatSI(p.rho_m, 'm') : '—'} · relErrMax ${p ? formatSig(p.relErrMax, 3) : '—'}
        </span>
        <button class="small" @click=${this.savePng} ?disabled=${!p} aria-label="Save the time series of probe ${p?.name ?? ''} as PNG">PNG</button>
      </div>
      <div class="plot" role="img" aria-label="${this.names.field} against time at probe ${p?.name ?? ''}: FDTD, exact and their difference"></div>
      <p class="note muted">Legend: values under the pointer, or at the FDTD peak.</p>
    `;
  }

  protected hasData(): boolean {
    return this.probe !== undefined;
  }

  protected dataChanged(changed: PropertyValues<this>): boolean {
    return changed.has('probe') || changed.has('dt');
  }

  protected data(): uPlot.AlignedData {
    const p = this.probe as ProbeResult;
    const n = p.fdtd.length;
    const t = new Float64Array(n);
    const exact: (number | null)[] = new Array(n);
    const diff: (number | null)[] = new Array(n);
    for (let k = 0; k < n; k++) {
      t[k] = k * this.dt;
      const e = p.exact[k];
      const ok = Number.isFinite(e);
      exact[k] = ok ? e : null;
      diff[k] = ok ? p.fdtd[k] - e : null;
    }
    return [t, p.fdtd, exact, diff] as unknown as uPlot.AlignedData;
  }

  protected options(width: number, palette: () => Palette): uPlot.Options {
    return {
      width: Math.max(200, width || 480), height: HEIGHT,
      scales: { x: { time: false } },
      axes: [siAxis(palette, 't', 's', 'x'), siAxis(palette, this.names.field, this.names.unit, 'y')],
      series: [
        { label: 't', value: (_u, v) => (v === null ? '—' : formatSI(v, 's', 4)) },
        series({ label: 'FDTD', colour: () => palette().fdtd, width: 2 }),
        series({ label: 'exact', colour: () => palette().exact, dash: [6, 4], width: 1.5 }),
        series({ label: 'FDTD − exact', colour: () => palette().difference, width: 1 }),
      ],
      ...restingLegend((u) => peakIndex(u, 1)),
      cursor: { drag: { x: true, y: false } },
    };
  }

  private async savePng(): Promise<void> {
    if (!this.chart || !this.probe) return;
    saveBlob(`timeseries-${fileSafe(this.probe.name)}.png`, await chartsPng([this.chart], palettes[this.theme], `${this.names.field} at probe ${this.probe.name}: FDTD, exact, difference`));
  }
}

declare global {
  interface HTMLElementTagNameMap { 'gg-timeseries-chart': GgTimeseriesChart }
}
