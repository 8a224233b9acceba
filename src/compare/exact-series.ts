/**
 * The exact time column at a probe, whatever the scenario (README "Exact field"): the direct
 * transient integral for a lossless medium (TMz as it always was; TEz by duality,
 * Hz/M = (ε/μ0)·Ez/I), and frequency synthesis with its own error estimate everywhere else
 * (a lossy or dispersive medium, one circular object). A scenario with any other objects has
 * no exact reference: the column is NaN.
 */
import { cylinderSeriesSolver, type CylinderInside } from '../exact/cylinder-series.ts';
import { isSimpleMedium } from '../exact/medium.ts';
import { synthesizeTransient, type SynthesisResult } from '../exact/synthesis.ts';
import { permittivityAt, synthesizedLineSource } from '../exact/synthesis-line-source.ts';
import { exactTimeSeries } from '../exact/transient.ts';
import { cSqrt, type Complex } from '../exact/complex.ts';
import { C0, EPS0, MU0 } from '../scenario/constants.ts';
import type { Node } from '../scenario/layout.ts';
import type { CircleObject, Medium, Scenario } from '../scenario/types.ts';
import { exactKind } from './reference.ts';

/** The exact column's accuracy target, relative to its peak. */
export const EXACT_TOLERANCE = 1e-4;

export interface ExactColumn {
  values: Float64Array;
  /** Error estimate relative to the column's peak (about 1e-12 for the direct integral; NaN when there is no reference). */
  relativeError: number;
  /** How it was computed. */
  method: 'integral' | 'synthesis' | 'none';
  /** Empty when the estimate meets EXACT_TOLERANCE; otherwise why not and what to change. */
  message: string;
}

const NONE = (samples: number): ExactColumn => ({ values: new Float64Array(samples).fill(NaN), relativeError: NaN, method: 'none', message: '' });

/** k = (ω/c0)·√εr(ω) on the branch Im k ≤ 0, at a complex ω. */
function wavenumberAt(m: Medium, omega: Complex): Complex {
  const eps = permittivityAt(m, omega);
  const w2: Complex = [omega[0] * omega[0] - omega[1] * omega[1], 2 * omega[0] * omega[1]];
  let [kr, ki] = cSqrt([w2[0] * eps[0] - w2[1] * eps[1], w2[0] * eps[1] + w2[1] * eps[0]]);
  if (ki > 0 || (ki === 0 && kr < 0)) { kr = -kr; ki = -ki; }
  return [kr / C0, ki / C0];
}

/** The field beside one circular object at a complex frequency: the cylinder series times the source factor. */
function cylinderTransfer(s: Scenario, circle: CircleObject, src: Node, at: Node) {
  const tmz = (s.polarization ?? 'TMz') === 'TMz';
  const polar = (n: { x: number; y: number }) => ({ rho: Math.hypot(n.x - circle.x, n.y - circle.y), phi: Math.atan2(n.y - circle.y, n.x - circle.x) });
  return (omegas: Complex[]): Complex[] => omegas.map((omega) => {
    const eps1 = permittivityAt(s.medium, omega);
    const inside: CylinderInside = circle.material === 'pec' ? 'pec'
      : { k2: wavenumberAt(circle.material, omega), eps2: permittivityAt(circle.material, omega) };
    const v = cylinderSeriesSolver({
      polarization: tmz ? 'TMz' : 'TEz', k1: wavenumberAt(s.medium, omega), eps1, inside, radius: circle.radius, source: polar(src),
    }).at(polar(at)).value;
    // −(ωμ0/4) for TMz, −(ωε0εr(ω)/4) for TEz
    const a: Complex = tmz ? [(-omega[0] * MU0) / 4, (-omega[1] * MU0) / 4]
      : [(-EPS0 * (omega[0] * eps1[0] - omega[1] * eps1[1])) / 4, (-EPS0 * (omega[0] * eps1[1] + omega[1] * eps1[0])) / 4];
    return [a[0] * v[0] - a[1] * v[1], a[0] * v[1] + a[1] * v[0]];
  });
}

function fromSynthesis(r: SynthesisResult): ExactColumn {
  return { values: r.values, relativeError: r.relativeError, method: 'synthesis', message: r.met ? '' : r.message };
}

/**
 * The exact field at node `at` (distance `rho` from the source node `src`) at t = n·dt,
 * n = 0..samples−1, in the units of the probe's FDTD column (V/m for TMz, A/m for TEz).
 */
export function exactColumn(s: Scenario, src: Node, at: Node, rho: number, dt: number, samples: number): ExactColumn {
  const kind = exactKind(s);
  if (kind === 'none' || !(rho > 0)) return NONE(samples);
  const { waveform, amplitude } = s.source;
  const tmz = (s.polarization ?? 'TMz') === 'TMz';
  if (kind === 'hankel' && isSimpleMedium(s.medium)) {
    const values = exactTimeSeries(waveform, amplitude, rho, s.medium.epsR, dt, samples);
    if (!tmz) {
      const scale = (EPS0 * s.medium.epsR) / MU0;
      for (let n = 0; n < values.length; n++) values[n] *= scale;
    }
    return { values, relativeError: 1e-12, method: 'integral', message: '' };
  }
  if (kind === 'hankel') {
    return fromSynthesis(synthesizedLineSource(s.medium, tmz ? 'TMz' : 'TEz', waveform, amplitude, rho, dt, samples, { tolerance: EXACT_TOLERANCE }));
  }
  const circle = (s.objects as CircleObject[])[0];
  // the earliest arrival: the straight path at the fastest speed present
  const fastest = circle.material === 'pec' ? s.medium.epsR : Math.min(s.medium.epsR, circle.material.epsR);
  return fromSynthesis(synthesizeTransient({
    waveform, amplitude, transferMany: cylinderTransfer(s, circle, src, at),
    delay: (rho * Math.sqrt(fastest)) / C0, dt, samples, tolerance: EXACT_TOLERANCE,
  }));
}
