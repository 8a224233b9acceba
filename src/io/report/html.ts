/**
 * Building the report's HTML with escaping by default: the `html` template escapes every
 * value it is given unless the value is already `Html` (made by this module), so a probe
 * named `<img src=x onerror=…>` lands in the page as text. Also the tables and number
 * formats every section shares.
 */
import { escapeXml } from '../svg-plot.ts';
import { formatSI, formatSig } from '../../scenario/units.ts';

/** A fragment of HTML that is safe to insert as is: escaped text, or markup made here. */
export class Html {
  constructor(readonly text: string) {}
  toString(): string { return this.text; }
}

/** What `html` accepts between its markup: text (escaped), numbers, fragments, lists of them, nothing. */
export type Part = Html | string | number | null | undefined | false | readonly Part[];

function partText(v: Part): string {
  if (v === null || v === undefined || v === false) return '';
  if (v instanceof Html) return v.text;
  if (Array.isArray(v)) return v.map(partText).join('');
  return escapeXml(String(v));
}

/**
 * HTML from a template: literal markup as written, every interpolated value escaped unless
 * it is `Html` already (HTML Living Standard §13.1: `&`, `<` in text; quotes in attributes).
 *
 * @example
 * html`<td>${'<b>'}</td>`.text; // '<td>&lt;b&gt;</td>'
 */
export function html(strings: TemplateStringsArray, ...values: Part[]): Html {
  let text = strings[0];
  values.forEach((v, k) => { text += partText(v) + strings[k + 1]; });
  return new Html(text);
}

/**
 * Markup made by trusted code (an SVG plot, whose text is escaped by the plot writer) as a fragment.
 *
 * @example
 * trusted('<svg></svg>').text; // '<svg></svg>'
 */
export const trusted = (markup: string) => new Html(markup);

/** A cell of a table: its content and whether it holds a number (right-aligned). */
export type Cell = Part | { value: Part; numeric?: boolean; className?: string; rowspan?: number };

function cellHtml(tag: 'td' | 'th', c: Cell): Html {
  if (c !== null && typeof c === 'object' && !(c instanceof Html) && !Array.isArray(c) && 'value' in c) {
    const cls = [c.numeric ? 'num' : '', c.className ?? ''].filter(Boolean).join(' ');
    return html`<${trusted(tag)}${cls ? html` class="${cls}"` : ''}${c.rowspan && c.rowspan > 1 ? html` rowspan="${c.rowspan}"` : ''}>${c.value}</${trusted(tag)}>`;
  }
  return html`<${trusted(tag)}>${c as Part}</${trusted(tag)}>`;
}

/**
 * A data table with a header row that repeats on every printed page; `picked` marks rows
 * (by index) to stand out, such as a study's recommendation.
 *
 * @example
 * dataTable(['probe', 'ρ'], [['near', { value: '30 mm', numeric: true }]]);
 */
export function dataTable(head: readonly Cell[], rows: readonly (readonly Cell[])[], className = 'data', picked: readonly boolean[] = []): Html {
  return html`<table class="${className}"><thead><tr>${head.map((h) => cellHtml('th', h))}</tr></thead><tbody>${
    rows.map((r, k) => html`<tr${picked[k] ? html` class="picked"` : ''}>${r.map((c) => cellHtml('td', c))}</tr>`)}</tbody></table>`;
}

/**
 * Fixed wording with the notation of the README made typographic: `^{…}` and `^(…)` become
 * superscripts, the Hankel function's order H0 a subscript. Only for the report's own texts.
 *
 * @example
 * notation('e^{+jωt}').text; // 'e<sup>+jωt</sup>'
 */
export function notation(text: string): Html {
  return new Html(escapeXml(text)
    .replace(/\bH0\^\((\d)\)/g, 'H<sub>0</sub><sup>($1)</sup>')
    .replace(/\^\{([^}]*)\}/g, '<sup>$1</sup>')
    .replace(/\^\(([^)]*)\)/g, '<sup>($1)</sup>')
    .replace(/\^m\b/g, '<sup>m</sup>'));
}

/**
 * A two-column table of named values (what, value).
 *
 * @example
 * keyValueTable([['time step', '1.18 ps']]);
 */
export function keyValueTable(rows: readonly (readonly [Part, Part])[]): Html {
  return html`<table class="kv"><tbody>${rows.map(([k, v]) => html`<tr><th scope="row">${k}</th><td>${v}</td></tr>`)}</tbody></table>`;
}

/** A number with an SI prefix and unit, 3 significant figures ("—" when not a number). */
export const si = (x: number, unit: string, digits = 3) => formatSI(x, unit, digits);
/** A plain number, 3 significant figures. */
export const sig = (x: number, digits = 3) => formatSig(x, digits);
/** A level in dB, 3 significant figures. */
export const dB = (x: number) => (Number.isNaN(x) ? '—' : `${formatSig(x, 3)} dB`);
/** An angle in degrees, 3 significant figures. */
export const deg = (x: number) => (Number.isNaN(x) ? '—' : `${formatSig(x, 3)}°`);
/** A number cell. */
export const numCell = (value: Part): Cell => ({ value, numeric: true });
