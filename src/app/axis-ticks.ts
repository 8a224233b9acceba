/**
 * Where axes put their tick labels: round steps of 1, 2 or 5 × 10^k on a linear axis (the
 * maps' x and y), and on a logarithmic axis the roundest of the chart's own ticks that keep
 * their labels apart, so a scale spanning less than a decade still reads.
 */

/**
 * Ticks at multiples of a 1-2-5 step covering [min, max] with at most `maxCount` ticks
 * (at least 2 when the span allows), each rounded to the step to keep float noise out.
 *
 * @example
 * niceTicks(0, 299, 6); // [0, 50, 100, 150, 200, 250]
 */
export function niceTicks(min: number, max: number, maxCount: number): number[] {
  if (!Number.isFinite(min) || !Number.isFinite(max) || max < min || !(maxCount >= 1)) return [];
  if (max === min) return [min];
  // The finest 1-2-5 step that keeps the count within maxCount.
  const span = max - min;
  const power = 10 ** Math.floor(Math.log10(span / Math.max(1, Math.floor(maxCount))));
  const count = (step: number) => Math.floor(max / step + 1e-9) - Math.ceil(min / step - 1e-9) + 1;
  let step = power;
  for (const m of [1, 2, 5, 10, 20, 50, 100]) {
    step = m * power;
    if (count(step) <= maxCount) break;
  }
  const digits = Math.max(0, -Math.floor(Math.log10(step)));
  const out: number[] = [];
  for (let k = Math.ceil(min / step - 1e-9); k * step <= max + step * 1e-9; k++) out.push(Number((k * step).toFixed(digits)));
  return out;
}

/** How round a tick value is on a log axis: 0 for 1 × 10^k, 1 for 2 and 5, 2 for 3, 4, 6 and 8, 3 for 7 and 9, 4 otherwise. */
function roundness(v: number): number {
  const mantissa = Number((v / 10 ** Math.floor(Math.log10(v) + 1e-9)).toPrecision(6));
  if (mantissa === 1) return 0;
  if (mantissa === 2 || mantissa === 5) return 1;
  if ([3, 4, 6, 8].includes(mantissa)) return 2;
  if (mantissa === 7 || mantissa === 9) return 3;
  return 4;
}

/**
 * Which ticks of a logarithmic axis get a label: the roundest first (1, then 2 and 5, then
 * 3, 4, 6, 8, then 7 and 9), each only when it lies at least `minGap` pixels from every
 * label already chosen; a tick that is not a whole multiple of its decade (the end of a
 * padded range) gets none. `positions` are the ticks' pixel positions along the axis.
 * Returns one flag per tick.
 *
 * @example
 * logTickLabels([8, 9, 10, 20, 30, 40, 50, 60], [0, 12, 23, 100, 145, 177, 202, 222], 30);
 * // [false, false, true, true, true, false, true, false]: 10, 20, 30 and 50
 */
export function logTickLabels(values: readonly number[], positions: readonly number[], minGap: number): boolean[] {
  const order = values.map((_v, k) => k).filter((k) => values[k] > 0 && Number.isFinite(positions[k]) && roundness(values[k]) < 4)
    .sort((a, b) => roundness(values[a]) - roundness(values[b]) || a - b);
  const chosen: number[] = [];
  for (const k of order) {
    if (chosen.every((c) => Math.abs(positions[c] - positions[k]) >= minGap)) chosen.push(k);
  }
  return values.map((_v, k) => chosen.includes(k));
}
