/**
 * Slit-die kinematics and stresses (a rectangular channel of width W and height, or gap, H with
 * W ≫ H), before and after the end correction.
 *
 * Newtonian flow between parallel plates gives the apparent wall shear rate γ̇_a = 6Q/(W H²)
 * (apparentSlitShearRate, slitFlow.ts);
 * a force balance on the fluid gives τ_w = ΔP·H/(2L) (Macosko 1994, ch. 6, from memory; ISO 11443). The end
 * correction works as Bagley's does for round dies but in L/H: ΔP = ΔP_ent + 2τ_w·(L/H), so the
 * slope of ΔP against L/H is 2τ_w and the round-die code applies with L/H in place of L/R.
 * The slit Rabinowitsch factor is (2n'+1)/(3n') (rabinowitsch.ts, geometry "slit").
 * Edge effects are neglected; some texts multiply τ_w by 1/(1 + H/W) (Macosko 1994, ch. 6, from memory), and
 * this module warns when W/H is below {@link DEFAULT_SLIT_OPTIONS}.minAspectRatio.
 */
import { Warning, requireNonNegative, requirePositive, warning } from "./errors";

// The apparent rate γ̇_a = 6Q/(WH²) is apparentSlitShearRate in slitFlow.ts.

/** Options of the slit checks. */
export interface SlitOptions {
  /** warn when W/H is below this (W/H ≥ 10 usual; common practice, no source) */
  minAspectRatio: number;
}

/** Defaults of {@link SlitOptions}. */
export const DEFAULT_SLIT_OPTIONS: Readonly<SlitOptions> = Object.freeze({ minAspectRatio: 10 });

/**
 * Wall shear stress in a slit, τ_w = (ΔP − ΔP_ent)·H/(2L); with ΔP_ent = 0 this is the apparent
 * (uncorrected) stress, which includes the entrance and exit losses.
 * @param pressure ΔP in Pa (≥ 0)
 * @param slitHeight H in m (> 0)
 * @param dieLength L in m (> 0)
 * @param entrancePressure ΔP_ent in Pa (default 0)
 * @returns τ_w in Pa
 * @example slitWallShearStress(1e7, 1e-3, 20e-3) // 2.5e5 Pa
 */
export function slitWallShearStress(pressure: number, slitHeight: number, dieLength: number, entrancePressure = 0): number {
  requireNonNegative(pressure, "pressure");
  requirePositive(slitHeight, "slitHeight");
  requirePositive(dieLength, "dieLength");
  requireNonNegative(entrancePressure, "entrancePressure");
  return ((pressure - entrancePressure) * slitHeight) / (2 * dieLength);
}

/**
 * The slit's length in gaps, L/H: the abscissa of the slit Bagley plot.
 * @example slitLengthOverHeight(20e-3, 1e-3) // 20
 */
export function slitLengthOverHeight(dieLength: number, slitHeight: number): number {
  requirePositive(dieLength, "dieLength");
  requirePositive(slitHeight, "slitHeight");
  return dieLength / slitHeight;
}

/**
 * Checks a slit's aspect ratio. Warning code: SLIT_NARROW (W/H below the option's minimum: the
 * side walls carry part of the stress and the parallel-plate formulas overstate the rate).
 */
export function slitWarnings(slitWidth: number, slitHeight: number, options: Partial<SlitOptions> = {}): Warning[] {
  const opt: SlitOptions = { ...DEFAULT_SLIT_OPTIONS, ...options };
  requirePositive(slitWidth, "slitWidth");
  requirePositive(slitHeight, "slitHeight");
  const ratio = slitWidth / slitHeight;
  if (ratio >= opt.minAspectRatio) return [];
  return [
    warning(
      "SLIT_NARROW",
      `The slit is only ${Number(ratio.toPrecision(3))} times wider than high (W/H < ${opt.minAspectRatio}): the side walls slow the flow and the parallel-plate formulas are approximate.`,
    ),
  ];
}
