/**
 * Placing the names of probes and lines on a map so they never print over each other:
 * each label tries a few spots around its marker, in order, and takes the first that
 * overlaps no label already placed and no other marker; a label with no free spot is left
 * out (its marker still shows, and the readout names it under the pointer).
 */

export interface Box { x: number; y: number; width: number; height: number }

export interface LabelRequest {
  /** The marker's centre, px. */
  at: [number, number];
  width: number;
  height: number;
}

/** Offsets tried around a marker, in units of `gap` (right-above first, as maps usually read). */
const SPOTS: [number, number][] = [[1, -1], [1, 1], [-1, -1], [-1, 1], [0, -1.6], [0, 1.6], [1.4, 0], [-1.4, 0]];

function overlaps(a: Box, b: Box): boolean {
  return a.x < b.x + b.width && b.x < a.x + a.width && a.y < b.y + b.height && b.y < a.y + a.height;
}

/**
 * A box for each label (top-left corner, px), or null where every spot is taken. `gap` is
 * the distance from the marker's centre to the label's near corner; `markers` are boxes
 * the labels must keep clear of (the other markers); `bounds` keeps labels on the canvas.
 *
 * @example
 * placeLabels([{ at: [50, 50], width: 30, height: 12 }, { at: [52, 50], width: 30, height: 12 }], 8);
 * // [{ x: 58, y: 30, … }, { x: 60, y: 58, … }]: the second goes below the first
 */
export function placeLabels(requests: readonly LabelRequest[], gap: number, markers: readonly Box[] = [], bounds?: Box): (Box | null)[] {
  const placed: Box[] = [];
  return requests.map((r) => {
    for (const [sx, sy] of SPOTS) {
      const x = sx > 0 ? r.at[0] + sx * gap : sx < 0 ? r.at[0] + sx * gap - r.width : r.at[0] - r.width / 2;
      const y = sy > 0 ? r.at[1] + sy * gap : sy < 0 ? r.at[1] + sy * gap - r.height : r.at[1] - r.height / 2;
      const box = { x, y, width: r.width, height: r.height };
      if (bounds && (x < bounds.x || y < bounds.y || x + r.width > bounds.x + bounds.width || y + r.height > bounds.y + bounds.height)) continue;
      if (placed.some((p) => overlaps(p, box)) || markers.some((m) => overlaps(m, box))) continue;
      placed.push(box);
      return box;
    }
    return null;
  });
}
