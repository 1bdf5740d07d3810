/**
 * A melt-flow-rate test (ISO 1133-1 / ASTM D1238) placed on the flow curve as one apparent point,
 * with the checks a QC lab needs. The arithmetic is priorViscosity.ts's meltFlowApparentPoint
 * (standard geometry DEFAULT_MFR_GEOMETRY: die 2.095 mm × 8.000 mm, barrel 9.550 mm, from memory
 * (ISO 1133-1)); this module adds the load's pressure, the flow rate and the warnings.
 *
 *   ΔP = m·g_n/(π(D_b/2)²),  Q = MVR or MFR/ρ,  γ̇_a = 32Q/(πD³),  τ_app = ΔP·D/(4L),  η_a = τ_app/γ̇_a,
 *
 * g_n = 9.80665 m/s² (standard gravity, CGPM 1901). These are apparent values with no entrance or
 * Rabinowitsch correction (the short die, L/D ≈ 3.8, carries a large entrance loss, so τ_app and
 * η_a read high); piston friction and the melt column above the die are neglected.
 */
import { Warning, requirePositive, warning } from "./errors";
import { flowRateForApparentShearRate } from "./capillary";
import { DEFAULT_MFR_GEOMETRY, STANDARD_GRAVITY, meltFlowApparentPoint } from "./priorViscosity";

/** Nominal loads of the common test conditions, kg (from memory (ISO 1133-1, annex); not exhaustive). */
export const COMMON_MELT_FLOW_LOADS: readonly number[] = Object.freeze([0.325, 1.2, 2.16, 3.8, 5, 10, 12.5, 21.6]);

/** The apparent point of a melt-flow-rate test, SI. */
export interface MeltFlowResult {
  /** Q, m³/s */
  flowRate: number;
  /** ΔP = m·g_n/A_barrel, Pa */
  pressure: number;
  /** γ̇_a, 1/s */
  shearRateApparent: number;
  /** τ_app, Pa */
  wallShearStressApparent: number;
  /** η_a, Pa·s */
  viscosityApparent: number;
  warnings: Warning[];
}

/**
 * Pressure a dead load puts on the melt in the standard barrel: ΔP = m·g_n/(π(D_b/2)²).
 * @param load m, kg (> 0)
 * @returns Pa
 * @example meltFlowPressure(2.16) // 2.9573e5 Pa
 */
export function meltFlowPressure(load: number): number {
  requirePositive(load, "load");
  return (load * STANDARD_GRAVITY) / (Math.PI * (DEFAULT_MFR_GEOMETRY.barrelDiameter / 2) ** 2);
}

/**
 * Apparent flow-curve point of a melt-flow-rate test.
 *
 * Warning codes: MFR_APPARENT_POINT (always: the point carries the entrance loss and no
 * Rabinowitsch correction; compare it with apparent viscosities), MFR_UNUSUAL_LOAD (the load is
 * not one of the common test loads).
 *
 * @param flow `{ volumeRate }` (MVR, m³/s) or `{ massRate, density }` (MFR, kg/s and kg/m³)
 * @param load m, kg
 * @throws RheoError("domain") for non-positive input; ("value") when the flow is given both ways;
 *   ("missing") when neither, or an MFR without density.
 * @example meltFlowPoint({ volumeRate: 10e-6 / 600 }, 2.16).viscosityApparent // ≈ 1049 Pa·s
 */
export function meltFlowPoint(flow: { volumeRate?: number; massRate?: number; density?: number }, load: number): MeltFlowResult {
  const p = meltFlowApparentPoint({ ...flow, load });
  const warnings: Warning[] = [
    warning("MFR_APPARENT_POINT", "The melt-flow-rate point is apparent: it includes the short die's entrance loss and no Rabinowitsch correction, so compare it with apparent viscosities, not corrected ones."),
  ];
  if (!COMMON_MELT_FLOW_LOADS.some((l) => Math.abs(l - load) <= 1e-3 * l)) {
    warnings.push(warning("MFR_UNUSUAL_LOAD", `A load of ${load} kg is not one of the common test loads (${COMMON_MELT_FLOW_LOADS.join(", ")} kg): check the value.`));
  }
  return {
    flowRate: flowRateForApparentShearRate(p.shearRateApparent, DEFAULT_MFR_GEOMETRY.dieDiameter),
    pressure: meltFlowPressure(load),
    shearRateApparent: p.shearRateApparent,
    wallShearStressApparent: p.wallStress,
    viscosityApparent: p.viscosityApparent,
    warnings,
  };
}
