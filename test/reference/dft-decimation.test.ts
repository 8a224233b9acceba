/**
 * The decimation of the full-grid running DFT (src/exact/dft-decimation.ts): the aliasing
 * identity it rests on, the bound against the actual alias of a sampled pulse, the choice of
 * m, and unusable inputs.
 */
import { describe, expect, it } from 'vitest';
import { DECIMATION_CAP, decimationAliasDb, fullGridDecimation, type DecimationInput } from '../../src/exact/dft-decimation.ts';
import type { Waveform } from '../../src/scenario/types.ts';
import { waveformValue } from '../../src/scenario/waveforms.ts';

const DT = 1e-3 / 299_792_458 / 2; // 1 mm cells at Courant number 0.5: the demo's time step
const DEMO: Waveform = { kind: 'modulated-gaussian', f0: 1e10, tau: 1e-10, t0: 5e-10 };
const RICKER: Waveform = { kind: 'ricker', f0: 1e10, t0: 2e-10 };
const GAUSSIAN: Waveform = { kind: 'gaussian', tau: 3e-11, t0: 1.5e-10 };

/** Every-step and m-decimated (weight m) DFTs of the sampled pulse I(n·dt), n = 0..N. */
function sums(w: Waveform, f: number, m: number, n = 4000): { full: [number, number]; decimated: [number, number]; at: (g: number) => [number, number] } {
  const x = Array.from({ length: n + 1 }, (_, k) => waveformValue(w, 1, k * DT));
  const at = (g: number): [number, number] => {
    let re = 0;
    let im = 0;
    for (let k = 0; k <= n; k++) {
      re += x[k] * Math.cos(2 * Math.PI * g * k * DT);
      im -= x[k] * Math.sin(2 * Math.PI * g * k * DT);
    }
    return [re, im];
  };
  let re = 0;
  let im = 0;
  for (let k = 0; k <= n; k += m) {
    re += m * x[k] * Math.cos(2 * Math.PI * f * k * DT);
    im -= m * x[k] * Math.sin(2 * Math.PI * f * k * DT);
  }
  return { full: at(f), decimated: [re, im], at };
}

describe('the decimated sum and its aliases', () => {
  it('m·Σ x[qm]·e^{−jωqm·dt} = Σ_{k=0}^{m−1} X(f − k·fs/m) to rounding', () => {
    // Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., §4.6 (downsampling), exact for any sequence
    for (const [w, f, m] of [[DEMO, 1.5e10, 24], [RICKER, 5e9, 7], [GAUSSIAN, 1e10, 40]] as const) {
      const { decimated, at } = sums(w, f, m, 900);
      let re = 0;
      let im = 0;
      for (let k = 0; k < m; k++) {
        const [a, b] = at(f - (k * (1 / DT)) / m);
        re += a;
        im += b;
      }
      const size = Math.hypot(...at(f));
      expect(Math.hypot(decimated[0] - re, decimated[1] - im)).toBeLessThan(1e-9 * size); // float64 rounding, common practice, no source
    }
  });

  it('the bound holds the actual alias of the sampled pulse from above, and is not loose where one alias rules', () => {
    // the pulse's own spectrum is the field's at the source (H = 1 there): the bound's max(1, g/f) only adds
    for (const [w, f] of [[DEMO, 5e9], [DEMO, 1.5e10], [RICKER, 1e10], [GAUSSIAN, 5e9]] as const) {
      const input: DecimationInput = { waveform: w, dt: DT, frequencies: [f] };
      for (const m of [12, 20, 28]) {
        const { full, decimated } = sums(w, f, m);
        const actualDb = 20 * Math.log10(Math.hypot(decimated[0] - full[0], decimated[1] - full[1]) / Math.hypot(...full));
        const boundDb = decimationAliasDb(input, f, m);
        if (actualDb < -200) continue; // below float64 rounding of the sums: nothing to compare
        expect(actualDb, `${w.kind} ${f} Hz, m = ${m}`).toBeLessThanOrEqual(boundDb + 0.01); // Oppenheim & Schafer §4.6 with waveformSpectrum, common practice, no source
        expect(actualDb, `${w.kind} ${f} Hz, m = ${m}: a bound 40 dB above the alias would waste decimation`).toBeGreaterThan(boundDb - 40); // common practice, no source
      }
    }
  });
});

