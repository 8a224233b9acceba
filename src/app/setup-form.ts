import { css, html, LitElement, nothing, type TemplateResult } from 'lit';
import { customElement, property, state } from 'lit/decorators.js';
import { withWaveformDefaults } from '../scenario/waveforms.ts';
import { formatBytes, formatSI, formatSig } from '../scenario/units.ts';
import type { DerivedQuantities } from '../scenario/derived.ts';
import { renderPath, type PathSegment } from '../scenario/path.ts';
import { stabilityLimit } from '../scenario/layout.ts';
import type { Problem, Scenario, Waveform, WaveformKind } from '../scenario/types.ts';
import { ASSUMED_CELL_RATE } from './controller.ts';
import {
  freshName, readAt, siToText, textToSi, UNIT_EXPONENT, type DisplayUnits, type Draft, type Edit,
} from './draft.ts';
import './spectrum-preview.ts';
import { controlStyles, type ThemeName } from './theme.ts';

type UnitKind = keyof DisplayUnits;

interface FieldOptions {
  unit?: UnitKind;
  /** Unit text for fields without a unit choice (A, S/m). */
  fixedUnit?: string;
  placeholder?: string;
  whole?: boolean;
  /** Visually hidden label (rows of a list show column headings instead). */
  compact?: boolean;
}

const idOf = (path: readonly PathSegment[]) => `f-${renderPath(path).replace(/[^A-Za-z0-9]+/g, '-')}`;

const KINDS: { kind: WaveformKind; label: string }[] = [
  { kind: 'modulated-gaussian', label: 'modulated Gaussian' },
  { kind: 'gaussian', label: 'Gaussian' },
  { kind: 'ricker', label: 'Ricker' },
];

/**
 * The scenario form. Every field shows the draft's value in the chosen units, sends each
 * change up as `gg-edit` (SI values), and shows the scenario model's message for its path.
 * Problems with no field of their own are listed at the top. Derived readouts follow the
 * valid scenario live.
 */
@customElement('gg-setup')
export class GgSetup extends LitElement {
  static styles = [controlStyles, css`
    :host { display: block; font-size: 0.9rem; }
    form { display: flex; flex-direction: column; gap: 0.6rem; }
    .units { display: flex; gap: 0.6rem; flex-wrap: wrap; align-items: end; }
    .units label { display: flex; flex-direction: column; font-size: 0.78rem; color: var(--gg-muted); gap: 0.15rem; }
    details { border: 1px solid var(--gg-border); border-radius: 8px; background: var(--gg-surface); }
    summary { cursor: pointer; padding: 0.45rem 0.7rem; font-weight: 600; list-style-position: inside; }
    summary .count { font-weight: 400; color: var(--gg-error); margin-left: 0.4rem; }
    .body { padding: 0.2rem 0.7rem 0.7rem; display: grid; grid-template-columns: repeat(auto-fill, minmax(8.5rem, 1fr)); gap: 0.5rem 0.6rem; }
    .body.wide { grid-template-columns: 1fr; }
    .field { display: flex; flex-direction: column; gap: 0.15rem; min-width: 0; }
    .field label { font-size: 0.78rem; color: var(--gg-muted); }
    .field input, .field select { width: 100%; }
    .problem { color: var(--gg-error); font-size: 0.78rem; line-height: 1.25; }
    .row { display: grid; gap: 0.35rem; align-items: start; }
    .cols-2 .row { grid-template-columns: minmax(5rem, 1.3fr) repeat(2, minmax(4rem, 1fr)) auto; }
    .cols-4 .row { grid-template-columns: minmax(4.5rem, 1.2fr) repeat(4, minmax(3.2rem, 1fr)) auto; }
    .row.single { grid-template-columns: minmax(6rem, 12rem) auto; }
    .row.single .end { align-self: end; justify-self: start; }
    .row-problem { margin: -0.15rem 0 0.2rem; }
    .full-row { grid-column: 1 / -1; }
    .row.head { font-size: 0.75rem; color: var(--gg-muted); }
    .list { display: flex; flex-direction: column; gap: 0.35rem; }
    .list-actions { display: flex; gap: 0.5rem; }
    .others { order: -1; border: 1px solid var(--gg-error); border-radius: 8px; padding: 0.5rem 0.7rem; background: var(--gg-surface); }
    .others h3 { font-size: 0.85rem; margin: 0 0 0.3rem; color: var(--gg-error); }
    .others ul { margin: 0; padding-left: 1.1rem; }
    .others code { font-family: var(--gg-mono); font-size: 0.8rem; }
    .readouts { order: -1; display: grid; grid-template-columns: repeat(auto-fill, minmax(9.5rem, 1fr)); gap: 0.3rem 0.8rem;
      border: 1px solid var(--gg-border); border-radius: 8px; padding: 0.55rem 0.7rem; margin: 0; background: var(--gg-raised); }
    .readouts div { display: flex; flex-direction: column; }
    .readouts dt { font-size: 0.72rem; color: var(--gg-muted); }
    .readouts dd { margin: 0; font-variant-numeric: tabular-nums; font-weight: 600; }
    .readouts .warn { color: var(--gg-warn); }
    .readouts.invalid dd { color: var(--gg-muted); font-weight: 400; }
    .order-top { order: -2; }
    .hint { font-size: 0.75rem; color: var(--gg-muted); margin: 0; grid-column: 1 / -1; }
  `];

