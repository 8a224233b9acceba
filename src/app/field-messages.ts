/**
 * The scenario model writes its messages in SI ("give the cell size along x in metres,
 * e.g. 0.001"), as a scenario file holds it. A field of the form may show another unit
 * (mm), so its message is rewritten into that unit: the value echoed at the start, every
 * figure followed by the SI symbol, the example after "e.g." and the words "in metres".
 * Other numbers (node indices, the Courant number) are left alone.
 */
import { SI_UNIT, UNIT_EXPONENT, type UnitKind } from './draft.ts';

/** How the model names each SI unit in running text ("in metres"). */
const SI_WORDS: Record<UnitKind, string> = { length: 'metres', frequency: 'Hz', time: 'seconds', conductivity: 'S/m' };

const NUMBER = String.raw`[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?`;

/** A decimal numeral scaled from SI into a unit of 10^exponent, without float noise (0.001 m → "1" mm). */
export function scaledNumeral(numeral: string, exponent: number): string {
  const [mantissa, power] = numeral.toLowerCase().split('e');
  const v = Number(`${mantissa}e${Number(power ?? 0) - exponent}`);
  if (!Number.isFinite(v)) return numeral;
  const tidy = Number(v.toPrecision(12));
  // a million and above as a person types it: 2e12 rather than 2000000000000
  return Math.abs(tidy) >= 1e6 ? tidy.toExponential().replace('e+', 'e') : String(tidy);
}

/**
 * `message` about a field of `kind` shown in `unit`, with its SI figures written in that unit.
 *
 * @example
 * messageInUnit('-0.001 is not above 0; give the cell size along x in metres, e.g. 0.001', 'length', 'mm');
 * // '-1 mm is not above 0; give the cell size along x in mm, e.g. 1'
 */
export function messageInUnit(message: string, kind: UnitKind, unit: string): string {
  const si = SI_UNIT[kind];
  const exponent = UNIT_EXPONENT[unit];
  if (unit === si || exponent === undefined) return message;
  const symbol = `${si}(?![\\p{L}])`;
  const pattern = new RegExp(
    `(?<example>e\\.g\\. )(?<ex>${NUMBER})(?<exUnit> ${symbol})?`
    + `|^(?<lead>${NUMBER})(?= is\\b)`
    + `|(?<![\\w.])(?<value>${NUMBER}) ${symbol}`
    + `|\\bin ${SI_WORDS[kind]}\\b`,
    'gu',
  );
  return message.replace(pattern, (whole, ...args) => {
    const g = args[args.length - 1] as Record<string, string | undefined>;
    if (g.ex !== undefined) return `${g.example}${scaledNumeral(g.ex, exponent)}${g.exUnit ? ` ${unit}` : ''}`;
    if (g.lead !== undefined) return `${scaledNumeral(g.lead, exponent)} ${unit}`;
    if (g.value !== undefined) return `${scaledNumeral(g.value, exponent)} ${unit}`;
    return whole.startsWith('in ') ? `in ${unit}` : whole;
  });
}
