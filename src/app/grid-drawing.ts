/**
 * Drawing a grid quantity on a canvas, shared by the field view and the error map: the
 * mapping between canvas pixels and Ez nodes (j = 0 at the bottom), the absorber outline,
 * and the source, probe and line markers.
 */
import { css } from 'lit';
import { snapIndex } from '../scenario/layout.ts';
import type { Scenario } from '../scenario/types.ts';
import { LUT_SIZE } from './colormap.ts';
import { placeLabels, type Box, type LabelRequest } from './label-placement.ts';
import { AXIS_MARGIN } from './map-axes.ts';
import type { Palette } from './theme.ts';

/** Styles both grid maps share: tool row, canvas stage with its axes, legend with its colour bar, readout. */
export const gridMapStyles = css`
  :host { display: block; }
  .tools { display: flex; gap: 0.6rem; align-items: center; flex-wrap: wrap; font-size: 0.85rem; margin-bottom: 0.4rem; }
  .tools label { display: inline-flex; gap: 0.3rem; align-items: center; }
  .stage { position: relative; width: 100%; padding: ${AXIS_MARGIN.top}px 0 ${AXIS_MARGIN.bottom}px ${AXIS_MARGIN.left}px; box-sizing: border-box; }
  canvas.map { display: block; position: relative; z-index: 1; border-radius: 2px; background: var(--gg-raised); }
  canvas.axes { position: absolute; left: 0; top: 0; pointer-events: none; }
  .legend { display: flex; align-items: center; gap: 0.4rem; font-size: 0.78rem; margin-top: 0.35rem; flex-wrap: wrap; }
  .legend .num { white-space: nowrap; }
  canvas.bar { height: 10px; width: min(260px, 50%); border-radius: 2px; }
  .readout { font-size: 0.8rem; min-height: 2.4em; margin: 0.25rem 0 0; }
`;

/**
 * Sizes `canvas` to fill `stage`'s width (less the room for the axes) with the grid's
 * physical aspect, at most 70 % of the window's height, in device pixels for a sharp image.
 * Returns whether anything was sized: a hidden stage (no width) keeps the last size.
 */
export function fitCanvasToGrid(stage: HTMLElement | null, canvas: HTMLCanvasElement | undefined, s: Scenario | undefined): boolean {
  if (!stage || !canvas) return false;
  const aspect = s ? (s.grid.ny * s.grid.dy) / (s.grid.nx * s.grid.dx) : 1;
  let width = stage.clientWidth - AXIS_MARGIN.left - AXIS_MARGIN.right;
  if (width <= 0) return false;
  const maxHeight = Math.max(200, window.innerHeight * 0.7);
  if (width * aspect > maxHeight) width = maxHeight / aspect;
  const height = width * aspect;
  const dpr = window.devicePixelRatio || 1;
  canvas.style.width = `${Math.round(width)}px`;
  canvas.style.height = `${Math.round(height)}px`;
  const w = Math.max(1, Math.round(width * dpr));
  const h = Math.max(1, Math.round(height * dpr));
  if (canvas.width !== w || canvas.height !== h) {
    canvas.width = w;
    canvas.height = h;
  }
  return true;
}

/** Paints a colour look-up table (packed RGBA, LUT_SIZE entries) into a 1-pixel-high bar canvas. */
export function paintColourBar(bar: HTMLCanvasElement, lut: Uint32Array): void {
  const image = new ImageData(LUT_SIZE, 1);
  new Uint32Array(image.data.buffer).set(lut);
  (bar.getContext('2d') as CanvasRenderingContext2D).putImageData(image, 0, 0);
}

/** Canvas-pixel geometry of a grid drawn to fill a `width` × `height` canvas. */
export class GridGeometry {
  constructor(
    readonly nx: number, readonly ny: number, readonly dx: number, readonly dy: number,
    readonly cells: number, readonly width: number, readonly height: number,
  ) {}

  static of(s: Scenario, width: number, height: number): GridGeometry {
    return new GridGeometry(s.grid.nx, s.grid.ny, s.grid.dx, s.grid.dy, s.absorber.cells, width, height);
  }

  /** Pixel centre of the node nearest to (x, y) metres. */
  toPixel(x: number, y: number): [number, number] {
    const i = x / this.dx;
    const j = y / this.dy;
    return [((i + 0.5) / this.nx) * this.width, this.height - ((j + 0.5) / this.ny) * this.height];
  }

  /** Node indices under a pixel (not clamped). */
  toNode(px: number, py: number): [number, number] {
    return [Math.floor((px / this.width) * this.nx), Math.floor(((this.height - py) / this.height) * this.ny)];
  }

  /** The interior node nearest a pixel, as metres (positions snap to nodes). */
  toInteriorPosition(px: number, py: number): [number, number] {
    const [i, j] = this.toNode(px, py);
    const ci = Math.min(Math.max(i, this.cells), this.nx - 1 - this.cells);
    const cj = Math.min(Math.max(j, this.cells), this.ny - 1 - this.cells);
    return [tidy(ci * this.dx), tidy(cj * this.dy)];
  }

