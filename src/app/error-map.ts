import { css, html, LitElement, type PropertyValues } from 'lit';
import { customElement, property, query, state } from 'lit/decorators.js';
import type { ErrorMap } from '../compare/error-map.ts';
import { formatSI, formatSig } from '../scenario/units.ts';
import type { Scenario } from '../scenario/types.ts';
import { LUT_SIZE, sequentialLut } from './colormap.ts';
import { canvasesToPng, saveBlob } from './download.ts';
import { drawAbsorberOutline, drawMarkers, fitCanvasToGrid, gridMapStyles, GridGeometry, paintColourBar, paintGrid } from './grid-drawing.ts';
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
  if (values.length < 2) return [-80, 0];
  values.sort((a, b) => a - b);
  const lo = Math.floor(values[Math.floor(0.02 * (values.length - 1))] / 5) * 5;
  const hi = Math.ceil(values[Math.ceil(0.98 * (values.length - 1))] / 5) * 5;
  return hi > lo ? [lo, hi] : [lo, lo + 5];
}

/**
 * |FDTD/exact − 1| in dB over the whole grid at one frequency, from the run's full-grid
 * running DFT: dispersion anisotropy shows as error rising faster along the axes than the
 * diagonals, absorber reflections as ripples. Dark is small error, bright is large.
 */
@customElement('gg-error-map')
export class GgErrorMap extends LitElement {
  static styles = [controlStyles, gridMapStyles, css`
    .legend .muted { white-space: normal; }
    .note { font-size: 0.8rem; margin: 0.25rem 0 0; min-height: 1.2em; }
  `];

  @property({ attribute: false }) map: ErrorMap | undefined;
  /** The scenario of the run that made the map. */
  @property({ attribute: false }) scenario: Scenario | undefined;
  /** Analysis frequencies of the scenario being edited, Hz, and the one chosen for the next map. */
  @property({ attribute: false }) frequencies: number[] = [];
  @property({ type: Number }) chosen = 0;
  @property() theme: ThemeName = 'light';

  @state() private range = 0;
  /** The colour range drawn, dB. */
  private shownRange: [number, number] = [-80, 0];

  @query('canvas.map') private canvas!: HTMLCanvasElement;
  @query('canvas.bar') private bar!: HTMLCanvasElement;
  @query('.readout') private readout!: HTMLElement;

  private sizer: ResizeObserver | undefined;
  private scratch: { canvas?: HTMLCanvasElement; image?: ImageData } = {};
  private drawRequested = false;

  render() {
    const next = this.frequencies[this.chosen];
    const differs = this.map && next !== undefined && next !== this.map.f_Hz;
    return html`
      <div class="tools">
        <label>Map at
          <select aria-label="Frequency of the error map (used by the next run)" ?disabled=${this.frequencies.length === 0}
            @change=${(e: Event) => this.dispatchEvent(new CustomEvent('gg-map-frequency', { detail: { index: Number((e.target as HTMLSelectElement).value) }, bubbles: true, composed: true }))}>
            ${this.frequencies.map((f, k) => html`<option value=${k} ?selected=${k === this.chosen}>${formatSI(f, 'Hz')}</option>`)}
          </select>
        </label>
        <label>Range
          <select aria-label="Range of the error colour scale" @change=${(e: Event) => { this.range = Number((e.target as HTMLSelectElement).value); }}>
            ${RANGES.map((r) => html`<option value=${r} ?selected=${r === this.range}>${r === 0 ? 'fit to the interior' : `−${r} dB to 0 dB`}</option>`)}
          </select>
        </label>
        <button class="small" @click=${this.savePng} ?disabled=${!this.map} aria-label="Save the error map as PNG">PNG</button>
      </div>
      <div class="stage">
        <canvas class="map" role="img" aria-label=${this.map ? `Error map at ${formatSI(this.map.f_Hz, 'Hz')}: |FDTD/exact − 1| in dB over the grid` : 'Error map, empty until a run finishes'}
          @pointermove=${this.onMove} @pointerleave=${() => { if (this.readout) this.readout.textContent = '\u00a0'; }}></canvas>
      </div>
      <div class="legend">
        <span class="num lo"></span><canvas class="bar" width="256" height="1" aria-hidden="true"></canvas><span class="num hi"></span>
        <span class="muted">|FDTD/exact − 1|${this.map ? ` at ${formatSI(this.map.f_Hz, 'Hz')}` : ''}; absorber grey</span>
      </div>
      <p class="readout muted num">\u00a0</p>
      ${this.frequencies.length === 0 ? html`<p class="note muted">Add an analysis frequency in Set-up to get an error map.</p>` : ''}
      ${differs ? html`<p class="note muted">The next run maps ${formatSI(next as number, 'Hz')}.</p>` : ''}
    `;
  }

