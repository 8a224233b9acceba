import { css, html, LitElement, nothing, type PropertyValues } from 'lit';
import { customElement, property, state } from 'lit/decorators.js';
import { formatBytes, formatSI, formatSig } from '../scenario/units.ts';
import { validateScenario } from '../scenario/parse.ts';
import type { Problem, Scenario } from '../scenario/types.ts';
import {
  ABSORBER_DEFAULTS, absorberKey, absorberOptionProblems, applyAbsorber, compareAbsorbers, gradingKey, planAbsorberStudy,
  recommendAbsorber, runAbsorberStudy, type AbsorberCandidateResult, type AbsorberStudyOptions, type AbsorberStudyPlan,
  type AbsorberStudyResult,
} from '../studies/absorber-study.ts';
import { createPagePool } from '../studies/page-pool.ts';
import type { StudyPool } from '../studies/pool.ts';
import type { StudyProgress } from '../studies/progress.ts';
import {
  applyResolution, planResolutionStudy, predictedLags, recommendResolution, resolutionOptionProblems, runResolutionStudy,
  type ResolutionCandidateResult, type ResolutionStudyOptions, type ResolutionStudyPlan, type ResolutionStudyResult,
} from '../studies/resolution-study.ts';
import { absorberFiles, resolutionFiles } from '../studies/study-files.ts';
import { saveText } from './download.ts';
import { controlStyles, palettes, type ThemeName } from './theme.ts';
import { fitWidth, series, siAxis, uPlot, uplotStyles } from './uplot-kit.ts';

type StudyKind = 'absorber' | 'resolution';
type Phase = 'idle' | 'running' | 'done' | 'cancelled' | 'failed';

const CHART_HEIGHT = 240;
/** Series colours for the reflection-versus-cells curves, cycled (theme-independent mid tones). */
const CURVE_COLOURS = ['#1f77b4', '#d62728', '#2ca02c', '#9467bd', '#8c564b', '#e377c2', '#17becf', '#bcbd22'];

/** "4, 6, 8" → [4, 6, 8]; undefined when a part is not a number. */
function parseList(text: string): number[] | undefined {
  const parts = text.split(/[,;\s]+/).filter((p) => p !== '');
  const values = parts.map(Number);
  return parts.length > 0 && values.every(Number.isFinite) ? values : undefined;
}

const listText = (values: readonly number[]) => values.join(', ');

function timeLeft(p: StudyProgress): string {
  if (!Number.isFinite(p.secondsLeft) || p.fraction <= 0) return 'estimating time left…';
  const s = Math.round(p.secondsLeft);
  return s < 90 ? `about ${s} s left` : `about ${Math.round(s / 60)} min left`;
}

/** An axis on a logarithmic scale, labelled only at 1, 2 and 5 × 10^k so the minor ticks stay quiet. */
function logAxis(palette: () => (typeof palettes)[ThemeName], name: string, scaleKey: string): uPlot.Axis {
  return {
    ...siAxis(palette, name, '', scaleKey),
    values: (_u: uPlot, splits: number[]) => splits.map((v) => {
      const mantissa = v / 10 ** Math.floor(Math.log10(v) + 1e-9);
      return [1, 2, 5].some((k) => Math.abs(mantissa - k) < 1e-6) ? formatSig(v, 3) : '';
    }),
  };
}

const dB = (x: number) => (Number.isFinite(x) ? x.toFixed(1) : '—');
const gradingLabel = (c: { order: number; sigmaScale: number; kappaMax: number; alphaMax: number }) =>
  `m ${c.order}, σ×${c.sigmaScale}, κ ${c.kappaMax}, α ${c.alphaMax}`;

/**
 * The studies panel: absorber and resolution studies of the given scenario, run on a pool
 * of module workers (one per hardware thread). Inputs for each study, a progress bar with
 * the count of runs and the time left, a table that fills as runs finish, uPlot charts,
 * cancel, downloads, and "Apply" which fires `gg-apply-scenario` with the scenario changed
 * to the recommendation.
 */
