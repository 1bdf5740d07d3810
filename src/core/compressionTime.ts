/**
 * Time constant of the pressure approach after a piston-speed change, from the compressibility of
 * the melt in the barrel: a lumped first-order model in which the melt column is a compliance
 * C = β·V_melt charged through the die's flow resistance R = ΔP/Q, so that
 *
 *   p(t) = p_ss + (p_0 − p_ss)·exp(−t/τ),   τ = R·C = β·V_melt·ΔP/Q,
 *
 * and the pressure is within a fraction ε of its final change after t = ln(1/ε)·τ.
 * The barrel-compressibility balance dP/dt = (1/(β·V))·(Q_piston − Q_die) behind it is the usual
 * model of the capillary rheometer's start-up and of stick–slip (Hatzikiriakos & Dealy,
 * J. Rheol. 36 (1992) 845; from memory). Exact for a Newtonian liquid; for a shear-thinning melt
 * the tangent resistance n'·ΔP/Q is smaller, so τ is an upper estimate.
 * SI units: β 1/Pa, V m³, ΔP Pa, Q m³/s, τ s.
 */
import { requirePositive } from "./errors";

/**
 * τ = β·V_melt·ΔP/Q (see the module comment).
 * @param compressibility β, 1/Pa
 * @param meltVolume V_melt, m³ (the melt left in the barrel)
 * @param pressure ΔP, Pa (the step's final pressure)
 * @param flowRate Q, m³/s
 * @returns τ, s
 * @throws RheoError("domain") naming a non-positive input
 * @example compressionTimeConstant(1e-9, 2e-5, 1e7, 1e-8) // 20 s
 */
export function compressionTimeConstant(compressibility: number, meltVolume: number, pressure: number, flowRate: number): number {
  requirePositive(compressibility, "compressibility");
  requirePositive(meltVolume, "meltVolume");
  requirePositive(pressure, "pressure");
  requirePositive(flowRate, "flowRate");
  return (compressibility * meltVolume * pressure) / flowRate;
}

/**
 * Time for a first-order approach to come within a fraction ε of its final value: ln(1/ε)·τ.
 * @param timeConstant τ, s (≥ 0)
 * @param settleTolerance ε, between 0 and 1
 * @returns s
 * @example settlingTime(10, 0.01) // 46.05 s
 */
export function settlingTime(timeConstant: number, settleTolerance: number): number {
  return Math.log(1 / settleTolerance) * timeConstant;
}
