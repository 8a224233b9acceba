/**
 * How often a running DFT over the whole grid (the error map's) needs a sample: every m-th
 * time step, weighted by m, is as good as every step to a stated level, because the field is
 * band-limited by the source pulse.
 *
 * The sampling theorem for a decimated sum (Oppenheim & Schafer, Discrete-Time Signal
 * Processing, 3rd ed., §4.6, downsampling in the frequency domain): with X(f) = Σ_n x[n]·e^{−j2πf·n·dt}
 * the every-step running DFT of a node's field, keeping every m-th sample and weighting it
 * by m gives
 *     X_m(f) = m·Σ_q x[q·m]·e^{−j2πf·q·m·dt} = Σ_{k=0}^{m−1} X(f − k·fs/m),   fs = 1/dt,
 * since m·[n ≡ 0 (mod m)] = Σ_{k=0}^{m−1} e^{j2πkn/m}. The k = 0 term is the wanted value; the
 * others are its aliases. X is periodic in fs and |X(−g)| = |X(g)| for a real field, so the
 * k-th alias has the magnitude of X at g_k = f − k·fs/m folded into [0, fs/2].
 *
 * At every node the field is the source current I times the grid's transfer function H. For
 * the line source in a lossless medium, H(f) = −(ωμ/4)·H0^(2)(kρ) (Harrington 1961, ch. 5),
 * and the modulus M0(x) = |H0^(2)(x)| decreases with x while x·M0(x)² increases (Nicholson's
 * formula, DLMF 10.9.30, and DLMF §10.18(iii); recalled, from memory), so at any distance
 * |H(g)/H(f)| ≤ max(1, g/f). A lossy or dispersive medium attenuates by e^{−α(f)ρ}, which adds
 * at most e^{ρmax·(α(f) − α(g))} when the wanted frequency decays faster than its alias.
 * The aliases' total relative to the wanted value is then at most
 *     A(m, f) = Σ_{k=1}^{m−1} |I(g_k)|·max(1, g_k/f)·e^{ρmax·max(0, α(f) − α(g_k))} / |I(f)|,
 * with I the pulse's closed-form spectrum (scenario/waveforms.ts `waveformSpectrum`). The
 * decimation chosen is the largest m up to a cap with A(m, f) at or below the level
 * (default −80 dB) at every mapped frequency: at every node, not only at the map's peak.
 *
 * What the bound leaves out: the grid's own departures from the exact transfer function
 * (dispersion, absorber reflections, objects), which are small where the pulse has energy;
 * and the end of the run: the sum stops at the last multiple of m, so a field still ringing
 * at the last step adds up to about m/2 samples of it (the run's energy-left warning flags
 * that case, where the map is already cut short).
 */
import { C0 } from '../scenario/constants.ts';
import type { Medium, Waveform } from '../scenario/types.ts';
import { waveformSpectrum } from '../scenario/waveforms.ts';
import { refractiveIndex, relativePermittivity, isSimpleMedium } from './medium.ts';

/** What fixes the decimation of a full-grid running DFT. */
export interface DecimationInput {
  /** The source pulse. */
  waveform: Waveform;
  /** Time step, s. */
  dt: number;
  /** Frequencies of the full-grid DFTs, Hz. */
  frequencies: readonly number[];
  /** The medium (a lossy or dispersive one weighs aliases by its attenuation); lossless when absent. */
  medium?: Medium;
  /** Farthest distance from the source to a node, m (used with a lossy `medium`). */
  reach?: number;
}

/** Default level of the aliases below the wanted value, dB. */
export const DECIMATION_LEVEL_DB = 80;
/** Default cap on the decimation: beyond it the full-grid DFT's cost is already a few per cent of a step. */
export const DECIMATION_CAP = 32;
/** Largest cap searched, whatever is asked. */
const SEARCH_LIMIT = 256;

/** Attenuation constant α = −Im k of the medium at f, Np/m (0 at f = 0 or in a lossless medium). */
function attenuation(medium: Medium | undefined, f: number): number {
  if (!medium || isSimpleMedium(medium) || !(f > 0)) return 0;
  const n = refractiveIndex(relativePermittivity(medium, f));
  return Math.max(0, (-2 * Math.PI * f * n[1]) / C0);
}

