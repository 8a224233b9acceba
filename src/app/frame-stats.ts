/** Figures of an Ez frame that the field view needs for its colour scale and replay. */
export interface FrameStats {
  /** Largest |Ez| in the frame, V/m. */
  peak: number;
  /**
   * The 99th percentile of |Ez| over the nodes the wave has reached (|Ez| above 10⁻⁴ of
   * the peak), V/m, so the few nodes beside the source do not wash out the picture.
   */
  robust: number;
  /** Σ Ez² over the frame, (V/m)²: rises while the source drives, falls as the absorber takes the wave. */
  sumSquares: number;
}

/** Peak, robust scale (from a 512-bin histogram) and Σ Ez² of a frame. */
export function frameStats(data: Float32Array): FrameStats {
  let peak = 0;
  let sumSquares = 0;
  for (let k = 0; k < data.length; k++) {
    const v = data[k];
    sumSquares += v * v;
    const a = Math.abs(v);
    if (a > peak) peak = a;
  }
  if (!(peak > 0)) return { peak: 0, robust: 0, sumSquares };
  const bins = new Uint32Array(512);
  const scale = 511 / peak;
  const floor = peak * 1e-4;
  let reached = 0;
  for (let k = 0; k < data.length; k++) {
    const a = Math.abs(data[k]);
    if (a > floor) { bins[Math.floor(a * scale)]++; reached++; }
  }
  const target = reached * 0.99;
  let sum = 0;
  for (let b = 0; b < 512; b++) {
    sum += bins[b];
    if (sum >= target) return { peak, robust: Math.max(((b + 1) / 511) * peak, peak * 0.02), sumSquares };
  }
  return { peak, robust: peak, sumSquares };
}
