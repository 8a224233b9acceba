import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { demoScenario } from '../../src/scenario/defaults.ts';
import { decodeScenario, encodeScenario, fromBase64Url, LINK_PATH, toBase64Url } from '../../src/scenario/url.ts';

const bytes = (s: string) => new TextEncoder().encode(s);

describe('base64url', () => {
  it.each([
    ['', ''], ['f', 'Zg'], ['fo', 'Zm8'], ['foo', 'Zm9v'], ['foob', 'Zm9vYg'], ['fooba', 'Zm9vYmE'], ['foobar', 'Zm9vYmFy'],
  ])('%j → %j', (plain, encoded) => {
    // RFC 4648 section 10 test vectors, padding dropped as section 5 allows for URLs
    expect(toBase64Url(bytes(plain))).toBe(encoded);
    expect(fromBase64Url(encoded)).toEqual(bytes(plain));
  });
  it('uses - and _ in place of + and /, and still reads + and / and padding', () => {
    // RFC 4648 section 5 (URL- and filename-safe alphabet)
    expect(toBase64Url(new Uint8Array([0xfb, 0xff]))).toBe('-_8');
    expect(fromBase64Url('+/8=')).toEqual(new Uint8Array([0xfb, 0xff]));
  });
  it('round-trips any bytes (property)', () => {
    // common practice, no source
    fc.assert(fc.property(fc.uint8Array({ maxLength: 200 }), (b) => {
      const e = toBase64Url(b);
      expect(e).toMatch(/^[A-Za-z0-9_-]*$/);
      expect(fromBase64Url(e)).toEqual(b);
    }), { numRuns: 500 });
  });
});

describe('scenario links', () => {
  it('the demo round-trips', () => {
    const r = decodeScenario(encodeScenario(demoScenario()));
    expect(r).toEqual({ ok: true, scenario: demoScenario() });
  });
  it('names beyond ASCII survive (UTF-8)', () => {
    // common practice, no source: btoa alone would fail on these
    const s = demoScenario();
    s.probes[0].name = 'Meßpunkt ü 東';
    const r = decodeScenario(encodeScenario(s));
    expect(r.ok && r.scenario.probes[0].name).toBe('Meßpunkt ü 東');
  });
  it('tolerates surrounding whitespace', () => {
    expect(decodeScenario(`  ${encodeScenario(demoScenario())}\n`).ok).toBe(true);
  });
  it.each([
    ['an empty link', '', /holds no scenario/],
    ['a character outside the alphabet', 'abc%def', /character "%" at position 4 does not belong/],
    ['a cut-off link', 'abcde', /part of it is missing/],
    ['bytes that are not UTF-8', toBase64Url(new Uint8Array([0xff, 0xfe, 0x80])), /does not decode to UTF-8 text/],
  ])('%s is refused on (link)', (_name, text, message) => {
    // common practice, no source
    const r = decodeScenario(text);
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.problems).toHaveLength(1);
      expect(r.problems[0].path).toBe(LINK_PATH);
      expect(r.problems[0].message).toMatch(message);
      expect(r.problems[0].message).toMatch(/copy the whole link again$/);
    }
  });
  it('a link holding an invalid scenario reports the scenario problems', () => {
    const s = demoScenario();
    s.grid.courant = 0.75;
    const r = decodeScenario(encodeScenario(s));
    expect(r.ok ? [] : r.problems.map((p) => p.path)).toEqual(['grid.courant']);
  });
  it('a link holding text that is not JSON reports where', () => {
    const r = decodeScenario(toBase64Url(bytes('{"steps": }')));
    expect(r.ok ? '' : r.problems[0].message).toMatch(/^malformed JSON at line 1, column 11/);
  });
  it('never throws on arbitrary text (property)', () => {
    // common practice, no source: a link is untrusted input
    fc.assert(fc.property(fc.oneof(fc.string(), fc.string({ unit: 'binary' }), fc.base64String()), (text) => {
      const r = decodeScenario(text);
      if (!r.ok) for (const p of r.problems) expect(p.path.length > 0 && p.message.length > 0).toBe(true);
    }), { numRuns: 1000 });
  });
});
