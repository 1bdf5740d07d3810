/** Strict checks of the data handed to the fits; nothing is patched. */
import { RheoError, requireFinite, requirePositive } from "../errors";

/** Data for a viscosity-curve fit, SI: γ̇ (1/s), η (Pa·s), T (K), dimensionless weights. */
export interface FitData {
  shearRate: readonly number[];
  viscosity: readonly number[];
  /** One temperature per point (needed by `cross-wlf`). */
  temperature?: readonly number[];
  /** One weight ≥ 0 per point, multiplying the squared residual; 0 excludes a point. */
  weights?: readonly number[];
}

function requireArray(value: unknown, argument: string): readonly number[] {
  if (!Array.isArray(value)) throw new RheoError("value", argument, `must be an array of numbers, got ${typeof value}`);
  return value as readonly number[];
}

function requireSameLength(values: readonly number[], argument: string, count: number): void {
  if (values.length !== count) {
    throw new RheoError("value", argument, `has ${values.length} values but shearRate has ${count}`);
  }
}

/**
 * Checks lengths and values of fit data.
 * @throws RheoError naming the argument and the 1-based row: non-finite entries (`value`),
 *   non-positive rates, viscosities or temperatures and negative weights (`domain`), arrays of
 *   different lengths (`value`), no points (`missing`).
 */
export function validateFitData(data: FitData): void {
  if (typeof data !== "object" || data === null) throw new RheoError("value", "data", "must be an object with shearRate and viscosity arrays");
  const rates = requireArray(data.shearRate, "shearRate");
  const etas = requireArray(data.viscosity, "viscosity");
  if (rates.length === 0) throw new RheoError("missing", "shearRate", "has no points");
  requireSameLength(etas, "viscosity", rates.length);
  rates.forEach((v, i) => requirePositive(v, "shearRate", i + 1));
  etas.forEach((v, i) => requirePositive(v, "viscosity", i + 1));
  if (data.temperature !== undefined) {
    const temps = requireArray(data.temperature, "temperature");
    requireSameLength(temps, "temperature", rates.length);
    temps.forEach((v, i) => requirePositive(v, "temperature", i + 1));
  }
  if (data.weights !== undefined) {
    const weights = requireArray(data.weights, "weights");
    requireSameLength(weights, "weights", rates.length);
    weights.forEach((w, i) => {
      requireFinite(w, "weights", i + 1);
      if (w < 0) throw new RheoError("domain", "weights", `must not be negative, got ${w}`, i + 1);
    });
  }
}
