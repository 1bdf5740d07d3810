/**
 * The viscosity a test is planned with: a function η(γ̇) built from what the engineer knows before
 * the test — a fitted model from an earlier test, a power-law guess, one apparent-viscosity point,
 * or a melt flow rate (MFR/MVR) result.
 *
 * One-point estimates need a flow index n: a single point fixes the level of the curve, not its
 * slope. {@link DEFAULT_ASSUMED_FLOW_INDEX} (n = 0.4) is a typical value for commodity polymer melts
 * at 10–1000 1/s (common practice, no source); give the n of a similar material when known.
 */
import { RheoError, requirePositive } from "./errors";
import { getModel, parameterVector } from "./models";
import { shiftFactor, verticalFactor, type ShiftLaw } from "./temperature/shiftFactors";

/** Viscosity η (Pa·s) as a function of the true shear rate γ̇ (1/s). */
export type ViscosityFunction = (shearRate: number) => number;

/** Flow index assumed when a single point is all that is known (common practice, no source). */
export const DEFAULT_ASSUMED_FLOW_INDEX = 0.4;

/** Standard gravity g_n = 9.80665 m/s² (CGPM 1901; NIST SP 811), for MFR loads given as masses. */
export const STANDARD_GRAVITY = 9.80665;

/**
 * Melt-flow-rate geometry (ISO 1133-1 / ASTM D1238): die bore 2.095 mm, die length 8.000 mm,
 * barrel bore 9.550 mm (from memory; check the standard's text before relying on the decimals).
 */
export const DEFAULT_MFR_GEOMETRY = Object.freeze({ dieDiameter: 2.095e-3, dieLength: 8.0e-3, barrelDiameter: 9.55e-3 });

/**
 * Power law η = K·γ̇^(n−1) as a function (Bird, Armstrong & Hassager 1987, vol. 1, ch. 4, from memory).
 * @param consistency K in Pa·s^n (> 0)
 * @param flowIndex n (> 0)
 * @example powerLawViscosity(1e4, 0.4)(10) // 2511.9 Pa·s
 */
export function powerLawViscosity(consistency: number, flowIndex: number): ViscosityFunction {
  requirePositive(consistency, "K");
  requirePositive(flowIndex, "n");
  return (rate) => consistency * Math.pow(rate, flowIndex - 1);
}

/**
 * A registry model (src/core/models) with its parameters as a function η(γ̇). The parameters are
 * checked once here (errors name `argument`); for `cross-wlf` the temperature (K) is required.
 * @throws RheoError for an unknown model, unknown/missing/out-of-bounds parameters, a missing
 *   temperature.
 * @example modelViscosity("newtonian", { mu: 1.0016e-3 })(100) // 1.0016e-3 Pa·s
 */
export function modelViscosity(model: string, parameters: Record<string, number>, temperature?: number, argument = "parameters"): ViscosityFunction {
  const def = getModel(model);
  const p = parameterVector(def, parameters, argument);
  if (def.needsTemperature && temperature === undefined) {
    throw new RheoError("missing", "temperature", `${def.id} needs a temperature (K)`);
  }
  const t = temperature === undefined ? NaN : requirePositive(temperature, "temperature");
  return (rate) => Math.exp(def.logViscosity(p, rate, t));
}

/**
 * The power law through one apparent-viscosity point (γ̇_a, η_a = τ_w/γ̇_a) with an assumed flow
 * index n. For a power-law liquid in a round die the true wall rate is γ̇_w = γ̇_a(3n+1)/(4n)
 * (Rabinowitsch 1929), so τ_w = K·γ̇_w^n gives K = η_a·γ̇_a / ((3n+1)/(4n)·γ̇_a)^n.
 * @param shearRateApparent γ̇_a in 1/s (> 0)
 * @param viscosityApparent η_a in Pa·s (> 0)
 * @param flowIndex n (> 0), default {@link DEFAULT_ASSUMED_FLOW_INDEX}
 * @returns { K (Pa·s^n), n }
 * @example powerLawFromApparentPoint(100, 300, 1) // { K: 300, n: 1 }
 */
export function powerLawFromApparentPoint(
  shearRateApparent: number,
  viscosityApparent: number,
  flowIndex = DEFAULT_ASSUMED_FLOW_INDEX,
): { K: number; n: number } {
  requirePositive(shearRateApparent, "shearRateApparent");
  requirePositive(viscosityApparent, "viscosityApparent");
  requirePositive(flowIndex, "n");
  const stress = viscosityApparent * shearRateApparent;
  const wallRate = (shearRateApparent * (3 * flowIndex + 1)) / (4 * flowIndex);
  return { K: stress / Math.pow(wallRate, flowIndex), n: flowIndex };
}

