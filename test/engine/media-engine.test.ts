import { beforeAll, describe, expect, it } from 'vitest';
import type { ComponentPatch, MaterialMap } from '../../src/engine/material-map.ts';
import { MediaSimulation } from '../../src/engine/media-simulation.ts';
import { Simulation } from '../../src/engine/simulation.ts';
import { loadEngineModule, loadMediaModule } from '../../src/engine/wasm.ts';
import { EPS0, MU0 } from '../../src/scenario/constants.ts';
import { stabilityLimit } from '../../src/scenario/layout.ts';
import type { Medium, Polarization, Scenario } from '../../src/scenario/types.ts';
import { mediaScenario, patchedMap, TEST_MEDIA } from '../fixtures/media.ts';
import { makeScenario } from '../fixtures/scenarios.ts';

let media: WebAssembly.Module;
let lossless: WebAssembly.Module;
beforeAll(async () => {
  media = await loadMediaModule();
  lossless = await loadEngineModule();
});

const peak = (a: ArrayLike<number>) => {
  let m = 0;
  for (let k = 0; k < a.length; k++) m = Math.max(m, Math.abs(a[k]));
  return m;
};

describe('media engine: the lossless TMz case is the lossless engine', () => {
  // Lossless: ca = (ε/dt)/(ε/dt) = 1 exactly, so ca·Ez = Ez, cb/Δ is dt/(ε·Δ) computed as the
  // lossless engine computes it, and every node sees the same operations in the same order:
  // the fields must agree bit for bit, not just to rounding (common practice, no source).
  for (const [nx, ny, cells, epsR] of [[64, 48, 10, 1], [61, 47, 10, 4], [41, 33, 0, 1], [30, 30, 12, 2.5], [83, 50, 7, 9]] as const) {
    it(`${nx} × ${ny}, CPML ${cells}, εr ${epsR}: fields, series, DFTs and full-grid DFT bit for bit`, () => {
      const s = makeScenario({
        grid: { nx, ny }, absorber: { cells }, medium: { epsR }, steps: 300,
        source: { x: (cells + 5) * 1e-3, y: (cells + 4) * 1e-3, waveform: { kind: 'ricker', f0: 4e10, t0: 5e-11 } },
        probes: [{ name: 'p', x: (nx - cells - 3) * 1e-3, y: (ny - cells - 2) * 1e-3 }],
        lines: [{ name: 'l', x0: cells * 1e-3, y0: (cells + 2) * 1e-3, x1: (nx - 1 - cells) * 1e-3, y1: (ny - 3 - cells) * 1e-3 }],
        frequencies: [2e10, 3e10],
      });
      const a = new Simulation(lossless, s, { fullGridFrequency: 2e10 });
      const b = new MediaSimulation(media, s, { fullGridFrequency: 2e10 });
      a.run(undefined, 41);
      b.run(undefined, 29);
      const same = (x: Float32Array, y: Float32Array) => x.every((v, k) => Object.is(v, y[k]));
      expect(peak(a.ezView())).toBeGreaterThan(0); // common practice, no source
      expect(same(a.ezView(), b.ezView())).toBe(true); // same operations in the same order: common practice, no source
      expect(same(a.hxView(), b.hxView())).toBe(true); // same operations in the same order: common practice, no source
      expect(same(a.hyView(), b.hyView())).toBe(true); // same operations in the same order: common practice, no source
      expect(same(a.probeSeries(0), b.probeSeries(0))).toBe(true); // same operations in the same order: common practice, no source
      expect(same(a.fullGridDft()!.re, b.fullGridDft()!.re)).toBe(true); // same operations in the same order: common practice, no source
      expect(same(a.fullGridDft()!.im, b.fullGridDft()!.im)).toBe(true); // same operations in the same order: common practice, no source
      for (let f = 0; f < 2; f++) {
        expect(b.probeDft(0, f)).toEqual(a.probeDft(0, f)); // same operations in the same order: common practice, no source
        a.layout.lines[0].nodes.forEach((_, k) => expect(b.lineDft(0, k, f)).toEqual(a.lineDft(0, k, f))); // same operations in the same order: common practice, no source
        expect(b.currentDft(s.frequencies[f])).toEqual(a.currentDft(s.frequencies[f])); // same operations in the same order: common practice, no source
      }
      expect(b.maxAbsEz()).toBe(a.maxAbsEz()); // same operations in the same order: common practice, no source
    });
  }
});

