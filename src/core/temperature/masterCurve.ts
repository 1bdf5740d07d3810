/**
 * Master curve and model evaluation at another temperature by time–temperature superposition:
 * reduced rate γ̇_r = a_T·γ̇, reduced viscosity η_r = η/(a_T·b_T); η(γ̇, T) = a_T·b_T·η_ref(a_T·γ̇)
 * (Dealy & Wang, Melt Rheology (2013), from memory), with b_T = 1 unless the law carries the optional
 * vertical shift ρ(T)T/(ρ_ref T_ref) (shiftFactors.ts).
 */
import { RheoError } from "../errors";
import { evaluateModel, getModel } from "../models";
import { validateCurves, type TemperatureCurve } from "./curves";
import { shiftFactor, verticalFactor, type ShiftLaw } from "./shiftFactors";

/** All points reduced to the reference temperature, sorted by reduced rate. */
export interface MasterCurve {
  referenceTemperature: number;
  /** a_T·γ̇ (1/s) */
  shearRate: number[];
  /** η/(a_T·b_T) (Pa·s) */
  viscosity: number[];
  /** Temperature (K) each point was measured at. */
  temperature: number[];
  aT: number[];
  /** vertical factor b_T per point (1 without a vertical shift) */
  bT: number[];
}

/**
 * Reduces curves measured at several temperatures onto the reference temperature of `shift`
 * (a law with its constants, e.g. the result of fitArrheniusShift).
 * @throws RheoError for invalid curves or a temperature outside the law's range (WLF).
 * @example masterCurve(curves, { law: "arrhenius", referenceTemperature: 473.15, activationEnergy: 45e3 })
 */
export function masterCurve(curves: readonly TemperatureCurve[], shift: ShiftLaw): MasterCurve {
  validateCurves(curves, 1);
  const points = curves.flatMap((c) => {
    const aT = shiftFactor(shift, c.temperature);
    const bT = verticalFactor(shift, c.temperature);
    return c.shearRate.map((g, i) => ({ rate: g * aT, eta: (c.viscosity[i] as number) / (aT * bT), T: c.temperature, aT, bT }));
  });
  points.sort((a, b) => a.rate - b.rate);
  return {
    referenceTemperature: shift.referenceTemperature,
    shearRate: points.map((p) => p.rate),
    viscosity: points.map((p) => p.eta),
    temperature: points.map((p) => p.T),
    aT: points.map((p) => p.aT),
    bT: points.map((p) => p.bT),
  };
}

/**
 * η (Pa·s) at temperature T (K) of an isothermal model fitted at the shift law's reference
 * temperature: η(γ̇, T) = a_T·b_T·η_ref(a_T·γ̇) (b_T = 1 without a vertical shift); for yield-stress
 * models this also shifts τy by b_T.
 * @throws RheoError for `cross-wlf` (it carries its own temperature dependence: use evaluateModel
 *   with temperatures), and the errors of evaluateModel and shiftFactor.
 * @example evaluateAtTemperature("cross", fit.parameters, shift, [1, 10], 493.15)
 */
export function evaluateAtTemperature(
  model: string,
  parameters: Record<string, number>,
  shift: ShiftLaw,
  shearRates: readonly number[],
  temperature: number,
): number[] {
  if (getModel(model).needsTemperature) {
    throw new RheoError("value", "model", `${model} carries its own temperature dependence; evaluate it with evaluateModel(model, parameters, shearRates, temperatures)`);
  }
  const aT = shiftFactor(shift, temperature);
  const bT = verticalFactor(shift, temperature);
  return evaluateModel(model, parameters, shearRates.map((g) => g * aT)).map((eta) => eta * aT * bT);
}
