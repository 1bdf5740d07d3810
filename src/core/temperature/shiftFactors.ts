/**
 * Temperature shift factors a_T for time–temperature superposition,
 * η(γ̇, T) = a_T·η_ref(a_T·γ̇) (Dealy & Wang, Melt Rheology (2013), from memory; Ferry 1980).
 */
import { RheoError, requireFinite, requirePositive } from "../errors";

/** Molar gas constant R (J/(mol·K)), exact since the 2019 SI redefinition (CODATA 2018). */
export const GAS_CONSTANT = 8.314462618;

/** "Universal" WLF constant C1 (dimensionless; Williams, Landel & Ferry 1955, at T_ref = T_g). */
export const WLF_UNIVERSAL_C1 = 17.44;
/** "Universal" WLF constant C2 (K; Williams, Landel & Ferry 1955, at T_ref = T_g). */
export const WLF_UNIVERSAL_C2 = 51.6;

/** A temperature-shift law with its constants (SI). */
export type ShiftLaw =
  | { law: "arrhenius"; referenceTemperature: number; activationEnergy: number }
  | { law: "wlf"; referenceTemperature: number; C1: number; C2: number };

/**
 * Arrhenius shift factor a_T = exp[(Ea/R)(1/T − 1/T_ref)].
 * @param temperature T (K), referenceTemperature T_ref (K), activationEnergy Ea (J/mol)
 * @throws RheoError for non-positive temperatures or a non-finite Ea.
 * @example arrheniusShiftFactor(463.15, 473.15, 50e3) // ≈ 1.316
 */
export function arrheniusShiftFactor(temperature: number, referenceTemperature: number, activationEnergy: number): number {
  requirePositive(temperature, "temperature");
  requirePositive(referenceTemperature, "referenceTemperature");
  requireFinite(activationEnergy, "activationEnergy");
  return Math.exp((activationEnergy / GAS_CONSTANT) * (1 / temperature - 1 / referenceTemperature));
}

/**
 * WLF shift factor: log10 a_T = −C1·(T − T_ref)/(C2 + T − T_ref) (Williams, Landel & Ferry,
 * J. Am. Chem. Soc. 77 (1955) 3701).
 * @param C1 dimensionless, C2 (K), temperatures (K)
 * @throws RheoError(kind "domain") when C2 + T − T_ref ≤ 0 (the law diverges there).
 * @example wlfShiftFactor(383.15, 373.15, 17.44, 51.6) // 10^(−17.44·10/61.6) ≈ 1.476e-3
 */
export function wlfShiftFactor(temperature: number, referenceTemperature: number, C1: number, C2: number): number {
  requirePositive(temperature, "temperature");
  requirePositive(referenceTemperature, "referenceTemperature");
  requireFinite(C1, "C1");
  requireFinite(C2, "C2");
  const dT = temperature - referenceTemperature;
  if (C2 + dT <= 0) {
    throw new RheoError("domain", "temperature", `must satisfy C2 + T − Tref > 0 for the WLF law, got C2 + T − Tref = ${C2 + dT} K`);
  }
  return Math.pow(10, (-C1 * dT) / (C2 + dT));
}

/** a_T of a shift law at temperature T (K). */
export function shiftFactor(shift: ShiftLaw, temperature: number): number {
  if (shift.law === "arrhenius") return arrheniusShiftFactor(temperature, shift.referenceTemperature, shift.activationEnergy);
  if (shift.law === "wlf") return wlfShiftFactor(temperature, shift.referenceTemperature, shift.C1, shift.C2);
  throw new RheoError("value", "shift.law", `unknown shift law "${String((shift as { law: unknown }).law)}"; accepted: arrhenius, wlf`);
}
