import type { Scenario } from '../scenario/types.ts';
import type { MaterialMap } from './material-map.ts';
import { backgroundStateIndex, mediaTables, PATCH_KIND, type MediaTables, type PatchRecord, type PoleRecord } from './media-simulation.ts';

const f = Math.fround;

/**
 * The media engine's scheme (assembly/media.ts) in plain TypeScript over Float32Arrays,
 * every operation rounded to float32 with Math.fround in the engine's order, so that its
 * fields agree with the engine's bit for bit (test/engine/media-plain-kernel.test.ts).
 * Each row runs b and c over the whole row and then a (the engine fuses the two where it
 * can; per node the operations are the same). No probes or DFTs: fields, poles, patches,
 * absorber, walls and source.
 *
 * @example
 * const k = MediaPlainKernel.fromScenario(scenario, map);
 * k.step(100);
 * k.a[k.nx * 50 + 50];
 */
export class MediaPlainKernel {
  readonly nx: number;
  readonly ny: number;
  readonly layer: number;
  readonly te: boolean;
  /** The node field (Ez or Hz), b (Hx or −Ex) and c (Hy or −Ey), k = j·nx + i. */
  readonly a: Float32Array;
  readonly b: Float32Array;
  readonly c: Float32Array;
  private readonly t: MediaTables;
  // Coefficients as float32.
  private readonly caA: number; private readonly cbxA: number; private readonly cbyA: number; private readonly cqA: number;
  private readonly caB: number; private readonly cbB: number; private readonly cqB: number;
  private readonly caC: number; private readonly cbC: number; private readonly cqC: number;
  private readonly sourceScale: number;
  private readonly poles: PoleRecord[];
  private readonly patches: { a: PatchRecord[]; b: PatchRecord[]; c: PatchRecord[] };
  private readonly rowStart: { a: Int32Array; b: Int32Array; c: Int32Array };
  private readonly scratch: { a: Float32Array; b: Float32Array; c: Float32Array };
  // Background states in the engine's layout (see backgroundStateIndex), patch states in a pool.
  private readonly statesA: Float32Array;
  private readonly statesB: Float32Array;
  private readonly statesC: Float32Array;
  private readonly pool: Float32Array;
  private readonly leftEnd: number;
  private readonly rightStart: number;
  private readonly psiRow: number;
  private readonly psiCX: Float32Array; // c's ψ (x strips), row j, strip column
  private readonly psiAX: Float32Array; // a's ψ (x strips)
  private readonly psiBY: Float32Array; // b's ψ (y strips), ψ row, column
  private readonly psiAY: Float32Array; // a's ψ (y strips)
  private steps = 0;

  /** Builds the kernel for a scenario and optional material map (tables as MediaSimulation has them). */
  static fromScenario(s: Scenario, map?: MaterialMap): MediaPlainKernel {
    return new MediaPlainKernel(mediaTables(s, map));
  }

