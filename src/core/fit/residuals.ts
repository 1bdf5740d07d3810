/**
 * The residuals of a viscosity-curve fit and their Jacobians:
 *   log space:    r_i = √w_i·(ln η_model,i − ln η_i)
 *   linear space: r_i = √w_i·(η_model,i − η_i)
 * in the solver's transformed coordinates u (for the iterations) and in the original parameters
 * (for the covariance and the bound test).
 */
import type { ModelDefinition } from "../models";
import type { LeastSquaresProblem } from "./levenbergMarquardt";
import type { ResidualSpace } from "./options";
import type { FitSetup } from "./setup";
import type { Transform } from "./transforms";

/** The least-squares problem in u for the free parameters `freeIndex` (others held at `base`). */
export function residualProblem(
  def: ModelDefinition,
  setup: FitSetup,
  space: ResidualSpace,
  freeIndex: readonly number[],
  transforms: readonly Transform[],
  base: Float64Array,
): LeastSquaresProblem {
  const { rates, temperature, sqrtWeight, logViscosity, viscosity } = setup;
  const k = freeIndex.length;
  const p = Float64Array.from(base);
  const gradient = new Float64Array(def.parameters.length);
  const dpdu = new Float64Array(k);
  return {
    residualCount: rates.length,
    parameterCount: k,
    evaluate(u, residuals, jacobian) {
      for (let f = 0; f < k; f++) {
        const t = transforms[f] as Transform;
        p[freeIndex[f] as number] = t.fromFree(u[f] as number);
        dpdu[f] = t.derivative(u[f] as number);
      }
      for (let i = 0; i < rates.length; i++) {
        const sw = sqrtWeight[i] as number;
        const lnEta = jacobian
          ? def.logGradient(p, rates[i] as number, temperature[i] as number, gradient)
          : def.logViscosity(p, rates[i] as number, temperature[i] as number);
        let scale: number;
        if (space === "log") {
          residuals[i] = sw * (lnEta - (logViscosity[i] as number));
          scale = sw;
        } else {
          const eta = Math.exp(lnEta);
          residuals[i] = sw * (eta - (viscosity[i] as number));
          scale = sw * eta;
        }
        if (!Number.isFinite(residuals[i] as number)) return false;
        if (jacobian) {
          for (let f = 0; f < k; f++) {
            const v = scale * (gradient[freeIndex[f] as number] as number) * (dpdu[f] as number);
            if (!Number.isFinite(v)) return false;
            jacobian[i * k + f] = v;
          }
        }
      }
      return true;
    },
  };
}

/**
 * Residuals at `p` and ∂r_i/∂p_j (original parameters, row-major n×k over `columns`), plus the
 * relative influence max_i |∂ln η_i/∂ln p_j| of each column.
 */
export function originalJacobian(
  def: ModelDefinition,
  setup: FitSetup,
  space: ResidualSpace,
  p: Float64Array,
  columns: readonly number[],
): { residuals: Float64Array; jacobian: Float64Array; influence: Float64Array } {
  const n = setup.rates.length;
  const k = columns.length;
  const residuals = new Float64Array(n);
  const jacobian = new Float64Array(n * k);
  const influence = new Float64Array(k);
  const gradient = new Float64Array(def.parameters.length);
  for (let i = 0; i < n; i++) {
    const sw = setup.sqrtWeight[i] as number;
    const lnEta = def.logGradient(p, setup.rates[i] as number, setup.temperature[i] as number, gradient);
    const eta = Math.exp(lnEta);
    residuals[i] = space === "log" ? sw * (lnEta - (setup.logViscosity[i] as number)) : sw * (eta - (setup.viscosity[i] as number));
    const scale = space === "log" ? sw : sw * eta;
    columns.forEach((j, c) => {
      const g = gradient[j] as number;
      jacobian[i * k + c] = scale * g;
      influence[c] = Math.max(influence[c] as number, Math.abs(g * (p[j] as number)));
    });
  }
  return { residuals, jacobian, influence };
}
