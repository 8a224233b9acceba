/**
 * The scenario's objects as the page edits them: read from the draft (which may hold
 * anything typed), made new at a free spot, moved, resized by a handle and grown by whole
 * cells. Plane geometry only, in metres; every coordinate written back is tidied to 12
 * significant digits so that i·dx reads as typed (0.12, not 0.12000000000000001).
 */
import type { Material, Problem, SceneObject } from '../scenario/types.ts';
import { freshName, readAt, type Draft } from './draft.ts';
import { tidy } from './grid-drawing.ts';

export type ObjectShape = SceneObject['shape'];

/** What a new object is made of until the person chooses: a plain dielectric. */
export const NEW_OBJECT_MATERIAL: Material = { epsR: 4 };

/** What the editors need of the grid: cell sizes, m, node counts and absorber cells. */
export interface CellGrid { nx: number; ny: number; dx: number; dy: number; cells: number }

const finite = (v: unknown): v is number => typeof v === 'number' && Number.isFinite(v);

/**
 * An entry of the draft's `objects` as a shape the map can draw, or undefined when its
 * shape or coordinates are not yet numbers (the form shows why).
 *
 * @example
 * drawableObject({ shape: 'circle', x: 0.1, y: 0.1, radius: 'x' }); // undefined
 */
export function drawableObject(raw: unknown): SceneObject | undefined {
  if (raw === null || typeof raw !== 'object') return undefined;
  const o = raw as Record<string, unknown>;
  const material = (o.material ?? NEW_OBJECT_MATERIAL) as Material;
  const head = typeof o.name === 'string' ? { name: o.name } : {};
  if (o.shape === 'circle' && finite(o.x) && finite(o.y) && finite(o.radius)) {
    return { ...head, shape: 'circle', x: o.x, y: o.y, radius: o.radius, material };
  }
  if (o.shape === 'rectangle' && finite(o.x0) && finite(o.y0) && finite(o.x1) && finite(o.y1)) {
    return { ...head, shape: 'rectangle', x0: o.x0, y0: o.y0, x1: o.x1, y1: o.y1, material };
  }
  if (o.shape === 'polygon' && Array.isArray(o.points)) {
    const pts = o.points.filter((p): p is [number, number] => Array.isArray(p) && p.length === 2 && finite(p[0]) && finite(p[1]));
    if (pts.length >= 2) return { ...head, shape: 'polygon', points: pts.map(([x, y]) => [x, y]), material };
  }
  return undefined;
}

const NONE: unknown[] = [];

/**
 * The draft's `objects` list as it stands, the same array while the draft is unchanged
 * (empty when missing or not a list).
 *
 * @example
 * draftObjectList({ objects: 'none' }); // []
 */
export function draftObjectList(draft: Draft): unknown[] {
  const list = readAt(draft, ['objects']);
  return Array.isArray(list) ? list : NONE;
}

/**
 * The list to write back: left out of the scenario when it is empty.
 *
 * @example
 * objectsValue([]); // undefined
 */
export function objectsValue(list: unknown[]): unknown[] | undefined {
  return list.length ? list : undefined;
}

/**
 * The grid and source position of a draft as far as they are numbers, with stand-ins
 * (1 mm cells, 100 nodes, 10 absorber cells, the source at the origin) for the rest, so a
 * new object can be placed while other fields are still wrong. Lengths in m.
 *
 * @example
 * placementOfDraft({ grid: { dx: 0.002 } }).grid.dx; // 0.002
 */
export function placementOfDraft(draft: Draft): { grid: CellGrid; source: [number, number] } {
  const num = (path: (string | number)[], fallback: number, positive = true) => {
    const v = readAt(draft, path);
    return finite(v) && (!positive || v > 0) ? v : fallback;
  };
  return {
    grid: {
      nx: num(['grid', 'nx'], 100), ny: num(['grid', 'ny'], 100), dx: num(['grid', 'dx'], 1e-3), dy: num(['grid', 'dy'], 1e-3),
      cells: num(['absorber', 'cells'], 10, false),
    },
    source: [num(['source', 'x'], 0, false), num(['source', 'y'], 0, false)],
  };
}

/**
 * Where a new object goes, m: above the source by a quarter of the interior, shifted
 * sideways by 12 cells for each object already there so that new ones do not pile up.
 * `g` in nodes and m, `source` in m; kept 8 cells inside the interior.
 *
 * @example
 * newObjectSpot({ nx: 300, ny: 300, dx: 0.001, dy: 0.001, cells: 10 }, [0.15, 0.15], 0); // [0.126, 0.22]
 */
