import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { csvCell, csvRow, formatNumber, jsonForOutput, parseCsv, toCsv } from '../../src/io/csv.ts';

describe('formatNumber', () => {
  it('writes the shortest decimal that reads back to the same double', () => {
    // ECMA-262 Number::toString picks the shortest round-tripping digits
    expect(formatNumber(0.1 + 0.2)).toBe('0.30000000000000004');
    expect(formatNumber(0.1)).toBe('0.1');
    expect(formatNumber(1e21)).toBe('1e+21');
    expect(formatNumber(1.6678204759907604e-12)).toBe('1.6678204759907604e-12');
    expect(formatNumber(5e-324)).toBe('5e-324'); // smallest subnormal, IEEE 754
    expect(formatNumber(Number.MAX_VALUE)).toBe('1.7976931348623157e+308');
    expect(formatNumber(-1.5)).toBe('-1.5');
  });
  it('NaN, ±Infinity and −0', () => {
    // docs/outputs.md "Files of a run": undefined values are NaN in CSV; −0 is written "0" (our choice)
    expect(formatNumber(NaN)).toBe('NaN');
    expect(formatNumber(Infinity)).toBe('Infinity');
    expect(formatNumber(-Infinity)).toBe('-Infinity');
    expect(formatNumber(-0)).toBe('0');
  });
  it('round-trips every double (property)', () => {
    // common practice, no source
    fc.assert(fc.property(fc.double(), (x) => {
      const back = Number(formatNumber(x));
      if (Number.isNaN(x)) expect(back).toBeNaN();
      else expect(back === x).toBe(true);
    }), { numRuns: 5000 });
  });
});

describe('csvCell: quoting', () => {
  // RFC 4180 section 2, rule 6: fields with line breaks, double quotes or commas are enclosed in double quotes
  it('plain text and numbers are not quoted', () => {
    expect(csvCell('near')).toBe('near');
    expect(csvCell('near.fdtd')).toBe('near.fdtd');
    expect(csvCell(2.5)).toBe('2.5');
    expect(csvCell('')).toBe('');
  });
  it('a comma', () => {
    expect(csvCell('a,b')).toBe('"a,b"'); // RFC 4180 section 2, rule 6
  });
  it('a double quote is doubled', () => {
    expect(csvCell('say "hi"')).toBe('"say ""hi"""'); // RFC 4180 section 2, rule 7
  });
  it('LF and CR', () => {
    expect(csvCell('two\nlines')).toBe('"two\nlines"'); // RFC 4180 section 2, rule 6
    expect(csvCell('two\rlines')).toBe('"two\rlines"'); // RFC 4180 section 2, rule 6
  });
});

describe('csvCell: formula guard', () => {
  // OWASP CSV injection guidance: prefix cells starting with = + - @ tab CR with a single quote
  it.each([
    ['=SUM(A1:A9)', "'=SUM(A1:A9)"],
    ['+1', "'+1"],
    ['-1.5', "'-1.5"],
    ['@cmd', "'@cmd"],
    ['\tx', "'\tx"],
  ])('text %j', (input, expected) => {
    expect(csvCell(input)).toBe(expected); // OWASP CSV injection guidance
  });
  it('a guarded cell that also needs quoting', () => {
    expect(csvCell('\rx')).toBe('"\'\rx"'); // OWASP CSV injection guidance, then RFC 4180 section 2, rule 6
    expect(csvCell('=A1,B1')).toBe('"\'=A1,B1"');
    expect(csvCell('=HYPERLINK("x")')).toBe('"\'=HYPERLINK(""x"")"');
  });
  it('numbers are never guarded', () => {
    // common practice, no source: a negative number must stay a number for the spreadsheet
    expect(csvCell(-1.5)).toBe('-1.5');
    expect(csvCell(-Infinity)).toBe('-Infinity');
  });
  it('the guard applies only at the start', () => {
    expect(csvCell('a=b')).toBe('a=b'); // OWASP CSV injection guidance concerns the first character
  });
});

