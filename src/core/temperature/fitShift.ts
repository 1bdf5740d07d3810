/**
 * Shift factors from viscosity curves at several temperatures, by time–temperature
 * superposition: η(γ̇, T) = a_T·η_ref(a_T·γ̇) (Dealy & Wang, Melt Rheology (2013), from memory).
 *
 * Method: one joint least-squares fit in ln η of the shift-law constants and a smooth master
 * curve ln η_ref = P(ln γ̇_r), a polynomial of degree options.polynomialDegree in the reduced
 * rate γ̇_r = a_T·γ̇:  ln η_ij = ln a_T(T_i) + P(ln γ̇_ij + ln a_T(T_i)) (with options.verticalShift
 * ln η_ij − ln b_T(T_i) on the left, b_T = ρ(T)T/(ρ_ref T_ref)). The law's constants come
 * with standard errors from the Jacobian at the optimum (as in fitModel). Starting values: a grid
 * over Ea (or C1) with the master-curve coefficients solved linearly at each grid point.
 * The master curve must describe the data: a polynomial misfit biases the shift (tests: data
 * built on a polynomial master curve are recovered exactly, Carreau–Yasuda ones to ~1 %).
 */
import { RheoError, requirePositive, warning, type Warning } from "../errors";
import { levenbergMarquardt, type LeastSquaresProblem } from "../fit/levenbergMarquardt";
import { choleskyInPlace, choleskySolveInPlace, normalEquations } from "../fit/linearAlgebra";
import { fitStatistics } from "../fit/statistics";
import { validateCurves, type TemperatureCurve } from "./curves";
import { GAS_CONSTANT, WLF_UNIVERSAL_C1, WLF_UNIVERSAL_C2, verticalShiftFactor, wlfConstantsAtReference, type VerticalShift } from "./shiftFactors";

/** Options of the shift fits. */
export interface ShiftFitOptions {
  /** Degree of the master-curve polynomial in ln γ̇_r (1–6). */
  polynomialDegree: number;
  maxIterations: number;
  /** WLF only: hold C1 at this value. */
  C1?: number;
  /** WLF only: hold C2 (K) at this value. */
  C2?: number;
  /**
   * WLF only: the glass transition temperature T_g (K). When the data cannot determine C2 (two
   * temperatures, or a free fit that fails or leaves C2 undetermined) C2 is held at the universal
   * 51.6 K converted to T_ref: C2 = 51.6 K + T_ref − T_g (wlfConstantsAtReference).
   */
  glassTransitionTemperature?: number;
  /** the vertical shift b_T = ρ(T)T/(ρ_ref T_ref) of the viscosities (shiftFactors.ts); absent: none */
  verticalShift?: VerticalShift;
}

/** Defaults of the shift fits; docs and tests import this constant. */
export const DEFAULT_SHIFT_FIT_OPTIONS: Readonly<ShiftFitOptions> = Object.freeze({ polynomialDegree: 3, maxIterations: 200 });

export interface ShiftFactorEntry {
  temperature: number;
  aT: number;
  /** vertical factor b_T (1 without a vertical shift) */
  bT: number;
}

interface ShiftFitCommon {
  referenceTemperature: number;
  factors: ShiftFactorEntry[];
  /** Master curve ln η_ref = Σ c_k·((ln γ̇_r − center)/halfWidth)^k. */
  masterPolynomial: { coefficients: number[]; center: number; halfWidth: number };
  rmse: number;
  iterations: number;
  converged: boolean;
  warnings: Warning[];
  /** the vertical shift the fit used (options.verticalShift), so the result is a complete ShiftLaw */
  verticalShift?: VerticalShift;
}

export interface ArrheniusShiftFit extends ShiftFitCommon {
  law: "arrhenius";
  /** Ea (J/mol). */
  activationEnergy: number;
  activationEnergyStandardError: number;
}

export interface WlfShiftFit extends ShiftFitCommon {
  law: "wlf";
  C1: number;
  /** K */
  C2: number;
  /** NaN for a constant that was held. */
  C1StandardError: number;
  C2StandardError: number;
  /** how C2 was found: fitted, held at options.C2, or the universal value converted to T_ref */
  C2Source: "fitted" | "held" | "universal";
  /** the universal constants converted to T_ref (with options.glassTransitionTemperature), else null */
  universalAtReference: { C1: number; C2: number } | null;
}

/** A shift law's ln a_T and its derivatives with respect to the law's free constants θ. */
interface LawShape {
  names: string[];
  /** Solver coordinates u ↔ constants θ = u·scale (keeps u of order 1). */
  scale: number[];
  logShift(theta: ArrayLike<number>, dT: number, T: number, grad: Float64Array | null): number;
}

