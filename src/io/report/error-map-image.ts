/**
 * The error map in the report: |FDTD/exact − 1| in dB over the grid (src/compare/error-map.ts)
 * shrunk to at most 200 pixels a side, each pixel the worst (largest) error of the block of
 * nodes it covers, so a local defect is never averaged away; drawn with a dark-to-bright
 * colour scale into a palette PNG (png.ts) embedded as a data: URI, with the absorber's
 * inner edge outlined and an SVG colour bar beside it.
 */
import { colourRangeDb, type ErrorMap } from '../../compare/error-map.ts';
import { formatSig } from '../../scenario/units.ts';
import { linearTicks } from '../svg-plot.ts';
import { base64, encodePalettePng } from './png.ts';
import { html, si, trusted, type Html } from './html.ts';

/** Longest side of the embedded image, pixels. */
export const MAP_MAX_PIXELS = 200;
/** Palette entries: 0..COLOURS−1 the scale, then the outline and "no value". */
const COLOURS = 254;
const OUTLINE = 254;
const NO_VALUE = 255;

/** The scale's anchors, dark (small error) to bright (large), RGB; our own choice, even steps in lightness. */
const ANCHORS: readonly [number, number, number][] = [
  [18, 20, 58], [36, 62, 140], [30, 122, 160], [52, 168, 128], [170, 200, 70], [250, 236, 150],
];

/**
 * The colour at u in [0, 1] of the dark-to-bright scale, RGB 0–255, linear between anchors;
 * u outside [0, 1] is clamped, NaN taken as 0.
 *
 * @example
 * scaleColour(0); // [18, 20, 58]
 */
export function scaleColour(u: number): [number, number, number] {
  const t = Math.min(1, Math.max(0, Number.isFinite(u) ? u : 0)) * (ANCHORS.length - 1);
  const k = Math.min(ANCHORS.length - 2, Math.floor(t));
  const f = t - k;
  const [a, b] = [ANCHORS[k], ANCHORS[k + 1]];
  return [0, 1, 2].map((c) => Math.round(a[c] + f * (b[c] - a[c]))) as [number, number, number];
}

export interface ShrunkMap {
  width: number;
  height: number;
  /** Nodes per pixel along each side. */
  factor: number;
  /** Row-major from the bottom row (j = 0) up; NaN where a block has no finite value. */
  db: Float32Array;
}

/**
 * The map shrunk by a whole factor so neither side exceeds `maxSide` pixels: each pixel holds
 * the largest finite dB value of its factor × factor block of nodes (NaN if none).
 *
 * @example
 * shrinkWorst({ nx: 400, ny: 300, f_Hz: 1e10, db }).width; // 200 (factor 2)
 */
export function shrinkWorst(map: ErrorMap, maxSide = MAP_MAX_PIXELS): ShrunkMap {
  const factor = Math.max(1, Math.ceil(Math.max(map.nx, map.ny) / maxSide));
  const width = Math.ceil(map.nx / factor);
  const height = Math.ceil(map.ny / factor);
  const db = new Float32Array(width * height).fill(NaN);
  for (let j = 0; j < map.ny; j++) {
    const row = Math.floor(j / factor) * width;
    for (let i = 0; i < map.nx; i++) {
      const v = map.db[j * map.nx + i];
      const k = row + Math.floor(i / factor);
      if (Number.isFinite(v) && !(v <= db[k])) db[k] = v;
    }
  }
  return { width, height, factor, db };
}

/**
 * The colour range, dB: 2nd to 98th percentile of the values `inset` pixels in from every
 * edge (the absorber left out), widened to 5 dB steps, as the page's "fit to the interior";
 * −80 to 0 dB when there are fewer than two values.
 *
 * @example
 * fittedRange(shrinkWorst(map), 5); // e.g. [-60, -45]
 */
export function fittedRange(m: ShrunkMap, inset: number): [number, number] {
  const values: number[] = [];
  for (let j = inset; j < m.height - inset; j++) {
    for (let i = inset; i < m.width - inset; i++) {
      const v = m.db[j * m.width + i];
      if (Number.isFinite(v)) values.push(v);
    }
  }
  return colourRangeDb(values);
}

/** The palette: the scale, then white for the outline and mid grey for "no value". */
function palette(): Uint8Array {
  const p = new Uint8Array(256 * 3);
  for (let k = 0; k < COLOURS; k++) p.set(scaleColour(k / (COLOURS - 1)), 3 * k);
  p.set([255, 255, 255], 3 * OUTLINE);
  p.set([150, 150, 150], 3 * NO_VALUE);
  return p;
}