  /** Moves a position by whole cells, kept in the interior. */
  nudge(x: number, y: number, di: number, dj: number): [number, number] {
    const i = Math.min(Math.max(snapIndex(x, this.dx) + di, this.cells), this.nx - 1 - this.cells);
    const j = Math.min(Math.max(snapIndex(y, this.dy) + dj, this.cells), this.ny - 1 - this.cells);
    return [tidy(i * this.dx), tidy(j * this.dy)];
  }
}

/** i·dx without float noise: 180·0.001 is written 0.18. */
export function tidy(x: number): number {
  return Number(x.toPrecision(12));
}

/**
 * Writes `data` (row-major, row 0 at j = 0) through `colour` into an offscreen image and
 * draws it over the whole canvas, nodes as sharp blocks.
 */
export function paintGrid(
  ctx: CanvasRenderingContext2D, scratch: { canvas?: HTMLCanvasElement; image?: ImageData },
  data: ArrayLike<number>, w: number, h: number, colour: (v: number) => number,
): void {
  if (!scratch.canvas || scratch.canvas.width !== w || scratch.canvas.height !== h) {
    scratch.canvas = document.createElement('canvas');
    scratch.canvas.width = w;
    scratch.canvas.height = h;
    scratch.image = new ImageData(w, h);
  }
  const image = scratch.image as ImageData;
  const pixels = new Uint32Array(image.data.buffer);
  for (let r = 0; r < h; r++) {
    const src = r * w;
    const dst = (h - 1 - r) * w; // j grows upwards
    for (let c = 0; c < w; c++) pixels[dst + c] = colour(data[src + c]);
  }
  const off = scratch.canvas.getContext('2d') as CanvasRenderingContext2D;
  off.putImageData(image, 0, 0);
  ctx.imageSmoothingEnabled = false;
  ctx.drawImage(scratch.canvas, 0, 0, ctx.canvas.width, ctx.canvas.height);
}

/** Dashed rectangle at the inner face of the absorber layers. */
export function drawAbsorberOutline(ctx: CanvasRenderingContext2D, g: GridGeometry, p: Palette, dpr: number): void {
  if (g.cells <= 0) return;
  const x0 = (g.cells / g.nx) * g.width;
  const x1 = ((g.nx - g.cells) / g.nx) * g.width;
  const y0 = g.height - ((g.ny - g.cells) / g.ny) * g.height;
  const y1 = g.height - (g.cells / g.ny) * g.height;
  ctx.save();
  ctx.setLineDash([5 * dpr, 4 * dpr]);
  ctx.lineWidth = 1.5 * dpr;
  ctx.strokeStyle = p.markerHalo;
  ctx.strokeRect(x0, y0, x1 - x0, y1 - y0);
  ctx.lineDashOffset = 5 * dpr;
  ctx.strokeStyle = p.marker;
  ctx.strokeRect(x0, y0, x1 - x0, y1 - y0);
  ctx.restore();
}

/** A marker that can be picked and moved on the field view. */
export type MarkerRef =
  | { kind: 'source' }
  | { kind: 'probe'; index: number }
  | { kind: 'line-end'; index: number; end: 0 | 1 };

export interface MarkerPosition { ref: MarkerRef; x: number; y: number; label: string }

/** Every movable marker of a scenario with its position in metres. */
export function markersOf(s: Scenario): MarkerPosition[] {
  const out: MarkerPosition[] = [{ ref: { kind: 'source' }, x: s.source.x, y: s.source.y, label: 'source' }];
  s.probes.forEach((p, index) => out.push({ ref: { kind: 'probe', index }, x: p.x, y: p.y, label: `probe ${p.name}` }));
  s.lines.forEach((l, index) => {
    out.push({ ref: { kind: 'line-end', index, end: 0 }, x: l.x0, y: l.y0, label: `start of line ${l.name}` });
    out.push({ ref: { kind: 'line-end', index, end: 1 }, x: l.x1, y: l.y1, label: `end of line ${l.name}` });
  });
  return out;
}

export function sameMarker(a: MarkerRef | undefined, b: MarkerRef | undefined): boolean {
  if (!a || !b || a.kind !== b.kind) return false;
  if (a.kind === 'source') return true;
  if (a.kind === 'probe') return a.index === (b as typeof a).index;
  return a.index === (b as typeof a).index && a.end === (b as typeof a).end;
}

function haloText(ctx: CanvasRenderingContext2D, text: string, x: number, y: number, p: Palette, dpr: number): void {
  ctx.lineWidth = 3 * dpr;
  ctx.strokeStyle = p.markerHalo;
  ctx.strokeText(text, x, y);
  ctx.fillStyle = p.marker;
  ctx.fillText(text, x, y);
}

/**
 * Source (diamond), probes (rings, named) and lines (segments with square ends, named).
 * `moved` replaces one marker's position while it is being dragged; `selected` is ringed.
 * Names are placed so that none prints over another or over a marker (label-placement.ts);
 * a name with no free spot is left out. `extra` names (the objects', at canvas px) come
 * last, so they give way to the markers'. Returns the names drawn and their boxes (canvas px).
 */
