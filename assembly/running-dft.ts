// What both engines (assembly/engine.ts, assembly/media.ts) do with the node field after a
// sweep, written once: the full-grid running DFTs, the probe series and the running DFTs at
// the listed points, and the largest magnitude for the blow-up watch. Every function is
// inlined into its caller with that engine's buffers, so the code each build runs is what
// it ran when these were written out in each engine; each node sees the same operations in
// the SIMD and the scalar build.

// The full-grid DFTs that take sample n, with its weights m·cos(ωn·dt), m·sin(ωn·dt) (a
// sample stands for m steps; src/exact/dft-decimation.ts says why that holds). `table`
// holds f64 ω·dt, i32 m, i32 r per frequency; `weights` gets i32 f, f32 m·cos, f32 m·sin per
// frequency sampled. Returns how many are sampled.
@inline export function prepareFullWeights(table: usize, count: i32, weights: usize, n: i32): i32 {
  let active = 0;
  for (let f = 0; f < count; f++) {
    const entry = table + (<usize>f << 4);
    const m = max(load<i32>(entry, 8), 1);
    if (n % m != load<i32>(entry, 12)) continue;
    const phase = load<f64>(entry) * <f64>n;
    const w = weights + (<usize>active << 4);
    store<i32>(w, f);
    store<f32>(w, <f32>(<f64>m * Math.cos(phase)), 4);
    store<f32>(w, <f32>(<f64>m * Math.sin(phase)), 8);
    active++;
  }
  return active;
}

// Running DFTs of the whole grid at the sample in hand: per frequency sampled, over every
// node k, re += field·c, im −= field·s (float32), with (c, s) the sample's weighted cosine
// and sine. One contiguous pass per frequency after the sweep: long streams run at memory
// speed, where row-sized pieces between the field updates ran at half of it. Frequency f's
// real part starts at fullRe + 2f·stride, its imaginary part one stride further.
@inline export function fullDftPass(field: usize, total: i32, weights: usize, active: i32, fullRe: usize, fullStride: usize): void {
  for (let q = 0; q < active; q++) {
    const w = weights + (<usize>q << 4);
    const c = load<f32>(w, 4);
    const s = load<f32>(w, 8);
    const re = fullRe + (<usize>(2 * load<i32>(w))) * fullStride;
    const im = re + fullStride;
    let k = 0;
    if (ASC_FEATURE_SIMD) {
      const cv = f32x4.splat(c);
      const sv = f32x4.splat(s);
      for (; k + 16 <= total; k += 16) {
        const o = <usize>k << 2;
        const v0 = v128.load(field + o);
        const v1 = v128.load(field + o, 16);
        const v2 = v128.load(field + o, 32);
        const v3 = v128.load(field + o, 48);
        v128.store(re + o, f32x4.add(v128.load(re + o), f32x4.mul(v0, cv)));
        v128.store(re + o, f32x4.add(v128.load(re + o, 16), f32x4.mul(v1, cv)), 16);
        v128.store(re + o, f32x4.add(v128.load(re + o, 32), f32x4.mul(v2, cv)), 32);
        v128.store(re + o, f32x4.add(v128.load(re + o, 48), f32x4.mul(v3, cv)), 48);
        v128.store(im + o, f32x4.sub(v128.load(im + o), f32x4.mul(v0, sv)));
        v128.store(im + o, f32x4.sub(v128.load(im + o, 16), f32x4.mul(v1, sv)), 16);
        v128.store(im + o, f32x4.sub(v128.load(im + o, 32), f32x4.mul(v2, sv)), 32);
        v128.store(im + o, f32x4.sub(v128.load(im + o, 48), f32x4.mul(v3, sv)), 48);
      }
    }
    for (; k < total; k++) {
      const o = <usize>k << 2;
      const v = load<f32>(field + o);
      store<f32>(re + o, load<f32>(re + o) + v * c);
      store<f32>(im + o, load<f32>(im + o) - v * s);
    }
  }
}

// Probe series and running DFTs at the listed points, for sample n of the node field.
// `series` holds seriesLength f32 per probe; `pointValue` is f64 scratch per point; `dft`
// holds f64 (re, im) per frequency per point, frequency-major.
@inline export function recordPoints(
  field: usize, n: i32, seriesLength: i32, probeCount: i32, probeIndex: usize, series: usize,
  frequencyCount: i32, pointCount: i32, pointIndex: usize, pointValue: usize, omegaDt: usize, dft: usize,
): void {
  if (n < seriesLength) {
    for (let p = 0; p < probeCount; p++) {
      const k = load<i32>(probeIndex + (<usize>p << 2));
      store<f32>(series + (<usize>(p * seriesLength + n) << 2), load<f32>(field + (<usize>k << 2)));
    }
  }
  if (frequencyCount == 0) return;
  for (let p = 0; p < pointCount; p++) {
    store<f64>(pointValue + (<usize>p << 3), <f64>load<f32>(field + (<usize>load<i32>(pointIndex + (<usize>p << 2)) << 2)));
  }
  for (let f = 0; f < frequencyCount; f++) {
    const phase = load<f64>(omegaDt + (<usize>f << 3)) * <f64>n;
    const c = Math.cos(phase);
    const s = Math.sin(phase);
    let acc = dft + ((<usize>f * <usize>pointCount) << 4);
    let p = 0;
    if (ASC_FEATURE_SIMD) {
      // (re, im) += v·(cos, −sin): v·(−sin) is exactly −(v·sin), so this is re + v·cos, im − v·sin.
      const w = f64x2(c, -s);
      for (; p < pointCount; p++) {
        const v = f64x2.splat(load<f64>(pointValue + (<usize>p << 3)));
        v128.store(acc, f64x2.add(v128.load(acc), f64x2.mul(v, w)));
        acc += 16;
      }
    }
    for (; p < pointCount; p++) {
      const v = load<f64>(pointValue + (<usize>p << 3));
      store<f64>(acc, load<f64>(acc) + v * c);
      store<f64>(acc + 8, load<f64>(acc + 8) - v * s);
      acc += 16;
    }
  }
}

// Largest |field| over `total` nodes; NaN if any node is NaN (blow-up detection).
@inline export function maxAbsOf(field: usize, total: i32): f32 {
  let m: f32 = 0;
  for (let k = 0; k < total; k++) {
    const v = load<f32>(field + (<usize>k << 2));
    if (v != v) return NaN;
    const x = Mathf.abs(v);
    if (x > m) m = x;
  }
  return m;
}
