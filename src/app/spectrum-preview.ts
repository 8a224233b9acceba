import { css, html, type PropertyValues } from 'lit';
import { customElement, property } from 'lit/decorators.js';
import { cAbs } from '../exact/complex.ts';
import { waveformBand, waveformSpectrum } from '../scenario/waveforms.ts';
import { formatSI } from '../scenario/units.ts';
import type { Waveform } from '../scenario/types.ts';
import { controlStyles, type Palette } from './theme.ts';
import { SingleChartElement } from './single-chart.ts';
import { series, siAxis, uPlot, uplotStyles } from './uplot-kit.ts';

const HEIGHT = 130;
const POINTS = 240;

/**
 * The source spectrum |I(f)| (|M(f)| for TEz's magnetic current) in dB below its peak, with
 * the centre frequency f0 and the −40 dB band edge marked: the band the grid has to resolve.
 */
@customElement('gg-spectrum-preview')
export class GgSpectrumPreview extends SingleChartElement {
  static styles = [controlStyles, uplotStyles, css`
    :host { display: block; }
    .plot { min-height: ${HEIGHT}px; }
    p { font-size: 0.8rem; margin: 0.2rem 0 0; }
  `];

  @property({ attribute: false }) waveform: Waveform | undefined;
  /** The source's symbol: I, or M in TEz. */
  @property() source = 'I';
  protected readonly chartHeight = HEIGHT;

  protected updated(changed: PropertyValues<this>): void {
    if (changed.has('source')) this.destroyChart();
    super.updated(changed);
  }
  private marks = { f0: NaN, edge: NaN };

  render() {
    const w = this.waveform;
    return html`
      <div class="plot" role="img" aria-label="Source spectrum with the centre frequency and the −40 dB band edge marked"></div>
      <p class="muted num">${w
        ? html`f0 ${formatSI(this.marks.f0, 'Hz')} · −40 dB edge ${formatSI(this.marks.edge, 'Hz')}`
        : 'Fix the waveform fields to see its spectrum.'}</p>
    `;
  }

  protected willUpdate(changed: PropertyValues<this>): void {
    if (changed.has('waveform') && this.waveform) {
      const band = waveformBand(this.waveform);
      this.marks = { f0: this.waveform.kind === 'gaussian' ? band.peakHz : this.waveform.f0, edge: band.edgeHz };
    }
  }

  protected hasData(): boolean {
    return this.waveform !== undefined;
  }

  protected dataChanged(changed: PropertyValues<this>): boolean {
    return changed.has('waveform');
  }

  protected data(): uPlot.AlignedData {
    const w = this.waveform as Waveform;
    const top = 1.3 * this.marks.edge;
    const f = new Float64Array(POINTS);
    const mag = new Float64Array(POINTS);
    let peak = 0;
    for (let k = 0; k < POINTS; k++) {
      f[k] = (top * k) / (POINTS - 1);
      mag[k] = cAbs(waveformSpectrum(w, 1, f[k]));
      peak = Math.max(peak, mag[k]);
    }
    const db: (number | null)[] = Array.from(mag, (m) => (m > 0 ? Math.max(-80, 20 * Math.log10(m / peak)) : -80));
    return [f, db] as unknown as uPlot.AlignedData;
  }

  protected options(width: number, palette: () => Palette): uPlot.Options {
    return {
      width: Math.max(180, width || 300), height: HEIGHT,
      legend: { show: false },
      cursor: { show: false },
      scales: { x: { time: false }, y: { range: [-80, 3] } },
      axes: [siAxis(palette, 'f', 'Hz', 'x'), { ...siAxis(palette, `|${this.source}(f)| (dB)`, '', 'y'), size: 44 }],
      series: [{}, series({ label: `|${this.source}(f)|`, colour: () => palette().fdtd, width: 1.5 })],
      hooks: {
        draw: [(u) => {
          const ctx = u.ctx;
          const p = palette();
          ctx.save();
          ctx.lineWidth = 1.5 * devicePixelRatio;
          ctx.setLineDash([4 * devicePixelRatio, 3 * devicePixelRatio]);
          for (const [f, colour] of [[this.marks.f0, p.exact], [this.marks.edge, p.predicted]] as const) {
            if (!Number.isFinite(f)) continue;
            const x = u.valToPos(f, 'x', true);
            ctx.strokeStyle = colour;
            ctx.beginPath();
            ctx.moveTo(x, u.bbox.top);
            ctx.lineTo(x, u.bbox.top + u.bbox.height);
            ctx.stroke();
          }
          ctx.restore();
        }],
      },
    };
  }
}

declare global {
  interface HTMLElementTagNameMap { 'gg-spectrum-preview': GgSpectrumPreview }
}
