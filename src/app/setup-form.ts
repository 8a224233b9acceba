import { css, html, LitElement, nothing, type TemplateResult } from 'lit';
import { customElement, property, state } from 'lit/decorators.js';
import type { DerivedQuantities } from '../scenario/derived.ts';
import type { Warning } from '../scenario/warnings.ts';
import type { Problem, Scenario } from '../scenario/types.ts';
import { UNIT_CHOICES, type DisplayUnits, type Draft, type Edit, type UnitKind } from './draft.ts';
import { frequenciesSection, linesSection, probesSection } from './list-editors.ts';
import { mediumSection } from './medium-section.ts';
import { ObjectCountsController } from './object-counts.ts';
import { objectsSection } from './objects-section.ts';
import { PermittivityCurvesCache } from './permittivity-curves.ts';
import { FieldKit, type FieldHost } from './setup-fields.ts';
import { readoutsList, warningsList } from './setup-readouts.ts';
import { absorberSection, gridSection, stepsSection } from './setup-sections.ts';
import { PreviewWaveform, sourceSection } from './source-section.ts';
import { controlStyles, type ThemeName } from './theme.ts';

const UNIT_MENUS: { kind: UnitKind; label: string }[] = [
  { kind: 'length', label: 'Lengths' }, { kind: 'frequency', label: 'Frequencies' }, { kind: 'time', label: 'Times' },
  { kind: 'conductivity', label: 'Conductivities' },
];

/**
 * The scenario form. Every field shows the draft's value in the chosen units, sends each
 * change up as `gg-edit` (SI values), and shows the scenario model's message for its path
 * in the field's unit. Problems with no field of their own are listed at the top. Derived
 * readouts follow the valid scenario live. The sections are built in setup-sections.ts,
 * source-section.ts and list-editors.ts; this component keeps the form's own state.
 */
@customElement('gg-setup')
export class GgSetup extends LitElement implements FieldHost {
  static styles = [controlStyles, css`
    :host { display: block; font-size: 0.9rem; }
    form { display: flex; flex-direction: column; gap: 0.6rem; }
    .units { display: flex; gap: 0.6rem; flex-wrap: wrap; align-items: end; }
    .units label { display: flex; flex-direction: column; font-size: 0.78rem; color: var(--gg-muted); gap: 0.15rem; }
    details { border: 1px solid var(--gg-border); border-radius: 8px; background: var(--gg-surface); }
    summary { cursor: pointer; padding: 0.45rem 0.7rem; font-weight: 600; list-style-position: inside; }
    summary .count { font-weight: 400; color: var(--gg-error); margin-left: 0.4rem; }
    .body { padding: 0.2rem 0.7rem 0.7rem; display: grid; grid-template-columns: repeat(auto-fill, minmax(min(100%, 8.5rem), 1fr)); gap: 0.5rem 0.6rem; }
    .body.wide { grid-template-columns: minmax(0, 1fr); }
    .field { display: flex; flex-direction: column; gap: 0.15rem; min-width: 0; }
    .field label { font-size: 0.78rem; color: var(--gg-muted); }
    .field input, .field select { width: 100%; min-width: 0; }
    .problem { color: var(--gg-error); font-size: 0.78rem; line-height: 1.25; overflow-wrap: anywhere; }
    .row { display: grid; gap: 0.35rem; align-items: start; }
    .cols-2 .row { grid-template-columns: minmax(4rem, 1.3fr) repeat(2, minmax(3rem, 1fr)) auto; }
    .cols-4 .row { grid-template-columns: minmax(3.5rem, 1.2fr) repeat(4, minmax(2.6rem, 1fr)) auto; }
    .row.single { grid-template-columns: minmax(6rem, 12rem) auto; }
    .row.single .end { align-self: end; justify-self: start; }
    .row-problem { margin: -0.15rem 0 0.2rem; }
    .full-row { grid-column: 1 / -1; }
    .row.head { font-size: 0.75rem; color: var(--gg-muted); }
    .list { display: flex; flex-direction: column; gap: 0.35rem; min-width: 0; }
    .list-actions { display: flex; gap: 0.5rem; flex-wrap: wrap; }
    .others { order: -1; border: 1px solid var(--gg-error); border-radius: 8px; padding: 0.5rem 0.7rem; background: var(--gg-surface); }
    .others h3 { font-size: 0.85rem; margin: 0 0 0.3rem; color: var(--gg-error); }
    .others ul { margin: 0; padding-left: 1.1rem; overflow-wrap: anywhere; }
    .others code { font-family: var(--gg-mono); font-size: 0.8rem; }
    .readouts { order: -1; display: grid; grid-template-columns: repeat(auto-fill, minmax(9.5rem, 1fr)); gap: 0.3rem 0.8rem;
      border: 1px solid var(--gg-border); border-radius: 8px; padding: 0.55rem 0.7rem; margin: 0; background: var(--gg-raised); }
    .readouts div { display: flex; flex-direction: column; }
    .readouts dt { font-size: 0.72rem; color: var(--gg-muted); }
    .readouts dd { margin: 0; font-variant-numeric: tabular-nums; font-weight: 600; }
    .readouts dd .note { display: block; font-weight: 400; font-size: 0.72rem; color: var(--gg-muted); }
    .readouts .warn { color: var(--gg-warn); }
    .readouts.invalid dd { color: var(--gg-muted); font-weight: 400; }
    .warnings { order: -1; margin: 0; padding: 0.45rem 0.7rem 0.45rem 1.6rem; border: 1px solid var(--gg-warn); border-radius: 8px;
      background: var(--gg-surface); font-size: 0.8rem; overflow-wrap: anywhere; }
    .warnings li + li { margin-top: 0.25rem; }
    .order-top { order: -2; }
    .hint { font-size: 0.75rem; color: var(--gg-muted); margin: 0; grid-column: 1 / -1; }
    .group { grid-column: 1 / -1; display: grid; grid-template-columns: repeat(auto-fill, minmax(min(100%, 7.5rem), 1fr));
      gap: 0.4rem 0.6rem; align-items: start; border: 1px solid var(--gg-grid); border-radius: 6px; padding: 0.4rem 0.55rem; background: var(--gg-raised); }
    .group .end { align-self: end; justify-self: start; }
    .group .group { background: var(--gg-surface); }
    .group-head { display: flex; gap: 0.5rem; align-items: baseline; flex-wrap: wrap; }
    .group-head .count-readout { margin-right: auto; font-size: 0.8rem; }
    .figures { display: grid; grid-template-columns: repeat(auto-fill, minmax(min(100%, 9rem), 1fr)); gap: 0.3rem 0.8rem; margin: 0; }
    .figures div { display: flex; flex-direction: column; }
    .figures dt { font-size: 0.72rem; color: var(--gg-muted); }
    .figures dd { margin: 0; font-variant-numeric: tabular-nums; font-weight: 600; }
  `];

