import { css, html, LitElement, type PropertyValues } from 'lit';
import { customElement, property, query, state } from 'lit/decorators.js';
import { formatSI } from '../scenario/units.ts';
import type { Scenario } from '../scenario/types.ts';
import { cssColour, divergingIndex, divergingLut, LUT_SIZE } from './colormap.ts';
import { AnimationFrameController, ResizeController, TimeoutController } from './controllers.ts';
import { canvasesToPng, fileSafe, saveBlob } from './download.ts';
import type { Edit } from './draft.ts';
import { FilmPlayer, type FrameSource } from './film-player.ts';
import type { Box } from './label-placement.ts';
import { drawAbsorberOutline, drawMarkers, fitCanvasToGrid, gridMapStyles, GridGeometry, paintColourBar, paintGrid } from './grid-drawing.ts';
import { lengthText, mapWithAxes, paintAxesCanvas } from './map-axes.ts';
import { fieldNames } from '../scenario/field-names.ts';
import { MarkerEditor } from './marker-editor.ts';
import { drawObjects, objectNameAnchors } from './object-drawing.ts';
import { ObjectEditor } from './object-editor.ts';
import { drawableObject, type ObjectShape } from './object-shapes.ts';
import type { ShownFrame } from './store.ts';
import { controlStyles, palettes, type ThemeName } from './theme.ts';

export type { FrameSource } from './film-player.ts';

/** Dynamic range of the dB scale. */
const DB_RANGE = 80;
/** Share of the main thread that live pictures may take while a run steps (the rest is the engine's). */
const LIVE_PAINT_SHARE = 0.05;
/** Longest wait between two live pictures, ms. */
const LIVE_PAINT_MAX_GAP_MS = 200;

/** What the pointer does on the map: edit the markers, or draw and edit objects of a shape. */
type Tool = 'markers' | ObjectShape;

const TOOLS: { tool: Tool; label: string }[] = [
  { tool: 'markers', label: 'Probes & lines' }, { tool: 'circle', label: 'Circle' },
  { tool: 'rectangle', label: 'Rectangle' }, { tool: 'polygon', label: 'Polygon' },
];

const OBJECT_KEYS = 'keys <N> next object, arrows move it (<Shift> ×10), <+> <−> resize, <A> add, <Delete> remove, <Esc> let go';
const HINTS: Record<Tool, string> = {
  markers: 'Click: add probe · drag: draw line · drag a marker: move it · keys <N> next marker, arrows move (<Shift> ×10), <A> add probe, <Delete> remove',
  circle: `Drag from a centre outwards: new circle · drag an object: move it · drag a handle: resize · ${OBJECT_KEYS}`,
  rectangle: `Drag corner to corner: new rectangle · drag an object: move it · drag a corner: resize · ${OBJECT_KEYS}`,
  polygon: `Click the vertices, double-click or <Enter> to close · drag an object: move it · drag a vertex: reshape · ${OBJECT_KEYS}`,
};

/** A hint with its <key> names set as keys. */
function hintText(text: string) {
  return text.split(/(<[^>]+>)/).map((part) => (part.startsWith('<') ? html`<kbd>${part.slice(1, -1)}</kbd>` : part));
}

/**
 * The field (Ez in TMz, Hz in TEz) over the whole grid as a heat map (diverging colours,
 * symmetric about zero, linear or dB) with x and y axes in the chosen length unit, the
 * absorber outline, the objects, source, probes and lines. Replay is the FilmPlayer's job,
 * editing the markers the MarkerEditor's and the objects the ObjectEditor's (the tool row
 * picks which has the pointer); this component paints. Edits go up as `gg-edit` events; frames are drawn in requestAnimationFrame.
 */
@customElement('gg-field-view')
export class GgFieldView extends LitElement {
  static styles = [controlStyles, gridMapStyles, css`
    canvas.map { touch-action: none; cursor: crosshair; }
    canvas.map.grab { cursor: grab; }
    .tools.draw { gap: 0.3rem; }
    .tools.draw button[aria-pressed='true'] { border-color: var(--gg-accent); box-shadow: inset 0 -2px 0 var(--gg-accent); font-weight: 600; }
    .legend .scale-label { white-space: normal; }
    .keys { font-size: 0.75rem; margin: 0.2rem 0 0; }
    kbd { font-family: var(--gg-mono); font-size: 0.72rem; border: 1px solid var(--gg-border); border-radius: 3px; padding: 0 0.25rem; }
  `];

