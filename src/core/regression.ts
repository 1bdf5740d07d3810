/**
 * Least-squares straight lines and polynomials, with the statistics the corrections need.
 * Lines from centred sums, b = Sxy/Sxx, a = ȳ − b·x̄, with the standard errors of the
 * coefficients (Draper & Smith, Applied Regression Analysis, 3rd ed. (1998), ch. 1; from memory);
 * polynomials from the Householder QR of ./linearLeastSquares.
 * Why not ml-regression-simple-linear (used here before): it gave slope and intercept only (this
 * module needs the means, Sxx and residuals anyway), and from raw one-pass sums
 * (nΣxy − ΣxΣy)/(nΣx² − (Σx)²), which cancel catastrophically when x carries a large offset
 * (docs/numerics.md; test/regression.test.ts).
 */
import { leastSquares } from "./linearLeastSquares";

/** A fitted line y = intercept + slope·x. Standard errors are NaN-free: 0 when n = 2. */
export interface LineFit {
  slope: number;
  intercept: number;
  /** coefficient of determination; 1 for two points */
  r2: number;
  /** standard error of the slope, from s² = SSR/(n−2); 0 for two points (no degrees of freedom) */
  slopeStandardError: number;
  /** standard error of the intercept */
  interceptStandardError: number;
  /** number of points */
  n: number;
  /** residuals y − ŷ, in input order */
  residuals: number[];
}

/**
 * Ordinary least-squares line through (x, y) from centred sums: b = Sxy/Sxx, a = ȳ − b·x̄, with
 * SE(b) = √(s²/Sxx), SE(a) = √(s²(1/n + x̄²/Sxx)), s² = Σr²/(n−2).
 * Caller guarantees n ≥ 2 and that x is not constant.
 * @example fitLine([1, 2, 3], [3, 5, 7]) // slope 2, intercept 1, r2 1
 */
export function fitLine(x: number[], y: number[]): LineFit {
  const n = x.length;
  const meanX = x.reduce((s, v) => s + v, 0) / n;
  const meanY = y.reduce((s, v) => s + v, 0) / n;
  let sxx = 0;
  let sxy = 0;
  let sst = 0;
  for (let i = 0; i < n; i++) {
    const dx = (x[i] as number) - meanX;
    const dy = (y[i] as number) - meanY;
    sxx += dx * dx;
    sxy += dx * dy;
    sst += dy * dy;
  }
  const slope = sxy / sxx;
  const intercept = meanY - slope * meanX;
  let ssr = 0;
  const residuals: number[] = [];
  for (let i = 0; i < n; i++) {
    const r = (y[i] as number) - (intercept + slope * (x[i] as number));
    residuals.push(r);
    ssr += r * r;
  }
  const r2 = sst === 0 ? 1 : 1 - ssr / sst;
  const s2 = n > 2 ? ssr / (n - 2) : 0;
  return {
    slope,
    intercept,
    r2,
    slopeStandardError: Math.sqrt(s2 / sxx),
    interceptStandardError: Math.sqrt(s2 * (1 / n + (meanX * meanX) / sxx)),
    n,
    residuals,
  };
}

/**
 * Least-squares polynomial y = Σ c_k (x − x0)^k, k = 0..degree, centred on x0 for conditioning
 * (Householder QR of the Vandermonde matrix: {@link leastSquares}). Returns the coefficients
 * c_0..c_degree; a power the data cannot determine (fewer distinct x than degree + 1) gets 0.
 * @example fitPolynomial([0, 1, 2], [1, 3, 7], 2) // [1, 1, 1] (y = 1 + x + x²)
 */
export function fitPolynomial(x: number[], y: number[], degree: number, x0 = 0): number[] {
  const shifted = x.map((v) => v - x0);
  const columns = Array.from({ length: degree + 1 }, (_, k) => shifted.map((t) => t ** k));
  return leastSquares(columns, y);
}

/** Value of Σ c_k t^k. */
export function polynomialValue(coefficients: number[], t: number): number {
  let v = 0;
  for (let k = coefficients.length - 1; k >= 0; k--) v = v * t + (coefficients[k] as number);
  return v;
}

/** Value of d/dt Σ c_k t^k = Σ k c_k t^(k−1). */
export function polynomialSlope(coefficients: number[], t: number): number {
  let v = 0;
  for (let k = coefficients.length - 1; k >= 1; k--) v = v * t + k * (coefficients[k] as number);
  return v;
}