@customElement('gg-studies-panel')
export class GgStudiesPanel extends LitElement {
  static styles = [controlStyles, uplotStyles, css`
    :host { display: block; }
    .tabs { display: flex; gap: 0.3rem; margin-bottom: 0.6rem; }
    .tabs button[aria-pressed='true'] { border-color: var(--gg-accent); box-shadow: inset 0 -2px 0 var(--gg-accent); font-weight: 600; }
    form { display: grid; grid-template-columns: repeat(auto-fit, minmax(11rem, 1fr)); gap: 0.5rem 0.8rem; align-items: end; }
    label { display: flex; flex-direction: column; gap: 0.15rem; font-size: 0.82rem; color: var(--gg-muted); }
    label input { color: var(--gg-ink); width: 100%; }
    .actions { display: flex; gap: 0.4rem; flex-wrap: wrap; align-items: center; margin: 0.7rem 0 0.4rem; }
    .problems { margin: 0.3rem 0; padding-left: 1.1rem; font-size: 0.85rem; color: var(--gg-error); }
    .status { font-size: 0.85rem; margin: 0.3rem 0; }
    .progress { display: flex; gap: 0.6rem; align-items: center; font-size: 0.85rem; margin: 0.3rem 0; }
    progress { flex: 1; height: 0.8rem; accent-color: var(--gg-accent); }
    .verdict { margin: 0.5rem 0; padding: 0.45rem 0.7rem; border-left: 3px solid var(--gg-accent); background: var(--gg-raised); font-size: 0.9rem; }
    .verdict.none { border-left-color: var(--gg-warn); }
    .table { max-height: 22rem; overflow: auto; border: 1px solid var(--gg-grid); border-radius: 6px; margin: 0.5rem 0; }
    table { border-collapse: collapse; width: 100%; font-size: 0.84rem; }
    th, td { padding: 0.25rem 0.5rem; border-bottom: 1px solid var(--gg-grid); text-align: right; white-space: nowrap; }
    th { position: sticky; top: 0; background: var(--gg-surface); color: var(--gg-muted); font-weight: 600; font-size: 0.78rem; }
    tr.recommended td { background: color-mix(in srgb, var(--gg-accent) 14%, transparent); font-weight: 600; }
    tr.current td:first-child::after { content: ' (current)'; color: var(--gg-muted); font-weight: 400; }
    td.fail { color: var(--gg-error); text-align: left; }
    .charts { display: grid; grid-template-columns: repeat(auto-fit, minmax(min(100%, 24rem), 1fr)); gap: 1rem; margin-top: 0.6rem; }
    .chart { min-width: 0; }
    .chart h3 { font-size: 0.9rem; margin: 0 0 0.3rem; }
    .plot { min-height: ${CHART_HEIGHT}px; overflow: hidden; }
    .chart[hidden] { display: none; }
    .uplot { font-family: var(--gg-font); }
    .u-legend { font-size: 0.78rem; color: var(--gg-ink); }
    .note { font-size: 0.8rem; color: var(--gg-muted); margin: 0.3rem 0; }
  `];

  /** The scenario to study (the set-up as it stands); undefined while it is invalid. */
  @property({ attribute: false }) scenario: Scenario | undefined;
  @property() theme: ThemeName = 'light';

  @state() private kind: StudyKind = 'absorber';
  @state() private phase: Phase = 'idle';
  @state() private progress: StudyProgress | undefined;
  @state() private message = '';
  @state() private applyProblems: Problem[] = [];
  // absorber inputs, as typed
  @state() private target = String(ABSORBER_DEFAULTS.target_dB);
  @state() private cells = listText(ABSORBER_DEFAULTS.cells);
  @state() private gradingCells = listText(ABSORBER_DEFAULTS.gradingCells);
  @state() private orders = listText(ABSORBER_DEFAULTS.orders);
  @state() private sigmaScales = listText(ABSORBER_DEFAULTS.sigmaScales);
  @state() private kappaMaxes = listText(ABSORBER_DEFAULTS.kappaMaxes);
  @state() private alphaMaxes = listText(ABSORBER_DEFAULTS.alphaMaxes);
  // resolution inputs, as typed
  @state() private size = '12';
  @state() private budget = '5';
  @state() private minCells = '8';
  @state() private maxCells = '60';
  // results
  @state() private absorberRows: AbsorberCandidateResult[] = [];
  @state() private absorberResult: AbsorberStudyResult | undefined;
  @state() private resolutionRows: ResolutionCandidateResult[] = [];
  @state() private resolutionResult: ResolutionStudyResult | undefined;

