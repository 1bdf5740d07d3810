/** Builds parameter specifications; the one place the shared parameter names are described. */
import type { ParameterSpec } from "./types";

/** A parameter with a lower bound and optional upper bound (exclusive). */
export function parameter(
  name: string,
  unit: string,
  description: string,
  min: number,
  options: { minInclusive?: boolean; max?: number } = {},
): ParameterSpec {
  return { name, unit, description, min, minInclusive: options.minInclusive ?? false, max: options.max ?? Infinity };
}

/** Zero-shear viscosity η0 > 0 (Pa·s). */
export const ETA0 = parameter("eta0", "Pa.s", "zero-shear viscosity η0", 0);
/** Infinite-shear viscosity η∞ ≥ 0 (Pa·s). */
export const ETA_INF = parameter("etaInf", "Pa.s", "infinite-shear viscosity η∞", 0, { minInclusive: true });
/** Time constant λ > 0 (s). */
export const LAMBDA = parameter("lambda", "s", "time constant λ (inverse of the onset shear rate)", 0);
/** Flow (power-law) index n > 0 (dimensionless). */
export const N_INDEX = parameter("n", "1", "flow index n (high-rate slope of log η is n − 1)", 0);
/** Consistency K > 0 (Pa·s^n). */
export const CONSISTENCY = parameter("K", "Pa.s^n", "consistency K", 0);
/** Yield stress τy ≥ 0 (Pa). */
export const TAU_Y = parameter("tauY", "Pa", "yield stress τy", 0, { minInclusive: true });
