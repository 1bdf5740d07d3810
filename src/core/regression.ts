/**
 * Least-squares straight lines and polynomials, with the statistics the corrections need.
 * The fits themselves come from ml-regression; this module adds the standard errors of the
 * coefficients (Draper & Smith, Applied Regression Analysis, 3rd ed. 1998, §1.4 and §3.1).
 */
import { PolynomialRegression, SimpleLinearRegression } from "ml-regression";

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
 * Least-squares polynomial y = Σ c_k (x − x0)^k, k = 0..degree (ml-regression
 * PolynomialRegression), centred on x0 for conditioning. Returns the coefficients c_0..c_degree.
 */
export function fitPolynomial(x: number[], y: number[], degree: number, x0 = 0): number[] {
  const shifted = x.map((v) => v - x0);
  const reg = new PolynomialRegression(shifted, y, degree);
  const coefficients = new Array<number>(degree + 1).fill(0);
  reg.powers.forEach((p, i) => {
    coefficients[p] = reg.coefficients[i] as number;
  });
  return coefficients;
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
