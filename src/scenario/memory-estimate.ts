/**
 * The memory a scenario's run needs, on the engine that will run it (src/engine/
 * create-simulation.ts chooses): the lossless engine's exact figure, or for the media engine
 * (conductivity, poles, TEz, objects) its exact figure without objects and an upper bound
 * with them (every point within an object's bounding box counted as a patch of every
 * component). Estimated before anything is allocated; the memory cap applies to it.
 */
import { isSimpleMedium } from '../exact/medium.ts';
import { boundingBox } from './geometry.ts';
import { layoutOf } from './layout.ts';
import { mediaMemoryBytes } from './media-memory.ts';
import { engineMemoryBytes } from './memory.ts';
import type { Pole, Scenario } from './types.ts';

/** Pole state values per node: one per Debye or Drude pole, two per Lorentz pole. */
export const poleStateSlots = (poles: readonly Pole[] | undefined) => (poles ?? []).reduce((n, p) => n + (p.kind === 'lorentz' ? 2 : 1), 0);

export function runsOnMediaEngine(s: Scenario): boolean {
  return !isSimpleMedium(s.medium) || (s.objects?.length ?? 0) > 0 || (s.polarization ?? 'TMz') !== 'TMz';
}

export function estimateMemoryBytes(s: Scenario, fullGridDft = false): number {
  const layout = layoutOf(s);
  const lineNodes = layout.lines.reduce((sum, l) => sum + l.nodes.length, 0);
  const base = {
    nx: s.grid.nx, ny: s.grid.ny, cells: s.absorber.cells, steps: s.steps, probes: s.probes.length,
    dftPoints: s.probes.length + lineNodes, frequencies: s.frequencies.length, fullGridDft,
  };
  if (!runsOnMediaEngine(s)) return engineMemoryBytes(base);
  const objects = s.objects ?? [];
  let points = 0;
  let slots = 0;
  let rows = 0;
  for (const o of objects) {
    const b = boundingBox(o);
    const n = (Math.ceil((b.x1 - b.x0) / s.grid.dx) + 3) * (Math.ceil((b.y1 - b.y0) / s.grid.dy) + 3);
    points += n;
    slots += n * (o.material === 'pec' ? 0 : poleStateSlots(o.material.poles));
    rows += Math.ceil((b.y1 - b.y0) / s.grid.dy) + 3;
  }
  const records = [points, points, points] as [number, number, number];
  const poles = (s.medium.poles?.length ?? 0) + objects.reduce((n, o) => n + (o.material === 'pec' ? 0 : o.material.poles?.length ?? 0), 0);
  return mediaMemoryBytes({
    ...base, polarization: s.polarization ?? 'TMz', stateSlots: poleStateSlots(s.medium.poles), poleRecords: poles,
    patches: records, poolSlots: 2 * slots, sourceCorrections: poles, pecRuns: [points, points, points], maskRows: Math.min(s.grid.ny, rows),
  });
}
