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

/**
 * The optional vertical shift of time–temperature superposition, b_T = ρ(T)·T/(ρ_ref·T_ref)
 * (Ferry, Viscoelastic Properties of Polymers, 3rd ed. 1980, ch. 11; Dealy & Plazek, Rheol. Bull.
 * 78 (2009) 16; from memory), with the melt density ρ(T) = ρ_ref·exp(−α·(T − T_ref)) for a
 * constant volumetric expansion coefficient α (1/K; 0 leaves b_T = T/T_ref). With it
 * η(γ̇, T) = a_T·b_T·η_ref(a_T·γ̇).
 */
export interface VerticalShift {
  /** α, volumetric thermal expansion coefficient of the melt, 1/K (≥ 0; about 6e-4–8e-4 for polyolefin melts, from memory) */
  thermalExpansion: number;
}

/** A temperature-shift law with its constants (SI), and optionally the vertical shift b_T. */
export type ShiftLaw = (
  | { law: "arrhenius"; referenceTemperature: number; activationEnergy: number }
  | { law: "wlf"; referenceTemperature: number; C1: number; C2: number }
) & { verticalShift?: VerticalShift };

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

/**
 * The universal WLF constants, which belong to T_ref = T_g, converted to another reference
 * temperature: C2 = C2_g + T_ref − T_g, C1 = C1_g·C2_g/C2 (the standard change of reference of the
 * WLF equation; Ferry 1980, ch. 11, from memory). The law is unchanged: log10 a_T relative to T_ref
 * is the same function of T.
 * @param referenceTemperature T_ref (K); glassTransitionTemperature T_g (K)
 * @returns { C1, C2 (K) } at T_ref
 * @throws RheoError("domain") when T_ref ≤ T_g − C2_g (the law has no such reference)
 * @example wlfConstantsAtReference(473.15, 373.15) // { C1: 5.93604, C2: 151.6 }
 */
export function wlfConstantsAtReference(referenceTemperature: number, glassTransitionTemperature: number, C1g = WLF_UNIVERSAL_C1, C2g = WLF_UNIVERSAL_C2): { C1: number; C2: number } {
  requirePositive(referenceTemperature, "referenceTemperature");
  requirePositive(glassTransitionTemperature, "glassTransitionTemperature");
  requirePositive(C2g, "C2");
  requireFinite(C1g, "C1");
  const C2 = C2g + referenceTemperature - glassTransitionTemperature;
  if (!(C2 > 0)) {
    throw new RheoError("domain", "glassTransitionTemperature", `must be below T_ref + ${C2g} K (= ${referenceTemperature + C2g} K) for the WLF constants to be converted, got ${glassTransitionTemperature} K`);
  }
  return { C1: (C1g * C2g) / C2, C2 };
}

/**
 * Vertical shift factor b_T = ρ(T)·T/(ρ_ref·T_ref) with ρ(T)/ρ_ref = exp(−α(T − T_ref)) (see {@link VerticalShift}).
 * @example verticalShiftFactor(493.15, 473.15, 7e-4) // 1.02778
 */
export function verticalShiftFactor(temperature: number, referenceTemperature: number, thermalExpansion: number): number {
  requirePositive(temperature, "temperature");
  requirePositive(referenceTemperature, "referenceTemperature");
  if (!(thermalExpansion >= 0) || !Number.isFinite(thermalExpansion)) throw new RheoError("domain", "thermalExpansion", `must be zero or more (1/K), got ${thermalExpansion}`);
  return Math.exp(-thermalExpansion * (temperature - referenceTemperature)) * (temperature / referenceTemperature);
}

/** b_T of a law at temperature T (K): 1 without a vertical shift. */
export function verticalFactor(shift: ShiftLaw, temperature: number): number {
  return shift.verticalShift ? verticalShiftFactor(temperature, shift.referenceTemperature, shift.verticalShift.thermalExpansion) : 1;
}

/** a_T of a shift law at temperature T (K). */
export function shiftFactor(shift: ShiftLaw, temperature: number): number {
  if (shift.law === "arrhenius") return arrheniusShiftFactor(temperature, shift.referenceTemperature, shift.activationEnergy);
  if (shift.law === "wlf") return wlfShiftFactor(temperature, shift.referenceTemperature, shift.C1, shift.C2);
  throw new RheoError("value", "shift.law", `unknown shift law "${String((shift as { law: unknown }).law)}"; accepted: arrhenius, wlf`);
}
