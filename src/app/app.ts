import { css, html, LitElement, nothing, type PropertyValues } from 'lit';
import { customElement, query } from 'lit/decorators.js';
import type { ErrorMap } from '../compare/error-map.ts';
import { demoScenario } from '../scenario/defaults.ts';
import { deriveQuantities } from '../scenario/derived.ts';
import { scenarioWarnings } from '../scenario/warnings.ts';
import { validateScenario } from '../scenario/parse.ts';
import type { Scenario } from '../scenario/types.ts';
import { encodeScenario } from '../scenario/url.ts';
import { AppController } from './controller.ts';
import { EventController } from './controllers.ts';
import type { DisplayUnits, Edit } from './draft.ts';
import { saveText } from './download.ts';
import './error-map.ts';
import './field-view.ts';
import { plannedMaps } from './map-plan.ts';
import { initialScenario, linkParameter, linkView, savedTheme, savedUnits, writeLink, type View } from './persist.ts';
import './results-panel.ts';
import type { GgResultsPanel, RunFileName } from './results-panel.ts';
import './run-controls.ts';
import type { RunCommand } from './run-controls.ts';
import { sectionNav, viewStyles } from './section-nav.ts';
import './setup-form.ts';
import { Store, type AppState } from './store.ts';
import './report-panel.ts';
import './studies-panel.ts';
import { controlStyles, themeTokens } from './theme.ts';
import { draftObjectList, faultyObjectIndices } from './object-shapes.ts';
import type { GgStudiesPanel } from './studies-panel.ts';

const EMPTY_MAPS: ErrorMap[] = [];

/**
 * The page: a header with the scenario files and the theme, a bar of sections (Set-up,
 * Results, Studies, Report; the one on show is kept in the address), the run controls, and
 * the section itself. Owns the store and the controller; passes state down as properties and
 * turns the components' events into controller actions.
 */
@customElement('gg-app')
export class GgApp extends LitElement {
  static styles = [themeTokens, controlStyles, viewStyles, css`
    :host {
      display: block; min-height: 100vh; background: var(--gg-bg); color: var(--gg-ink);
      font-family: var(--gg-font); line-height: 1.4;
    }
    header {
      display: flex; gap: 0.5rem 1rem; align-items: center; flex-wrap: wrap; padding: 0.6rem 1.1rem;
      border-bottom: 1px solid var(--gg-border); background: var(--gg-surface);
    }
    .brand { margin-right: auto; min-width: 0; }
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
    .runbar { margin: 0.8rem 1.1rem 0; display: flex; gap: 0.6rem; align-items: center; flex-wrap: wrap; }
    .runbar gg-run-controls { flex: 1 1 20rem; min-width: 0; }
    main { padding: 1rem 1.1rem 2rem; }
    .columns { display: grid; grid-template-columns: minmax(20rem, 26rem) minmax(0, 1fr); gap: 1rem; align-items: start; }
    #view-results { grid-template-columns: minmax(18rem, 22rem) minmax(0, 1fr); }
    @media (max-width: 960px) { .columns, #view-results { grid-template-columns: minmax(0, 1fr); } }
    @media (max-width: 480px) { header, main { padding-left: 0.6rem; padding-right: 0.6rem; } .runbar, .notice { margin-left: 0.6rem; margin-right: 0.6rem; } }
    .column { display: flex; flex-direction: column; gap: 0.5rem; min-width: 0; }
    .column h2 { font-size: 1.05rem; margin: 0; }
    .report p { max-width: 40rem; }
    footer { padding: 0 1.1rem 1.5rem; font-size: 0.78rem; color: var(--gg-muted); }
  `];

  readonly store: Store;
  readonly controller: AppController;
  private readonly openedFrom: 'link' | 'saved' | 'demo';
  private lastValid: Scenario;
  private drawnResults: unknown;

  @query('#open-file') private fileInput!: HTMLInputElement;
  @query('gg-results-panel') private resultsPanel!: GgResultsPanel;
  @query('gg-studies-panel') private studiesPanel!: GgStudiesPanel;
  /** The objects the check found wrong, kept as one set while they stay the same. */
  private faulty: { key: string; set: ReadonlySet<number> } = { key: '', set: new Set() };

