/**
 * One way to make a simulation of any scenario: the lossless TMz engine when the scenario is
 * lossless, non-dispersive, TMz and free of objects (its outputs and speed are unchanged),
 * the media engine otherwise (conductivity, poles, TEz, objects through their material map).
 * Both have the same public API.
 */
import { isSimpleMedium } from '../exact/medium.ts';
import { layoutOf } from '../scenario/layout.ts';
import type { Scenario } from '../scenario/types.ts';
import { buildMaterialMap } from './build-material-map.ts';
import { MediaSimulation } from './media-simulation.ts';
import { Simulation, type SimulationOptions } from './simulation.ts';
import { loadEngineModule, loadMediaModule } from './wasm.ts';

export type AnySimulation = Simulation | MediaSimulation;

/** The compiled engines: the lossless one and the media one. */
export interface EngineModules { engine: WebAssembly.Module; media: WebAssembly.Module }

/** True when only the media engine can run the scenario. */
export function needsMediaEngine(s: Scenario): boolean {
  return !isSimpleMedium(s.medium) || (s.objects?.length ?? 0) > 0 || (s.polarization ?? 'TMz') !== 'TMz';
}

/** Both engines, compiled once per realm. */
export async function loadEngineModules(): Promise<EngineModules> {
  const [engine, media] = await Promise.all([loadEngineModule(), loadMediaModule()]);
  return { engine, media };
}

/** A simulation of `scenario` on the engine it needs. */
export function createSimulation(modules: EngineModules, scenario: Scenario, options: SimulationOptions = {}): AnySimulation {
  if (!needsMediaEngine(scenario)) return new Simulation(modules.engine, scenario, options);
  const map = (scenario.objects?.length ?? 0) > 0 ? buildMaterialMap(scenario, layoutOf(scenario)) : undefined;
  return new MediaSimulation(modules.media, scenario, options, map);
}

/** Loads the engines (once) and makes a simulation. */
export async function makeSimulation(scenario: Scenario, options: SimulationOptions = {}): Promise<AnySimulation> {
  return createSimulation(await loadEngineModules(), scenario, options);
}