/**
 * Arrhenius fit of shift factors: a_T = exp[(Ea/R)(1/T − 1/T_ref)].
 * @param curves viscosity curves (T in K, γ̇ in 1/s, η in Pa·s), at least 2 temperatures
 * @param referenceTemperature T_ref (K)
 * @returns Ea (J/mol) with its standard error, a_T per curve, warnings
 * @throws RheoError for invalid curves (naming curves[i].field and row), fewer than 2
 *   temperatures, a bad option, or a fit that does not converge (`convergence`).
 * @example fitArrheniusShift(curves, 473.15).activationEnergy // J/mol
 */
export function fitArrheniusShift(curves: readonly TemperatureCurve[], referenceTemperature: number, options: Partial<ShiftFitOptions> = {}): ArrheniusShiftFit {
  const shape: LawShape = {
    names: ["activationEnergy"],
    scale: [1000 * GAS_CONSTANT],
    logShift(theta, _dT, T, grad) {
      const x = 1 / T - 1 / referenceTemperature;
      if (grad) grad[0] = x / GAS_CONSTANT;
      return ((theta[0] as number) / GAS_CONSTANT) * x;
    },
  };
  const grid = Array.from({ length: 41 }, (_, i) => [i * 10e3]);
  const fit = fitShiftLaw(curves, referenceTemperature, options, shape, grid);
  return {
    law: "arrhenius",
    activationEnergy: fit.theta[0] as number,
    activationEnergyStandardError: fit.se[0] as number,
    ...fit.common,
  };
}

/**
 * WLF fit of shift factors: log10 a_T = −C1(T − T_ref)/(C2 + T − T_ref).
 *
 * C2 is fitted when the data allow it: three or more temperatures, a converged fit, C2 > 0 and a
 * standard error below C2. Otherwise C2 is held at the universal 51.6 K (Williams, Landel & Ferry
 * 1955), which belongs to T_ref = T_g, converted to the chosen T_ref: C2 = 51.6 K + T_ref − T_g
 * (options.glassTransitionTemperature; wlfConstantsAtReference), and only C1 is fitted; a
 * WLF_C2_UNIVERSAL warning says so. Without T_g two temperatures cannot give C2 (an error), and a
 * free fit that leaves C2 undetermined is returned with WLF_C2_POORLY_DETERMINED.
 * @throws RheoError as {@link fitArrheniusShift}; ("missing") naming glassTransitionTemperature
 *   when two temperatures and no T_g leave C2 undetermined.
 */
export function fitWlfShift(curves: readonly TemperatureCurve[], referenceTemperature: number, options: Partial<ShiftFitOptions> = {}): WlfShiftFit {
  validateCurves(curves, 2);
  requirePositive(referenceTemperature, "referenceTemperature");
  const levels = new Set(curves.map((c) => c.temperature)).size;
  const Tg = options.glassTransitionTemperature;
  const universal = Tg === undefined ? null : wlfConstantsAtReference(referenceTemperature, requirePositive(Tg, "glassTransitionTemperature"));
  if (options.C1 !== undefined && options.C2 !== undefined) throw new RheoError("value", "options", "holds both C1 and C2; nothing is left to fit");
  if (options.C2 !== undefined) return { ...wlfWith(curves, referenceTemperature, options, undefined, options.C2), C2Source: "held", universalAtReference: universal };
  let reason: string;
  let free: Omit<WlfShiftFit, "C2Source" | "universalAtReference"> | null = null;
  if (levels < 3) reason = `${levels} temperatures cannot determine C2`;
  else {
    try {
      free = wlfWith(curves, referenceTemperature, options, options.C1, undefined);
      const se = free.C2StandardError;
      reason = !(free.C2 > 0) ? `the fitted C2 (${fmt(free.C2)} K) is not positive` : !(Number.isFinite(se) && se < free.C2) ? `the fitted C2 (${fmt(free.C2)} K) has a standard error of ${fmt(se)} K` : "";
    } catch (e) {
      if (!(e instanceof RheoError) || e.kind !== "convergence") throw e;
      reason = "the free fit of C1 and C2 did not converge";
    }
    if (free && reason === "") return { ...free, C2Source: "fitted", universalAtReference: universal };
  }
  if (universal !== null) {
    const held = wlfWith(curves, referenceTemperature, options, options.C1, universal.C2);
    held.warnings.push(
      warning(
        "WLF_C2_UNIVERSAL",
        `C2 was not fitted (${reason}): it is held at the universal 51.6 K converted to T_ref with T_g = ${fmt(Tg as number)} K, C2 = 51.6 + T_ref − T_g = ${fmt(universal.C2)} K (Williams, Landel & Ferry 1955; the universal C1 would be ${fmt(universal.C1)}), and only C1 is fitted.`,
      ),
    );
    return { ...held, C2Source: "universal", universalAtReference: universal };
  }
  if (free === null) {
    throw new RheoError(
      "missing",
      "glassTransitionTemperature",
      `WLF with ${reason === "" ? "these data" : reason}: give the glass transition temperature T_g so the universal constants (C1 = ${WLF_UNIVERSAL_C1}, C2 = ${WLF_UNIVERSAL_C2} K at T_g) can be converted to T_ref, or hold C2`,
    );
  }
  free.warnings.push(warning("WLF_C2_POORLY_DETERMINED", `The data do not determine C2 well (${reason}); give the glass transition temperature T_g to hold C2 at the universal value converted to T_ref, or hold C2.`));
  return { ...free, C2Source: "fitted", universalAtReference: null };
}

