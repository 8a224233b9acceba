import { EPS0, MU0 } from '../scenario/constants.ts';
import { stabilityLimit } from '../scenario/layout.ts';
import type { Scenario } from '../scenario/types.ts';
import { waveformExtent } from '../scenario/waveforms.ts';

/** Why a run was stopped: the step and the likely cause, in words a user can act on. */
export interface BlowUp { step: number; reason: string }

/** What the watch reads of a simulation (both engines provide it). */
export interface WatchedSimulation {
  readonly scenario: Scenario;
  readonly dt: number;
  readonly layout: { nx: number; ny: number; dx: number; dy: number };
  readonly stepsDone: number;
  ezView(): Float32Array;
  hxView(): Float32Array;
  hyView(): Float32Array;
  maxAbsEz(): number;
}

/**
 * Watches a running simulation between batches of steps and says when it has blown up:
 * a NaN or infinite field, or field energy that keeps growing for a sustained stretch after
 * the source has ended (a lossless grid with absorbers can only lose energy then).
 * Call `check()` after each batch; it returns undefined while all is well.
 */
export class BlowUpWatch {
  private peakEnergy = 0;
  private quietMinimum = Infinity;
  private risingChecks = 0;
  private lastEnergy = 0;
  private readonly sourceEndStep: number;
  private readonly sampleSpacing: number;
  private nextSample = 0;

  /** `risingChecksAllowed`: consecutive growing checks tolerated after the source ends. */
  constructor(private readonly sim: WatchedSimulation, private readonly risingChecksAllowed = 8) {
    const w = sim.scenario.source.waveform;
    this.sourceEndStep = Math.ceil((w.t0 + waveformExtent(w)) / sim.dt);
    this.sampleSpacing = Math.max(1, Math.ceil(sim.scenario.steps / 32));
  }

  /** Discrete field energy per unit length, J/m: ½Σ(ε·Ez² + μ·(Hx² + Hy²))·dx·dy (TEz: ½Σ(μ·Hz² + ε·(Ex² + Ey²))·dx·dy, with ε∞). */
  energy(): number {
    const ez = this.sim.ezView();
    const hx = this.sim.hxView();
    const hy = this.sim.hyView();
    let e = 0;
    let h = 0;
    for (let k = 0; k < ez.length; k++) {
      e += ez[k] * ez[k];
      h += hx[k] * hx[k] + hy[k] * hy[k];
    }
    const { dx, dy } = this.sim.layout;
    // the node field is Ez in TMz and Hz in TEz; the other two are the dual components
    const eps = EPS0 * this.sim.scenario.medium.epsR;
    const tez = (this.sim.scenario.polarization ?? 'TMz') === 'TEz';
    return 0.5 * (tez ? MU0 * e + eps * h : eps * e + MU0 * h) * dx * dy;
  }

  /**
   * Field energy at the last check over the largest seen in the run, dB; NaN before any
   * check after the source ended. A run whose response has died away ends far below 0 dB.
   */
  energyLeftDb(): number {
    if (!(this.peakEnergy > 0) || !(this.lastEnergy > 0)) return NaN;
    return 10 * Math.log10(this.lastEnergy / this.peakEnergy);
  }

  check(): BlowUp | undefined {
    const step = this.sim.stepsDone;
    const m = this.sim.maxAbsEz();
    if (!Number.isFinite(m)) {
      return { step, reason: `the field became ${Number.isNaN(m) ? 'NaN' : 'infinite'} by step ${step}; ${this.likelyCause()}` };
    }
    // While the source is on, energy may rightly grow: only the NaN test above applies. The
    // full-grid energy pass runs then only every ~1/32 of the run, to learn the run's peak
    // (for the energy left at the end) without slowing the stepping.
    if (step <= this.sourceEndStep) {
      if (step >= this.nextSample) {
        this.nextSample = step + this.sampleSpacing;
        this.peakEnergy = Math.max(this.peakEnergy, this.energy());
      }
      return undefined;
    }
    const energy = this.energy();
    this.peakEnergy = Math.max(this.peakEnergy, energy);
    this.quietMinimum = Math.min(this.quietMinimum, energy);
    this.risingChecks = this.lastEnergy > 0 && energy > this.lastEnergy ? this.risingChecks + 1 : 0;
    this.lastEnergy = energy;
    // Ignore growth at the float32 noise floor: only a rise well above the post-source
    // minimum and visible against the run's peak counts.
    const significant = energy > 4 * this.quietMinimum && energy > 1e-6 * this.peakEnergy;
    if (this.risingChecks > this.risingChecksAllowed && significant) {
      return { step, reason: `the field energy kept growing after the source ended (step ${step}); ${this.likelyCause()}` };
    }
    return undefined;
  }

  private likelyCause(): string {
    const { grid, absorber } = this.sim.scenario;
    const limit = stabilityLimit(grid.dx, grid.dy);
    if (grid.courant > limit * (1 - 1e-3)) {
      return `grid.courant ${grid.courant} is at the stability limit ${limit.toFixed(4)}, where float32 rounding can tip it over; use ${(0.98 * limit).toFixed(4)} or less`;
    }
    if (absorber.cells > 0 && absorber.alphaMax === 0) {
      return 'a CPML with alphaMax 0 can grow slowly at late times; set absorber.alphaMax to about 0.05';
    }
    return 'check grid.courant and the absorber settings; a run inside the stability limit should not grow';
  }
}