  constructor(t: MediaTables) {
    this.t = t;
    const { nx, ny, layer: L } = t;
    this.nx = nx; this.ny = ny; this.layer = L; this.te = t.te;
    this.caA = f(t.a.ca); this.cbxA = f(t.a.cbx); this.cbyA = f(t.a.cby); this.cqA = f(t.a.cq);
    this.caB = f(t.b.ca); this.cbB = f(t.b.cb); this.cqB = f(t.b.cq);
    this.caC = f(t.c.ca); this.cbC = f(t.c.cb); this.cqC = f(t.c.cq);
    this.sourceScale = f(t.sourceScale);
    this.poles = t.poles.map((p) => ({ kind: p.kind, k1: f(p.k1), k2: f(p.k2), k3: f(p.k3) }));
    const round = (list: PatchRecord[]) => list.map((p) => ({ ...p, coefficients: p.coefficients.map(f) as PatchRecord['coefficients'] }));
    this.patches = { a: round(t.patches.a), b: round(t.patches.b), c: round(t.patches.c) };
    const starts = (list: PatchRecord[]) => {
      const s = new Int32Array(ny + 1);
      let p = 0;
      for (let j = 0; j <= ny; j++) {
        while (p < list.length && list[p].k < j * nx) p++;
        s[j] = p;
      }
      return s;
    };
    this.rowStart = { a: starts(t.patches.a), b: starts(t.patches.b), c: starts(t.patches.c) };
    this.scratch = { a: new Float32Array(t.patches.a.length), b: new Float32Array(t.patches.b.length), c: new Float32Array(t.patches.c.length) };
    const cells = nx * ny;
    // One spare node past the last row: c of the last node reads its right neighbour.
    this.a = new Float32Array(cells + 1);
    this.b = new Float32Array(cells);
    this.c = new Float32Array(cells);
    const stateSize = ny * Math.ceil(nx / 4) * 4 * t.slots;
    this.statesA = new Float32Array(t.te ? 0 : stateSize);
    this.statesB = new Float32Array(t.te ? stateSize : 0);
    this.statesC = new Float32Array(t.te ? stateSize : 0);
    this.pool = new Float32Array(t.poolSlots);
    let left = 0;
    let right = nx;
    if (L > 0) {
      left = (L + 3) & ~3;
      right = (nx - 1 - L) & ~3;
      if (right < left) { left = nx; right = nx; }
    }
    this.leftEnd = left; this.rightStart = right; this.psiRow = left + nx - right;
    this.psiCX = new Float32Array(ny * this.psiRow);
    this.psiAX = new Float32Array(ny * this.psiRow);
    this.psiBY = new Float32Array(2 * L * nx);
    this.psiAY = new Float32Array(2 * L * nx);
  }

  get stepsDone(): number {
    return this.steps;
  }

  /** Advances `count` steps (the source is zero past the table it was given). */
  step(count: number): void {
    for (let s = 0; s < count; s++) {
      this.sweep(this.steps);
      this.steps++;
    }
  }

  /** Largest |a| (NaN if any node is NaN). */
  maxAbsA(): number {
    let m = 0;
    for (let k = 0; k < this.nx * this.ny; k++) {
      const v = this.a[k];
      if (v !== v) return NaN;
      m = Math.max(m, Math.abs(v));
    }
    return m;
  }

  // The terms of `count` poles from record `first` applied to v, states from `base`,
  // `stride` floats apart (see assembly/media.ts).
  private poleTerms(v: number, e: number, cq: number, st: Float32Array, base: number, stride: number, first: number, count: number): number {
    let s = base;
    for (let p = first; p < first + count; p++) {
      const r = this.poles[p];
      if (r.kind === 1) {
        const j = f(f(r.k1 * st[s]) + f(r.k2 * e));
        st[s] = j;
        v = f(v - f(cq * j));
        s += stride;
      } else if (r.kind === 2) {
        const now = st[s];
        const next = f(f(f(r.k1 * now) + f(r.k2 * st[s + stride])) + f(r.k3 * e));
        st[s] = next;
        st[s + stride] = now;
        v = f(v - f(cq * f(next - now)));
        s += 2 * stride;
      } else {
        v = f(v - f(f(cq * r.k3) * st[s]));
        s += stride;
      }
    }
    return v;
  }

  private debyeUpdate(v: number, e: number, st: Float32Array, base: number, stride: number, first: number, count: number): void {
    const sum = f(v + e);
    let s = base;
    for (let p = first; p < first + count; p++) {
      const r = this.poles[p];
      if (r.kind === 3) st[s] = f(f(r.k1 * st[s]) + sum);
      s += r.kind === 2 ? 2 * stride : stride;
    }
  }

  private clearStates(st: Float32Array, i: number, j: number): void {
    for (let s = 0; s < this.t.slots; s++) st[backgroundStateIndex(this.nx, this.t.slots, i, j, s)] = 0;
  }

  private psiYRow(j: number): number {
    const L = this.layer;
    return j < L ? j : L + j - (this.ny - 1 - L);
  }