  /** The scenario whose grid and markers are shown (the latest valid one). */
  @property({ attribute: false }) scenario: Scenario | undefined;
  @property({ attribute: false }) frames: FrameSource | undefined;
  @property() theme: ThemeName = 'light';
  /** Unit of the axes and the readout: m, mm or µm. */
  @property() lengthUnit = 'mm';
  /** True while a run is stepping: the view follows the live frames. */
  @property({ type: Boolean }) running = false;
  /** The draft's objects as they stand, outlined over the map (some may not be drawable yet). */
  @property({ attribute: false }) objects: readonly unknown[] = [];
  /** Indices of objects the scenario model found wrong. */
  @property({ attribute: false }) faultyObjects: ReadonlySet<number> = new Set();

  @state() private scale: 'linear' | 'db' = 'linear';
  @state() private tool: Tool = 'markers';

  @query('canvas.map') private canvas!: HTMLCanvasElement;
  @query('canvas.axes') private axes!: HTMLCanvasElement;
  @query('canvas.bar') private bar!: HTMLCanvasElement;
  @query('.readout') private readout!: HTMLElement;
  @query('.scale-label') private scaleLabel!: HTMLElement;

  private readonly player = new FilmPlayer(this, () => this.frames, () => this.painter.request());
  private readonly editor = new MarkerEditor(this);
  private readonly shapes = new ObjectEditor(this);
  private readonly painter = new AnimationFrameController(this, () => this.draw());
  private scratch: { canvas?: HTMLCanvasElement; image?: ImageData } = {};
  /** The linear colour scale last drawn, V/m. */
  private linearScale = 0;
  /** The marker names last drawn and where (canvas px), for checking that none collide. */
  labels: { text: string; box: Box }[] = [];
  /** Pictures painted and the main-thread milliseconds they took (read by the page benchmark). */
  readonly paintStats = { count: 0, ms: 0 };
  /** The frame last painted and when (performance.now(), ms). */
  private lastPainted: { frame?: ShownFrame; at: number } = { at: -Infinity };
  private readonly liveTimer = new TimeoutController(this);

  constructor() {
    super();
    new ResizeController(this, () => this.renderRoot.querySelector('.stage'), () => this.fitCanvas());
  }

  get mapCanvas(): HTMLCanvasElement | undefined { return this.canvas ?? undefined; }
  emitEdits(edits: Edit[]): void { this.dispatchEvent(new CustomEvent('gg-edit', { detail: { edits }, bubbles: true, composed: true })); }
  redraw(): void { this.painter.request(); }
  announce(text: string): void { if (this.readout) this.readout.textContent = text; }

  private setTool(tool: Tool): void {
    this.tool = tool;
    this.shapes.reset();
    if (tool !== 'markers') this.shapes.tool = tool;
  }

  private readonly onPointerMove = (ev: PointerEvent) => {
    if (this.tool === 'markers') { this.editor.onPointerMove(ev); return; }
    const r = this.canvas.getBoundingClientRect();
    this.editor.pointer = [ev.clientX - r.left, ev.clientY - r.top];
    this.shapes.onPointerMove(ev);
  };

  private readonly onKey = (ev: KeyboardEvent) => {
    if (this.tool === 'markers') this.editor.onKey(ev);
    else this.shapes.onKey(ev);
  };

  render() {
    const e = this.editor;
    const o = this.shapes;
    const markers = this.tool === 'markers';
    const f = fieldNames(this.scenario?.polarization).field;
    return html`
      <div class="tools draw" role="group" aria-label="What the pointer does on the map">
        ${TOOLS.map((t) => html`<button class="small" aria-pressed=${this.tool === t.tool ? 'true' : 'false'} @click=${() => this.setTool(t.tool)}>${t.label}</button>`)}
      </div>
      <div class="tools">
        <label>Scale
          <select aria-label="Colour scale of the field" @change=${(ev: Event) => { this.scale = (ev.target as HTMLSelectElement).value as 'linear' | 'db'; }}>
            <option value="linear" ?selected=${this.scale === 'linear'}>linear</option>
            <option value="db" ?selected=${this.scale === 'db'}>dB (${DB_RANGE} dB range)</option>
          </select>
        </label>
        <button class="small" @click=${this.savePng} aria-label="Save the field picture as PNG">PNG</button>
        ${this.replayControls()}
      </div>
      <div class="stage">
        <canvas class="map" tabindex="0" role="application"
          aria-label="${f} field map. ${HINTS[this.tool].replace(/[<>]/g, '')}"
          @pointerdown=${markers ? e.onPointerDown : o.onPointerDown} @pointermove=${this.onPointerMove} @pointerup=${markers ? e.onPointerUp : o.onPointerUp}
          @pointercancel=${markers ? e.onPointerCancel : o.onPointerCancel} @pointerleave=${e.onPointerLeave}
          @dblclick=${o.onDoubleClick} @keydown=${this.onKey}></canvas>
        <canvas class="axes" aria-hidden="true"></canvas>
      </div>
      <div class="legend">
        <span class="num" data-end="low">−</span><canvas class="bar" width="256" height="1" aria-hidden="true"></canvas><span class="num" data-end="high">+</span>
        <span class="scale-label muted num"></span>
      </div>
      <p class="readout muted num" aria-live="off"></p>
      <p class="keys muted">${hintText(HINTS[this.tool])}</p>
    `;
  }

