import { EPS0, MU0 } from '../scenario/constants.ts';
import { layoutOf } from '../scenario/layout.ts';
import type { Scenario } from '../scenario/types.ts';
import { cpmlAxisTables } from './cpml-profile.ts';
import { waveformValue } from '../scenario/waveforms.ts';

const f = Math.fround; // coefficients as the engine holds them (float32)

/**
 * The engine's algorithm written in plain TypeScript over Float32Arrays, for the benchmark's
 * "how much does WebAssembly buy" ratio: the same row-by-row sweep (H of a row, then its E),
 * the same CPML strips with ψ sized to them, the same operation order, as one would write it
 * without WebAssembly: values are stored as float32 and the arithmetic between loads and
 * stores is JavaScript's double precision. Rounding every intermediate to float32 with
 * Math.fround would match the engine bit for bit but runs about 3× slower in V8, which would
 * flatter the engine; as written the fields agree with the engine to float32 rounding
 * (test/engine/plain-kernel.test.ts). No probes or DFTs: only fields, absorber and source.
 *
 * @example
 * const k = PlainKernel.fromScenario(scenario);
 * k.step(100);
 * k.ez[k.nx * 50 + 50];
 */
export class PlainKernel {
  readonly nx: number;
  readonly ny: number;
  readonly layer: number;
  readonly ez: Float32Array;
  readonly hx: Float32Array;
  readonly hy: Float32Array;
  private readonly cex: number;
  private readonly cey: number;
  private readonly chx: number;
  private readonly chy: number;
  private readonly sourceScale: number;
  private readonly sourceIndex: number;
  private readonly current: Float64Array;
  private readonly x: ReturnType<typeof cpmlAxisTables>;
  private readonly y: ReturnType<typeof cpmlAxisTables>;
  private readonly leftEnd: number;
  private readonly rightStart: number;
  private readonly psiRow: number;
  private readonly psiHyX: Float32Array;
  private readonly psiEzX: Float32Array;
  private readonly psiHxY: Float32Array;
  private readonly psiEzY: Float32Array;
  private steps = 0;

  /** Builds the kernel for a validated scenario (coefficients as Simulation computes them). */
  static fromScenario(s: Scenario): PlainKernel {
    const layout = layoutOf(s);
    const { nx, ny, dx, dy, dt } = layout;
    const eps = EPS0 * s.medium.epsR;
    const current = new Float64Array(s.steps);
    for (let n = 0; n < s.steps; n++) current[n] = waveformValue(s.source.waveform, s.source.amplitude, (n + 0.5) * dt);
    return new PlainKernel({
      nx, ny, layer: s.absorber.cells,
      cex: dt / (eps * dx), cey: dt / (eps * dy), chx: dt / (MU0 * dx), chy: dt / (MU0 * dy),
      sourceScale: dt / (eps * dx * dy), sourceIndex: layout.source.j * nx + layout.source.i, current,
      x: cpmlAxisTables(nx, s.absorber, dx, dt, s.medium.epsR),
      y: cpmlAxisTables(ny, s.absorber, dy, dt, s.medium.epsR),
    });
  }

