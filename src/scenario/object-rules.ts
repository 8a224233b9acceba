/**
 * Rules for the scenario's objects that tie fields together (README "Objects"): each
 * shape must have an area (radius above 0, a rectangle with width and height, a simple
 * polygon of 3 to 64 points); no object may reach into the absorber; no object may cover
 * the source; no perfect conductor may cover a probe or a point of a probe line; and a
 * medium faster than the background must not push the local Courant number past the
 * stability limit. They run on a scenario whose fields have passed their own checks
 * (object-schema.ts and schema.ts), with defaults filled in. Every problem is reported on
 * the object (`objects[i]`, or the field of it at fault), names the other party, and says
 * what to change, in metres.
 */
import { boundingBox, containsPoint, onBoundary, polygonDefect, POLYGON_MAX_POINTS, type Shape } from './geometry.ts';
import { layoutOf, lineNodes, stabilityLimit, type Node } from './layout.ts';
import { approx, floorTo4Decimals, quote, tidy } from './show.ts';
import type { Fill, Polarization, Problem, Scenario, SceneObject } from './types.ts';

/** The parts of a scenario the object rules read. */
export type ObjectScenario = Pick<Scenario, 'grid' | 'medium' | 'absorber' | 'source' | 'probes' | 'lines'> & {
  objects?: SceneObject[];
  polarization?: Polarization;
  fill?: Fill;
};

/**
 * Every problem with the scenario's objects, in object order, one per mistake.
 *
 * @example
 * objectProblems(scenario).map((p) => `${p.path}: ${p.message}`);
 * // ['objects[0].radius: 0 is not above 0; give the radius in metres, e.g. 0.01']
 */
export function objectProblems(s: ObjectScenario): Problem[] {
  const objects = s.objects ?? [];
  const out: Problem[] = [];
  const usable: boolean[] = [];
  objects.forEach((o, i) => {
    const shapeProblems = shapeProblemsOf(o, i);
    out.push(...shapeProblems);
    usable.push(shapeProblems.length === 0);
    const speed = speedProblem(s, o, i);
    if (speed !== undefined) out.push(speed);
  });
  const layout = layoutOf(s as Scenario);
  const shapes: (Shape | undefined)[] = objects.map((o, i) => (usable[i] ? o : undefined));
  objects.forEach((o, i) => {
    if (!usable[i]) return;
    const reach = absorberProblem(s, o, i);
    if (reach !== undefined) out.push(reach);
    const { source } = layout;
    if (containsPoint(o, source.x, source.y)) {
      const where = onBoundary(o, source.x, source.y) ? 'on its boundary' : 'inside it';
      out.push({
        path: `objects[${i}]`,
        message: `covers the source node at ${at(source)}, which lies ${where}; a source must sit outside every object, so move the source or the object`,
      });
    }
  });
  const isPec = (k: number) => k >= 0 && objects[k].material === 'pec';
  layout.probes.forEach((p, k) => {
    const top = topUsable(shapes, p.x, p.y);
    if (!isPec(top)) return;
    out.push({
      path: `objects[${top}]`,
      message: `is a perfect conductor covering probes[${k}] (${quote(p.name)}) at ${at(p)}, where the field is held at zero; move the probe or the object (a probe inside a penetrable object is fine)`,
    });
  });
  s.lines.forEach((line, k) => {
    const nodes = lineNodes(line.x0, line.y0, line.x1, line.y1, s.grid.dx, s.grid.dy);
    const hits = new Map<number, { count: number; first: Node }>();
    for (const node of nodes) {
      const top = topUsable(shapes, node.x, node.y);
      if (!isPec(top)) continue;
      const h = hits.get(top);
      if (h === undefined) hits.set(top, { count: 1, first: node });
      else h.count++;
    }
    for (const [top, { count, first }] of [...hits].sort((a, b) => a[0] - b[0])) {
      const points = count === 1 ? 'a point' : `${count} of the ${nodes.length} points`;
      out.push({
        path: `objects[${top}]`,
        message: `is a perfect conductor covering ${points} of lines[${k}] (${quote(line.name)}), the first at ${at(first)}, where the field is held at zero; move or shorten the line, or move the object`,
      });
    }
  });
  return out.sort((a, b) => objectIndex(a.path) - objectIndex(b.path));
}

/**
 * Facts about the objects worth a warning but not a refusal: an object that takes no
 * sample point of the electric field, so the fill in use leaves it out of the grid.
 *
 * @example
 * objectWarnings(scenario); // [{ path: 'objects[1]', message: 'takes no Ez node: at 0.0004 m across …' }]
 */
