/**
 * Colour maps for the field and error maps, computed here in CIELAB rather than copied:
 * each map is a path through Lab with lightness linear along it, chroma kept inside the
 * sRGB gamut, and the path then resampled to equal CIE76 colour differences per step, so
 * equal steps in value look like equal steps in colour.
 *
 * - Diverging (signed Ez): neutral at zero, a cool arm for negative values and a warm arm
 *   for positive ones, symmetric in lightness. Light theme: pale centre, dark ends. Dark
 *   theme: dark centre, bright ends.
 * - Sequential (error in dB): dark to bright, hue turning from violet through red to yellow.
 *
 * Conversions: CIELAB (D65 white) to XYZ to linear sRGB to 8-bit sRGB, IEC 61966-2-1.
 */
import type { ThemeName } from './theme.ts';

type Lab = [number, number, number];

const WHITE = [0.95047, 1, 1.08883]; // D65, Y = 1

function labToLinearRgb([L, a, b]: Lab): [number, number, number] {
  const fy = (L + 16) / 116;
  const fx = fy + a / 500;
  const fz = fy - b / 200;
  const finv = (t: number) => (t > 6 / 29 ? t * t * t : 3 * (6 / 29) ** 2 * (t - 4 / 29));
  const X = WHITE[0] * finv(fx);
  const Y = WHITE[1] * finv(fy);
  const Z = WHITE[2] * finv(fz);
  return [
    3.2404542 * X - 1.5371385 * Y - 0.4985314 * Z,
    -0.969266 * X + 1.8760108 * Y + 0.041556 * Z,
    0.0556434 * X - 0.2040259 * Y + 1.0572252 * Z,
  ];
}

const inGamut = (rgb: number[]) => rgb.every((c) => c >= -1e-4 && c <= 1 + 1e-4);

function encode(c: number): number {
  const v = Math.min(1, Math.max(0, c));
  const s = v <= 0.0031308 ? 12.92 * v : 1.055 * v ** (1 / 2.4) - 0.055;
  return Math.round(255 * s);
}

/** Lab from lightness, chroma and hue (degrees), the chroma cut back until sRGB can show it. */
function lchInGamut(L: number, C: number, hueDeg: number): Lab {
  const h = (hueDeg * Math.PI) / 180;
  let lo = 0;
  let hi = C;
  const at = (c: number): Lab => [L, c * Math.cos(h), c * Math.sin(h)];
  if (inGamut(labToLinearRgb(at(hi)))) return at(hi);
  for (let k = 0; k < 30; k++) {
    const mid = 0.5 * (lo + hi);
    if (inGamut(labToLinearRgb(at(mid)))) lo = mid; else hi = mid;
  }
  return at(lo);
}

/** Resample a finely sampled Lab path to `n` colours equally spaced in CIE76 ΔE. */
function equalSteps(path: Lab[], n: number): Uint32Array {
  const dist = [0];
  for (let k = 1; k < path.length; k++) {
    const [a, b] = [path[k - 1], path[k]];
    dist.push(dist[k - 1] + Math.hypot(b[0] - a[0], b[1] - a[1], b[2] - a[2]));
  }
  const total = dist[dist.length - 1];
  const out = new Uint32Array(n);
  let seg = 1;
  for (let k = 0; k < n; k++) {
    const target = (total * k) / (n - 1);
    while (seg < path.length - 1 && dist[seg] < target) seg++;
    const span = dist[seg] - dist[seg - 1];
    const f = span > 0 ? (target - dist[seg - 1]) / span : 0;
    const lab: Lab = [0, 1, 2].map((c) => path[seg - 1][c] + f * (path[seg][c] - path[seg - 1][c])) as Lab;
    const [r, g, b] = labToLinearRgb(lab).map(encode);
    out[k] = (255 << 24) | (b << 16) | (g << 8) | r; // RGBA bytes on a little-endian Uint32 view
  }
  return out;
}

interface DivergingSpec { centreL: number; endL: number; endC: number; coolHue: number; warmHue: number }

const DIVERGING: Record<ThemeName, DivergingSpec> = {
  light: { centreL: 96, endL: 34, endC: 62, coolHue: 268, warmHue: 32 },
  dark: { centreL: 14, endL: 82, endC: 58, coolHue: 222, warmHue: 62 },
};

function divergingPath(s: DivergingSpec, samples = 400): Lab[] {
  const arm = (hue: number) => {
    const out: Lab[] = [];
    for (let k = 0; k <= samples; k++) {
      const t = k / samples; // 0 at the centre, 1 at the end
      // Chroma rises quickly from the neutral centre, so small values still show their sign.
      out.push(lchInGamut(s.centreL + t * (s.endL - s.centreL), s.endC * Math.sin((Math.PI / 2) * Math.min(1, 1.6 * t)), hue));
    }
    return out;
  };
  const cool = arm(s.coolHue).reverse();
  const warm = arm(s.warmHue).slice(1);
  return [...cool, ...warm];
}

function sequentialPath(samples = 800): Lab[] {
  const out: Lab[] = [];
  for (let k = 0; k <= samples; k++) {
    const t = k / samples;
    const hue = 300 + t * 140; // 300° → 440° = 80°: violet, red, orange, yellow
    out.push(lchInGamut(12 + 82 * t, 20 + 50 * Math.sin(Math.PI * Math.min(1, 0.15 + 0.85 * t)), hue % 360));
  }
  return out;
}

export const LUT_SIZE = 256;
const cache = new Map<string, Uint32Array>();

/**
 * 256-entry diverging map as packed RGBA (write straight into an ImageData's Uint32 view):
 * entry 0 for the most negative value, 128 near zero, 255 for the most positive.
 */
export function divergingLut(theme: ThemeName): Uint32Array {
  const key = `div-${theme}`;
  let lut = cache.get(key);
  if (!lut) {
    // Each arm is resampled on its own, so the neutral colour sits exactly at the middle.
    const spec = DIVERGING[theme];
    const whole = divergingPath(spec);
    const mid = (whole.length - 1) / 2;
    const cool = equalSteps(whole.slice(0, mid + 1), LUT_SIZE / 2);
    const warm = equalSteps(whole.slice(mid), LUT_SIZE / 2);
    lut = new Uint32Array(LUT_SIZE);
    lut.set(cool, 0);
    lut.set(warm, LUT_SIZE / 2);
    cache.set(key, lut);
  }
  return lut;
}

/** 256-entry sequential map, dark (entry 0) to bright (entry 255). */
export function sequentialLut(): Uint32Array {
  let lut = cache.get('seq');
  if (!lut) {
    lut = equalSteps(sequentialPath(), LUT_SIZE);
    cache.set('seq', lut);
  }
  return lut;
}

/** A LUT entry as a CSS colour, for legends. */
export function cssColour(packed: number): string {
  return `rgb(${packed & 255} ${(packed >>> 8) & 255} ${(packed >>> 16) & 255})`;
}

/** Value in [−1, 1] to a diverging LUT index. */
export function divergingIndex(v: number): number {
  const k = Math.floor((v + 1) * 0.5 * LUT_SIZE);
  return k < 0 ? 0 : k >= LUT_SIZE ? LUT_SIZE - 1 : k;
}