  constructor(o: {
    nx: number; ny: number; layer: number; cex: number; cey: number; chx: number; chy: number;
    sourceScale: number; sourceIndex: number; current: Float64Array;
    x: ReturnType<typeof cpmlAxisTables>; y: ReturnType<typeof cpmlAxisTables>;
  }) {
    this.nx = o.nx; this.ny = o.ny; this.layer = o.layer;
    this.cex = f(o.cex); this.cey = f(o.cey); this.chx = f(o.chx); this.chy = f(o.chy);
    this.sourceScale = f(o.sourceScale); this.sourceIndex = o.sourceIndex; this.current = o.current;
    this.x = o.x; this.y = o.y;
    const cells = o.nx * o.ny;
    // One spare node past the last row: Hy of the last node reads its right neighbour.
    this.ez = new Float32Array(cells + 1);
    this.hx = new Float32Array(cells);
    this.hy = new Float32Array(cells);
    // Same strip columns as the engine (assembly/engine.ts `allocate`).
    const L = o.layer;
    let left = 0;
    let right = o.nx;
    if (L > 0) {
      left = (L + 3) & ~3;
      right = (o.nx - 1 - L) & ~3;
      if (right < left) { left = o.nx; right = o.nx; }
    }
    this.leftEnd = left; this.rightStart = right; this.psiRow = left + o.nx - right;
    this.psiHyX = new Float32Array(o.ny * this.psiRow);
    this.psiEzX = new Float32Array(o.ny * this.psiRow);
    this.psiHxY = new Float32Array(2 * L * o.nx);
    this.psiEzY = new Float32Array(2 * L * o.nx);
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

  private sweep(n: number): void {
    const { nx, ny, layer, ez } = this;
    const last = ny - 1;
    const sourceRow = Math.floor(this.sourceIndex / nx);
    for (let j = 0; j <= last; j++) {
      const k0 = j * nx;
      if (j === 0 || j === last) {
        this.boundaryRow(j, k0);
        continue;
      }
      const q = j * this.psiRow;
      const right = q + this.leftEnd;
      if (layer === 0) {
        this.plainRange(k0, 0, nx);
      } else if (j >= layer && j < ny - 1 - layer) {
        this.stripRange(j, k0, 0, this.leftEnd, q, -1, -1);
        this.plainRange(k0, this.leftEnd, this.rightStart);
        this.stripRange(j, k0, this.rightStart, nx, right, -1, -1);
      } else {
        const qH = (j < layer ? j : layer + j - (ny - 1 - layer)) * nx;
        const qE = j === ny - 1 - layer ? -1 : (j < layer ? j : layer + j - (ny - layer)) * nx;
        this.stripRange(j, k0, 0, this.leftEnd, q, qH, qE);
        this.stripRange(j, k0, this.leftEnd, this.rightStart, -1, qH, qE);
        this.stripRange(j, k0, this.rightStart, nx, right, qH, qE);
      }
      ez[k0] = 0;
      ez[k0 + nx - 1] = 0;
      if (j === sourceRow && n < this.current.length) {
        ez[this.sourceIndex] -= this.sourceScale * this.current[n];
      }
    }
  }

  // H of row 0 or ny−1 (no E: those Ez nodes are PEC), with its CPML corrections.
  private boundaryRow(j: number, k0: number): void {
    const { nx, ny, layer, ez, hx, hy, chx, chy } = this;
    if (j < ny - 1) {
      for (let k = k0; k < k0 + nx; k++) hx[k] -= chy * (ez[k + nx] - ez[k]);
    }
    for (let k = k0; k < k0 + nx; k++) hy[k] += chx * (ez[k + 1] - ez[k]);
    if (layer === 0) return;
    if (j < ny - 1) {
      const b = this.y.bH[j], a = this.y.aH[j], g = this.y.gH[j];
      const psi = this.psiHxY;
      for (let i = 0; i < nx; i++) {
        const k = k0 + i;
        const d = ez[k + nx] - ez[k];
        const p = b * psi[i] + a * d;
        psi[i] = p;
        hx[k] -= chy * (g * d + p);
      }
    }
    const q = j * this.psiRow;
    this.hyStrip(k0, 0, this.leftEnd, q);
    this.hyStrip(k0, this.rightStart, nx, q + this.leftEnd);
  }

  private hyStrip(k0: number, i0: number, i1: number, q0: number): void {
    const { ez, hy, chx } = this;
    const { bH, aH, gH } = this.x;
    const psi = this.psiHyX;
    for (let i = i0, q = q0; i < i1; i++, q++) {
      const k = k0 + i;
      const d = ez[k + 1] - ez[k];
      const p = bH[i] * psi[q] + aH[i] * d;
      psi[q] = p;
      hy[k] += chx * (gH[i] * d + p);
    }
  }

  // H then E over columns [i0, i1) between the strips: the plain update, nothing else.
  private plainRange(k0: number, i0: number, i1: number): void {
    const { nx, ez, hx, hy, cex, cey, chx, chy } = this;
    for (let k = k0 + i0; k < k0 + i1; k++) {
      const e = ez[k];
      const hxNew = hx[k] - chy * (ez[k + nx] - e);
      const hyNew = hy[k] + chx * (ez[k + 1] - e);
      hx[k] = hxNew;
      hy[k] = hyNew;
      ez[k] = e + cex * (hyNew - hy[k - 1]) - cey * (hxNew - hx[k - nx]);
    }
  }

  // H then E over columns [i0, i1) of row j with CPML terms: q0 ≥ 0 asks for the x-strip
  // terms (ψ from q0), qH / qE ≥ 0 for the y-strip terms of Hx / Ez (ψ rows starting there).
  private stripRange(j: number, k0: number, i0: number, i1: number, q0: number, qH: number, qE: number): void {
    const { nx, ez, hx, hy, cex, cey, chx, chy } = this;
    const X = this.x;
    const bHy = qH >= 0 ? this.y.bH[j] : 0, aHy = qH >= 0 ? this.y.aH[j] : 0, gHy = qH >= 0 ? this.y.gH[j] : 0;
    const bEy = qE >= 0 ? this.y.bE[j] : 0, aEy = qE >= 0 ? this.y.aE[j] : 0, gEy = qE >= 0 ? this.y.gE[j] : 0;
    const { psiHyX, psiEzX, psiHxY, psiEzY } = this;
    for (let i = i0; i < i1; i++) {
      const k = k0 + i;
      const q = q0 + i - i0;
      const e = ez[k];
      const dy = ez[k + nx] - e;
      hx[k] -= chy * dy;
      if (qH >= 0) {
        const p = bHy * psiHxY[qH + i] + aHy * dy;
        psiHxY[qH + i] = p;
        hx[k] -= chy * (gHy * dy + p);
      }
      const dx = ez[k + 1] - e;
      hy[k] += chx * dx;
      if (q0 >= 0) {
        const p = X.bH[i] * psiHyX[q] + X.aH[i] * dx;
        psiHyX[q] = p;
        hy[k] += chx * (X.gH[i] * dx + p);
      }
      const dHy = hy[k] - hy[k - 1];
      const dHx = hx[k] - hx[k - nx];
      let ezNew = e + cex * dHy - cey * dHx;
      if (q0 >= 0) {
        const p = X.bE[i] * psiEzX[q] + X.aE[i] * dHy;
        psiEzX[q] = p;
        ezNew += cex * (X.gE[i] * dHy + p);
      }
      if (qE >= 0) {
        const p = bEy * psiEzY[qE + i] + aEy * dHx;
        psiEzY[qE + i] = p;
        ezNew -= cey * (gEy * dHx + p);
      }
      ez[k] = ezNew;
    }
  }
}
