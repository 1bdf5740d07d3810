/**
 * Maps between a model parameter p and the unconstrained variable u the solver moves, so that
 * every trial point is physical without clipping:
 *   - lower bound only:  p = min + e^u          (log; the usual case min = 0)
 *   - both bounds:       p = min + (max − min)/(1 + e^−u)   (logistic)
 * A bound that is physical itself (η∞ = 0, τy = 0) is approached but never reached; a fit that
 * runs onto it is reported with a warning.
 */
import type { ParameterSpec } from "../models";

export interface Transform {
  toFree(p: number): number;
  fromFree(u: number): number;
  /** dp/du at u. */
  derivative(u: number): number;
}

/** The transform for a parameter's bounds. */
export function transformFor(spec: ParameterSpec): Transform {
  const { min, max } = spec;
  if (Number.isFinite(max)) {
    const width = max - min;
    return {
      toFree: (p) => Math.log((p - min) / (max - p)),
      fromFree: (u) => min + width / (1 + Math.exp(-u)),
      derivative: (u) => {
        const s = 1 / (1 + Math.exp(-u));
        return width * s * (1 - s);
      },
    };
  }
  return {
    toFree: (p) => Math.log(p - min),
    fromFree: (u) => min + Math.exp(u),
    derivative: (u) => Math.exp(u),
  };
}
