/**
 * Volumetric flow rate through the die, from the piston or from a weighed extrudate.
 */
import { requirePositive, requireNonNegative } from "./errors";

/**
 * Flow rate displaced by the piston: Q = v_p · π D_b² / 4 (incompressible melt, no leakage).
 * @param pistonSpeed v_p in m/s (≥ 0)
 * @param barrelDiameter D_b in m (> 0)
 * @returns Q in m³/s
 * @example flowRateFromPiston(1e-3 / 60, 0.015) // 1 mm/min in a 15 mm barrel ≈ 2.945e-9 m³/s
 */
export function flowRateFromPiston(pistonSpeed: number, barrelDiameter: number): number {
  requireNonNegative(pistonSpeed, "pistonSpeed");
  requirePositive(barrelDiameter, "barrelDiameter");
  return (pistonSpeed * Math.PI * barrelDiameter * barrelDiameter) / 4;
}

/**
 * Flow rate from a mass throughput and the melt density: Q = ṁ / ρ.
 * @param massRate ṁ in kg/s (≥ 0)
 * @param density ρ of the melt at test temperature, kg/m³ (> 0)
 * @returns Q in m³/s
 * @example flowRateFromMassRate(1e-4, 750) // 1.333e-7 m³/s
 */
export function flowRateFromMassRate(massRate: number, density: number): number {
  requireNonNegative(massRate, "massRate");
  requirePositive(density, "density");
  return massRate / density;
}

/**
 * Piston speed needed for a flow rate (inverse of {@link flowRateFromPiston}): v_p = 4Q/(π D_b²).
 * @returns v_p in m/s
 */
export function pistonSpeedForFlowRate(flowRate: number, barrelDiameter: number): number {
  requireNonNegative(flowRate, "flowRate");
  requirePositive(barrelDiameter, "barrelDiameter");
  return (4 * flowRate) / (Math.PI * barrelDiameter * barrelDiameter);
}
