/**
 * Shift factors from viscosity curves at several temperatures, by time–temperature
 * superposition: η(γ̇, T) = a_T·η_ref(a_T·γ̇) (Dealy & Wang, Melt Rheology (2013), from memory).
 *
 * Method: one joint least-squares fit in ln η of the shift-law constants and a smooth master
 * curve ln η_ref = P(ln γ̇_r), a polynomial of degree options.polynomialDegree in the reduced
 * rate γ̇_r = a_T·γ̇:  ln η_ij = ln a_T(T_i) + P(ln γ̇_ij + ln a_T(T_i)). The law's constants come
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
import { GAS_CONSTANT, WLF_UNIVERSAL_C2 } from "./shiftFactors";

/** Options of the shift fits. */
export interface ShiftFitOptions {
  /** Degree of the master-curve polynomial in ln γ̇_r (1–6). */
  polynomialDegree: number;
  maxIterations: number;
  /** WLF only: hold C1 at this value. */
  C1?: number;
  /** WLF only: hold C2 (K) at this value; held at 51.6 K automatically with only two temperatures. */
  C2?: number;
}

/** Defaults of the shift fits; docs and tests import this constant. */
export const DEFAULT_SHIFT_FIT_OPTIONS: Readonly<ShiftFitOptions> = Object.freeze({ polynomialDegree: 3, maxIterations: 200 });

export interface ShiftFactorEntry {
  temperature: number;
  aT: number;
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
 * WLF fit of shift factors: log10 a_T = −C1(T − T_ref)/(C2 + T − T_ref). C1 and C2 are fitted
 * unless held by options (C2 is held at 51.6 K, Williams, Landel & Ferry 1955, with only two
 * temperatures).
 * @throws RheoError as {@link fitArrheniusShift}.
 */
export function fitWlfShift(curves: readonly TemperatureCurve[], referenceTemperature: number, options: Partial<ShiftFitOptions> = {}): WlfShiftFit {
  validateCurves(curves, 2);
  const levels = new Set(curves.map((c) => c.temperature)).size;
  const heldC2 = options.C2 ?? (levels < 3 && options.C1 === undefined ? WLF_UNIVERSAL_C2 : undefined);
  const heldC1 = options.C1;
  if (heldC1 !== undefined && heldC2 !== undefined) throw new RheoError("value", "options", "holds both C1 and C2; nothing is left to fit");
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
  const points = curves.flatMap((c) => c.shearRate.map((g, i) => ({ T: c.temperature, x: Math.log(g), y: Math.log(c.viscosity[i] as number) })));
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
      factors: temps.map((T) => ({ temperature: T, aT: Math.exp(shape.logShift(theta, T - referenceTemperature, T, null)) })),
      masterPolynomial: { coefficients: Array.from(solved.u.slice(nTheta)), center, halfWidth },
      rmse: stats.rmse,
      iterations: solved.iterations,
      converged: solved.converged,
      warnings,
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
