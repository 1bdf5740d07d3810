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

/** Median of a list (sorted copy; NaN for an empty list). */
export function median(values: number[]): number {
  return percentile(values, 0.5);
}

/**
 * The q-quantile (0…1) by linear interpolation between order statistics (the "type 7" rule of
 * Hyndman & Fan, Am. Stat. 50 (1996) 361, numpy's default).
 * @example percentile([1, 2, 3, 4], 0.5) // 2.5
 */
export function percentile(values: number[], q: number): number {
  if (values.length === 0) return NaN;
  const s = Float64Array.from(values).sort();
  const h = (s.length - 1) * q;
  const lo = Math.floor(h);
  const hi = Math.min(s.length - 1, lo + 1);
  return (s[lo] as number) + (h - lo) * ((s[hi] as number) - (s[lo] as number));
}

/**
 * White-noise standard deviation of samples [from, to] (see the module comment); 0 for fewer
 * than three samples.
 */
export function whiteNoise(values: ArrayLike<number>, from: number, to: number): number {
  if (to - from < 2) return 0;
  const d: number[] = [];
  for (let i = from + 1; i <= to; i++) d.push((values[i] as number) - (values[i - 1] as number));
  const m = median(d);
  const mad = median(d.map((x) => Math.abs(x - m)));
  return (1.4826 * mad) / Math.SQRT2;
}