  @property({ attribute: false }) draft: Draft = {};
  @property({ attribute: false }) problems: Problem[] = [];
  @property({ attribute: false }) scenario: Scenario | undefined;
  @property({ attribute: false }) derived: DerivedQuantities | undefined;
  @property({ attribute: false }) units!: DisplayUnits;
  @property({ type: Number }) cellRate: number | undefined;
  @property() theme: ThemeName = 'light';

  /** Text being typed, by path, so re-rendering never rewrites a half-typed number. */
  @state() private typing = new Map<string, string>();

  private shownPaths = new Set<string>();
  private byPath = new Map<string, string[]>();

  private emit(edits: Edit[]): void {
    this.dispatchEvent(new CustomEvent('gg-edit', { detail: { edits }, bubbles: true, composed: true }));
  }

  private get(path: PathSegment[]): unknown {
    return readAt(this.draft, path);
  }

  private list(path: PathSegment[]): Record<string, unknown>[] {
    const v = this.get(path);
    return Array.isArray(v) ? (v as Record<string, unknown>[]) : [];
  }

  private num(path: PathSegment[]): number | undefined {
    const v = this.get(path);
    return typeof v === 'number' && Number.isFinite(v) ? v : undefined;
  }

  private problemText(path: PathSegment[]): TemplateResult | typeof nothing {
    const key = renderPath(path);
    this.shownPaths.add(key);
    const messages = this.byPath.get(key);
    if (!messages) return nothing;
    return html`<div class="problem" id="${idOf(path)}-problem">${messages.join(' ')}</div>`;
  }

  private field(label: string, path: PathSegment[], o: FieldOptions = {}): TemplateResult {
    const key = renderPath(path);
    const exponent = o.unit ? UNIT_EXPONENT[this.units[o.unit]] : 0;
    const text = this.typing.get(key) ?? siToText(this.get(path), exponent);
    const unitText = o.unit ? this.units[o.unit] : o.fixedUnit;
    const invalid = this.byPath.has(key);
    const id = idOf(path);
    return html`
      <div class="field">
        <label for=${id} class=${o.compact ? 'visually-hidden' : ''}>${label}${unitText ? ` (${unitText})` : ''}</label>
        <input id=${id} name=${key} type="text" inputmode=${o.whole ? 'numeric' : 'decimal'} autocomplete="off" spellcheck="false"
          .value=${text} placeholder=${o.placeholder ?? ''} aria-invalid=${invalid ? 'true' : 'false'}
          aria-describedby=${invalid ? `${id}-problem` : nothing}
          @input=${(e: Event) => this.onNumber(path, (e.target as HTMLInputElement).value, exponent)}
          @blur=${() => this.doneTyping(key)} />
        ${o.compact ? this.registerOnly(path) : this.problemText(path)}
      </div>`;
  }

  /** Marks a path as shown by a row whose messages are listed under the whole row. */
  private registerOnly(path: PathSegment[]): typeof nothing {
    this.shownPaths.add(renderPath(path));
    return nothing;
  }

  /** The messages of a list row's fields, under the row, each named by its column. */
  private rowProblems(fields: [string, PathSegment[]][]): TemplateResult | typeof nothing {
    const found = fields.flatMap(([label, path]) => (this.byPath.get(renderPath(path)) ?? []).map((m) => ({ label, path, m })));
    if (found.length === 0) return nothing;
    return html`${found.map((f) => html`<div class="problem row-problem" id="${idOf(f.path)}-problem">${f.label}: ${f.m}</div>`)}`;
  }

