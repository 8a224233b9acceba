/**
 * x and y axes around a grid map, in the length unit the person chose: ticks at round
 * positions, labelled, with the axis names. The map canvas itself stays exactly the grid
 * (pointer positions map straight to nodes); the axes are drawn on a second canvas around
 * it, and both are put together for a PNG.
 */
import { formatSig } from '../scenario/units.ts';
import { niceTicks } from './axis-ticks.ts';
import { UNIT_EXPONENT } from './draft.ts';
import type { Palette } from './theme.ts';

/** Room around the map for the axes, CSS px. */
export const AXIS_MARGIN = { left: 46, right: 16, top: 8, bottom: 36 } as const;

/** What the axes need of the grid: node counts and cell sizes, m. */
export interface AxisGrid { nx: number; ny: number; dx: number; dy: number }

/**
 * A length in metres written in `unit` (m, mm, µm) to 4 significant digits.
 *
 * @example
 * lengthText(0.15, 'mm'); // "150 mm"
 */
export function lengthText(metres: number, unit: string): string {
  return `${formatSig(metres / 10 ** (UNIT_EXPONENT[unit] ?? 0), 4)} ${unit}`;
}

/**
 * Draws the axes of a map that fills `rect` (device px) of `ctx`: node i's centre sits at
 * (i + ½)/nx of the width, x = i·dx, and j grows upwards. `dpr` scales fonts and strokes.
 */
export function drawMapAxes(
  ctx: CanvasRenderingContext2D, rect: { x: number; y: number; width: number; height: number },
  g: AxisGrid, unit: string, palette: Palette, dpr: number,
): void {
  const scale = 10 ** (UNIT_EXPONENT[unit] ?? 0);
  const tick = 4 * dpr;
  ctx.save();
  ctx.strokeStyle = palette.muted;
  ctx.fillStyle = palette.muted;
  ctx.lineWidth = Math.max(1, dpr);
  ctx.font = `${11 * dpr}px system-ui, sans-serif`;
  const xs = niceTicks(0, ((g.nx - 1) * g.dx) / scale, Math.max(2, Math.floor(rect.width / (64 * dpr))));
  ctx.textAlign = 'center';
  ctx.textBaseline = 'top';
  const bottom = rect.y + rect.height;
  for (const v of xs) {
    const px = rect.x + ((v * scale) / g.dx + 0.5) / g.nx * rect.width;
    ctx.beginPath();
    ctx.moveTo(px, bottom);
    ctx.lineTo(px, bottom + tick);
    ctx.stroke();
    ctx.fillText(formatSig(v, 4), px, bottom + tick + 2 * dpr);
  }
  const ys = niceTicks(0, ((g.ny - 1) * g.dy) / scale, Math.max(2, Math.floor(rect.height / (40 * dpr))));
  ctx.textAlign = 'right';
  ctx.textBaseline = 'middle';
  for (const v of ys) {
    const py = bottom - ((v * scale) / g.dy + 0.5) / g.ny * rect.height;
    ctx.beginPath();
    ctx.moveTo(rect.x, py);
    ctx.lineTo(rect.x - tick, py);
    ctx.stroke();
    ctx.fillText(formatSig(v, 4), rect.x - tick - 3 * dpr, py);
  }
  ctx.fillStyle = palette.ink;
  ctx.font = `${12 * dpr}px system-ui, sans-serif`;
  ctx.textAlign = 'center';
  ctx.textBaseline = 'bottom';
  ctx.fillText(`x (${unit})`, rect.x + rect.width / 2, bottom + AXIS_MARGIN.bottom * dpr);
  ctx.translate(rect.x - (AXIS_MARGIN.left - 2) * dpr, rect.y + rect.height / 2);
  ctx.rotate(-Math.PI / 2);
  ctx.textBaseline = 'top';
  ctx.fillText(`y (${unit})`, 0, 0);
  ctx.restore();
}

/** Sizes the axes canvas to its stage and draws the axes around the map canvas on it. */
export function paintAxesCanvas(axes: HTMLCanvasElement, map: HTMLCanvasElement, g: AxisGrid, unit: string, palette: Palette): void {
  const dpr = window.devicePixelRatio || 1;
  const width = Math.round((AXIS_MARGIN.left + map.clientWidth + AXIS_MARGIN.right) * dpr);
  const height = Math.round((AXIS_MARGIN.top + map.clientHeight + AXIS_MARGIN.bottom) * dpr);
  if (axes.width !== width || axes.height !== height) {
    axes.width = width;
    axes.height = height;
  }
  const ctx = axes.getContext('2d') as CanvasRenderingContext2D;
  ctx.clearRect(0, 0, width, height);
  drawMapAxes(ctx, { x: AXIS_MARGIN.left * dpr, y: AXIS_MARGIN.top * dpr, width: map.width, height: map.height }, g, unit, palette, dpr);
}

/** A canvas holding the map with its axes, for the PNG export. */
export function mapWithAxes(map: HTMLCanvasElement, g: AxisGrid, unit: string, palette: Palette): HTMLCanvasElement {
  const dpr = window.devicePixelRatio || 1;
  const out = document.createElement('canvas');
  out.width = Math.round((AXIS_MARGIN.left + AXIS_MARGIN.right) * dpr) + map.width;
  out.height = Math.round((AXIS_MARGIN.top + AXIS_MARGIN.bottom) * dpr) + map.height;
  const ctx = out.getContext('2d') as CanvasRenderingContext2D;
  ctx.fillStyle = palette.surface;
  ctx.fillRect(0, 0, out.width, out.height);
  const rect = { x: Math.round(AXIS_MARGIN.left * dpr), y: Math.round(AXIS_MARGIN.top * dpr), width: map.width, height: map.height };
  ctx.drawImage(map, rect.x, rect.y);
  drawMapAxes(ctx, rect, g, unit, palette, dpr);
  return out;
}
