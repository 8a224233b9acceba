import { css, html, LitElement, nothing, type PropertyValues } from 'lit';
import { customElement, query } from 'lit/decorators.js';
import { repeat } from 'lit/directives/repeat.js';
import { formatSI } from '../scenario/units.ts';
import { demoScenario } from '../scenario/defaults.ts';
import { validateScenario } from '../scenario/parse.ts';
import { deriveQuantities } from '../scenario/derived.ts';
import type { Scenario } from '../scenario/types.ts';
import { AppController } from './controller.ts';
import type { DisplayUnits, Edit } from './draft.ts';
import { saveText } from './download.ts';
import './error-map.ts';
import './field-view.ts';
import './line-chart.ts';
import { initialScenario, linkParameter, savedTheme, savedUnits, writeLink } from './persist.ts';
import './run-controls.ts';
import type { RunCommand } from './run-controls.ts';
import './setup-form.ts';
import { Store, type AppState } from './store.ts';
import './studies-panel.ts';
import './summary-table.ts';
import { controlStyles, themeTokens, type ThemeName } from './theme.ts';
import './timeseries-chart.ts';

const RUN_FILES = ['timeseries.csv', 'spectra.csv', 'lines.csv', 'summary.json'] as const;

/**
 * The page: set-up on the left; run controls, the field and error maps, the comparison
 * charts and table, and studies on the right. Owns the store and the controller; passes
 * state down as properties and turns the components' events into controller actions.
 */
@customElement('gg-app')
export class GgApp extends LitElement {
  static styles = [themeTokens, controlStyles, css`
    :host {
      display: block; min-height: 100vh; background: var(--gg-bg); color: var(--gg-ink);
      font-family: var(--gg-font); line-height: 1.4;
    }
    header {
      display: flex; gap: 1rem; align-items: center; flex-wrap: wrap; padding: 0.6rem 1.1rem;
      border-bottom: 1px solid var(--gg-border); background: var(--gg-surface);
    }
    .brand { margin-right: auto; }
    h1 { font-size: 1.25rem; margin: 0; letter-spacing: 0.01em; }
    h1 span { color: var(--gg-accent); }
    .tagline { margin: 0; font-size: 0.82rem; color: var(--gg-muted); }
    .actions { display: flex; gap: 0.4rem; flex-wrap: wrap; align-items: center; }
    .notice { margin: 0.7rem 1.1rem 0; padding: 0.55rem 0.8rem; border-radius: 8px; border: 1px solid var(--gg-border);
      background: var(--gg-surface); display: flex; gap: 0.8rem; align-items: flex-start; }
    .notice.error { border-color: var(--gg-error); }
    .notice h2 { font-size: 0.92rem; margin: 0; }
    .notice.error h2 { color: var(--gg-error); }
    .notice ul { margin: 0.25rem 0 0; padding-left: 1.1rem; font-size: 0.85rem; }
    .notice > div { flex: 1; min-width: 0; overflow-wrap: anywhere; }
    .layout { display: grid; grid-template-columns: minmax(20rem, 26rem) minmax(0, 1fr); gap: 1rem; padding: 1rem 1.1rem 2rem; align-items: start; }
    @media (max-width: 960px) { .layout { grid-template-columns: minmax(0, 1fr); } }
    aside { display: flex; flex-direction: column; gap: 0.5rem; }
    aside h2, .work h2 { font-size: 1.05rem; margin: 0; }
    .work { display: flex; flex-direction: column; gap: 1rem; min-width: 0; }
    .maps { display: grid; grid-template-columns: repeat(auto-fit, minmax(min(100%, 22rem), 1fr)); gap: 1rem; }
    .charts { display: grid; grid-template-columns: repeat(auto-fit, minmax(min(100%, 26rem), 1fr)); gap: 1rem 1.2rem; }
    .compare h3 { font-size: 0.95rem; margin: 1rem 0 0.4rem; }
    .exports { display: flex; gap: 0.4rem; flex-wrap: wrap; align-items: center; font-size: 0.85rem; }
    .stale { font-size: 0.85rem; color: var(--gg-warn); margin: 0 0 0.5rem; }
    .empty { color: var(--gg-muted); font-size: 0.9rem; margin: 0.3rem 0; }
    label.inline { display: inline-flex; gap: 0.35rem; align-items: center; font-size: 0.85rem; }
    footer { padding: 0 1.1rem 1.5rem; font-size: 0.78rem; color: var(--gg-muted); }
  `];

