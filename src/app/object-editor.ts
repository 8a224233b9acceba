/**
 * Drawing and editing the scenario's objects on a grid map with the pointer and the
 * keyboard, while one of the shape tools is chosen. Pointer: a drag from empty space
 * draws the tool's shape (a circle from its centre outwards, a rectangle corner to
 * corner); with the polygon tool each click adds a vertex and a double-click, Enter or a
 * click on the first vertex closes it; a drag from an object moves it, a drag from a
 * handle of the selected object reshapes it. Keys: N selects the next object, the arrows
 * move it (Shift: ten cells), + and − grow and shrink it by a cell, A adds an object of
 * the tool's shape, Delete removes it, Escape lets go. Positions snap to nodes of the
 * interior; edits go out through `emit`, and the map only paints what `paint` reports.
 */
import type { ReactiveController, ReactiveControllerHost } from 'lit';
import { containsPoint } from '../scenario/geometry.ts';
import type { Scenario, SceneObject } from '../scenario/types.ts';
import { freshName, type Edit } from './draft.ts';
import { GridGeometry, tidy } from './grid-drawing.ts';
import { HANDLE_HALF, type ObjectPaint } from './object-drawing.ts';
import {
  drawableObject, geometryOf, grown, handlesOf, NEW_OBJECT_MATERIAL, newObject, newObjectSpot, objectLabel, objectNames, objectsValue,
  translated, withHandleAt, type ObjectShape,
} from './object-shapes.ts';

/** Pointer travel, CSS px, that turns a click into a drag. */
const DRAG_START = 6;
/** Most vertices of a polygon (README "Objects"). */
const MAX_POINTS = 64;

type Point = [number, number];

type Drag =
  | { kind: 'pending'; cx: number; cy: number; hit: number | undefined }
  | { kind: 'circle'; centre: Point; rim: Point }
  | { kind: 'rectangle'; corner: Point; opposite: Point }
  | { kind: 'move'; index: number; from: Point; to: Point }
  | { kind: 'resize'; index: number; handle: number; at: Point };

/** What the editor needs from the map it works on. */
export interface ObjectEditorHost extends ReactiveControllerHost, HTMLElement {
  /** The scenario whose grid the map shows. */
  readonly scenario: Scenario | undefined;
  /** The draft's `objects` entries as they stand (some may not be drawable yet). */
  readonly objects: readonly unknown[];
  readonly mapCanvas: HTMLCanvasElement | undefined;
  emitEdits(edits: Edit[]): void;
  redraw(): void;
  announce(text: string): void;
}

export class ObjectEditor implements ReactiveController {
  /** The shape a drag or a click on empty space makes. */
  tool: ObjectShape = 'circle';
  selected: number | undefined;
  private drag: Drag | undefined;
  /** Vertices of a polygon being drawn, m. */
  private polygon: Point[] | undefined;
  /** Where the pointer is, m (for the polygon's next edge). */
  private at: Point | undefined;

  constructor(private readonly host: ObjectEditorHost) {
    host.addController(this);
  }

  /** Whether a polygon is being drawn (Enter closes it). */
  get drawingPolygon(): boolean {
    return this.polygon !== undefined;
  }

  /** What the map paints on top of the stored objects. */
  get paint(): ObjectPaint {
    const d = this.drag;
    const out: ObjectPaint = { selected: this.selected };
    const fresh = { name: '', material: NEW_OBJECT_MATERIAL };
    if (d?.kind === 'circle') out.sketch = { object: { ...fresh, shape: 'circle', x: d.centre[0], y: d.centre[1], radius: Math.hypot(d.rim[0] - d.centre[0], d.rim[1] - d.centre[1]) } };
    if (d?.kind === 'rectangle') out.sketch = { object: { ...fresh, shape: 'rectangle', x0: d.corner[0], y0: d.corner[1], x1: d.opposite[0], y1: d.opposite[1] } };
    if (this.polygon) out.sketch = { object: { ...fresh, shape: 'polygon', points: this.polygon }, open: true, pointer: this.at };
    const o = d?.kind === 'move' || d?.kind === 'resize' ? this.objectAt(d.index) : undefined;
    if (o && d?.kind === 'move') out.moved = { index: d.index, object: translated(o, d.to[0] - d.from[0], d.to[1] - d.from[1]) };
    if (o && d?.kind === 'resize') out.moved = { index: d.index, object: withHandleAt(o, d.handle, d.at[0], d.at[1]) };
    return out;
  }

  /** Lets go of whatever is under way (the tool changed, the map was left). */
  reset(): void {
    this.drag = undefined;
    this.polygon = undefined;
    this.host.redraw();
  }

  private objectAt(k: number): SceneObject | undefined {
    return drawableObject(this.host.objects[k]);
  }

  private geometry(): GridGeometry | undefined {
    const c = this.host.mapCanvas;
    const s = this.host.scenario;
    return c && s ? GridGeometry.of(s, c.width, c.height) : undefined;
  }