describe('fullGridDecimation', () => {
  it('picks the largest m up to the cap whose aliases stay 80 dB down at every frequency', () => {
    for (const w of [DEMO, RICKER, GAUSSIAN]) {
      const input: DecimationInput = { waveform: w, dt: DT, frequencies: [5e9, 1e10, 1.5e10] };
      const m = fullGridDecimation(input);
      expect(m).toBeGreaterThan(1); // common practice, no source
      for (const f of input.frequencies) expect(decimationAliasDb(input, f, m)).toBeLessThanOrEqual(-80); // the stated level
      for (let larger = m + 1; larger <= DECIMATION_CAP; larger++) {
        expect(input.frequencies.some((f) => decimationAliasDb(input, f, larger) > -80), `m = ${larger}`).toBe(true); // common practice, no source
      }
    }
  });

  it('gives the demo 16 steps; a stricter level or a higher frequency gives fewer', () => {
    const demo: DecimationInput = { waveform: DEMO, dt: DT, frequencies: [5e9, 1e10, 1.5e10] };
    expect(fullGridDecimation(demo)).toBe(16); // fs/m must clear 15 GHz plus the band to about 20 GHz, from the closed-form spectrum, common practice, no source
    expect(fullGridDecimation(demo, 120)).toBeLessThan(16); // common practice, no source
    expect(fullGridDecimation({ ...demo, frequencies: [5e9] })).toBeGreaterThanOrEqual(16); // common practice, no source
    expect(fullGridDecimation({ ...demo, frequencies: [5e9, 2.5e10] })).toBeLessThan(16); // common practice, no source
    expect(fullGridDecimation(demo, 80, 4)).toBe(4); // the cap, common practice, no source
  });

  it('weighs aliases by a lossy medium\'s attenuation: an evanescent wanted frequency gets fewer steps', () => {
    // a Drude plasma with ωp = 2π·12 GHz: 10 GHz is below the plasma frequency and decays, 20 GHz propagates (Jackson, Classical Electrodynamics, §7.5, from memory)
    const plasma = { epsR: 1, poles: [{ kind: 'drude' as const, omegaP: 2 * Math.PI * 12e9, gamma: 1e8 }] };
    const lossless: DecimationInput = { waveform: DEMO, dt: DT, frequencies: [1e10] };
    const lossy: DecimationInput = { ...lossless, medium: plasma, reach: 0.3 };
    expect(decimationAliasDb(lossy, 1e10, 16)).toBeGreaterThan(decimationAliasDb(lossless, 1e10, 16) + 20); // common practice, no source
    expect(fullGridDecimation(lossy)).toBeLessThan(fullGridDecimation(lossless)); // common practice, no source
    expect(fullGridDecimation({ ...lossy, reach: 0 })).toBe(fullGridDecimation(lossless)); // at the source the medium adds nothing, common practice, no source
    expect(fullGridDecimation({ ...lossless, medium: { epsR: 4 }, reach: 1 })).toBe(fullGridDecimation(lossless)); // lossless: no weight, common practice, no source
  });

  it('falls back to every step when nothing larger is safe or an input is unusable', () => {
    const base: DecimationInput = { waveform: DEMO, dt: DT, frequencies: [1e10] };
    expect(fullGridDecimation({ ...base, frequencies: [] })).toBe(1); // no DFT, common practice, no source
    for (const dt of [0, -DT, Number.NaN, Infinity]) expect(fullGridDecimation({ ...base, dt })).toBe(1); // common practice, no source
    for (const f of [0, -1e10, Number.NaN, Infinity, 0.5 / DT, 1 / DT]) expect(fullGridDecimation({ ...base, frequencies: [f] })).toBe(1); // at or past fs/2 nothing can be said, common practice, no source
    expect(fullGridDecimation({ ...base, frequencies: [1e10, Number.NaN] })).toBe(1); // common practice, no source
    expect(fullGridDecimation({ ...base, frequencies: [2e12] })).toBe(1); // |I(f)| underflows to 0 this far in the tail, common practice, no source
    expect(fullGridDecimation(base, Number.NaN)).toBe(1); // common practice, no source
    expect(fullGridDecimation(base, 80, 0)).toBe(1); // common practice, no source
    expect(fullGridDecimation(base, 80, Number.NaN)).toBe(1); // common practice, no source
    expect(fullGridDecimation({ ...base, medium: { epsR: 1, sigma: 1 }, reach: Number.NaN })).toBe(1); // common practice, no source
    expect(fullGridDecimation(base, -Infinity)).toBe(1); // common practice, no source
    expect(fullGridDecimation(base, 80, 1e9)).toBeGreaterThan(16); // a huge cap is searched up to 256, not refused, common practice, no source
  });

  it('decimationAliasDb: no aliases at m = 1, unusable m is refused', () => {
    const base: DecimationInput = { waveform: RICKER, dt: DT, frequencies: [1e10] };
    expect(decimationAliasDb(base, 1e10, 1)).toBe(-Infinity); // common practice, no source
    for (const m of [0, -3, 2.5, Number.NaN, Infinity]) expect(decimationAliasDb(base, 1e10, m)).toBe(Infinity); // common practice, no source
    expect(decimationAliasDb(base, 1e10, 40)).toBeGreaterThan(decimationAliasDb(base, 1e10, 20)); // common practice, no source
  });
});