  private pool: StudyPool | undefined;
  private controller: AbortController | undefined;
  private absorberPlan: AbsorberStudyPlan | undefined;
  private resolutionPlan: ResolutionStudyPlan | undefined;
  private reflectionChart: uPlot | undefined;
  private errorChart: uPlot | undefined;
  private phaseChart: uPlot | undefined;
  private curves: { key: string; label: string }[] = [];
  private sizers: ResizeObserver[] = [];
  private drawQueued = false;

  disconnectedCallback(): void {
    super.disconnectedCallback();
    this.controller?.abort();
    this.pool?.dispose();
    this.pool = undefined;
    this.destroyCharts();
  }

  // ---- inputs ----

  private absorberOptions(): { options?: AbsorberStudyOptions; problems: string[] } {
    const lists = {
      cells: parseList(this.cells), gradingCells: parseList(this.gradingCells), orders: parseList(this.orders),
      sigmaScales: parseList(this.sigmaScales), kappaMaxes: parseList(this.kappaMaxes), alphaMaxes: parseList(this.alphaMaxes),
    };
    const unreadable = Object.entries(lists).filter(([, v]) => v === undefined).map(([k]) => `${k}: write numbers separated by commas`);
    const target = Number(this.target);
    if (unreadable.length > 0) return { problems: unreadable };
    const options: AbsorberStudyOptions = { target_dB: this.target.trim() === '' ? NaN : target, ...(lists as Required<typeof lists>) };
    const problems = absorberOptionProblems(options);
    return problems.length ? { problems } : { options, problems };
  }

  private resolutionOptions(): { options?: ResolutionStudyOptions; problems: string[] } {
    const num = (t: string) => (t.trim() === '' ? NaN : Number(t));
    const options: ResolutionStudyOptions = {
      size_wavelengths: num(this.size), budget_deg: num(this.budget), minCells: num(this.minCells), maxCells: num(this.maxCells),
    };
    const problems = resolutionOptionProblems(options);
    return problems.length ? { problems } : { options, problems };
  }

  private field(label: string, value: string, set: (v: string) => void, hint: string, invalid: boolean, inputmode = 'decimal') {
    return html`<label>${label}
      <input .value=${value} inputmode=${inputmode} title=${hint} aria-invalid=${invalid ? 'true' : 'false'}
        ?disabled=${this.phase === 'running'} @input=${(e: Event) => set((e.target as HTMLInputElement).value)} />
    </label>`;
  }

  // ---- running ----

  private async run(): Promise<void> {
    const scenario = this.scenario;
    if (!scenario || this.phase === 'running') return;
    this.applyProblems = [];
    this.message = '';
    this.progress = undefined;
    this.controller = new AbortController();
    this.pool ??= createPagePool();
    this.phase = 'running';
    try {
      if (this.kind === 'absorber') await this.runAbsorber(scenario);
      else await this.runResolution(scenario);
    } catch (e) {
      this.phase = 'failed';
      this.message = `The study failed: ${e instanceof Error ? e.message : String(e)}`;
    }
  }

  private async runAbsorber(scenario: Scenario): Promise<void> {
    const { options } = this.absorberOptions();
    if (!options) return;
    const plan = (this.absorberPlan = planAbsorberStudy(scenario, options));
    this.absorberRows = [];
    this.absorberResult = undefined;
    this.prepareReflectionChart(plan);
    const result = await runAbsorberStudy(plan, this.pool as StudyPool, {
      signal: this.controller?.signal,
      onProgress: (p) => { this.progress = p; },
      onCandidate: (c) => {
        this.absorberRows = [...this.absorberRows, c].sort(compareAbsorbers);
        this.queueDraw();
      },
    });
    this.absorberResult = result;
    this.phase = result.complete ? 'done' : 'cancelled';
    this.queueDraw();
  }

  private async runResolution(scenario: Scenario): Promise<void> {
    const { options } = this.resolutionOptions();
    if (!options) return;
    const plan = (this.resolutionPlan = planResolutionStudy(scenario, options));
    this.resolutionRows = [];
    this.resolutionResult = undefined;
    const result = await runResolutionStudy(plan, this.pool as StudyPool, {
      signal: this.controller?.signal,
      onProgress: (p) => { this.progress = p; },
      onCandidate: (c) => {
        this.resolutionRows = [...this.resolutionRows, c].sort((a, b) => a.cellsPerWavelength - b.cellsPerWavelength);
        this.queueDraw();
      },
    });
    this.resolutionResult = result;
    this.resolutionRows = result.candidates; // now with project times at the measured speed
    this.phase = result.complete ? 'done' : 'cancelled';
    this.queueDraw();
  }

