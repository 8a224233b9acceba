import { C0 } from './constants.ts';
import type { Scenario } from './types.ts';

/** A node of the Ez grid: indices and the node's own position in metres. */
export interface Node { i: number; j: number; x: number; y: number }

export interface LineLayout { name: string; nodes: Node[] }

/** Where everything sits on the grid once positions are snapped to Ez nodes. */
export interface Layout {
  nx: number; ny: number; dx: number; dy: number;
  /** Time step, s: dt = courant·min(dx, dy)/c. */
  dt: number;
  /** Wave speed in the medium, m/s: c0/√εr. */
  c: number;
  source: Node;
  probes: (Node & { name: string })[];
  lines: LineLayout[];
}

/**
 * Index of the Ez node nearest to coordinate `x` on a grid of spacing `d`:
 * round(x/d) with halves rounded up (docs/scenario.md "Rules between fields").
 *
 * @example
 * snapIndex(0.15, 0.001); // 150
 */
export function snapIndex(x: number, d: number): number {
  return Math.floor(x / d + 0.5);
}

/** Wave speed in a medium of relative permittivity `epsR`, m/s. */
export function waveSpeed(epsR: number): number {
  return C0 / Math.sqrt(epsR);
}

/** Time step in seconds for a Courant number S: dt = S·min(dx, dy)/c. */
export function timeStep(courant: number, dx: number, dy: number, epsR: number): number {
  return (courant * Math.min(dx, dy)) / waveSpeed(epsR);
}

/** 2D Yee stability limit on S = c·dt/min(dx,dy): 1/(min(dx,dy)·√(1/dx² + 1/dy²)). */
export function stabilityLimit(dx: number, dy: number): number {
  return 1 / (Math.min(dx, dy) * Math.sqrt(1 / (dx * dx) + 1 / (dy * dy)));
}

function node(i: number, j: number, dx: number, dy: number): Node {
  return { i, j, x: i * dx, y: j * dy };
}

/**
 * Nodes of a probe line from (x0,y0) to (x1,y1): max(|Δi|, |Δj|) + 1 points evenly along
 * the segment, each snapped to its nearest node, repeats dropped (docs/outputs.md, lines.csv).
 */
export function lineNodes(x0: number, y0: number, x1: number, y1: number, dx: number, dy: number): Node[] {
  const di = snapIndex(x1, dx) - snapIndex(x0, dx);
  const dj = snapIndex(y1, dy) - snapIndex(y0, dy);
  const count = Math.max(Math.abs(di), Math.abs(dj)) + 1;
  const out: Node[] = [];
  const seen = new Set<number>();
  for (let k = 0; k < count; k++) {
    const f = count === 1 ? 0 : k / (count - 1);
    const i = snapIndex(x0 + f * (x1 - x0), dx);
    const j = snapIndex(y0 + f * (y1 - y0), dy);
    const key = i * 1_000_003 + j;
    if (seen.has(key)) continue;
    seen.add(key);
    out.push(node(i, j, dx, dy));
  }
  return out;
}

/** Snap source, probes and lines of a validated scenario to grid nodes and derive dt. */
export function layoutOf(s: Scenario): Layout {
  const { nx, ny, dx, dy, courant } = s.grid;
  const snap = (x: number, y: number) => node(snapIndex(x, dx), snapIndex(y, dy), dx, dy);
  return {
    nx, ny, dx, dy,
    dt: timeStep(courant, dx, dy, s.medium.epsR),
    c: waveSpeed(s.medium.epsR),
    source: snap(s.source.x, s.source.y),
    probes: s.probes.map((p) => ({ name: p.name, ...snap(p.x, p.y) })),
    lines: s.lines.map((l) => ({ name: l.name, nodes: lineNodes(l.x0, l.y0, l.x1, l.y1, dx, dy) })),
  };
}

/** Distance between two nodes, m (ρ is measured node to node from the source node). */
export function nodeDistance(a: Node, b: Node, dx: number, dy: number): number {
  return Math.hypot((a.i - b.i) * dx, (a.j - b.j) * dy);
}
