import { beforeAll, describe, expect, it } from 'vitest';
import type { ComponentPatch, MaterialMap } from '../../src/engine/material-map.ts';
import { MediaSimulation } from '../../src/engine/media-simulation.ts';
import { loadMediaModule } from '../../src/engine/wasm.ts';
import { cAbs, cAdd, cDiv, cLog, cMul, cScale, cSqrt, cSub, type Complex } from '../../src/exact/complex.ts';
import { discretePermittivity, refractiveIndex, wavenumber } from '../../src/exact/medium.ts';
import { C0 } from '../../src/scenario/constants.ts';
import type { Medium, Polarization } from '../../src/scenario/types.ts';
import { mediaScenario, OBJECT_MEDIUM, TEST_MEDIA } from '../fixtures/media.ts';

/*
 * The wavenumber the grid gives a wave in each medium, measured and set against the
 * scheme's own dispersion relation along an axis,
 *   (2/dx)²·sin²(k̃·dx/2) = μ0ε0·ε̃r(ω)·Ω² − T,   Ω = (2/dt)·sin(ωdt/2),
 * with ε̃r the discrete permittivity of src/exact/medium.ts and T a known transverse term,
 * so k̃ = (2/dx)·asin((dx/2)·√(μ0ε0ε̃rΩ² − T)) in closed form (Yee dispersion relation,
 * Taflove & Hagness, Computational Electrodynamics, 3rd ed., ch. 4, from memory; the
 * medium's part is the z-transform of its update equations).
 *
 * Set-up, plane-wave-like: a grid of three rows, so that one row of a nodes is all there is.
 *  - TEz: the walls of the TEz box (b = −Ex = 0 on rows 0 and ny−2 = 1) leave Hz of row 1
 *    driven by ∂Ey/∂x alone: an exact one-dimensional line, T = 0.
 *  - TMz: Ez = 0 on rows 0 and 2 makes row 1 the one mode sin(πj/2) of a parallel-plate
 *    guide, T = 2/dy² exactly; with dy = 1 m (and dx = 1 mm) it is a small known correction.
 * No absorber: the line is long enough that no reflection from its far end is back at the
 * probes within the run, even at the stencil's one cell per step. A Ricker pulse (10 GHz)
 * leaves a source near the near end; the left-going half comes back from that end
 * as a second right-going wave, which changes nothing: every wave at the probes runs to +x,
 * so the ratio of the running DFTs of two probes Δx apart is exactly e^{−jk̃Δx}. The run is
 * long enough (8000 steps) for the pulse to have passed both probes to below 1e−4 of its
 * peak, which bounds the truncation of the DFTs. (In a conducting medium, σ or a Drude
 * pole, TEz lets the pulse's lowest frequencies diffuse along the line, a slowly fading
 * tail; the Ricker pulse, whose spectrum vanishes as ω² at zero, keeps that tail small.)
 *
 * Accuracy: |k̃measured − k̃| ≤ 1e−4·|k̃ − k| (k the medium's exact wavenumber) and ≤ 1e−6·|k̃|
 * at the frequencies below, 5–20 GHz at 15–60 cells per wavelength, where |k̃ − k| is
 * 1e−4..1e−2 of |k|. Measured: 1e−8..2e−7 of |k̃|, i.e. 1.4e−6..5e−5 of |k̃ − k|. What
 * limits it is float32: the fields carry about 1e−7 relative rounding and the DFT ratio
 * inherits it. At lower frequencies |k̃ − k| shrinks as (k·dx)² and the 1e−4 share is lost
 * (lossless at 5 GHz: 1e−4..2e−4); where the wave loses more than about six nepers between
 * the nearest probes (Drude near its plasma frequency, Lorentz in its absorption band,
 * Debye above 15 GHz here) the far probe sinks into the rounding of the near field, and
 * those frequencies are left out.
 */

const casin = (w: Complex): Complex => {
  // asin w = −j·ln(jw + √(1 − w²)), principal branch (DLMF 4.23.19, from memory)
  const l = cLog(cAdd([-w[1], w[0]], cSqrt(cSub([1, 0], cMul(w, w)))));
  return [l[1], -l[0]];
};

/** k̃ from the closed form above, rad/m, Im ≤ 0. */
function schemeWavenumber(m: Medium, f: number, dt: number, dx: number, transverse: number): Complex {
  const omega = (2 / dt) * Math.sin(Math.PI * f * dt);
  const square = cSub(cScale(discretePermittivity(m, f, dt), (omega / C0) ** 2), [transverse, 0]);
  return cScale(casin(cScale(refractiveIndex(square), dx / 2)), 2 / dx);
}

const DX = 1e-3;
const STEPS = 8000;
const SOURCE = 40;
const PROBES = [100, 150, 200, 300, 400];

let media: WebAssembly.Module;
beforeAll(async () => {
  media = await loadMediaModule();
});

