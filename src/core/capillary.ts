/**
 * Round-capillary kinematics and stresses before any end or Rabinowitsch correction.
 *
 * Reference: Macosko, Rheology: Principles, Measurements and Applications (1994), ch. 6;
 * ISO 11443 (capillary and slit-die rheometry of plastics).
 */
import { RheoError, requireFinite, requireNonNegative, requirePositive } from "./errors";

/**
 * Apparent (Newtonian) wall shear rate: γ̇_a = 4Q/(πR³) = 32Q/(πD³).
 * @param flowRate Q in m³/s (≥ 0)
 * @param dieDiameter D in m (> 0)
 * @returns γ̇_a in 1/s
 * @example apparentShearRate(1e-8, 1e-3) // 101.86 1/s
 */
export function apparentShearRate(flowRate: number, dieDiameter: number): number {
  requireNonNegative(flowRate, "flowRate");
  requirePositive(dieDiameter, "dieDiameter");
  return (32 * flowRate) / (Math.PI * dieDiameter ** 3);
}

/**
 * Flow rate giving an apparent wall shear rate (inverse of {@link apparentShearRate}):
 * Q = γ̇_a π D³ / 32.
 * @returns Q in m³/s
 */
export function flowRateForApparentShearRate(shearRateApparent: number, dieDiameter: number): number {
  requireNonNegative(shearRateApparent, "shearRateApparent");
  requirePositive(dieDiameter, "dieDiameter");
  return (shearRateApparent * Math.PI * dieDiameter ** 3) / 32;
}

/**
 * Apparent (uncorrected) wall shear stress: τ_w,app = ΔP·R/(2L) = ΔP·D/(4L).
 * Includes the entrance and exit losses; see {@link correctedWallShearStress}.
 * @param pressure ΔP in Pa (≥ 0)
 * @param dieDiameter D in m (> 0)
 * @param dieLength L in m (> 0)
 * @returns τ in Pa
 * @example apparentWallShearStress(1e7, 1e-3, 20e-3) // 1.25e5 Pa
 */
export function apparentWallShearStress(pressure: number, dieDiameter: number, dieLength: number): number {
  requireDie(pressure, dieDiameter, dieLength);
  return (pressure * dieDiameter) / (4 * dieLength);
}

/** Checks a pressure (≥ 0) and a die's diameter and length (> 0). */
function requireDie(pressure: number, dieDiameter: number, dieLength: number): void {
  requireNonNegative(pressure, "pressure");
  requirePositive(dieDiameter, "dieDiameter");
  requirePositive(dieLength, "dieLength");
}

/**
 * Wall shear stress after the end correction (Bagley 1957, J. Appl. Phys. 28, 624):
 * τ_w = (ΔP − ΔP_ent)·R/(2L), equivalently τ_w = ΔP / (2(L/R + e)).
 * @param pressure ΔP in Pa (≥ 0)
 * @param entrancePressure ΔP_ent in Pa (entrance plus exit loss at the same apparent rate)
 * @returns τ_w in Pa
 * @example correctedWallShearStress(1e7, 2e6, 1e-3, 20e-3) // 1.0e5 Pa
 */
export function correctedWallShearStress(
  pressure: number,
  entrancePressure: number,
  dieDiameter: number,
  dieLength: number,
): number {
  requireDie(pressure, dieDiameter, dieLength);
  requireFinite(entrancePressure, "entrancePressure");
  if (pressure - entrancePressure <= 0) {
    throw new RheoError("domain", "entrancePressure", `(${entrancePressure} Pa) is not below the measured pressure (${pressure} Pa): no pressure is left for the die land`);
  }
  return ((pressure - entrancePressure) * dieDiameter) / (4 * dieLength);
}

/**
 * Wall shear stress from the pressure and the Bagley end correction e (in die radii):
 * τ_w = ΔP / (2(L/R + e)).
 * @param endCorrection e, dimensionless
 * @returns τ_w in Pa
 */
export function wallShearStressFromEndCorrection(
  pressure: number,
  endCorrection: number,
  dieDiameter: number,
  dieLength: number,
): number {
  requireDie(pressure, dieDiameter, dieLength);
  const lOverR = (2 * dieLength) / dieDiameter;
  if (!Number.isFinite(endCorrection) || lOverR + endCorrection <= 0) {
    requirePositive(lOverR + endCorrection, "endCorrection");
  }
  return pressure / (2 * (lOverR + endCorrection));
}

/**
 * Viscosity as the ratio of wall stress to a wall shear rate: η = τ_w / γ̇.
 * With the true (Rabinowitsch) rate this is the viscosity; with the apparent rate it is the
 * apparent viscosity η_a.
 * @returns η in Pa·s
 */
export function viscosityFromStressAndRate(wallShearStress: number, shearRate: number): number {
  requireNonNegative(wallShearStress, "wallShearStress");
  requirePositive(shearRate, "shearRate");
  return wallShearStress / shearRate;
}
