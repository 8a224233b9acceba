/**
 * Where JSON text first breaks the grammar of RFC 8259, with a plain reason. JSON.parse
 * reports errors differently in every engine (and some give no position at all), so we
 * scan the text ourselves once JSON.parse has refused it. The scan keeps its own stack,
 * so deeply nested input cannot overflow the call stack.
 */
export interface JsonErrorLocation {
  /** 1-based line; a line ends at LF, CR LF or CR. */
  line: number;
  /** 1-based column, counted in characters (code points). */
  column: number;
  reason: string;
}

interface Found { offset: number; reason: string }

const WHITESPACE = new Set([' ', '\t', '\n', '\r']);

/**
 * Locate the first syntax error in `text`, or undefined when the text is valid JSON.
 *
 * @example
 * locateJsonError('{\n  "a": 1,\n}'); // { line: 3, column: 1, reason: 'a comma before "}" …' }
 */
export function locateJsonError(text: string): JsonErrorLocation | undefined {
  const found = scan(text);
  if (found === undefined) return undefined;
  return { ...lineAndColumn(text, found.offset), reason: found.reason };
}

/** 1-based line and column of a UTF-16 offset. */
export function lineAndColumn(text: string, offset: number): { line: number; column: number } {
  let line = 1;
  let column = 1;
  for (let k = 0; k < offset && k < text.length; k++) {
    const ch = text.charCodeAt(k);
    if (ch === 10 || (ch === 13 && text.charCodeAt(k + 1) !== 10)) { line++; column = 1; }
    else if (ch === 13) continue; // the LF that follows ends the line
    else if (ch >= 0xdc00 && ch <= 0xdfff && k > 0 && isHighSurrogate(text.charCodeAt(k - 1))) continue;
    else column++;
  }
  return { line, column };
}

function isHighSurrogate(ch: number): boolean {
  return ch >= 0xd800 && ch <= 0xdbff;
}

function describeChar(ch: string | undefined): string {
  if (ch === undefined) return 'the end of the file';
  if (ch === "'") return "a single quote (JSON needs double quotes)";
  const code = ch.charCodeAt(0);
  if (code < 0x20) return `a control character (code ${code})`;
  return JSON.stringify(ch);
}

