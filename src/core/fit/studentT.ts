/**
 * Quantiles of Student's t and of the standard normal distribution.
 *
 * tQuantile follows Hill, "Algorithm 396: Student's t-quantiles", Comm. ACM 13 (1970) 619,
 * which is exact for 1 and 2 degrees of freedom and accurate to about 1e-5 relative beyond
 * (worst 7e-6 against scipy.stats.t.ppf over p 0.025–0.995, dof 1–1000: see the tests). Its normal deviate comes from
 * normalQuantile: Acklam's rational approximation (relative error < 1.15e-9; P. J. Acklam,
 * "An algorithm for computing the inverse normal cumulative distribution function", 2003).
 */
import { RheoError } from "../errors";

/**
 * The p-quantile of Student's t with `dof` degrees of freedom (p in (0, 1), dof ≥ 1, may be
 * non-integer ≥ 1 in principle but is tested for integers).
 * @throws RheoError(kind "domain") for p outside (0, 1) or dof < 1.
 * @example tQuantile(0.975, 10) // 2.228 (two-sided 95 % with 10 dof)
 */
export function tQuantile(p: number, dof: number): number {
  if (!(p > 0 && p < 1)) throw new RheoError("domain", "p", `must be between 0 and 1, got ${p}`);
  if (!(dof >= 1) || !Number.isFinite(dof)) throw new RheoError("domain", "dof", `must be at least 1, got ${dof}`);
  if (p === 0.5) return 0;
  const upper = p > 0.5;
  const twoTailed = 2 * (upper ? 1 - p : p); // P(|T| > t)
  const t = hillTwoTailed(twoTailed, dof);
  return upper ? t : -t;
}

/** Hill (1970) Algorithm 396: t with P(|T| > t) = pp for n degrees of freedom. */
function hillTwoTailed(pp: number, n: number): number {
  const halfPi = Math.PI / 2;
  if (n === 1) return Math.cos(pp * halfPi) / Math.sin(pp * halfPi);
  if (n === 2) return Math.sqrt(2 / (pp * (2 - pp)) - 2);
  const a = 1 / (n - 0.5);
  const b = 48 / (a * a);
  let c = (((20700 * a) / b - 98) * a - 16) * a + 96.36;
  const d = ((94.5 / (b + c) - 3) / b + 1) * Math.sqrt(a * halfPi) * n;
  let x = d * pp;
  let y = Math.pow(x, 2 / n);
  if (y > 0.05 + a) {
    x = -normalQuantile(0.5 * pp); // lower-tail deviate, as in Hill's NORMDEV
    y = x * x;
    if (n < 5) c += 0.3 * (n - 4.5) * (x + 0.6);
    c = (((0.05 * d * x - 5) * x - 7) * x - 2) * x + b + c;
    y = (((((0.4 * y + 6.3) * y + 36) * y + 94.5) / c - y - 3) / b + 1) * x;
    y = Math.expm1(a * y * y);
  } else {
    y = ((1 / ((((n + 6) / (n * y) - 0.089 * d - 0.822) * (n + 2) * 3)) + 0.5 / (n + 4)) * y - 1) * ((n + 1) / (n + 2)) + 1 / y;
  }
  return Math.sqrt(n * y);
}

const A = [-3.969683028665376e1, 2.209460984245205e2, -2.759285104469687e2, 1.38357751867269e2, -3.066479806614716e1, 2.506628277459239];
const B = [-5.447609879822406e1, 1.615858368580409e2, -1.556989798598866e2, 6.680131188771972e1, -1.328068155288572e1];
const C = [-7.784894002430293e-3, -3.223964580411365e-1, -2.400758277161838, -2.549732539343734, 4.374664141464968, 2.938163982698783];
const D = [7.784695709041462e-3, 3.224671290700398e-1, 2.445134137142996, 3.754408661907416];

function poly(c: number[], x: number): number {
  let s = 0;
  for (const v of c) s = s * x + v;
  return s;
}

/**
 * Upper-tail standard normal deviate: z with P(Z > z) = q (so normalQuantile(0.025) = 1.959964).
 * Acklam's rational approximation, relative error < 1.15e-9.
 */
export function normalQuantile(q: number): number {
  const p = 1 - q; // lower-tail probability of the wanted deviate
  let z: number;
  if (p < 0.02425) {
    const s = Math.sqrt(-2 * Math.log(p));
    z = poly(C, s) / (poly(D, s) * s + 1);
  } else if (p > 1 - 0.02425) {
    const s = Math.sqrt(-2 * Math.log(q));
    z = -poly(C, s) / (poly(D, s) * s + 1);
  } else {
    const s = p - 0.5;
    const r = s * s;
    z = (poly(A, r) * s) / (poly(B, r) * r + 1);
  }
  return z;
}