/** Runs the three-row line; returns k̃ measured from the first probe and the farthest one within six nepers. */
function measure(medium: Medium, polarization: Polarization, frequencies: number[], map?: (nx: number) => MaterialMap) {
  const dy = polarization === 'TEz' ? DX : 1;
  const nx = Math.ceil((STEPS + SOURCE + PROBES[PROBES.length - 1]) / 2) + 10;
  const s = mediaScenario(medium, polarization, {
    grid: { nx, ny: 3, dx: DX, dy }, absorber: { cells: 0 }, steps: STEPS,
    source: { x: SOURCE * DX, y: dy, waveform: { kind: 'ricker', f0: 1e10, t0: 2e-10 } },
    probes: PROBES.map((i) => ({ name: `x${i}`, x: i * DX, y: dy })),
    frequencies,
  });
  const sim = new MediaSimulation(media, s, {}, map?.(nx));
  sim.run(undefined, 2000);
  // Largest |a| over the last 300 steps against the largest over the run, at probe p.
  const tail = (p: number) => {
    const series = sim.probeSeries(p);
    return Math.max(...Array.from(series.slice(-300), Math.abs)) / Math.max(...Array.from(series, Math.abs));
  };
  const transverse = polarization === 'TEz' ? 0 : 2 / (dy * dy);
  return {
    results: frequencies.map((f, n) => {
      const predicted = schemeWavenumber(map ? OBJECT_MEDIUM : medium, f, sim.dt, DX, transverse);
      const far = PROBES.filter((i) => i > PROBES[0] && -predicted[1] * (i - PROBES[0]) * DX <= 6).pop() as number;
      const distance = (far - PROBES[0]) * DX;
      const ratio = cDiv(sim.probeDft(PROBES.indexOf(far), n), sim.probeDft(0, n));
      const phase = Math.atan2(ratio[1], ratio[0]);
      const turns = Math.round((predicted[0] * distance + phase) / (2 * Math.PI));
      const measured: Complex = [(2 * Math.PI * turns - phase) / distance, Math.log(cAbs(ratio)) / distance];
      const exact = wavenumber(map ? OBJECT_MEDIUM : medium, f);
      return {
        f, measured, predicted, tail: Math.max(tail(0), tail(PROBES.indexOf(far))),
        error: cAbs(cSub(measured, predicted)), schemeError: cAbs(cSub(predicted, exact)),
      };
    }),
  };
}

const cases: [string, number[]][] = [
  ['lossless', [8e9, 1e10, 2e10]],
  ['conductive', [8e9, 1e10, 2e10]],
  ['debye', [5e9, 8e9, 1e10]],
  ['drude', [1e10, 1.5e10, 2e10]],
  ['lorentz', [5e9, 8e9, 1e10]],
  ['several', [8e9, 9e9, 1e10]],
];

describe('media engine: measured wavenumber against the discrete dispersion relation', () => {
  for (const polarization of ['TEz', 'TMz'] as const) {
    for (const [name, frequencies] of cases) {
      it(`${polarization}, ${name}: k̃ to 1e−4 of |k̃ − k| at ${frequencies.map((f) => f / 1e9).join(', ')} GHz`, () => {
        for (const r of measure(TEST_MEDIA[name], polarization, frequencies).results) {
          if (process.env.MEDIA_DISPERSION_LOG) console.log(polarization, name, r.f / 1e9, 'GHz', (r.error / cAbs(r.predicted)).toExponential(1), (r.error / r.schemeError).toExponential(1), r.tail.toExponential(1));
          expect(r.tail, `${r.f / 1e9} GHz: the pulse has passed both probes`).toBeLessThan(1e-4); // common practice, no source: a truncated running DFT is off by about the field left at the end
          expect(r.schemeError / cAbs(r.predicted), `${r.f / 1e9} GHz: the scheme's own error is there to be told apart`).toBeGreaterThan(1e-4); // Yee dispersion relation (Taflove & Hagness, ch. 4, from memory)
          expect(r.error, `${r.f / 1e9} GHz: measured ${r.measured}, relation ${r.predicted}`).toBeLessThan(1e-4 * r.schemeError); // the scheme's dispersion relation with ε̃r of its own updates (Taflove & Hagness, chs. 4 and 9, from memory)
          expect(r.error).toBeLessThan(1e-6 * cAbs(r.predicted)); // float32 rounding, common practice, no source
        }
      });
    }

    it(`${polarization}: an object medium with poles of its own (patches) carries its own k̃`, () => {
      // Patches from column 70 to the far end put the probes inside the object; the wave
      // crossing into it is partly reflected, and what goes on is the object's wave.
      const map = (nx: number): MaterialMap => {
        const list: ComponentPatch[] = [];
        for (let i = 70; i <= nx - 3; i++) list.push({ k: nx + i, kind: 'medium', medium: OBJECT_MEDIUM });
        return polarization === 'TEz'
          ? { polarization, background: TEST_MEDIA.lossless, a: [], b: [], c: list, nodesPerObject: [list.length] }
          : { polarization, background: TEST_MEDIA.lossless, a: list, b: [], c: [], nodesPerObject: [list.length] };
      };
      for (const r of measure(TEST_MEDIA.lossless, polarization, [5e9, 8e9], map).results) {
        expect(r.tail, `${r.f / 1e9} GHz: the pulse has passed both probes`).toBeLessThan(1e-4); // common practice, no source: a truncated running DFT is off by about the field left at the end
        expect(r.error, `${r.f / 1e9} GHz`).toBeLessThan(1e-4 * r.schemeError); // the scheme's dispersion relation with ε̃r of its own updates (Taflove & Hagness, chs. 4 and 9, from memory)
        expect(r.error).toBeLessThan(1e-6 * cAbs(r.predicted)); // float32 rounding, common practice, no source
      }
    });
  }
});
