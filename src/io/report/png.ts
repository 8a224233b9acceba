/**
 * A minimal PNG writer for the report's error-map image: one 8-bit palette image
 * (colour type 3), rows unfiltered, the zlib stream made of stored (uncompressed) deflate
 * blocks. Built from the PNG specification (W3C PNG, 2nd edition = ISO/IEC 15948:2004:
 * signature §5.2, chunk layout and CRC §5.3, IHDR/PLTE/IDAT/IEND §11.2, filter type 0 §9),
 * zlib (RFC 1950: CMF/FLG header, Adler-32 trailer) and deflate (RFC 1951 §3.2.4: stored
 * blocks). No compression: the map is small, and the bytes are easy to check.
 */

/** The CRC-32 table for the reflected polynomial 0xEDB88320 (PNG §5.3 and its Annex D). */
const CRC_TABLE = (() => {
  const table = new Uint32Array(256);
  for (let n = 0; n < 256; n++) {
    let c = n;
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
    table[n] = c >>> 0;
  }
  return table;
})();

/**
 * CRC-32 of `bytes` as PNG and zip use it (ISO/IEC 15948 §5.3): initial value all ones,
 * reflected polynomial 0xEDB88320, final complement.
 *
 * @example
 * crc32(new TextEncoder().encode('123456789')); // 0xcbf43926
 */
export function crc32(bytes: Uint8Array, start = 0, end = bytes.length): number {
  let c = 0xffffffff;
  for (let k = start; k < end; k++) c = CRC_TABLE[(c ^ bytes[k]) & 0xff] ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
}

/**
 * Adler-32 of `bytes` (RFC 1950 §8.2): two sums modulo 65521, s2 in the high half.
 *
 * @example
 * adler32(new TextEncoder().encode('abc')); // 0x024d0127
 */
export function adler32(bytes: Uint8Array): number {
  const MOD = 65521;
  let a = 1;
  let b = 0;
  // reducing every 4096 bytes keeps both sums far below 2^53, where a double counts exactly
  for (let start = 0; start < bytes.length; start += 4096) {
    const end = Math.min(bytes.length, start + 4096);
    for (let k = start; k < end; k++) { a += bytes[k]; b += a; }
    a %= MOD;
    b %= MOD;
  }
  return ((b << 16) | a) >>> 0;
}

/** Largest payload of one stored deflate block (RFC 1951 §3.2.4: LEN is 16 bits). */
const STORED_MAX = 65535;

/**
 * A zlib stream (RFC 1950) holding `data` in stored deflate blocks (RFC 1951 §3.2.4):
 * header 0x78 0x01 (deflate, 32 KiB window, no dictionary, check bits making it a multiple
 * of 31), blocks of at most 65535 bytes each with LEN and its one's complement NLEN, the
 * last with BFINAL set, then the Adler-32 of `data`, most significant byte first.
 *
 * @example
 * zlibStored(new Uint8Array([1, 2, 3])); // 78 01 01 03 00 fc ff 01 02 03 00 0d 00 07
 */
export function zlibStored(data: Uint8Array): Uint8Array {
  const blocks = Math.max(1, Math.ceil(data.length / STORED_MAX));
  const out = new Uint8Array(2 + blocks * 5 + data.length + 4);
  out[0] = 0x78;
  out[1] = 0x01;
  let at = 2;
  for (let b = 0; b < blocks; b++) {
    const start = b * STORED_MAX;
    const len = Math.min(STORED_MAX, data.length - start);
    out[at++] = b === blocks - 1 ? 1 : 0; // BFINAL in bit 0, BTYPE 00 (stored), rest of the byte skipped
    out[at++] = len & 0xff;
    out[at++] = len >>> 8;
    out[at++] = ~len & 0xff;
    out[at++] = (~len >>> 8) & 0xff;
    out.set(data.subarray(start, start + len), at);
    at += len;
  }
  const check = adler32(data);
  out[at++] = check >>> 24;
  out[at++] = (check >>> 16) & 0xff;
  out[at++] = (check >>> 8) & 0xff;
  out[at++] = check & 0xff;
  return out;
}

