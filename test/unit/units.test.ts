import { describe, expect, it } from 'vitest';
import { figureOrNote, formatBytes, formatSI, formatSig } from '../../src/scenario/units.ts';

describe('SI formatting', () => {
  it('chooses the prefix that shows 1 to 999', () => {
    // prefixes and symbols: BIPM SI Brochure (9th ed.), Table 7
    expect(formatSI(1e10, 'Hz')).toBe('10 GHz');
    expect(formatSI(0.0015, 'm')).toBe('1.5 mm');
    expect(formatSI(1.6678204759907604e-12, 's')).toBe('1.67 ps');
    expect(formatSI(5e-7, 'm')).toBe('500 nm');
    expect(formatSI(999.96, 'V/m')).toBe('1 kV/m'); // rounds up into the next prefix (common practice, no source)
    expect(formatSI(-2.5e6, 'Hz')).toBe('−2.5 MHz');
  });

  it('handles zero, NaN and infinities on purpose', () => {
    expect(formatSI(0, 'm')).toBe('0 m');
    expect(formatSI(NaN, 'm')).toBe('—');
    expect(formatSI(Infinity, 'dB')).toBe('∞ dB');
    expect(formatSig(NaN)).toBe('—');
    expect(formatSig(-Infinity)).toBe('−∞');
  });

  it('gives a missing figure its reason or a dash, never a dash with a unit', () => {
    expect(figureOrNote(-1.234, '°')).toBe('−1.23°'); // common practice, no source
    expect(figureOrNote(0.05, ' dB', 'evanescent')).toBe('0.05 dB'); // a value wins over a note, common practice, no source
    expect(figureOrNote(NaN, '°', 'evanescent')).toBe('evanescent'); // common practice, no source
    expect(figureOrNote(NaN, ' dB')).toBe('—'); // common practice, no source
  });

  it('keeps significant figures and switches to exponents outside everyday magnitudes', () => {
    expect(formatSig(0.0104123, 3)).toBe('0.0104');
    expect(formatSig(-3.36712, 3)).toBe('−3.37');
    expect(formatSig(1.234e-7, 3)).toBe('1.23e−7');
  });

  it('prints bytes in binary units', () => {
    // IEC 80000-13 binary prefixes
    expect(formatBytes(512)).toBe('512 B');
    expect(formatBytes(1536)).toBe('1.50 KiB');
    expect(formatBytes(2 * 1024 ** 3)).toBe('2.00 GiB');
    // a count just under 1 MiB stays below 1000 of its unit, never "1.02e+3 KiB" (common practice, no source)
    expect(formatBytes(1046528)).toBe('0.998 MiB');
    expect(formatBytes(1000 * 1024 - 1)).toBe('0.977 MiB');
    expect(formatBytes(999)).toBe('999 B');
    expect(formatBytes(2 * 1024 ** 3, 4, true)).toBe('2 GiB');
  });

  it('keeps three significant digits below 1000 in the unit it picks', () => {
    // IEC 80000-13 binary prefixes; 1046528 = 1022 KiB = 0.998 MiB (common practice, no source)
    expect(formatBytes(1046528)).toBe('0.998 MiB');
    expect(formatBytes(1024 ** 2)).toBe('1.00 MiB'); // common practice, no source
    expect(formatBytes(999)).toBe('999 B'); // common practice, no source
    expect(formatBytes(1000)).toBe('0.977 KiB'); // 1000/1024, common practice, no source
    expect(formatBytes(999.4 * 1024)).toBe('999 KiB'); // common practice, no source
    expect(formatBytes(999.6 * 1024)).toBe('0.976 MiB'); // would round to 1000 KiB, common practice, no source
    expect(formatBytes(0)).toBe('0 B'); // common practice, no source
    expect(formatBytes(-2048)).toBe('−2.00 KiB'); // common practice, no source
    expect(formatBytes(NaN)).toBe('—'); // common practice, no source
    expect(formatBytes(Infinity)).toBe('∞ B'); // common practice, no source
    for (let e = 0; e < 50; e++) {
      const text = formatBytes(2 ** e * 1.37);
      expect(text, text).not.toMatch(/e\+|\d{4}/); // never an exponent or four digits, common practice, no source
    }
  });
});
