/**
 * Line and point plots written as SVG text, for the design-review report and for chart
 * exports: linear and logarithmic axes, ticks at 1-2-5 steps (decades on a log axis) with
 * labels in SI prefixes, axis labels, a legend under the plot, dashed limit lines and a
 * title. No DOM and no library: the result is a string, the same input gives the same bytes,
 * and every piece of text is escaped. A NaN, null, infinite (or, on a log axis, non-positive)
 * value breaks a line rather than drawing through it.
 */
import { formatSI, formatSig, SI_PREFIXES } from '../scenario/units.ts';

/** A colour role (as the page's charts name them) or an index into the curve palette. */
export type SeriesColour = 'fdtd' | 'exact' | 'error' | 'predicted' | number;

export interface PlotSeries {
  label: string;
  x: ArrayLike<number>;
  /** null (or NaN) where the curve has no value: the line breaks there. */
  y: ArrayLike<number | null>;
  /** "line" (default), "points" (markers only), "dashed" (a limit, a guide or a prediction). */
  style?: 'line' | 'points' | 'dashed';
  /** Also mark each point of a line (a curve through few measured values). */
  markers?: boolean;
  colour?: SeriesColour;
}

export interface PlotAxis {
  /** What the axis shows, with a non-SI unit in brackets if any: "phase error (°)". */
  label: string;
  /** An SI unit that takes a prefix ("s", "m", "V/m"); the ticks are written in it. */
  unit?: string;
  log?: boolean;
  /** Fixed ends of the axis; by default they enclose the data and the limit lines. */
  min?: number;
  max?: number;
}

/** A dashed line at a fixed value across the plot (a target, a budget), named in the legend. */
export interface LimitLine { axis: 'x' | 'y'; value: number; label: string }

export interface PlotSpec {
  title: string;
  x: PlotAxis;
  y: PlotAxis;
  series: readonly PlotSeries[];
  limits?: readonly LimitLine[];
  /** Unique within one document: names the plot's clip path (default "plot"). */
  id?: string;
  /** Size of the drawing in SVG units (default 640 × 360; the legend adds rows below). */
  width?: number;
  height?: number;
  /** Write the SVG namespace (default true: a file of its own); inline SVG in HTML does without. */
  xmlns?: boolean;
}

/** Curve colours, chosen to stay apart in print and for the common colour-vision deficiencies. */
export const PALETTE = ['#1f5fa8', '#c4561c', '#2a8a4a', '#7b3fa0', '#a07800', '#17808f', '#b8325a', '#555555'] as const;
const ROLE_COLOURS: Record<Exclude<SeriesColour, number>, string> = {
  fdtd: '#1f5fa8', exact: '#222222', error: '#c0282d', predicted: '#7a7a7a',
};
const LIMIT_COLOUR = '#c0282d';
const FONT = 11;
/** Width of one character of the labels, as a share of the font size (sans-serif, mixed text). */
const CHAR = 0.58;

const XML_ESCAPES: Record<string, string> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' };

/**
 * Text made safe inside an XML or HTML element or a quoted attribute (XML 1.0 §2.4: `&` and
 * `<` must be escaped; quotes for attributes; `>` for `]]>`).
 *
 * @example
 * escapeXml('<b>"x" & y</b>'); // '&lt;b&gt;&quot;x&quot; &amp; y&lt;/b&gt;'
 */