describe('media engine: TEz is TMz with ε and μ swapped', () => {
  // Duality of Maxwell's equations: the TEz scheme (a = Hz, b = −Ex, c = −Ey) in a medium ε
  // with magnetic current M is the TMz scheme with permittivity μ0 and permeability ε.
  // Scaling that scheme's node field by μ0/ε turns it into the TMz scheme of the medium
  // itself (Ez, Hx, Hy, current I = M): every update then carries the same coefficients,
  // CPML ψ included. Hence, on the same grid and time step, exactly
  //   Hz(TEz, M) = (ε/μ0)·Ez(TMz, I = M),  −Ex(TEz) = Hx(TMz),  −Ey(TEz) = Hy(TMz),
  // i.e. Hz/M = (ε/μ0)·Ez/I (the continuum fields −(ωε/4)M·H0(kρ) and −(ωμ0/4)I·H0(kρ)
  // obey the same ratio). Only the outer walls differ (PEC for both: Ez = 0 on the outermost
  // nodes; tangential E = 0 half a cell inside them in TEz), so the comparison stops before
  // the wave reaches the nodes next to them: after n steps nothing is non-zero n or more
  // cells (Manhattan) from the source. What is left is float32 rounding of the two coefficient
  // sets, a few ulp per step over 78 steps (common practice, no source).
  for (const epsR of [1, 4]) {
    it(`εr ${epsR}, 10-cell CPML entered: Hz·μ0/ε = Ez and −E = H to float32 rounding`, () => {
      const n = 161;
      const base = makeScenario({
        grid: { nx: n, ny: n }, absorber: { cells: 10 }, medium: { epsR }, steps: 78,
        source: { waveform: { kind: 'ricker', f0: 4e10, t0: 4e-11 } },
      });
      const tm = new MediaSimulation(media, { ...base, polarization: 'TMz' });
      const te = new MediaSimulation(media, { ...base, polarization: 'TEz' });
      tm.run();
      te.run();
      const scale = MU0 / (EPS0 * epsR);
      const ez = tm.ezView();
      const hz = te.ezView();
      let worst = 0;
      let inAbsorber = 0;
      for (let k = 0; k < ez.length; k++) {
        worst = Math.max(worst, Math.abs(hz[k] * scale - ez[k]));
        const i = k % n;
        if (i < 10 && ez[k] !== 0) inAbsorber++;
      }
      expect(inAbsorber, 'the wave has entered the CPML').toBeGreaterThan(0); // common practice, no source
      expect(worst / peak(ez)).toBeLessThan(2e-6); // duality of Maxwell's equations
      for (const [x, y] of [[tm.hxView(), te.hxView()], [tm.hyView(), te.hyView()]] as const) {
        let w = 0;
        for (let k = 0; k < x.length; k++) w = Math.max(w, Math.abs(x[k] - y[k]));
        expect(w / peak(x)).toBeLessThan(2e-6); // duality of Maxwell's equations
      }
      // the relation is not trivially met: without the factor ε/μ0 it fails by far
      let unscaled = 0;
      for (let k = 0; k < ez.length; k++) unscaled = Math.max(unscaled, Math.abs(hz[k] - ez[k]));
      expect(unscaled / peak(ez)).toBeGreaterThan(0.5); // duality of Maxwell's equations
    });
  }
});