  private textField(label: string, path: PathSegment[], compact = false): TemplateResult {
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
          @input=${(e: Event) => this.emit([{ path, value: (e.target as HTMLInputElement).value }])} />
        ${compact ? this.registerOnly(path) : this.problemText(path)}
      </div>`;
  }

  private onNumber(path: PathSegment[], text: string, exponent: number): void {
    this.typing = new Map(this.typing).set(renderPath(path), text);
    this.emit([{ path, value: textToSi(text, exponent) }]);
  }

  private doneTyping(key: string): void {
    if (!this.typing.has(key)) return;
    const next = new Map(this.typing);
    next.delete(key);
    this.typing = next;
  }

  private unitSelect(kind: UnitKind, label: string, options: string[]): TemplateResult {
    return html`<label>${label}
      <select aria-label="${label} unit" @change=${(e: Event) => {
        this.typing = new Map();
        this.dispatchEvent(new CustomEvent('gg-units', { detail: { ...this.units, [kind]: (e.target as HTMLSelectElement).value }, bubbles: true, composed: true }));
      }}>
        ${options.map((u) => html`<option ?selected=${this.units[kind] === u}>${u}</option>`)}
      </select></label>`;
  }

  private section(title: string, prefix: PathSegment[], body: TemplateResult, wide = false): TemplateResult {
    const p = renderPath(prefix);
    const count = this.problems.filter((q) => q.path === p || q.path.startsWith(`${p}.`) || q.path.startsWith(`${p}[`)).length;
    return html`
      <details open>
        <summary>${title}${count ? html`<span class="count">${count} to fix</span>` : nothing}</summary>
        <div class="body ${wide ? 'wide' : ''}">${body}</div>
      </details>`;
  }

  render() {
    this.shownPaths = new Set();
    this.byPath = new Map();
    for (const p of this.problems) this.byPath.set(p.path, [...(this.byPath.get(p.path) ?? []), p.message]);
    const kind = this.get(['source', 'waveform', 'kind']) as string | undefined;
    return html`
      <form @submit=${(e: Event) => e.preventDefault()} aria-label="Scenario set-up">
        <div class="units order-top">
          ${this.unitSelect('length', 'Lengths', ['m', 'mm', 'µm'])}
          ${this.unitSelect('frequency', 'Frequencies', ['MHz', 'GHz', 'THz'])}
          ${this.unitSelect('time', 'Times', ['ns', 'ps', 'fs'])}
          <button type="button" @click=${() => this.dispatchEvent(new CustomEvent('gg-load-demo', { bubbles: true, composed: true }))}>Demo scenario</button>
        </div>
        ${this.readouts()}
        ${this.section('Grid', ['grid'], html`
          ${this.field('Nodes along x, nx', ['grid', 'nx'], { whole: true })}
          ${this.field('Nodes along y, ny', ['grid', 'ny'], { whole: true })}
          ${this.field('Cell size dx', ['grid', 'dx'], { unit: 'length' })}
          ${this.field('Cell size dy', ['grid', 'dy'], { unit: 'length' })}
          ${this.field('Courant number', ['grid', 'courant'])}
          <p class="hint">Node counts include the absorber layers. Courant number S = c·dt/min(dx, dy); the 2D limit is ${formatSig(this.limitText(), 4)} for these cells.</p>
        `)}
        ${this.section('Medium', ['medium'], html`
          ${this.field('Relative permittivity εr', ['medium', 'epsR'], { placeholder: '1' })}
        `)}
        ${this.section('Absorber (CPML)', ['absorber'], html`
          ${this.field('Cells per side', ['absorber', 'cells'], { whole: true, placeholder: '10' })}
          ${this.field('Grading order m', ['absorber', 'order'], { placeholder: '3' })}
          ${this.field('σmax / σopt', ['absorber', 'sigmaScale'], { placeholder: '1' })}
          ${this.field('κmax', ['absorber', 'kappaMax'], { placeholder: '5' })}
          ${this.field('αmax', ['absorber', 'alphaMax'], { fixedUnit: 'S/m', placeholder: '0.05' })}
        `)}
        ${this.section('Source', ['source'], html`
          ${this.field('Position x', ['source', 'x'], { unit: 'length' })}
          ${this.field('Position y', ['source', 'y'], { unit: 'length' })}
          ${this.field('Peak current', ['source', 'amplitude'], { fixedUnit: 'A', placeholder: '1' })}
          <div class="field">
            <label for="f-waveform-kind">Waveform</label>
            <select id="f-waveform-kind" @change=${(e: Event) => this.setKind((e.target as HTMLSelectElement).value as WaveformKind)}
              aria-invalid=${this.byPath.has('source.waveform.kind') ? 'true' : 'false'}>
              ${KINDS.map((k) => html`<option value=${k.kind} ?selected=${k.kind === kind}>${k.label}</option>`)}
              ${KINDS.some((k) => k.kind === kind) ? nothing : html`<option value="" selected disabled>choose</option>`}
            </select>
            ${this.problemText(['source', 'waveform', 'kind'])}
          </div>
          ${kind !== 'gaussian' ? this.field('Centre frequency f0', ['source', 'waveform', 'f0'], { unit: 'frequency' }) : nothing}
          ${kind !== 'ricker' ? this.field('Width τ', ['source', 'waveform', 'tau'], { unit: 'time', placeholder: kind === 'modulated-gaussian' ? this.defaultText('tau') : '' }) : nothing}
          ${this.field('Delay t0', ['source', 'waveform', 't0'], { unit: 'time', placeholder: this.defaultText('t0') })}
          ${this.problemText(['source', 'waveform'])}
          <div class="field full-row">
            <gg-spectrum-preview .waveform=${this.previewWaveform()} theme=${this.theme}></gg-spectrum-preview>
          </div>
        `)}
        ${this.section('Probes', ['probes'], this.probesList(), true)}
        ${this.section('Probe lines', ['lines'], this.linesList(), true)}
        ${this.section('Analysis frequencies', ['frequencies'], this.frequencyList(), true)}
        ${this.section('Time steps', ['steps'], html`
          ${this.field('Steps', ['steps'], { whole: true })}
          <p class="hint">Simulated time ${formatSI(this.derived?.duration_s ?? NaN, 's')}.</p>
        `)}
        ${this.otherProblems()}
      </form>
    `;
  }

  /** The stability limit from dx and dy alone, so it shows while other fields are wrong. */
  private limitText(): number {
    const dx = this.num(['grid', 'dx']);
    const dy = this.num(['grid', 'dy']);
    return dx && dy && dx > 0 && dy > 0 ? stabilityLimit(dx, dy) : NaN;
  }

  /** The waveform with its defaults, when its own fields are right (whatever else is wrong). */
  private previewWaveform(): Waveform | undefined {
    if (this.scenario) return this.same(this.scenario.source.waveform);
    if (this.problems.some((p) => p.path === 'source' || p.path.startsWith('source.waveform'))) return undefined;
    const w = this.get(['source', 'waveform']) as Partial<Waveform> | undefined;
    if (!w || !KINDS.some((k) => k.kind === w.kind)) return undefined;
    const kind = w.kind as WaveformKind;
    const f0 = this.num(['source', 'waveform', 'f0']);
    const tau = this.num(['source', 'waveform', 'tau']);
    if ((kind !== 'gaussian' && !f0) || (kind === 'gaussian' && !tau)) return undefined;
    return this.same(withWaveformDefaults({ kind, f0, tau, t0: this.num(['source', 'waveform', 't0']) }));
  }

  /** The same object while the waveform is unchanged, so the preview does not redraw on every keystroke. */
  private same(wave: Waveform): Waveform | undefined {
    const key = JSON.stringify(wave);
    if (key !== this.previewKey) { this.previewKey = key; this.preview = wave; }
    return this.preview;
  }

  private previewKey = '';
  private preview: Waveform | undefined;

  private defaultText(which: 't0' | 'tau'): string {
    const kind = this.get(['source', 'waveform', 'kind']) as WaveformKind;
    const f0 = this.num(['source', 'waveform', 'f0']);
    const tau = this.num(['source', 'waveform', 'tau']);
    try {
      if (kind === 'ricker' ? !f0 : kind === 'gaussian' ? !tau : !(f0 || tau)) return 'default';
      const d = withWaveformDefaults({ kind, f0, tau });
      const v = which === 't0' ? d.t0 : d.kind === 'ricker' ? undefined : d.tau;
      return v === undefined ? 'default' : `default ${siToText(Number(v.toPrecision(4)), UNIT_EXPONENT[this.units.time])}`;
    } catch {
      return 'default';
    }
  }

  private setKind(kind: WaveformKind): void {
    const f0 = this.num(['source', 'waveform', 'f0']);
    const tau = this.num(['source', 'waveform', 'tau']);
    const base: PathSegment[] = ['source', 'waveform'];
    const edits: Edit[] = [{ path: [...base, 'kind'], value: kind }, { path: [...base, 't0'], value: undefined }];
    if (kind === 'gaussian') {
      edits.push({ path: [...base, 'f0'], value: undefined }, { path: [...base, 'tau'], value: tau ?? (f0 ? Number((1 / f0).toPrecision(6)) : undefined) });
    } else if (kind === 'ricker') {
      edits.push({ path: [...base, 'tau'], value: undefined }, { path: [...base, 'f0'], value: f0 ?? (tau ? Number((1 / tau).toPrecision(6)) : undefined) });
    } else {
      edits.push({ path: [...base, 'f0'], value: f0 ?? (tau ? Number((1 / tau).toPrecision(6)) : undefined) });
    }
    this.typing = new Map();
    this.emit(edits);
  }

  /** A spot for a new probe or line: a sixth of the interior to the right of the source. */
  private newSpot(): [number, number] {
    const dx = this.num(['grid', 'dx']) ?? 1e-3;
    const nx = this.num(['grid', 'nx']) ?? 100;
    const cells = this.num(['absorber', 'cells']) ?? 10;
    const sx = this.num(['source', 'x']) ?? 0;
    const sy = this.num(['source', 'y']) ?? 0;
    const x = Math.min(sx + Math.round((nx - 2 * cells) / 6) * dx, (nx - 1 - cells) * dx);
    return [Number(x.toPrecision(12)), sy];
  }

  private probesList(): TemplateResult {
    const probes = this.list(['probes']);
    const len = this.units.length;
    return html`
      <div class="list cols-2">
        ${probes.length ? html`<div class="row head" aria-hidden="true"><span>Name</span><span>x (${len})</span><span>y (${len})</span><span></span></div>` : nothing}
        ${probes.map((p, k) => html`
          <div class="row" role="group" aria-label="Probe ${k + 1}">
            ${this.textField(`Probe ${k + 1} name`, ['probes', k, 'name'], true)}
            ${this.field(`Probe ${k + 1} x`, ['probes', k, 'x'], { unit: 'length', compact: true })}
            ${this.field(`Probe ${k + 1} y`, ['probes', k, 'y'], { unit: 'length', compact: true })}
            <button type="button" class="small" aria-label="Remove probe ${String(p?.name ?? k + 1)}"
              @click=${() => { this.typing = new Map(); this.emit([{ path: ['probes'], value: probes.filter((_q, n) => n !== k) }]); }}>Remove</button>
          </div>
          ${this.rowProblems([['name', ['probes', k, 'name']], ['x', ['probes', k, 'x']], ['y', ['probes', k, 'y']]])}`)}
        <div class="list-actions">
          <button type="button" class="small" @click=${() => {
            const [x, y] = this.newSpot();
            this.emit([{ path: ['probes'], value: [...probes, { name: freshName('p', probes.map((q) => String(q?.name))), x, y }] }]);
          }}>Add probe</button>
          <span class="muted hint">or click the field map</span>
        </div>
      </div>`;
  }

  private linesList(): TemplateResult {
    const lines = this.list(['lines']);
    const len = this.units.length;
    return html`
      <div class="list cols-4">
        ${lines.length ? html`<div class="row head" aria-hidden="true"><span>Name</span><span>x0 (${len})</span><span>y0</span><span>x1</span><span>y1</span><span></span></div>` : nothing}
        ${lines.map((l, k) => html`
          <div class="row" role="group" aria-label="Probe line ${k + 1}">
            ${this.textField(`Line ${k + 1} name`, ['lines', k, 'name'], true)}
            ${this.field(`Line ${k + 1} start x`, ['lines', k, 'x0'], { unit: 'length', compact: true })}
            ${this.field(`Line ${k + 1} start y`, ['lines', k, 'y0'], { unit: 'length', compact: true })}
            ${this.field(`Line ${k + 1} end x`, ['lines', k, 'x1'], { unit: 'length', compact: true })}
            ${this.field(`Line ${k + 1} end y`, ['lines', k, 'y1'], { unit: 'length', compact: true })}
            <button type="button" class="small" aria-label="Remove line ${String(l?.name ?? k + 1)}"
              @click=${() => { this.typing = new Map(); this.emit([{ path: ['lines'], value: lines.filter((_q, n) => n !== k) }]); }}>Remove</button>
          </div>
          ${this.rowProblems([['name', ['lines', k, 'name']], ['x0', ['lines', k, 'x0']], ['y0', ['lines', k, 'y0']], ['x1', ['lines', k, 'x1']], ['y1', ['lines', k, 'y1']]])}`)}
        <div class="list-actions">
          <button type="button" class="small" @click=${() => {
            const [x1, y] = this.newSpot();
            const x0 = this.num(['source', 'x']) ?? 0;
            const dx = this.num(['grid', 'dx']) ?? 1e-3;
            this.emit([{ path: ['lines'], value: [...lines, { name: freshName('line ', lines.map((q) => String(q?.name))), x0: Number((x0 + 5 * dx).toPrecision(12)), y0: y, x1, y1: y }] }]);
          }}>Add line</button>
          <span class="muted hint">or drag across the field map</span>
        </div>
      </div>`;
  }

  private frequencyList(): TemplateResult {
    const v = this.get(['frequencies']);
    const freqs = Array.isArray(v) ? v : [];
    return html`
      <div class="list">
        ${freqs.map((_f, k) => html`
          <div class="row single" role="group" aria-label="Frequency ${k + 1}">
            ${this.field(`Frequency ${k + 1}`, ['frequencies', k], { unit: 'frequency' })}
            <button type="button" class="small end" aria-label="Remove frequency ${k + 1}"
              @click=${() => { this.typing = new Map(); this.emit([{ path: ['frequencies'], value: freqs.filter((_q, n) => n !== k) }]); }}>Remove</button>
          </div>`)}
        <div class="list-actions">
          <button type="button" class="small" @click=${() => {
            const last = freqs.length ? Number(freqs[freqs.length - 1]) : (this.derived?.f0_Hz ?? 1e9);
            this.emit([{ path: ['frequencies'], value: [...freqs, Number(((Number.isFinite(last) && last > 0 ? last : 1e9) * 1.5).toPrecision(6))] }]);
          }}>Add frequency</button>
        </div>
        <p class="hint">Spectra, probe-line charts and the error map are computed at these frequencies.</p>
      </div>`;
  }

  private readouts(): TemplateResult {
    const d = this.derived;
    const s = this.scenario;
    const valid = d !== undefined && s !== undefined;
    const rate = this.cellRate ?? ASSUMED_CELL_RATE;
    const seconds = valid ? (s.grid.nx * s.grid.ny * s.steps) / rate : NaN;
    const item = (label: string, value: string, warn = false, title = '') =>
      html`<div><dt>${label}</dt><dd class=${warn ? 'warn' : ''} title=${title}>${value}</dd></div>`;
    const cpwEdge = d?.cellsPerWavelengthAtBandEdge ?? NaN;
    return html`
      <dl class="readouts ${valid ? '' : 'invalid'}" aria-label="Derived quantities" aria-live="polite">
        ${item('Time step dt', valid ? formatSI(d.dt_s, 's') : '—')}
        ${item('Cells per wavelength at f0', valid ? formatSig(d.cellsPerWavelengthAtF0, 3) : '—')}
        ${item('Cells per wavelength at −40 dB edge', valid ? formatSig(cpwEdge, 3) : '—', valid && cpwEdge < 10,
          'Below about 10 cells per wavelength the phase error grows quickly')}
        ${item('Stability margin', valid ? `${formatSig(100 * d.stabilityMarginFraction, 3)} % below limit` : '—', valid && d.stabilityMarginFraction < 0.01)}
        ${item('Memory', valid ? formatBytes(d.memory_bytes + (s.frequencies.length ? 8 * s.grid.nx * s.grid.ny : 0)) : '—', false,
          'Engine memory for this run, with the full-grid running DFT the error map needs')}
        ${item('Run time (estimate)', valid ? formatSI(seconds, 's', 2) : '—', false,
          this.cellRate ? 'From the speed of the last run' : `Assuming ${formatSI(ASSUMED_CELL_RATE, '')} node updates per second until a run has been timed`)}
      </dl>`;
  }

  private otherProblems(): TemplateResult | typeof nothing {
    const rest = this.problems.filter((p) => !this.shownPaths.has(p.path));
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
