/**
 * Painting the scenario's objects over a grid map (the field view and the error map):
 * outlines with a halo so they read over any colour, perfect conductors filled, a selected
 * object dashed with its handles, an object being dragged at its new place, and a shape
 * being drawn (a polygon still open, with a line to the pointer).
 */
import type { SceneObject } from '../scenario/types.ts';
import type { GridGeometry } from './grid-drawing.ts';
import { handlesOf } from './object-shapes.ts';
import type { Palette } from './theme.ts';

/** Half the side of a handle, CSS px (also the pick distance's basis). */
export const HANDLE_HALF = 4;

export interface ObjectPaint {
  /** Index of the selected object (dashed, with handles). */
  selected?: number;
  /** An object shown at a new place or size while it is dragged, in place of objects[index]. */
  moved?: { index: number; object: SceneObject };
  /** A shape being drawn; `open` leaves a polygon unclosed with a line on to `pointer` (m). */
  sketch?: { object: SceneObject; open?: boolean; pointer?: [number, number] };
  /** Objects the scenario model found wrong, outlined in the error colour. */
  faulty?: ReadonlySet<number>;
}

/**
 * Where each named object's name goes on the map: the top centre of its outline's box,
 * canvas px (the label placement finds a free spot around it). Unnamed objects have none.
 *
 * @example
 * objectNameAnchors(g, [{ name: 'post', shape: 'circle', x: 0.1, y: 0.1, radius: 0.01, material: 'pec' }]); // [{ text: 'post', at: g.toPixel(0.1, 0.11) }]
 */
export function objectNameAnchors(g: GridGeometry, objects: readonly (SceneObject | undefined)[]): { text: string; at: [number, number] }[] {
  return objects.flatMap((o) => {
    if (!o?.name) return [];
    const pts = o.shape === 'circle' ? [[o.x, o.y + o.radius]] : o.shape === 'rectangle' ? handlesOf(o) : o.points;
    let top = -Infinity;
    let x0 = Infinity;
    let x1 = -Infinity;
    for (const [x, y] of pts) { top = Math.max(top, y); x0 = Math.min(x0, x); x1 = Math.max(x1, x); }
    return [{ text: o.name, at: g.toPixel((x0 + x1) / 2, top) }];
  });
}

function tracePath(ctx: CanvasRenderingContext2D, g: GridGeometry, o: SceneObject, open = false): void {
  ctx.beginPath();
  if (o.shape === 'circle') {
    const [cx, cy] = g.toPixel(o.x, o.y);
    const rx = (o.radius / g.dx / g.nx) * g.width;
    const ry = (o.radius / g.dy / g.ny) * g.height;
    ctx.ellipse(cx, cy, Math.max(rx, 0.5), Math.max(ry, 0.5), 0, 0, 2 * Math.PI);
    return;
  }
  const corners = o.shape === 'rectangle' ? handlesOf(o) : o.points;
  corners.forEach(([x, y], k) => {
    const [px, py] = g.toPixel(x, y);
    if (k === 0) ctx.moveTo(px, py);
    else ctx.lineTo(px, py);
  });
  if (!open) ctx.closePath();
}

function outline(ctx: CanvasRenderingContext2D, g: GridGeometry, o: SceneObject, p: Palette, dpr: number, colour: string, dashed: boolean, open = false): void {
  tracePath(ctx, g, o, open);
  if (o.material === 'pec' && !open) {
    ctx.globalAlpha = 0.45;
    ctx.fillStyle = p.marker;
    ctx.fill();
    ctx.globalAlpha = 1;
  }
  ctx.setLineDash([]);
  ctx.lineWidth = 4 * dpr;
  ctx.strokeStyle = p.markerHalo;
  ctx.stroke();
  ctx.setLineDash(dashed ? [6 * dpr, 4 * dpr] : []);
  ctx.lineWidth = 2 * dpr;
  ctx.strokeStyle = colour;
  ctx.stroke();
  ctx.setLineDash([]);
}

function handle(ctx: CanvasRenderingContext2D, q: [number, number], p: Palette, dpr: number): void {
  const r = HANDLE_HALF * dpr;
  ctx.fillStyle = p.focus;
  ctx.strokeStyle = p.markerHalo;
  ctx.lineWidth = 1.5 * dpr;
  ctx.fillRect(q[0] - r, q[1] - r, 2 * r, 2 * r);
  ctx.strokeRect(q[0] - r, q[1] - r, 2 * r, 2 * r);
}

/**
 * Paints `objects` (index for index with the draft; undefined entries are skipped) on a
 * map of geometry `g`, later objects over earlier ones as they cover them in the grid.
 *
 * @example
 * drawObjects(ctx, GridGeometry.of(scenario, canvas.width, canvas.height), scenario.objects ?? [], palettes.light, devicePixelRatio);
 */
export function drawObjects(
  ctx: CanvasRenderingContext2D, g: GridGeometry, objects: readonly (SceneObject | undefined)[], p: Palette, dpr: number, paint: ObjectPaint = {},
): void {
  ctx.save();
  objects.forEach((stored, k) => {
    const o = paint.moved?.index === k ? paint.moved.object : stored;
    if (!o) return;
    const selected = paint.selected === k;
    outline(ctx, g, o, p, dpr, paint.faulty?.has(k) ? p.error : selected ? p.focus : p.accent, selected);
    if (selected) for (const [x, y] of handlesOf(o)) handle(ctx, g.toPixel(x, y), p, dpr);
  });
  const sketch = paint.sketch;
  if (sketch) {
    outline(ctx, g, sketch.object, p, dpr, p.focus, true, sketch.open);
    if (sketch.open && sketch.object.shape === 'polygon') {
      const pts = sketch.object.points;
      for (const [x, y] of pts) handle(ctx, g.toPixel(x, y), p, dpr);
      const last = pts[pts.length - 1];
      if (sketch.pointer && last) {
        const a = g.toPixel(last[0], last[1]);
        const b = g.toPixel(sketch.pointer[0], sketch.pointer[1]);
        ctx.setLineDash([3 * dpr, 3 * dpr]);
        ctx.lineWidth = 1.5 * dpr;
        ctx.strokeStyle = p.focus;
        ctx.beginPath();
        ctx.moveTo(a[0], a[1]);
        ctx.lineTo(b[0], b[1]);
        ctx.stroke();
      }
    }
  }
  ctx.restore();
}