export function objectWarnings(s: ObjectScenario): Problem[] {
  const objects = s.objects ?? [];
  const fill = s.fill ?? 'staircase';
  const te = (s.polarization ?? 'TMz') === 'TEz';
  const out: Problem[] = [];
  objects.forEach((o, i) => {
    if (shapeProblemsOf(o, i).length > 0) return;
    const pec = o.material === 'pec';
    // Blending takes in any penetrable object, and TEz's cut cells any conductor, however small.
    const blended = fill !== 'staircase' && (!pec || (fill === 'conformal' && te));
    if (blended || takesSamplePoint(o, s.grid.dx, s.grid.dy, te)) return;
    const b = boundingBox(o);
    const size = Math.max(b.x1 - b.x0, b.y1 - b.y0);
    const points = te ? 'Ex or Ey sample point' : 'Ez node';
    const why = fill === 'staircase' ? 'the staircase fill leaves it out' : `the ${fill} fill staircases a perfect conductor in ${te ? 'TEz' : 'TMz'}, so it is left out`;
    const fix = pec && fill !== 'conformal' ? 'make it larger, use smaller cells, or use "fill": "conformal"' : pec ? 'make it larger or use smaller cells' : 'make it larger, use smaller cells, or use "fill": "average"';
    out.push({
      path: `objects[${i}]`,
      message: `takes no ${points}: at ${approx(size)} m across it fits between sample points ${tidy(s.grid.dx)} m × ${tidy(s.grid.dy)} m apart, so ${why}; ${fix}`,
    });
  });
  return out;
}

function at(n: Node): string {
  return `(${tidy(n.x)}, ${tidy(n.y)}) m (node i = ${n.i}, j = ${n.j})`;
}

function objectIndex(path: string): number {
  const m = /^objects\[(\d+)\]/.exec(path);
  return m === null ? -1 : Number(m[1]);
}

function topUsable(shapes: readonly (Shape | undefined)[], x: number, y: number): number {
  for (let k = shapes.length - 1; k >= 0; k--) {
    const s = shapes[k];
    if (s !== undefined && containsPoint(s, x, y)) return k;
  }
  return -1;
}

function shapeProblemsOf(o: SceneObject, i: number): Problem[] {
  const base = `objects[${i}]`;
  switch (o.shape) {
    case 'circle':
      return o.radius > 0 ? [] : [{ path: `${base}.radius`, message: `${o.radius} is not above 0; give the radius in metres, e.g. 0.01` }];
    case 'rectangle': {
      const out: Problem[] = [];
      if (o.x0 === o.x1) out.push({ path: `${base}.x1`, message: `${o.x1} equals x0, so the rectangle has no width; give x0 and x1 as the left and right sides in metres` });
      if (o.y0 === o.y1) out.push({ path: `${base}.y1`, message: `${o.y1} equals y0, so the rectangle has no height; give y0 and y1 as the bottom and top sides in metres` });
      return out;
    }
    case 'polygon': {
      const message = polygonMessage(o.points);
      return message === undefined ? [] : [{ path: `${base}.points`, message }];
    }
  }
}

function polygonMessage(points: [number, number][]): string | undefined {
  const d = polygonDefect(points);
  if (d === undefined) return undefined;
  const n = points.length;
  const edge = (k: number) => `the edge from points[${k}] to points[${(k + 1) % n}]`;
  const pt = ([x, y]: [number, number]) => `(${approx(x)}, ${approx(y)}) m`;
  switch (d.kind) {
    case 'too-few': return `has ${n} point${n === 1 ? '' : 's'}; a polygon needs at least 3 corners, so add points, or use a "circle" or "rectangle"`;
    case 'too-many': return `has ${n} points, more than the ${POLYGON_MAX_POINTS} a polygon may have; simplify the outline to at most ${POLYGON_MAX_POINTS} points, or split it into several objects`;
    case 'repeated-point': return `points[${d.index}] and points[${(d.index + 1) % n}] are the same point ${pt(points[d.index])}; remove one of them`;
    case 'no-area': return `all ${n} points lie on one straight line, so the polygon has no area; move at least one point off the line`;
    case 'edges-cross': return `${edge(d.first)} crosses ${edge(d.second)} at ${pt(d.at)}; reorder the points so the outline does not cross itself`;
    case 'edges-touch': return `${edge(d.first)} touches ${edge(d.second)} at ${pt(d.at)}; an outline may meet itself only at neighbouring corners, so move the points apart, or split the shape into two objects`;
    case 'edge-folds-back': return `${edge(d.second)} runs back along ${edge(d.first)}; remove points[${d.second}], where the outline turns back`;
  }
}