function chunk(type: string, data: Uint8Array): Uint8Array {
  const out = new Uint8Array(12 + data.length);
  const view = new DataView(out.buffer);
  view.setUint32(0, data.length);
  for (let k = 0; k < 4; k++) out[4 + k] = type.charCodeAt(k);
  out.set(data, 8);
  view.setUint32(8 + data.length, crc32(out, 4, 8 + data.length));
  return out;
}

/** The eight bytes every PNG file starts with (ISO/IEC 15948 §5.2). */
export const PNG_SIGNATURE = new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);

/**
 * A palette PNG: `width` × `height` pixels (1..2^31−1 each), `indices` one byte per pixel,
 * row by row from the top, each an index into `palette` (RGB triples, 1 to 256 colours).
 * Throws a RangeError on sizes that do not match.
 *
 * @example
 * encodePalettePng(1, 1, new Uint8Array([255, 0, 0]), new Uint8Array([0])); // a red pixel
 */
export function encodePalettePng(width: number, height: number, palette: Uint8Array, indices: Uint8Array): Uint8Array {
  if (!(Number.isInteger(width) && Number.isInteger(height) && width >= 1 && height >= 1 && width < 2 ** 31 && height < 2 ** 31)) {
    throw new RangeError(`PNG size ${width} × ${height} is not two whole numbers from 1 to 2^31 − 1`);
  }
  const colours = palette.length / 3;
  if (!(Number.isInteger(colours) && colours >= 1 && colours <= 256)) throw new RangeError(`PNG palette of ${palette.length} bytes is not 1 to 256 RGB triples`);
  if (indices.length !== width * height) throw new RangeError(`PNG pixels: ${indices.length} given for ${width} × ${height}`);
  for (let k = 0; k < indices.length; k++) {
    if (indices[k] >= colours) throw new RangeError(`PNG pixel ${k} uses colour ${indices[k]} of a ${colours}-colour palette`);
  }
  const header = new Uint8Array(13);
  const hv = new DataView(header.buffer);
  hv.setUint32(0, width);
  hv.setUint32(4, height);
  header[8] = 8; // bit depth
  header[9] = 3; // colour type: palette
  // bytes 10-12: deflate, adaptive filtering, no interlace
  const raw = new Uint8Array(height * (width + 1));
  for (let j = 0; j < height; j++) {
    raw[j * (width + 1)] = 0; // filter type None
    raw.set(indices.subarray(j * width, (j + 1) * width), j * (width + 1) + 1);
  }
  const parts = [PNG_SIGNATURE, chunk('IHDR', header), chunk('PLTE', palette), chunk('IDAT', zlibStored(raw)), chunk('IEND', new Uint8Array(0))];
  const out = new Uint8Array(parts.reduce((n, p) => n + p.length, 0));
  let at = 0;
  for (const p of parts) { out.set(p, at); at += p.length; }
  return out;
}

const B64 = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789+/';

/**
 * Bytes as base64 (RFC 4648 §4, with padding), for a data: URI; the same in Node and in a browser.
 *
 * @example
 * base64(new TextEncoder().encode('foob')); // 'Zm9vYg=='
 */
export function base64(bytes: Uint8Array): string {
  const out: string[] = [];
  for (let k = 0; k < bytes.length; k += 3) {
    const n = (bytes[k] << 16) | ((bytes[k + 1] ?? 0) << 8) | (bytes[k + 2] ?? 0);
    out.push(B64[(n >>> 18) & 63], B64[(n >>> 12) & 63], k + 1 < bytes.length ? B64[(n >>> 6) & 63] : '=', k + 2 < bytes.length ? B64[n & 63] : '=');
  }
  return out.join('');
}
