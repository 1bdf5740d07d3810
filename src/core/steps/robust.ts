/**
 * Small robust statistics for step detection: the median, a percentile, and the white-noise level
 * of a record from its successive differences.
 *
 * White noise: for independent samples of standard deviation σ the successive differences have
 * standard deviation σ√2 (von Neumann et al., Ann. Math. Statist. 12 (1941) 367; from memory); their
 * median absolute deviation × 1.4826 estimates that for a normal distribution while ignoring the
 * few large jumps of a speed change or a stick–slip drop (Rousseeuw & Croux, J. Am. Stat. Assoc.
 * 88 (1993) 1273; from memory). So σ ≈ 1.4826·MAD(Δp)/√2.
 */

/** Median of a list (NaN for an empty list); the input is not changed. */
export function median(values: ArrayLike<number>): number {
  return percentile(values, 0.5);
}

/**
 * The q-quantile (0…1) by linear interpolation between order statistics (the "type 7" rule of
 * Hyndman & Fan, Am. Stat. 50 (1996) 361, numpy's default). Selection in O(n) on average
 * (Hoare's quickselect, Comm. ACM 4 (1961) 321) rather than a full sort.
 * @example percentile([1, 2, 3, 4], 0.5) // 2.5
 */
export function percentile(values: ArrayLike<number>, q: number): number {
  const n = values.length;
  if (n === 0) return NaN;
  const a = Float64Array.from(values);
  const h = (n - 1) * q;
  const lo = Math.floor(h);
  const low = select(a, lo);
  if (h === lo || lo + 1 >= n) return low;
  // after selecting lo, every element right of it is ≥ a[lo]: the next order statistic is their minimum
  let next = Infinity;
  for (let i = lo + 1; i < n; i++) if ((a[i] as number) < next) next = a[i] as number;
  return low + (h - lo) * (next - low);
}

/** Rearranges `a` so that a[k] is its k-th smallest value (0-based), smaller ones left of it; returns a[k]. */
function select(a: Float64Array, k: number): number {
  let left = 0;
  let right = a.length - 1;
  while (right > left) {
    const pivot = a[(left + right) >> 1] as number;
    let i = left;
    let j = right;
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
    if (k <= j) right = j;
    else if (k >= i) left = i;
    else break;
  }
  return a[k] as number;
}

/**
 * White-noise standard deviation of samples [from, to] (see the module comment); 0 for fewer
 * than three samples.
 */
export function whiteNoise(values: ArrayLike<number>, from: number, to: number): number {
  if (to - from < 2) return 0;
  const d = new Float64Array(to - from);
  for (let i = from + 1; i <= to; i++) d[i - from - 1] = (values[i] as number) - (values[i - 1] as number);
  const m = median(d);
  for (let i = 0; i < d.length; i++) d[i] = Math.abs((d[i] as number) - m);
  const mad = median(d);
  return (1.4826 * mad) / Math.SQRT2;
}
