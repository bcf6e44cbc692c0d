/** Median of the first `n` values of `a` (reorders them). Quickselect: O(n) on average, no full sort. */
export function medianInPlace(a: Float64Array, n: number = a.length): number {
  if (n === 0) return NaN;
  const kth = (k: number): number => {
    let lo = 0;
    let hi = n - 1;
    while (lo < hi) {
      const pivot = a[(lo + hi) >>> 1] as number;
      let i = lo;
      let j = hi;
      while (i <= j) {
        while ((a[i] as number) < pivot) i++;
        while ((a[j] as number) > pivot) j--;
        if (i <= j) {
          const t = a[i] as number;
          a[i] = a[j] as number;
          a[j] = t;
          i++;
          j--;
        }
      }
      if (k <= j) hi = j;
      else if (k >= i) lo = i;
      else return a[k] as number;
    }
    return a[k] as number;
  };
  const mid = n >>> 1;
  if (n % 2 === 1) return kth(mid);
  const upper = kth(mid);
  // After selecting `mid`, everything before it is ≤ a[mid]; the lower middle is their maximum.
  let lower = -Infinity;
  for (let i = 0; i < mid; i++) if ((a[i] as number) > lower) lower = a[i] as number;
  return (lower + upper) / 2;
}
