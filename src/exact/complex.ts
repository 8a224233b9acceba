/**
 * Complex arithmetic on [re, im] pairs: the one helper module every layer uses for
 * frequency-domain values (transfer functions, DFTs, permittivities, wavenumbers).
 * Functions return new pairs and never mutate their arguments. Hot loops (series,
 * recurrences) may inline the arithmetic instead; these are for clarity elsewhere.
 */

/** A complex number as [re, im]. */
export type Complex = [number, number];

export const cx = (re: number, im = 0): Complex => [re, im];
export const cAdd = (a: Complex, b: Complex): Complex => [a[0] + b[0], a[1] + b[1]];
export const cSub = (a: Complex, b: Complex): Complex => [a[0] - b[0], a[1] - b[1]];
export const cMul = (a: Complex, b: Complex): Complex => [a[0] * b[0] - a[1] * b[1], a[0] * b[1] + a[1] * b[0]];
export const cScale = (a: Complex, s: number): Complex => [a[0] * s, a[1] * s];
export const cConj = (a: Complex): Complex => [a[0], -a[1]];
export const cNeg = (a: Complex): Complex => [-a[0], -a[1]];
export const cAbs = (a: Complex): number => Math.hypot(a[0], a[1]);
export const cArg = (a: Complex): number => Math.atan2(a[1], a[0]);

/** a/b by Smith's algorithm (no overflow for large |b|; Smith, CACM 5(8), 1962). */
export function cDiv(a: Complex, b: Complex): Complex {
  const [ar, ai] = a;
  const [br, bi] = b;
  if (Math.abs(br) >= Math.abs(bi)) {
    const r = bi / br;
    const d = br + bi * r;
    return [(ar + ai * r) / d, (ai - ar * r) / d];
  }
  const r = br / bi;
  const d = br * r + bi;
  return [(ar * r + ai) / d, (ai * r - ar) / d];
}

/** e^a. */
export function cExp(a: Complex): Complex {
  const m = Math.exp(a[0]);
  return [m * Math.cos(a[1]), m * Math.sin(a[1])];
}

/** Principal logarithm, imaginary part in (−π, π]. */
export function cLog(a: Complex): Complex {
  return [Math.log(cAbs(a)), cArg(a)];
}

/** Principal square root (Re ≥ 0), computed without cancellation. */
export function cSqrt(a: Complex): Complex {
  const [x, y] = a;
  if (x === 0 && y === 0) return [0, 0];
  const m = cAbs(a);
  if (x >= 0) {
    const t = Math.sqrt((m + x) / 2);
    return [t, y / (2 * t)];
  }
  const t = Math.sqrt((m - x) / 2);
  return [Math.abs(y) / (2 * t), y >= 0 ? t : -t];
}

/** r·e^{jθ}. */
export const cPolar = (r: number, theta: number): Complex => [r * Math.cos(theta), r * Math.sin(theta)];