  private cancel(): void {
    this.controller?.abort();
  }

  /** The recommendation so far (final once the study is over). */
  private absorberPick(): AbsorberCandidateResult | null {
    return recommendAbsorber(this.absorberRows, this.absorberPlan?.target_dB ?? ABSORBER_DEFAULTS.target_dB);
  }

  private resolutionPick(): ResolutionCandidateResult | null {
    return recommendResolution(this.resolutionRows, this.resolutionPlan?.budget_deg ?? Number(this.budget));
  }

  private apply(): void {
    const scenario = this.scenario;
    if (!scenario) return;
    let next: Scenario;
    if (this.kind === 'absorber') {
      const pick = this.absorberPick();
      if (!pick) return;
      next = applyAbsorber(scenario, { cells: pick.cells, order: pick.order, sigmaScale: pick.sigmaScale, kappaMax: pick.kappaMax, alphaMax: pick.alphaMax });
    } else {
      const pick = this.resolutionPick();
      if (!pick || !this.resolutionPlan) return;
      next = applyResolution(scenario, pick.cellsPerWavelength, this.resolutionPlan.frequency_Hz);
    }
    const check = validateScenario(next);
    if (!check.ok) {
      this.applyProblems = check.problems;
      return;
    }
    this.applyProblems = [];
    this.dispatchEvent(new CustomEvent('gg-apply-scenario', { detail: check.scenario, bubbles: true, composed: true }));
  }

  private download(): void {
    const files = this.kind === 'absorber'
      ? this.absorberResult && absorberFiles(this.absorberResult)
      : this.resolutionResult && resolutionFiles(this.resolutionResult);
    if (!files) return;
    for (const [name, text] of Object.entries(files)) saveText(name, text, name.endsWith('.json') ? 'application/json' : 'text/csv');
  }

  // ---- rendering ----

  render() {
    const running = this.phase === 'running';
    const check = this.kind === 'absorber' ? this.absorberOptions() : this.resolutionOptions();
    const p = this.progress;
    const hasResult = this.kind === 'absorber' ? this.absorberResult : this.resolutionResult;
    const pick = this.kind === 'absorber' ? this.absorberPick() : this.resolutionPick();
    return html`
      <div class="tabs" role="group" aria-label="Study">
        <button type="button" aria-pressed=${this.kind === 'absorber'} ?disabled=${running} @click=${() => this.switchTo('absorber')}>Absorber</button>
        <button type="button" aria-pressed=${this.kind === 'resolution'} ?disabled=${running} @click=${() => this.switchTo('resolution')}>Resolution</button>
      </div>
      ${this.kind === 'absorber' ? this.absorberForm(check.problems) : this.resolutionForm(check.problems)}
      ${check.problems.length ? html`<ul class="problems">${check.problems.map((m) => html`<li>${m}</li>`)}</ul>` : nothing}
      <div class="actions">
        <button class="primary" type="button" ?disabled=${running || !this.scenario || check.problems.length > 0} @click=${this.run}>Run study</button>
        <button type="button" ?disabled=${!running} @click=${this.cancel}>Cancel</button>
        <button type="button" ?disabled=${running || !pick || !this.scenario} @click=${this.apply}
          title="Change the set-up to the recommended setting">Apply recommendation</button>
        <button type="button" class="small" ?disabled=${running || !hasResult} @click=${this.download}>Download CSV + JSON</button>
      </div>
      ${!this.scenario ? html`<p class="status error-text">Fix the set-up first: studies run on a valid scenario.</p>` : nothing}
      ${this.applyProblems.length ? html`<ul class="problems">${this.applyProblems.map((q) => html`<li>${q.path}: ${q.message}</li>`)}</ul>` : nothing}
      ${p && (running || this.phase === 'cancelled') ? html`
        <div class="progress">
          <progress max="1" .value=${p.fraction} aria-label="Study progress"></progress>
          <span class="num">${p.finished} of ${p.total} runs · ${running ? timeLeft(p) : 'cancelled'}</span>
        </div>` : nothing}
      ${this.message ? html`<p class="status error-text">${this.message}</p>` : nothing}
      ${this.kind === 'absorber' ? this.absorberResults() : this.resolutionResults()}
    `;
  }

