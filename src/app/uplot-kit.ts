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

/** Sets every chart to `width` px (the width of its container), keeping `height`. */
export function fitCharts(charts: (uPlot | undefined)[], width: number, height: number): void {
  const w = Math.floor(width);
  if (w <= 0) return;
  for (const c of charts) if (c && c.width !== w) c.setSize({ width: w, height });
}

/**
 * Legend options that always show every series with a value: at the pointer while it is
 * over the plot, otherwise at the sample `resting` picks (the peak, the end of a line), so
 * the figures read without hovering.
 */
export function restingLegend(resting: (u: uPlot) => number | null): { legend: uPlot.Legend; hooks: uPlot.Hooks.Arrays } {
  const settle = (u: uPlot) => {
    if (u.cursor.left !== undefined && u.cursor.left >= 0) return; // the pointer is on the plot
    const k = resting(u);
    if (k !== null && k !== u.legend.idx) u.setLegend({ idx: k }, false);
  };
  return { legend: { show: true, live: true }, hooks: { setLegend: [settle], ready: [settle], setData: [settle] } };
}

/** The last index at which the most series have a value (a study chart's curves differ in x), or null. */
export function fullestIndex(u: uPlot): number | null {
  let best: number | null = null;
  let most = 0;
  const n = u.data[0]?.length ?? 0;
  for (let k = 0; k < n; k++) {
    let count = 0;
    for (let s = 1; s < u.data.length; s++) if (u.data[s][k] !== null && u.data[s][k] !== undefined) count++;
    if (count > 0 && count >= most) { most = count; best = k; }
  }
  return best;
}

/** The index of the largest |value| of series `s`, or null when it has none. */
export function peakIndex(u: uPlot, s: number): number | null {
  const ys = u.data[s] as ArrayLike<number | null | undefined> | undefined;
  let best: number | null = null;
  let top = -Infinity;
  for (let k = 0; ys && k < ys.length; k++) {
    const v = ys[k];
    if (v !== null && v !== undefined && Math.abs(v) > top) { top = Math.abs(v); best = k; }
  }
  return best;
}

/** The index of the last sample with a value in series `s`, or null. */
export function lastIndex(u: uPlot, s: number): number | null {
  const ys = u.data[s] as ArrayLike<number | null | undefined> | undefined;
  for (let k = (ys?.length ?? 0) - 1; k >= 0; k--) if (ys?.[k] !== null && ys?.[k] !== undefined) return k;
  return null;
}

/** A PNG of the charts' canvases (plot, axes and labels) under a title. */
export function chartsPng(charts: uPlot[], palette: Palette, title: string): Promise<Blob> {
  return canvasesToPng(charts.map((c) => c.ctx.canvas), palette.surface, palette.ink, title);
}
