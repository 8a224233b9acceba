/**
 * The scenario being edited ("draft"): plain data in the shape of a scenario file, SI units,
 * which may hold anything the person typed. Validation (src/scenario/parse.ts) judges it;
 * these helpers only read and write it, and convert between SI and the units shown.
 */
import type { PathSegment } from '../scenario/path.ts';

export type Draft = Record<string, unknown>;

export interface Edit { path: PathSegment[]; value: unknown }

/** The value at `path`, or undefined when any step is missing or not an object. */
export function readAt(draft: unknown, path: readonly PathSegment[]): unknown {
  let v: unknown = draft;
  for (const s of path) {
    if (v === null || typeof v !== 'object') return undefined;
    if (!Object.prototype.hasOwnProperty.call(v, s)) return undefined;
    v = (v as Record<PathSegment, unknown>)[s];
  }
  return v;
}

/** A copy of `draft` with `value` written at `path` (undefined deletes the field). */
export function writeAt(draft: Draft, path: readonly PathSegment[], value: unknown): Draft {
  if (path.length === 0) return value as Draft;
  const root: Draft = structuredClone(draft);
  let v: Record<PathSegment, unknown> = root;
  for (let k = 0; k < path.length - 1; k++) {
    const s = path[k];
    const next = v[s];
    if (next === null || typeof next !== 'object') v[s] = typeof path[k + 1] === 'number' ? [] : {};
    v = v[s] as Record<PathSegment, unknown>;
  }
  const last = path[path.length - 1];
  if (value === undefined) {
    if (Array.isArray(v) && typeof last === 'number') v.splice(last, 1);
    else delete v[last];
  } else {
    v[last] = value;
  }
  return root;
}

export function applyEdits(draft: Draft, edits: readonly Edit[]): Draft {
  let out = draft;
  for (const e of edits) out = writeAt(out, e.path, e.value);
  return out;
}

/** The unit menus of the form, smallest power last; the draft is always SI. */
export const UNIT_CHOICES = {
  length: ['m', 'mm', 'µm'],
  frequency: ['Hz', 'kHz', 'MHz', 'GHz', 'THz'],
  time: ['s', 'ms', 'µs', 'ns', 'ps', 'fs'],
  conductivity: ['S/m', 'mS/m'],
} as const;

export type UnitKind = keyof typeof UNIT_CHOICES;

/** The units the form shows, one per kind of quantity. */
export type DisplayUnits = { [K in UnitKind]: (typeof UNIT_CHOICES)[K][number] };

/** The SI unit of each kind, as the scenario model's messages write it. */
export const SI_UNIT: Record<UnitKind, string> = { length: 'm', frequency: 'Hz', time: 's', conductivity: 'S/m' };

export const DEFAULT_UNITS: DisplayUnits = { length: 'mm', frequency: 'GHz', time: 'ps', conductivity: 'S/m' };

/** Power of ten of each unit in SI. */
export const UNIT_EXPONENT: Record<string, number> = {
  m: 0, mm: -3, 'µm': -6,
  Hz: 0, kHz: 3, MHz: 6, GHz: 9, THz: 12,
  s: 0, ms: -3, 'µs': -6, ns: -9, ps: -12, fs: -15,
  'S/m': 0, 'mS/m': -3,
};

const NUMERAL = /^([+-]?(?:\d+\.?\d*|\.\d+))(?:[eE]([+-]?\d+))?$/;

/**
 * Text typed in a unit of 10^exponent to an SI number, parsed as a decimal so that
 * "150" mm is exactly 0.15 m (no 149.99999999999997). Empty text gives undefined (field
 * left out); text that is not a number is returned as is, so validation names it.
 *
 * @example
 * textToSi('150', -3); // 0.15
 */
export function textToSi(text: string, exponent: number): number | string | undefined {
  const t = text.trim().replace(/^−/, '-');
  if (t === '') return undefined;
  const m = NUMERAL.exec(t);
  if (!m) return text;
  return Number(`${m[1]}e${Number(m[2] ?? 0) + exponent}`);
}

/**
 * An SI number shown in a unit of 10^exponent, to 12 significant figures so that float
 * noise from the scaling does not show. Non-numbers are shown as they are.
 */
export function siToText(value: unknown, exponent: number): string {
  if (value === undefined || value === null) return '';
  if (typeof value !== 'number') return typeof value === 'string' ? value : JSON.stringify(value);
  if (!Number.isFinite(value)) return String(value);
  const [mantissa, power] = String(value).split('e');
  const shown = Number(`${mantissa}e${Number(power ?? 0) - exponent}`);
  return String(Number(shown.toPrecision(12)));
}

/** A name not yet used in `taken`: prefix + the lowest free number from 1. */
export function freshName(prefix: string, taken: readonly string[]): string {
  for (let k = 1; ; k++) {
    const name = `${prefix}${k}`;
    if (!taken.includes(name)) return name;
  }
}
