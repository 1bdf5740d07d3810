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
 * Edge effects: the side walls carry part of the flow resistance. The reduction neglects them
 * unless the edge correction is asked for (reduce option slitEdgeCorrection), which divides the true
 * wall rate by the Newtonian shape factor F of the channel (slitFlow.ts, slitShapeFactor; exact
 * for a Newtonian liquid; a shear-thinning liquid's flatter profile feels the side walls less, so
 * it over-corrects slightly). This module warns when W/H is below
 * {@link DEFAULT_SLIT_OPTIONS}.minAspectRatio. (Some texts instead multiply τ_w by 1/(1 + H/W),
 * the perimeter-averaged stress of a force balance; Macosko 1994, ch. 6, from memory.)
 */
import { Warning, requireNonNegative, requirePositive, warning } from "./errors";
import { slitShapeFactor } from "./slitFlow";

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
 * side walls slow the flow, so the parallel-plate formulas understate the wall rate and overstate
 * the viscosity by about 1/F − 1; the message names the edge-correction option).
 */
export function slitWarnings(slitWidth: number, slitHeight: number, options: Partial<SlitOptions> = {}): Warning[] {
  const opt: SlitOptions = { ...DEFAULT_SLIT_OPTIONS, ...options };
  requirePositive(slitWidth, "slitWidth");
  requirePositive(slitHeight, "slitHeight");
  const ratio = slitWidth / slitHeight;
  if (ratio >= opt.minAspectRatio) return [];
  const over = ratio >= 1 ? 1 / slitShapeFactor(slitWidth, slitHeight) - 1 : NaN;
  return [
    warning(
      "SLIT_NARROW",
      `The slit is only ${Number(ratio.toPrecision(3))} times wider than high (W/H < ${opt.minAspectRatio}): the side walls slow the flow, so the parallel-plate formulas understate the wall rate and overstate the viscosity${Number.isFinite(over) ? ` (by about ${Number((over * 100).toPrecision(2))} % for a Newtonian liquid)` : ""}; the slit edge correction applies the channel's shape factor.`,
    ),
  ];
}

/**
 * The finite-width (edge) correction of a slit's flow curve: the true wall rate divided by the
 * Newtonian shape factor F (slitFlow.ts), the viscosity multiplied by it; apparent rate and stress
 * unchanged. Warning code: SLIT_EDGE_CORRECTED (info: the factor applied).
 * @param flowCurve the slit group's rows (γ̇_w in 1/s, η in Pa·s, null where undefined)
 * @returns the corrected rows, F and the warning
 */
export function slitEdgeCorrection<T extends { shearRateWall: number | null; viscosity: number | null }>(
  flowCurve: T[],
  slitWidth: number,
  slitHeight: number,
): { rows: T[]; shapeFactor: number; warnings: Warning[] } {
  const f = slitShapeFactor(slitWidth, slitHeight);
  const rows = flowCurve.map((r) => ({ ...r, shearRateWall: r.shearRateWall === null ? null : r.shearRateWall / f, viscosity: r.viscosity === null ? null : r.viscosity * f }));
  return {
    rows,
    shapeFactor: f,
    warnings: [
      warning(
        "SLIT_EDGE_CORRECTED",
        `Edge correction of the ${Number((slitWidth / slitHeight).toPrecision(3))}:1 slit: true wall rates divided and viscosities multiplied by the Newtonian shape factor F = ${Number(f.toPrecision(4))} (exact for a Newtonian liquid, slightly too strong for a shear-thinning one).`,
      ),
    ],
  };
}