/**
 * The shrunk map as PNG bytes, top row first (y grows upward on the page), values in dB
 * placed on the scale over `range`, the absorber's inner edge (`inset` pixels in from each
 * side; 0 for none) in white, pixels without a value grey.
 *
 * @example
 * mapPng(shrinkWorst(map), [-60, 0], 5); // Uint8Array starting 0x89 'PNG'
 */
export function mapPng(m: ShrunkMap, range: [number, number], inset: number): Uint8Array {
  const [lo, hi] = range;
  const indices = new Uint8Array(m.width * m.height);
  for (let row = 0; row < m.height; row++) {
    const j = m.height - 1 - row;
    for (let i = 0; i < m.width; i++) {
      const v = m.db[j * m.width + i];
      const edge = inset > 0 && ((i === inset - 1 || i === m.width - inset) && j >= inset - 1 && j <= m.height - inset ||
        (j === inset - 1 || j === m.height - inset) && i >= inset - 1 && i <= m.width - inset);
      indices[row * m.width + i] = edge ? OUTLINE : Number.isFinite(v) ? Math.round(Math.min(1, Math.max(0, (v - lo) / (hi - lo))) * (COLOURS - 1)) : NO_VALUE;
    }
  }
  return encodePalettePng(m.width, m.height, palette(), indices);
}

/** A vertical colour bar with ticks in dB, as inline SVG. */
function colourBar(range: [number, number]): string {
  const [lo, hi] = range;
  const top = 8;
  const height = 220;
  const steps = 48;
  const rects: string[] = [];
  for (let k = 0; k < steps; k++) {
    const [r, g, b] = scaleColour(1 - (k + 0.5) / steps);
    rects.push(`<rect x="4" y="${(top + (k * height) / steps).toFixed(2)}" width="16" height="${(height / steps + 0.3).toFixed(2)}" fill="rgb(${r},${g},${b})"/>`);
  }
  const ticks = linearTicks(lo, hi, 5).map((t) => {
    const y = top + ((hi - t) / (hi - lo)) * height;
    return `<line x1="20" y1="${y.toFixed(1)}" x2="25" y2="${y.toFixed(1)}" stroke="#333"/><text x="28" y="${(y + 4).toFixed(1)}">${formatSig(t, 4)} dB</text>`;
  });
  return `<svg viewBox="0 0 80 ${height + 2 * top}" role="img" aria-label="colour scale, ${lo} dB to ${hi} dB" font-family="Helvetica, Arial, sans-serif" font-size="11">` +
    `${rects.join('')}<rect x="4" y="${top}" width="16" height="${height}" fill="none" stroke="#333"/>${ticks.join('')}</svg>`;
}

/**
 * The error-map figure: image, colour bar and a caption saying how it was made; or the note
 * saying why there is none. dx, dy in m; absorberCells in cells.
 *
 * @example
 * errorMapFigure(errorMapOf(sim), undefined, 1e-3, 1e-3, 10);
 */
export function errorMapFigure(map: ErrorMap | undefined, note: string | undefined, dx: number, dy: number, absorberCells: number): Html {
  if (!map) return html`<p class="note">No error map: ${note ?? 'the run had no full-grid DFT'}.</p>`;
  const shrunk = shrinkWorst(map);
  const inset = absorberCells > 0 ? Math.max(1, Math.round(absorberCells / shrunk.factor)) : 0;
  const range = fittedRange(shrunk, inset);
  const uri = `data:image/png;base64,${base64(mapPng(shrunk, range, inset))}`;
  const shrunkText = shrunk.factor > 1
    ? `Shrunk from ${map.nx} × ${map.ny} nodes to ${shrunk.width} × ${shrunk.height} pixels: each pixel is the largest error of the ${shrunk.factor} × ${shrunk.factor} nodes it covers.`
    : `One pixel per node (${map.nx} × ${map.ny}).`;
  return html`<figure class="wide"><div class="map"><img src="${uri}" width="${shrunk.width}" height="${shrunk.height}" alt="Error map at ${si(map.f_Hz, 'Hz')}"><div class="bar">${trusted(colourBar(range))}</div></div>
<figcaption>Error map |FDTD/exact − 1| in dB at ${si(map.f_Hz, 'Hz')}, the first analysis frequency. x from 0 (left) to ${si((map.nx - 1) * dx, 'm')}, y from 0 (bottom) to ${si((map.ny - 1) * dy, 'm')}; the white outline is the inner edge of the absorber; grey: no value (the source node). ${shrunkText} Colour range: 2nd to 98th percentile of the interior, in 5 dB steps. Embedded as a palette PNG written by gridgauge (stored deflate blocks, no compression).</figcaption></figure>`;
}