describe('rows and files', () => {
  it('csvRow joins cells with commas', () => {
    expect(csvRow(['near', 1e-12, 'a,b', -0])).toBe('near,1e-12,"a,b",0'); // RFC 4180 section 2, rule 4
  });
  it('toCsv ends every record, the last included, with LF', () => {
    // RFC 4180 section 2, rules 2–3 (header line, final line break); LF rather than CRLF is our choice
    expect(toCsv(['t_s', 'near.fdtd', 'near.exact'], [[0, 0, 0], [1e-12, 2.5, NaN]]))
      .toBe('t_s,near.fdtd,near.exact\n0,0,0\n1e-12,2.5,NaN\n');
    expect(toCsv(['a'], [])).toBe('a\n');
  });
});

describe('parseCsv', () => {
  it('reads quoted cells, doubled quotes, CRLF and LF', () => {
    // RFC 4180 section 2, rules 1, 5, 6, 7
    expect(parseCsv('a,"b,c","say ""hi"""\r\n1,"two\nlines",\n')).toEqual([['a', 'b,c', 'say "hi"'], ['1', 'two\nlines', '']]);
    expect(parseCsv('x')).toEqual([['x']]);
    expect(parseCsv('')).toEqual([]);
    expect(parseCsv('\n')).toEqual([['']]);
  });
  it('refuses malformed text', () => {
    // RFC 4180 section 2, rule 5: quotes may not appear inside an unquoted field
    expect(() => parseCsv('a"b\n')).toThrow(/record 1, column 1/);
    expect(() => parseCsv('"a"b\n')).toThrow(/text after a closing quote/);
    expect(() => parseCsv('x,"open\n')).toThrow(/never closed \(record 1, column 2\)/);
  });
  it('reads back what toCsv writes, guard included (property)', () => {
    // common practice, no source: writer and reader agree on any text
    const cell = fc.oneof(fc.string(), fc.string({ unit: 'binary' }), fc.constantFrom('=1', '-x', '"', ',', '\r\n', ''), fc.double());
    const guard = (c: string | number) => (typeof c === 'number' ? formatNumber(c) : /^[=+\-@\t\r]/.test(c) ? `'${c}` : c);
    fc.assert(fc.property(
      fc.array(cell, { minLength: 1, maxLength: 6 }),
      fc.array(fc.array(cell, { minLength: 1, maxLength: 6 }), { maxLength: 6 }),
      (header, rows) => {
        const h = header.map(String);
        expect(parseCsv(toCsv(h, rows))).toEqual([h.map(guard), ...rows.map((r) => r.map(guard))]);
      },
    ), { numRuns: 1000 });
  });
});

describe('jsonForOutput', () => {
  it('writes NaN and ±Infinity as null, two-space indent, final newline', () => {
    // docs/outputs.md "Files of a run": undefined values are null in JSON
    expect(jsonForOutput({ rho_m: NaN, a: [Infinity, -Infinity, 1], b: { c: 2 } }))
      .toBe('{\n  "rho_m": null,\n  "a": [\n    null,\n    null,\n    1\n  ],\n  "b": {\n    "c": 2\n  }\n}\n');
  });
  it('keeps an undefined field as null and writes typed arrays as lists', () => {
    // common practice, no source
    expect(JSON.parse(jsonForOutput({ recommended: undefined, v: new Float64Array([1.5, NaN]) }))).toEqual({ recommended: null, v: [1.5, null] });
    expect(jsonForOutput(undefined)).toBe('null\n');
  });
  it('keeps every finite double exactly', () => {
    // ECMA-262 JSON.stringify writes numbers with Number::toString
    fc.assert(fc.property(fc.double({ noNaN: true, noDefaultInfinity: true }), (x) => {
      expect(JSON.parse(jsonForOutput({ x })).x === x).toBe(true);
    }), { numRuns: 1000 });
  });
});
