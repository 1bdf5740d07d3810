/**
 * Predicted pressure drop over a die at a given rate, for a liquid of known viscosity η(γ̇): the
 * forward problem of capillary rheometry, used to plan a test.
 *
 * - Round capillary: γ̇_w from γ̇_a by inverting the exact flow integral (forwardFlow.ts), τ_w = η(γ̇_w)·γ̇_w,
 *   ΔP = 2τ_w(L/R + e) (Bagley 1957). With e = 0 and η = μ this is Hagen–Poiseuille,
 *   ΔP = 8μLQ/(πR⁴).
 * - Orifice die: the same with L = 0 (or its short land length): ΔP = 2τ_w·e, an entrance-only
 *   estimate at the wall stress a long die of that bore would have.
 * - Slit: γ̇_w from the plane-Poiseuille integral (slitFlow.ts), ΔP = 2τ_w(L/H + e), e in slit
 *   heights (τ_w = ΔP·H/(2L), ISO 11443).
 *
 * e is an assumed entrance allowance: the Bagley end correction from an earlier test, or
 * {@link DEFAULT_PLANNER_OPTIONS}.endCorrection.
 */
import { RheoError, requireNonNegative, requirePositive } from "./errors";
import { apparentRateFromWallRate, DEFAULT_INVERSION_BRACKET, invertApparentRate } from "./forwardFlow";
import { flowRateForApparentShearRate } from "./capillary";
import { apparentSlitRateFromWallRate, flowRateForApparentSlitShearRate } from "./slitFlow";
import type { ViscosityFunction } from "./priorViscosity";

/** Die types the planner knows. */
export type PlanDieKind = "capillary" | "orifice" | "slit";

/** A die available for the test (SI). */
export interface PlanDie {
  /** A label used in tables and warnings (unique within a plan). */
  name: string;
  kind: PlanDieKind;
  /** Bore D (m): capillary and orifice. */
  diameter?: number;
  /** Land length L (m): capillary and slit (> 0); orifice: optional short land (≥ 0, default 0). */
  length?: number;
  /** Slit width W and height (gap) H (m). */
  width?: number;
  height?: number;
  /** Name of the transducer to use with this die; omitted: the planner suggests one. */
  transducer?: string;
}

/** What the liquid does in a die at one rate. SI units. */
export interface DieFlowPoint {
  shearRateApparent: number;
  shearRateWall: number;
  /** η at the true wall rate, Pa·s */
  viscosity: number;
  wallShearStress: number;
  flowRate: number;
  /** 2τ_w·L/R (round) or 2τ_w·L/H (slit), Pa */
  landPressure: number;
  /** 2τ_w·e, Pa */
  entrancePressure: number;
  /** landPressure + entrancePressure, Pa */
  pressure: number;
}

/** Checks a die's geometry for its kind; returns it. */
export function validatePlanDie(die: PlanDie, argument = "dies"): PlanDie {
  const where = `${argument} "${die.name}"`;
  if (die.kind === "capillary" || die.kind === "orifice") {
    if (die.diameter === undefined) throw new RheoError("missing", where, `a ${die.kind} die needs a diameter`);
    requirePositive(die.diameter, `${where} diameter`);
    if (die.kind === "capillary") {
      if (die.length === undefined) throw new RheoError("missing", where, "a capillary die needs a length");
      requirePositive(die.length, `${where} length`);
    } else if (die.length !== undefined) requireNonNegative(die.length, `${where} length`);
    if (die.width !== undefined || die.height !== undefined) throw new RheoError("value", where, `a ${die.kind} die has no width or height; use kind "slit"`);
  } else if (die.kind === "slit") {
    for (const key of ["width", "height", "length"] as const) {
      const v = die[key];
      if (v === undefined) throw new RheoError("missing", where, `a slit die needs ${key}`);
      requirePositive(v, `${where} ${key}`);
    }
    if (die.diameter !== undefined) throw new RheoError("value", where, "a slit die has no diameter; give width and height");
  } else {
    throw new RheoError("value", where, `unknown die kind "${String((die as { kind: unknown }).kind)}"; accepted: capillary, orifice, slit`);
  }
  return die;
}

/** Relative accuracy of the wall-rate inversion (on γ̇_a): enough for planning. */
const INVERSION_TOLERANCE = 1e-9;

/**
 * Quadrature panels of the flow integrals here: 16 instead of the default 60 (measured: the
 * integral stays within 2e-10 of a 240-panel value for power laws with n = 0.2–0.8 and a Carreau
 * law; the finite-difference slope, not the panels, limits the accuracy), four times faster.
 */
const PANELS = 16;

/**
 * What a liquid of viscosity η(γ̇) does in `die` at a rate: on the apparent-rate basis (the
 * default) `rate` is γ̇_a; on the wall basis it is the true wall rate γ̇_w.
 * @param die a validated die ({@link validatePlanDie})
 * @param rate 1/s (> 0)
 * @param endCorrection e (die radii or slit heights, ≥ 0)
 * @throws RheoError("convergence") when the rate inversion leaves its bracket.
 * @example dieFlowPoint(() => 1, { name: "a", kind: "capillary", diameter: 1e-3, length: 2e-2 }, 100, "apparent", 0).pressure
 *   // 8·1·L·Q/(πR⁴) = 8000 Pa
 */
export function dieFlowPoint(
  viscosity: ViscosityFunction,
  die: PlanDie,
  rate: number,
  basis: "apparent" | "wall",
  endCorrection: number,
): DieFlowPoint {
  requirePositive(rate, "shearRate");
  requireNonNegative(endCorrection, "endCorrection");
  const slit = die.kind === "slit";
  const forward = slit ? apparentSlitRateFromWallRate : apparentRateFromWallRate;
  let apparent: number;
  let wall: number;
  if (basis === "apparent") {
    apparent = rate;
    wall = invertApparentRate((w) => forward(viscosity, w, PANELS), rate, DEFAULT_INVERSION_BRACKET, {
      tolerance: INVERSION_TOLERANCE,
      where: ` in die "${die.name}"`,
      consequence: "; this prior cannot be planned with",
    });
  } else {
    wall = rate;
    apparent = forward(viscosity, wall, PANELS);
  }
  const eta = viscosity(wall);
  if (!(eta > 0) || !Number.isFinite(eta)) {
    throw new RheoError("domain", "viscosity", `is not a positive finite number at ${wall.toPrecision(4)} 1/s (got ${eta})`);
  }
  const tau = eta * wall;
  let flowRate: number;
  let lengthRatio: number;
  if (slit) {
    const h = die.height as number;
    flowRate = flowRateForApparentSlitShearRate(apparent, die.width as number, h);
    lengthRatio = (die.length as number) / h;
  } else {
    const d = die.diameter as number;
    flowRate = flowRateForApparentShearRate(apparent, d);
    lengthRatio = (2 * (die.length ?? 0)) / d;
  }
  const landPressure = 2 * tau * lengthRatio;
  const entrancePressure = 2 * tau * endCorrection;
  return {
    shearRateApparent: apparent,
    shearRateWall: wall,
    viscosity: eta,
    wallShearStress: tau,
    flowRate,
    landPressure,
    entrancePressure,
    pressure: landPressure + entrancePressure,
  };
}
