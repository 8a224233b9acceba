import { css, html, LitElement, type PropertyValues } from 'lit';
import { customElement, property, query, state } from 'lit/decorators.js';
import { formatSI } from '../scenario/units.ts';
import type { Scenario } from '../scenario/types.ts';
import { cssColour, divergingIndex, divergingLut, LUT_SIZE } from './colormap.ts';
import { fileSafe, canvasesToPng, saveBlob } from './download.ts';
import type { Edit } from './draft.ts';
import { freshName } from './draft.ts';
import {
  drawAbsorberOutline, drawMarkers, fitCanvasToGrid, gridMapStyles, GridGeometry, markersOf, paintColourBar, paintGrid, sameMarker, type MarkerRef,
} from './grid-drawing.ts';
import type { ShownFrame } from './store.ts';
import { controlStyles, palettes, type ThemeName } from './theme.ts';

/** Where Ez frames come from (the store). */
export interface FrameSource {
  readonly frame: ShownFrame | undefined;
  /** Every frame of the current or last run, oldest first. */
  readonly film: readonly ShownFrame[];
  onFrame(listen: (f: ShownFrame | undefined) => void): () => void;
}

/** Dynamic range of the dB scale. */
const DB_RANGE = 80;
/** Pointer travel, CSS px, that turns a click into a drag. */
const DRAG_START = 6;
/** Pick radius around a marker, CSS px. */
const PICK = 10;

type Drag =
  | { kind: 'pending'; x0: number; y0: number }
  | { kind: 'move'; ref: MarkerRef; x: number; y: number }
  | { kind: 'new-line'; x0: number; y0: number; x: number; y: number };

/**
 * Ez over the whole grid as a heat map (diverging colours, symmetric about zero, linear or
 * dB), with the absorber outline, source, probes and lines. Click adds a probe, dragging
 * from empty space draws a probe line, dragging a marker moves it; the keyboard does the
 * same. Edits go up as `gg-edit` events; frames are drawn in requestAnimationFrame.
 */
@customElement('gg-field-view')
export class GgFieldView extends LitElement {
  static styles = [controlStyles, gridMapStyles, css`
    canvas.map { touch-action: none; cursor: crosshair; }
    canvas.map.grab { cursor: grab; }
    .legend .scale-label { white-space: normal; }
    .keys { font-size: 0.75rem; margin: 0.2rem 0 0; }
    kbd { font-family: var(--gg-mono); font-size: 0.72rem; border: 1px solid var(--gg-border); border-radius: 3px; padding: 0 0.25rem; }
  `];

  /** The scenario whose grid and markers are shown (the latest valid one). */
  @property({ attribute: false }) scenario: Scenario | undefined;
  @property({ attribute: false }) frames: FrameSource | undefined;
  @property() theme: ThemeName = 'light';
  /** True while a run is stepping: the view follows the live frames. */
  @property({ type: Boolean }) running = false;

  @state() private scale: 'linear' | 'db' = 'linear';
  /** Index into the film of the frame shown after a run; undefined follows the newest frame. */
  @state() private viewIndex: number | undefined;
  @state() private playing = false;
  @state() private selected: MarkerRef | undefined;

  @query('canvas.map') private canvas!: HTMLCanvasElement;
  @query('canvas.bar') private bar!: HTMLCanvasElement;
  @query('.readout') private readout!: HTMLElement;
  @query('.scale-label') private scaleLabel!: HTMLElement;

  private unsubscribe: (() => void) | undefined;
  private sizer: ResizeObserver | undefined;
  private frameRequested = false;
  private scratch: { canvas?: HTMLCanvasElement; image?: ImageData } = {};
  private drag: Drag | undefined;
  private pointerAt: [number, number] | undefined;
  /** The linear colour scale last drawn, V/m. */
  private linearScale = 0;
  private playTimer: ReturnType<typeof setInterval> | undefined;

