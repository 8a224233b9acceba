/**
 * The medium of the set-up form: ε∞, conductivity σ and up to six dispersion poles, each
 * with its kind menu and its fields (τ in the chosen time unit, ωp and ω0 in rad/s, γ and
 * δ in 1/s, as the scenario file holds them); the medium's figures at f0 and at the band
 * edge (src/scenario/derived.ts); and the εr(ω) chart when the medium has loss or poles.
 * The same fields, without figures and chart, edit an object's material (objects-section.ts).
 */
import { html, nothing, type TemplateResult } from 'lit';
import type { DerivedQuantities } from '../scenario/derived.ts';
import type { PathSegment } from '../scenario/path.ts';
import { MAX_POLES, POLE_KINDS } from '../scenario/schema.ts';
import type { PoleKind } from '../scenario/types.ts';
import { formatSI, formatSig } from '../scenario/units.ts';
import type { UnitKind } from './draft.ts';
import type { PermittivityCurves } from './permittivity-curves.ts';
import { newPole } from './new-pole.ts';
import './permittivity-chart.ts';
import { idOf, type FieldKit } from './setup-fields.ts';
import type { ThemeName } from './theme.ts';

const KIND_LABELS: Record<PoleKind, string> = { debye: 'Debye', drude: 'Drude', lorentz: 'Lorentz' };

interface PoleField { key: string; label: string; unit?: UnitKind; fixedUnit?: string }

const POLE_FIELDS: Record<PoleKind, PoleField[]> = {
  debye: [{ key: 'deltaEps', label: 'Strength Δε' }, { key: 'tau', label: 'Relaxation time τ', unit: 'time' }],
  drude: [{ key: 'omegaP', label: 'Plasma frequency ωp', fixedUnit: 'rad/s' }, { key: 'gamma', label: 'Collision rate γ', fixedUnit: '1/s' }],
  lorentz: [
    { key: 'deltaEps', label: 'Strength Δε' }, { key: 'omega0', label: 'Resonance ω0', fixedUnit: 'rad/s' },
    { key: 'delta', label: 'Damping δ', fixedUnit: '1/s' },
  ],
};

/** The pole's angular rates written as frequencies (ω/2π), so rad/s can be read against the band. */
function asFrequencies(pole: Record<string, unknown>, kind: PoleKind): TemplateResult | typeof nothing {
  const rates = POLE_FIELDS[kind].filter((f) => f.fixedUnit !== undefined && typeof pole[f.key] === 'number' && Number.isFinite(pole[f.key]));
  if (rates.length === 0) return nothing;
  const text = rates.map((f) => `${f.label.split(' ').pop()}/2π = ${formatSI((pole[f.key] as number) / (2 * Math.PI), 'Hz')}`).join(', ');
  return html`<p class="hint">${text}</p>`;
}

function poleRow(kit: FieldKit, base: PathSegment[], k: number, f0Hz: number | undefined, owner: string): TemplateResult {
  const path = [...base, 'poles', k];
  const pole = kit.get(path) as Record<string, unknown> | undefined;
  const kind = (POLE_KINDS as readonly unknown[]).includes(pole?.kind) ? (pole?.kind as PoleKind) : undefined;
  const kindId = idOf([...path, 'kind']);
  const poles = kit.list([...base, 'poles']);
  return html`
    <div class="group" role="group" aria-label="Pole ${k + 1} of ${owner}">
      <div class="field">
        <label for=${kindId}>Pole ${k + 1} kind</label>
        <select id=${kindId} aria-invalid=${kit.hasProblem([...path, 'kind']) ? 'true' : 'false'} @change=${(e: Event) => {
          kit.host.clearTyping();
          kit.host.emit([{ path, value: newPole((e.target as HTMLSelectElement).value as PoleKind, f0Hz, pole) }]);
        }}>
          ${POLE_KINDS.map((p) => html`<option value=${p} ?selected=${p === kind}>${KIND_LABELS[p]}</option>`)}
          ${kind ? nothing : html`<option value="" selected disabled>choose</option>`}
        </select>
        ${kit.problemText([...path, 'kind'])}
      </div>
      ${(kind ? POLE_FIELDS[kind] : []).map((f) => kit.field(f.label, [...path, f.key], { unit: f.unit, fixedUnit: f.fixedUnit }))}
      ${kind ? asFrequencies(pole ?? {}, kind) : nothing}
      <button type="button" class="small end" aria-label="Remove pole ${k + 1} of ${owner}" @click=${() => {
        kit.host.clearTyping();
        const rest = poles.filter((_p, n) => n !== k);
        kit.host.emit([{ path: [...base, 'poles'], value: rest.length ? rest : undefined }]);
      }}>Remove</button>
      ${kit.problemText(path)}
    </div>`;
}