function scan(text: string): Found | undefined {
  type Container = 'object' | 'array';
  const stack: Container[] = [];
  let i = 0;
  const skipWhitespace = () => { while (i < text.length && WHITESPACE.has(text[i])) i++; };
  const err = (offset: number, reason: string): Found => ({ offset, reason });

  // States: expect a value, expect a key, or expect what follows a complete value.
  let state: 'value' | 'key' | 'after' = 'value';
  let afterComma = false; // a close bracket right after a comma is a trailing comma
  let justOpened = false; // a close bracket right after an open bracket is an empty container

  for (;;) {
    skipWhitespace();
    const ch = text[i];
    if (state === 'value') {
      if (ch === undefined) return err(i, 'the file ends where a value was expected');
      if ((ch === ']' && stack.at(-1) === 'array') && (justOpened || afterComma)) {
        if (afterComma) return err(i, 'a comma before "]" is not allowed in JSON; remove the last comma');
        stack.pop(); i++; state = 'after'; justOpened = false; continue;
      }
      justOpened = false;
      afterComma = false;
      if (ch === '{') { stack.push('object'); i++; state = 'key'; justOpened = true; continue; }
      if (ch === '[') { stack.push('array'); i++; state = 'value'; justOpened = true; continue; }
      if (ch === '"') {
        const bad = scanString(text, i);
        if (typeof bad !== 'number') return bad;
        i = bad; state = 'after'; continue;
      }
      if (ch === '-' || (ch >= '0' && ch <= '9')) {
        const bad = scanNumber(text, i);
        if (typeof bad !== 'number') return bad;
        i = bad; state = 'after'; continue;
      }
      const word = /^[A-Za-z_]+/.exec(text.slice(i, i + 20))?.[0] ?? '';
      if (word === 'true' || word === 'false' || word === 'null') { i += word.length; state = 'after'; continue; }
      if (word === 'NaN' || word === 'Infinity') return err(i, `${word} is not allowed in JSON; write a finite number`);
      if (ch === '/') return err(i, 'comments are not allowed in JSON; remove them');
      if (word !== '') return err(i, `${JSON.stringify(word)} is not a JSON value; text needs double quotes, and only true, false and null are bare words`);
      return err(i, `expected a value but found ${describeChar(ch)}`);
    }
    if (state === 'key') {
      if (ch === '}' && (justOpened || afterComma)) {
        if (afterComma) return err(i, 'a comma before "}" is not allowed in JSON; remove the last comma');
        stack.pop(); i++; state = 'after'; justOpened = false; continue;
      }
      justOpened = false;
      afterComma = false;
      if (ch !== '"') {
        if (ch === '/') return err(i, 'comments are not allowed in JSON; remove them');
        return err(i, `expected a field name in double quotes but found ${describeChar(ch)}`);
      }
      const end = scanString(text, i);
      if (typeof end !== 'number') return end;
      i = end;
      skipWhitespace();
      if (text[i] !== ':') return err(i, `expected ":" after the field name but found ${describeChar(text[i])}`);
      i++;
      state = 'value';
      continue;
    }
    // state === 'after'
    const top = stack.at(-1);
    if (top === undefined) {
      if (ch === undefined) return undefined;
      return err(i, `unexpected ${describeChar(ch)} after the end of the scenario; remove it`);
    }
    if (ch === ',') { i++; afterComma = true; state = top === 'object' ? 'key' : 'value'; continue; }
    if (top === 'object' && ch === '}') { stack.pop(); i++; continue; }
    if (top === 'array' && ch === ']') { stack.pop(); i++; continue; }
    if (ch === undefined) return err(i, `the file ends inside ${top === 'object' ? 'an object; a "}"' : 'a list; a "]"'} is missing`);
    const close = top === 'object' ? '"}"' : '"]"';
    return err(i, `expected "," or ${close} but found ${describeChar(ch)}; is a comma missing?`);
  }
}

/** Offset just past a valid string starting at `start` (a double quote), or the error. */
function scanString(text: string, start: number): number | Found {
  let i = start + 1;
  for (;;) {
    const ch = text[i];
    if (ch === undefined) return { offset: start, reason: 'this text is never closed; add the closing double quote' };
    if (ch === '"') return i + 1;
    if (ch === '\\') {
      const e = text[i + 1];
      if (e === 'u') {
        if (!/^[0-9A-Fa-f]{4}$/.test(text.slice(i + 2, i + 6))) return { offset: i, reason: '\\u must be followed by four hex digits' };
        i += 6;
        continue;
      }
      if (e !== undefined && '"\\/bfnrt'.includes(e)) { i += 2; continue; }
      return { offset: i, reason: `${e === undefined ? 'a lone backslash' : `"\\${e}"`} is not a JSON escape; write "\\\\" for a backslash` };
    }
    if (ch.charCodeAt(0) < 0x20) return { offset: i, reason: 'a line break or control character inside text; close the text first or write it as \\n' };
    i++;
  }
}

/** Offset just past a valid number starting at `start`, or the error. */
function scanNumber(text: string, start: number): number | Found {
  const pattern = /-?(0|[1-9][0-9]*)(\.[0-9]+)?([eE][+-]?[0-9]+)?/y;
  pattern.lastIndex = start;
  const m = pattern.exec(text);
  if (m === null) return { offset: start, reason: 'malformed number; write it like 0.5, -2 or 1e-3' };
  const end = start + m[0].length;
  const next = text[end];
  if (next !== undefined && /[0-9.eE+\-xX]/.test(next)) {
    return { offset: start, reason: 'malformed number; JSON numbers have no leading zeros, hex or trailing dots; write it like 0.5, -2 or 1e-3' };
  }
  return end;
}
