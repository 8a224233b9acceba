import { css, html, LitElement, nothing } from 'lit';
import { customElement, property } from 'lit/decorators.js';
import { repeat } from 'lit/directives/repeat.js';
import { exactKind } from '../compare/reference.ts';
import type { RunResults } from '../compare/results.ts';
import type { Scenario } from '../scenario/types.ts';
import { formatSI } from '../scenario/units.ts';
import { fieldNames } from '../scenario/field-names.ts';
import './line-chart.ts';
import './summary-table.ts';
import { controlStyles, type ThemeName } from './theme.ts';
import './timeseries-chart.ts';

export const RUN_FILES = ['timeseries.csv', 'spectra.csv', 'lines.csv', 'summary.json'] as const;
export type RunFileName = (typeof RUN_FILES)[number];

/**
 * The comparison of the last run: the summary table per probe (the CLI's figures),
 * FDTD-over-exact time series at each probe, magnitude and phase along each probe line at
 * a chosen frequency, and downloads of the four run files. Labels follow the run's
 * polarization (Ez/I or Hz/M); a run without an exact reference says so and offers the
 * convergence study. Fires `gg-export` {name}, `gg-line-frequency` {index} and
 * `gg-open-study` {id}.
 */
@customElement('gg-results-panel')
export class GgResultsPanel extends LitElement {
  static styles = [controlStyles, css`
    :host { display: block; min-width: 0; }
    h3 { font-size: 0.95rem; margin: 1rem 0 0.4rem; }
    .exports { display: flex; gap: 0.4rem; flex-wrap: wrap; align-items: center; font-size: 0.85rem; }
    .charts { display: grid; grid-template-columns: repeat(auto-fit, minmax(min(100%, 26rem), 1fr)); gap: 1rem 1.2rem; }
    .stale { font-size: 0.85rem; color: var(--gg-warn); margin: 0 0 0.5rem; }
    .empty { color: var(--gg-muted); font-size: 0.9rem; margin: 0.3rem 0; }
    label.inline { display: inline-flex; gap: 0.35rem; align-items: center; font-size: 0.85rem; margin-bottom: 0.4rem; }
  `];

  @property({ attribute: false }) results: RunResults | undefined;
  /** The scenario that produced the results. */
  @property({ attribute: false }) scenario: Scenario | undefined;
  /** True when the set-up changed since the run that made these results. */
  @property({ type: Boolean }) stale = false;
  /** Index into the results' frequencies for the line charts. */
  @property({ type: Number }) lineFrequency = 0;
  @property() theme: ThemeName = 'light';

  /** Resolves once every chart of the current results has been drawn. */
  async drawn(): Promise<void> {
    await this.updateComplete;
    const charts = [...this.renderRoot.querySelectorAll('gg-timeseries-chart, gg-line-chart, gg-summary-table')] as LitElement[];
    await Promise.all(charts.map((c) => c.updateComplete));
  }

  private send(name: string, detail: unknown): void {
    this.dispatchEvent(new CustomEvent(name, { detail, bubbles: true, composed: true }));
  }

  render() {
    const results = this.results;
    const lineFreq = results?.frequencies[this.lineFrequency];
    const names = fieldNames(this.scenario?.polarization);
    const exact = this.scenario ? exactKind(this.scenario) : 'hankel';
    return html`
      <div class="card-head">
        <h2 id="compare-heading">Compare</h2>
        <div class="exports" role="group" aria-label="Download run files">
          <span class="muted">Download</span>
          ${RUN_FILES.map((name) => html`<button class="small" data-file=${name} ?disabled=${!results} @click=${() => this.send('gg-export', { name })}>${name}</button>`)}
        </div>
      </div>
      ${this.stale ? html`<p class="stale">These results are from the last run; the set-up has changed since. Press Run to update them.</p>` : nothing}
      <gg-summary-table .results=${results} .names=${names} exact=${exact}></gg-summary-table>
      <h3>Time series at the probes</h3>
      ${results && exact === 'none' ? html`<p class="empty">FDTD alone: no exact reference for these objects (see the note above).</p>` : nothing}
      ${results && results.probes.length ? html`
        <div class="charts">
          ${repeat(results.probes, (p) => p.name, (p) => html`<gg-timeseries-chart .probe=${p} .dt=${results.dt_s} .names=${names} theme=${this.theme}></gg-timeseries-chart>`)}
        </div>` : html`<p class="empty">FDTD and exact ${names.field} at each probe appear here after a run.</p>`}
      <h3>Along the probe lines</h3>
      ${results && results.lines.length && lineFreq !== undefined ? html`
        <label class="inline">Frequency
          <select @change=${(e: Event) => this.send('gg-line-frequency', { index: Number((e.target as HTMLSelectElement).value) })}>
            ${results.frequencies.map((f, k) => html`<option value=${k} ?selected=${k === this.lineFrequency}>${formatSI(f, 'Hz')}</option>`)}
          </select>
        </label>
        <div class="charts">
          ${repeat(results.lines, (l) => l.name, (l) => html`<gg-line-chart .line=${l} .frequency=${lineFreq} .names=${names} theme=${this.theme}></gg-line-chart>`)}
        </div>` : html`<p class="empty">Magnitude and phase of ${names.ratio} along each probe line appear here after a run (needs a line and an analysis frequency).</p>`}
    `;
  }
}

declare global {
  interface HTMLElementTagNameMap { 'gg-results-panel': GgResultsPanel }
}
