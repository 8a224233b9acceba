import { css, html, LitElement } from 'lit';
import { customElement, property } from 'lit/decorators.js';
import type { OptionValues, StudyOption } from '../studies/definition.ts';
import { controlStyles } from './theme.ts';

/**
 * The form of one study, made from its options (src/studies/definition.ts): a text field
 * (or a menu) per option offered on the page, marked when a problem names it. Sends
 * `gg-study-option` {name, value} as the person types.
 */
@customElement('gg-study-form')
export class GgStudyForm extends LitElement {
  static styles = [controlStyles, css`
    :host { display: block; }
    form { display: grid; grid-template-columns: repeat(auto-fit, minmax(11rem, 1fr)); gap: 0.5rem 0.8rem; align-items: end; }
    label { display: flex; flex-direction: column; gap: 0.15rem; font-size: 0.82rem; color: var(--gg-muted); }
    label input, label select { color: var(--gg-ink); width: 100%; }
  `];

  @property({ attribute: false }) options: readonly StudyOption[] = [];
  @property({ attribute: false }) values: OptionValues = {};
  @property({ attribute: false }) problems: readonly string[] = [];
  @property({ type: Boolean }) disabled = false;

  private send(name: string, value: string): void {
    this.dispatchEvent(new CustomEvent('gg-study-option', { detail: { name, value }, bubbles: true, composed: true }));
  }

  private field(o: StudyOption) {
    const value = this.values[o.name] ?? o.defaultText ?? '';
    const invalid = this.problems.some((p) => p.startsWith(`${o.name}:`) || p.startsWith(`${o.name} `));
    if (o.choices) {
      return html`<label>${o.label}
        <select title=${o.help} ?disabled=${this.disabled} @change=${(e: Event) => this.send(o.name, (e.target as HTMLSelectElement).value)}>
          ${o.choices.map((c) => html`<option value=${c} ?selected=${c === value}>${c}</option>`)}
        </select></label>`;
    }
    return html`<label>${o.label}
      <input .value=${value} inputmode="decimal" title=${o.help} placeholder=${o.defaultText ?? ''} aria-invalid=${invalid ? 'true' : 'false'}
        ?disabled=${this.disabled} @input=${(e: Event) => this.send(o.name, (e.target as HTMLInputElement).value)} /></label>`;
  }

  render() {
    return html`<form @submit=${(e: Event) => e.preventDefault()}>
      ${this.options.filter((o) => (o.where ?? 'both') !== 'cli' && !o.flag).map((o) => this.field(o))}
    </form>`;
  }
}

declare global {
  interface HTMLElementTagNameMap { 'gg-study-form': GgStudyForm }
}
