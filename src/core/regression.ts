/**
 * Least-squares straight lines and polynomials, with the statistics the corrections need.
 * Lines come from mljs (ml-regression-simple-linear), polynomials from the Householder QR of
 * ./linearLeastSquares; this module adds the standard errors of the coefficients
 * (Draper & Smith, Applied Regression Analysis, 3rd ed. 1998, §1.4 and §3.1).
 */
// The sub-package, not the ml-regression umbrella (which pulls every mljs regression into the
// worksheet-function bundle); polynomials without ml-regression-polynomial, whose ml-matrix was
// ~70 KB of that bundle's 150 KB budget (see linearLeastSquares.ts).
import { SimpleLinearRegression } from "ml-regression-simple-linear";
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
 * Ordinary least-squares line through (x, y) (ml-regression SimpleLinearRegression), with
 * SE(b) = √(s²/Sxx), SE(a) = √(s²(1/n + x̄²/Sxx)), s² = Σr²/(n−2).
 * Caller guarantees n ≥ 2 and that x is not constant.
 */
export function fitLine(x: number[], y: number[]): LineFit {
  const n = x.length;
  const reg = new SimpleLinearRegression(x, y);
  const slope = reg.slope;
  const intercept = reg.intercept;
  const meanX = x.reduce((s, v) => s + v, 0) / n;
  const meanY = y.reduce((s, v) => s + v, 0) / n;
  let sxx = 0;
  let ssr = 0;
  let sst = 0;
  const residuals: number[] = [];
  for (let i = 0; i < n; i++) {
    const xi = x[i] as number;
    const yi = y[i] as number;
    const r = yi - (intercept + slope * xi);
    residuals.push(r);
    sxx += (xi - meanX) ** 2;
    ssr += r * r;
    sst += (yi - meanY) ** 2;
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