  @property({ attribute: false }) draft: Draft = {};
  @property({ attribute: false }) problems: Problem[] = [];
  /** The draft as validated, undefined while it is wrong (for the εr(ω) chart and the object counts). */
  @property({ attribute: false }) scenario: Scenario | undefined;
  @property({ attribute: false }) derived: DerivedQuantities | undefined;
  @property({ attribute: false }) warnings: readonly Warning[] = [];
  @property({ attribute: false }) units!: DisplayUnits;
  /** Error maps the next run accumulates (for the memory readout). */
  @property({ type: Number }) maps = 0;
  @property({ type: Number }) cellRate: number | undefined;
  @property() theme: ThemeName = 'light';

  @state() typing: ReadonlyMap<string, string> = new Map();

  private readonly preview = new PreviewWaveform();
  private readonly curves = new PermittivityCurvesCache();
  private readonly counts = new ObjectCountsController(this);

  protected willUpdate(): void {
    this.counts.follow(this.scenario);
  }

  setTyping(key: string, text: string | undefined): void {
    if (text === undefined && !this.typing.has(key)) return;
    const next = new Map(this.typing);
    if (text === undefined) next.delete(key);
    else next.set(key, text);
    this.typing = next;
  }

  clearTyping(): void {
    this.typing = new Map();
  }

  emit(edits: Edit[]): void {
    this.dispatchEvent(new CustomEvent('gg-edit', { detail: { edits }, bubbles: true, composed: true }));
  }

  private unitSelect(kind: UnitKind, label: string): TemplateResult {
    return html`<label>${label}
      <select aria-label="${label} unit" @change=${(e: Event) => {
        this.clearTyping();
        this.dispatchEvent(new CustomEvent('gg-units', { detail: { ...this.units, [kind]: (e.target as HTMLSelectElement).value }, bubbles: true, composed: true }));
      }}>
        ${UNIT_CHOICES[kind].map((u) => html`<option ?selected=${this.units[kind] === u}>${u}</option>`)}
      </select></label>`;
  }

  render() {
    const kit = new FieldKit(this, this.problems);
    return html`
      <form @submit=${(e: Event) => e.preventDefault()} aria-label="Scenario set-up">
        <div class="units order-top">
          ${UNIT_MENUS.map((m) => this.unitSelect(m.kind, m.label))}
          <button type="button" @click=${() => this.dispatchEvent(new CustomEvent('gg-load-demo', { bubbles: true, composed: true }))}>Demo scenario</button>
        </div>
        ${readoutsList(this.derived, this.maps, this.cellRate)}
        ${warningsList(this.warnings)}
        ${gridSection(kit)}
        ${mediumSection(kit, { derived: this.derived, curves: this.curves.of(this.scenario), theme: this.theme })}
        ${objectsSection(kit, { counts: this.counts.counts, countsPending: this.counts.pending, f0Hz: this.derived?.f0_Hz })}
        ${absorberSection(kit)}
        ${sourceSection(kit, this.preview.of(kit), this.theme)}
        ${probesSection(kit)}
        ${linesSection(kit)}
        ${frequenciesSection(kit, this.derived?.f0_Hz)}
        ${stepsSection(kit, this.derived)}
        ${this.otherProblems(kit)}
      </form>
    `;
  }

  private otherProblems(kit: FieldKit): TemplateResult | typeof nothing {
    const rest = kit.unshown();
    if (rest.length === 0) return nothing;
    return html`
      <div class="others" role="alert">
        <h3>${rest.length === 1 ? 'One more problem' : `${rest.length} more problems`}</h3>
        <ul>${rest.map((p) => html`<li><code>${p.path}</code>: ${p.message}</li>`)}</ul>
      </div>`;
  }
}

declare global {
  interface HTMLElementTagNameMap { 'gg-setup': GgSetup }
}
