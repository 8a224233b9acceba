/**
 * Shared uPlot set-up for the charts: axes whose tick values carry an SI prefix chosen from
 * the visible range (the prefix goes in the axis label, so ticks stay short), theme
 * colours, sizing to the container, and a PNG of a chart.
 */
import { unsafeCSS } from 'lit';
import uPlot from 'uplot';
import uplotCss from 'uplot/dist/uPlot.min.css?inline';
import { formatSig, SI_PREFIXES } from '../scenario/units.ts';
import { canvasesToPng } from './download.ts';
import type { Palette } from './theme.ts';

export { uPlot };

export const uplotStyles = unsafeCSS(uplotCss);


/** The SI prefix (scale and letter) that shows `magnitude` as 1 to 999. */
export function prefixFor(magnitude: number): [number, string] {
  if (!(magnitude > 0) || !Number.isFinite(magnitude)) return [1, ''];
  return SI_PREFIXES.find(([s]) => magnitude >= s * 0.9995) ?? SI_PREFIXES[SI_PREFIXES.length - 1];
}

function scaleMagnitude(u: uPlot, key: string): number {
  const s = u.scales[key];
  return Math.max(Math.abs(s?.min ?? 0), Math.abs(s?.max ?? 0));
}

/**
 * An axis for `scaleKey` labelled "name (prefix unit)", e.g. "t (ns)", "Ez (mV/m)". With
 * `unit` empty the values are shown as they are (dB, degrees).
 */
export function siAxis(palette: () => Palette, name: string, unit: string, scaleKey: string, side?: uPlot.Axis.Side): uPlot.Axis {
  // uPlot merges options over its defaults, so a key set to undefined would wipe a default.
  const axis: uPlot.Axis = {
    scale: scaleKey,
    stroke: () => palette().muted,
    grid: { stroke: () => palette().grid, width: 1 },
    ticks: { stroke: () => palette().border, width: 1 },
    font: '11px system-ui, sans-serif',
    labelFont: '12px system-ui, sans-serif',
    label: (u: uPlot) => {
      if (!unit) return name;
      const [, prefix] = prefixFor(scaleMagnitude(u, scaleKey));
      return `${name} (${prefix}${unit})`;
    },
    values: (u: uPlot, splits: number[]) => {
      if (!unit) return splits.map((v) => formatSig(v, 3));
      const [scale] = prefixFor(scaleMagnitude(u, scaleKey));
      return splits.map((v) => formatSig(v / scale, 3));
    },
  };
  if (side !== undefined) axis.side = side;
  if (scaleKey !== 'x') axis.size = 56;
  return axis;
}

export interface SeriesStyle { label: string; colour: () => string; dash?: number[]; width?: number; scale?: string; points?: boolean }

export function series(style: SeriesStyle): uPlot.Series {
  const out: uPlot.Series = {
    label: style.label,
    scale: style.scale ?? 'y',
    stroke: () => style.colour(),
    width: style.width ?? 1.5,
    points: { show: style.points ?? false, size: 4, stroke: () => style.colour(), fill: () => style.colour() },
    value: (_u: uPlot, v: number | null) => (v === null || v === undefined ? '—' : formatSig(v, 4)),
  };
  if (style.dash) out.dash = style.dash;
  return out;
}

/** Sets every chart in `charts()` to the width of `host`'s content box. */
export function fitWidth(host: HTMLElement, charts: () => (uPlot | undefined)[], height: number): ResizeObserver {
  const observer = new ResizeObserver((entries) => {
    const width = Math.floor(entries[0].contentRect.width);
    if (width <= 0) return;
    for (const c of charts()) if (c && c.width !== width) c.setSize({ width, height });
  });
  observer.observe(host);
  return observer;
}

/** A PNG of the charts' canvases (plot, axes and labels) under a title. */
export function chartsPng(charts: uPlot[], palette: Palette, title: string): Promise<Blob> {
  return canvasesToPng(charts.map((c) => c.ctx.canvas), palette.surface, palette.ink, title);
}