/** One WLF fit with C1 and/or C2 held (undefined: fitted). */
function wlfWith(curves: readonly TemperatureCurve[], referenceTemperature: number, options: Partial<ShiftFitOptions>, heldC1: number | undefined, heldC2: number | undefined): Omit<WlfShiftFit, "C2Source" | "universalAtReference"> {
  const names = [...(heldC1 === undefined ? ["C1"] : []), ...(heldC2 === undefined ? ["C2"] : [])];
  const shape: LawShape = {
    names,
    scale: names.map((n) => (n === "C1" ? 10 : 100)),
    logShift(theta, dT, _T, grad) {
      const C1 = heldC1 ?? (theta[0] as number);
      const C2 = heldC2 ?? (theta[names.length - 1] as number);
      const den = C2 + dT;
      if (!(den > 0)) return NaN;
      if (grad) {
        let k = 0;
        if (heldC1 === undefined) grad[k++] = (-Math.LN10 * dT) / den;
        if (heldC2 === undefined) grad[k] = (Math.LN10 * C1 * dT) / (den * den);
      }
      return (-Math.LN10 * C1 * dT) / den;
    },
  };
  const minDT = Math.min(...curves.map((c) => c.temperature - referenceTemperature));
  const c2Start = heldC2 ?? Math.max(WLF_UNIVERSAL_C2, 10 - minDT);
  const grid: number[][] = [];
  for (let i = 1; i <= 40; i++) grid.push(names.length === 2 ? [i, c2Start] : names[0] === "C1" ? [i] : [c2Start + 5 * (i - 1)]);
  const fit = fitShiftLaw(curves, referenceTemperature, options, shape, grid);
  const value = (n: string, held: number | undefined) => held ?? (fit.theta[names.indexOf(n)] as number);
  const se = (n: string) => (names.includes(n) ? (fit.se[names.indexOf(n)] as number) : NaN);
  return { law: "wlf", C1: value("C1", heldC1), C2: value("C2", heldC2), C1StandardError: se("C1"), C2StandardError: se("C2"), ...fit.common };
}

function fmt(x: number): string {
  return Number(x.toPrecision(4)).toString();
}