  private local(e: PointerEvent | MouseEvent): Point {
    const r = (this.host.mapCanvas as HTMLCanvasElement).getBoundingClientRect();
    return [e.clientX - r.left, e.clientY - r.top];
  }

  /** The interior node nearest a CSS pixel, m. */
  private position(cx: number, cy: number): Point {
    const dpr = window.devicePixelRatio || 1;
    return (this.geometry() as GridGeometry).toInteriorPosition(cx * dpr, cy * dpr);
  }

  /** The handle of the selected object under a CSS pixel, if any. */
  private pickHandle(cx: number, cy: number): number | undefined {
    const g = this.geometry();
    const o = this.selected === undefined ? undefined : this.objectAt(this.selected);
    if (!g || !o) return undefined;
    const dpr = window.devicePixelRatio || 1;
    const reach = (HANDLE_HALF + 4) * dpr;
    const k = handlesOf(o).findIndex(([x, y]) => {
      const [px, py] = g.toPixel(x, y);
      return Math.abs(px - cx * dpr) <= reach && Math.abs(py - cy * dpr) <= reach;
    });
    return k >= 0 ? k : undefined;
  }

  /** The topmost object whose outline holds a CSS pixel, if any. */
  private pickBody(cx: number, cy: number): number | undefined {
    const g = this.geometry();
    if (!g) return undefined;
    const dpr = window.devicePixelRatio || 1;
    const x = ((cx * dpr) / g.width * g.nx - 0.5) * g.dx;
    const y = (((g.height - cy * dpr) / g.height) * g.ny - 0.5) * g.dy;
    for (let k = this.host.objects.length - 1; k >= 0; k--) {
      const o = this.objectAt(k);
      if (o && containsPoint(o, x, y)) return k;
    }
    return undefined;
  }

  private select(k: number | undefined): void {
    this.selected = k;
    if (k !== undefined) this.host.announce(`${objectLabel(this.objectAt(k), k)} selected`);
  }

  private add(o: SceneObject): void {
    const list = this.host.objects;
    this.selected = list.length;
    this.host.emitEdits([{ path: ['objects'], value: [...list, o] }]);
    this.host.announce(`${objectLabel(o, list.length)} added`);
  }

  private replace(k: number, o: SceneObject): void {
    const raw = this.host.objects[k];
    this.host.emitEdits([{ path: ['objects', k], value: { ...(raw as object), ...geometryOf(o) } }]);
  }

  private named(shape: ObjectShape): string {
    return freshName(`${shape} `, objectNames(this.host.objects));
  }

  private addVertex(p: Point): void {
    const pts = this.polygon ?? [];
    const first = pts[0];
    const last = pts[pts.length - 1];
    if (first && pts.length >= 3 && p[0] === first[0] && p[1] === first[1]) { this.closePolygon(); return; }
    if (last && p[0] === last[0] && p[1] === last[1]) return;
    this.polygon = [...pts, p];
    const n = this.polygon.length;
    this.host.announce(`vertex ${n} placed${n === 1 ? '; click for the next, Enter or a double-click closes the polygon' : ''}`);
    if (this.polygon.length >= MAX_POINTS) this.closePolygon();
  }

  /** Closes the polygon being drawn into a new object (needs three vertices). */
  closePolygon(): void {
    const pts = this.polygon;
    if (!pts) return;
    if (pts.length < 3) {
      this.host.announce('a polygon needs at least 3 vertices; click on, or press Escape to give up');
      return;
    }
    this.polygon = undefined;
    this.add({ name: this.named('polygon'), shape: 'polygon', points: pts, material: structuredClone(NEW_OBJECT_MATERIAL) });
  }

  readonly onPointerDown = (e: PointerEvent) => {
    if (!this.host.scenario || e.button !== 0 || !this.host.mapCanvas) return;
    const [cx, cy] = this.local(e);
    this.host.mapCanvas.setPointerCapture(e.pointerId);
    if (this.polygon) { this.drag = { kind: 'pending', cx, cy, hit: undefined }; return; }
    const h = this.pickHandle(cx, cy);
    const sel = this.selected;
    const o = sel === undefined ? undefined : this.objectAt(sel);
    if (h !== undefined && sel !== undefined && o) {
      const [x, y] = handlesOf(o)[h];
      this.drag = { kind: 'resize', index: sel, handle: h, at: [x, y] };
      return;
    }
    const hit = this.pickBody(cx, cy);
    if (hit !== undefined) this.select(hit);
    this.drag = { kind: 'pending', cx, cy, hit };
    this.host.redraw();
  };

  readonly onPointerMove = (e: PointerEvent) => {
    if (!this.host.mapCanvas || !this.host.scenario) return;
    const [cx, cy] = this.local(e);
    const here = this.position(cx, cy);
    this.at = here;
    const d = this.drag;
    if (!d) {
      this.host.mapCanvas.classList.toggle('grab', this.pickHandle(cx, cy) !== undefined || this.pickBody(cx, cy) !== undefined);
    } else if (d.kind === 'pending') {
      if (Math.hypot(cx - d.cx, cy - d.cy) >= DRAG_START && !this.polygon) {
        const start = this.position(d.cx, d.cy);
        if (d.hit !== undefined) this.drag = { kind: 'move', index: d.hit, from: start, to: here };
        else if (this.tool === 'circle') this.drag = { kind: 'circle', centre: start, rim: here };
        else if (this.tool === 'rectangle') this.drag = { kind: 'rectangle', corner: start, opposite: here };
      }
    } else if (d.kind === 'move') d.to = here;
    else if (d.kind === 'circle') d.rim = here;
    else if (d.kind === 'rectangle') d.opposite = here;
    else d.at = here;
    this.host.redraw();
  };