  constructor() {
    super();
    const initial = initialScenario();
    const check = validateScenario(initial.draft);
    this.lastValid = check.ok ? check.scenario : demoScenario();
    this.openedFrom = initial.from;
    this.store = new Store({
      draft: initial.draft, check, derived: check.ok ? deriveQuantities(check.scenario) : undefined,
      warnings: check.ok ? scenarioWarnings(check.scenario) : [],
      units: savedUnits(), theme: savedTheme(), view: linkView(),
      run: { phase: 'idle', runId: 0, stepsDone: 0, stepsTotal: 0, stepsPerSecond: 0 },
      results: undefined, resultsScenario: undefined, errorMaps: [], studyFiles: {},
      lineFrequency: 0, mapFrequencyHz: undefined, measuredCellRate: undefined,
      notice: initial.linkProblems ? {
        kind: 'error', title: 'The scenario in this link could not be used; showing your last scenario instead',
        lines: initial.linkProblems.map((p) => `${p.path}: ${p.message}`),
      } : undefined,
    });
    this.controller = new AppController(this.store);
    new EventController(this, () => this.store);
    // A link pasted into the address bar of the open page (the page's own updates fire no event).
    new EventController(this, () => window, 'hashchange', () => {
      const encoded = linkParameter();
      const { check } = this.state;
      if (encoded !== undefined && (!check.ok || encoded !== encodeScenario(check.scenario))) this.controller.openLink(encoded);
      if (linkView() !== this.state.view) this.controller.setView(linkView());
    });
    new EventController<CustomEvent<{ edits: Edit[] }>>(this, () => this, 'gg-edit', (e) => {
      e.stopPropagation();
      this.controller.edit(e.detail.edits);
    });
    new EventController<CustomEvent<Scenario>>(this, () => this, 'gg-apply-scenario', (e) => {
      e.stopPropagation();
      this.controller.applyScenario(e.detail, 'Applied the study’s recommendation to the set-up');
    });
    new EventController<CustomEvent<{ id: string }>>(this, () => this, 'gg-open-study', (e) => {
      e.stopPropagation();
      void this.openStudy(e.detail.id);
    });
    if (check.ok) writeLink(check.scenario);
  }

  /** Shows the Studies section on the tab of one study (e.g. the convergence study). */
  async openStudy(id: string): Promise<void> {
    this.controller.setView('studies');
    await this.updateComplete;
    this.studiesPanel?.showStudy(id);
  }

  private faultyObjects(): ReadonlySet<number> {
    const { check } = this.state;
    const indices = check.ok ? [] : faultyObjectIndices(check.problems);
    const key = indices.join(',');
    if (key !== this.faulty.key) this.faulty = { key, set: new Set(indices) };
    return this.faulty.set;
  }

  private get state(): AppState {
    return this.store.state;
  }

  /** Shows one section of the page (also for scripts and tests). */
  showView(view: View): void {
    this.controller.setView(view);
  }

  /** Runs the demo (or `?autorun=1`) once the page has drawn, so nothing waits for the press of a button. */
  protected firstUpdated(): void {
    const autorun = new URLSearchParams(window.location.search).get('autorun');
    const untouchedDemo = JSON.stringify(this.state.draft) === JSON.stringify(demoScenario());
    if (autorun === '1' || (autorun !== '0' && (this.openedFrom === 'demo' || untouchedDemo) && this.state.check.ok)) {
      this.controller.run();
    }
  }

