/**
 * Probes for the absorber study's worst case: one cell inside the layer's inner face, along
 * every side (level with the source, where the wave meets the layer head-on, and halfway to
 * each corner) and in the four corners (grazing incidence, where a CPML reflects most). A
 * figure measured there holds wherever the user later puts probes.
 */
import { layoutOf } from '../scenario/layout.ts';
import type { Probe, Scenario } from '../scenario/types.ts';

/** A probe the absorber study records, in metres on the user's own grid. */
export interface StudyProbe extends Probe {
  /** True when the study placed it because the scenario has no probes of its own. */
  added: boolean;
  /** True for the worst-case probes along the layer's inner face. */
  edge?: boolean;
}

/**
 * The worst-case probes of a scenario, skipping nodes in `taken` ("i,j") and the source's.
 * At most 16: four corners, and three per side.
 */
export function edgeProbes(s: Scenario, taken: ReadonlySet<string> = new Set()): StudyProbe[] {
  const { nx, ny, dx, dy } = s.grid;
  const L = s.absorber.cells;
  const src = layoutOf(s).source;
  const lo = L + 1;
  const hiX = nx - 2 - L;
  const hiY = ny - 2 - L;
  if (hiX < lo || hiY < lo) return [];
  const mid = (a: number, b: number) => Math.round((a + b) / 2);
  const at: [string, number, number][] = [
    ['edge corner bottom-left', lo, lo], ['edge corner bottom-right', hiX, lo], ['edge corner top-left', lo, hiY], ['edge corner top-right', hiX, hiY],
    ['edge left', lo, src.j], ['edge left low', lo, mid(lo, src.j)], ['edge left high', lo, mid(src.j, hiY)],
    ['edge right', hiX, src.j], ['edge right low', hiX, mid(lo, src.j)], ['edge right high', hiX, mid(src.j, hiY)],
    ['edge bottom', src.i, lo], ['edge bottom left', mid(lo, src.i), lo], ['edge bottom right', mid(src.i, hiX), lo],
    ['edge top', src.i, hiY], ['edge top left', mid(lo, src.i), hiY], ['edge top right', mid(src.i, hiX), hiY],
  ];
  const seen = new Set<string>([...taken, `${src.i},${src.j}`]);
  const out: StudyProbe[] = [];
  for (const [name, i, j] of at) {
    const key = `${i},${j}`;
    if (seen.has(key)) continue;
    seen.add(key);
    out.push({ name, x: i * dx, y: j * dy, added: true, edge: true });
  }
  return out;
}