  readonly store: Store;
  readonly controller: AppController;
  private readonly openedFrom: 'link' | 'saved' | 'demo';
  private lastValid: Scenario;
  private drawnResults: unknown;

  @query('#open-file') private fileInput!: HTMLInputElement;

  constructor() {
    super();
    const initial = initialScenario();
    const check = validateScenario(initial.draft);
    const demo = demoScenario();
    this.lastValid = check.ok ? check.scenario : demo;
    this.openedFrom = initial.from;
    this.store = new Store({
      draft: initial.draft, check, derived: check.ok ? deriveQuantities(check.scenario) : undefined,
      units: savedUnits(), theme: savedTheme(),
      run: { phase: 'idle', runId: 0, stepsDone: 0, stepsTotal: 0, stepsPerSecond: 0 },
      results: undefined, resultsScenario: undefined, errorMap: undefined,
      lineFrequency: 0, mapFrequency: 0, measuredCellRate: undefined,
      notice: initial.linkProblems ? {
        kind: 'error', title: 'The scenario in this link could not be used; showing your last scenario instead',
        lines: initial.linkProblems.map((p) => `${p.path}: ${p.message}`),
      } : undefined,
    });
    this.controller = new AppController(this.store);
    this.store.addEventListener('change', () => this.requestUpdate());
    if (check.ok) writeLink(check.scenario);
  }

  private get state(): AppState {
    return this.store.state;
  }

  connectedCallback(): void {
    super.connectedCallback();
    this.addEventListener('gg-edit', this.onEdit as EventListener);
    this.addEventListener('gg-apply-scenario', this.onApply as EventListener);
    window.addEventListener('hashchange', this.onHashChange);
    const params = new URLSearchParams(window.location.search);
    const autorun = params.get('autorun');
    const untouchedDemo = JSON.stringify(this.state.draft) === JSON.stringify(demoScenario());
    if (autorun === '1' || (autorun !== '0' && (this.openedFrom === 'demo' || untouchedDemo) && this.state.check.ok)) {
      this.controller.run();
    }
  }

  disconnectedCallback(): void {
    super.disconnectedCallback();
    this.removeEventListener('gg-edit', this.onEdit as EventListener);
    this.removeEventListener('gg-apply-scenario', this.onApply as EventListener);
    window.removeEventListener('hashchange', this.onHashChange);
  }

  /** A link pasted into the address bar of the open page (the page's own updates fire no event). */
  private onHashChange = () => {
    const encoded = linkParameter();
    if (encoded !== undefined) this.controller.openLink(encoded);
  };

  private onEdit = (e: CustomEvent<{ edits: Edit[] }>) => {
    e.stopPropagation();
    this.controller.edit(e.detail.edits);
  };

  private onApply = (e: CustomEvent<Scenario>) => {
    e.stopPropagation();
    this.controller.applyScenario(e.detail, 'Applied the study’s recommendation to the set-up');
  };

  protected willUpdate(): void {
    const s = this.state;
    if (s.check.ok) this.lastValid = s.check.scenario;
    this.setAttribute('theme', s.theme);
    this.dataset.phase = s.run.phase;
    document.documentElement.dataset.theme = s.theme;
  }

  protected updated(_changed: PropertyValues<this>): void {
    const results = this.state.results;
    if (results && results !== this.drawnResults) {
      this.drawnResults = results;
      void this.markCompareDrawn();
    }
  }