  private switchTo(kind: StudyKind): void {
    this.kind = kind;
    this.applyProblems = [];
    this.message = '';
    this.progress = undefined;
    this.destroyCharts();
    this.queueDraw();
  }

  private absorberForm(problems: string[]) {
    const bad = (name: string) => problems.some((m) => m.startsWith(name));
    return html`<form @submit=${(e: Event) => e.preventDefault()}>
      ${this.field('Target reflection (dB)', this.target, (v) => { this.target = v; }, 'Largest acceptable reflection error, e.g. -60', bad('target'))}
      ${this.field('Layer cells swept', this.cells, (v) => { this.cells = v; }, 'Thicknesses swept with the standard, plain and current gradings', bad('cells'))}
      ${this.field('Cells for grading grids', this.gradingCells, (v) => { this.gradingCells = v; }, 'Thicknesses at which the order × sigmaScale and kappaMax × alphaMax grids run', bad('gradingCells'))}
      ${this.field('Orders m', this.orders, (v) => { this.orders = v; }, 'Polynomial grading orders', bad('orders'))}
      ${this.field('sigmaScale values', this.sigmaScales, (v) => { this.sigmaScales = v; }, 'σmax as a multiple of σopt', bad('sigmaScales'))}
      ${this.field('kappaMax values', this.kappaMaxes, (v) => { this.kappaMaxes = v; }, 'Largest real stretch κ', bad('kappaMaxes'))}
      ${this.field('alphaMax values (S/m)', this.alphaMaxes, (v) => { this.alphaMaxes = v; }, 'Largest frequency shift α', bad('alphaMaxes'))}
    </form>
    <p class="note">Each candidate keeps your interior, source and probes and changes only the layer around them. Reflection is measured against one run on a grid so large that nothing returns within your steps.</p>`;
  }

  private resolutionForm(problems: string[]) {
    const bad = (name: string) => problems.some((m) => m.startsWith(name));
    return html`<form @submit=${(e: Event) => e.preventDefault()}>
      ${this.field('Project size (wavelengths)', this.size, (v) => { this.size = v; }, 'Largest distance in the project, in wavelengths at the highest frequency', bad('size'))}
      ${this.field('Phase budget (degrees)', this.budget, (v) => { this.budget = v; }, 'Phase error allowed across that distance', bad('budget'))}
      ${this.field('Coarsest cells per wavelength', this.minCells, (v) => { this.minCells = v; }, 'Lower end of the range', bad('min-cells'))}
      ${this.field('Finest cells per wavelength', this.maxCells, (v) => { this.maxCells = v; }, 'Upper end of the range', bad('max-cells'))}
    </form>
    <p class="note">Held fixed: your Courant number and dy/dx. Cells per wavelength count along x at your highest analysis frequency. Each resolution runs its own line current with probe lines along x, y and the diagonal from 2 to 5 wavelengths out.</p>`;
  }

