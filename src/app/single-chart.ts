import { LitElement, type PropertyValues } from 'lit';
import { property } from 'lit/decorators.js';
import { ResizeController, TeardownController } from './controllers.ts';
import { palettes, type Palette, type ThemeName } from './theme.ts';
import { fitCharts, uPlot } from './uplot-kit.ts';

/**
 * A component that shows one uPlot chart in its `.plot` element: the chart is made once
 * (and again when the theme changes, since colours are baked in), later data goes through
 * `setData`, it follows its host's width, and it is destroyed when the component leaves.
 */
export abstract class SingleChartElement extends LitElement {
  @property() theme: ThemeName = 'light';

  protected chart: uPlot | undefined;

  /** Chart height, px. */
  protected abstract readonly chartHeight: number;
  /** Whether there is anything to draw. */
  protected abstract hasData(): boolean;
  /** Whether a change of properties means new data for the chart. */
  protected abstract dataChanged(changed: PropertyValues<this>): boolean;
  protected abstract data(): uPlot.AlignedData;
  /** uPlot options for a chart `width` px wide in the current theme. */
  protected abstract options(width: number, palette: () => Palette): uPlot.Options;

  constructor() {
    super();
    new ResizeController(this, () => this.renderRoot.querySelector('.plot'), (rect) => fitCharts([this.chart], rect.width, this.chartHeight));
    new TeardownController(this, () => this.destroyChart());
  }

  protected updated(changed: PropertyValues<this>): void {
    if (changed.has('theme')) this.destroyChart();
    if (!this.hasData()) return;
    if (!this.chart) this.create();
    else if (this.dataChanged(changed)) this.chart.setData(this.data());
  }

  protected destroyChart(): void {
    this.chart?.destroy();
    this.chart = undefined;
  }

  private create(): void {
    const host = this.renderRoot.querySelector('.plot') as HTMLElement;
    const width = Math.floor(host.getBoundingClientRect().width);
    this.chart = new uPlot(this.options(width, () => palettes[this.theme]), this.data(), host);
  }
}
