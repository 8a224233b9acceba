import { css, html, LitElement, nothing, type PropertyValues } from 'lit';
import { customElement, property, query, state } from 'lit/decorators.js';
import { colourRangeDb, type ErrorMap } from '../compare/error-map.ts';
import { exactKind } from '../compare/reference.ts';
import { formatSI, formatSig } from '../scenario/units.ts';
import type { Scenario } from '../scenario/types.ts';
import { LUT_SIZE, sequentialLut } from './colormap.ts';
import { AnimationFrameController, ResizeController } from './controllers.ts';
import { canvasesToPng, saveBlob } from './download.ts';
import { drawAbsorberOutline, drawMarkers, fitCanvasToGrid, gridMapStyles, GridGeometry, paintColourBar, paintGrid } from './grid-drawing.ts';
import { mapMenu } from './map-plan.ts';
import { drawObjects, objectNameAnchors } from './object-drawing.ts';
import { lengthText, mapWithAxes, paintAxesCanvas } from './map-axes.ts';
import { controlStyles, palettes, type ThemeName } from './theme.ts';

/** Fixed colour ranges, dB below 0 dB; 0 stands for "fit to the interior's values". */
const RANGES = [0, 40, 60, 80, 100];

/** The 2nd and 98th percentiles of the interior's finite values, widened to 5 dB steps. */
function fittedRange(m: ErrorMap, cells: number): [number, number] {
  const values: number[] = [];
  const step = Math.max(1, Math.floor(Math.sqrt((m.nx * m.ny) / 40_000)));
  for (let j = cells; j < m.ny - cells; j += step) {
    for (let i = cells; i < m.nx - cells; i += step) {
      const v = m.db[j * m.nx + i];
      if (Number.isFinite(v)) values.push(v);
    }
  }
  return colourRangeDb(values);
}

/**
 * |FDTD/exact − 1| in dB over the whole grid at one analysis frequency, from the run's
 * full-grid running DFTs: dispersion anisotropy shows as error rising faster along the axes
 * than the diagonals, absorber reflections as ripples. Dark is small error, bright is large.
 * The scenario's objects are outlined over it.
 * The menu switches between the maps the last run made; a frequency without one says the
 * next run maps it, and the picture is never of another frequency than the one named.
 */
@customElement('gg-error-map')
export class GgErrorMap extends LitElement {
  static styles = [controlStyles, gridMapStyles, css`
    .legend .muted { white-space: normal; }
    .note { font-size: 0.8rem; margin: 0.25rem 0 0; }
  `];

  /** The maps of the last run, one per mapped frequency. */
  @property({ attribute: false }) maps: ErrorMap[] = [];
  /** The scenario of the run that made the maps. */
  @property({ attribute: false }) scenario: Scenario | undefined;
  /** Analysis frequencies of the scenario being edited, Hz. */
  @property({ attribute: false }) frequencies: number[] = [];
  /** Frequencies the next run will map, Hz (undefined while the set-up is wrong). */
  @property({ attribute: false }) nextRun: number[] | undefined;
  /** The frequency chosen in the menu, Hz (undefined: the first map). */
  @property({ type: Number }) chosen: number | undefined;
  @property() lengthUnit = 'mm';
  @property() theme: ThemeName = 'light';

  @state() private range = 0;
  /** The colour range drawn, dB. */
  private shownRange: [number, number] = [-80, 0];

  @query('canvas.map') private canvas!: HTMLCanvasElement;
  @query('canvas.axes') private axes!: HTMLCanvasElement;
  @query('canvas.bar') private bar!: HTMLCanvasElement;
  @query('.readout') private readout!: HTMLElement;

  private scratch: { canvas?: HTMLCanvasElement; image?: ImageData } = {};
  private readonly painter = new AnimationFrameController(this, () => this.draw());

  constructor() {
    super();
    new ResizeController(this, () => this.renderRoot.querySelector('.stage'), () => this.fitCanvas());
  }

  private get menu() {
    return mapMenu(this.maps, this.frequencies, this.nextRun, this.chosen);
  }

