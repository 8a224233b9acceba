/**
 * Writing results as CSV and JSON (docs/outputs.md "Files of a run"). Numbers are written as
 * the shortest decimal that reads back to the same double; CSV follows RFC 4180 quoting;
 * text cells that a spreadsheet would run as a formula get a leading apostrophe.
 */

/**
 * The shortest decimal that reads back to the same double: ECMAScript Number::toString
 * (ECMA-262 §6.1.6.1.20) is specified to pick it. NaN is "NaN", ±Infinity "Infinity" and
 * "-Infinity". −0 is written "0": it reads back as a number equal to −0, and a signed zero
 * in a table only confuses.
 *
 * @example
 * formatNumber(0.1 + 0.2); // '0.30000000000000004'
 */
export function formatNumber(x: number): string {
  return String(x); // String(-0) is already "0"
}

/** Leading characters that make spreadsheets treat a cell as a formula. // OWASP CSV injection guidance */
const FORMULA_START = new Set(['=', '+', '-', '@', '\t', '\r']);

/**
 * One CSV cell. Numbers through {@link formatNumber}, never guarded (a negative number stays
 * "-1.5"). Text starting with = + - @, tab or CR gets a leading `'`; text holding a comma,
 * double quote, CR or LF is quoted with inner quotes doubled (RFC 4180 section 2, rules 6–7).
 *
 * @example
 * csvCell('say "hi", then go'); // '"say ""hi"", then go"'
 * csvCell('=SUM(A1)');          // "'=SUM(A1)"
 */
export function csvCell(value: string | number): string {
  if (typeof value === 'number') return formatNumber(value);
  const text = value.length > 0 && FORMULA_START.has(value[0]) ? `'${value}` : value;
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

/** One CSV record, cells joined by commas, without a line ending. */
export function csvRow(cells: readonly (string | number)[]): string {
  return cells.map(csvCell).join(',');
}

/**
 * A whole CSV file: header, then rows, each ended by "\n" (RFC 4180 allows readers LF;
 * we choose LF so files diff cleanly), including the last.
 *
 * @example
 * toCsv(['t_s', 'near.fdtd'], [[0, 0], [1e-12, 2.5]]); // 't_s,near.fdtd\n0,0\n1e-12,2.5\n'
 */
export function toCsv(header: readonly string[], rows: readonly (readonly (string | number)[])[]): string {
  let out = `${csvRow(header)}\n`;
  for (const row of rows) out += `${csvRow(row)}\n`;
  return out;
}

/**
 * Read CSV text into records of text cells (RFC 4180 section 2): records end at CRLF or
 * LF, a final line ending adds no record, quoted cells may hold commas, line breaks and
 * doubled quotes. Throws on a quote inside an unquoted cell, text after a closing quote,
 * or an unclosed quote, naming the record and column. Cells are returned as written: a
 * guarded cell keeps its leading apostrophe.
 *
 * @example
 * parseCsv('a,"b,c"\n1,2\n'); // [['a', 'b,c'], ['1', '2']]
 */
export function parseCsv(text: string): string[][] {
  const records: string[][] = [];
  let record: string[] = [];
  let cell = '';
  let i = 0;
  const where = () => `record ${records.length + 1}, column ${record.length + 1}`;
  if (text.length === 0) return records;
  for (;;) {
    if (text[i] === '"') {
      i++;
      for (;;) {
        if (i >= text.length) throw new Error(`CSV: quoted cell never closed (${where()})`);
        if (text[i] === '"') {
          if (text[i + 1] === '"') { cell += '"'; i += 2; continue; }
          i++;
          break;
        }
        cell += text[i++];
      }
      const next = text[i];
      if (next !== undefined && next !== ',' && next !== '\n' && next !== '\r') {
        throw new Error(`CSV: text after a closing quote (${where()})`);
      }
    } else {
      while (i < text.length && text[i] !== ',' && text[i] !== '\n' && text[i] !== '\r') {
        if (text[i] === '"') throw new Error(`CSV: double quote inside an unquoted cell (${where()})`);
        cell += text[i++];
      }
    }
    record.push(cell);
    cell = '';
    if (i >= text.length) { records.push(record); return records; }
    const ch = text[i];
    if (ch === ',') { i++; continue; }
    if (ch === '\r' && text[i + 1] === '\n') i += 2; else i++;
    records.push(record);
    record = [];
    if (i >= text.length) return records;
  }
}

/**
 * JSON for output files and `--json`: 2-space indent, ending with a newline. NaN and
 * ±Infinity become null (docs/outputs.md: undefined values are null in JSON), as do undefined
 * object fields, so a missing result shows as `null` rather than vanishing; typed arrays
 * are written as plain arrays.
 *
 * @example
 * jsonForOutput({ rho_m: NaN, steps: 3 }); // '{\n  "rho_m": null,\n  "steps": 3\n}\n'
 */
export function jsonForOutput(value: unknown): string {
  const text = JSON.stringify(value, (_key, v: unknown) => {
    if (v === undefined) return null;
    if (typeof v === 'number' && !Number.isFinite(v)) return null;
    if (ArrayBuffer.isView(v) && !(v instanceof DataView)) return Array.from(v as unknown as ArrayLike<number>);
    return v;
  }, 2);
  return `${text ?? 'null'}\n`;
}
