import { css, html, type PropertyValues } from 'lit';
import { customElement, property } from 'lit/decorators.js';
import type { ChartSeries, StudyChart } from '../studies/definition.ts';
import { formatSig } from '../scenario/units.ts';
import { SingleChartElement } from './single-chart.ts';
import type { Palette, ThemeName } from './theme.ts';
import { logTickLabels } from './axis-ticks.ts';
import { fullestIndex, restingLegend, series, siAxis, uPlot, uplotStyles } from './uplot-kit.ts';

const CHART_HEIGHT = 240;
/** Colours for numbered curves, cycled (mid tones that read on both themes). */
const CURVE_COLOURS = ['#1f77b4', '#d62728', '#2ca02c', '#9467bd', '#8c564b', '#e377c2', '#17becf', '#bcbd22'];

function colourOf(s: ChartSeries, palette: () => Palette): () => string {
  const c = s.colour;
  if (typeof c === 'number') return () => CURVE_COLOURS[c % CURVE_COLOURS.length];
  if (c === undefined) return () => palette().fdtd;
  return () => palette()[c];
}

/**
 * An axis on a logarithmic scale: the roundest ticks (1, 2, 5 × 10^k first) are labelled
 * as long as their labels keep apart, so a scale spanning less than a decade still reads.
 */
function logAxis(palette: () => Palette, name: string, scaleKey: string): uPlot.Axis {
  const horizontal = scaleKey === 'x';
  return {
    ...siAxis(palette, name, '', scaleKey),
    // uPlot's own log filter blanks all but 1 × 10^k while the plot is still being sized;
    // every split reaches `values`, which picks the labels.
    filter: (_u: uPlot, splits: number[]) => splits,
    values: (u: uPlot, splits: number[]) => {
      // Pixel positions from the scale and the chart's size: the plot box is not settled
      // yet while uPlot sizes its axes, so it cannot be asked.
      const { min, max } = u.scales[scaleKey];
      const lo = Math.log10(min ?? splits[0]);
      const span = Math.log10(max ?? splits[splits.length - 1]) - lo || 1;
      const length = horizontal ? u.width - 90 : u.height - 70;
      const show = logTickLabels(splits, splits.map((v) => ((Math.log10(v) - lo) / span) * length), horizontal ? 34 : 16);
      return splits.map((v, k) => (show[k] ? formatSig(v, 3) : ''));
    },
  };
}

/** uPlot wants one x array: the union of the series' x values, each series null where it has none. */
export function alignChart(spec: StudyChart): uPlot.AlignedData {
  const xs = [...new Set(spec.series.flatMap((s) => s.x))].sort((a, b) => a - b);
  const at = new Map(xs.map((x, k) => [x, k]));
  const columns = spec.series.map((s) => {
    const col: (number | null)[] = new Array(xs.length).fill(null);
    s.x.forEach((x, k) => { col[at.get(x) as number] = s.y[k]; });
    return col;
  });
  return [xs, ...columns] as unknown as uPlot.AlignedData;
}

/**
 * One chart of a study, drawn from the study's own description (src/studies/definition.ts
 * `StudyChart`): axes, curves, markers and limit lines; the legend shows every series with
 * its value at the cursor.
 */
@customElement('gg-study-chart')
export class GgStudyChart extends SingleChartElement {
  static styles = [uplotStyles, css`
    :host { display: block; min-width: 0; }
    h3 { font-size: 0.9rem; margin: 0 0 0.3rem; }
    .plot { min-height: ${CHART_HEIGHT}px; overflow: hidden; }
    .uplot { font-family: var(--gg-font); }
    .u-legend { font-size: 0.78rem; color: var(--gg-ink); }
  `];

  @property({ attribute: false }) spec: StudyChart | undefined;
  @property() declare theme: ThemeName;

  protected readonly chartHeight = CHART_HEIGHT;
  private shape = '';

  protected hasData(): boolean { return !!this.spec && this.spec.series.some((s) => s.x.length > 0); }
  protected dataChanged(changed: PropertyValues<this>): boolean { return changed.has('spec'); }
  protected data(): uPlot.AlignedData { return alignChart(this.spec as StudyChart); }

  protected updated(changed: PropertyValues<this>): void {
    // a different set of series needs a new chart, not new data
    const shape = this.spec ? this.spec.series.map((s) => s.label).join('|') : '';
    if (shape !== this.shape) this.destroyChart();
    this.shape = shape;
    super.updated(changed);
  }

  protected options(width: number, palette: () => Palette): uPlot.Options {
    const spec = this.spec as StudyChart;
    const axis = (a: StudyChart['x'], key: string) => (a.log ? logAxis(palette, a.label, key) : siAxis(palette, a.label, a.unit ?? '', key));
    return {
      width: Math.max(240, width || 480),
      height: CHART_HEIGHT,
      scales: {
        x: { time: false, ...(spec.x.log ? { distr: 3, range: (_u: uPlot, min: number, max: number) => [min / 1.05, max * 1.05] as [number, number] } : {}) },
        ...(spec.y.log ? { y: { distr: 3 } } : {}),
      },
      axes: [axis(spec.x, 'x'), axis(spec.y, 'y')],
      series: [
        { label: spec.x.label, value: (_u: uPlot, v: number | null) => (v === null ? '—' : formatSig(v, 4)) },
        ...spec.series.map((s): uPlot.Series => {
          const colour = colourOf(s, palette);
          if (s.style === 'points') return { ...series({ label: s.label, colour, points: true }), paths: () => null, points: { show: true, size: 7, stroke: colour, fill: colour } };
          return { ...series({ label: s.label, colour, ...(s.style === 'dashed' ? { dash: [6, 4], width: 1 } : {}) }), spanGaps: true };
        }),
      ],
      ...restingLegend(fullestIndex),
    };
  }

  render() {
    return html`<h3>${this.spec?.title ?? ''}</h3><div class="plot" role="img" aria-label=${this.spec?.title ?? 'study chart'}></div>`;
  }
}


declare global {
  interface HTMLElementTagNameMap { 'gg-study-chart': GgStudyChart }
}
