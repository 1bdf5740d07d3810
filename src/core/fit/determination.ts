/**
 * Which fitted parameters the data determine. A parameter is determined when
 *   1. the covariance is finite (JᵀJ invertible) and its relative standard error SE/|p| is at or
 *      below {@link DEFAULT_DETERMINATION_LIMITS}.maxRelativeStandardError (25 %: a 95 % interval
 *      within about a factor e^(1.96·0.25) ≈ 1.6 either way; common practice, no source);
 *   2. it does not sit on a bound of its range (fitModel's PARAMETER_AT_BOUND test);
 *   3. for the zero-shear viscosity and the time constant (or critical stress) of a plateau model,
 *      the measured rates reach the onset of shear thinning γ̇c (models/families.ts): η0 is an
 *      extrapolation when γ̇c lies below the lowest measured rate (the data never show the
 *      plateau), and the onset parameter is one when γ̇c lies outside [γ̇min, γ̇max]. Then the
 *      data only support a bound: η0 ≥ the highest measured viscosity (every plateau model is
 *      non-increasing in γ̇), λ > 1/γ̇min (onset below the data) or λ < 1/γ̇max (above them).
 *      (Rule stated from the model forms; its use as a determinacy test is common practice, no
 *      source. Macosko 1994, ch. 2, and Dealy & Wang 2013, ch. 2, discuss reaching the plateau.)
 */
import type { ModelId } from "../models";
import { onsetRate, PLATEAU_PARAMETERS } from "../models/families";

/** Limits of the determinacy test; docs and tests import this constant. */
export interface DeterminationLimits {
  /** Largest relative standard error SE/|p| of a determined parameter. */
  maxRelativeStandardError: number;
}

/** The documented limits (see the module comment). */
export const DEFAULT_DETERMINATION_LIMITS: Readonly<DeterminationLimits> = Object.freeze({ maxRelativeStandardError: 0.25 });

/** The measured window of one curve (or of one temperature of a multi-temperature fit). */
export interface DataWindow {
  /** K, for temperature-dependent models; absent for isothermal fits */
  temperature?: number;
  /** lowest and highest shear rate (1/s) */
  shearRateMin: number;
  shearRateMax: number;
  /** highest viscosity (Pa·s) */
  viscosityMax: number;
}

/** A bound the data support for a parameter they do not determine. */
export interface SupportedBound {
  side: "lower" | "upper";
  /** SI, the parameter's unit */
  value: number;
}

/** Why a free parameter is not determined, in plain words, and the bound the data support. */
export interface Undetermined {
  reason: string;
  bound?: SupportedBound;
  /** true when the value is an extrapolation outside the measured rates (η0, λ) */
  outsideData: boolean;
}

/** The measured window of points (γ̇ in 1/s, η in Pa·s), optionally one per temperature (K). */
export function dataWindows(shearRate: ArrayLike<number>, viscosity: ArrayLike<number>, temperature?: ArrayLike<number>): DataWindow[] {
  if (!temperature) {
    // one window: a plain pass (this runs in every single-curve fit)
    let shearRateMin = Infinity;
    let shearRateMax = -Infinity;
    let viscosityMax = -Infinity;
    for (let i = 0; i < shearRate.length; i++) {
      const g = shearRate[i] as number;
      if (g < shearRateMin) shearRateMin = g;
      if (g > shearRateMax) shearRateMax = g;
      if ((viscosity[i] as number) > viscosityMax) viscosityMax = viscosity[i] as number;
    }
    return [{ shearRateMin, shearRateMax, viscosityMax }];
  }
  const byT = new Map<number | undefined, DataWindow>();
  for (let i = 0; i < shearRate.length; i++) {
    const T = temperature[i] as number;
    const key = Number.isFinite(T) ? T : undefined;
    const rate = shearRate[i] as number;
    const eta = viscosity[i] as number;
    const w = byT.get(key);
    if (!w) byT.set(key, { ...(key !== undefined ? { temperature: key } : {}), shearRateMin: rate, shearRateMax: rate, viscosityMax: eta });
    else {
      w.shearRateMin = Math.min(w.shearRateMin, rate);
      w.shearRateMax = Math.max(w.shearRateMax, rate);
      w.viscosityMax = Math.max(w.viscosityMax, eta);
    }
  }
  return [...byT.values()];
}

const fmt = (v: number) => Number(v.toPrecision(3)).toString();

/**
 * The plateau test (rule 3 of the module comment) for the plateau and onset parameters of
 * `model`: undefined entries are determined as far as the measured window goes.
 * @example plateauTest("cross", { eta0: 12500, etaInf: 0, lambda: 1.22, m: 0.63 }, [{ shearRateMin: 24, shearRateMax: 5150, viscosityMax: 1340 }])
 *   // { eta0: { reason: "...", bound: { side: "lower", value: 1340 } }, lambda: { ... bound: { side: "lower", value: 0.0417 } } }
 */
export function plateauTest(model: ModelId, parameters: Readonly<Record<string, number>>, windows: readonly DataWindow[]): Record<string, Undetermined> {
  const names = PLATEAU_PARAMETERS[model];
  if (!names || windows.length === 0) return {};
  const onsets = windows.map((w) => ({ w, rate: onsetRate(model, parameters, w.temperature) }));
  if (onsets.some((o) => o.rate === null || !Number.isFinite(o.rate))) return {};
  const reached = onsets.some((o) => (o.rate as number) >= o.w.shearRateMin);
  const inside = onsets.some((o) => (o.rate as number) >= o.w.shearRateMin && (o.rate as number) <= o.w.shearRateMax);
  const out: Record<string, Undetermined> = {};
  const lowest = Math.min(...windows.map((w) => w.shearRateMin));
  const highest = Math.max(...windows.map((w) => w.shearRateMax));
  const etaMax = Math.max(...windows.map((w) => w.viscosityMax));
  const onsetText = onsets.map((o) => fmt(o.rate as number)).join(", ");
  const isothermal = windows.length === 1 && windows[0]?.temperature === undefined;
  if (!reached) {
    out[names.plateau] = {
      reason: `the data never reach the zero-shear plateau: shear thinning sets in at ${onsetText} 1/s, below the lowest measured rate (${fmt(lowest)} 1/s); the value is an extrapolation`,
      ...(names.plateau === "eta0" ? { bound: { side: "lower" as const, value: etaMax } } : {}),
      outsideData: true,
    };
  }
  if (!inside) {
    const below = !reached;
    const bound: SupportedBound | undefined =
      names.onset === "lambda" && isothermal ? (below ? { side: "lower", value: 1 / lowest } : { side: "upper", value: 1 / highest }) : undefined;
    out[names.onset] = {
      reason: below
        ? `the onset of shear thinning (${onsetText} 1/s) lies below the measured rates (${fmt(lowest)}–${fmt(highest)} 1/s); the value is an extrapolation`
        : `the onset of shear thinning (${onsetText} 1/s) lies above the measured rates (${fmt(lowest)}–${fmt(highest)} 1/s); the data stay on the plateau`,
      ...(bound ? { bound } : {}),
      outsideData: true,
    };
  }
  return out;
}

/**
 * Relative standard error SE/|p| (Infinity for p = 0 with SE > 0; NaN when SE is not finite).
 * @example relativeStandardError(200, 20) // 0.1
 */
export function relativeStandardError(value: number, standardError: number): number {
  if (!Number.isFinite(standardError)) return NaN;
  if (standardError === 0) return 0;
  return standardError / Math.abs(value);
}
