import { EPS0, MU0 } from '../scenario/constants.ts';
import type { Scenario } from '../scenario/types.ts';
import { cpmlAxisTables } from './cpml-profile.ts';
import { engineMemoryBytes } from '../scenario/memory.ts';
import { waveformValue } from '../scenario/waveforms.ts';
import { instantiateEngine, loadEngineModule, type EngineExports } from './wasm.ts';
import { isSimpleMedium } from '../exact/medium.ts';
import { EngineRun } from './engine-run.ts';
import type { SimulationOptions } from './simulation-options.ts';

export type { Complex } from '../exact/complex.ts';
export { FULL_GRID_MAX, fillFullGridTable, fullGridPlan, type FullGridPlan, type SimulationOptions } from './simulation-options.ts';

/** The lossless engine's run; throws for a scenario it cannot run (see the message). */
function losslessOnly(scenario: Scenario): Scenario {
  if (!isSimpleMedium(scenario.medium) || (scenario.objects?.length ?? 0) > 0 || (scenario.polarization ?? 'TMz') !== 'TMz') {
    throw new Error('this engine runs lossless TMz scenarios without objects; use createSimulation() (create-simulation.ts) for the others');
  }
  return scenario;
}

/**
 * One FDTD run of a validated scenario: builds the coefficient tables, drives the wasm
 * engine in batches of steps and reads back probe series and running DFTs.
 * DFT points are the probes first, then every node of every line, in order.
 */
export class Simulation extends EngineRun<EngineExports> {
  /** Loads (once) the engine module and builds a simulation. */
  static async create(scenario: Scenario, options: SimulationOptions = {}): Promise<Simulation> {
    return new Simulation(await loadEngineModule(), scenario, options);
  }

  constructor(module: WebAssembly.Module, scenario: Scenario, options: SimulationOptions = {}) {
    super(module, losslessOnly(scenario), options);
    const { nx, ny, dx, dy, dt, probes } = this.layout;
    const L = scenario.absorber.cells;
    const epsR = scenario.medium.epsR;
    const points = this.pointCount;
    const frequencies = scenario.frequencies.length;
    const fullGrid = this.full.frequencies.length;
    const bytes = engineMemoryBytes({
      nx, ny, cells: L, steps: scenario.steps, probes: probes.length, dftPoints: points, frequencies, fullGridDft: fullGrid,
    });
    const engine = this.claimEngine(bytes, options, instantiateEngine,
      (e) => e.allocate(nx, ny, L, scenario.steps, probes.length, points, frequencies, fullGrid));
    const eps = EPS0 * epsR;
    engine.setUpdateCoefficients(
      dt / (eps * dx), dt / (eps * dy), dt / (MU0 * dx), dt / (MU0 * dy),
      dt / (eps * dx * dy), this.layout.source.j * nx + this.layout.source.i,
    );
    const current = new Float64Array(scenario.steps);
    for (let n = 0; n < scenario.steps; n++) {
      current[n] = waveformValue(scenario.source.waveform, scenario.source.amplitude, (n + 0.5) * dt);
    }
    this.writeCommonTables(cpmlAxisTables(nx, scenario.absorber, dx, dt, epsR), cpmlAxisTables(ny, scenario.absorber, dy, dt, epsR), current);
  }

  /** Largest |Ez| on the grid (NaN if any node is NaN). */
  maxAbsEz(): number {
    return this.live().maxAbsEz();
  }
}