  render() {
    return html`
      <div class="tools">
        <label>Scale
          <select aria-label="Colour scale of the field" @change=${(e: Event) => { this.scale = (e.target as HTMLSelectElement).value as 'linear' | 'db'; }}>
            <option value="linear" ?selected=${this.scale === 'linear'}>linear</option>
            <option value="db" ?selected=${this.scale === 'db'}>dB (${DB_RANGE} dB range)</option>
          </select>
        </label>
        <button class="small" @click=${this.savePng} aria-label="Save the field picture as PNG">PNG</button>
        ${this.replayControls()}
      </div>
      <div class="stage">
        <canvas class="map" tabindex="0" role="application"
          aria-label="Ez field map. Click to add a probe, drag to draw a probe line, drag a marker to move it. Keys: N selects the next marker, arrows move it, A adds a probe, Delete removes the selected probe or line."
          @pointerdown=${this.onPointerDown} @pointermove=${this.onPointerMove} @pointerup=${this.onPointerUp}
          @pointercancel=${() => { this.drag = undefined; this.requestDraw(); }}
          @pointerleave=${() => { this.pointerAt = undefined; this.updateReadout(); }}
          @keydown=${this.onKey}></canvas>
      </div>
      <div class="legend">
        <span class="num" data-end="low">−</span><canvas class="bar" width="256" height="1" aria-hidden="true"></canvas><span class="num" data-end="high">+</span>
        <span class="scale-label muted num"></span>
      </div>
      <p class="readout muted num" aria-live="off"></p>
      <p class="keys muted">Click: add probe · drag: draw line · drag a marker: move it · keys <kbd>N</kbd> next marker, arrows move (<kbd>Shift</kbd> ×10), <kbd>A</kbd> add probe, <kbd>Delete</kbd> remove</p>
    `;
  }

  private replayControls() {
    const film = this.frames?.film ?? [];
    if (this.running || film.length < 2) return '';
    const index = this.viewIndex ?? film.length - 1;
    return html`
      <label>Step <span class="num">${film[index]?.step ?? ''}</span>
        <input type="range" min="0" max=${film.length - 1} .value=${String(index)} aria-label="Frame of the last run to show"
          aria-valuetext="step ${film[index]?.step ?? ''}"
          @input=${(e: Event) => { this.stopPlaying(); this.viewIndex = Number((e.target as HTMLInputElement).value); }} />
      </label>
      <button class="small" @click=${() => (this.playing ? this.stopPlaying() : this.play(0, film.length - 1))}>${this.playing ? 'Stop replay' : 'Replay'}</button>`;
  }

  /** Steps through the film from `from` to `to` at about 24 frames a second. */
  private play(from: number, to: number): void {
    this.stopPlaying();
    this.playing = true;
    this.viewIndex = from;
    this.playTimer = setInterval(() => {
      const next = (this.viewIndex ?? from) + 1;
      if (next > to) { this.stopPlaying(); return; }
      this.viewIndex = next;
    }, 42);
  }

  private stopPlaying(): void {
    clearInterval(this.playTimer);
    this.playTimer = undefined;
    this.playing = false;
  }

  /**
   * The most telling frame of a finished run: the last one before the absorber has taken
   * a quarter of the wave (Σ Ez² below 75 % of its largest value), when the wave front
   * spans most of the grid.
   */
  private telling(): number {
    const film = this.frames?.film ?? [];
    let top = 0;
    for (const f of film) top = Math.max(top, f.sumSquares);
    let best = film.length - 1;
    let seenTop = false;
    for (let k = 0; k < film.length; k++) {
      if (film[k].sumSquares === top) seenTop = true;
      if (seenTop && film[k].sumSquares >= 0.75 * top) best = k;
      if (seenTop && film[k].sumSquares < 0.75 * top) break;
    }
    return best;
  }

  connectedCallback(): void {
    super.connectedCallback();
    this.subscribe();
  }

