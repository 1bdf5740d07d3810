/**
 * The residuals of a viscosity-curve fit and their Jacobians:
 *   log space:    r_i = √w_i·(ln η_model,i − ln η_i)
 *   linear space: r_i = √w_i·(η_model,i − η_i)
 * in the solver's transformed coordinates u (for the iterations) and in the original parameters
 * (for the covariance and the bound test). The iterations use the model's whole-curve fast path
 * (ModelDefinition.logCurve) when it has one, and its per-point functions otherwise.
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
  const { rates, logRate, temperature, sqrtWeight, logViscosity, viscosity } = setup;
  const n = rates.length;
  const k = freeIndex.length;
  const parameterCount = def.parameters.length;
  const curve = def.logCurve;
  // The fast path writes ln η into `residuals` and its gradient (n × parameters) straight into
  // `jacobian` when every parameter is free, in model order; otherwise into a scratch store made
  // on first use. Each is then turned into r and ∂r/∂u in place.
  const direct = k === parameterCount && freeIndex.every((j, f) => j === f);
  let scratch: Float64Array | undefined;
  const columns = Int32Array.from(freeIndex);
  const p = Float64Array.from(base);
  const gradient = new Float64Array(def.parameters.length);
  const dpdu = new Float64Array(k);
  const bounded = transforms.some((t) => t.lower > -Infinity);
  const logSpace = space === "log";

  /**
   * Turns the fast path's ln η (in `residuals`) and ∂ln η/∂p (in `modelGradient`, n × parameters)
   * into r and ∂r/∂u in place; false when some value is not finite.
   */
  /**
   * Writes r_i from the model's ln η at point i and returns ∂r_i/∂ln η (the weight, times η for
   * linear residuals); NaN when r_i is not finite.
   */
  const residualAt = (i: number, lnEta: number, residuals: Float64Array): number => {
    const sw = sqrtWeight[i] as number;
    let r: number;
    let scale = sw;
    if (logSpace) {
      r = sw * (lnEta - (logViscosity[i] as number));
    } else {
      const eta = Math.exp(lnEta);
      r = sw * (eta - (viscosity[i] as number));
      scale = sw * eta;
    }
    if (!Number.isFinite(r)) return NaN;
    residuals[i] = r;
    return scale;
  };

  const fromLogCurve = (residuals: Float64Array, jacobian: Float64Array | null, modelGradient: Float64Array | null): boolean => {
    for (let i = 0; i < n; i++) {
      const scale = residualAt(i, residuals[i] as number, residuals);
      if (Number.isNaN(scale)) return false;
      if (!jacobian || !modelGradient) continue;
      const row = i * k;
      const from = i * parameterCount;
      for (let f = 0; f < k; f++) {
        const v = scale * (modelGradient[from + (columns[f] as number)] as number) * (dpdu[f] as number);
        if (!Number.isFinite(v)) return false;
        jacobian[row + f] = v;
      }
    }
    return true;
  };

  return {
    residualCount: n,
    parameterCount: k,
    lowerBounds: bounded ? Float64Array.from(transforms, (t) => t.lower) : undefined,
    evaluate(u, residuals, jacobian) {
      for (let f = 0; f < k; f++) {
        const t = transforms[f] as Transform;
        p[columns[f] as number] = t.fromFree(u[f] as number);
        dpdu[f] = t.derivative(u[f] as number);
      }
      if (curve) {
        const modelGradient = !jacobian ? null : direct ? jacobian : (scratch ??= new Float64Array(n * parameterCount));
        curve(p, logRate, temperature, residuals, modelGradient);
        return fromLogCurve(residuals, jacobian, modelGradient);
      }
      if (!jacobian) {
        for (let i = 0; i < n; i++) {
          const lnEta = def.logViscosity(p, rates[i] as number, temperature[i] as number);
          const v = logSpace ? lnEta - (logViscosity[i] as number) : Math.exp(lnEta) - (viscosity[i] as number);
          const r = (sqrtWeight[i] as number) * v;
          if (!Number.isFinite(r)) return false;
          residuals[i] = r;
        }
        return true;
      }
      for (let i = 0; i < n; i++) {
        const scale = residualAt(i, def.logGradient(p, rates[i] as number, temperature[i] as number, gradient), residuals);
        if (Number.isNaN(scale)) return false;
        const row = i * k;
        for (let f = 0; f < k; f++) {
          const v = scale * (gradient[columns[f] as number] as number) * (dpdu[f] as number);
          if (!Number.isFinite(v)) return false;
          jacobian[row + f] = v;
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
  const buffer = new Float64Array(n + n * k + k); // one store for the three results
  const residuals = buffer.subarray(0, n);
  const jacobian = buffer.subarray(n, n + n * k);
  const influence = buffer.subarray(n + n * k);
  const gradient = new Float64Array(def.parameters.length);
  const { rates, temperature, sqrtWeight, logViscosity, viscosity } = setup;
  const logSpace = space === "log";
  for (let i = 0; i < n; i++) {
    const sw = sqrtWeight[i] as number;
    const lnEta = def.logGradient(p, rates[i] as number, temperature[i] as number, gradient);
    let scale = sw;
    if (logSpace) {
      residuals[i] = sw * (lnEta - (logViscosity[i] as number));
    } else {
      const eta = Math.exp(lnEta);
      residuals[i] = sw * (eta - (viscosity[i] as number));
      scale = sw * eta;
    }
    const row = i * k;
    for (let c = 0; c < k; c++) {
      const j = columns[c] as number;
      const g = gradient[j] as number;
      jacobian[row + c] = scale * g;
      influence[c] = Math.max(influence[c] as number, Math.abs(g * (p[j] as number)));
    }
  }
  return { residuals, jacobian, influence };
}
