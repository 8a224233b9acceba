/**
 * How many sample points each object takes in the grid, and for the conformal fill how
 * many cut cells were dropped into the metal: the material map's own counts
 * (src/engine/build-material-map.ts). Building the map can take a tenth of a second on a
 * large grid, so it is built only when what it depends on changes, a moment after the
 * last edit, and never inside a render.
 */
import type { ReactiveController, ReactiveControllerHost } from 'lit';
import { buildMaterialMap } from '../engine/build-material-map.ts';
import { layoutOf } from '../scenario/layout.ts';
import type { Scenario } from '../scenario/types.ts';

export interface ObjectCounts {
  /** Sample points of the electric component(s) each object took, index for index. */
  nodesPerObject: number[];
  /** The conformal fill's cut cells: how many were dropped, and the fraction above which none is. */
  smallCells?: { dropped: number; threshold: number };
}

/** Quiet time after an edit before the map is rebuilt, ms. */
const SETTLE_MS = 120;

/** What the counts depend on: the grid, the media, the objects, the fill and the polarization. */
function countsKey(s: Scenario): string {
  return JSON.stringify([s.grid, s.medium, s.objects, s.fill ?? 'staircase', s.polarization ?? 'TMz']);
}

export class ObjectCountsController implements ReactiveController {
  /** The counts of the scenario last counted, undefined until there is one with objects. */
  counts: ObjectCounts | undefined;
  /** True while the counts shown are not those of the scenario on show. */
  pending = false;
  /** The key of the scenario counted, and of the one waiting to be. */
  private counted = '';
  private wanted = '';
  private timer: ReturnType<typeof setTimeout> | undefined;

  constructor(private readonly host: ReactiveControllerHost) {
    host.addController(this);
  }

  /** Follows the valid scenario (undefined while the set-up is wrong: the last counts stay, marked pending). */
  follow(s: Scenario | undefined): void {
    if (!s) {
      this.pending = this.counts !== undefined;
      return;
    }
    if (!(s.objects?.length)) {
      clearTimeout(this.timer);
      this.counted = this.wanted = '';
      this.counts = undefined;
      this.pending = false;
      return;
    }
    const key = countsKey(s);
    this.pending = key !== this.counted;
    if (key === this.wanted) return;
    this.wanted = key;
    clearTimeout(this.timer);
    if (!this.pending) return;
    this.timer = setTimeout(() => {
      const map = buildMaterialMap(s, layoutOf(s));
      this.counts = { nodesPerObject: map.nodesPerObject, smallCells: map.smallCells };
      this.counted = key;
      this.pending = false;
      this.host.requestUpdate();
    }, SETTLE_MS);
  }

  hostConnected(): void {}
  hostDisconnected(): void { clearTimeout(this.timer); }
}