  protected firstUpdated(): void {
    this.sizer = new ResizeObserver(() => this.fitCanvas());
    this.sizer.observe(this.renderRoot.querySelector('.stage') as HTMLElement);
    paintColourBar(this.bar, sequentialLut());
  }

  disconnectedCallback(): void {
    super.disconnectedCallback();
    this.sizer?.disconnect();
    this.sizer = undefined;
  }

  protected updated(changed: PropertyValues<this>): void {
    if (changed.has('scenario')) this.fitCanvas();
    this.requestDraw();
  }

  private fitCanvas(): void {
    if (fitCanvasToGrid(this.renderRoot.querySelector('.stage'), this.canvas, this.scenario)) this.requestDraw();
  }

  private requestDraw(): void {
    if (this.drawRequested) return;
    this.drawRequested = true;
    requestAnimationFrame(() => {
      this.drawRequested = false;
      this.draw();
    });
  }

  private draw(): void {
    if (!this.canvas) return;
    const ctx = this.canvas.getContext('2d') as CanvasRenderingContext2D;
    const palette = palettes[this.theme];
    const m = this.map;
    const s = this.scenario;
    if (!m || !s || m.nx !== s.grid.nx || m.ny !== s.grid.ny) {
      ctx.fillStyle = palette.raised;
      ctx.fillRect(0, 0, this.canvas.width, this.canvas.height);
      ctx.fillStyle = palette.muted;
      ctx.font = `${13 * (window.devicePixelRatio || 1)}px system-ui, sans-serif`;
      ctx.textAlign = 'center';
      ctx.fillText('The error map appears when a run finishes', this.canvas.width / 2, this.canvas.height / 2);
      return;
    }
    const lut = sequentialLut();
    const [lo, hi] = (this.shownRange = this.range === 0 ? fittedRange(m, s.absorber.cells) : [-this.range, 0]);
    const loText = this.renderRoot.querySelector('.legend .lo');
    const hiText = this.renderRoot.querySelector('.legend .hi');
    if (loText && hiText) { loText.textContent = `${formatSig(lo, 3)} dB`; hiText.textContent = `${formatSig(hi, 3)} dB`; }
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
    drawMarkers(ctx, g, s, palette, dpr);
  }

  private onMove = (e: PointerEvent) => {
    const m = this.map;
    const s = this.scenario;
    if (!m || !s || !this.readout) return;
    const r = this.canvas.getBoundingClientRect();
    const g = GridGeometry.of(s, r.width, r.height);
    const [i, j] = g.toNode(e.clientX - r.left, e.clientY - r.top);
    if (i < 0 || j < 0 || i >= m.nx || j >= m.ny) return;
    const v = m.db[j * m.nx + i];
    const cells = s.absorber.cells;
    const inAbsorber = i < cells || j < cells || i > m.nx - 1 - cells || j > m.ny - 1 - cells;
    this.readout.textContent = `node (${i}, ${j}) · x = ${formatSI(i * s.grid.dx, 'm', 4)}, y = ${formatSI(j * s.grid.dy, 'm', 4)} · `
      + (inAbsorber ? 'in the absorber (not compared)' : `error ${Number.isFinite(v) ? `${formatSig(v, 3)} dB` : 'undefined (source node)'}`);
  };

  private async savePng(): Promise<void> {
    if (!this.map) return;
    const p = palettes[this.theme];
    saveBlob('error-map.png', await canvasesToPng([this.canvas], p.surface, p.ink, `|FDTD/exact − 1| at ${formatSI(this.map.f_Hz, 'Hz')}, ${formatSig(this.shownRange[0], 3)} dB to ${formatSig(this.shownRange[1], 3)} dB`));
  }
}

declare global {
  interface HTMLElementTagNameMap { 'gg-error-map': GgErrorMap }
}