/**
 * ε∞, σ and the poles of the medium at `base` (["medium"] or an object's material);
 * `owner` names it for screen readers ("the medium", "object 2"); new poles start near
 * f0Hz (Hz).
 *
 * @example
 * html`${mediumFields(kit, ['objects', 0, 'material'], 1e10, 'object 1')}`;
 */
export function mediumFields(kit: FieldKit, base: PathSegment[], f0Hz: number | undefined, owner: string): TemplateResult {
  const poles = kit.list([...base, 'poles']);
  return html`
    ${kit.field(base.length === 1 ? 'Relative permittivity εr (ε∞ with poles)' : 'Permittivity εr (ε∞)', [...base, 'epsR'], { placeholder: '1' })}
    ${kit.field('Conductivity σ', [...base, 'sigma'], { unit: 'conductivity', placeholder: '0' })}
    ${poles.map((_p, k) => poleRow(kit, base, k, f0Hz, owner))}
    <div class="list-actions full-row">
      <button type="button" class="small" ?disabled=${poles.length >= MAX_POLES} aria-label="Add a dispersion pole to ${owner}" @click=${() => {
        kit.host.clearTyping();
        kit.host.emit([{ path: [...base, 'poles'], value: [...poles, newPole('debye', f0Hz)] }]);
      }}>Add pole</button>
      <span class="muted hint">${poles.length} of ${MAX_POLES} poles: Debye Δε/(1 + jωτ), Drude −ωp²/(ω² − jωγ), Lorentz Δε·ω0²/(ω0² + 2jωδ − ω²)</span>
    </div>
    ${kit.problemText([...base, 'poles'])}`;
}

/** a − jb, to four significant digits. */
function complexText(re: number, im: number): string {
  if (!Number.isFinite(re) || !Number.isFinite(im)) return '—';
  return `${formatSig(re, 4)} ${im <= 0 ? '−' : '+'} j${formatSig(Math.abs(im), 4)}`;
}

/** The medium's figures at f0 and at the band edge, as `gridgauge check` prints them. */
function mediumFigures(d: DerivedQuantities): TemplateResult {
  const item = (label: string, value: string, key: string, title = '') =>
    html`<div><dt>${label}</dt><dd data-figure=${key} title=${title}>${value}</dd></div>`;
  return html`
    <dl class="figures full-row" aria-label="Figures of the medium">
      ${item(`εr at f0 (${formatSI(d.f0_Hz, 'Hz')})`, complexText(d.epsRAtF0_re, d.epsRAtF0_im), 'eps-f0')}
      ${item(`εr at the −40 dB edge (${formatSI(d.bandEdge_Hz, 'Hz')})`, complexText(d.epsRAtBandEdge_re, d.epsRAtBandEdge_im), 'eps-edge')}
      ${item('Loss per wavelength at f0', `${formatSig(d.lossPerWavelengthAtF0_dB, 3)} dB`, 'loss')}
      ${item('Skin depth at f0', Number.isFinite(d.skinDepthAtF0_m) ? formatSI(d.skinDepthAtF0_m, 'm') : '— (no conductivity)', 'skin', '1/|Im k| at f0')}
      ${item('c∞ = c0/√ε∞', formatSI(d.fastestWaveSpeed_m_per_s, 'm/s', 4), 'c-inf', 'The fastest wave speed in the medium, which sets the time step')}
    </dl>`;
}

export interface MediumView {
  derived: DerivedQuantities | undefined;
  /** The εr(ω) curves of the valid scenario, undefined for a lossless medium without poles. */
  curves: PermittivityCurves | undefined;
  theme: ThemeName;
}

/**
 * The Medium section of the form: its fields, and for a lossy or dispersive medium its
 * figures and the εr(ω) chart.
 *
 * @example
 * html`${mediumSection(kit, { derived, curves: cache.of(scenario), theme: 'light' })}`;
 */
export function mediumSection(kit: FieldKit, v: MediumView): TemplateResult {
  const lossy = v.curves !== undefined;
  return kit.section('Medium', ['medium'], html`
    ${mediumFields(kit, ['medium'], v.derived?.f0_Hz, 'the medium')}
    ${v.derived && lossy ? mediumFigures(v.derived) : nothing}
    ${v.curves ? html`<div class="field full-row"><gg-permittivity-chart .curves=${v.curves} theme=${v.theme}></gg-permittivity-chart></div>` : nothing}
    ${v.derived && !lossy ? html`<p class="hint">Lossless and without poles: εr is the same at every frequency, c = ${formatSI(v.derived.fastestWaveSpeed_m_per_s, 'm/s', 4)}.</p>` : nothing}
  `);
}
