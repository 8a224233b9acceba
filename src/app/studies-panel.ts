import { css, html, LitElement, nothing, type PropertyValues } from 'lit';
import { customElement, property, state } from 'lit/decorators.js';
import { repeat } from 'lit/directives/repeat.js';
import { studyFiles } from '../io/study-files.ts';
import { validateScenario } from '../scenario/parse.ts';
import type { Problem, Scenario } from '../scenario/types.ts';
import type { AnyStudyDefinition, OptionValues } from '../studies/definition.ts';
import { createPagePool } from '../studies/page-pool.ts';
import type { StudyPool } from '../studies/pool.ts';
import type { StudyProgress } from '../studies/progress.ts';
import { STUDIES } from '../studies/registry.ts';
import { runStudy } from '../studies/run-study.ts';
import { TaskController, TeardownController } from './controllers.ts';
import { saveText } from './download.ts';
import './study-chart.ts';
import './study-form.ts';
import { controlStyles, type ThemeName } from './theme.ts';

function timeLeft(p: StudyProgress): string {
  if (!Number.isFinite(p.secondsLeft) || p.fraction <= 0) return 'estimating time left…';
  const s = Math.round(p.secondsLeft);
  return s < 90 ? `about ${s} s left` : `about ${Math.round(s / 60)} min left`;
}

/**
 * The studies panel: one tab per study of the registry (src/studies/registry.ts), each with
 * the form its definition describes, run on a pool of module workers with progress and
 * cancel, a table that fills as candidates finish, the study's charts, downloads of its
 * files, and "Apply" which fires `gg-apply-scenario` with the recommendation applied.
 * Everything study-specific comes from the definition.
 */
@customElement('gg-studies-panel')
export class GgStudiesPanel extends LitElement {
  static styles = [controlStyles, css`
    :host { display: block; }
    .tabs { display: flex; gap: 0.3rem; margin-bottom: 0.6rem; flex-wrap: wrap; }
    .tabs button[aria-pressed='true'] { border-color: var(--gg-accent); box-shadow: inset 0 -2px 0 var(--gg-accent); font-weight: 600; }
    .actions { display: flex; gap: 0.4rem; flex-wrap: wrap; align-items: center; margin: 0.7rem 0 0.4rem; }
    .problems { margin: 0.3rem 0; padding-left: 1.1rem; font-size: 0.85rem; color: var(--gg-error); }
    .status { font-size: 0.85rem; margin: 0.3rem 0; }
    .progress { display: flex; gap: 0.6rem; align-items: center; font-size: 0.85rem; margin: 0.3rem 0; flex-wrap: wrap; }
    progress { flex: 1; min-width: 8rem; height: 0.8rem; accent-color: var(--gg-accent); }
    .verdict { margin: 0.5rem 0; padding: 0.45rem 0.7rem; border-left: 3px solid var(--gg-accent); background: var(--gg-raised); font-size: 0.9rem; }
    .verdict.none { border-left-color: var(--gg-warn); }
    .verdict p { margin: 0.1rem 0; }
    .table { max-height: 22rem; overflow: auto; border: 1px solid var(--gg-grid); border-radius: 6px; margin: 0.5rem 0; }
    table { border-collapse: collapse; width: 100%; font-size: 0.84rem; }
    th, td { padding: 0.25rem 0.5rem; border-bottom: 1px solid var(--gg-grid); text-align: right; white-space: nowrap; }
    th { position: sticky; top: 0; background: var(--gg-surface); color: var(--gg-muted); font-weight: 600; font-size: 0.78rem; }
    td.text, th.text { text-align: left; }
    tr.recommended td { background: color-mix(in srgb, var(--gg-accent) 14%, transparent); font-weight: 600; }
    td.fail { color: var(--gg-error); }
    .charts { display: grid; grid-template-columns: repeat(auto-fit, minmax(min(100%, 24rem), 1fr)); gap: 1rem; margin-top: 0.6rem; }
    .note { font-size: 0.8rem; color: var(--gg-muted); margin: 0.3rem 0; }
  `];

