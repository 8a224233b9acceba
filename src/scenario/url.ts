/**
 * A scenario in a link: compact JSON, UTF-8 encoded, written in base64url without padding
 * (RFC 4648 section 5), so it can sit in a query string or fragment unescaped. Decoding
 * runs the result through the same validation as a file and never throws.
 */
import { parseScenarioText } from './parse.ts';
import type { ParseResult, Scenario } from './types.ts';

/** Path used for problems with the link text itself. */
export const LINK_PATH = '(link)';

const ALPHABET = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789-_';
const VALUE_OF = new Map<string, number>([...ALPHABET].map((ch, k) => [ch, k]));
// Standard base64 letters are read too, so a link that passed through a base64 tool still works.
VALUE_OF.set('+', 62);
VALUE_OF.set('/', 63);

/**
 * Bytes to base64url without padding (RFC 4648 section 5).
 *
 * @example
 * toBase64Url(new TextEncoder().encode('µ')); // 'wrU'
 */
export function toBase64Url(bytes: Uint8Array): string {
  let out = '';
  for (let k = 0; k < bytes.length; k += 3) {
    const b0 = bytes[k];
    const b1 = k + 1 < bytes.length ? bytes[k + 1] : 0;
    const b2 = k + 2 < bytes.length ? bytes[k + 2] : 0;
    const n = (b0 << 16) | (b1 << 8) | b2;
    out += ALPHABET[(n >> 18) & 63] + ALPHABET[(n >> 12) & 63];
    if (k + 1 < bytes.length) out += ALPHABET[(n >> 6) & 63];
    if (k + 2 < bytes.length) out += ALPHABET[n & 63];
  }
  return out;
}

/**
 * base64url (or standard base64, padded or not) to bytes; a string naming the first bad
 * character or a length no encoder produces, when the text is damaged.
 */
export function fromBase64Url(text: string): Uint8Array | string {
  const body = text.replace(/=+$/, '');
  if (body.length % 4 === 1) return `its length (${body.length} characters) cannot come from an encoded scenario; part of it is missing`;
  const out = new Uint8Array(Math.floor((body.length * 3) / 4));
  let acc = 0;
  let bits = 0;
  let n = 0;
  for (let k = 0; k < body.length; k++) {
    const v = VALUE_OF.get(body[k]);
    if (v === undefined) return `character ${JSON.stringify(body[k])} at position ${k + 1} does not belong in an encoded scenario`;
    acc = (acc << 6) | v;
    bits += 6;
    if (bits >= 8) {
      bits -= 8;
      out[n++] = (acc >> bits) & 0xff;
      acc &= (1 << bits) - 1;
    }
  }
  return out.subarray(0, n);
}

/**
 * Encode a scenario for a link.
 *
 * @example
 * const param = encodeScenario(demoScenario());
 * decodeScenario(param); // { ok: true, scenario: … }
 */
export function encodeScenario(s: Scenario): string {
  return toBase64Url(new TextEncoder().encode(JSON.stringify(s)));
}

/** Decode and validate a scenario from a link; problems, never an exception, for bad input. */
export function decodeScenario(encoded: string): ParseResult {
  try {
    if (typeof encoded !== 'string') return linkProblem('is not text');
    const trimmed = encoded.trim();
    if (trimmed === '') return linkProblem('holds no scenario');
    const bytes = fromBase64Url(trimmed);
    if (typeof bytes === 'string') return linkProblem(bytes);
    let text: string;
    try {
      text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
    } catch {
      return linkProblem('does not decode to UTF-8 text; part of it is damaged');
    }
    return parseScenarioText(text);
  } catch {
    return linkProblem('could not be read');
  }
}

function linkProblem(what: string): ParseResult {
  return { ok: false, problems: [{ path: LINK_PATH, message: `the scenario in this link ${what}; copy the whole link again` }] };
}
