/**
 * The curves of the set-up's εr(ω) chart: the medium's own relative permittivity and the
 * one the FDTD scheme carries at the scenario's time step, real and imaginary parts, from 0
 * to the pulse's −40 dB band edge. The values come from src/exact/medium.ts; this file
 * only samples them and picks a vertical range that shows the band.
 */
import { discretePermittivity, isSimpleMedium, relativePermittivity } from '../exact/medium.ts';
import { layoutOf } from '../scenario/layout.ts';
import type { Scenario } from '../scenario/types.ts';
import { waveformBand } from '../scenario/waveforms.ts';

export interface PermittivityCurves {
  /** Frequencies, Hz, evenly from 0 to the band edge. */
  f_Hz: Float64Array;
  /** εr(ω) of the medium: real and imaginary parts (null at 0 Hz, where σ and Drude poles diverge). */
  mediumRe: (number | null)[];
  mediumIm: (number | null)[];
  /** ε̃r(ω) of the scheme at the scenario's dt (null at 0 Hz and from 1/(2dt) up). */
  schemeRe: (number | null)[];
  schemeIm: (number | null)[];
  /** Centre frequency and band edge, Hz. */
  f0_Hz: number;
  edge_Hz: number;
  /**
   * Vertical range that holds every curve above a tenth of the band edge: below it a
   * conductor's Im εr grows as 1/f without bound and would flatten the rest.
   */
  range: [number, number];
}

/** Lowest share of the band the vertical range is fitted to. */
const FIT_FROM = 0.1;

const finiteOrNull = (v: number) => (Number.isFinite(v) ? v : null);

/**
 * Samples εr(ω) and ε̃r(ω) of a valid scenario's medium at `points` frequencies from 0 to
 * the −40 dB band edge, or undefined when the medium has neither conductivity nor poles
 * (εr is then the constant ε∞).
 *
 * @example
 * permittivityCurves(wetSoil)?.mediumRe[100]; // Re εr at half the band edge
 */
export function permittivityCurves(s: Scenario, points = 201): PermittivityCurves | undefined {
  if (isSimpleMedium(s.medium)) return undefined;
  const band = waveformBand(s.source.waveform);
  const edge = band.edgeHz;
  const dt = layoutOf(s).dt;
  const nyquist = 1 / (2 * dt);
  const n = Math.max(3, Math.floor(points));
  const f = new Float64Array(n);
  const mediumRe: (number | null)[] = [];
  const mediumIm: (number | null)[] = [];
  const schemeRe: (number | null)[] = [];
  const schemeIm: (number | null)[] = [];
  let lo = Infinity;
  let hi = -Infinity;
  for (let k = 0; k < n; k++) {
    f[k] = (edge * k) / (n - 1);
    const m = k > 0 ? relativePermittivity(s.medium, f[k]) : [NaN, NaN];
    const d = k > 0 && f[k] < nyquist ? discretePermittivity(s.medium, f[k], dt) : [NaN, NaN];
    const values = [m[0], m[1], d[0], d[1]].map(finiteOrNull);
    mediumRe.push(values[0]);
    mediumIm.push(values[1]);
    schemeRe.push(values[2]);
    schemeIm.push(values[3]);
    if (f[k] < FIT_FROM * edge) continue;
    for (const v of values) {
      if (v === null) continue;
      lo = Math.min(lo, v);
      hi = Math.max(hi, v);
    }
  }
  if (!(hi >= lo)) [lo, hi] = [-1, 1];
  const pad = Math.max(0.08 * (hi - lo), 0.05 * Math.max(Math.abs(hi), Math.abs(lo)), 1e-3);
  const f0 = s.source.waveform.kind === 'gaussian' ? band.peakHz : s.source.waveform.f0;
  return { f_Hz: f, mediumRe, mediumIm, schemeRe, schemeIm, f0_Hz: f0, edge_Hz: edge, range: [lo - pad, hi + pad] };
}

/**
 * Keeps the curves handed to the chart the same object while the medium, the waveform and
 * the grid are unchanged, so the chart does not redraw on every keystroke elsewhere.
 */
export class PermittivityCurvesCache {
  private key = '';
  private curves: PermittivityCurves | undefined;

  of(s: Scenario | undefined): PermittivityCurves | undefined {
    const key = s ? JSON.stringify([s.medium, s.source.waveform, s.grid]) : '';
    if (key !== this.key) {
      this.key = key;
      this.curves = s ? permittivityCurves(s) : undefined;
    }
    return this.curves;
  }
}