  /** The scenario to study (the set-up as it stands); undefined while it is invalid. */
  @property({ attribute: false }) scenario: Scenario | undefined;
  @property() theme: ThemeName = 'light';

  @state() private study: AnyStudyDefinition = STUDIES[0];
  /** Option text as typed, per study id. */
  @state() private typed: Record<string, OptionValues> = {};
  @state() private applyProblems: Problem[] = [];
  @state() private rows: unknown[] = [];

  private readonly task = new TaskController<StudyProgress, unknown>(this);
  private plan: unknown;
  private planned: AnyStudyDefinition | undefined;
  private pool: StudyPool | undefined;

  constructor() {
    super();
    new TeardownController(this, () => {
      this.pool?.dispose();
      this.pool = undefined;
    });
  }

  private values(): OptionValues {
    const typed = this.typed[this.study.id] ?? {};
    return Object.fromEntries(this.study.options.map((o) => [o.name, typed[o.name] ?? o.defaultText]));
  }

  private async run(): Promise<void> {
    const scenario = this.scenario;
    const d = this.study;
    const { options } = d.readOptions(this.values());
    if (!scenario || !options) return;
    this.applyProblems = [];
    this.rows = [];
    this.pool ??= createPagePool();
    const pool = this.pool;
    await this.task.run(async (signal, onProgress) => {
      const plan = (this.plan = d.plan(scenario, options));
      this.planned = d;
      return runStudy(d, plan, pool, {
        signal, onProgress,
        onCandidate: (c) => { this.rows = [...this.rows, c].sort((a, b) => d.compare(a, b)); },
      });
    });
    if (this.task.value) {
      this.rows = [...this.study.rows(this.task.value)];
      // the study's JSON file, for the page's report
      const json = d.outputs(this.task.value).find((o) => o.kind === 'json');
      if (json) this.dispatchEvent(new CustomEvent('gg-study-done', { detail: { file: json.name, data: d.json(this.task.value) }, bubbles: true, composed: true }));
    }
  }

  /** The recommendation so far (final once the study is over). */
  private pick(): unknown {
    if (!this.plan || this.planned !== this.study) return null;
    return this.task.value ? this.study.recommended(this.task.value) : this.study.pick(this.plan, this.rows);
  }

  private apply(): void {
    const scenario = this.scenario;
    const pick = this.pick();
    if (!scenario || !pick || !this.study.apply) return;
    const check = validateScenario(this.study.apply(scenario, this.plan, pick));
    if (!check.ok) {
      this.applyProblems = check.problems;
      return;
    }
    this.applyProblems = [];
    this.dispatchEvent(new CustomEvent('gg-apply-scenario', { detail: check.scenario, bubbles: true, composed: true }));
  }

  private download(): void {
    if (!this.task.value) return;
    const files = studyFiles(this.study.outputs(this.task.value));
    for (const [name, text] of Object.entries(files)) saveText(name, text, name.endsWith('.json') ? 'application/json' : 'text/csv');
  }

  /** Opens the tab of the study with this id (nothing while a study runs). */
  showStudy(id: string): void {
    const d = STUDIES.find((s) => s.id === id);
    if (d) this.switchTo(d);
  }

  private switchTo(d: AnyStudyDefinition): void {
    if (this.task.status === 'running' || d === this.study) return;
    this.study = d;
    this.applyProblems = [];
    this.rows = [];
    this.plan = undefined;
    this.task.reset();
  }

  private onOption = (e: CustomEvent<{ name: string; value: string }>) => {
    const id = this.study.id;
    this.typed = { ...this.typed, [id]: { ...(this.typed[id] ?? {}), [e.detail.name]: e.detail.value } };
  };

  private progressLine(p: StudyProgress, running: boolean) {
    const plan = this.plan as { candidates: unknown[]; shared: unknown[] } | undefined;
    const what = plan && plan.shared.length > 0 && this.study.sharedRuns
      ? ` (${plan.candidates.length} candidates and ${this.study.sharedRuns})` : '';
    return html`<div class="progress">
      <progress max="1" .value=${p.fraction} aria-label="Study progress"></progress>
      <span class="num">${p.finished} of ${p.total} runs${what} · ${running ? timeLeft(p) : 'cancelled'}</span>
    </div>`;
  }