  protected willUpdate(): void {
    const s = this.state;
    if (s.check.ok) this.lastValid = s.check.scenario;
    this.setAttribute('theme', s.theme);
    this.dataset.phase = s.run.phase;
    this.dataset.view = s.view;
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
    const map = this.renderRoot.querySelector('gg-error-map') as LitElement | null;
    await Promise.all([this.resultsPanel?.drawn(), map?.updateComplete]);
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

  private exportRunFile(name: RunFileName): void {
    const files = this.controller.runFiles();
    if (files) saveText(name, files[name], name.endsWith('.json') ? 'application/json' : 'text/csv');
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
    // Undefined while the set-up is wrong: which maps the next run makes is not known yet.
    const nextMaps = s.check.ok && s.derived ? plannedMaps(s.check.scenario, s.derived, s.mapFrequencyHz) : undefined;
    const stale = !!s.results && !!s.resultsScenario && JSON.stringify(s.resultsScenario) !== JSON.stringify(s.check.ok ? s.check.scenario : undefined);
    const dark = s.theme === 'dark';
    const finished = (s.run.phase === 'done' || s.run.phase === 'stopped') && !!s.results;
    return html`
      <header>
        <div class="brand">
          <h1>grid<span>gauge</span></h1>
          <p class="tagline">2D Yee grid (TMz or TEz) with CPML, media and objects, against the exact field of a pulsed line source</p>
        </div>
        <div class="actions" role="toolbar" aria-label="Scenario files, sharing and theme">
          <button @click=${() => this.fileInput.click()}>Open scenario…</button>
          <input id="open-file" class="visually-hidden" type="file" accept=".json,application/json" tabindex="-1" aria-hidden="true"
            @change=${this.openFile} />
          <button @click=${() => this.controller.saveScenario()} ?disabled=${!s.check.ok}>Save scenario</button>
          <button @click=${this.copyLink} ?disabled=${!s.check.ok}>Copy link</button>
          <button class="theme" title=${dark ? 'The dark theme is on' : 'The light theme is on'}
            @click=${() => this.controller.setTheme(dark ? 'light' : 'dark')}>${dark ? 'Light theme' : 'Dark theme'}</button>
        </div>
      </header>
      ${sectionNav(s.view, (v) => this.controller.setView(v), { results: !!s.results })}
      ${s.notice ? html`
        <div class="notice ${s.notice.kind}" role=${s.notice.kind === 'error' ? 'alert' : 'status'}>
          <div>
            <h2>${s.notice.title}</h2>
            ${s.notice.lines.length ? html`<ul>${s.notice.lines.map((l) => html`<li>${l}</li>`)}</ul>` : nothing}
          </div>
          <button class="small" @click=${() => this.controller.dismissNotice()} aria-label="Dismiss this message">Dismiss</button>
        </div>` : nothing}
      <section class="card runbar" aria-label="Run">
        <gg-run-controls .run=${s.run} blocked=${this.blockedReason()}
          @gg-run-command=${(e: CustomEvent<{ command: RunCommand }>) => this.command(e.detail.command)}></gg-run-controls>
        ${finished && s.view !== 'results' ? html`<button class="small see-results" @click=${() => this.controller.setView('results')}>See the results</button>` : nothing}
      </section>
      <main>
        <div class="view columns" id="view-setup" role="tabpanel" aria-labelledby="tab-setup" ?hidden=${s.view !== 'setup'}>
          <div class="column">
            <h2 id="setup-heading">Set-up</h2>
            <gg-setup .draft=${s.draft} .problems=${s.check.ok ? [] : s.check.problems} .scenario=${s.check.ok ? s.check.scenario : undefined} .derived=${s.derived} .warnings=${s.warnings} .units=${s.units}
              .maps=${nextMaps?.length ?? 0} .cellRate=${s.measuredCellRate} theme=${s.theme}
              @gg-units=${(e: CustomEvent<DisplayUnits>) => this.controller.setUnits(e.detail)}
              @gg-load-demo=${() => this.controller.loadDemo()}></gg-setup>
          </div>
          <section class="card" aria-labelledby="field-heading">
            <div class="card-head"><h2 id="field-heading">Field</h2></div>
            <gg-field-view .scenario=${shown} .frames=${this.store} theme=${s.theme} lengthUnit=${s.units.length}
              .objects=${draftObjectList(s.draft)} .faultyObjects=${this.faultyObjects()}
              ?running=${s.run.phase === 'running' || s.run.phase === 'paused' || s.run.phase === 'stopping'}></gg-field-view>
          </section>
        </div>
        <div class="view columns" id="view-results" role="tabpanel" aria-labelledby="tab-results" ?hidden=${s.view !== 'results'}>
          <section class="card" aria-labelledby="map-heading">
            <div class="card-head"><h2 id="map-heading">Error map</h2></div>
            <gg-error-map .maps=${s.errorMaps.length ? s.errorMaps : EMPTY_MAPS} .scenario=${s.resultsScenario} .frequencies=${shown.frequencies}
              .nextRun=${nextMaps} .chosen=${s.mapFrequencyHz} lengthUnit=${s.units.length} theme=${s.theme}
              @gg-map-frequency=${(e: CustomEvent<{ hz: number }>) => this.controller.setMapFrequency(e.detail.hz)}></gg-error-map>
          </section>
          <section class="card compare" aria-labelledby="compare-heading">
            <gg-results-panel .results=${s.results} .scenario=${s.resultsScenario} ?stale=${stale} .lineFrequency=${s.lineFrequency} theme=${s.theme}
              @gg-export=${(e: CustomEvent<{ name: RunFileName }>) => this.exportRunFile(e.detail.name)}
              @gg-line-frequency=${(e: CustomEvent<{ index: number }>) => this.controller.setLineFrequency(e.detail.index)}></gg-results-panel>
          </section>
        </div>
        <section class="view card" id="view-studies" role="tabpanel" aria-labelledby="tab-studies" ?hidden=${s.view !== 'studies'}>
          <div class="card-head"><h2 id="studies-heading">Studies</h2></div>
          <gg-studies-panel .scenario=${s.check.ok ? s.check.scenario : undefined} theme=${s.theme}
            @gg-study-done=${(e: CustomEvent<{ file: string; data: unknown }>) => this.store.set({ studyFiles: { ...this.store.state.studyFiles, [e.detail.file]: e.detail.data } })}></gg-studies-panel>
        </section>
        <section class="view card report" id="view-report" role="tabpanel" aria-labelledby="tab-report" ?hidden=${s.view !== 'report'}>
          <div class="card-head"><h2 id="report-heading">Report</h2></div>
          <gg-report-panel .scenario=${s.resultsScenario} .results=${s.results} .run=${s.run} .studies=${s.studyFiles}
            .errorMap=${s.errorMaps.find((m) => m.f_Hz === s.mapFrequencyHz) ?? s.errorMaps[0]}></gg-report-panel>
        </section>
      </main>
      <footer>Results check the numerical method only; they are not evidence for RF-exposure or EMC compliance.</footer>
    `;
  }
}

declare global {
  interface HTMLElementTagNameMap { 'gg-app': GgApp }
}