  private sweep(n: number): void {
    const { nx, ny, layer: L, te, a } = this;
    const last = ny - 1;
    const bg = this.t.backgroundPoles;
    const sourceRow = Math.floor(this.t.sourceIndex / nx);
    for (let j = 0; j <= last; j++) {
      const k0 = j * nx;
      if (j === 0 || j === last) {
        if (j < last && !te) this.bRow(j, L > 0);
        this.cRow(j);
        continue;
      }
      this.computeEdgePatches(j);
      for (let p = this.rowStart.a[j]; p < this.rowStart.a[j + 1]; p++) this.scratch.a[p] = a[this.patches.a[p].k];
      const bY = L > 0 && (j < L || j >= last - L);
      const aY = L > 0 && (j < L || j > last - L);
      if (!(te && j === last - 1)) this.bRow(j, bY);
      this.cRow(j);
      if (te) {
        for (const i of [0, nx - 2]) {
          this.c[k0 + i] = 0;
          if (bg > 0) this.clearStates(this.statesC, i, j);
        }
      }
      this.writeEdgePatches(j);
      this.aRow(j, aY);
      a[k0] = 0;
      a[k0 + nx - 1] = 0;
      if (!te && bg > 0) {
        this.clearStates(this.statesA, 0, j);
        this.clearStates(this.statesA, nx - 1, j);
      }
      this.applyNodePatches(j);
      if (j === sourceRow && n < this.t.current.length) {
        const d = f(this.sourceScale * f(this.t.current[n]));
        const s = this.t.sourceIndex;
        a[s] = f(a[s] - d);
        for (const loc of this.t.sourceStates) {
          const st = loc.block === 'pool' ? this.pool : this.statesA;
          st[loc.index] = f(st[loc.index] - d);
        }
      }
    }
  }

  private bRow(j: number, yStrip: boolean): void {
    const { nx, te, a, b } = this;
    const { caB, cbB, cqB } = this;
    const bg = this.t.backgroundPoles;
    const r = yStrip ? this.psiYRow(j) : 0;
    const yb = yStrip ? this.t.y.bH[j] : 0, ya = yStrip ? this.t.y.aH[j] : 0, yg = yStrip ? this.t.y.gH[j] : 0;
    for (let i = 0; i < nx; i++) {
      const k = j * nx + i;
      const old = b[k];
      const d = f(a[k + nx] - a[k]);
      let v = te ? f(f(caB * old) - f(cbB * d)) : f(old - f(cbB * d));
      if (yStrip) {
        const q = r * nx + i;
        const p = f(f(yb * this.psiBY[q]) + f(ya * d));
        this.psiBY[q] = p;
        v = f(v - f(cbB * f(f(yg * d) + p)));
      }
      const base = backgroundStateIndex(nx, this.t.slots, i, j, 0);
      if (te && bg > 0) v = this.poleTerms(v, old, cqB, this.statesB, base, 4, 0, bg);
      b[k] = v;
      if (te && bg > 0) this.debyeUpdate(v, old, this.statesB, base, 4, 0, bg);
    }
  }

  private cRow(j: number): void {
    const { nx, te, a, c } = this;
    const { caC, cbC, cqC } = this;
    const X = this.t.x;
    const bg = this.t.backgroundPoles;
    for (let i = 0; i < nx; i++) {
      const k = j * nx + i;
      const old = c[k];
      const d = f(a[k + 1] - a[k]);
      let v = te ? f(f(caC * old) + f(cbC * d)) : f(old + f(cbC * d));
      if (this.layer > 0 && (i < this.leftEnd || i >= this.rightStart)) {
        const q = j * this.psiRow + (i < this.leftEnd ? i : this.leftEnd + i - this.rightStart);
        const p = f(f(X.bH[i] * this.psiCX[q]) + f(X.aH[i] * d));
        this.psiCX[q] = p;
        v = f(v + f(cbC * f(f(X.gH[i] * d) + p)));
      }
      const base = backgroundStateIndex(nx, this.t.slots, i, j, 0);
      if (te && bg > 0) v = this.poleTerms(v, old, cqC, this.statesC, base, 4, 0, bg);
      c[k] = v;
      if (te && bg > 0) this.debyeUpdate(v, old, this.statesC, base, 4, 0, bg);
    }
  }