  private replayControls() {
    const p = this.player;
    const film = p.film;
    if (this.running || film.length < 2) return '';
    const index = p.index ?? film.length - 1;
    return html`
      <label>Step <span class="num">${film[index]?.step ?? ''}</span>
        <input type="range" min="0" max=${film.length - 1} .value=${String(index)} aria-label="Frame of the last run to show"
          aria-valuetext="step ${film[index]?.step ?? ''}" @input=${(e: Event) => p.scrub(Number((e.target as HTMLInputElement).value))} />
      </label>
      <button class="small" @click=${() => (p.playing ? p.pause() : p.play(0, film.length - 1))}>${p.playing ? 'Stop replay' : 'Replay'}</button>`;
  }

  protected willUpdate(changed: PropertyValues<this>): void {
    if (changed.has('running')) this.player.setLive(this.running);
  }

  protected updated(changed: PropertyValues<this>): void {
    if (changed.has('frames')) this.player.renew();
    if (changed.has('theme') || !this.bar?.dataset.painted) this.paintBar();
    if (changed.has('scenario')) this.fitCanvas();
    this.painter.request();
  }

  private fitCanvas(): void {
    if (this.scenario && fitCanvasToGrid(this.renderRoot.querySelector('.stage'), this.canvas, this.scenario)) this.painter.request();
  }

  private paintBar(): void {
    if (!this.bar) return;
    paintColourBar(this.bar, divergingLut(this.theme));
    this.bar.dataset.painted = '1';
  }

  /** The frame shown, if it belongs to a grid of the shown size. */
  private usableFrame(): ShownFrame | undefined {
    const f = this.player.frame;
    const s = this.scenario;
    if (!f || !s) return undefined;
    if (Math.ceil(s.grid.nx / f.stride) !== f.width || Math.ceil(s.grid.ny / f.stride) !== f.height) return undefined;
    return f;
  }

  private draw(): void {
    const t0 = performance.now();
    const frame = this.player.frame;
    // While a run steps, a new live frame waits until the pictures so far have cost at most
    // LIVE_PAINT_SHARE of the main thread: on a big grid painting shares the cores with the
    // engine's worker. Edits and replay paint at once.
    if (this.running && frame !== this.lastPainted.frame && this.paintStats.count > 0) {
      const gap = Math.min(LIVE_PAINT_MAX_GAP_MS, this.paintStats.ms / this.paintStats.count / LIVE_PAINT_SHARE);
      const wait = this.lastPainted.at + gap - t0;
      if (wait > 1) {
        this.liveTimer.once(wait, () => this.painter.request());
        return;
      }
    }
    this.paint();
    this.lastPainted = { frame, at: t0 };
    this.paintStats.count++;
    this.paintStats.ms += performance.now() - t0;
    this.player.painted(this.usableFrame());
  }

