/**
 * Forward model of slit-die flow (parallel plates, W ≫ H, edge effects neglected): the apparent
 * wall shear rate γ̇_a = 6Q/(WH²) a generalised-Newtonian liquid gives at a known wall stress,
 * from the plane-Poiseuille flow integral (Macosko 1994, ch. 6, from memory; ISO 11443 slit dies):
 *
 *   γ̇_a = 6Q/(WH²) = (3/τ_w²) ∫₀^τw τ γ̇(τ) dτ,   written over the rate with τ = f(g) = η(g)·g:
 *   γ̇_a = (3/τ_w²) ∫₀^γ̇w f(g) g f'(g) dg.
 *
 * Newtonian: γ̇_a = γ̇_w; power law: γ̇_w = γ̇_a(2n+1)/(3n). Round-die twin: forwardFlow.ts.
 *
 * Finite width: a rectangular channel carries less than the parallel-plate flow at the same
 * pressure gradient. For a Newtonian liquid (Boussinesq's series; White, Viscous Fluid Flow,
 * ch. 3; Shah & London 1978; from memory)
 *   Q = (W·H³·ΔP/(12·μ·L))·F,   F = 1 − (192/π⁵)(H/W) Σ_{i odd} tanh(iπW/(2H))/i⁵,
 * so 6Q/(WH²) is F times the wall rate of the plates, and the plates' formulas overstate the
 * viscosity by 1/F − 1 (6.7 % at W/H = 10, 14 % at W/H = 5). {@link slitShapeFactor} gives F.
 */
import { RheoError, requireNonNegative, requirePositive } from "./errors";
import { invertApparentRate, wallStressMoment } from "./forwardFlow";

/**
 * Apparent slit shear rate: γ̇_a = 6Q/(WH²).
 * @param flowRate Q in m³/s (≥ 0); slitWidth W, slitHeight H in m (> 0)
 * @returns γ̇_a in 1/s
 * @example apparentSlitShearRate(1e-8, 0.01, 0.001) // 6 1/s
 */
export function apparentSlitShearRate(flowRate: number, slitWidth: number, slitHeight: number): number {
  requireNonNegative(flowRate, "flowRate");
  requirePositive(slitWidth, "slitWidth");
  requirePositive(slitHeight, "slitHeight");
  return (6 * flowRate) / (slitWidth * slitHeight ** 2);
}

/**
 * Newtonian shape factor F of a rectangular channel of width W and height H (module comment):
 * the flow rate over the parallel-plate flow at the same pressure gradient.
 * @param slitWidth W, slitHeight H, m (> 0; W is the wider side)
 * @returns F in (0, 1]
 * @throws RheoError("domain") for non-positive sizes, or H > W
 * @example slitShapeFactor(10e-3, 1e-3) // 0.93700
 */
export function slitShapeFactor(slitWidth: number, slitHeight: number): number {
  requirePositive(slitWidth, "slitWidth");
  requirePositive(slitHeight, "slitHeight");
  if (slitHeight > slitWidth) throw new RheoError("domain", "slitHeight", `must not exceed the width (${slitWidth} m), got ${slitHeight} m`);
  const aspect = slitWidth / slitHeight;
  let sum = 0;
  for (let i = 1; i < 2000; i += 2) sum += Math.tanh((i * Math.PI * aspect) / 2) / i ** 5;
  return 1 - (192 / Math.PI ** 5) * (sum / aspect);
}

/**
 * Flow rate giving an apparent slit rate (inverse of {@link apparentSlitShearRate}): Q = γ̇_a·W·H²/6.
 * @returns Q in m³/s
 */
export function flowRateForApparentSlitShearRate(shearRateApparent: number, slitWidth: number, slitHeight: number): number {
  requireNonNegative(shearRateApparent, "shearRateApparent");
  requirePositive(slitWidth, "slitWidth");
  requirePositive(slitHeight, "slitHeight");
  return (shearRateApparent * slitWidth * slitHeight ** 2) / 6;
}

/**
 * Apparent slit rate 6Q/(WH²) of a liquid with viscosity η(γ̇) at true wall rate `wallRate` (1/s).
 * The stress must rise with rate.
 * @example apparentSlitRateFromWallRate(() => 10, 100) // 100 (Newtonian)
 */
export function apparentSlitRateFromWallRate(viscosity: (rate: number) => number, wallRate: number, panels = 60): number {
  const { integral, wallStress } = wallStressMoment(viscosity, wallRate, 1, panels);
  return (3 / wallStress ** 2) * integral;
}

/**
 * True wall rate at which the liquid gives the apparent slit rate `apparentRate` (inverse of
 * {@link apparentSlitRateFromWallRate} by {@link invertApparentRate} over γ̇_w/γ̇_a in (0.5, 10)).
 * @returns γ̇_w in 1/s
 * @throws RheoError("convergence") when γ̇_w/γ̇_a lies outside (0.5, 10)
 */
export function wallRateFromApparentSlitRate(viscosity: (rate: number) => number, apparentRate: number): number {
  return invertApparentRate((wall) => apparentSlitRateFromWallRate(viscosity, wall), apparentRate);
}