  render() {
    const { options, shown, map } = this.menu;
    const fHz = shown?.f_Hz;
    return html`
      <div class="tools">
        <label>Map at
          <select aria-label="Frequency of the error map" ?disabled=${options.length === 0}
            @change=${(e: Event) => this.dispatchEvent(new CustomEvent('gg-map-frequency', { detail: { hz: Number((e.target as HTMLSelectElement).value) }, bubbles: true, composed: true }))}>
            ${options.map((o) => html`<option value=${o.f_Hz} ?selected=${o.f_Hz === fHz}>${o.label}</option>`)}
          </select>
        </label>
        <label>Range
          <select aria-label="Range of the error colour scale" @change=${(e: Event) => { this.range = Number((e.target as HTMLSelectElement).value); }}>
            ${RANGES.map((r) => html`<option value=${r} ?selected=${r === this.range}>${r === 0 ? 'fit to the interior' : `−${r} dB to 0 dB`}</option>`)}
          </select>
        </label>
        <button class="small" @click=${this.savePng} ?disabled=${!map} aria-label="Save the error map as PNG">PNG</button>
      </div>
      <div class="stage">
        <canvas class="map" role="img" aria-label=${map ? `Error map at ${formatSI(map.f_Hz, 'Hz')}: |FDTD/exact − 1| in dB over the grid` : 'Error map, empty until a run maps this frequency'}
          @pointermove=${this.onMove} @pointerleave=${() => this.setReadout()}></canvas>
        <canvas class="axes" aria-hidden="true"></canvas>
      </div>
      <div class="legend">
        <span class="num lo"></span><canvas class="bar" width="256" height="1" aria-hidden="true"></canvas><span class="num hi"></span>
        <span class="muted">|FDTD/exact − 1|${map ? ` at ${formatSI(map.f_Hz, 'Hz')}` : ''}; absorber grey</span>
      </div>
      <p class="readout muted num"></p>
      ${this.frequencies.length === 0 && this.maps.length === 0 ? html`<p class="note muted">Add an analysis frequency in Set-up to get an error map.</p>` : nothing}
      ${shown && !map ? html`<p class="note muted" data-note="next-run">${shown.note}</p>` : nothing}
      ${this.scenario && exactKind(this.scenario) === 'none' ? html`<p class="note muted" data-note="no-exact">No exact reference for these objects, so the map has no errors to show: use the convergence study.</p>` : nothing}
    `;
  }

  protected firstUpdated(): void {
    paintColourBar(this.bar, sequentialLut());
    this.setReadout();
  }

  protected updated(changed: PropertyValues<this>): void {
    if (changed.has('scenario')) this.fitCanvas();
    this.painter.request();
  }

  private fitCanvas(): void {
    if (fitCanvasToGrid(this.renderRoot.querySelector('.stage'), this.canvas, this.scenario)) this.painter.request();
  }

