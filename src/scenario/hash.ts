/**
 * A fingerprint of a scenario, so a run done elsewhere can be matched to the scenario it
 * was asked to run (README "Batch scheduler round trip"): the 64-bit FNV-1a hash (Fowler,
 * Noll, Vo; as published at isthe.com/chongo/tech/comp/fnv) of its canonical JSON text, in
 * hex. Canonical: keys sorted at every level, numbers as JavaScript writes them, nothing
 * undefined. Not a security measure: it tells runs apart, it does not resist forgery.
 */
import type { Scenario } from './types.ts';

/** JSON text with object keys sorted at every level. */
export function canonicalJson(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map((v) => (v === undefined ? 'null' : canonicalJson(v))).join(',')}]`;
  if (value && typeof value === 'object') {
    const entries = Object.entries(value).filter(([, v]) => v !== undefined).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
    return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonicalJson(v)}`).join(',')}}`;
  }
  return JSON.stringify(value) ?? 'null';
}

/**
 * FNV-1a, 64 bits, over the UTF-8 bytes of a string, as 16 hex digits.
 *
 * @example
 * fnv1a64(''); // 'cbf29ce484222325' (the offset basis)
 * fnv1a64('a'); // 'af63dc4c8601ec8c'
 */
export function fnv1a64(text: string): string {
  const prime = 0x100000001b3n;
  const mask = 0xffffffffffffffffn;
  let h = 0xcbf29ce484222325n;
  for (const byte of new TextEncoder().encode(text)) h = ((h ^ BigInt(byte)) * prime) & mask;
  return h.toString(16).padStart(16, '0');
}

/** The fingerprint of a validated scenario (as `run` and the study's emitted files see it). */
export function scenarioHash(s: Scenario): string {
  return fnv1a64(canonicalJson(s));
}
