/**
 * Least-squares fit of a generalized-Newtonian model to a viscosity curve.
 */
import { RheoError, warning, type Warning } from "../errors";
import { getModel, type ModelDefinition, type ModelId, type ParameterSpec } from "../models";
import { levenbergMarquardt, type StopReason } from "./levenbergMarquardt";
import type { FitOptions, ResidualSpace } from "./options";
import { originalJacobian, residualProblem } from "./residuals";
import { resolveFitOptions, setupFit, type FitSetup } from "./setup";
import { transformFor, type Transform } from "./transforms";
import { fitStatistics } from "./statistics";
import { validateFitData, type FitData } from "./validate";

/** Everything a fit found out. Parameters in SI; uncertainties for the free parameters only. */
export interface FitResult {
  model: ModelId;
  parameters: Record<string, number>;
  standardErrors: Record<string, number>;
  /** Two-sided intervals at options.confidenceLevel (95 % by default), Student t with n − p dof. */
  confidenceIntervals: Record<string, [number, number]>;
  r2: number;
  rmse: number;
  aic: number;
  /** Weighted sum of squared residuals. */
  ssr: number;
  /** Points used (positive weight) and free parameters. */
  pointCount: number;
  parameterCount: number;
  iterations: number;
  converged: boolean;
  stopReason: StopReason;
  residualSpace: ResidualSpace;
  /** Parameters that were held fixed (options.fixed and the model's defaults). */
  fixed: string[];
  warnings: Warning[];
}

/** Relative influence of a free parameter below which it counts as undetermined (on a bound). */
const NEGLIGIBLE_INFLUENCE = 1e-7;

/**
 * Fits `model` to η(γ̇[, T]) by Levenberg–Marquardt on residuals in ln η (default) or η, with
 * analytic Jacobians; parameters move in log/logistic coordinates so they stay physical.
 * Starting values are guessed from the data unless options.initial gives them.
 *
 * Units: shearRate 1/s, viscosity Pa·s, temperature K; parameters in the SI units of the model
 * registry. Formulas of the statistics: see statistics.ts.
 *
 * @throws RheoError: unknown model or option (`value`); non-finite (`value`) or non-positive
 *   (`domain`) data naming the argument and row; arrays or weights of the wrong length
 *   (`value`); too few points for the free parameters or missing temperatures (`missing`);
 *   non-finite viscosities at the start (`convergence`); non-convergence when
 *   options.throwOnNonConvergence (`convergence`).
 * @example fitModel("power-law", { shearRate: [1, 10, 100], viscosity: [1000, 400, 160] }).parameters
 *   // { K: 1000, n: 0.6 } (nearly)
 */
export function fitModel(model: string, data: FitData, options: Partial<FitOptions> = {}): FitResult {
  const def = getModel(model);
  validateFitData(data);
  const opts = resolveFitOptions(def, options);
  const setup = setupFit(def, data, opts);
  const solved = solveWithBounds(def, setup, opts);
  if (!solved.converged && opts.throwOnNonConvergence) {
    throw new RheoError("convergence", "model", `${def.id} fit did not converge after ${solved.iterations} iterations (${solved.stopReason})`);
  }
  const { freeIndex } = setup;
  const p = solved.p;
  const jac = originalJacobian(def, setup, opts.residualSpace, p, freeIndex);
  const observed = opts.residualSpace === "log" ? setup.logViscosity : setup.viscosity;
  const stats = fitStatistics(jac.jacobian, jac.residuals, observed, setup.weight, freeIndex.length, opts.confidenceLevel);

  const warnings = [...setup.warnings];
  if (!solved.converged) {
    warnings.push(warning("NOT_CONVERGED", `${def.id} fit stopped after ${solved.iterations} iterations (${solved.stopReason}) before converging; the parameters are not an optimum`));
  }
  const parameters: Record<string, number> = {};
  def.parameters.forEach((spec, j) => (parameters[spec.name] = p[j] as number));
  const standardErrors: Record<string, number> = {};
  const confidenceIntervals: Record<string, [number, number]> = {};
  freeIndex.forEach((j, f) => {
    const spec = def.parameters[j] as ParameterSpec;
    const value = p[j] as number;
    const se = stats.standardErrors[f] as number;
    const half = stats.halfWidths[f] as number;
    standardErrors[spec.name] = se;
    const atBound = solved.atBound.includes(j) || (jac.influence[f] as number) < NEGLIGIBLE_INFLUENCE;
    confidenceIntervals[spec.name] = [atBound ? Math.max(spec.min, value - half) : value - half, value + half];
    if (atBound) {
      warnings.push(warning("PARAMETER_AT_BOUND", `${spec.name} is at its bound ${spec.min} (${value.toPrecision(3)}): the data do not call for it; its interval is one-sided`));
    } else if (se > Math.abs(value)) {
      warnings.push(warning("POORLY_DETERMINED", `${spec.name} = ${value.toPrecision(4)} has a standard error of ${se.toPrecision(3)}, larger than the value itself`));
    }
  });
  if (stats.singular) warnings.push(warning("SINGULAR_COVARIANCE", `the parameters of ${def.id} are not independently determined by these data; standard errors are NaN`));

  return {
    model: def.id,
    parameters,
    standardErrors,
    confidenceIntervals,
    r2: stats.r2,
    rmse: stats.rmse,
    aic: stats.aic,
    ssr: stats.ssr,
    pointCount: setup.rates.length,
    parameterCount: freeIndex.length,
    iterations: solved.iterations,
    converged: solved.converged,
    stopReason: solved.stopReason,
    residualSpace: opts.residualSpace,
    fixed: setup.fixedNames,
    warnings,
  };
}