  /** Records the time from pressing Run to the drawn comparison (for the benchmark). */
  private async markCompareDrawn(): Promise<void> {
    const charts = [...this.renderRoot.querySelectorAll('gg-timeseries-chart, gg-line-chart, gg-summary-table, gg-error-map')] as LitElement[];
    await Promise.all(charts.map((c) => c.updateComplete));
    await new Promise((resolve) => requestAnimationFrame(resolve));
    performance.clearMarks('gg-compare-drawn');
    performance.mark('gg-compare-drawn');
    try {
      const m = performance.measure('gg-run-to-compare', 'gg-run-pressed', 'gg-compare-drawn');
      this.dataset.compareMs = m.duration.toFixed(1);
      const drawing = performance.measure('gg-results-to-compare', 'gg-results-arrived', 'gg-compare-drawn');
      this.dataset.drawingMs = drawing.duration.toFixed(1);
    } catch {
      // no run-pressed mark: results came from elsewhere
    }
    this.dataset.drawnRun = String(this.state.run.runId);
  }

  private command(c: RunCommand): void {
    const ctl = this.controller;
    if (c === 'run') ctl.run();
    else if (c === 'pause') ctl.pause();
    else if (c === 'resume') ctl.resume();
    else if (c === 'stop') ctl.stop();
    else ctl.reset();
  }

  private async openFile(): Promise<void> {
    const file = this.fileInput.files?.[0];
    this.fileInput.value = '';
    if (file) await this.controller.loadFile(file);
  }

  private async copyLink(): Promise<void> {
    const { check } = this.state;
    if (!check.ok) return;
    writeLink(check.scenario);
    let copied = false;
    try {
      await navigator.clipboard.writeText(window.location.href);
      copied = true;
    } catch {
      copied = false;
    }
    this.store.set({
      notice: { kind: 'info', title: copied ? 'Link copied: it opens this scenario' : 'The address bar now holds a link to this scenario; copy it from there', lines: [] },
    });
  }

  private exportRunFile(name: (typeof RUN_FILES)[number]): void {
    const files = this.controller.runFiles();
    if (!files) return;
    saveText(name, files[name], name.endsWith('.json') ? 'application/json' : 'text/csv');
  }

  private blockedReason(): string {
    const { check } = this.state;
    if (check.ok) return '';
    const n = check.problems.length;
    return `Fix ${n === 1 ? 'the marked entry' : `the ${n} marked entries`} in Set-up to run`;
  }