describe('media engine: PEC patches', () => {
  // Image theory on the Yee grid: the grid is symmetric about a column of a nodes (TMz) and
  // about a column of c edges (TEz). A wall of PEC a nodes (Ez = 0) at column w acts as the
  // source's mirror image of opposite sign, Ez = E(i) − E(2w − i); a wall of PEC c edges
  // (Ey = 0) at x = (w + ½)dx as an image of the same sign, Hz = H(i) + H(2w + 1 − i)
  // (magnetic line current parallel to an electric wall), where E, H are the fields of the
  // source alone. The wall spans the interior only (patches stay out of the CPML), so the
  // comparison stops before the wave reaches its ends or the absorber (causality, as above).
  // Both in a dispersive background: the background pole states at the wall must stay zero.
  const n = 301;
  const w = 150;
  const run = (polarization: Polarization, medium: Medium, wall: boolean): { sim: MediaSimulation; wallPeak: number } => {
    const s = mediaScenario(medium, polarization, {
      grid: { nx: n, ny: n }, absorber: { cells: 10 }, steps: 125,
      source: { x: 140e-3, y: 150e-3, waveform: { kind: 'ricker', f0: 3e10, t0: 6e-11 } },
    });
    const list: ComponentPatch[] = [];
    for (let j = 10; j <= n - 11; j++) list.push({ k: j * n + w, kind: 'pec' });
    const map: MaterialMap | undefined = wall
      ? { polarization, background: medium, a: polarization === 'TMz' ? list : [], b: [], c: polarization === 'TEz' ? list : [], nodesPerObject: [list.length] }
      : undefined;
    const sim = new MediaSimulation(media, s, {}, map);
    let wallPeak = 0;
    while (sim.stepsLeft > 0) {
      sim.step(5);
      const field = polarization === 'TMz' ? sim.ezView() : sim.hyView();
      for (const p of list) wallPeak = Math.max(wallPeak, Math.abs(field[p.k]));
    }
    return { sim, wallPeak };
  };

  for (const [polarization, medium, sign] of [['TMz', 'debye', -1], ['TEz', 'drude', 1], ['TMz', 'lossless', -1]] as const) {
    it(`${polarization}, ${medium} background: the wall stays exactly zero and reflects as an image of sign ${sign > 0 ? '+' : '−'}`, () => {
      const walled = run(polarization, TEST_MEDIA[medium], true);
      const free = run(polarization, TEST_MEDIA[medium], false);
      expect(walled.wallPeak).toBe(0); // PEC: tangential E held at zero (common practice, no source)
      expect(free.wallPeak, 'without the wall the field there is not zero').toBeGreaterThan(0); // common practice, no source
      const a = walled.sim.ezView();
      const f = free.sim.ezView();
      const mirror = (i: number) => (polarization === 'TMz' ? 2 * w - i : 2 * w + 1 - i);
      let worst = 0;
      let image = 0;
      for (let j = 0; j < n; j++) {
        for (let i = 1; i <= w; i++) {
          const k = j * n + i;
          const reflected = f[j * n + mirror(i)];
          image = Math.max(image, Math.abs(reflected));
          worst = Math.max(worst, Math.abs(a[k] - (f[k] + sign * reflected)));
        }
      }
      const scale = peak(f);
      expect(image / scale, 'the reflection is there to be seen').toBeGreaterThan(0.05); // image theory for a PEC plane (common practice, no source)
      expect(worst / scale).toBeLessThan(1e-5); // image theory for a PEC plane (common practice, no source)
    });
  }
});

