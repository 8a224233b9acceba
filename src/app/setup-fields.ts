/**
 * The building blocks of the set-up form: a number field shown in the chosen unit, a text
 * field, a collapsible section, and the scenario model's messages placed at their fields
 * (rewritten into the field's unit). One `FieldKit` is made per render of gg-setup; it
 * remembers which problem paths found a field, so the rest can be listed at the top.
 */
import { html, nothing, type TemplateResult } from 'lit';
import { renderPath, type PathSegment } from '../scenario/path.ts';
import type { Problem } from '../scenario/types.ts';
import { messageInUnit } from './field-messages.ts';
import { readAt, siToText, textToSi, UNIT_EXPONENT, type DisplayUnits, type Draft, type Edit, type UnitKind } from './draft.ts';

export interface FieldOptions {
  unit?: UnitKind;
  /** Unit text for fields without a unit choice (A, S/m). */
  fixedUnit?: string;
  placeholder?: string;
  whole?: boolean;
  /** Visually hidden label (rows of a list show column headings instead). */
  compact?: boolean;
}

/** What the kit needs from the form component. */
export interface FieldHost {
  readonly draft: Draft;
  readonly units: DisplayUnits;
  /** Text being typed, by path, so re-rendering never rewrites a half-typed number. */
  readonly typing: ReadonlyMap<string, string>;
  setTyping(key: string, text: string | undefined): void;
  /** Forgets every half-typed text (after a change of units or of a list's length). */
  clearTyping(): void;
  emit(edits: Edit[]): void;
}

/** A row column: its heading, its path and the unit its figures are shown in. */
export type Column = [label: string, path: PathSegment[], unit?: UnitKind];

export const idOf = (path: readonly PathSegment[]) => `f-${renderPath(path).replace(/[^A-Za-z0-9]+/g, '-')}`;

export class FieldKit {
  private readonly byPath = new Map<string, string[]>();
  private readonly shown = new Set<string>();

  constructor(readonly host: FieldHost, readonly problems: readonly Problem[]) {
    for (const p of problems) this.byPath.set(p.path, [...(this.byPath.get(p.path) ?? []), p.message]);
  }

  get(path: PathSegment[]): unknown {
    return readAt(this.host.draft, path);
  }

  list(path: PathSegment[]): Record<string, unknown>[] {
    const v = this.get(path);
    return Array.isArray(v) ? (v as Record<string, unknown>[]) : [];
  }

  /** The messages for a path, in the unit of `unit`'s kind. */
  private messages(path: PathSegment[], unit?: UnitKind): string[] | undefined {
    const found = this.byPath.get(renderPath(path));
    return found && unit ? found.map((m) => messageInUnit(m, unit, this.host.units[unit])) : found;
  }

  hasProblem(path: PathSegment[]): boolean {
    return this.byPath.has(renderPath(path));
  }

  problemText(path: PathSegment[], unit?: UnitKind): TemplateResult | typeof nothing {
    this.shown.add(renderPath(path));
    const messages = this.messages(path, unit);
    if (!messages) return nothing;
    return html`<div class="problem" id="${idOf(path)}-problem">${messages.join(' ')}</div>`;
  }

  /** Marks a path as shown by a row whose messages are listed under the whole row. */
  registerOnly(path: PathSegment[]): typeof nothing {
    this.shown.add(renderPath(path));
    return nothing;
  }

  /** The messages of a list row's fields, under the row, each named by its column. */
  rowProblems(columns: Column[]): TemplateResult | typeof nothing {
    const found = columns.flatMap(([label, path, unit]) => (this.messages(path, unit) ?? []).map((m) => ({ label, path, m })));
    if (found.length === 0) return nothing;
    return html`${found.map((f) => html`<div class="problem row-problem" id="${idOf(f.path)}-problem">${f.label}: ${f.m}</div>`)}`;
  }

  field(label: string, path: PathSegment[], o: FieldOptions = {}): TemplateResult {
    const key = renderPath(path);
    const unitText = o.unit ? this.host.units[o.unit] : o.fixedUnit;
    const exponent = o.unit ? UNIT_EXPONENT[this.host.units[o.unit]] : 0;
    const text = this.host.typing.get(key) ?? siToText(this.get(path), exponent);
    const invalid = this.byPath.has(key);
    const id = idOf(path);
    return html`
      <div class="field">
        <label for=${id} class=${o.compact ? 'visually-hidden' : ''}>${label}${unitText ? ` (${unitText})` : ''}</label>
        <input id=${id} name=${key} type="text" inputmode=${o.whole ? 'numeric' : 'decimal'} autocomplete="off" spellcheck="false"
          .value=${text} placeholder=${o.placeholder ?? ''} aria-invalid=${invalid ? 'true' : 'false'}
          aria-describedby=${invalid ? `${id}-problem` : nothing}
          @input=${(e: Event) => {
            const typed = (e.target as HTMLInputElement).value;
            this.host.setTyping(key, typed);
            this.host.emit([{ path, value: textToSi(typed, exponent) }]);
          }}
          @blur=${() => this.host.setTyping(key, undefined)} />
        ${o.compact ? this.registerOnly(path) : this.problemText(path, o.unit)}
      </div>`;
  }

  textField(label: string, path: PathSegment[], compact = false): TemplateResult {
    const key = renderPath(path);
    const v = this.get(path);
    const id = idOf(path);
    const invalid = this.byPath.has(key);
    return html`
      <div class="field">
        <label for=${id} class=${compact ? 'visually-hidden' : ''}>${label}</label>
        <input id=${id} name=${key} type="text" autocomplete="off" spellcheck="false" maxlength="60"
          .value=${typeof v === 'string' ? v : v === undefined ? '' : JSON.stringify(v)}
          aria-invalid=${invalid ? 'true' : 'false'} aria-describedby=${invalid ? `${id}-problem` : nothing}
          @input=${(e: Event) => this.host.emit([{ path, value: (e.target as HTMLInputElement).value }])} />
        ${compact ? this.registerOnly(path) : this.problemText(path)}
      </div>`;
  }

  /** A collapsible group of fields with the count of problems inside it. */
  section(title: string, prefix: PathSegment[], body: TemplateResult, wide = false): TemplateResult {
    const p = renderPath(prefix);
    const count = this.problems.filter((q) => q.path === p || q.path.startsWith(`${p}.`) || q.path.startsWith(`${p}[`)).length;
    return html`
      <details open>
        <summary>${title}${count ? html`<span class="count">${count} to fix</span>` : nothing}</summary>
        <div class="body ${wide ? 'wide' : ''}">${body}</div>
      </details>`;
  }

  /** A button that removes entry `k` of the list at `path`. */
  removeButton(path: PathSegment[], k: number, label: string, extraClass = ''): TemplateResult {
    return html`<button type="button" class="small ${extraClass}" aria-label=${label}
      @click=${() => { this.host.clearTyping(); this.host.emit([{ path, value: this.list(path).filter((_q, n) => n !== k) }]); }}>Remove</button>`;
  }

  /** Problems no field showed (call after rendering every field). */
  unshown(): Problem[] {
    return this.problems.filter((p) => !this.shown.has(p.path));
  }
}
