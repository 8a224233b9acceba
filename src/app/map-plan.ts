/**
 * Which analysis frequencies get an error map, and what the map's frequency menu offers.
 * A run accumulates one full-grid running DFT per mapped frequency (8 bytes a node each):
 * as many as fit under the memory cap beside the run (src/scenario/readouts.ts), the one
 * chosen in the menu first, then the others in order, and no more than the engine keeps at
 * once. The menu lists the maps the last run made and the set-up's other frequencies,
 * saying plainly that those apply to the next run.
 */
import type { ErrorMap } from '../compare/error-map.ts';
import type { SimulationOptions } from '../engine/simulation.ts';
import type { DerivedQuantities } from '../scenario/derived.ts';
import type { Scenario } from '../scenario/types.ts';
import { formatSI } from '../scenario/units.ts';

/**
 * Full-grid DFTs one engine run keeps: as many as asked (`fullGridFrequencies`, taken in one
 * pass every few steps), so the memory cap alone limits the maps of a run.
 */
export const ENGINE_MAPS_PER_RUN = Infinity;

/**
 * The frequencies the next run maps, Hz: the chosen one first (when the scenario has it),
 * then the scenario's others in order, as many as fit beside the run and the engine keeps.
 *
 * @example
 * plannedMaps(demo, deriveQuantities(demo), 1e10); // [1e10, 5e9, 1.5e10]
 */
export function plannedMaps(s: Scenario, d: DerivedQuantities, chosenHz: number | undefined): number[] {
  const first = chosenHz !== undefined && s.frequencies.includes(chosenHz) ? [chosenHz] : [];
  const order = [...first, ...s.frequencies.filter((f) => !first.includes(f))];
  return order.slice(0, Math.min(ENGINE_MAPS_PER_RUN, d.errorMapsFitting));
}

/**
 * Engine options for the full-grid DFTs behind the error maps at `frequencies` (Hz), as the
 * run worker and the page benchmark create their simulations: all in one pass, sampled every
 * few steps as the pulse's band allows (src/exact/dft-decimation.ts).
 *
 * @example
 * mapOptions([1e10, 5e9]); // { fullGridFrequencies: [1e10, 5e9] }
 */
export function mapOptions(frequencies: readonly number[]): SimulationOptions {
  return frequencies.length > 0 ? { fullGridFrequencies: [...frequencies] } : {};
}

export interface MapOption { f_Hz: number; label: string; mapped: boolean }

export interface MapMenu {
  options: MapOption[];
  /** The option on show, with what to say when it has no map. */
  shown: { f_Hz: number; note: string } | undefined;
  /** The map of the option on show, if the last run made one. */
  map: ErrorMap | undefined;
}

/**
 * The menu of the error map: every frequency of the set-up (`frequencies`) and every map of
 * the last run, each labelled so that its label never disagrees with the picture. `nextRun`
 * is what the next run maps (undefined while the set-up is wrong and that is not known).
 */
export function mapMenu(maps: readonly ErrorMap[], frequencies: readonly number[], nextRun: readonly number[] | undefined, chosenHz: number | undefined): MapMenu {
  const all = [...frequencies, ...maps.map((m) => m.f_Hz).filter((f) => !frequencies.includes(f))];
  const roomForOne = nextRun === undefined || nextRun.length > 0;
  const options = all.map((f) => {
    const mapped = maps.some((m) => m.f_Hz === f);
    const suffix = mapped ? (frequencies.includes(f) ? '' : ' (last run)') : roomForOne ? ' (next run)' : ' (no room for a map)';
    return { f_Hz: f, label: `${formatSI(f, 'Hz')}${suffix}`, mapped };
  });
  const pick = options.find((o) => o.f_Hz === chosenHz) ?? options.find((o) => o.mapped) ?? options[0];
  if (!pick) return { options, shown: undefined, map: undefined };
  const map = maps.find((m) => m.f_Hz === pick.f_Hz);
  const f = formatSI(pick.f_Hz, 'Hz');
  const note = map ? ''
    : nextRun?.includes(pick.f_Hz) ? `The last run made no map at ${f}; this choice applies to the next run, which maps ${f}. Press Run.`
    : roomForOne ? `This choice applies to the next run: press Run to map ${f}.`
    : `A map at ${f} does not fit under the memory cap beside this run; use a smaller grid for error maps.`;
  return { options, shown: { f_Hz: pick.f_Hz, note }, map };
}