  private aRow(j: number, yStrip: boolean): void {
    const { nx, te, a, b, c } = this;
    const { caA, cbxA, cbyA, cqA } = this;
    const X = this.t.x;
    const bg = this.t.backgroundPoles;
    const r = yStrip ? this.psiYRow(j) : 0;
    const yb = yStrip ? this.t.y.bE[j] : 0, ya = yStrip ? this.t.y.aE[j] : 0, yg = yStrip ? this.t.y.gE[j] : 0;
    for (let i = 0; i < nx; i++) {
      const k = j * nx + i;
      const e = a[k];
      const dC = f(c[k] - c[k - 1]);
      const dB = f(b[k] - b[k - nx]);
      let v = f(f((te ? e : f(caA * e)) + f(cbxA * dC)) - f(cbyA * dB));
      if (this.layer > 0 && (i < this.leftEnd || i >= this.rightStart)) {
        const q = j * this.psiRow + (i < this.leftEnd ? i : this.leftEnd + i - this.rightStart);
        const p = f(f(X.bE[i] * this.psiAX[q]) + f(X.aE[i] * dC));
        this.psiAX[q] = p;
        v = f(v + f(cbxA * f(f(X.gE[i] * dC) + p)));
      }
      if (yStrip) {
        const q = r * nx + i;
        const p = f(f(yb * this.psiAY[q]) + f(ya * dB));
        this.psiAY[q] = p;
        v = f(v - f(cbyA * f(f(yg * dB) + p)));
      }
      const base = backgroundStateIndex(nx, this.t.slots, i, j, 0);
      if (!te && bg > 0) v = this.poleTerms(v, e, cqA, this.statesA, base, 4, 0, bg);
      a[k] = v;
      if (!te && bg > 0) this.debyeUpdate(v, e, this.statesA, base, 4, 0, bg);
    }
  }

  private computeEdgePatches(j: number): void {
    const { nx, a } = this;
    for (const name of ['b', 'c'] as const) {
      const field = this[name];
      const list = this.patches[name];
      for (let p = this.rowStart[name][j]; p < this.rowStart[name][j + 1]; p++) {
        const { k, kind, coefficients: w, poleFirst, poleCount, state } = list[p];
        const old = field[k];
        const d = name === 'b' ? f(a[k + nx] - a[k]) : f(a[k + 1] - a[k]);
        let v = 0;
        if (kind === PATCH_KIND.medium) {
          v = name === 'b' ? f(f(w[0] * old) - f(w[1] * d)) : f(f(w[0] * old) + f(w[1] * d));
          if (poleCount > 0) {
            v = this.poleTerms(v, old, w[3], this.pool, state, 1, poleFirst, poleCount);
            this.debyeUpdate(v, old, this.pool, state, 1, poleFirst, poleCount);
          }
        } else if (kind === PATCH_KIND.edge) {
          v = name === 'b' ? f(old - f(w[0] * d)) : f(old + f(w[0] * d));
        }
        this.scratch[name][p] = v;
      }
    }
  }

  private writeEdgePatches(j: number): void {
    const bg = this.t.backgroundPoles;
    for (const name of ['b', 'c'] as const) {
      const list = this.patches[name];
      for (let p = this.rowStart[name][j]; p < this.rowStart[name][j + 1]; p++) {
        const k = list[p].k;
        this[name][k] = this.scratch[name][p];
        if (this.te && bg > 0) this.clearStates(name === 'b' ? this.statesB : this.statesC, k - j * this.nx, j);
      }
    }
  }

  private applyNodePatches(j: number): void {
    const { nx, a, b, c } = this;
    const bg = this.t.backgroundPoles;
    for (let p = this.rowStart.a[j]; p < this.rowStart.a[j + 1]; p++) {
      const { k, kind, coefficients: w, poleFirst, poleCount, state } = this.patches.a[p];
      const e = this.scratch.a[p];
      let v = 0;
      if (kind === PATCH_KIND.medium) {
        const dC = f(c[k] - c[k - 1]);
        const dB = f(b[k] - b[k - nx]);
        v = f(f(f(w[0] * e) + f(w[1] * dC)) - f(w[2] * dB));
        if (poleCount > 0) {
          v = this.poleTerms(v, e, w[3], this.pool, state, 1, poleFirst, poleCount);
          this.debyeUpdate(v, e, this.pool, state, 1, poleFirst, poleCount);
        }
      } else if (kind === PATCH_KIND.cell) {
        v = f(f(e + f(f(w[0] * c[k]) - f(w[1] * c[k - 1]))) - f(f(w[2] * b[k]) - f(w[3] * b[k - nx])));
      }
      a[k] = v;
      if (!this.te && bg > 0) this.clearStates(this.statesA, k - j * nx, j);
    }
  }
}