  disconnectedCallback(): void {
    super.disconnectedCallback();
    this.stopPlaying();
    this.unsubscribe?.();
    this.unsubscribe = undefined;
    this.sizer?.disconnect();
    this.sizer = undefined;
  }

  protected firstUpdated(): void {
    this.sizer = new ResizeObserver(() => this.fitCanvas());
    this.sizer.observe(this.renderRoot.querySelector('.stage') as HTMLElement);
  }

  protected willUpdate(changed: PropertyValues<this>): void {
    if (!changed.has('running')) return;
    if (this.running) {
      this.stopPlaying();
      this.viewIndex = undefined;
    } else if (changed.get('running') === true && (this.frames?.film.length ?? 0) > 1) {
      // The run is over: replay it up to its most telling frame, which then stays.
      this.play(0, this.telling());
    }
  }

  protected updated(changed: PropertyValues<this>): void {
    if (changed.has('frames')) this.subscribe();
    if (changed.has('theme')) this.paintBar();
    if (changed.has('scenario')) this.fitCanvas();
    this.requestDraw();
  }

  private subscribe(): void {
    this.unsubscribe?.();
    this.unsubscribe = this.frames?.onFrame((f) => {
      if (!f) { this.stopPlaying(); this.viewIndex = undefined; }
      this.requestDraw();
    });
  }

  private fitCanvas(): void {
    if (this.scenario && fitCanvasToGrid(this.renderRoot.querySelector('.stage'), this.canvas, this.scenario)) this.requestDraw();
  }

  private paintBar(): void {
    if (this.bar) paintColourBar(this.bar, divergingLut(this.theme));
  }

  private requestDraw(): void {
    if (this.frameRequested) return;
    this.frameRequested = true;
    requestAnimationFrame(() => {
      this.frameRequested = false;
      this.draw();
    });
  }

  private geometry(): GridGeometry | undefined {
    if (!this.scenario || !this.canvas) return undefined;
    return GridGeometry.of(this.scenario, this.canvas.width, this.canvas.height);
  }

  /** The frame shown, if it belongs to a grid of the shown size. */
  private usableFrame(): ShownFrame | undefined {
    const film = this.frames?.film ?? [];
    const f = this.viewIndex !== undefined && !this.running ? film[this.viewIndex] : this.frames?.frame;
    const s = this.scenario;
    if (!f || !s) return undefined;
    if (Math.ceil(s.grid.nx / f.stride) !== f.width || Math.ceil(s.grid.ny / f.stride) !== f.height) return undefined;
    return f;
  }