/**
 * A medium with a lower ε∞ than the background carries faster waves than the time step was
 * set for: its local Courant number is S·√(εbackground/εobject) (README "Physics conventions").
 */
function speedProblem(s: ObjectScenario, o: SceneObject, i: number): Problem | undefined {
  if (o.material === 'pec') return undefined;
  const epsObject = o.material.epsR;
  const epsBackground = s.medium.epsR;
  const { courant, dx, dy } = s.grid;
  const limit = stabilityLimit(dx, dy);
  const local = courant * Math.sqrt(epsBackground / epsObject);
  if (!(local > limit * (1 + 1e-12))) return undefined;
  const lowest = epsBackground * (courant / limit) ** 2;
  const safeCourant = floorTo4Decimals(limit * Math.sqrt(epsObject / epsBackground));
  return {
    path: `objects[${i}].material.epsR`,
    message: `${epsObject} is below medium.epsR = ${epsBackground}, so waves in this object are faster than the time step allows: its local Courant number ${approx(local)} is above the stability limit ${approx(limit)}; use epsR ${approx(lowest)} or more, or lower grid.courant to ${safeCourant} or less`,
  };
}

function absorberProblem(s: ObjectScenario, o: SceneObject, i: number): Problem | undefined {
  const { nx, ny, dx, dy } = s.grid;
  const cells = s.absorber.cells;
  const b = boundingBox(o);
  const axes = [
    { axis: 'x', index: 'i', d: dx, n: nx, low: b.x0, high: b.x1 },
    { axis: 'y', index: 'j', d: dy, n: ny, low: b.y0, high: b.y1 },
  ];
  const reaches: string[] = [];
  let outsideGrid = false;
  for (const { axis, d, n, low, high } of axes) {
    const lo = cells * d;
    const hi = (n - 1 - cells) * d;
    const slack = 1e-9 * d;
    if (low < lo - slack) {
      reaches.push(`${approx(lo - low)} m past ${axis} = ${tidy(lo)} m on the low-${axis} side (down to ${axis} = ${approx(low)} m)`);
      if (low < -slack) outsideGrid = true;
    }
    if (high > hi + slack) {
      reaches.push(`${approx(high - hi)} m past ${axis} = ${tidy(hi)} m on the high-${axis} side (up to ${axis} = ${approx(high)} m)`);
      if (high > (n - 1) * d + slack) outsideGrid = true;
    }
  }
  if (reaches.length === 0) return undefined;
  const into = cells === 0 ? 'outside the grid' : outsideGrid ? 'through the absorber layer and outside the grid' : 'into the absorber layer';
  const [ax, ay] = axes;
  const keep = `${tidy(cells * ax.d)} m ≤ x ≤ ${tidy((ax.n - 1 - cells) * ax.d)} m and ${tidy(cells * ay.d)} m ≤ y ≤ ${tidy((ay.n - 1 - cells) * ay.d)} m`;
  const nodes = `the interior nodes i = ${cells} to ${ax.n - 1 - cells}, j = ${cells} to ${ay.n - 1 - cells}`;
  return {
    path: `objects[${i}]`,
    message: `reaches ${into}: ${reaches.join(' and ')}; keep every part of the object within ${keep}, ${nodes}, or enlarge the grid`,
  };
}

/** Whether any electric sample point of the polarization lies in the closed shape. */
function takesSamplePoint(o: SceneObject, dx: number, dy: number, te: boolean): boolean {
  const b = boundingBox(o);
  const offsets: [number, number][] = te ? [[0, 0.5], [0.5, 0]] : [[0, 0]];
  for (const [ox, oy] of offsets) {
    const i0 = Math.ceil(b.x0 / dx - ox) - 1;
    const i1 = Math.floor(b.x1 / dx - ox) + 1;
    const j0 = Math.ceil(b.y0 / dy - oy) - 1;
    const j1 = Math.floor(b.y1 / dy - oy) + 1;
    for (let j = j0; j <= j1; j++) {
      for (let i = i0; i <= i1; i++) if (containsPoint(o, (i + ox) * dx, (j + oy) * dy)) return true;
    }
  }
  return false;
}
