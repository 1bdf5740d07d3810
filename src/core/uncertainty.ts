/**
 * The pressure transducer in the uncertainty estimate: its standard uncertainty from a stated
 * accuracy, the Bagley slope's uncertainty from independent readings, and the range checks.
 * The per-point budget of the flow curve (zero and gain correlated, scatter, die geometry, piston
 * speed, temperature, the smoother's n′) is uncertaintyBudget.ts.
 *
 * - A transducer accuracy "±a of full scale" with no stated confidence is read as a rectangular
 *   distribution: u_P = a·FS/√3 (JCGM 100:2008 "GUM", §4.3.7).
 * - Bagley wall stress τ_w = slope/2 of ΔP vs x (x = L/R or L/H): with independent readings of
 *   standard uncertainty u_P the slope's is u_P/√Sxx, Sxx = Σ(x − x̄)² (Draper & Smith 1998, ch. 1, from memory);
 *   the fit's standard error is added in quadrature: u(τ_w) = ½·√(u_P²/Sxx + SE_slope²).
 */
import { RheoError, Warning, requirePositive, warning } from "./errors";

/** The pressure transducer, SI. */
export interface Transducer {
  /** full-scale range, Pa */
  fullScale: number;
  /** accuracy as a fraction of full scale (0.0025 for ±0.25 % FS) */
  accuracy: number;
}

/** Options of the uncertainty estimate. */
export interface UncertaintyOptions {
  /** coverage factor k of the reported ± values */
  coverageFactor: number;
  /** flag readings below this fraction of full scale ("a few percent"; common practice, no source) */
  minFractionOfFullScale: number;
}

/** Defaults of {@link UncertaintyOptions}. */
export const DEFAULT_UNCERTAINTY_OPTIONS: Readonly<UncertaintyOptions> = Object.freeze({ coverageFactor: 2, minFractionOfFullScale: 0.05 });

/**
 * Standard uncertainty of one reading, u_P = accuracy·FS/√3 (rectangular distribution).
 * @returns u_P, Pa
 * @example pressureStandardUncertainty({fullScale: 1000e5, accuracy: 0.0025}) // 14434 Pa
 */
export function pressureStandardUncertainty(transducer: Transducer): number {
  requirePositive(transducer.fullScale, "fullScale");
  requirePositive(transducer.accuracy, "accuracy");
  if (transducer.accuracy >= 1) throw new RheoError("domain", "accuracy", `is a fraction of full scale and must be below 1, got ${transducer.accuracy}`);
  return (transducer.accuracy * transducer.fullScale) / Math.sqrt(3);
}

/**
 * Standard uncertainty of a Bagley wall stress: ½·√(u_P²/Sxx + SE_slope²).
 * @param lengthOverRadius x of each die on the line
 * @param pressureUncertainty u_P, Pa
 * @param slopeStandardError the line's SE of the slope, Pa
 * @returns u(τ_w), Pa
 */
export function bagleyStressUncertainty(lengthOverRadius: number[], pressureUncertainty: number, slopeStandardError: number): number {
  if (lengthOverRadius.length < 2) throw new RheoError("missing", "lengthOverRadius", "needs at least two dies");
  const mean = lengthOverRadius.reduce((s, v) => s + v, 0) / lengthOverRadius.length;
  const sxx = lengthOverRadius.reduce((s, v) => s + (v - mean) ** 2, 0);
  if (!(sxx > 0)) throw new RheoError("domain", "lengthOverRadius", "the dies must have different lengths");
  return 0.5 * Math.sqrt((pressureUncertainty * pressureUncertainty) / sxx + slopeStandardError * slopeStandardError);
}

/** Expanded uncertainties (k·u_c) of one flow-curve point, from the budget (uncertaintyBudget.ts). */
export interface UncertaintyRow {
  /** ± of τ_w, Pa */
  wallShearStress: number;
  /** ± of γ̇_w, 1/s (null where γ̇_w is) */
  shearRateWall: number | null;
  /** ± of η, Pa·s (null where η is) */
  viscosity: number | null;
}

/**
 * Checks readings against the transducer's range.
 * Warning codes: TRANSDUCER_LOW_READING (readings below minFractionOfFullScale of full scale:
 * the accuracy, a fraction of full scale, is large relative to them), TRANSDUCER_OVER_RANGE
 * (readings above full scale).
 * @param pressure readings, Pa
 */
export function transducerWarnings(pressure: number[], transducer: Transducer, options: Partial<UncertaintyOptions> = {}): Warning[] {
  const opt: UncertaintyOptions = { ...DEFAULT_UNCERTAINTY_OPTIONS, ...options };
  pressureStandardUncertainty(transducer);
  const low = pressure.filter((p) => p < opt.minFractionOfFullScale * transducer.fullScale);
  const high = pressure.filter((p) => p > transducer.fullScale);
  const warnings: Warning[] = [];
  if (low.length > 0) {
    const worst = Math.min(...low) / transducer.fullScale;
    warnings.push(
      warning("TRANSDUCER_LOW_READING", `${low.length} pressure reading(s) lie below ${opt.minFractionOfFullScale * 100} % of the transducer's full scale (lowest ${(worst * 100).toPrecision(2)} %): their error is large relative to the reading; use a smaller transducer for those rates.`),
    );
  }
  if (high.length > 0) {
    warnings.push(warning("TRANSDUCER_OVER_RANGE", `${high.length} pressure reading(s) exceed the transducer's full scale: they are outside its calibrated range (and its safe rating).`));
  }
  return warnings;
}
