/** SI prefixes from tera to femto: scale and letter. */
export const SI_PREFIXES: readonly [number, string][] = [
  [1e12, 'T'], [1e9, 'G'], [1e6, 'M'], [1e3, 'k'], [1, ''], [1e-3, 'm'], [1e-6, 'µ'], [1e-9, 'n'], [1e-12, 'p'], [1e-15, 'f'],
];

/**
 * A value with an SI prefix and `digits` significant figures, e.g. formatSI(1.0e10, 'Hz') →
 * "10 GHz", formatSI(0.0015, 'm') → "1.5 mm". NaN and infinities print as "—" and "∞".
 *
 * @example
 * formatSI(1.6678e-12, 's'); // "1.67 ps"
 */
export function formatSI(value: number, unit: string, digits = 3): string {
  if (Number.isNaN(value)) return '—';
  if (!Number.isFinite(value)) return `${value < 0 ? '−' : ''}∞ ${unit}`.trim();
  if (value === 0) return `0 ${unit}`.trim();
  const a = Math.abs(value);
  const [scale, prefix] = SI_PREFIXES.find(([s]) => a >= s * 0.9995) ?? SI_PREFIXES[SI_PREFIXES.length - 1];
  return `${formatSig(value / scale, digits)} ${prefix}${unit}`.trim();
}

/**
 * A figure with its unit, or when it has no value (NaN, ±∞) the reason given in `note`
 * ("evanescent", "not reached") or a dash: never "—°" or "— dB".
 *
 * @example
 * figureOrNote(-1.234, '°'); // "−1.23°"
 * figureOrNote(NaN, '°', 'evanescent'); // "evanescent"
 * figureOrNote(NaN, ' dB'); // "—"
 */
export function figureOrNote(value: number, unit: string, note = '', digits = 3): string {
  return Number.isFinite(value) ? `${formatSig(value, digits)}${unit}` : note || '—';
}

/** A number with `digits` significant figures, no exponent for everyday magnitudes. */
export function formatSig(value: number, digits = 3): string {
  if (Number.isNaN(value)) return '—';
  if (!Number.isFinite(value)) return value < 0 ? '−∞' : '∞';
  if (value === 0) return '0';
  const a = Math.abs(value);
  if (a >= 1e6 || a < 1e-4) return value.toExponential(digits - 1).replace('-', '−');
  return Number(value.toPrecision(digits)).toString().replace('-', '−');
}

/**
 * Bytes in binary units (IEC 80000-13) with `digits` significant figures, in the unit that
 * keeps the figure below 1000: 1536 → "1.50 KiB", 1046528 → "0.998 MiB" (not "1.02e+3 KiB");
 * `trim` drops trailing zeros ("2 GiB" rather than "2.00 GiB"). Whole bytes below 1000
 * print as they are; NaN prints "—". The one byte formatter of the project.
 *
 * @example
 * formatBytes(1046528); // "0.998 MiB"
 */
export function formatBytes(bytes: number, digits = 3, trim = false): string {
  if (Number.isNaN(bytes)) return '—';
  if (!Number.isFinite(bytes)) return `${bytes < 0 ? '−' : ''}∞ B`;
  const units = ['B', 'KiB', 'MiB', 'GiB', 'TiB', 'PiB'];
  let v = Math.abs(bytes);
  let u = 0;
  // step up while the figure, once rounded to what is shown, would need four digits
  while (u < units.length - 1 && (u === 0 ? Math.round(v) : Number(v.toPrecision(digits))) >= 1000) { v /= 1024; u++; }
  const text = u === 0 ? String(Math.round(v)) : v.toPrecision(digits);
  return `${bytes < 0 ? '−' : ''}${trim ? String(Number(text)) : text} ${units[u]}`;
}
