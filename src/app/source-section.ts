/**
 * The source section of the set-up form: position, current (a magnetic current in volts
 * when the grid is TEz), waveform kind and its fields, and the spectrum preview. Switching the kind converts f0 and τ through the scenario layer
 * (src/scenario/readouts.ts `waveformForKind`); placeholders show the defaults it gives.
 */
import { html, nothing, type TemplateResult } from 'lit';
import type { PathSegment } from '../scenario/path.ts';
import { waveformDefaultsOfDraft, waveformForKind, waveformOfDraft } from '../scenario/readouts.ts';
import type { Waveform, WaveformKind } from '../scenario/types.ts';
import { siToText, UNIT_EXPONENT, type Edit } from './draft.ts';
import { fieldNames } from '../scenario/field-names.ts';
import type { FieldKit } from './setup-fields.ts';
import './spectrum-preview.ts';
import type { ThemeName } from './theme.ts';

const KINDS: { kind: WaveformKind; label: string }[] = [
  { kind: 'modulated-gaussian', label: 'modulated Gaussian' },
  { kind: 'gaussian', label: 'Gaussian' },
  { kind: 'ricker', label: 'Ricker' },
];

const BASE: PathSegment[] = ['source', 'waveform'];

/** The edits that switch the draft's waveform to `kind` (t0 goes back to its default). */
export function kindEdits(draft: unknown, kind: WaveformKind): Edit[] {
  const w = waveformForKind(draft, kind);
  return [
    { path: [...BASE, 'kind'], value: kind },
    { path: [...BASE, 't0'], value: undefined },
    { path: [...BASE, 'f0'], value: w.f0 },
    { path: [...BASE, 'tau'], value: w.tau },
  ];
}

/**
 * Keeps the waveform handed to the spectrum preview the same object while it is unchanged,
 * so the chart does not redraw on every keystroke elsewhere in the form.
 */
export class PreviewWaveform {
  private key = '';
  private wave: Waveform | undefined;

  of(kit: FieldKit): Waveform | undefined {
    // Whatever else is wrong, the preview follows the waveform once its own fields are right.
    if (kit.problems.some((p) => p.path === 'source' || p.path.startsWith('source.waveform'))) return undefined;
    const wave = waveformOfDraft(kit.host.draft);
    const key = JSON.stringify(wave ?? null);
    if (key !== this.key) { this.key = key; this.wave = wave; }
    return this.wave;
  }
}

export function sourceSection(kit: FieldKit, preview: Waveform | undefined, theme: ThemeName): TemplateResult {
  const kind = kit.get([...BASE, 'kind']) as string | undefined;
  const defaults = waveformDefaultsOfDraft(kit.host.draft);
  const names = fieldNames(kit.get(['polarization']));
  const timeText = (v: number | undefined) =>
    v === undefined ? 'default' : `default ${siToText(Number(v.toPrecision(4)), UNIT_EXPONENT[kit.host.units.time])}`;
  return kit.section('Source', ['source'], html`
    ${kit.field('Position x', ['source', 'x'], { unit: 'length' })}
    ${kit.field('Position y', ['source', 'y'], { unit: 'length' })}
    ${kit.field(`Peak ${names.sourceName} ${names.source}`, ['source', 'amplitude'], { fixedUnit: names.sourceUnit, placeholder: '1' })}
    <div class="field">
      <label for="f-waveform-kind">Waveform</label>
      <select id="f-waveform-kind" aria-invalid=${kit.hasProblem([...BASE, 'kind']) ? 'true' : 'false'}
        @change=${(e: Event) => {
          kit.host.clearTyping();
          kit.host.emit(kindEdits(kit.host.draft, (e.target as HTMLSelectElement).value as WaveformKind));
        }}>
        ${KINDS.map((k) => html`<option value=${k.kind} ?selected=${k.kind === kind}>${k.label}</option>`)}
        ${KINDS.some((k) => k.kind === kind) ? nothing : html`<option value="" selected disabled>choose</option>`}
      </select>
      ${kit.problemText([...BASE, 'kind'])}
    </div>
    ${kind !== 'gaussian' ? kit.field('Centre frequency f0', [...BASE, 'f0'], { unit: 'frequency' }) : nothing}
    ${kind !== 'ricker' ? kit.field('Width τ', [...BASE, 'tau'], { unit: 'time', placeholder: kind === 'modulated-gaussian' ? timeText(defaults.tau) : '' }) : nothing}
    ${kit.field('Delay t0', [...BASE, 't0'], { unit: 'time', placeholder: timeText(defaults.t0) })}
    ${kit.problemText(BASE)}
    <div class="field full-row">
      <gg-spectrum-preview .waveform=${preview} source=${names.source} theme=${theme}></gg-spectrum-preview>
    </div>
  `);
}
