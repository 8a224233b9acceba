/**
 * Editing the scenario's markers on a grid map with the pointer and the keyboard: a click
 * adds a probe, a drag from empty space draws a probe line, a drag from a marker moves it;
 * N selects the next marker, the arrows move it (Shift: ten cells), A adds a probe, Delete
 * removes the selected probe or line. Edits go out through `emit` as SI positions snapped
 * to interior nodes; the map only paints what `moving` and `drawing` report.
 */
import type { ReactiveController, ReactiveControllerHost } from 'lit';
import { newProbeSpot } from '../scenario/readouts.ts';
import type { Scenario } from '../scenario/types.ts';
import { freshName, type Edit } from './draft.ts';
import { GridGeometry, markersOf, sameMarker, type MarkerRef } from './grid-drawing.ts';

/** Pointer travel, CSS px, that turns a click into a drag. */
const DRAG_START = 6;
/** Pick radius around a marker, CSS px. */
const PICK = 10;

type Drag =
  | { kind: 'pending'; x0: number; y0: number }
  | { kind: 'move'; ref: MarkerRef; x: number; y: number }
  | { kind: 'new-line'; x0: number; y0: number; x: number; y: number };

/** What the editor needs from the map it works on. */
export interface MarkerEditorHost extends ReactiveControllerHost, HTMLElement {
  readonly scenario: Scenario | undefined;
  /** The map canvas (device-pixel sized). */
  readonly mapCanvas: HTMLCanvasElement | undefined;
  emitEdits(edits: Edit[]): void;
  /** Repaint the map (markers moved, a line is being drawn, the pointer moved). */
  redraw(): void;
  /** Say something to screen-reader users (a marker selected, a probe added). */
  announce(text: string): void;
}

export class MarkerEditor implements ReactiveController {
  selected: MarkerRef | undefined;
  /** Where the pointer is over the map, CSS px from its top-left corner. */
  pointer: [number, number] | undefined;
  private drag: Drag | undefined;

  constructor(private readonly host: MarkerEditorHost) {
    host.addController(this);
  }

  /** A marker being dragged, at its new position (m). */
  get moving(): { ref: MarkerRef; x: number; y: number } | undefined {
    const d = this.drag;
    return d?.kind === 'move' ? { ref: d.ref, x: d.x, y: d.y } : undefined;
  }

  /** A probe line being drawn, from (x0, y0) to (x, y), m. */
  get drawing(): { x0: number; y0: number; x: number; y: number } | undefined {
    const d = this.drag;
    return d?.kind === 'new-line' ? d : undefined;
  }

  private geometry(): GridGeometry | undefined {
    const c = this.host.mapCanvas;
    const s = this.host.scenario;
    return c && s ? GridGeometry.of(s, c.width, c.height) : undefined;
  }

  private local(e: PointerEvent): [number, number] {
    const r = (this.host.mapCanvas as HTMLCanvasElement).getBoundingClientRect();
    return [e.clientX - r.left, e.clientY - r.top];
  }

