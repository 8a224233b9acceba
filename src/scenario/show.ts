/**
 * How numbers and values are written inside validation messages. A value the person typed
 * is echoed as typed (String(x)); a value we computed is rounded so the message stays short.
 */
import { formatBytes } from './units.ts';

/**
 * Describe any value for a message: numbers and booleans as written, text quoted and cut to
 * 40 characters, otherwise its kind ("an object", "an array", "null").
 *
 * @example
 * describeValue('0.001'); // '"0.001" (text)'
 */
export function describeValue(x: unknown): string {
  if (x === null) return 'null';
  if (x === undefined) return 'nothing';
  switch (typeof x) {
    case 'number': return String(x);
    case 'boolean': return String(x);
    case 'string': return `${quote(x)} (text)`;
    case 'bigint': return `${String(x)}n (a BigInt)`;
    case 'object': return Array.isArray(x) ? 'an array' : 'an object';
    case 'function': return 'a function';
    default: return `a ${typeof x}`;
  }
}

/** Text in double quotes, cut to `max` characters with an ellipsis, control characters escaped. */
export function quote(text: string, max = 40): string {
  const cut = text.length > max ? `${text.slice(0, max)}…` : text;
  return JSON.stringify(cut);
}

/**
 * A computed number to 4 significant digits, plain between 1e-3 and 1e6, otherwise in
 * e-notation without a plus sign or trailing zeros.
 *
 * @example
 * approx(0.7071067811865476); // '0.7071'
 * approx(299792458e3);        // '2.998e11'
 */
export function approx(x: number): string {
  if (!Number.isFinite(x)) return String(x);
  if (x === 0) return '0';
  const a = Math.abs(x);
  if (a >= 1e-3 && a < 1e6) return String(Number(x.toPrecision(4)));
  const [mantissa, exponent] = x.toExponential(3).split('e');
  const m = mantissa.includes('.') ? mantissa.replace(/0+$/, '').replace(/\.$/, '') : mantissa;
  return `${m}e${exponent.replace('+', '')}`;
}

/**
 * A position or size computed from grid indices (i·dx), with binary noise removed:
 * 289·0.001 shows as 0.289, not 0.28900000000000003.
 */
export function tidy(x: number): string {
  if (!Number.isFinite(x)) return String(x);
  return String(Number(x.toPrecision(12)));
}

/** The largest number with 4 decimals that does not exceed x: a safe value to suggest under a limit. */
export function floorTo4Decimals(x: number): number {
  return Math.floor(x * 1e4) / 1e4;
}

/**
 * A byte count in GiB (or MiB below 1 GiB) followed by the exact count.
 *
 * @example
 * showBytes(2 * 1024 ** 3); // '2 GiB (2147483648 bytes)'
 */
export function showBytes(bytes: number): string {
  return `${formatBytes(bytes, 4, true)} (${Number.isSafeInteger(bytes) ? String(bytes) : approx(bytes)} bytes)`;
}
