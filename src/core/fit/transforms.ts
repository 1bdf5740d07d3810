/**
 * Maps between a model parameter p and the variable u the solver moves, so that every trial
 * point is physical without clipping:
 *   - lower bound only:  p = min + e^u          (log; the usual case min = 0)
 *   - both bounds:       p = min + (max − min)/(1 + e^−u)   (logistic)
 * A bound that is physical itself (η∞ = 0, τy = 0) is unreachable in these coordinates; for such
 * a parameter {@link boundedLinearTransform} moves p = min + s·u with the solver bound u ≥ 0, so
 * the fit can stop on the bound (and leave it) in one run.
 */
import type { ParameterSpec } from "../models";

export interface Transform {
  toFree(p: number): number;
  fromFree(u: number): number;
  /** dp/du at u. */
  derivative(u: number): number;
  /** Lower bound on u the solver must respect (−Infinity when the map keeps p inside by itself). */
  readonly lower: number;
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
      lower: -Infinity,
    };
  }
  return {
    toFree: (p) => Math.log(p - min),
    fromFree: (u) => min + Math.exp(u),
    derivative: (u) => Math.exp(u),
    lower: -Infinity,
  };
}

/**
 * p = min + scale·u with u ≥ 0, for a parameter whose lower bound is admissible (η∞ = 0, τy = 0).
 * `scale` (> 0, the parameter's SI unit) keeps u of order one: the starting value is a good choice.
 */
export function boundedLinearTransform(spec: ParameterSpec, scale: number): Transform {
  const { min } = spec;
  return {
    toFree: (p) => (p - min) / scale,
    fromFree: (u) => min + scale * u,
    derivative: () => scale,
    lower: 0,
  };
}