  private table(pick: unknown) {
    const d = this.study;
    return html`<div class="table"><table>
      <thead><tr>${d.columns.map((c) => html`<th scope="col" class=${c.text ? 'text' : ''}>${c.label}</th>`)}<th scope="col" class="text">note</th></tr></thead>
      <tbody>${repeat(this.rows, (c) => c, (c) => {
        const notes = d.rowNotes({ recommended: pick }, c);
        const data = d.rowData?.(c) ?? {};
        const error = (c as { error?: string }).error;
        return html`<tr class=${c === pick ? 'recommended' : ''} data-key=${data.key ?? ''} data-cells=${data.cells ?? ''}>
          ${d.columns.map((col) => html`<td class=${col.text ? 'text' : 'num'}>${col.value(c)}</td>`)}
          <td class="text ${error ? 'fail' : ''}">${notes.join(', ')}</td></tr>`;
      })}</tbody></table></div>`;
  }

  protected updated(_changed: PropertyValues<this>): void {
    this.dataset.phase = this.task.status === 'cancelled' ? 'cancelled' : this.task.status;
  }

  render() {
    const d = this.study;
    const running = this.task.status === 'running';
    const { problems } = d.readOptions(this.values());
    const pick = this.pick();
    const result = this.task.value;
    const charts = this.plan && this.planned === d && d.charts ? d.charts(this.plan, this.rows, result) : [];
    return html`
      <div class="tabs" role="group" aria-label="Study">
        ${STUDIES.map((s) => html`<button type="button" aria-pressed=${s === d} ?disabled=${running} title=${s.summary} @click=${() => this.switchTo(s)}>${s.title}</button>`)}
      </div>
      <gg-study-form .options=${d.options} .values=${this.values()} .problems=${problems} ?disabled=${running} @gg-study-option=${this.onOption}></gg-study-form>
      ${problems.length ? html`<ul class="problems">${problems.map((m) => html`<li>${m}</li>`)}</ul>` : nothing}
      ${d.pageNote ? html`<p class="note">${d.pageNote}</p>` : nothing}
      <div class="actions">
        <button class="primary" type="button" ?disabled=${running || !this.scenario || problems.length > 0} @click=${this.run}>Run study</button>
        <button type="button" ?disabled=${!running} @click=${() => this.task.abort()}>Cancel</button>
        <button type="button" ?disabled=${running || !pick || !this.scenario || !d.apply} @click=${this.apply}
          title="Change the set-up to the recommended setting">Apply recommendation</button>
        <button type="button" class="small" ?disabled=${running || !result} @click=${this.download}>Download CSV + JSON</button>
      </div>
      ${!this.scenario ? html`<p class="status error-text">Fix the set-up first: studies run on a valid scenario.</p>` : nothing}
      ${this.applyProblems.length ? html`<ul class="problems">${this.applyProblems.map((q) => html`<li>${q.path}: ${q.message}</li>`)}</ul>` : nothing}
      ${this.task.progress && (running || this.task.status === 'cancelled') ? this.progressLine(this.task.progress, running) : nothing}
      ${this.task.status === 'failed' ? html`<p class="status error-text">The study failed: ${this.task.error}</p>` : nothing}
      ${result ? html`<div class="verdict ${pick ? '' : 'none'}">${d.verdict(result).map((line) => html`<p>${line}</p>`)}</div>` : nothing}
      ${this.rows.length ? this.table(pick) : nothing}
      <div class="charts">
        ${repeat(charts, (c) => `${d.id}/${c.id}`, (c) => html`<gg-study-chart .spec=${c} theme=${this.theme}></gg-study-chart>`)}
      </div>
    `;
  }
}

declare global {
  interface HTMLElementTagNameMap { 'gg-studies-panel': GgStudiesPanel }
}
