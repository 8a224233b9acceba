/** Nodes and weights of an n-point Gauss–Legendre rule on [−1, 1], ascending nodes. */
export interface QuadratureRule {
  nodes: Float64Array;
  weights: Float64Array;
}

/**
 * The n-point Gauss–Legendre rule on [−1, 1]: exact for polynomials of degree ≤ 2n − 1.
 * Nodes are the zeros of the Legendre polynomial Pn, found by Newton's method from the
 * Tricomi initial guess cos(π(i − ¼)/(n + ½)); weights are 2/((1 − x²)·Pn'(x)²)
 * (Abramowitz & Stegun 25.4.29). Pn and Pn' come from the three-term recurrence
 * (A&S 22.7.10) and the derivative identity (A&S 22.8.5). Dimensionless.
 *
 * @param n - number of points, an integer ≥ 1
 * @returns nodes ascending in (−1, 1) and their positive weights, which sum to 2
 * @throws RangeError when n is not an integer ≥ 1
 *
 * @example
 * const { nodes, weights } = gaussLegendre(2);
 * // nodes ≈ [−0.5773502692, 0.5773502692], weights = [1, 1]
 */
export function gaussLegendre(n: number): QuadratureRule {
  if (!Number.isInteger(n) || n < 1) throw new RangeError(`gaussLegendre: n must be an integer ≥ 1, got ${n}`);
  const nodes = new Float64Array(n);
  const weights = new Float64Array(n);
  for (let i = 1; i <= Math.floor((n + 1) / 2); i++) {
    let x = Math.cos((Math.PI * (i - 0.25)) / (n + 0.5));
    for (let iter = 0; iter < 100; iter++) {
      const step = legendreValue(n, x) / legendreDerivative(n, x);
      x -= step;
      if (Math.abs(step) <= 1e-16) break;
    }
    const slope = legendreDerivative(n, x);
    const w = 2 / ((1 - x * x) * slope * slope);
    nodes[i - 1] = -x;
    nodes[n - i] = x;
    weights[i - 1] = w;
    weights[n - i] = w;
  }
  if (n % 2 === 1) nodes[(n - 1) / 2] = 0; // the middle node is zero by symmetry
  return { nodes, weights };
}

/** Pn(x) by the three-term recurrence m·Pm = (2m − 1)·x·Pm−1 − (m − 1)·Pm−2. */
function legendrePair(n: number, x: number): [number, number] {
  let previous = 1;
  let current = x;
  for (let m = 2; m <= n; m++) {
    const next = ((2 * m - 1) * x * current - (m - 1) * previous) / m;
    previous = current;
    current = next;
  }
  return [current, previous];
}

function legendreValue(n: number, x: number): number {
  return legendrePair(n, x)[0];
}

/** Pn'(x) = n·(x·Pn − Pn−1)/(x² − 1), valid inside (−1, 1). */
function legendreDerivative(n: number, x: number): number {
  const [pn, pnMinus1] = legendrePair(n, x);
  return (n * (x * pn - pnMinus1)) / (x * x - 1);
}
