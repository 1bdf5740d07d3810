/**
 * Piecewise-linear interpolation in log–log coordinates, the usual way to bring points measured
 * at slightly different rates (or stresses) to common values (ISO 11443 permits interpolation
 * between neighbouring measurements; from memory).
 */

/**
 * Interpolates y(x) linearly in (ln x, ln y) between the two bracketing points.
 * Returns undefined outside [min x, max x] (no extrapolation). x must be > 0 and y > 0.
 * @param xs abscissae (any order)
 * @param ys ordinates, same length
 * @example interpolateLogLog([1, 100], [10, 1000], 10) // 100
 */
export function interpolateLogLog(xs: number[], ys: number[], x: number): number | undefined {
  const order = xs.map((_, i) => i).sort((a, b) => (xs[a] as number) - (xs[b] as number));
  const first = order[0];
  const last = order[order.length - 1];
  if (first === undefined || last === undefined) return undefined;
  const lo = xs[first] as number;
  const hi = xs[last] as number;
  const relTol = 1e-9;
  if (x < lo * (1 - relTol) || x > hi * (1 + relTol)) return undefined;
  for (let k = 0; k < order.length; k++) {
    const i = order[k] as number;
    const xi = xs[i] as number;
    if (Math.abs(xi - x) <= relTol * x) return ys[i] as number;
    const j = order[k + 1];
    if (j === undefined) break;
    const xj = xs[j] as number;
    if (x > xi && x < xj) {
      const t = (Math.log(x) - Math.log(xi)) / (Math.log(xj) - Math.log(xi));
      return Math.exp(Math.log(ys[i] as number) * (1 - t) + Math.log(ys[j] as number) * t);
    }
  }
  return undefined;
}

/**
 * Geometric mean of positive values; exactly the common value when all are equal (so repeated
 * identical readings keep their printed digits).
 * @example geometricMean([10, 1000]) // 100
 */
export function geometricMean(values: readonly number[]): number {
  const first = values[0] as number;
  if (values.every((v) => v === first)) return first;
  return Math.exp(values.reduce((s, v) => s + Math.log(v), 0) / values.length);
}
