/**
 * The run in the report: the quantities that follow from the scenario (time step, Courant
 * number and stability margin, cells per wavelength, memory, duration), the warnings, and
 * the comparison with the exact field per probe (README "Command line", `gridgauge run`).
 */
import type { RunResults } from '../../compare/results.ts';
import type { DerivedQuantities } from '../../scenario/derived.ts';
import { fieldNames } from '../../scenario/field-names.ts';
import type { Polarization } from '../../scenario/types.ts';
import { formatBytes } from '../../scenario/units.ts';
import type { Warning } from '../../scenario/warnings.ts';
import { dataTable, dB, deg, html, keyValueTable, numCell, si, sig, type Cell, type Html } from './html.ts';

/** What the report says about the run itself. */
export interface RunInfo {
  /** Wall-clock seconds of the run. */
  seconds: number;
  /** Why the run ended before its last step, if it did. */
  stopped?: { step: number; reason: string };
  /** Engine memory of the run as made, bytes (with the full-grid DFT when there is an error map). */
  memory_bytes?: number;
}

/**
 * Derived quantities and warnings.
 *
 * @example
 * derivedSection(deriveQuantities(s), scenarioWarnings(s), { seconds: 1.2 });
 */
export function derivedSection(d: DerivedQuantities, warnings: readonly Warning[], run: RunInfo): Html {
  const rows: [string, string][] = [
    ['Time step dt', si(d.dt_s, 's', 4)],
    ['Wave speed in the medium', si(d.c_m_per_s, 'm/s', 4)],
    ['Courant number S', sig(d.courant, 4)],
    ['Stability limit on S', sig(d.stabilityLimit, 4)],
    ['Stability margin', `${sig(d.stabilityMargin, 3)} (${sig(100 * d.stabilityMarginFraction, 3)} % of the limit)`],
    ['Centre frequency f0', si(d.f0_Hz, 'Hz', 4)],
    ['−40 dB band edge', si(d.bandEdge_Hz, 'Hz', 4)],
    ['Wavelength at f0 / at the band edge', `${si(d.wavelengthAtF0_m, 'm')} / ${si(d.wavelengthAtBandEdge_m, 'm')}`],
    ['Cells per wavelength at f0', sig(d.cellsPerWavelengthAtF0, 3)],
    ['Cells per wavelength at the band edge', sig(d.cellsPerWavelengthAtBandEdge, 3)],
    ['Highest frequency the time step samples, 1/(2·dt)', si(d.nyquist_Hz, 'Hz')],
    ['Interior nodes (absorber excluded)', `${d.interiorNx} × ${d.interiorNy}`],
    ['Engine memory', `${formatBytes(d.memory_bytes)}${run.memory_bytes !== undefined && run.memory_bytes !== d.memory_bytes ? `; ${formatBytes(run.memory_bytes)} with the error map's full-grid DFT` : ''} (cap ${formatBytes(d.memoryCap_bytes, 3, true)})`],
    ['Simulated time, steps·dt', si(d.duration_s, 's', 4)],
    ['Run time on this machine', `${sig(run.seconds, 3)} s`],
  ];
  return html`<h2 id="derived">Derived quantities and warnings</h2>
<p>What follows from the scenario before any field is computed. The Courant number must stay below the stability limit; cells per wavelength count along the coarser of dx and dy.</p>
${keyValueTable(rows)}
<h3>Warnings</h3>
${run.stopped ? html`<p class="warning"><strong>The run stopped at step ${run.stopped.step}:</strong> ${run.stopped.reason}. The figures below use the steps taken.</p>` : ''}
${warnings.length
    ? warnings.map((w) => html`<p class="warning"><code>${w.path}</code> (${w.code}): ${w.message}</p>`)
    : html`<p>None: the cells, the band, the frequencies and the run's length suit the probes and lines.</p>`}`;
}

/**
 * The comparison with the exact field: per probe its place, ρ, relErrMax; per probe and
 * frequency ρ in wavelengths, magnitude and phase errors with the predicted ones.
 *
 * @example
 * comparisonSection(collectResults(sim));
 */
export function comparisonSection(r: RunResults, polarization?: Polarization): Html {
  const names = fieldNames(polarization);
  const per = names.source === 'I' ? 'the field per ampere of source current' : 'the field per volt of magnetic source current';
  const probeRows = r.probes.map((p): Cell[] => [
    { value: p.name, className: 'name' }, `(${si(p.x_m, 'm')}, ${si(p.y_m, 'm')})`, numCell(si(p.rho_m, 'm')),
    numCell(p.reached ? sig(p.relErrMax, 3) : '—'), p.reached ? 'reached' : 'not reached: the run ended before the pulse arrived',
  ]);
  const spectrumRows: Cell[][] = [];
  for (const p of r.probes) {
    p.spectra.forEach((s, k) => {
      const name: Cell[] = k === 0 ? [{ value: p.name, className: 'name', rowspan: p.spectra.length }] : [];
      if (!p.reached) {
        spectrumRows.push([...name, numCell(si(s.f_Hz, 'Hz')), numCell(sig(p.rho_wavelengths[k], 3)), { value: 'not reached', numeric: false }, '', '', '', '']);
        return;
      }
      spectrumRows.push([
        ...name, numCell(si(s.f_Hz, 'Hz')), numCell(sig(p.rho_wavelengths[k], 3)),
        numCell(dB(s.mag_err_dB)), numCell(dB(s.predicted_mag_err_dB)), numCell(deg(s.phase_err_deg)), numCell(deg(s.predicted_phase_err_deg)), s.note,
      ]);
    });
  }
  return html`<h2 id="comparison">FDTD against the exact field</h2>
<p>At each probe: the time-domain error relErrMax = max|FDTD − exact| / max|exact| over the run, and at each analysis frequency the errors of ${names.ratio} (${per}) in magnitude and phase, beside what the Yee dispersion relation predicts for that distance and direction. A phase error near its prediction means the grid behaves as theory says; a large difference points at the absorber, the run's length or the source region.</p>
${r.probes.length
    ? html`${dataTable(['probe', 'position (x, y)', { value: 'ρ', numeric: true }, { value: 'relErrMax', numeric: true }, ''], probeRows)}
${r.frequencies.length ? dataTable(['probe', { value: 'frequency', numeric: true }, { value: 'ρ (λ)', numeric: true }, { value: `|${names.ratio}| error`, numeric: true }, { value: 'predicted', numeric: true }, { value: 'phase error', numeric: true }, { value: 'predicted', numeric: true }, 'note'], spectrumRows)
    : html`<p class="note">No analysis frequencies: no spectra to compare.</p>`}`
    : html`<p class="note">No probes in this scenario: add probes to compare FDTD with the exact field at chosen points.</p>`}
<p class="note">ρ: distance from the source; ρ (λ): the same in wavelengths of the medium at that frequency. Phase error = arg(FDTD) − arg(exact) with e<sup>+jωt</sup>; negative: the grid lags. Predicted magnitude error is 0 dB in a lossless medium; "—" where the relation gives no value.</p>`;
}