export function newObjectSpot(g: CellGrid, source: [number, number], count: number): [number, number] {
  const { nx, ny, dx, dy, cells } = g;
  const i0 = Math.round(source[0] / dx) - 24 + 12 * (count % 5);
  const j0 = Math.round(source[1] / dy) + Math.round((ny - 2 * cells) / 4);
  const margin = 8;
  const i = Math.min(Math.max(i0, cells + margin), nx - 1 - cells - margin);
  const j = Math.min(Math.max(j0, cells + margin), ny - 1 - cells - margin);
  return [tidy(i * dx), tidy(j * dy)];
}

/**
 * A new object of `shape` centred on `at` (m): a circle of radius 5 cells, a rectangle of
 * 12 × 8 cells, or a triangle about 12 cells across; named after its shape, made of a
 * plain dielectric.
 *
 * @example
 * newObject('circle', [0.1, 0.1], { dx: 0.001, dy: 0.001 }, []); // { name: 'circle 1', shape: 'circle', x: 0.1, y: 0.1, radius: 0.005, … }
 */
export function newObject(shape: ObjectShape, at: [number, number], g: Pick<CellGrid, 'dx' | 'dy'>, taken: readonly string[]): SceneObject {
  const [x, y] = at;
  const { dx, dy } = g;
  const name = freshName(`${shape} `, taken);
  const material = structuredClone(NEW_OBJECT_MATERIAL);
  switch (shape) {
    case 'circle': return { name, shape, x, y, radius: tidy(5 * Math.min(dx, dy)), material };
    case 'rectangle': return { name, shape, x0: tidy(x - 6 * dx), y0: tidy(y - 4 * dy), x1: tidy(x + 6 * dx), y1: tidy(y + 4 * dy), material };
    case 'polygon': return {
      name, shape, material,
      points: [[tidy(x - 6 * dx), tidy(y - 4 * dy)], [tidy(x + 6 * dx), tidy(y - 4 * dy)], [x, tidy(y + 6 * dy)]],
    };
  }
}

/**
 * The names the draft's objects already use.
 *
 * @example
 * objectNames([{ name: 'post' }, {}, 3]); // ['post']
 */
export function objectNames(list: readonly unknown[]): string[] {
  return list.map((o) => (o && typeof o === 'object' ? (o as { name?: unknown }).name : undefined)).filter((n): n is string => typeof n === 'string');
}

/**
 * Only the fields that place an object (no name or material), to merge into the draft's entry.
 *
 * @example
 * geometryOf({ shape: 'circle', x: 0.1, y: 0.1, radius: 0.01, material: 'pec' }); // { x: 0.1, y: 0.1, radius: 0.01 }
 */
export function geometryOf(o: SceneObject): Record<string, unknown> {
  switch (o.shape) {
    case 'circle': return { x: o.x, y: o.y, radius: o.radius };
    case 'rectangle': return { x0: o.x0, y0: o.y0, x1: o.x1, y1: o.y1 };
    case 'polygon': return { points: o.points.map(([x, y]) => [x, y]) };
  }
}

/**
 * The object moved by (mx, my), m.
 *
 * @example
 * translated({ shape: 'circle', x: 0.1, y: 0.1, radius: 0.01, material: 'pec' }, 0.02, 0).x; // 0.12
 */
export function translated(o: SceneObject, mx: number, my: number): SceneObject {
  switch (o.shape) {
    case 'circle': return { ...o, x: tidy(o.x + mx), y: tidy(o.y + my) };
    case 'rectangle': return { ...o, x0: tidy(o.x0 + mx), y0: tidy(o.y0 + my), x1: tidy(o.x1 + mx), y1: tidy(o.y1 + my) };
    case 'polygon': return { ...o, points: o.points.map(([x, y]) => [tidy(x + mx), tidy(y + my)]) };
  }
}

/**
 * The handles that reshape an object, m: a circle's point on its rim towards +x, a
 * rectangle's four corners (x0 y0, x1 y0, x1 y1, x0 y1), a polygon's vertices.
 *
 * @example
 * handlesOf({ shape: 'circle', x: 0.1, y: 0.1, radius: 0.01, material: 'pec' }); // [[0.11, 0.1]]
 */