  private absorberResults() {
    const rows = this.absorberRows;
    const done = this.absorberResult;
    const pick = this.absorberPick();
    const target = this.absorberPlan?.target_dB ?? Number(this.target);
    return html`
      ${done ? html`<div class="verdict ${pick ? '' : 'none'}">
        ${pick
          ? html`Recommended: <strong>${pick.cells} cells</strong>, ${gradingLabel(pick)} — ${dB(pick.reflection_dB)} dB against a target of ${target} dB (margin ${dB(target - pick.reflection_dB)} dB), ${formatBytes(pick.memory_bytes)}.`
          : html`No candidate meets ${target} dB. Try thicker layers or a less strict target.`}
        ${done.current ? html`<br />Your current setting: ${done.current.cells} cells, ${gradingLabel(done.current)} — ${dB(done.current.reflection_dB)} dB.` : nothing}
        ${done.probes.some((q) => q.added) ? html`<br /><span class="muted">Your scenario has no probes, so the study placed probes one cell inside the layers.</span>` : nothing}
      </div>` : nothing}
      ${rows.length ? html`<div class="table"><table>
        <thead><tr>
          <th scope="col">Cells</th><th scope="col">m</th><th scope="col">sigmaScale</th><th scope="col">kappaMax</th><th scope="col">alphaMax</th>
          <th scope="col">Reflection (dB)</th><th scope="col">Theory R(0) (dB)</th><th scope="col">Worst probe</th><th scope="col">Memory</th><th scope="col">Run time</th>
        </tr></thead>
        <tbody>${rows.map((c) => html`
          <tr class="${c === pick ? 'recommended' : ''} ${c.isCurrent ? 'current' : ''}" data-key=${absorberKey(c)}>
            <td class="num">${c.cells}</td><td class="num">${c.order}</td><td class="num">${c.sigmaScale}</td>
            <td class="num">${c.kappaMax}</td><td class="num">${c.alphaMax}</td>
            ${c.error ? html`<td class="fail" colspan="3">${c.error}</td>` : html`
              <td class="num">${dB(c.reflection_dB)}</td><td class="num">${dB(c.theory_dB)}</td><td>${c.worst_probe}</td>`}
            <td class="num">${formatBytes(c.memory_bytes)}</td>
            <td class="num">${Number.isFinite(c.seconds) ? `${c.seconds.toFixed(2)} s` : '—'}</td>
          </tr>`)}
        </tbody></table></div>` : nothing}
      <div class="charts">
        <div class="chart" ?hidden=${rows.length === 0}><h3>Reflection against layer cells</h3><div class="plot" id="reflection-plot" role="img" aria-label="Measured reflection in dB against absorber cells, one curve per grading, with the target"></div></div>
        <div class="chart" ?hidden=${!done || (!done.current && !done.recommended)}><h3>Error against time, worst probe</h3><div class="plot" id="error-plot" role="img" aria-label="Reflection error in dB against time for the recommended and the current setting"></div></div>
      </div>`;
  }

  private resolutionResults() {
    const rows = this.resolutionRows;
    const done = this.resolutionResult;
    const pick = this.resolutionPick();
    return html`
      ${done ? html`<div class="verdict ${pick ? '' : 'none'}">
        ${pick
          ? html`Recommended: <strong>${pick.cellsPerWavelength} cells per wavelength</strong> (dx = ${formatSI(pick.dx_m, 'm')}) —
              ${formatSig(pick.projected_error_deg, 3)}° across ${done.size_wavelengths} wavelengths, budget ${done.budget_deg}°.
              A ${done.size_wavelengths} × ${done.size_wavelengths} wavelength grid: ${pick.project.nx} × ${pick.project.ny} cells, ${pick.project.steps} steps,
              ${formatBytes(pick.project.memory_bytes)}, about ${formatSig(pick.project.seconds, 2)} s at ${formatSig(done.mcells_per_second, 3)} Mcells/s.`
          : html`No resolution meets ${done.budget_deg}° across ${done.size_wavelengths} wavelengths. Try finer cells or a larger budget.`}
        <br /><span class="muted">At ${formatSI(done.frequency_Hz, 'Hz')} (wavelength ${formatSI(done.wavelength_m, 'm')} in the medium).</span>
      </div>` : nothing}
      ${rows.length ? html`<div class="table"><table>
        <thead><tr>
          <th scope="col">Cells/λ</th><th scope="col">dx</th><th scope="col">Axis (°/λ)</th><th scope="col">Predicted</th>
          <th scope="col">Diagonal (°/λ)</th><th scope="col">Predicted</th><th scope="col">Across project</th>
          <th scope="col">Project grid</th><th scope="col">Memory</th><th scope="col">Time</th>
        </tr></thead>
        <tbody>${rows.map((c) => html`
          <tr class=${c === pick ? 'recommended' : ''} data-cells=${c.cellsPerWavelength}>
            <td class="num">${c.cellsPerWavelength}</td><td class="num">${formatSI(c.dx_m, 'm')}</td>
            ${c.error ? html`<td class="fail" colspan="5">${c.error}</td>` : html`
              <td class="num">${formatSig(c.axis_deg_per_wavelength, 3)}</td><td class="num">${formatSig(c.predicted_axis_deg_per_wavelength, 3)}</td>
              <td class="num">${formatSig(c.diagonal_deg_per_wavelength, 3)}</td><td class="num">${formatSig(c.predicted_diagonal_deg_per_wavelength, 3)}</td>
              <td class="num">${formatSig(c.projected_error_deg, 3)}°</td>`}
            <td class="num">${c.project.nx} × ${c.project.ny}</td><td class="num">${formatBytes(c.project.memory_bytes)}</td>
            <td class="num">${Number.isFinite(c.project.seconds) ? `${formatSig(c.project.seconds, 2)} s` : '—'}</td>
          </tr>`)}
        </tbody></table></div>` : nothing}
      <div class="charts">
        <div class="chart" ?hidden=${rows.length === 0}><h3>Phase lag per wavelength against cells per wavelength</h3><div class="plot" id="phase-plot" role="img" aria-label="Measured phase lag per wavelength along the axis and the diagonal over the dispersion-relation curves, with the budget line"></div></div>
      </div>`;
  }