export function escapeXml(text: string): string {
  return String(text).replace(/[&<>"']/g, (c) => XML_ESCAPES[c]);
}

/**
 * The stroke colour of a series: its role's colour, or the palette entry of its index
 * (wrapping), or by default the palette entry of its position in the plot.
 *
 * @example
 * colourOf('error', 0); // '#c0282d'
 */
export function colourOf(c: SeriesColour | undefined, index: number): string {
  if (typeof c === 'number') return PALETTE[((Math.trunc(c) % PALETTE.length) + PALETTE.length) % PALETTE.length] ?? PALETTE[0];
  if (c && c in ROLE_COLOURS) return ROLE_COLOURS[c];
  return PALETTE[index % PALETTE.length];
}

/** Rounds away the binary noise of k·step (0.1·3 = 0.30000000000000004). */
const clean = (x: number) => Number(x.toPrecision(12));

/** The 1-2-5 step nearest above `raw`. */
function niceStep(raw: number): number {
  const decade = 10 ** Math.floor(Math.log10(raw));
  const m = raw / decade;
  return clean((m <= 1 ? 1 : m <= 2 ? 2 : m <= 5 ? 5 : 10) * decade);
}

/**
 * Ticks of a linear axis from `min` to `max`: multiples of a 1-2-5 step, about `target` of
 * them (Heckbert, "Nice numbers for graph labels", Graphics Gems, 1990, is the usual form).
 *
 * @example
 * linearTicks(0, 1); // [0, 0.2, 0.4, 0.6, 0.8, 1]
 */
export function linearTicks(min: number, max: number, target = 5): number[] {
  if (!(Number.isFinite(min) && Number.isFinite(max) && max > min)) return Number.isFinite(min) ? [min] : [];
  const step = niceStep((max - min) / Math.max(1, target));
  const first = Math.ceil(min / step - 1e-9);
  const last = Math.floor(max / step + 1e-9);
  const ticks: number[] = [];
  for (let k = first; k <= last; k++) ticks.push(clean(k * step) || 0);
  return ticks;
}

/**
 * Ticks of a logarithmic axis from `min` to `max` (both > 0): the decades, with 2 and 5 times
 * each decade when the axis spans two decades or fewer (or the decades alone give fewer than
 * three ticks), every n-th decade when it spans many; the linear ticks of the range when it
 * spans too little for three of those.
 *
 * @example
 * logTicks(1, 1000); // [1, 10, 100, 1000]
 */
export function logTicks(min: number, max: number): number[] {
  if (!(min > 0 && max > min && Number.isFinite(max))) return min > 0 && Number.isFinite(min) ? [min] : [];
  const lo = Math.floor(Math.log10(min) + 1e-9);
  const hi = Math.ceil(Math.log10(max) - 1e-9);
  const every = Math.max(1, Math.ceil((hi - lo) / 8));
  const at = (mantissas: number[]) => {
    const ticks: number[] = [];
    for (let e = lo; e <= hi; e++) {
      if ((e - lo) % every !== 0) continue;
      for (const m of mantissas) {
        const v = clean(m * 10 ** e);
        if (v >= min * (1 - 1e-9) && v <= max * (1 + 1e-9)) ticks.push(v);
      }
    }
    return ticks;
  };
  let ticks = hi - lo <= 2 ? at([1, 2, 5]) : at([1]);
  if (ticks.length < 3) ticks = at([1, 2, 5]);
  return ticks.length >= 3 ? ticks : linearTicks(min, max, 4).filter((t) => t > 0);
}

/** The 1-2-5 value at or below x (mode "down") or at or above it ("up"), x > 0. */
function snap125(x: number, mode: 'down' | 'up'): number {
  const e = Math.floor(Math.log10(x));
  const steps = [1, 2, 5, 10].map((m) => clean(m * 10 ** e));
  return mode === 'down' ? [...steps].reverse().find((s) => s <= x * (1 + 1e-12)) ?? steps[0] : steps.find((s) => s >= x * (1 - 1e-12)) ?? steps[3];
}

interface Scale { min: number; max: number; log: boolean; ticks: number[] }

/**
 * The axis range and ticks enclosing `values` (finite, and positive on a log axis). With
 * `pad` (markers are drawn) the range leaves room around the outermost values, so no
 * marker sits half outside the plot.
 */
function scaleOf(axis: PlotAxis, values: number[], pad: boolean): Scale {
  const log = !!axis.log;
  // a loop, not Math.min(...values): a long run has more samples than a call takes arguments
  let [lo, hi] = [NaN, NaN];
  for (const v of values) {
    if (!Number.isFinite(v) || (log && !(v > 0))) continue;
    if (!(v >= lo)) lo = v;
    if (!(v <= hi)) hi = v;
  }
  if (log) {
    if (!(lo > 0)) { lo = 1; hi = 10; }
    const room = pad ? 1.08 : 1;
    lo = axis.min !== undefined && axis.min > 0 ? axis.min : snap125(lo / room, 'down');
    hi = axis.max !== undefined && axis.max > lo ? axis.max : snap125(hi * room, 'up');
    if (!(hi > lo)) hi = lo * 10;
    return { min: lo, max: hi, log, ticks: logTicks(lo, hi) };
  }
  if (!Number.isFinite(lo)) { lo = 0; hi = 1; }
  if (hi === lo) { const half = lo === 0 ? 1 : Math.abs(lo) * 0.1; lo -= half; hi += half; }
  if (pad) { const room = 0.03 * (hi - lo); lo -= room; hi += room; }
  const step = niceStep((hi - lo) / 5);
  lo = axis.min ?? clean(Math.floor(lo / step + 1e-9) * step);
  hi = axis.max ?? clean(Math.ceil(hi / step - 1e-9) * step);
  if (!(hi > lo)) hi = lo + 1;
  return { min: lo, max: hi, log, ticks: linearTicks(lo, hi) };
}

/** Tick labels and the axis title: a linear axis with an SI unit shares one prefix, a log one gives each tick its own. */
function labelsOf(axis: PlotAxis, s: Scale): { ticks: string[]; title: string } {
  if (s.log) {
    return { ticks: s.ticks.map((t) => (axis.unit ? formatSI(t, axis.unit) : formatSig(t, 3))), title: axis.label };
  }
  const biggest = Math.max(...s.ticks.map(Math.abs), 0);
  const [scale, prefix] = axis.unit && biggest > 0
    ? SI_PREFIXES.find(([f]) => biggest >= f * 0.9995) ?? SI_PREFIXES[SI_PREFIXES.length - 1] : [1, ''];
  const step = s.ticks.length > 1 ? s.ticks[1] - s.ticks[0] : Math.abs(s.ticks[0] ?? 1) || 1;
  const decimals = Math.max(0, Math.min(20, Math.ceil(-Math.log10(step / scale) - 1e-9)));
  const text = (t: number) => {
    const v = Number((t / scale).toFixed(decimals));
    // formatSig writes an exponent outside 1e-4..1e6; a few digits are enough there
    return formatSig(v, Math.abs(v) >= 1e6 || (v !== 0 && Math.abs(v) < 1e-4) ? 4 : 15);
  };
  return { ticks: s.ticks.map(text), title: axis.unit ? `${axis.label} (${prefix}${axis.unit})` : axis.label };
}

/** A coordinate to 0.1 unit, without "-0" or a trailing ".0". */
const num = (x: number) => (Math.round(x * 10) / 10 || 0).toFixed(1).replace(/\.0$/, '');

/** Pixel position on an axis; NaN for values the axis cannot show. */
function project(s: Scale, v: number, from: number, to: number): number {
  if (!Number.isFinite(v) || (s.log && !(v > 0))) return NaN;
  const u = s.log ? (Math.log10(v) - Math.log10(s.min)) / (Math.log10(s.max) - Math.log10(s.min)) : (v - s.min) / (s.max - s.min);
  return from + u * (to - from);
}

/**
 * Keeps a dense run of points readable and small: per pixel column, the first, lowest,
 * highest and last point in their order, so peaks survive. Runs are split at gaps (NaN).
 */
function thin(points: [number, number][], columns: number): [number, number][] {
  if (points.length <= 4 * columns) return points;
  const out: [number, number][] = [];
  let group: [number, number][] = [];
  const flush = () => {
    if (group.length === 0) return;
    const lo = group.reduce((a, p) => (p[1] < a[1] ? p : a));
    const hi = group.reduce((a, p) => (p[1] > a[1] ? p : a));
    const keep = new Set([group[0], lo, hi, group[group.length - 1]]);
    out.push(...group.filter((p) => keep.has(p)));
    group = [];
  };
  for (const p of points) {
    if (Number.isNaN(p[0]) || Number.isNaN(p[1])) { flush(); out.push(p); continue; }
    if (group.length && Math.floor(group[0][0]) !== Math.floor(p[0])) flush();
    group.push(p);
  }
  flush();
  return out;
}

/** "M x y L x y …" with a new M after every gap. */
function pathData(points: [number, number][]): string {
  let d = '';
  let pen = false;
  for (const [x, y] of points) {
    if (Number.isNaN(x) || Number.isNaN(y)) { pen = false; continue; }
    d += `${pen ? 'L' : 'M'}${num(x)} ${num(y)}`;
    pen = true;
  }
  return d;
}

const textWidth = (text: string, size = FONT) => text.length * size * CHAR;

/** Text cut with an ellipsis to fit `width` (a long name in a title or legend; the caption carries it whole). */
function fit(text: string, width: number, size = FONT): string {
  const chars = Array.from(text);
  const room = Math.max(4, Math.floor(width / (size * CHAR)));
  return chars.length <= room ? text : `${chars.slice(0, room - 1).join('')}…`;
}

interface LegendEntry { label: string; colour: string; style: 'line' | 'points' | 'dashed'; markers?: boolean }

/** Legend rows under the plot: each entry a swatch and its label, wrapped to the width. */
function legendRows(entries: LegendEntry[], width: number): { entry: LegendEntry; x: number; row: number }[] {
  const placed: { entry: LegendEntry; x: number; row: number }[] = [];
  let x = 0;
  let row = 0;
  for (const entry of entries) {
    entry.label = fit(entry.label, width - 44);
    const w = 30 + textWidth(entry.label) + 14;
    if (x > 0 && x + w > width) { x = 0; row++; }
    placed.push({ entry, x, row });
    x += w;
  }
  return placed;
}

function swatch(e: LegendEntry, x: number, y: number): string {
  if (e.style === 'points') return `<circle cx="${num(x + 12)}" cy="${num(y)}" r="3" fill="${e.colour}"/>`;
  const dash = e.style === 'dashed' ? ' stroke-dasharray="6 4"' : '';
  const mark = e.markers ? `<circle cx="${num(x + 12)}" cy="${num(y)}" r="2.5" fill="${e.colour}"/>` : '';
  return `<line x1="${num(x)}" y1="${num(y)}" x2="${num(x + 24)}" y2="${num(y)}" stroke="${e.colour}" stroke-width="2"${dash}/>${mark}`;
}

/**
 * A plot as SVG text: title on top, the plot area with axes, ticks and light grid lines,
 * each series as a line, dashed line or points (clipped to the plot area), limit lines
 * dashed, and a legend under the x axis. Deterministic; every label, title and series name
 * is escaped, so markup in a name shows as text.
 *
 * @example
 * svgPlot({ title: 'Ez', x: { label: 't', unit: 's' }, y: { label: 'Ez', unit: 'V/m' },
 *   series: [{ label: 'FDTD', x: [0, 1e-9, 2e-9], y: [0, 1, 0] }] }); // '<svg …>…</svg>'
 */
export function svgPlot(spec: PlotSpec): string {
  const W = spec.width ?? 640;
  const plotH = spec.height ?? 360;
  const id = String(spec.id ?? 'plot').replace(/[^A-Za-z0-9_-]/g, '_');
  const limits = (spec.limits ?? []).filter((l) => Number.isFinite(l.value));
  const collect = (axis: 'x' | 'y') => {
    const values = limits.filter((l) => l.axis === axis).map((l) => l.value);
    for (const s of spec.series) {
      for (let k = 0; k < Math.min(s.x.length, s.y.length); k++) {
        const y = s.y[k];
        if (y !== null && Number.isFinite(s.x[k]) && Number.isFinite(y)) values.push(axis === 'x' ? s.x[k] : y);
      }
    }
    return values;
  };
  const marked = spec.series.some((s) => s.style === 'points' || s.markers);
  const xs = scaleOf(spec.x, collect('x'), marked);
  const ys = scaleOf(spec.y, collect('y'), marked);
  const xl = labelsOf(spec.x, xs);
  const yl = labelsOf(spec.y, ys);

  const left = 22 + Math.max(24, ...yl.ticks.map((t) => textWidth(t))) + 8;
  const right = W - 14;
  const top = spec.title ? 30 : 12;
  const bottom = plotH - 42;
  const entries: LegendEntry[] = [
    ...spec.series.map((s, k) => ({ label: s.label, colour: colourOf(s.colour, k), style: s.style ?? 'line', markers: s.markers && s.style !== 'points' })),
    ...limits.map((l) => ({ label: l.label, colour: LIMIT_COLOUR, style: 'dashed' as const })),
  ];
  const legend = legendRows(entries, right - left);
  const title = fit(spec.title, W - 40, FONT + 2);
  const rows = legend.length ? Math.max(...legend.map((l) => l.row)) + 1 : 0;
  const H = plotH + rows * 16 + (rows ? 6 : 0);
  const px = (v: number) => project(xs, v, left, right);
  const py = (v: number) => project(ys, v, bottom, top);

  const out: string[] = [];
  const ns = spec.xmlns === false ? '' : ' xmlns="http://www.w3.org/2000/svg"';
  out.push(`<svg${ns} viewBox="0 0 ${W} ${H}" width="${W}" height="${H}" role="img" aria-label="${escapeXml(spec.title)}" font-family="Helvetica, Arial, sans-serif" font-size="${FONT}">`);
  out.push(`<title>${escapeXml(spec.title)}</title>`);
  out.push(`<defs><clipPath id="${id}-clip"><rect x="${num(left)}" y="${num(top)}" width="${num(right - left)}" height="${num(bottom - top)}"/></clipPath></defs>`);
  if (spec.title) out.push(`<text x="${num(W / 2)}" y="18" text-anchor="middle" font-size="${FONT + 2}" font-weight="bold">${escapeXml(title)}</text>`);

  const grid: string[] = [];
  const tickText: string[] = [];
  xs.ticks.forEach((t, k) => {
    const x = px(t);
    grid.push(`M${num(x)} ${num(top)}V${num(bottom)}`);
    tickText.push(`<text x="${num(x)}" y="${num(bottom + 14)}" text-anchor="middle">${escapeXml(xl.ticks[k])}</text>`);
  });
  ys.ticks.forEach((t, k) => {
    const y = py(t);
    grid.push(`M${num(left)} ${num(y)}H${num(right)}`);
    tickText.push(`<text x="${num(left - 5)}" y="${num(y + 4)}" text-anchor="end">${escapeXml(yl.ticks[k])}</text>`);
  });
  out.push(`<path d="${grid.join('')}" stroke="#dddddd" stroke-width="1" fill="none"/>`);
  out.push(`<rect x="${num(left)}" y="${num(top)}" width="${num(right - left)}" height="${num(bottom - top)}" fill="none" stroke="#333333" stroke-width="1"/>`);
  out.push(...tickText);
  out.push(`<text x="${num((left + right) / 2)}" y="${num(bottom + 32)}" text-anchor="middle">${escapeXml(fit(xl.title, right - left))}</text>`);
  out.push(`<text transform="translate(13 ${num((top + bottom) / 2)}) rotate(-90)" text-anchor="middle">${escapeXml(fit(yl.title, bottom - top))}</text>`);

  out.push(`<g clip-path="url(#${id}-clip)">`);
  let drawn = 0;
  spec.series.forEach((s, k) => {
    const colour = colourOf(s.colour, k);
    const points = Array.from({ length: Math.min(s.x.length, s.y.length) }, (_, i): [number, number] => [px(s.x[i]), py(s.y[i] ?? NaN)]);
    const marks = points.filter(([x, y]) => !Number.isNaN(x) && !Number.isNaN(y));
    const markGroup = (r: number) => `<g fill="${colour}">${marks.map(([x, y]) => `<circle cx="${num(x)}" cy="${num(y)}" r="${r}"/>`).join('')}</g>`;
    if (s.style === 'points') {
      drawn += marks.length;
      if (marks.length) out.push(markGroup(3));
      return;
    }
    const d = pathData(thin(points, Math.ceil(right - left)));
    if (!d) return;
    drawn++;
    const dash = s.style === 'dashed' ? ' stroke-dasharray="6 4"' : '';
    out.push(`<path d="${d}" fill="none" stroke="${colour}" stroke-width="1.5" stroke-linejoin="round"${dash}/>`);
    if (s.markers) out.push(markGroup(2.5));
  });
  for (const l of limits) {
    const d = l.axis === 'y' ? `M${num(left)} ${num(py(l.value))}H${num(right)}` : `M${num(px(l.value))} ${num(top)}V${num(bottom)}`;
    if (!d.includes('NaN')) out.push(`<path d="${d}" fill="none" stroke="${LIMIT_COLOUR}" stroke-width="1.5" stroke-dasharray="6 4"/>`);
  }
  out.push('</g>');
  if (drawn === 0) out.push(`<text x="${num((left + right) / 2)}" y="${num((top + bottom) / 2)}" text-anchor="middle" fill="#777777">no data</text>`);

  for (const { entry, x, row } of legend) {
    const y = plotH + row * 16 + 4;
    out.push(swatch(entry, left + x, y));
    out.push(`<text x="${num(left + x + 30)}" y="${num(y + 4)}">${escapeXml(entry.label)}</text>`);
  }
  out.push('</svg>');
  return out.join('\n');
}
