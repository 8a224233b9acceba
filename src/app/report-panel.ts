import { css, html, LitElement, nothing } from 'lit';
import { customElement, property, state } from 'lit/decorators.js';
import type { ErrorMap } from '../compare/error-map.ts';
import type { RunResults } from '../compare/results.ts';
import { runExtras } from '../io/outputs.ts';
import type { ReportInput } from '../io/report.ts';
import { deriveQuantities } from '../scenario/derived.ts';
import type { Scenario } from '../scenario/types.ts';
import type { Warning } from '../scenario/warnings.ts';
import { TeardownController } from './controllers.ts';
import { saveText } from './download.ts';
import type { FromReportWorker, ToReportWorker } from './report-worker.ts';
import type { RunState } from './store.ts';
import { controlStyles } from './theme.ts';

/** gridgauge's version, as the report prints it. */
const VERSION = '0.1.0';

/**
 * The Report section: builds the design-review report from the page's last run and the
 * studies finished in this session — the same file `gridgauge report` writes — in a worker,
 * with progress, and offers it as report.html.
 */
@customElement('gg-report-panel')
export class GgReportPanel extends LitElement {
  static styles = [controlStyles, css`
    :host { display: block; }
    .actions { display: flex; gap: 0.5rem; align-items: center; flex-wrap: wrap; margin: 0.5rem 0; }
    progress { flex: 1; min-width: 8rem; height: 0.8rem; accent-color: var(--gg-accent); }
    ul { margin: 0.3rem 0; padding-left: 1.1rem; font-size: 0.88rem; }
    .note { font-size: 0.82rem; color: var(--gg-muted); }
  `];

  @property({ attribute: false }) scenario: Scenario | undefined;
  @property({ attribute: false }) results: RunResults | undefined;
  @property({ attribute: false }) errorMap: ErrorMap | undefined;
  @property({ attribute: false }) run: RunState | undefined;
  /** The JSON of each study finished in this session, by its file name (absorber.json, …). */
  @property({ attribute: false }) studies: Record<string, unknown> = {};

  @state() private status: { stage: string; fraction: number } | undefined;
  @state() private message = '';
  private worker: Worker | undefined;
  private nextId = 1;

  constructor() {
    super();
    new TeardownController(this, () => { this.worker?.terminate(); this.worker = undefined; });
  }

  private input(): ReportInput | undefined {
    const { scenario, results, run } = this;
    if (!scenario || !results) return undefined;
    const extras = runExtras(scenario, results, { runSeconds: run?.runSeconds ?? NaN, energyLeftDb: run?.energyLeftDb ?? NaN, stopped: run?.stopped });
    return {
      scenarioName: 'the page\'s scenario',
      scenario, results, derived: deriveQuantities(scenario), warnings: extras.warnings as Warning[],
      errorMap: this.errorMap,
      errorMapNote: this.errorMap ? undefined : 'this run kept no error map',
      studies: Object.entries(this.studies).map(([file, data]) => ({ file, folder: 'this page', data })),
      run: { seconds: run?.runSeconds ?? NaN, stopped: run?.stopped },
      version: VERSION,
      runtime: navigator.userAgent,
      date: new Date().toISOString(),
    };
  }

  private build(): void {
    const input = this.input();
    if (!input) return;
    this.worker ??= new Worker(new URL('./report-worker.ts', import.meta.url), { type: 'module', name: 'gridgauge report' });
    const id = this.nextId++;
    this.status = { stage: 'starting', fraction: 0 };
    this.message = '';
    this.worker.onmessage = (e: MessageEvent<FromReportWorker>) => {
      const m = e.data;
      if (m.id !== id) return;
      if (m.type === 'progress') this.status = { stage: m.stage, fraction: m.fraction };
      else if (m.type === 'failed') { this.status = undefined; this.message = `The report could not be built: ${m.message}`; }
      else {
        this.status = undefined;
        this.message = `Built in ${m.seconds.toFixed(2)} s.`;
        this.dataset.built = String(id);
        saveText('report.html', m.html, 'text/html');
      }
    };
    this.worker.postMessage({ type: 'build', id, input } satisfies ToReportWorker);
  }

  render() {
    const studies = Object.keys(this.studies);
    return html`
      <p>One self-contained HTML file for a design review: the set-up, the comparison with the exact field and its plots,
        the error map, and every study finished on this page, with the conventions and cautions. It prints on A4 and Letter.</p>
      <ul>
        <li>Run: ${this.results ? `${this.results.steps} steps, ${this.results.probes.length} probes, ${this.results.lines.length} lines` : 'none yet — press Run first'}</li>
        <li>Studies: ${studies.length ? studies.join(', ') : 'none yet (the report can go without them)'}</li>
      </ul>
      <div class="actions">
        <button class="primary" type="button" ?disabled=${!this.results || !this.scenario || !!this.status} @click=${this.build}>Build report</button>
        ${this.status ? html`<progress max="1" .value=${this.status.fraction} aria-label="Report progress"></progress><span class="note">${this.status.stage}</span>` : nothing}
      </div>
      ${this.message ? html`<p class="note" role="status">${this.message}</p>` : nothing}
      <p class="note">Results check the numerical method only; they are not evidence for RF-exposure or EMC compliance.</p>`;
  }
}

declare global {
  interface HTMLElementTagNameMap { 'gg-report-panel': GgReportPanel }
}