/** f folded into [0, fs/2] (aliasing of a real sequence sampled at fs). */
function folded(f: number, fs: number): number {
  const r = ((f % fs) + fs) % fs;
  return r > fs / 2 ? fs - r : r;
}

/**
 * The bound A(m, f) of the module comment, in dB: how far below the wanted value at `f`
 * the aliases of a full-grid DFT decimated by `m` stay, at any node. −Infinity for m = 1
 * (no aliases); +Infinity when |I(f)| is zero, f is not inside (0, fs/2), or an input is
 * not usable.
 *
 * @param input - pulse, time step (s), medium and reach (m)
 * @param f - the DFT's frequency, Hz
 * @param m - decimation: one sample every m steps (integer ≥ 1)
 * @returns 20·log10 A(m, f), dB
 * @example
 * const w = { kind: 'modulated-gaussian', f0: 1e10, tau: 1e-10, t0: 5e-10 } as const;
 * decimationAliasDb({ waveform: w, dt: 1.6678e-12, frequencies: [1e10] }, 1e10, 16); // ≈ −253 dB
 */
export function decimationAliasDb(input: DecimationInput, f: number, m: number): number {
  return aliasDb(input, f, m, Infinity);
}

/** {@link decimationAliasDb}, giving up (+Infinity) as soon as the sum passes `stopAboveDb`. */
function aliasDb(input: DecimationInput, f: number, m: number, stopAboveDb: number): number {
  const { waveform, dt, medium } = input;
  const reach = input.reach ?? 0;
  if (!Number.isInteger(m) || m < 1 || !(dt > 0) || !Number.isFinite(dt) || !(reach >= 0) || !Number.isFinite(reach)) return Infinity;
  const fs = 1 / dt;
  if (!(f > 0) || !(f < fs / 2)) return Infinity;
  if (m === 1) return -Infinity;
  const wanted = Math.hypot(...waveformSpectrum(waveform, 1, f));
  if (!(wanted > 0) || !Number.isFinite(wanted)) return Infinity;
  const alphaF = attenuation(medium, f);
  const stop = wanted * 10 ** (stopAboveDb / 20);
  let sum = 0;
  for (let k = 1; k < m; k++) {
    const g = folded(f - (k * fs) / m, fs);
    const loss = Math.exp(reach * Math.max(0, alphaF - attenuation(medium, g)));
    sum += Math.hypot(...waveformSpectrum(waveform, 1, g)) * Math.max(1, g / f) * loss;
    if (sum > stop) return Infinity;
  }
  if (!Number.isFinite(sum)) return Infinity;
  return sum > 0 ? 20 * Math.log10(sum / wanted) : -Infinity;
}

/**
 * The decimation of a full-grid running DFT at `input.frequencies`: the largest m ≤ `cap`
 * whose aliases stay `levelDb` below the wanted value at every frequency and node
 * ({@link decimationAliasDb}). 1 (every step) when nothing larger meets the level, when there
 * are no frequencies, or when an input is not usable (NaN, zero or negative dt, ...).
 *
 * @param input - pulse, time step (s), frequencies (Hz), medium and reach (m)
 * @param levelDb - how far below the wanted value the aliases must stay, dB (default 80)
 * @param cap - largest decimation considered (default 32; at most 256 are searched)
 * @returns m, an integer from 1 to cap
 * @example
 * const demo = { kind: 'modulated-gaussian', f0: 1e10, tau: 1e-10, t0: 5e-10 } as const;
 * fullGridDecimation({ waveform: demo, dt: 1.6678e-12, frequencies: [5e9, 1e10, 1.5e10] }); // 16
 */
export function fullGridDecimation(input: DecimationInput, levelDb = DECIMATION_LEVEL_DB, cap = DECIMATION_CAP): number {
  if (input.frequencies.length === 0 || !Number.isFinite(levelDb) || !(cap >= 1)) return 1;
  const limit = -levelDb;
  for (let m = Math.floor(Math.min(cap, SEARCH_LIMIT)); m > 1; m--) {
    if (input.frequencies.every((f) => aliasDb(input, f, m, limit) <= limit)) return m;
  }
  return 1;
}