interface Solved {
  p: Float64Array;
  iterations: number;
  converged: boolean;
  stopReason: StopReason;
  cost: number;
  /** Parameter indices left exactly on a physical bound (η∞ = 0, τy = 0). */
  atBound: number[];
}

/** Runs the solver over the free parameters in `freeIndex`, the others held at `base`. */
function solve(def: ModelDefinition, setup: FitSetup, opts: FitOptions, freeIndex: readonly number[], base: Float64Array): Solved {
  const transforms = freeIndex.map((j) => transformFor(def.parameters[j] as ParameterSpec));
  const problem = residualProblem(def, setup, opts.residualSpace, freeIndex, transforms, base);
  const u0 = freeIndex.map((j, f) => (transforms[f] as Transform).toFree(base[j] as number));
  const r = levenbergMarquardt(problem, u0, opts);
  if (r.stopReason === "not-finite") {
    throw new RheoError("convergence", "model", `${def.id} gives non-finite viscosities at the starting values; give options.initial`);
  }
  const p = Float64Array.from(base);
  freeIndex.forEach((j, f) => (p[j] = (transforms[f] as Transform).fromFree(r.u[f] as number)));
  return { p, iterations: r.iterations, converged: r.converged, stopReason: r.stopReason, cost: r.cost, atBound: [] };
}

/**
 * Parameters whose physical bound is itself admissible (η∞ = 0, τy = 0) are tried on the bound
 * first: the fit with them held there is the constrained optimum when the cost does not fall as
 * they leave it (∂SSR/∂p_j ≥ 0, the Karush–Kuhn–Tucker condition); only otherwise are they
 * freed. A log-coordinate solver would otherwise crawl towards 0 for ~100 iterations on melt
 * data that show no second plateau.
 */
function solveWithBounds(def: ModelDefinition, setup: FitSetup, opts: FitOptions): Solved {
  const { freeIndex, start } = setup;
  const candidates = freeIndex.filter((j) => {
    const spec = def.parameters[j] as ParameterSpec;
    return spec.minInclusive && opts.initial[spec.name] === undefined;
  });
  if (candidates.length === 0 || candidates.length === freeIndex.length) return solve(def, setup, opts, freeIndex, start);

  const onBound = Float64Array.from(start);
  for (const j of candidates) onBound[j] = (def.parameters[j] as ParameterSpec).min;
  const inner = solve(def, setup, opts, freeIndex.filter((j) => !candidates.includes(j)), onBound);
  if (!inner.converged) return solve(def, setup, opts, freeIndex, start);

  // Slope of the cost just inside the bound (a tiny step in from it avoids Casson's infinite slope at τy = 0).
  const probe = Float64Array.from(inner.p);
  for (const j of candidates) probe[j] = (probe[j] as number) + 1e-9 * Math.abs(start[j] as number);
  const { residuals, jacobian } = originalJacobian(def, setup, opts.residualSpace, probe, candidates);
  const leaving = candidates.filter((_, c) => {
    let slope = 0;
    for (let i = 0; i < residuals.length; i++) slope += (residuals[i] as number) * (jacobian[i * candidates.length + c] as number);
    return slope < 0;
  });
  if (leaving.length === 0) return { ...inner, atBound: candidates };

  // Restart from the data-based guesses: the bound-held optimum may be a degenerate limit.
  const full = solve(def, setup, opts, freeIndex, start);
  const iterations = inner.iterations + full.iterations;
  return full.converged && full.cost <= inner.cost ? { ...full, iterations } : { ...inner, iterations, atBound: candidates };
}
