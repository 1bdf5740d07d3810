/**
 * Confidence intervals that respect a parameter's physical domain.
 *
 * The fit moves each parameter in the coordinates of its bounds (transforms.ts): ln(p − min) for a
 * lower bound only, logit for two bounds. The interval is taken symmetric in those coordinates and
 * mapped back, with the standard error carried over by the delta method (Bates & Watts, Nonlinear
 * Regression Analysis (1988), §3.5; Seber & Wild, Nonlinear Regression (1989), §5.2 on
 * re-parametrised intervals — from memory):
 *   lower bound only:  u = ln(p − min),  SE_u = SE/(p − min),
 *                      interval  min + (p − min)·exp(±t·SE_u)
 *   two bounds:        u = ln((p − min)/(max − p)),  SE_u = SE·(max − min)/((p − min)(max − p)),
 *                      interval  min + (max − min)/(1 + exp(−(u ± t·SE_u)))
 * so a positive quantity never gets a negative lower limit and the interval is asymmetric the way
 * the likelihood of a scale parameter is. A parameter whose bound is itself admissible (η∞ = 0,
 * τy = 0) keeps the linear interval p ± t·SE, cut at the bound (its estimate may sit on it).
 */
import type { ParameterSpec } from "../models";

/**
 * The interval [low, high] of a parameter with estimate `value`, standard error `se` and quantile
 * `t` (Student t for the wanted level). NaN limits when `se` is not finite.
 * @example domainInterval(ETA0, 1000, 100, 2) // [818.7, 1221.4]: 1000·e^(∓0.2)
 */
export function domainInterval(spec: ParameterSpec, value: number, se: number, t: number): [number, number] {
  if (!Number.isFinite(se) || !Number.isFinite(value)) return [NaN, NaN];
  const { min, max } = spec;
  const half = t * se;
  if (spec.minInclusive || !(value > min)) return [Math.max(min, value - half), Number.isFinite(max) ? Math.min(max, value + half) : value + half];
  if (Number.isFinite(max)) {
    if (!(value < max)) return [Math.max(min, value - half), max];
    const width = max - min;
    const u = Math.log((value - min) / (max - value));
    const uHalf = (half * width) / ((value - min) * (max - value));
    const back = (x: number) => min + width / (1 + Math.exp(-x));
    return [back(u - uHalf), back(u + uHalf)];
  }
  const scale = value - min;
  const factor = Math.exp(half / scale);
  return [min + scale / factor, min + scale * factor];
}