export function handlesOf(o: SceneObject): [number, number][] {
  switch (o.shape) {
    case 'circle': return [[o.x + o.radius, o.y]];
    case 'rectangle': return [[o.x0, o.y0], [o.x1, o.y0], [o.x1, o.y1], [o.x0, o.y1]];
    case 'polygon': return o.points.map(([x, y]) => [x, y]);
  }
}

/**
 * The object with handle `k` (of handlesOf) dragged to (x, y), m: a circle's radius becomes
 * the distance from its centre, a rectangle's corner moves and the opposite one stays.
 *
 * @example
 * withHandleAt({ shape: 'circle', x: 0, y: 0, radius: 1, material: 'pec' }, 0, 3, 4).radius; // 5
 */
export function withHandleAt(o: SceneObject, k: number, x: number, y: number): SceneObject {
  switch (o.shape) {
    case 'circle': return { ...o, radius: tidy(Math.hypot(x - o.x, y - o.y)) };
    case 'rectangle': {
      const r = { ...o };
      if (k === 0 || k === 3) r.x0 = x; else r.x1 = x;
      if (k === 0 || k === 1) r.y0 = y; else r.y1 = y;
      return r;
    }
    case 'polygon': return { ...o, points: o.points.map((p, n) => (n === k ? [x, y] : [p[0], p[1]])) };
  }
}

/**
 * The object grown (cells > 0) or shrunk (cells < 0) by whole cells on every side: a
 * circle's radius by cells·min(dx, dy), a rectangle's sides by cells·dx and cells·dy, a
 * polygon scaled about the centre of its bounding box so that the box grows likewise.
 * Returns the object unchanged when shrinking would leave nothing. dx, dy in m.
 *
 * @example
 * grown({ shape: 'circle', x: 0, y: 0, radius: 0.01, material: 'pec' }, 1, 0.001, 0.001).radius; // 0.011
 */
export function grown(o: SceneObject, cells: number, dx: number, dy: number): SceneObject {
  switch (o.shape) {
    case 'circle': {
      const radius = tidy(o.radius + cells * Math.min(dx, dy));
      return radius > 0 ? { ...o, radius } : o;
    }
    case 'rectangle': {
      const sx = o.x0 <= o.x1 ? 1 : -1;
      const sy = o.y0 <= o.y1 ? 1 : -1;
      const r = { ...o, x0: tidy(o.x0 - sx * cells * dx), x1: tidy(o.x1 + sx * cells * dx), y0: tidy(o.y0 - sy * cells * dy), y1: tidy(o.y1 + sy * cells * dy) };
      return (r.x1 - r.x0) * sx > 0 && (r.y1 - r.y0) * sy > 0 ? r : o;
    }
    case 'polygon': {
      const xs = o.points.map((p) => p[0]);
      const ys = o.points.map((p) => p[1]);
      const [x0, x1, y0, y1] = [Math.min(...xs), Math.max(...xs), Math.min(...ys), Math.max(...ys)];
      const w = x1 - x0;
      const h = y1 - y0;
      const fx = w > 0 ? (w + 2 * cells * dx) / w : 1;
      const fy = h > 0 ? (h + 2 * cells * dy) / h : 1;
      if (!(fx > 0 && fy > 0)) return o;
      const cx = (x0 + x1) / 2;
      const cy = (y0 + y1) / 2;
      return { ...o, points: o.points.map(([x, y]) => [tidy(cx + (x - cx) * fx), tidy(cy + (y - cy) * fy)]) };
    }
  }
}

/**
 * A short description of an object for screen readers.
 *
 * @example
 * objectLabel({ name: 'post', shape: 'circle', x: 0, y: 0, radius: 1, material: 'pec' }, 0); // 'object “post” (circle)'
 */
export function objectLabel(o: SceneObject | undefined, k: number): string {
  const what = o ? o.shape : 'object';
  return o?.name ? `object “${o.name}” (${what})` : `object ${k + 1} (${what})`;
}

/**
 * Indices of the objects a list of problems names (paths "objects[k]…"), each once, ascending.
 *
 * @example
 * faultyObjectIndices([{ path: 'objects[2].radius', message: '…' }]); // [2]
 */
export function faultyObjectIndices(problems: readonly Problem[]): number[] {
  const found = new Set<number>();
  for (const p of problems) {
    const m = /^objects\[(\d+)\]/.exec(p.path);
    if (m) found.add(Number(m[1]));
  }
  return [...found].sort((a, b) => a - b);
}
