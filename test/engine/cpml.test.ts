import { beforeAll, describe, expect, it } from 'vitest';
import { Simulation } from '../../src/engine/simulation.ts';
import type { Scenario } from '../../src/scenario/types.ts';
import { makeScenario } from '../fixtures/scenarios.ts';
import { reflectionErrorDb, reflectionGeometry } from '../fixtures/reflection.ts';

// Reference-grid method for absorber reflection: Taflove & Hagness, Computational
// Electrodynamics, ch. 7. The interior is 100 × 50 cells of 1 mm, S = 0.5, and the Gaussian
// pulse's spectrum is e^−9 down at 10 cells per wavelength; the source sits 5 cells from one
// layer and the probes one cell from the layers, the far corner included.
const STEPS = 2000;

async function probeSeries(s: Scenario): Promise<Float32Array[]> {
  const sim = await Simulation.create(s);
  sim.run();
  const out = s.probes.map((_, p) => sim.probeSeries(p));
  sim.dispose();
  return out;
}

describe('CPML reflection by the reference-grid method', () => {
  let reference: Float32Array[];
  beforeAll(async () => {
    reference = await probeSeries(reflectionGeometry({ cells: 10 }, STEPS, true));
  }, 120_000);

  it('a 10-cell CPML, m = 3, sigmaScale 1, kappaMax 5, alphaMax 0.05 reflects ≤ −80 dB', async () => {
    // published best for a 10-cell layer is about −80 dB (Taflove & Hagness ch. 7, from memory)
    const s = reflectionGeometry({ cells: 10, order: 3, sigmaScale: 1, kappaMax: 5, alphaMax: 0.05 }, STEPS, false);
    const db = reflectionErrorDb(await probeSeries(s), reference);
    console.log(`CPML κmax 5, αmax 0.05: ${db.worst.toFixed(1)} dB (per probe ${db.perProbe.map((d) => d.toFixed(1)).join(', ')})`);
    expect(db.worst).toBeLessThanOrEqual(-80);
  }, 60_000);

  it('the same layer with kappaMax 1, alphaMax 0 reflects ≤ −55 dB, and worse than with κ and α', async () => {
    const s = reflectionGeometry({ cells: 10, order: 3, sigmaScale: 1, kappaMax: 1, alphaMax: 0 }, STEPS, false);
    const db = reflectionErrorDb(await probeSeries(s), reference);
    console.log(`CPML κmax 1, αmax 0: ${db.worst.toFixed(1)} dB (per probe ${db.perProbe.map((d) => d.toFixed(1)).join(', ')})`);
    expect(db.worst).toBeLessThanOrEqual(-55);
    expect(db.worst).toBeGreaterThan(-80);
  }, 60_000);

  it('a bare PEC box (cells = 0) reflects everything: the method detects it', async () => {
    // common practice, no source: a perfect conductor reflects with |Γ| = 1
    const s = reflectionGeometry({ cells: 0 }, STEPS, false);
    const db = reflectionErrorDb(await probeSeries(s), reference);
    expect(db.worst).toBeGreaterThan(-10);
  }, 60_000);

  it('the fixture really is a wide reference grid', () => {
    const r = reflectionGeometry({ cells: 10 }, STEPS, true);
    const s = makeScenario();
    expect(r.grid.nx).toBeGreaterThan(1000);
    expect(s.grid.nx).toBeLessThan(r.grid.nx);
  });
});