  private paint(): void {
    const s = this.scenario;
    if (!s || !this.canvas) return;
    const g = GridGeometry.of(s, this.canvas.width, this.canvas.height);
    const ctx = this.canvas.getContext('2d') as CanvasRenderingContext2D;
    const palette = palettes[this.theme];
    const dpr = window.devicePixelRatio || 1;
    const frame = this.usableFrame();
    const lut = divergingLut(this.theme);
    if (frame) {
      // Scales from the run so far: a late, nearly empty frame is not blown up to full scale.
      let runRobust = 0;
      let peakSoFar = frame.peak;
      for (const f of this.player.film) {
        runRobust = Math.max(runRobust, f.robust);
        if (f.step <= frame.step) peakSoFar = Math.max(peakSoFar, f.peak);
      }
      this.linearScale = Math.max(frame.robust, 0.05 * runRobust, 1e-30);
      if (this.scale === 'linear') {
        const inv = 1 / this.linearScale;
        paintGrid(ctx, this.scratch, frame.data, frame.width, frame.height, (v) => lut[divergingIndex(v * inv)]);
        this.setScaleText(`±${formatSI(this.linearScale, 'V/m')} at step ${frame.step}`, `−${formatSI(this.linearScale, 'V/m', 2)}`, `+${formatSI(this.linearScale, 'V/m', 2)}`);
      } else {
        const ref = peakSoFar || 1;
        const k = 20 / Math.LN10;
        paintGrid(ctx, this.scratch, frame.data, frame.width, frame.height, (v) => {
          const a = Math.abs(v);
          if (!(a > 0)) return lut[LUT_SIZE / 2];
          const level = Math.max(0, (k * Math.log(a / ref) + DB_RANGE) / DB_RANGE);
          return lut[divergingIndex(v < 0 ? -level : level)];
        });
        this.setScaleText(`dB re. the largest |Ez| so far, ${formatSI(ref, 'V/m')}; sign by colour; step ${frame.step}`, 'Ez < 0', 'Ez > 0');
      }
    } else {
      ctx.fillStyle = palette.raised;
      ctx.fillRect(0, 0, this.canvas.width, this.canvas.height);
      ctx.fillStyle = cssColour(lut[LUT_SIZE / 2]);
      ctx.globalAlpha = 0.35;
      ctx.fillRect(0, 0, this.canvas.width, this.canvas.height);
      ctx.globalAlpha = 1;
      this.setScaleText('no field yet: press Run', '−', '+');
    }
    drawAbsorberOutline(ctx, g, palette, dpr);
    const paint = this.tool === 'markers' ? {} : this.shapes.paint;
    const objects = this.objects.map(drawableObject);
    drawObjects(ctx, g, objects, palette, dpr, { ...paint, faulty: this.faultyObjects });
    this.labels = drawMarkers(ctx, g, s, palette, dpr, this.editor.moving, this.editor.selected, objectNameAnchors(g, objects));
    const line = this.editor.drawing;
    if (line) {
      const a = g.toPixel(line.x0, line.y0);
      const b = g.toPixel(line.x, line.y);
      ctx.save();
      ctx.setLineDash([6 * dpr, 4 * dpr]);
      ctx.strokeStyle = palette.focus;
      ctx.lineWidth = 2 * dpr;
      ctx.beginPath();
      ctx.moveTo(a[0], a[1]);
      ctx.lineTo(b[0], b[1]);
      ctx.stroke();
      ctx.restore();
    }
    if (this.axes) paintAxesCanvas(this.axes, this.canvas, s.grid, this.lengthUnit, palette);
    this.updateReadout(g, frame);
  }

  private setScaleText(label: string, low: string, high: string): void {
    // The painting above writes TMz's names; a TEz grid shows Hz in A/m instead.
    const names = fieldNames(this.scenario?.polarization);
    if (names.field === 'Hz') [label, low, high] = [label, low, high].map((t) => t.replace(/\bEz\b/g, 'Hz').replace(/V\/m/g, 'A/m'));
    if (this.scaleLabel) this.scaleLabel.textContent = label;
    const ends = this.renderRoot.querySelectorAll<HTMLElement>('.legend [data-end]');
    if (ends.length === 2) {
      ends[0].textContent = low;
      ends[1].textContent = high;
    }
  }

  /** x, y and the field under the pointer, in the chosen length unit. */
  private updateReadout(g: GridGeometry, f: ShownFrame | undefined): void {
    const at = this.editor.pointer;
    const names = fieldNames(this.scenario?.polarization);
    if (!this.readout) return;
    if (!at) {
      this.readout.textContent = `Point at the map for x, y and ${names.field}.`;
      return;
    }
    const dpr = window.devicePixelRatio || 1;
    const [i, j] = g.toNode(at[0] * dpr, at[1] * dpr);
    if (i < 0 || j < 0 || i >= g.nx || j >= g.ny) return;
    let text = `x = ${lengthText(i * g.dx, this.lengthUnit)}, y = ${lengthText(j * g.dy, this.lengthUnit)}`;
    if (f) text += ` · ${names.field} = ${formatSI(f.data[Math.floor(j / f.stride) * f.width + Math.floor(i / f.stride)], names.unit, 3)} at step ${f.step}`;
    text += ` · node (${i}, ${j})`;
    if (i < g.cells || j < g.cells || i > g.nx - 1 - g.cells || j > g.ny - 1 - g.cells) text += ' · in the absorber';
    this.readout.textContent = text;
  }

  private async savePng(): Promise<void> {
    if (!this.canvas || !this.scenario) return;
    const f = this.usableFrame();
    const p = palettes[this.theme];
    const names = fieldNames(this.scenario.polarization);
    const title = `${names.field}${f ? ` at step ${f.step}` : ''}, ${this.scale === 'db' ? `dB scale (${DB_RANGE} dB)` : `linear scale ±${formatSI(this.linearScale, names.unit)}`}`;
    const picture = mapWithAxes(this.canvas, this.scenario.grid, this.lengthUnit, p);
    saveBlob(`field-${fileSafe(this.scale)}.png`, await canvasesToPng([picture], p.surface, p.ink, title));
  }
}

declare global {
  interface HTMLElementTagNameMap { 'gg-field-view': GgFieldView }
}
