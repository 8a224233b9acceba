import { css, html, type PropertyValues } from 'lit';
import { customElement, property } from 'lit/decorators.js';
import { formatSI } from '../scenario/units.ts';
import type { PermittivityCurves } from './permittivity-curves.ts';
import { SingleChartElement } from './single-chart.ts';
import { controlStyles, type Palette } from './theme.ts';
import { restingLegend, series, siAxis, uPlot, uplotStyles } from './uplot-kit.ts';

const HEIGHT = 200;

/**
 * εr(ω) of the medium over the pulse's band: real and imaginary parts of the medium's own
 * permittivity (solid orange, as the exact field elsewhere) beside the scheme's discrete
 * ε̃r(ω) at the run's time step (blue, as FDTD), with f0 marked. Where the two part, the
 * grid carries a different medium than the one asked for.
 */
@customElement('gg-permittivity-chart')
export class GgPermittivityChart extends SingleChartElement {
  static styles = [controlStyles, uplotStyles, css`
    :host { display: block; }
    .plot { min-height: ${HEIGHT}px; }
    .u-legend { font-size: 0.78rem; color: var(--gg-ink); }
    p { font-size: 0.78rem; margin: 0.2rem 0 0; }
  `];

  @property({ attribute: false }) curves: PermittivityCurves | undefined;
  protected readonly chartHeight = HEIGHT;

  render() {
    const c = this.curves;
    return html`
      <div class="plot" role="img" aria-label="Relative permittivity of the medium against frequency, real and imaginary parts, exact and as the grid carries it"></div>
      <p class="muted">${c ? html`0 to the −40 dB band edge ${formatSI(c.edge_Hz, 'Hz')}, f0 ${formatSI(c.f0_Hz, 'Hz')} dashed. ε̃r is the scheme's own permittivity at this dt; Im εr < 0 is loss (e<sup>+jωt</sup>). Legend at f0 unless pointed.` : ''}</p>
    `;
  }

  protected hasData(): boolean {
    return this.curves !== undefined;
  }

  protected dataChanged(changed: PropertyValues<this>): boolean {
    return changed.has('curves');
  }

  protected data(): uPlot.AlignedData {
    const c = this.curves as PermittivityCurves;
    return [c.f_Hz, c.mediumRe, c.mediumIm, c.schemeRe, c.schemeIm] as unknown as uPlot.AlignedData;
  }

  /** The sample nearest f0. */
  private f0Index(): number | null {
    const c = this.curves;
    if (!c || !(c.f0_Hz > 0)) return null;
    const step = c.f_Hz[1] - c.f_Hz[0];
    return Math.min(c.f_Hz.length - 1, Math.max(1, Math.round(c.f0_Hz / step)));
  }

  protected options(width: number, palette: () => Palette): uPlot.Options {
    const legend = restingLegend(() => this.f0Index());
    return {
      width: Math.max(180, width || 300), height: HEIGHT,
      scales: { x: { time: false }, y: { range: () => this.curves?.range ?? [0, 1] } },
      axes: [siAxis(palette, 'f', 'Hz', 'x'), { ...siAxis(palette, 'εr', '', 'y'), size: 48 }],
      series: [
        { label: 'f', value: (_u, v) => (v === null ? '—' : formatSI(v, 'Hz', 4)) },
        series({ label: 'Re εr', colour: () => palette().exact, width: 2 }),
        series({ label: 'Im εr', colour: () => palette().exact, dash: [6, 4], width: 1.5 }),
        series({ label: 'Re ε̃r grid', colour: () => palette().fdtd, width: 1.5 }),
        series({ label: 'Im ε̃r grid', colour: () => palette().fdtd, dash: [2, 3], width: 1.5 }),
      ],
      legend: legend.legend,
      cursor: { drag: { x: false, y: false } },
      hooks: {
        ...legend.hooks,
        draw: [(u) => {
          const f0 = this.curves?.f0_Hz;
          if (!(f0 !== undefined && f0 > 0)) return;
          const x = u.valToPos(f0, 'x', true);
          const ctx = u.ctx;
          ctx.save();
          ctx.strokeStyle = palette().predicted;
          ctx.lineWidth = 1.5 * devicePixelRatio;
          ctx.setLineDash([4 * devicePixelRatio, 3 * devicePixelRatio]);
          ctx.beginPath();
          ctx.moveTo(x, u.bbox.top);
          ctx.lineTo(x, u.bbox.top + u.bbox.height);
          ctx.stroke();
          ctx.restore();
        }],
      },
    };
  }
}

declare global {
  interface HTMLElementTagNameMap { 'gg-permittivity-chart': GgPermittivityChart }
}