  private pick(cssX: number, cssY: number): MarkerRef | undefined {
    const g = this.geometry();
    const s = this.host.scenario;
    if (!g || !s) return undefined;
    const dpr = window.devicePixelRatio || 1;
    let best: MarkerRef | undefined;
    let bestDist = PICK * dpr;
    for (const m of markersOf(s)) {
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

  readonly onPointerDown = (e: PointerEvent) => {
    const s = this.host.scenario;
    if (!s || e.button !== 0 || !this.host.mapCanvas) return;
    const [cx, cy] = this.local(e);
    this.host.mapCanvas.setPointerCapture(e.pointerId);
    const hit = this.pick(cx, cy);
    if (hit) {
      const m = markersOf(s).find((k) => sameMarker(k.ref, hit));
      this.selected = hit;
      this.drag = { kind: 'move', ref: hit, x: m?.x ?? 0, y: m?.y ?? 0 };
    } else {
      this.drag = { kind: 'pending', x0: cx, y0: cy };
    }
  };

  readonly onPointerMove = (e: PointerEvent) => {
    if (!this.host.mapCanvas) return;
    const [cx, cy] = this.local(e);
    this.pointer = [cx, cy];
    const d = this.drag;
    if (!d) {
      this.host.mapCanvas.classList.toggle('grab', this.pick(cx, cy) !== undefined);
    } else if (d.kind === 'pending') {
      if (Math.hypot(cx - d.x0, cy - d.y0) < DRAG_START) return;
      const [x0, y0] = this.position(d.x0, d.y0);
      const [x, y] = this.position(cx, cy);
      this.drag = { kind: 'new-line', x0, y0, x, y };
    } else {
      const [x, y] = this.position(cx, cy);
      this.drag = { ...d, x, y };
    }
    this.host.redraw();
  };

  readonly onPointerUp = (e: PointerEvent) => {
    const d = this.drag;
    this.drag = undefined;
    const s = this.host.scenario;
    if (!d || !s) return;
    if (d.kind === 'pending') {
      const [x, y] = this.position(...this.local(e));
      this.addProbe(s, x, y);
    } else if (d.kind === 'new-line') {
      const name = freshName('line ', s.lines.map((l) => l.name));
      this.selected = { kind: 'line-end', index: s.lines.length, end: 1 };
      this.host.emitEdits([{ path: ['lines'], value: [...s.lines, { name, x0: d.x0, y0: d.y0, x1: d.x, y1: d.y }] }]);
    } else {
      this.host.emitEdits(moveEdits(d.ref, d.x, d.y));
    }
    this.host.redraw();
  };

  readonly onPointerCancel = () => {
    this.drag = undefined;
    this.host.redraw();
  };

  readonly onPointerLeave = () => {
    this.pointer = undefined;
    this.host.redraw();
  };

  private addProbe(s: Scenario, x: number, y: number): string {
    const name = freshName('p', s.probes.map((p) => p.name));
    this.selected = { kind: 'probe', index: s.probes.length };
    this.host.emitEdits([{ path: ['probes'], value: [...s.probes, { name, x, y }] }]);
    return name;
  }

  readonly onKey = (e: KeyboardEvent) => {
    const s = this.host.scenario;
    const g = this.geometry();
    if (!s || !g) return;
    const markers = markersOf(s);
    const key = e.key;
    if (key === 'n' || key === 'N') {
      const k = markers.findIndex((m) => sameMarker(m.ref, this.selected));
      const next = markers[(k + (e.shiftKey ? markers.length - 1 : 1)) % markers.length];
      this.selected = next.ref;
      this.host.announce(`${next.label} selected`);
    } else if (key === 'a' || key === 'A') {
      const [x, y] = g.nudge(...newProbeSpot(s), 0, 0);
      this.host.announce(`probe ${this.addProbe(s, x, y)} added`);
    } else if (key.startsWith('Arrow') && this.selected) {
      const m = markers.find((k) => sameMarker(k.ref, this.selected));
      if (!m) return;
      const step = e.shiftKey ? 10 : 1;
      const di = key === 'ArrowRight' ? step : key === 'ArrowLeft' ? -step : 0;
      const dj = key === 'ArrowUp' ? step : key === 'ArrowDown' ? -step : 0;
      this.host.emitEdits(moveEdits(m.ref, ...g.nudge(m.x, m.y, di, dj)));
    } else if ((key === 'Delete' || key === 'Backspace') && this.selected && this.selected.kind !== 'source') {
      const ref = this.selected;
      this.selected = undefined;
      if (ref.kind === 'probe') this.host.emitEdits([{ path: ['probes'], value: s.probes.filter((_p, k) => k !== ref.index) }]);
      else this.host.emitEdits([{ path: ['lines'], value: s.lines.filter((_l, k) => k !== ref.index) }]);
    } else {
      return;
    }
    e.preventDefault();
    this.host.redraw();
  };

  hostConnected(): void {}
  hostDisconnected(): void { this.drag = undefined; }
}

/** The edits that put a marker at (x, y), m. */
function moveEdits(ref: MarkerRef, x: number, y: number): Edit[] {
  if (ref.kind === 'source') return [{ path: ['source', 'x'], value: x }, { path: ['source', 'y'], value: y }];
  if (ref.kind === 'probe') return [{ path: ['probes', ref.index, 'x'], value: x }, { path: ['probes', ref.index, 'y'], value: y }];
  const [kx, ky] = ref.end === 0 ? ['x0', 'y0'] : ['x1', 'y1'];
  return [{ path: ['lines', ref.index, kx], value: x }, { path: ['lines', ref.index, ky], value: y }];
}
