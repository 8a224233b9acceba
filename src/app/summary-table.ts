import { css, html, LitElement, nothing } from 'lit';
import { customElement, property } from 'lit/decorators.js';
import type { RunResults } from '../compare/results.ts';
import { figureOrNote, formatSI, formatSig } from '../scenario/units.ts';
import type { ExactKind } from '../compare/reference.ts';
import { fieldNames, type FieldNames } from '../scenario/field-names.ts';
import { noExactNote, noExactStyles } from './no-exact-note.ts';
import { controlStyles } from './theme.ts';

/**
 * One row per probe and analysis frequency, with the figures the command line prints for
 * `gridgauge run`: position, ρ, the time-domain relErrMax, and per frequency ρ in
 * wavelengths, |Ez/I| (|Hz/M| in TEz) error, phase error and the phase error the
 * dispersion relation predicts. A scenario without an exact reference (objects other than
 * one circle) has no errors to show: the table gives the probes and sends the reader to
 * the convergence study.
 */
@customElement('gg-summary-table')
export class GgSummaryTable extends LitElement {
  static styles = [controlStyles, noExactStyles, css`
    :host { display: block; min-width: 0; }
    .scroll { overflow-x: auto; }
    table { border-collapse: collapse; width: 100%; font-size: 0.86rem; }
    .caption { font-size: 0.8rem; margin: 0.4rem 0 0; color: var(--gg-muted); }
    th, td { padding: 0.3rem 0.4rem; border-bottom: 1px solid var(--gg-grid); text-align: right; white-space: nowrap; }
    th { font-weight: 600; color: var(--gg-muted); font-size: 0.8rem; vertical-align: bottom; }
    th:first-child, td.name { text-align: left; }
    td.name { font-weight: 600; }
    tbody tr.first td { border-top: 1px solid var(--gg-border); }
  `];

  @property({ attribute: false }) results: RunResults | undefined;
  @property({ attribute: false }) names: FieldNames = fieldNames('TMz');
  /** The exact reference the run was compared with. */
  @property() exact: ExactKind = 'hankel';

  render() {
    const r = this.results;
    if (!r) return html`<p class="muted">Run the scenario to fill this table.</p>`;
    if (r.probes.length === 0) return html`<p class="muted">This scenario has no probes: click the field to add one.</p>`;
    if (this.exact === 'none') return this.withoutReference(r);
    const freqs = r.frequencies;
    const span = Math.max(1, freqs.length);
    return html`
      <div class="scroll"><table aria-describedby="summary-caption">
        <thead>
          <tr>
            <th scope="col">Probe</th><th scope="col">x</th><th scope="col">y</th><th scope="col">ρ</th><th scope="col">relErrMax</th>
            <th scope="col">Frequency</th><th scope="col">ρ (λ)</th><th scope="col">|${this.names.ratio}| error</th>
            <th scope="col">Phase error</th><th scope="col">Predicted</th>
          </tr>
        </thead>
        <tbody>
          ${r.probes.map((p) => {
            const rows = freqs.length === 0 ? [-1] : freqs.map((_f, k) => k);
            return rows.map((k, n) => {
              const s = k >= 0 ? p.spectra[k] : undefined;
              return html`
                <tr class=${n === 0 ? 'first' : ''} data-probe=${p.name}>
                  ${n === 0 ? html`
                    <td class="name" rowspan=${span}>${p.name}</td>
                    <td class="num" rowspan=${span}>${formatSI(p.x_m, 'm')}</td>
                    <td class="num" rowspan=${span}>${formatSI(p.y_m, 'm')}</td>
                    <td class="num" rowspan=${span}>${formatSI(p.rho_m, 'm')}</td>
                    <td class="num relerr" rowspan=${span}>${formatSig(p.relErrMax, 3)}</td>` : nothing}
                  ${s ? html`
                    <td class="num">${formatSI(s.f_Hz, 'Hz')}</td>
                    <td class="num">${formatSig(p.rho_wavelengths[k], 3)}</td>
                    <td class="num">${figureOrNote(s.mag_err_dB, ' dB', s.note)}</td>
                    <td class="num">${figureOrNote(s.phase_err_deg, '°', s.note)}</td>
                    <td class="num predicted">${figureOrNote(s.predicted_phase_err_deg, '°', s.note)}</td>`
                  : html`<td class="muted" colspan="5">no analysis frequencies</td>`}
                </tr>`;
            });
          })}
        </tbody>
      </table></div>
      <p class="caption" id="summary-caption">${this.names.field} compared. Phase is arg(FDTD/exact) with e<sup>+jωt</sup>; negative means the grid lags. relErrMax = max |FDTD − exact| / max |exact| over the run. Predicted: the phase error the dispersion relation gives along the line from the source; — where it has none (objects in the grid, a frequency past what the grid carries).</p>
    `;
  }

  private withoutReference(r: RunResults) {
    return html`
      ${noExactNote(this)}
      <div class="scroll"><table aria-label="Probes of the run, without a comparison">
        <thead><tr><th scope="col">Probe</th><th scope="col">x</th><th scope="col">y</th><th scope="col">ρ</th><th scope="col">Comparison</th></tr></thead>
        <tbody>${r.probes.map((p) => html`
          <tr class="first" data-probe=${p.name}>
            <td class="name">${p.name}</td><td class="num">${formatSI(p.x_m, 'm')}</td><td class="num">${formatSI(p.y_m, 'm')}</td>
            <td class="num">${formatSI(p.rho_m, 'm')}</td><td class="muted">no exact ${this.names.field}</td>
          </tr>`)}
        </tbody>
      </table></div>`;
  }
}

declare global {
  interface HTMLElementTagNameMap { 'gg-summary-table': GgSummaryTable }
}