  render() {
    const s = this.state;
    const shown = s.check.ok ? s.check.scenario : this.lastValid;
    const problems = s.check.ok ? [] : s.check.problems;
    const results = s.results;
    const stale = results && s.resultsScenario && JSON.stringify(s.resultsScenario) !== JSON.stringify(s.check.ok ? s.check.scenario : undefined);
    const nextTheme: ThemeName = s.theme === 'dark' ? 'light' : 'dark';
    const lineFreq = results?.frequencies[s.lineFrequency];
    return html`
      <header>
        <div class="brand">
          <h1>grid<span>gauge</span></h1>
          <p class="tagline">2D TMz Yee grid with CPML against the exact field of a pulsed line current</p>
        </div>
        <div class="actions" role="toolbar" aria-label="Scenario files and sharing">
          <button @click=${() => this.fileInput.click()}>Open scenario…</button>
          <input id="open-file" class="visually-hidden" type="file" accept=".json,application/json" tabindex="-1" aria-hidden="true"
            @change=${this.openFile} />
          <button @click=${() => this.controller.saveScenario()} ?disabled=${!s.check.ok}>Save scenario</button>
          <button @click=${this.copyLink} ?disabled=${!s.check.ok}>Copy link</button>
          <button aria-pressed=${s.theme === 'dark' ? 'true' : 'false'} @click=${() => this.controller.setTheme(nextTheme)}>Dark theme</button>
        </div>
      </header>
      ${s.notice ? html`
        <div class="notice ${s.notice.kind}" role=${s.notice.kind === 'error' ? 'alert' : 'status'}>
          <div>
            <h2>${s.notice.title}</h2>
            ${s.notice.lines.length ? html`<ul>${s.notice.lines.map((l) => html`<li>${l}</li>`)}</ul>` : nothing}
          </div>
          <button class="small" @click=${() => this.controller.dismissNotice()} aria-label="Dismiss this message">Dismiss</button>
        </div>` : nothing}
      <main class="layout">
        <aside aria-labelledby="setup-heading">
          <h2 id="setup-heading">Set-up</h2>
          <gg-setup .draft=${s.draft} .problems=${problems} .scenario=${s.check.ok ? s.check.scenario : undefined}
            .derived=${s.derived} .units=${s.units} .cellRate=${s.measuredCellRate} theme=${s.theme}
            @gg-units=${(e: CustomEvent<DisplayUnits>) => this.controller.setUnits(e.detail)}
            @gg-load-demo=${() => this.controller.loadDemo()}></gg-setup>
        </aside>
        <div class="work">
          <section class="card" aria-label="Run">
            <gg-run-controls .run=${s.run} blocked=${this.blockedReason()}
              @gg-run-command=${(e: CustomEvent<{ command: RunCommand }>) => this.command(e.detail.command)}></gg-run-controls>
          </section>
          <div class="maps">
            <section class="card" aria-labelledby="field-heading">
              <div class="card-head"><h2 id="field-heading">Field</h2></div>
              <gg-field-view .scenario=${shown} .frames=${this.store} theme=${s.theme}
                ?running=${s.run.phase === 'running' || s.run.phase === 'paused' || s.run.phase === 'stopping'}></gg-field-view>
            </section>
            <section class="card" aria-labelledby="map-heading">
              <div class="card-head"><h2 id="map-heading">Error map</h2></div>
              <gg-error-map .map=${s.errorMap} .scenario=${s.resultsScenario} .frequencies=${shown.frequencies}
                .chosen=${s.mapFrequency} theme=${s.theme}
                @gg-map-frequency=${(e: CustomEvent<{ index: number }>) => this.controller.setMapFrequency(e.detail.index)}></gg-error-map>
            </section>
          </div>
          <section class="card compare" aria-labelledby="compare-heading">
            <div class="card-head">
              <h2 id="compare-heading">Compare</h2>
              <div class="exports" role="group" aria-label="Download run files">
                <span class="muted">Download</span>
                ${RUN_FILES.map((name) => html`<button class="small" data-file=${name} ?disabled=${!results} @click=${() => this.exportRunFile(name)}>${name}</button>`)}
              </div>
            </div>
            ${stale ? html`<p class="stale">These results are from the last run; the set-up has changed since. Press Run to update them.</p>` : nothing}
            <gg-summary-table .results=${results}></gg-summary-table>
            <h3>Time series at the probes</h3>
            ${results && results.probes.length ? html`
              <div class="charts">
                ${repeat(results.probes, (p) => p.name, (p) => html`<gg-timeseries-chart .probe=${p} .dt=${results.dt_s} theme=${s.theme}></gg-timeseries-chart>`)}
              </div>` : html`<p class="empty">FDTD and exact Ez at each probe appear here after a run.</p>`}
            <h3>Along the probe lines</h3>
            ${results && results.lines.length && lineFreq !== undefined ? html`
              <label class="inline">Frequency
                <select @change=${(e: Event) => this.controller.setLineFrequency(Number((e.target as HTMLSelectElement).value))}>
                  ${results.frequencies.map((f, k) => html`<option value=${k} ?selected=${k === s.lineFrequency}>${formatSI(f, 'Hz')}</option>`)}
                </select>
              </label>
              <div class="charts">
                ${repeat(results.lines, (l) => l.name, (l) => html`<gg-line-chart .line=${l} .frequency=${lineFreq} theme=${s.theme}></gg-line-chart>`)}
              </div>` : html`<p class="empty">Magnitude and phase of Ez/I along each probe line appear here after a run (needs a line and an analysis frequency).</p>`}
          </section>
          <section class="card" aria-labelledby="studies-heading">
            <div class="card-head"><h2 id="studies-heading">Studies</h2></div>
            <gg-studies-panel .scenario=${s.check.ok ? s.check.scenario : undefined} theme=${s.theme}></gg-studies-panel>
          </section>
        </div>
      </main>
      <footer>Results check the numerical method only; they are not evidence for RF-exposure or EMC compliance.</footer>
    `;
  }
}

declare global {
  interface HTMLElementTagNameMap { 'gg-app': GgApp }
}
