/**
 * The list sections of the set-up form: probes, probe lines and analysis frequencies, one
 * row per entry with its own Remove button, and an Add button that places the new entry
 * where the scenario layer suggests (src/scenario/readouts.ts).
 */
import { html, nothing, type TemplateResult } from 'lit';
import { newLineSpot, newProbeSpot, nextAnalysisFrequency } from '../scenario/readouts.ts';
import { freshName } from './draft.ts';
import type { FieldKit } from './setup-fields.ts';

export function probesSection(kit: FieldKit): TemplateResult {
  const probes = kit.list(['probes']);
  const len = kit.host.units.length;
  return kit.section('Probes', ['probes'], html`
    <div class="list cols-2">
      ${probes.length ? html`<div class="row head" aria-hidden="true"><span>Name</span><span>x (${len})</span><span>y (${len})</span><span></span></div>` : nothing}
      ${probes.map((p, k) => html`
        <div class="row" role="group" aria-label="Probe ${k + 1}">
          ${kit.textField(`Probe ${k + 1} name`, ['probes', k, 'name'], true)}
          ${kit.field(`Probe ${k + 1} x`, ['probes', k, 'x'], { unit: 'length', compact: true })}
          ${kit.field(`Probe ${k + 1} y`, ['probes', k, 'y'], { unit: 'length', compact: true })}
          ${kit.removeButton(['probes'], k, `Remove probe ${String(p?.name ?? k + 1)}`)}
        </div>
        ${kit.rowProblems([['name', ['probes', k, 'name']], ['x', ['probes', k, 'x'], 'length'], ['y', ['probes', k, 'y'], 'length']])}`)}
      <div class="list-actions">
        <button type="button" class="small" @click=${() => {
          const [x, y] = newProbeSpot(kit.host.draft);
          kit.host.emit([{ path: ['probes'], value: [...probes, { name: freshName('p', probes.map((q) => String(q?.name))), x, y }] }]);
        }}>Add probe</button>
        <span class="muted hint">or click the field map</span>
      </div>
    </div>`, true);
}

export function linesSection(kit: FieldKit): TemplateResult {
  const lines = kit.list(['lines']);
  const len = kit.host.units.length;
  const ends = ['x0', 'y0', 'x1', 'y1'] as const;
  const endLabel = { x0: 'start x', y0: 'start y', x1: 'end x', y1: 'end y' };
  return kit.section('Probe lines', ['lines'], html`
    <div class="list cols-4">
      ${lines.length ? html`<div class="row head" aria-hidden="true"><span>Name</span><span>x0 (${len})</span><span>y0</span><span>x1</span><span>y1</span><span></span></div>` : nothing}
      ${lines.map((l, k) => html`
        <div class="row" role="group" aria-label="Probe line ${k + 1}">
          ${kit.textField(`Line ${k + 1} name`, ['lines', k, 'name'], true)}
          ${ends.map((e) => kit.field(`Line ${k + 1} ${endLabel[e]}`, ['lines', k, e], { unit: 'length', compact: true }))}
          ${kit.removeButton(['lines'], k, `Remove line ${String(l?.name ?? k + 1)}`)}
        </div>
        ${kit.rowProblems([['name', ['lines', k, 'name']], ...ends.map((e) => [e, ['lines', k, e], 'length'] as [string, (string | number)[], 'length'])])}`)}
      <div class="list-actions">
        <button type="button" class="small" @click=${() => {
          const spot = newLineSpot(kit.host.draft);
          kit.host.emit([{ path: ['lines'], value: [...lines, { name: freshName('line ', lines.map((q) => String(q?.name))), ...spot }] }]);
        }}>Add line</button>
        <span class="muted hint">or drag across the field map</span>
      </div>
    </div>`, true);
}

export function frequenciesSection(kit: FieldKit, centreHz: number | undefined): TemplateResult {
  const freqs = kit.list(['frequencies']);
  return kit.section('Analysis frequencies', ['frequencies'], html`
    <div class="list">
      ${freqs.map((_f, k) => html`
        <div class="row single" role="group" aria-label="Frequency ${k + 1}">
          ${kit.field(`Frequency ${k + 1}`, ['frequencies', k], { unit: 'frequency' })}
          ${kit.removeButton(['frequencies'], k, `Remove frequency ${k + 1}`, 'end')}
        </div>`)}
      <div class="list-actions">
        <button type="button" class="small" @click=${() => {
          kit.host.emit([{ path: ['frequencies'], value: [...freqs, nextAnalysisFrequency(kit.host.draft, centreHz)] }]);
        }}>Add frequency</button>
      </div>
      <p class="hint">Spectra, probe-line charts and the error maps are computed at these frequencies.</p>
    </div>`, true);
}