/** A melt flow rate result: mass (MFR) or volume (MVR) rate under a dead-weight load. */
export interface MeltFlowPoint {
  /** MFR in kg/s (e.g. 2 g/10min = 3.333e-6 kg/s); give this or `volumeRate`. */
  massRate?: number;
  /** MVR in m³/s; give this or `massRate`. */
  volumeRate?: number;
  /** Nominal load as a mass in kg (e.g. 2.16), piston included as the standard defines it. */
  load: number;
  /** Melt density at the test temperature, kg/m³ (needed with `massRate`). */
  density?: number;
  /** Assumed flow index n (default {@link DEFAULT_ASSUMED_FLOW_INDEX}). */
  flowIndex?: number;
}

/**
 * The apparent-viscosity point of an MFR/MVR test in the standard geometry
 * ({@link DEFAULT_MFR_GEOMETRY}): Q = MFR/ρ (or MVR), γ̇_a = 32Q/(πD³), ΔP = m·g_n/(πD_b²/4),
 * τ = ΔP·D/(4L) (no entrance correction: the short die makes this an overestimate of τ_w,
 * acceptable for planning), η_a = τ/γ̇_a.
 * @returns { shearRateApparent (1/s), viscosityApparent (Pa·s), wallStress (Pa) }
 * @example meltFlowApparentPoint({ massRate: 2e-3 / 600, load: 2.16, density: 740 })
 */
export function meltFlowApparentPoint(point: MeltFlowPoint): { shearRateApparent: number; viscosityApparent: number; wallStress: number } {
  const g = DEFAULT_MFR_GEOMETRY;
  let q: number;
  if (point.volumeRate !== undefined) {
    if (point.massRate !== undefined) throw new RheoError("value", "mfr", "give a mass rate (MFR) or a volume rate (MVR), not both");
    q = requirePositive(point.volumeRate, "mvr");
  } else if (point.massRate !== undefined) {
    if (point.density === undefined) throw new RheoError("missing", "density", "is needed to turn an MFR (mass rate) into a flow rate");
    q = requirePositive(point.massRate, "mfr") / requirePositive(point.density, "density");
  } else {
    throw new RheoError("missing", "mfr", "give the MFR (mass rate) or the MVR (volume rate)");
  }
  const pressure = (requirePositive(point.load, "mfrLoad") * STANDARD_GRAVITY) / ((Math.PI * g.barrelDiameter ** 2) / 4);
  const rate = (32 * q) / (Math.PI * g.dieDiameter ** 3);
  const wallStress = (pressure * g.dieDiameter) / (4 * g.dieLength);
  return { shearRateApparent: rate, viscosityApparent: wallStress / rate, wallStress };
}

/**
 * Power law from an MFR/MVR result with an assumed flow index: {@link meltFlowApparentPoint} then
 * {@link powerLawFromApparentPoint}.
 * @returns { K (Pa·s^n), n }
 */
export function powerLawFromMeltFlow(point: MeltFlowPoint): { K: number; n: number } {
  const p = meltFlowApparentPoint(point);
  return powerLawFromApparentPoint(p.shearRateApparent, p.viscosityApparent, point.flowIndex ?? DEFAULT_ASSUMED_FLOW_INDEX);
}

/**
 * A prior viscosity moved from the temperature it belongs to, T_prior, to the test's, T_test, by
 * time–temperature superposition (Dealy & Wang, Melt Rheology (2013), ch. 4, from memory):
 * η_test(γ̇) = a·b·η_prior(a·γ̇) with a = a_T(T_test)/a_T(T_prior) of the law (and b the ratio of
 * its vertical factors, 1 without a vertical shift).
 * @param temperatures T_prior and T_test, K
 * @throws RheoError for non-positive temperatures or one outside the law's range (WLF)
 * @example shiftPriorViscosity(() => 1000, { law: "arrhenius", referenceTemperature: 463.15, activationEnergy: 50e3 }, 463.15, 483.15)(10) // 584.2 Pa·s
 */
export function shiftPriorViscosity(viscosity: ViscosityFunction, shift: ShiftLaw, priorTemperature: number, testTemperature: number): ViscosityFunction {
  requirePositive(priorTemperature, "priorTemperature");
  requirePositive(testTemperature, "testTemperature");
  const a = shiftFactor(shift, testTemperature) / shiftFactor(shift, priorTemperature);
  const b = verticalFactor(shift, testTemperature) / verticalFactor(shift, priorTemperature);
  return (rate) => a * b * viscosity(a * rate);
}