  private draw(): void {
    if (!this.canvas) return;
    const ctx = this.canvas.getContext('2d') as CanvasRenderingContext2D;
    const palette = palettes[this.theme];
    const { shown, map: m } = this.menu;
    const s = this.scenario;
    if (!m || !s || m.nx !== s.grid.nx || m.ny !== s.grid.ny) {
      this.setReadout();
      ctx.fillStyle = palette.raised;
      ctx.fillRect(0, 0, this.canvas.width, this.canvas.height);
      ctx.fillStyle = palette.muted;
      ctx.font = `${13 * (window.devicePixelRatio || 1)}px system-ui, sans-serif`;
      ctx.textAlign = 'center';
      const text = shown ? `No map at ${formatSI(shown.f_Hz, 'Hz')} yet` : 'The error map appears when a run finishes';
      ctx.fillText(text, this.canvas.width / 2, this.canvas.height / 2);
      this.setRangeText('', '');
      if (s && this.axes) paintAxesCanvas(this.axes, this.canvas, s.grid, this.lengthUnit, palette);
      return;
    }
    const lut = sequentialLut();
    const [lo, hi] = (this.shownRange = this.range === 0 ? fittedRange(m, s.absorber.cells) : [-this.range, 0]);
    this.setRangeText(`${formatSig(lo, 3)} dB`, `${formatSig(hi, 3)} dB`);
    const scale = (LUT_SIZE - 1) / (hi - lo);
    const grey = this.theme === 'dark' ? 0x3a4248 : 0xc9ced1;
    const missing = (255 << 24) | ((grey & 255) << 16) | (grey & 0xff00) | (grey >>> 16);
    // Inside the absorber the field is damped on purpose, so its "error" says nothing:
    // those nodes are greyed, leaving the colour range to the interior.
    const cells = s.absorber.cells;
    const shaded = new Float32Array(m.db);
    for (let j = 0; j < m.ny; j++) {
      for (let i = 0; i < m.nx; i++) {
        if (i < cells || j < cells || i > m.nx - 1 - cells || j > m.ny - 1 - cells) shaded[j * m.nx + i] = NaN;
      }
    }
    paintGrid(ctx, this.scratch, shaded, m.nx, m.ny, (v) => {
      if (!Number.isFinite(v)) return missing;
      const k = Math.round((v - lo) * scale);
      return lut[k < 0 ? 0 : k > LUT_SIZE - 1 ? LUT_SIZE - 1 : k];
    });
    const g = GridGeometry.of(s, this.canvas.width, this.canvas.height);
    const dpr = window.devicePixelRatio || 1;
    drawAbsorberOutline(ctx, g, palette, dpr);
    drawObjects(ctx, g, s.objects ?? [], palette, dpr);
    drawMarkers(ctx, g, s, palette, dpr, undefined, undefined, objectNameAnchors(g, s.objects ?? []));
    if (this.axes) paintAxesCanvas(this.axes, this.canvas, s.grid, this.lengthUnit, palette);
  }

  private setRangeText(lo: string, hi: string): void {
    const loText = this.renderRoot.querySelector('.legend .lo');
    const hiText = this.renderRoot.querySelector('.legend .hi');
    if (loText && hiText) { loText.textContent = lo; hiText.textContent = hi; }
  }

  private setReadout(text = 'Point at the map for x, y and the error there.'): void {
    if (this.readout) this.readout.textContent = text;
  }

  private onMove = (e: PointerEvent) => {
    const m = this.menu.map;
    const s = this.scenario;
    if (!m || !s) return;
    const r = this.canvas.getBoundingClientRect();
    const g = GridGeometry.of(s, r.width, r.height);
    const [i, j] = g.toNode(e.clientX - r.left, e.clientY - r.top);
    if (i < 0 || j < 0 || i >= m.nx || j >= m.ny) return;
    const v = m.db[j * m.nx + i];
    const cells = s.absorber.cells;
    const inAbsorber = i < cells || j < cells || i > m.nx - 1 - cells || j > m.ny - 1 - cells;
    this.setReadout(`x = ${lengthText(i * s.grid.dx, this.lengthUnit)}, y = ${lengthText(j * s.grid.dy, this.lengthUnit)} · `
      + (inAbsorber ? 'in the absorber (not compared)' : `error ${Number.isFinite(v) ? `${formatSig(v, 3)} dB` : 'undefined (source node)'}`)
      + ` · node (${i}, ${j})`);
  };

  private async savePng(): Promise<void> {
    const m = this.menu.map;
    if (!m || !this.scenario) return;
    const p = palettes[this.theme];
    const picture = mapWithAxes(this.canvas, this.scenario.grid, this.lengthUnit, p);
    saveBlob('error-map.png', await canvasesToPng([picture], p.surface, p.ink, `|FDTD/exact − 1| at ${formatSI(m.f_Hz, 'Hz')}, ${formatSig(this.shownRange[0], 3)} dB to ${formatSig(this.shownRange[1], 3)} dB`));
  }
}

declare global {
  interface HTMLElementTagNameMap { 'gg-error-map': GgErrorMap }
}
