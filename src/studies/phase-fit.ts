/**
 * Removes the 360° jumps from a sequence of wrapped angles in degrees, so that each value
 * differs from the previous one by at most 180° (the usual phase unwrapping of signal
 * processing). NaN entries are kept as NaN and skipped when looking back.
 * Source: common practice (e.g. MATLAB/NumPy `unwrap`), no single published source.
 *
 * @example
 * unwrapDegrees([170, -175, -160]); // [170, 185, 200]
 */
export function unwrapDegrees(values: ArrayLike<number>): Float64Array {
  const out = new Float64Array(values.length);
  let previous = NaN;
  let turns = 0;
  for (let k = 0; k < values.length; k++) {
    const v = values[k];
    if (!Number.isFinite(v)) { out[k] = NaN; continue; }
    if (Number.isFinite(previous)) {
      const jump = v + turns - previous;
      turns -= 360 * Math.round(jump / 360);
    }
    out[k] = v + turns;
    previous = out[k];
  }
  return out;
}

export interface LineFit {
  /** dy/dx of the least-squares line. */
  slope: number;
  /** y at x = 0. */
  intercept: number;
  /** Root-mean-square distance of the points from the line, in y's unit. */
  residualRms: number;
  /** Points used (finite x and y). */
  count: number;
}

/**
 * Ordinary least-squares straight line y = intercept + slope·x through the finite pairs
 * (x[k], y[k]); NaN slope and intercept when fewer than two distinct x remain.
 * Source: the normal equations of linear regression, any statistics handbook.
 *
 * @example
 * fitLine([0, 1, 2], [1, 3, 5]); // { slope: 2, intercept: 1, residualRms: 0, count: 3 }
 */
export function fitLine(x: ArrayLike<number>, y: ArrayLike<number>): LineFit {
  let n = 0;
  let mx = 0;
  let my = 0;
  for (let k = 0; k < x.length; k++) {
    if (!Number.isFinite(x[k]) || !Number.isFinite(y[k])) continue;
    n++;
    mx += x[k];
    my += y[k];
  }
  if (n < 2) return { slope: NaN, intercept: NaN, residualRms: NaN, count: n };
  mx /= n;
  my /= n;
  let sxx = 0;
  let sxy = 0;
  for (let k = 0; k < x.length; k++) {
    if (!Number.isFinite(x[k]) || !Number.isFinite(y[k])) continue;
    sxx += (x[k] - mx) ** 2;
    sxy += (x[k] - mx) * (y[k] - my);
  }
  if (!(sxx > 0)) return { slope: NaN, intercept: NaN, residualRms: NaN, count: n };
  const slope = sxy / sxx;
  const intercept = my - slope * mx;
  let squares = 0;
  for (let k = 0; k < x.length; k++) {
    if (!Number.isFinite(x[k]) || !Number.isFinite(y[k])) continue;
    squares += (y[k] - intercept - slope * x[k]) ** 2;
  }
  return { slope, intercept, residualRms: Math.sqrt(squares / n), count: n };
}