  // ---- charts ----

  protected updated(changed: PropertyValues<this>): void {
    if (changed.has('theme')) {
      this.destroyCharts();
      this.queueDraw();
    }
    this.dataset.phase = this.phase;
  }

  private palette = () => palettes[this.theme];

  private destroyCharts(): void {
    for (const sizer of this.sizers.splice(0)) sizer.disconnect();
    this.reflectionChart?.destroy();
    this.errorChart?.destroy();
    this.phaseChart?.destroy();
    this.reflectionChart = this.errorChart = this.phaseChart = undefined;
  }

  /** Charts are drawn at most once per frame however fast results stream in. */
  private queueDraw(): void {
    if (this.drawQueued) return;
    this.drawQueued = true;
    requestAnimationFrame(() => {
      this.drawQueued = false;
      void this.updateComplete.then(() => this.draw());
    });
  }

  private host(id: string): HTMLElement | null {
    return this.renderRoot.querySelector(`#${id}`);
  }

  private make(id: string, options: Omit<uPlot.Options, 'width' | 'height'>, data: uPlot.AlignedData): uPlot | undefined {
    const host = this.host(id);
    if (!host) return undefined;
    const width = Math.max(240, Math.floor(host.getBoundingClientRect().width) || 480);
    const chart = new uPlot({ ...options, width, height: CHART_HEIGHT } as uPlot.Options, data, host);
    this.sizers.push(fitWidth(host, () => [chart], CHART_HEIGHT));
    return chart;
  }

  private draw(): void {
    if (this.kind === 'absorber') {
      this.drawReflection();
      this.drawError();
    } else {
      this.drawPhase();
    }
  }

  /** Curves of the reflection chart: each grading with at least two thicknesses in the plan. */
  private prepareReflectionChart(plan: AbsorberStudyPlan): void {
    const byGrading = new Map<string, Set<number>>();
    for (const c of plan.candidates) {
      const key = gradingKey(c.absorber);
      if (!byGrading.has(key)) byGrading.set(key, new Set());
      byGrading.get(key)?.add(c.absorber.cells);
    }
    const curves = [...byGrading.entries()].filter(([, cells]) => cells.size >= 2).map(([key]) => {
      const c = plan.candidates.find((x) => gradingKey(x.absorber) === key) as AbsorberStudyPlan['candidates'][number];
      return { key, label: gradingLabel(c.absorber) };
    });
    this.destroyCharts();
    this.curves = curves;
  }

  private drawReflection(): void {
    const rows = this.absorberRows;
    const plan = this.absorberPlan;
    if (!plan || rows.length === 0) return;
    const cells = [...new Set(plan.candidates.map((c) => c.absorber.cells))].sort((a, b) => a - b);
    const value = (key: string, n: number) => {
      const c = rows.find((r) => r.cells === n && gradingKey(r) === key);
      return c && Number.isFinite(c.reflection_dB) ? c.reflection_dB : null;
    };
    const data = [
      cells,
      ...this.curves.map((curve) => cells.map((n) => value(curve.key, n))),
      cells.map(() => plan.target_dB),
    ] as unknown as uPlot.AlignedData;
    if (this.reflectionChart) {
      this.reflectionChart.setData(data);
      return;
    }
    const palette = this.palette;
    this.reflectionChart = this.make('reflection-plot', {
      scales: { x: { time: false } },
      axes: [siAxis(palette, 'layer cells', '', 'x'), siAxis(palette, 'reflection (dB)', '', 'y')],
      series: [
        { label: 'cells' },
        ...this.curves.map((c, k) => ({ ...series({ label: c.label, colour: () => CURVE_COLOURS[k % CURVE_COLOURS.length], points: true }), spanGaps: true })),
        series({ label: 'target', colour: () => palette().error, dash: [6, 4], width: 1 }),
      ],
      legend: { show: true },
    }, data);
  }