  readonly onPointerUp = (e: PointerEvent) => {
    const d = this.drag;
    this.drag = undefined;
    if (!d || !this.host.scenario) return;
    if (d.kind === 'pending') {
      if (this.polygon || (this.tool === 'polygon' && d.hit === undefined)) this.addVertex(this.position(...this.local(e)));
      else if (d.hit === undefined) this.selected = undefined;
    } else if (d.kind === 'circle') {
      const radius = tidy(Math.hypot(d.rim[0] - d.centre[0], d.rim[1] - d.centre[1]));
      if (radius > 0) this.add({ name: this.named('circle'), shape: 'circle', x: d.centre[0], y: d.centre[1], radius, material: structuredClone(NEW_OBJECT_MATERIAL) });
    } else if (d.kind === 'rectangle') {
      const [x0, y0] = d.corner;
      const [x1, y1] = d.opposite;
      if (x0 !== x1 && y0 !== y1) this.add({ name: this.named('rectangle'), shape: 'rectangle', x0, y0, x1, y1, material: structuredClone(NEW_OBJECT_MATERIAL) });
    } else {
      const o = this.objectAt(d.index);
      if (o && d.kind === 'move' && (d.to[0] !== d.from[0] || d.to[1] !== d.from[1])) this.replace(d.index, translated(o, d.to[0] - d.from[0], d.to[1] - d.from[1]));
      if (o && d.kind === 'resize') this.replace(d.index, withHandleAt(o, d.handle, d.at[0], d.at[1]));
    }
    this.host.redraw();
  };

  readonly onPointerCancel = () => {
    this.drag = undefined;
    this.host.redraw();
  };

  readonly onDoubleClick = () => {
    if (this.polygon) this.closePolygon();
    this.host.redraw();
  };

  /** Handles a key on the map; returns whether it was one of the editor's. */
  readonly onKey = (e: KeyboardEvent): boolean => {
    const s = this.host.scenario;
    const g = this.geometry();
    if (!s || !g) return false;
    const key = e.key;
    const list = this.host.objects;
    const sel = this.selected;
    const o = sel === undefined ? undefined : this.objectAt(sel);
    if (this.polygon && (key === 'Enter' || key === 'Escape' || key === 'Backspace')) {
      if (key === 'Enter') this.closePolygon();
      else if (key === 'Escape') { this.polygon = undefined; this.host.announce('polygon given up'); }
      else this.polygon = this.polygon.length > 1 ? this.polygon.slice(0, -1) : undefined;
    } else if (key === 'Escape' && sel !== undefined) {
      this.selected = undefined;
      this.host.announce('no object selected');
    } else if (key === 'n' || key === 'N') {
      const drawable = list.map((_o, k) => k).filter((k) => this.objectAt(k));
      if (drawable.length === 0) { this.host.announce('no objects yet: press A to add one'); return true; }
      const at = sel === undefined ? -1 : drawable.indexOf(sel);
      const next = e.shiftKey ? drawable[(at - 1 + drawable.length * 2) % drawable.length] : drawable[(at + 1) % drawable.length];
      this.select(next);
    } else if (key === 'a' || key === 'A') {
      const spot = newObjectSpot({ ...s.grid, cells: s.absorber.cells }, [s.source.x, s.source.y], list.length);
      this.add(newObject(this.tool, spot, s.grid, objectNames(list)));
    } else if (key.startsWith('Arrow') && sel !== undefined && o) {
      const step = e.shiftKey ? 10 : 1;
      const di = key === 'ArrowRight' ? step : key === 'ArrowLeft' ? -step : 0;
      const dj = key === 'ArrowUp' ? step : key === 'ArrowDown' ? -step : 0;
      this.replace(sel, translated(o, di * g.dx, dj * g.dy));
    } else if ((key === '+' || key === '=' || key === '-' || key === '_') && sel !== undefined && o) {
      this.replace(sel, grown(o, key === '+' || key === '=' ? 1 : -1, g.dx, g.dy));
    } else if ((key === 'Delete' || key === 'Backspace') && sel !== undefined) {
      this.selected = undefined;
      this.host.emitEdits([{ path: ['objects'], value: objectsValue(list.filter((_q, k) => k !== sel)) }]);
      this.host.announce(`${objectLabel(o, sel)} removed`);
    } else {
      return false;
    }
    e.preventDefault();
    this.host.redraw();
    return true;
  };

  hostConnected(): void {}
  hostDisconnected(): void { this.drag = undefined; }
}