describe('media engine: patches', () => {
  const scenario = (medium: Medium, polarization: Polarization) => mediaScenario(medium, polarization, {
    grid: { nx: 64, ny: 56 }, absorber: { cells: 10 }, steps: 220,
    // inside the patched block below: the source point's own coefficients come from its patch
    source: { x: 24e-3, y: 20e-3, waveform: { kind: 'ricker', f0: 4e10, t0: 5e-11 } },
  });
  const block = (nx: number, make: (k: number) => ComponentPatch) => {
    const list: ComponentPatch[] = [];
    for (let j = 16; j < 26; j++) for (let i = 20; i < 32; i++) list.push(make(j * nx + i));
    return list;
  };
  const fields = (s: Scenario, map?: MaterialMap) => {
    const sim = new MediaSimulation(media, s, {}, map);
    sim.run();
    return [sim.ezView().slice(), sim.hxView().slice(), sim.hyView().slice()];
  };

  // A patch update is the background update with the patch's own coefficients and states
  // (the same operations in the same order), so patches in the background's own medium must
  // leave every field unchanged bit for bit (common practice, no source).
  for (const medium of ['debye', 'several'] as const) {
    it(`${medium}: medium patches (TMz a, TEz b and c) and full-length conformal edges (TMz b, c) change nothing`, () => {
      const m = TEST_MEDIA[medium];
      for (const polarization of ['TMz', 'TEz'] as const) {
        const same = block(64, (k) => ({ k, kind: 'medium', medium: m }));
        const edges = block(64, (k) => ({ k, kind: 'conformal', lengthFraction: 1 }));
        const map: MaterialMap = polarization === 'TMz'
          ? { polarization, background: m, a: same, b: edges, c: edges, nodesPerObject: [] }
          : { polarization, background: m, a: [], b: same, c: same, nodesPerObject: [] };
        const s = scenario(m, polarization);
        const plain = fields(s);
        const patched = fields(s, map);
        expect(peak(plain[0])).toBeGreaterThan(0); // common practice, no source
        plain.forEach((x, n) => expect(x.every((v, k) => Object.is(v, patched[n][k])), `${polarization} field ${n}`).toBe(true)); // same operations in the same order: common practice, no source
      }
    });
  }

  it('TEz conformal cells with nothing cut give the background to rounding; with every edge cut Hz never moves', () => {
    const s = scenario(TEST_MEDIA.lossless, 'TEz');
    const plain = fields(s)[0];
    const whole = block(64, (k) => ({ k, kind: 'conformal', areaFraction: 1, edgeFractions: [1, 1, 1, 1] }));
    const uncut = fields(s, { polarization: 'TEz', background: TEST_MEDIA.lossless, a: whole, b: [], c: [], nodesPerObject: [] })[0];
    let worst = 0;
    for (let k = 0; k < plain.length; k++) worst = Math.max(worst, Math.abs(plain[k] - uncut[k]));
    // the cell update weighs c(i) and c(i−1) separately instead of their difference
    expect(worst / peak(plain)).toBeLessThan(1e-5); // common practice, no source
    expect(worst).toBeGreaterThan(0); // a different rounding, so the comparison is not vacuous
    const sealed = block(64, (k) => ({ k, kind: 'conformal', areaFraction: 0.5, edgeFractions: [0, 0, 0, 0] }));
    const shut = fields(s, { polarization: 'TEz', background: TEST_MEDIA.lossless, a: sealed, b: [], c: [], nodesPerObject: [] })[0];
    // Faraday's law over a contour with no edge outside the metal: dHz/dt = 0 there, but
    // at the source point, where the magnetic current still enters
    const source = 20 * 64 + 24;
    expect(sealed.every((p) => p.k === source || shut[p.k] === 0)).toBe(true); // common practice, no source
    expect(shut[source]).not.toBe(0); // Faraday's law over the cell's contour (common practice, no source)
    expect(peak(shut)).toBeGreaterThan(0); // Faraday's law over the cell's contour (common practice, no source)
  });

  it('objects with their own poles keep sparse states: the patched block changes the field around it', () => {
    for (const polarization of ['TMz', 'TEz'] as const) {
      const s = scenario(TEST_MEDIA.lossless, polarization);
      const plain = fields(s)[0];
      const patched = fields(s, patchedMap(polarization, TEST_MEDIA.lossless, 64, 20, 16))[0];
      let diff = 0;
      for (let k = 0; k < plain.length; k++) diff = Math.max(diff, Math.abs(plain[k] - patched[k]));
      expect(diff / peak(plain)).toBeGreaterThan(1e-2); // common practice, no source
      expect(Number.isFinite(peak(patched))).toBe(true); // common practice, no source
    }
  });

  it('refuses patches that do not suit their component, are unsorted, or reach the absorber', () => {
    const s = scenario(TEST_MEDIA.lossless, 'TMz');
    const k = 20 * 64 + 25;
    const bad: [string, Partial<MaterialMap>][] = [
      ['magnetic component', { c: [{ k, kind: 'medium', medium: { epsR: 3 } }] }],
      ['electric component', { a: [{ k, kind: 'conformal', lengthFraction: 0.5 }] }],
      ['lengthFraction', { b: [{ k, kind: 'conformal', lengthFraction: 0 }] }],
      ['sorted by k', { a: [{ k: k + 1, kind: 'pec' }, { k, kind: 'pec' }] }],
      ['absorber', { a: [{ k: 20 * 64 + 5, kind: 'pec' }] }],
      ['absorber', { c: [{ k: 20 * 64 + 53, kind: 'pec' }] }],
    ];
    for (const [message, part] of bad) {
      const map: MaterialMap = { polarization: 'TMz', background: TEST_MEDIA.lossless, a: [], b: [], c: [], nodesPerObject: [], ...part };
      expect(() => new MediaSimulation(media, s, {}, map), message).toThrow(message); // common practice, no source
    }
    // the last column a c edge may take: i = nx − 2 − cells
    const edge: MaterialMap = { polarization: 'TMz', background: TEST_MEDIA.lossless, a: [], b: [], c: [{ k: 20 * 64 + 52, kind: 'pec' }], nodesPerObject: [] };
    expect(() => new MediaSimulation(media, s, {}, edge)).not.toThrow(); // common practice, no source
    const other: MaterialMap = { polarization: 'TEz', background: TEST_MEDIA.lossless, a: [], b: [], c: [], nodesPerObject: [] };
    expect(() => new MediaSimulation(media, s, {}, other)).toThrow('built for TEz, but the scenario runs TMz'); // common practice, no source
    const tez: MaterialMap = { polarization: 'TEz', background: TEST_MEDIA.lossless, a: [{ k, kind: 'conformal', areaFraction: 0, edgeFractions: [1, 1, 1, 1] }], b: [], c: [], nodesPerObject: [] };
    expect(() => new MediaSimulation(media, { ...s, polarization: 'TEz' }, {}, tez)).toThrow('areaFraction'); // common practice, no source
  });
});

