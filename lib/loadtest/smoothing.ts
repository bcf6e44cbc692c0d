/**
 * Centred moving averages over a time window: each output sample is the mean of the samples within
 * ±window/2 of it. The window bounds are found once and shared by all signals. Running sums are
 * kept relative to each signal's first value, so a constant signal comes out exactly constant.
 */
export function movingAverages(time: Float64Array, signals: readonly Float64Array[], windowS: number): Float64Array[] {
  const n = time.length;
  const loAt = new Int32Array(n);
  const hiAt = new Int32Array(n);
  // A millionth of slack, so a sample exactly on either window edge is counted on both sides alike
  // (t + half and t − half round differently in floating point).
  const half = (windowS / 2) * (1 + 1e-6);
  let lo = 0;
  let hi = 0;
  for (let i = 0; i < n; i++) {
    const t = time[i] as number;
    while ((time[lo] as number) < t - half) lo++;
    if (hi < i) hi = i;
    while (hi + 1 < n && (time[hi + 1] as number) <= t + half) hi++;
    loAt[i] = lo;
    hiAt[i] = hi;
  }
  return signals.map((x) => averageOver(x, loAt, hiAt));
}

function averageOver(x: Float64Array, loAt: Int32Array, hiAt: Int32Array): Float64Array {
  const n = x.length;
  const out = new Float64Array(n);
  if (n === 0) return out;
  const base = x[0] as number;
  let sum = 0;
  let lo = 0;
  let hi = -1;
  for (let i = 0; i < n; i++) {
    const h = hiAt[i] as number;
    const l = loAt[i] as number;
    while (hi < h) sum += (x[++hi] as number) - base;
    while (lo < l) sum -= (x[lo++] as number) - base;
    out[i] = base + sum / (h - l + 1);
  }
  return out;
}

export function movingAverage(time: Float64Array, values: Float64Array, windowS: number): Float64Array {
  return movingAverages(time, [values], windowS)[0] as Float64Array;
}