export function drawMarkers(
  ctx: CanvasRenderingContext2D, g: GridGeometry, s: Scenario, p: Palette, dpr: number,
  moved?: { ref: MarkerRef; x: number; y: number }, selected?: MarkerRef, extra: readonly { text: string; at: [number, number] }[] = [],
): { text: string; box: Box }[] {
  const at = (ref: MarkerRef, x: number, y: number) => (moved && sameMarker(moved.ref, ref) ? g.toPixel(moved.x, moved.y) : g.toPixel(x, y));
  const obstacles: Box[] = [];
  const occupy = (q: [number, number], r: number) => obstacles.push({ x: q[0] - r, y: q[1] - r, width: 2 * r, height: 2 * r });
  const labels: { text: string; at: [number, number] }[] = [];
  ctx.save();
  s.lines.forEach((l, index) => {
    const a = at({ kind: 'line-end', index, end: 0 }, l.x0, l.y0);
    const b = at({ kind: 'line-end', index, end: 1 }, l.x1, l.y1);
    for (const [colour, width] of [[p.markerHalo, 4], [p.marker, 1.75]] as const) {
      ctx.strokeStyle = colour;
      ctx.lineWidth = width * dpr;
      ctx.beginPath();
      ctx.moveTo(a[0], a[1]);
      ctx.lineTo(b[0], b[1]);
      ctx.stroke();
    }
    for (const [end, q] of [[0, a], [1, b]] as const) {
      const r = 4 * dpr;
      ctx.fillStyle = p.marker;
      ctx.strokeStyle = p.markerHalo;
      ctx.lineWidth = 1.5 * dpr;
      ctx.fillRect(q[0] - r, q[1] - r, 2 * r, 2 * r);
      ctx.strokeRect(q[0] - r, q[1] - r, 2 * r, 2 * r);
      occupy(q, r + dpr);
      if (selected && sameMarker(selected, { kind: 'line-end', index, end })) ring(ctx, q, 9 * dpr, p, dpr);
    }
    labels.push({ text: l.name, at: [(a[0] + b[0]) / 2, (a[1] + b[1]) / 2] });
  });
  const probeLabels: typeof labels = [];
  s.probes.forEach((pr, index) => {
    const q = at({ kind: 'probe', index }, pr.x, pr.y);
    ctx.lineWidth = 4 * dpr;
    ctx.strokeStyle = p.markerHalo;
    ctx.beginPath();
    ctx.arc(q[0], q[1], 5 * dpr, 0, 2 * Math.PI);
    ctx.stroke();
    ctx.lineWidth = 2 * dpr;
    ctx.strokeStyle = p.marker;
    ctx.stroke();
    occupy(q, 6 * dpr);
    if (selected && sameMarker(selected, { kind: 'probe', index })) ring(ctx, q, 10 * dpr, p, dpr);
    probeLabels.push({ text: pr.name, at: q });
  });
  const q = at({ kind: 'source' }, s.source.x, s.source.y);
  const r = 6 * dpr;
  ctx.beginPath();
  ctx.moveTo(q[0], q[1] - r);
  ctx.lineTo(q[0] + r, q[1]);
  ctx.lineTo(q[0], q[1] + r);
  ctx.lineTo(q[0] - r, q[1]);
  ctx.closePath();
  ctx.fillStyle = p.marker;
  ctx.strokeStyle = p.markerHalo;
  ctx.lineWidth = 2 * dpr;
  ctx.fill();
  ctx.stroke();
  occupy(q, r + dpr);
  if (selected?.kind === 'source') ring(ctx, q, 11 * dpr, p, dpr);
  // Probe names first: they matter more than a line's name when space runs out.
  const all = [...probeLabels, ...labels, ...extra];
  ctx.font = `${12 * dpr}px system-ui, sans-serif`;
  ctx.textBaseline = 'top';
  const requests: LabelRequest[] = all.map((l) => ({ at: l.at, width: ctx.measureText(l.text).width + 2 * dpr, height: 14 * dpr }));
  const boxes = placeLabels(requests, 7 * dpr, obstacles, { x: 0, y: 0, width: g.width, height: g.height });
  const drawn: { text: string; box: Box }[] = [];
  boxes.forEach((box, k) => {
    if (!box) return;
    haloText(ctx, all[k].text, box.x + dpr, box.y + dpr, p, dpr);
    drawn.push({ text: all[k].text, box });
  });
  ctx.restore();
  return drawn;
}

function ring(ctx: CanvasRenderingContext2D, q: [number, number], r: number, p: Palette, dpr: number): void {
  ctx.save();
  ctx.setLineDash([3 * dpr, 3 * dpr]);
  ctx.lineWidth = 2 * dpr;
  ctx.strokeStyle = p.focus;
  ctx.beginPath();
  ctx.arc(q[0], q[1], r, 0, 2 * Math.PI);
  ctx.stroke();
  ctx.restore();
}