function fitShiftLaw(
  curves: readonly TemperatureCurve[],
  referenceTemperature: number,
  options: Partial<ShiftFitOptions>,
  shape: LawShape,
  grid: number[][],
): { theta: Float64Array; se: Float64Array; common: ShiftFitCommon } {
  validateCurves(curves, 2);
  requirePositive(referenceTemperature, "referenceTemperature");
  const opts: ShiftFitOptions = { ...DEFAULT_SHIFT_FIT_OPTIONS, ...options };
  if (!Number.isInteger(opts.polynomialDegree) || opts.polynomialDegree < 1 || opts.polynomialDegree > 6) {
    throw new RheoError("value", "options.polynomialDegree", `must be an integer from 1 to 6, got ${opts.polynomialDegree}`);
  }
  const lnB = (T: number) => (opts.verticalShift ? Math.log(verticalShiftFactor(T, referenceTemperature, opts.verticalShift.thermalExpansion)) : 0);
  // with the vertical shift, ln η − ln b_T = ln a_T + P(ln γ̇ + ln a_T)
  const points = curves.flatMap((c) => c.shearRate.map((g, i) => ({ T: c.temperature, x: Math.log(g), y: Math.log(c.viscosity[i] as number) - lnB(c.temperature) })));
  const nTheta = shape.names.length;
  const nCoef = opts.polynomialDegree + 1;
  const k = nTheta + nCoef;
  if (points.length <= k) throw new RheoError("missing", "curves", `${points.length} points cannot determine ${k} unknowns (shift constants and a degree-${opts.polynomialDegree} master curve)`);
  const xs = points.map((p) => p.x);
  const center = (Math.max(...xs) + Math.min(...xs)) / 2;
  const halfWidth = Math.max((Math.max(...xs) - Math.min(...xs)) / 2, 1);
  const m = points.length;
  const gradTheta = new Float64Array(nTheta);

  const problem: LeastSquaresProblem = {
    residualCount: m,
    parameterCount: k,
    evaluate(u, r, jac) {
      const theta = shape.scale.map((s, j) => s * (u[j] as number));
      for (let i = 0; i < m; i++) {
        const pt = points[i] as (typeof points)[number];
        const lnA = shape.logShift(theta, pt.T - referenceTemperature, pt.T, jac ? gradTheta : null);
        const z = (pt.x + lnA - center) / halfWidth;
        let value = 0;
        let slope = 0;
        for (let c = nCoef - 1; c >= 0; c--) {
          slope = slope * z + value;
          value = value * z + (u[nTheta + c] as number);
        }
        r[i] = lnA + value - pt.y;
        if (!Number.isFinite(r[i] as number)) return false;
        if (jac) {
          const dLnA = 1 + slope / halfWidth;
          for (let j = 0; j < nTheta; j++) jac[i * k + j] = dLnA * (gradTheta[j] as number) * (shape.scale[j] as number);
          let power = 1;
          for (let c = 0; c < nCoef; c++) {
            jac[i * k + nTheta + c] = power;
            power *= z;
          }
        }
      }
      return true;
    },
  };

  const start = bestGridStart(problem, grid, shape, nTheta, nCoef);
  const solved = levenbergMarquardt(problem, start, { maxIterations: opts.maxIterations, functionTolerance: 1e-12, stepTolerance: 1e-10, gradientTolerance: 1e-10 });
  if (!solved.converged) throw new RheoError("convergence", "curves", `the shift fit did not converge after ${solved.iterations} iterations (${solved.stopReason})`);
  const jacTheta = Float64Array.from(solved.jacobian);
  for (let i = 0; i < m; i++) for (let j = 0; j < nTheta; j++) jacTheta[i * k + j] = (jacTheta[i * k + j] as number) / (shape.scale[j] as number);
  const stats = fitStatistics(jacTheta, solved.residuals, Float64Array.from(points, (p) => p.y), new Float64Array(m).fill(1), k, 0.95);
  const theta = Float64Array.from(shape.scale, (s, j) => s * (solved.u[j] as number));
  const temps = [...new Set(curves.map((c) => c.temperature))].sort((a, b) => a - b);
  const warnings: Warning[] = [];
  if (referenceTemperature < (temps[0] as number) || referenceTemperature > (temps[temps.length - 1] as number)) {
    warnings.push(warning("REFERENCE_OUTSIDE_DATA", `the reference temperature ${referenceTemperature} K lies outside the measured ${temps[0]}–${temps[temps.length - 1]} K; the master curve is extrapolated`));
  }
  return {
    theta,
    se: stats.standardErrors.slice(0, nTheta),
    common: {
      referenceTemperature,
      factors: temps.map((T) => ({ temperature: T, aT: Math.exp(shape.logShift(theta, T - referenceTemperature, T, null)), bT: Math.exp(lnB(T)) })),
      masterPolynomial: { coefficients: Array.from(solved.u.slice(nTheta)), center, halfWidth },
      rmse: stats.rmse,
      iterations: solved.iterations,
      converged: solved.converged,
      warnings,
      ...(opts.verticalShift ? { verticalShift: opts.verticalShift } : {}),
    },
  };
}

/** For each grid value of θ, the master-curve coefficients are linear: solve them and keep the best. */
function bestGridStart(problem: LeastSquaresProblem, grid: number[][], shape: LawShape, nTheta: number, nCoef: number): Float64Array {
  const k = nTheta + nCoef;
  const m = problem.residualCount;
  const r = new Float64Array(m);
  const jac = new Float64Array(m * k);
  const sub = new Float64Array(m * nCoef);
  const ata = new Float64Array(nCoef * nCoef);
  const atr = new Float64Array(nCoef);
  let best = { cost: Infinity, u: new Float64Array(k) };
  for (const theta of grid) {
    const u = new Float64Array(k);
    theta.forEach((t, j) => (u[j] = t / (shape.scale[j] as number)));
    if (!problem.evaluate(u, r, jac)) continue;
    for (let i = 0; i < m; i++) for (let c = 0; c < nCoef; c++) sub[i * nCoef + c] = jac[i * k + nTheta + c] as number;
    normalEquations(sub, r, m, nCoef, ata, atr);
    if (!choleskyInPlace(ata, nCoef)) continue;
    for (let c = 0; c < nCoef; c++) atr[c] = -(atr[c] as number);
    choleskySolveInPlace(ata, nCoef, atr);
    for (let c = 0; c < nCoef; c++) u[nTheta + c] = atr[c] as number;
    if (!problem.evaluate(u, r, null)) continue;
    const cost = r.reduce((s, v) => s + v * v, 0);
    if (cost < best.cost) best = { cost, u };
  }
  if (!Number.isFinite(best.cost)) throw new RheoError("convergence", "curves", "no starting point of the shift fit gives finite residuals");
  return best.u;
}
