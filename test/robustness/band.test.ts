import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { BAND_SEARCH_EVALUATIONS, waveformBand, waveformSpectrum, withWaveformDefaults } from '../../src/scenario/waveforms.ts';
import type { WaveformKind } from '../../src/scenario/types.ts';

// Every computation on user input is bounded whatever the numbers: the band search counts its
// spectrum evaluations, and no waveform can make it take more. Common practice, no source.
describe('band search stays bounded', () => {
  it('the unit slip that once hung it: a modulated gaussian with f0 = 5 (GHz typed as Hz) and τ = 0.2 ns', () => {
    const band = waveformBand(withWaveformDefaults({ kind: 'modulated-gaussian', f0: 5, tau: 2e-10 }));
    expect(band.evaluations).toBeLessThanOrEqual(BAND_SEARCH_EVALUATIONS);
    expect(Number.isFinite(band.edgeHz)).toBe(true);
    // with f0 negligible the pulse is the derivative-like difference of two Gaussians: its band is set by τ
    expect(band.edgeHz).toBeGreaterThan(1e9);
    expect(band.edgeHz).toBeLessThan(2e10);
  });

  it('any positive f0 and τ, from 1 Hz to 1 PHz and 1 fs to 1 s, for every kind', () => {
    const positive = (lo: number, hi: number) => fc.double({ min: Math.log10(lo), max: Math.log10(hi), noNaN: true }).map((e) => 10 ** e);
    fc.assert(fc.property(
      fc.constantFrom<WaveformKind>('gaussian', 'modulated-gaussian', 'ricker'), positive(1, 1e15), positive(1e-15, 1), fc.double({ min: 1, max: 200, noNaN: true }),
      (kind, f0, tau, drop) => {
        const band = waveformBand(withWaveformDefaults({ kind, f0, tau }), drop);
        expect(band.evaluations).toBeLessThanOrEqual(BAND_SEARCH_EVALUATIONS);
        expect(band.edgeHz).toBeGreaterThanOrEqual(band.peakHz);
      },
    ), { numRuns: 300 });
  });

  it('the edge is where the spectrum has fallen by the drop (closed forms for gaussian and ricker, search for the modulated kind)', () => {
    // |I(f)| of each kind from its Fourier transform (waveforms.ts), compared at the edge found
    for (const w of [
      withWaveformDefaults({ kind: 'gaussian', tau: 1e-10 }),
      withWaveformDefaults({ kind: 'ricker', f0: 3e9 }),
      withWaveformDefaults({ kind: 'modulated-gaussian', f0: 1e10 }),
    ]) {
      const band = waveformBand(w, 40);
      const mag = (f: number) => Math.hypot(...waveformSpectrum(w, 1, f));
      expect(20 * Math.log10(mag(band.edgeHz) / mag(band.peakHz))).toBeCloseTo(-40, 3); // definition of the −40 dB edge
    }
  });
});
