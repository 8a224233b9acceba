/**
 * The live readouts above the set-up form: time step, cells per wavelength, stability
 * margin, memory and a run-time estimate. Every figure comes from the scenario layer
 * (src/scenario/derived.ts, src/scenario/readouts.ts); this file only formats them.
 */
import { html, type TemplateResult } from 'lit';
import type { DerivedQuantities } from '../scenario/derived.ts';
import { runMemory, runTimeEstimate } from '../scenario/readouts.ts';
import { formatBytes, formatSI, formatSig } from '../scenario/units.ts';
import type { Warning } from '../scenario/warnings.ts';

/** Node updates per second assumed for the run-time estimate before anything was measured. */
export const ASSUMED_CELL_RATE = 150e6;

/**
 * The memory readout's text: the page's figure, and how it splits into the run (the figure
 * `gridgauge check` prints) and the error maps the page accumulates on top.
 */
export function memoryText(d: DerivedQuantities, maps: number): { total: string; parts: string } {
  const m = runMemory(d, maps);
  const what = m.maps === 1 ? 'the error map' : `${m.maps} error maps`;
  return {
    total: formatBytes(m.total_bytes),
    parts: m.maps > 0 ? `${formatBytes(m.run_bytes)} for the run + ${formatBytes(m.errorMaps_bytes)} for ${what}` : 'the run alone, no error map',
  };
}

export function readoutsList(d: DerivedQuantities | undefined, maps: number, cellRate: number | undefined): TemplateResult {
  const item = (label: string, value: string, warn = false, title = '', note = '') =>
    html`<div><dt>${label}</dt><dd class=${warn ? 'warn' : ''} title=${title}>${value}${note ? html`<span class="note">${note}</span>` : ''}</dd></div>`;
  const cpwEdge = d?.cellsPerWavelengthAtBandEdge ?? NaN;
  const memory = d ? memoryText(d, maps) : undefined;
  const rate = cellRate ?? ASSUMED_CELL_RATE;
  return html`
    <dl class="readouts ${d ? '' : 'invalid'}" aria-label="Derived quantities" aria-live="polite">
      ${item('Time step dt', d ? formatSI(d.dt_s, 's') : '—')}
      ${item('Cells per wavelength at f0', d ? formatSig(d.cellsPerWavelengthAtF0, 3) : '—')}
      ${item('Cells per wavelength at −40 dB edge', d ? formatSig(cpwEdge, 3) : '—', !!d && cpwEdge < 10,
        'Below about 10 cells per wavelength the phase error grows quickly')}
      ${item('Stability margin', d ? `${formatSig(100 * d.stabilityMarginFraction, 3)} % below limit` : '—', !!d && d.stabilityMarginFraction < 0.01)}
      ${item('Memory', memory?.total ?? '—', false,
        'gridgauge check reports the run alone; the page also keeps a full-grid running DFT (8 bytes a node) for each error map',
        memory?.parts ?? '')}
      ${item('Run time (estimate)', d ? formatSI(runTimeEstimate(d, rate), 's', 2) : '—', false,
        cellRate ? 'From the speed of the last run' : `Assuming ${formatSI(ASSUMED_CELL_RATE, '')} node updates per second until a run has been timed`)}
    </dl>`;
}

/** The scenario's warnings (valid, but the results would mean little), first the likeliest cause. */
export function warningsList(warnings: readonly Warning[]): TemplateResult {
  if (warnings.length === 0) return html``;
  return html`<ul class="warnings" role="status" aria-label="Warnings">
    ${warnings.map((w) => html`<li data-code=${w.code}><strong>${w.path}</strong>: ${w.message}</li>`)}
  </ul>`;
}