describe('media engine: stability', () => {
  // Courant number 0.5 with the limit set by c∞ = c0/√ε∞ (the 2D limit is 1/√2 for square
  // cells). σ (time-averaged) and Debye poles (trapezoidal) add no condition. Drude and
  // Lorentz poles do: from the scheme's dispersion relation μ0ε0ε̃r(ω)Ω² = K², with γ = 0 or
  // δ = 0 every root Ω² must lie in [0, 4/dt²) for all grid wavenumbers up to the largest,
  // K²c∞²dt² = 4s² (s = Courant number over its limit), which gives
  //   Drude   ωp·dt < 2√ε∞·√(1 − s²),
  //   Lorentz ω0·dt < 2√(ε∞(1 − s²)/(εs − ε∞s²)), εs = ε∞ + Δε
  // (von Neumann analysis of the update equations; our own derivation). Just inside the
  // bounds the runs stay finite for 20 000 steps; 20 % beyond them they blow up.
  const grid = { nx: 41, ny: 41 };
  const dt = 0.5 * 1e-3 * Math.sqrt(2) / 299_792_458; // S = 0.5, ε∞ = 2, dx = 1 mm
  const s2 = (0.5 / stabilityLimit(1e-3, 1e-3)) ** 2;
  const drudeBound = (2 * Math.sqrt(2) * Math.sqrt(1 - s2)) / dt;
  const lorentzBound = (deltaEps: number) => (2 * Math.sqrt((2 * (1 - s2)) / (2 + deltaEps - 2 * s2))) / dt;
  const extremes: Record<string, Medium> = {
    ...TEST_MEDIA,
    'stiff Debye (τ = dt/200, Δε = 50)': { epsR: 2, poles: [{ kind: 'debye', deltaEps: 50, tau: dt / 200 }] },
    'strong conductor (σdt/ε∞ = 30)': { epsR: 2, sigma: (30 * 2 * EPS0) / dt },
    'Drude, γ = 0, at 0.97 of its bound': { epsR: 2, poles: [{ kind: 'drude', omegaP: 0.97 * drudeBound, gamma: 0 }] },
    'Lorentz, δ = 0, at 0.97 of its bound': { epsR: 2, poles: [{ kind: 'lorentz', deltaEps: 3, omega0: 0.97 * lorentzBound(3), delta: 0 }] },
  };
  const longRun = (m: Medium, polarization: Polarization, steps: number) => {
    const sim = new MediaSimulation(media, mediaScenario(m, polarization, { grid, steps }));
    sim.step(300);
    const early = sim.maxAbsEz();
    sim.run(undefined, 2000);
    return { early, late: sim.maxAbsEz() };
  };

  it('the dt of these tests is the scenario\'s', () => {
    expect(new MediaSimulation(media, mediaScenario(TEST_MEDIA.lossless, 'TMz', { grid, steps: 1 })).dt).toBeCloseTo(dt, 25); // dt = S·Δ/c∞ as src/scenario/layout.ts computes it (common practice, no source)
  });

  for (const [name, m] of Object.entries(extremes)) {
    it(`${name}: finite after 20 000 steps in both polarizations`, () => {
      for (const polarization of ['TMz', 'TEz'] as const) {
        const { early, late } = longRun(m, polarization, 20_000);
        expect(early).toBeGreaterThan(0); // von Neumann analysis of the ADE updates (Taflove & Hagness, ch. 9, from memory; bounds derived above)
        expect(Number.isFinite(late), polarization).toBe(true); // von Neumann analysis of the ADE updates (Taflove & Hagness, ch. 9, from memory; bounds derived above)
        expect(late, polarization).toBeLessThan(10 * early); // von Neumann analysis of the ADE updates (Taflove & Hagness, ch. 9, from memory; bounds derived above)
      }
    });
  }

  it('20 % beyond the Drude and Lorentz bounds the run blows up (the checks above can fail)', () => {
    const beyond: Medium[] = [
      { epsR: 2, poles: [{ kind: 'drude', omegaP: 1.2 * drudeBound, gamma: 0 }] },
      { epsR: 2, poles: [{ kind: 'lorentz', deltaEps: 3, omega0: 1.2 * lorentzBound(3), delta: 0 }] },
    ];
    for (const m of beyond) {
      for (const polarization of ['TMz', 'TEz'] as const) {
        const { early, late } = longRun(m, polarization, 3000);
        expect(!Number.isFinite(late) || late > 1e6 * early).toBe(true); // von Neumann analysis of the ADE updates (Taflove & Hagness, ch. 9, from memory; bounds derived above)
      }
    }
  });
});