  private drawError(): void {
    const done = this.absorberResult;
    if (!done || (!done.current && !done.recommended)) return;
    const columns = [done.current, done.recommended].filter((c): c is AbsorberCandidateResult => !!c && c.errorSeries.length > 0);
    if (columns.length === 0) return;
    const n = Math.max(...columns.map((c) => c.errorSeries.length));
    const t = Float64Array.from({ length: n }, (_, k) => k * done.dt_s);
    const toDb = (s: Float32Array) => Array.from({ length: n }, (_, k) => (k < s.length && s[k] > 0 ? 20 * Math.log10(s[k]) : null));
    const current = done.current ? toDb(done.current.errorSeries) : new Array(n).fill(null);
    const recommended = done.recommended ? toDb(done.recommended.errorSeries) : new Array(n).fill(null);
    const data = [t, current, recommended] as unknown as uPlot.AlignedData;
    if (this.errorChart) {
      this.errorChart.setData(data);
      return;
    }
    const palette = this.palette;
    this.errorChart = this.make('error-plot', {
      scales: { x: { time: false } },
      axes: [siAxis(palette, 't', 's', 'x'), siAxis(palette, '|E − Eref| / max|Eref| (dB)', '', 'y')],
      series: [
        { label: 't', value: (_u: uPlot, v: number | null) => (v === null ? '—' : formatSI(v, 's', 4)) },
        series({ label: 'current', colour: () => palette().exact }),
        series({ label: 'recommended', colour: () => palette().fdtd }),
      ],
      legend: { show: true },
    }, data);
  }

  private drawPhase(): void {
    const plan = this.resolutionPlan;
    const rows = this.resolutionRows.filter((r) => !r.error);
    if (!plan || rows.length === 0) return;
    const lo = plan.candidates[0].cellsPerWavelength;
    const hi = plan.candidates[plan.candidates.length - 1].cellsPerWavelength;
    const dense = Array.from({ length: 60 }, (_, k) => lo * (hi / lo) ** (k / 59));
    const measured = new Map(rows.map((r) => [r.cellsPerWavelength, r]));
    const x = [...new Set([...dense, ...plan.candidates.map((c) => c.cellsPerWavelength)])].sort((a, b) => a - b);
    const predicted = x.map((n) => predictedLags(plan.frequency_Hz, plan.epsR, plan.courant, plan.aspect, n));
    const data = [
      x,
      x.map((n) => measured.get(n)?.axis_deg_per_wavelength ?? null),
      x.map((n) => measured.get(n)?.diagonal_deg_per_wavelength ?? null),
      predicted.map((p) => Math.max(p.x, p.y)),
      predicted.map((p) => p.diagonal),
      x.map(() => plan.budget_deg / plan.size_wavelengths),
    ] as unknown as uPlot.AlignedData;
    if (this.phaseChart) {
      this.phaseChart.setData(data);
      return;
    }
    const palette = this.palette;
    const pointsOnly = (label: string, colour: () => string): uPlot.Series => ({
      ...series({ label, colour, points: true }), paths: () => null, points: { show: true, size: 7, stroke: colour, fill: colour },
    });
    this.phaseChart = this.make('phase-plot', {
      scales: { x: { time: false, distr: 3, range: (_u: uPlot, min: number, max: number) => [min / 1.05, max * 1.05] }, y: { distr: 3 } },
      axes: [logAxis(palette, 'cells per wavelength', 'x'), logAxis(palette, 'phase lag (° per wavelength)', 'y')],
      series: [
        { label: 'cells/λ', value: (_u: uPlot, v: number | null) => (v === null ? '—' : formatSig(v, 3)) },
        pointsOnly('measured, axis', () => palette().fdtd),
        pointsOnly('measured, diagonal', () => palette().exact),
        series({ label: 'predicted, axis', colour: () => palette().fdtd, width: 1 }),
        series({ label: 'predicted, diagonal', colour: () => palette().exact, width: 1, dash: [5, 3] }),
        series({ label: 'budget / size', colour: () => palette().error, dash: [6, 4], width: 1 }),
      ],
      legend: { show: true },
    }, data);
  }
}

declare global {
  interface HTMLElementTagNameMap { 'gg-studies-panel': GgStudiesPanel }
}
