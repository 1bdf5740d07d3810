/**
 * Uncertainty of the reduced flow curve from the pressure transducer's accuracy and the Bagley
 * fit's scatter, by first-order propagation (JCGM 100:2008 "GUM", §5.1).
 *
 * - A transducer accuracy "±a of full scale" with no stated confidence is read as a rectangular
 *   distribution: u_P = a·FS/√3 (GUM §4.3.7); readings are taken as independent.
 * - Bagley wall stress τ_w = slope/2 of ΔP vs x (x = L/R or L/H): the slope's uncertainty from
 *   the readings is u_P/√Sxx, Sxx = Σ(x − x̄)²; the fit's standard error (scatter) is added in
 *   quadrature: u(τ_w) = ½·√(u_P²/Sxx + SE_slope²).
 * - One die (no correction): u(τ_w) = u_P·g, g = D/(4L) (round) or H/(2L) (slit); with an
 *   orifice die two readings are subtracted: u(τ_w) = √2·u_P·g.
 * - n' from neighbouring points, n' ≈ Δln τ/Δln γ̇_a, so u(n') = √(u_r,i² + u_r,j²)/Δln γ̇_a
 *   (u_r the relative stress uncertainties; a conservative stand-in for the smoothed slope);
 *   u(γ̇_w) = γ̇_a·|df/dn'|·u(n') with f = (3n'+1)/(4n') (round, df/dn' = −1/(4n'²)) or
 *   (2n'+1)/(3n') (slit, −1/(3n'²)); u_r(η)² = u_r(τ_w)² + u_r(γ̇_w)².
 * Results are expanded uncertainties U = k·u (coverage factor k = 2 by default, about 95 %).
 * The flow rate (piston speed, bore) is taken as exact.
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

/** Uncertainty of one flow-curve point (expanded, k·u). */
export interface UncertaintyRow {
  /** ± of τ_w, Pa */
  wallShearStress: number;
  /** ± of γ̇_w, 1/s (null where γ̇_w is) */
  shearRateWall: number | null;
  /** ± of η, Pa·s (null where η is) */
  viscosity: number | null;
}

/**
 * Propagates standard stress uncertainties into γ̇_w and η along a flow curve (module comment).
 * @param shearRateApparent γ̇_a per point, 1/s
 * @param wallShearStress τ_w per point, Pa
 * @param stressUncertainty u(τ_w) per point (standard), Pa
 * @param nPrime n' per point; shearRateWall and viscosity per point (null where undefined)
 * @returns expanded uncertainties per point, aligned with the input
 */
export function flowCurveUncertainty(
  shearRateApparent: number[],
  wallShearStress: number[],
  stressUncertainty: number[],
  nPrime: number[],
  shearRateWall: (number | null)[],
  viscosity: (number | null)[],
  geometry: "round" | "slit" = "round",
  coverageFactor = DEFAULT_UNCERTAINTY_OPTIONS.coverageFactor,
): UncertaintyRow[] {
  const n = shearRateApparent.length;
  for (const [name, arr] of [["wallShearStress", wallShearStress], ["stressUncertainty", stressUncertainty], ["nPrime", nPrime], ["shearRateWall", shearRateWall], ["viscosity", viscosity]] as const) {
    if (arr.length !== n) throw new RheoError("value", name, `has ${arr.length} values but shearRateApparent has ${n}`);
  }
  requirePositive(coverageFactor, "coverageFactor");
  const order = shearRateApparent.map((_, i) => i).sort((a, b) => (shearRateApparent[a] as number) - (shearRateApparent[b] as number));
  const rel = (i: number) => (stressUncertainty[i] as number) / (wallShearStress[i] as number);
  const out = new Array<UncertaintyRow>(n);
  order.forEach((i, k) => {
    const a = order[Math.max(0, k - 1)] as number;
    const b = order[Math.min(n - 1, k + 1)] as number;
    const span = a === b ? Infinity : Math.log(shearRateApparent[b] as number) - Math.log(shearRateApparent[a] as number);
    const uN = Number.isFinite(span) ? Math.sqrt(rel(a) ** 2 + rel(b) ** 2) / span : 0;
    const np = nPrime[i] as number;
    const w = shearRateWall[i] ?? null;
    const v = viscosity[i] ?? null;
    let uW: number | null = null;
    let uV: number | null = null;
    if (w !== null && np > 0) {
      const dfdn = geometry === "slit" ? 1 / (3 * np * np) : 1 / (4 * np * np);
      uW = (shearRateApparent[i] as number) * dfdn * uN;
      if (v !== null) uV = v * Math.sqrt(rel(i) ** 2 + (uW / w) ** 2);
    }
    out[i] = {
      wallShearStress: coverageFactor * (stressUncertainty[i] as number),
      shearRateWall: uW === null ? null : coverageFactor * uW,
      viscosity: uV === null ? null : coverageFactor * uV,
    };
  });
  return out;
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
