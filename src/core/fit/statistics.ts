/**
 * Goodness of fit and parameter uncertainty at a least-squares optimum.
 *   covariance  = s²·(JᵀJ)⁻¹ with s² = SSR/(n − p), J = ∂r/∂θ in the ORIGINAL parameters θ
 *                 (Bates & Watts, Nonlinear Regression Analysis (1988), ch. 2, from memory);
 *   interval    = θ ± t_{(1+level)/2, n−p}·SE;
 *   R²          = 1 − SSR/SST in the residual space (weighted);
 *   RMSE        = √(SSR/n);
 *   AIC         = n·ln(SSR/n) + 2p (least-squares form, constants dropped: Burnham & Anderson,
 *                 Model Selection and Multimodel Inference (2002), ch. 2, from memory).
 */
import { inverseSpd, normalEquations } from "./linearAlgebra";
import { tQuantile } from "./studentT";

export interface FitStatistics {
  ssr: number;
  r2: number;
  rmse: number;
  aic: number;
  /** Standard errors of the free parameters (NaN when JᵀJ is singular). */
  standardErrors: Float64Array;
  /** Half-widths of the confidence intervals. */
  halfWidths: Float64Array;
  singular: boolean;
}

/**
 * @param jacobian ∂r_i/∂θ_j row-major (n×p), original parameters
 * @param residuals weighted residuals at the optimum
 * @param observed observations in the residual space (ln η or η) and their weights, for SST
 */
export function fitStatistics(
  jacobian: Float64Array,
  residuals: Float64Array,
  observed: Float64Array,
  weight: Float64Array,
  p: number,
  confidenceLevel: number,
): FitStatistics {
  const n = residuals.length;
  let ssr = 0;
  for (let i = 0; i < n; i++) ssr += (residuals[i] as number) ** 2;
  let sw = 0;
  let swy = 0;
  for (let i = 0; i < n; i++) {
    sw += weight[i] as number;
    swy += (weight[i] as number) * (observed[i] as number);
  }
  const mean = swy / sw;
  let sst = 0;
  for (let i = 0; i < n; i++) sst += (weight[i] as number) * ((observed[i] as number) - mean) ** 2;

  const dof = n - p;
  const s2 = ssr / dof;
  const buffer = new Float64Array(p * p + 3 * p); // one store: JᵀJ, Jᵀr (unused), SE, half-widths
  const jtj = buffer.subarray(0, p * p);
  const unused = buffer.subarray(p * p, p * p + p);
  const standardErrors = buffer.subarray(p * p + p, p * p + 2 * p).fill(NaN);
  const halfWidths = buffer.subarray(p * p + 2 * p).fill(NaN);
  normalEquations(jacobian, residuals, n, p, jtj, unused);
  const inv = inverseSpd(jtj, p);
  const t = tQuantile((1 + confidenceLevel) / 2, dof);
  if (inv) {
    for (let j = 0; j < p; j++) {
      standardErrors[j] = Math.sqrt(s2 * (inv[j * p + j] as number));
      halfWidths[j] = t * (standardErrors[j] as number);
    }
  }
  return {
    ssr,
    r2: sst > 0 ? 1 - ssr / sst : NaN,
    rmse: Math.sqrt(ssr / n),
    aic: n * Math.log(ssr / n) + 2 * p,
    standardErrors,
    halfWidths,
    singular: inv === undefined,
  };
}