  private draw(): void {
    const g = this.geometry();
    if (!g) return;
    if (!this.bar?.dataset.painted) {
      this.paintBar();
      if (this.bar) this.bar.dataset.painted = '1';
    }
    const ctx = this.canvas.getContext('2d') as CanvasRenderingContext2D;
    const palette = palettes[this.theme];
    const dpr = window.devicePixelRatio || 1;
    const frame = this.usableFrame();
    const lut = divergingLut(this.theme);
    if (frame) {
      // Scales from the run so far: a late, nearly empty frame is not blown up to full scale.
      const film = this.frames?.film ?? [];
      let runRobust = 0;
      let peakSoFar = frame.peak;
      for (const f of film) {
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
    const d = this.drag;
    const moved = d?.kind === 'move' ? { ref: d.ref, x: d.x, y: d.y } : undefined;
    drawMarkers(ctx, g, this.scenario as Scenario, palette, dpr, moved, this.selected);
    if (d?.kind === 'new-line') {
      const a = g.toPixel(d.x0, d.y0);
      const b = g.toPixel(d.x, d.y);
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
    this.updateReadout();
  }

  private setScaleText(label: string, low: string, high: string): void {
    if (this.scaleLabel) this.scaleLabel.textContent = label;
    const ends = this.renderRoot.querySelectorAll<HTMLElement>('.legend [data-end]');
    if (ends.length === 2) {
      ends[0].textContent = low;
      ends[1].textContent = high;
    }
  }

  private updateReadout(): void {
    if (!this.readout) return;
    const g = this.geometry();
    if (!g || !this.pointerAt) {
      this.readout.textContent = '\u00a0';
      return;
    }
    const dpr = window.devicePixelRatio || 1;
    const [i, j] = g.toNode(this.pointerAt[0] * dpr, this.pointerAt[1] * dpr);
    if (i < 0 || j < 0 || i >= g.nx || j >= g.ny) return;
    let text = `node (${i}, ${j}) · x = ${formatSI(i * g.dx, 'm', 4)}, y = ${formatSI(j * g.dy, 'm', 4)}`;
    const f = this.usableFrame();
    if (f) {
      const v = f.data[Math.floor(j / f.stride) * f.width + Math.floor(i / f.stride)];
      text += ` · Ez = ${formatSI(v, 'V/m', 3)} at step ${f.step}`;
    }
    if (i < g.cells || j < g.cells || i > g.nx - 1 - g.cells || j > g.ny - 1 - g.cells) text += ' · in the absorber';
    this.readout.textContent = text;
  }

  // ---- editing ----

  private emit(edits: Edit[]): void {
    this.dispatchEvent(new CustomEvent('gg-edit', { detail: { edits }, bubbles: true, composed: true }));
  }

  private local(e: PointerEvent): [number, number] {
    const r = this.canvas.getBoundingClientRect();
    return [e.clientX - r.left, e.clientY - r.top];
  }

  private pick(cssX: number, cssY: number): MarkerRef | undefined {
    const g = this.geometry();
    if (!g || !this.scenario) return undefined;
    const dpr = window.devicePixelRatio || 1;
    let best: MarkerRef | undefined;
    let bestDist = PICK * dpr;
    for (const m of markersOf(this.scenario)) {
      const [px, py] = g.toPixel(m.x, m.y);
      const d = Math.hypot(px - cssX * dpr, py - cssY * dpr);
      if (d <= bestDist) { best = m.ref; bestDist = d; }
    }
    return best;
  }

  private position(cssX: number, cssY: number): [number, number] {
    const dpr = window.devicePixelRatio || 1;
    return (this.geometry() as GridGeometry).toInteriorPosition(cssX * dpr, cssY * dpr);
  }

  private onPointerDown = (e: PointerEvent) => {
    if (!this.scenario || e.button !== 0) return;
    const [cx, cy] = this.local(e);
    this.canvas.setPointerCapture(e.pointerId);
    const hit = this.pick(cx, cy);
    if (hit) {
      const m = markersOf(this.scenario).find((k) => sameMarker(k.ref, hit));
      this.selected = hit;
      this.drag = { kind: 'move', ref: hit, x: m?.x ?? 0, y: m?.y ?? 0 };
    } else {
      this.drag = { kind: 'pending', x0: cx, y0: cy };
    }
  };

  private onPointerMove = (e: PointerEvent) => {
    const [cx, cy] = this.local(e);
    this.pointerAt = [cx, cy];
    const d = this.drag;
    if (!d) {
      this.canvas.classList.toggle('grab', this.pick(cx, cy) !== undefined);
      this.updateReadout();
      return;
    }
    if (d.kind === 'pending') {
      if (Math.hypot(cx - d.x0, cy - d.y0) < DRAG_START) return;
      const [x0, y0] = this.position(d.x0, d.y0);
      const [x, y] = this.position(cx, cy);
      this.drag = { kind: 'new-line', x0, y0, x, y };
    } else {
      const [x, y] = this.position(cx, cy);
      this.drag = { ...d, x, y };
    }
    this.requestDraw();
  };

  private onPointerUp = (e: PointerEvent) => {
    const d = this.drag;
    this.drag = undefined;
    if (!d || !this.scenario) return;
    const s = this.scenario;
    if (d.kind === 'pending') {
      const [x, y] = this.position(...this.local(e));
      const name = freshName('p', s.probes.map((p) => p.name));
      this.selected = { kind: 'probe', index: s.probes.length };
      this.emit([{ path: ['probes'], value: [...s.probes, { name, x, y }] }]);
    } else if (d.kind === 'new-line') {
      const name = freshName('line ', s.lines.map((l) => l.name));
      this.selected = { kind: 'line-end', index: s.lines.length, end: 1 };
      this.emit([{ path: ['lines'], value: [...s.lines, { name, x0: d.x0, y0: d.y0, x1: d.x, y1: d.y }] }]);
    } else {
      this.emit(this.moveEdits(d.ref, d.x, d.y));
    }
    this.requestDraw();
  };

  private moveEdits(ref: MarkerRef, x: number, y: number): Edit[] {
    if (ref.kind === 'source') return [{ path: ['source', 'x'], value: x }, { path: ['source', 'y'], value: y }];
    if (ref.kind === 'probe') return [{ path: ['probes', ref.index, 'x'], value: x }, { path: ['probes', ref.index, 'y'], value: y }];
    const [kx, ky] = ref.end === 0 ? ['x0', 'y0'] : ['x1', 'y1'];
    return [{ path: ['lines', ref.index, kx], value: x }, { path: ['lines', ref.index, ky], value: y }];
  }

  private onKey = (e: KeyboardEvent) => {
    const s = this.scenario;
    const g = this.geometry();
    if (!s || !g) return;
    const markers = markersOf(s);
    const key = e.key;
    if (key === 'n' || key === 'N') {
      const k = markers.findIndex((m) => sameMarker(m.ref, this.selected));
      const next = markers[(k + (e.shiftKey ? markers.length - 1 : 1)) % markers.length];
      this.selected = next.ref;
      this.announce(`${next.label} selected`);
    } else if (key === 'a' || key === 'A') {
      const [x, y] = g.nudge(s.source.x, s.source.y, Math.round((g.nx - 2 * g.cells) / 6), 0);
      const name = freshName('p', s.probes.map((p) => p.name));
      this.selected = { kind: 'probe', index: s.probes.length };
      this.emit([{ path: ['probes'], value: [...s.probes, { name, x, y }] }]);
      this.announce(`probe ${name} added`);
    } else if (key.startsWith('Arrow') && this.selected) {
      const m = markers.find((k) => sameMarker(k.ref, this.selected));
      if (!m) return;
      const step = e.shiftKey ? 10 : 1;
      const di = key === 'ArrowRight' ? step : key === 'ArrowLeft' ? -step : 0;
      const dj = key === 'ArrowUp' ? step : key === 'ArrowDown' ? -step : 0;
      const [x, y] = g.nudge(m.x, m.y, di, dj);
      this.emit(this.moveEdits(m.ref, x, y));
    } else if ((key === 'Delete' || key === 'Backspace') && this.selected && this.selected.kind !== 'source') {
      const ref = this.selected;
      this.selected = undefined;
      if (ref.kind === 'probe') this.emit([{ path: ['probes'], value: s.probes.filter((_p, k) => k !== ref.index) }]);
      else this.emit([{ path: ['lines'], value: s.lines.filter((_l, k) => k !== ref.index) }]);
    } else {
      return;
    }
    e.preventDefault();
    this.requestDraw();
  }

  private announce(text: string): void {
    if (this.readout) this.readout.textContent = text;
  }

  private async savePng(): Promise<void> {
    if (!this.canvas) return;
    const f = this.usableFrame();
    const p = palettes[this.theme];
    const title = `Ez${f ? ` at step ${f.step}` : ''}, ${this.scale === 'db' ? `dB scale (${DB_RANGE} dB)` : `linear scale ±${formatSI(this.linearScale, 'V/m')}`}`;
    saveBlob(`field-${fileSafe(this.scale)}.png`, await canvasesToPng([this.canvas], p.surface, p.ink, title));
  }
}

declare global {
  interface HTMLElementTagNameMap { 'gg-field-view': GgFieldView }
}
