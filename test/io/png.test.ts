/**
 * The report's PNG writer (src/io/report/png.ts): CRC-32, Adler-32, stored deflate blocks and
 * the PNG chunk layout, checked against Node's zlib (a general-purpose reference library:
 * zlib.crc32, and inflateSync, which verifies the zlib header and the Adler-32 trailer),
 * against published check values, and by reading our own files back chunk by chunk.
 */
import { crc32 as zlibCrc32, inflateSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { adler32, base64, crc32, encodePalettePng, PNG_SIGNATURE, zlibStored } from '../../src/io/report/png.ts';

const ascii = (s: string) => new TextEncoder().encode(s);

/** Deterministic pseudo-random bytes (a linear congruential generator; only a source of varied data). */
function bytes(n: number, seed = 1): Uint8Array {
  const out = new Uint8Array(n);
  let x = seed;
  for (let k = 0; k < n; k++) { x = (Math.imul(x, 1103515245) + 12345) >>> 0; out[k] = x >>> 24; }
  return out;
}

/** Chunks of a PNG file: type, data, and whether the stored CRC matches zlib's over type and data. */
function chunks(png: Uint8Array): { type: string; data: Uint8Array; crcOk: boolean }[] {
  const view = new DataView(png.buffer, png.byteOffset, png.byteLength);
  const out = [];
  for (let at = 8; at < png.length;) {
    const length = view.getUint32(at);
    const type = String.fromCharCode(...png.subarray(at + 4, at + 8));
    const data = png.subarray(at + 8, at + 8 + length);
    const crcOk = view.getUint32(at + 8 + length) === zlibCrc32(png.subarray(at + 4, at + 8 + length));
    out.push({ type, data, crcOk });
    at += 12 + length;
  }
  return out;
}

describe('checksums', () => {
  it('CRC-32 matches the published check value and zlib', () => {
    expect(crc32(ascii('123456789'))).toBe(0xcbf43926); // from memory: the CRC-32 "check" value of the CRC catalogue
    expect(crc32(new Uint8Array(0))).toBe(0); // fixture: node:zlib crc32 of nothing is 0
    for (const n of [1, 7, 1000, 70_000]) expect(crc32(bytes(n, n))).toBe(zlibCrc32(bytes(n, n))); // fixture: node:zlib crc32
  });

  it('Adler-32 follows RFC 1950 and agrees with zlib over long inputs', () => {
    expect(adler32(ascii('abc'))).toBe(0x024d0127); // RFC 1950 §8.2 definition, by hand: a = 1+97+98+99 = 295, b = 98+196+295 = 589
    expect(adler32(new Uint8Array(0))).toBe(1); // RFC 1950 §8.2: a starts at 1, b at 0
    expect(adler32(new Uint8Array(100_000).fill(255))).toBe(adlerByDefinition(new Uint8Array(100_000).fill(255))); // RFC 1950 §8.2, sums modulo 65521
  });
});

/** Adler-32 straight from RFC 1950 §8.2, reducing at every byte (slow, plain). */
function adlerByDefinition(data: Uint8Array): number {
  let a = 1;
  let b = 0;
  for (const d of data) { a = (a + d) % 65521; b = (b + a) % 65521; }
  return b * 65536 + a;
}

describe('zlib stream of stored blocks', () => {
  it('has a valid header and inflates back to the data, in one block or many', () => {
    const small = zlibStored(new Uint8Array([1, 2, 3]));
    expect([...small]).toEqual([0x78, 0x01, 0x01, 0x03, 0x00, 0xfc, 0xff, 1, 2, 3, 0x00, 0x0d, 0x00, 0x07]); // RFC 1950 §2.2 and RFC 1951 §3.2.4, by hand
    expect((0x78 * 256 + 0x01) % 31).toBe(0); // RFC 1950 §2.2: FCHECK makes CMF·256 + FLG a multiple of 31
    for (const n of [0, 1, 65_535, 65_536, 200_000]) {
      const data = bytes(n, 7);
      expect(Buffer.compare(inflateSync(zlibStored(data)), Buffer.from(data))).toBe(0); // fixture: node:zlib inflate checks the Adler-32 too
    }
  });

  it('is refused by zlib when a byte is changed, so the check is really there', () => {
    const stream = zlibStored(bytes(100, 3));
    stream[20] ^= 1;
    expect(() => inflateSync(stream)).toThrow(); // fixture: node:zlib reports the wrong Adler-32
  });
});

describe('palette PNG', () => {
  const palette = new Uint8Array([0, 0, 0, 255, 0, 0, 0, 255, 0]);
  const indices = new Uint8Array([0, 1, 2, 2, 1, 0]);
  const png = encodePalettePng(3, 2, palette, indices);

  it('starts with the signature and holds IHDR, PLTE, IDAT, IEND with good CRCs', () => {
    expect([...png.subarray(0, 8)]).toEqual([...PNG_SIGNATURE]); // ISO/IEC 15948 §5.2
    const c = chunks(png);
    expect(c.map((x) => x.type)).toEqual(['IHDR', 'PLTE', 'IDAT', 'IEND']); // ISO/IEC 15948 §5.6 chunk order
    for (const x of c) expect(x.crcOk).toBe(true); // fixture: node:zlib crc32 over type and data
    const ihdr = new DataView(c[0].data.buffer, c[0].data.byteOffset, 13);
    expect([ihdr.getUint32(0), ihdr.getUint32(4), ...c[0].data.subarray(8)]).toEqual([3, 2, 8, 3, 0, 0, 0]); // ISO/IEC 15948 §11.2.2
    expect([...c[1].data]).toEqual([...palette]);
  });

  it('stores each row after a filter byte 0, top row first', () => {
    const raw = inflateSync(chunks(png)[2].data); // fixture: node:zlib inflate
    expect([...raw]).toEqual([0, 0, 1, 2, 0, 2, 1, 0]); // ISO/IEC 15948 §9.2: filter type 0 before each row
  });

  it('refuses sizes and indices that do not fit', () => {
    expect(() => encodePalettePng(0, 1, palette, new Uint8Array(0))).toThrow(RangeError);
    expect(() => encodePalettePng(NaN, 1, palette, new Uint8Array(1))).toThrow(RangeError);
    expect(() => encodePalettePng(1.5, 1, palette, new Uint8Array(1))).toThrow(RangeError);
    expect(() => encodePalettePng(2 ** 31, 1, palette, new Uint8Array(1))).toThrow(RangeError);
    expect(() => encodePalettePng(2, 1, palette, new Uint8Array(3))).toThrow(RangeError);
    expect(() => encodePalettePng(1, 1, new Uint8Array(4), new Uint8Array(1))).toThrow(RangeError);
    expect(() => encodePalettePng(1, 1, new Uint8Array(257 * 3), new Uint8Array(1))).toThrow(RangeError);
    expect(() => encodePalettePng(1, 1, palette, new Uint8Array([3]))).toThrow(RangeError);
  });
});

describe('base64', () => {
  it('gives the RFC 4648 test vectors and agrees with Node for every length', () => {
    const vectors: [string, string][] = [['', ''], ['f', 'Zg=='], ['fo', 'Zm8='], ['foo', 'Zm9v'], ['foob', 'Zm9vYg=='], ['fooba', 'Zm9vYmE='], ['foobar', 'Zm9vYmFy']];
    for (const [plain, coded] of vectors) expect(base64(ascii(plain))).toBe(coded); // RFC 4648 §10 test vectors
    for (let n = 0; n < 40; n++) expect(base64(bytes(n, n + 11))).toBe(Buffer.from(bytes(n, n + 11)).toString('base64')); // fixture: Node Buffer base64
  });
});
