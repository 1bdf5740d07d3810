/**
 * Least-squares fit of a generalized-Newtonian model to a viscosity curve.
 */
import { RheoError, warning, type Warning } from "../errors";
import { getModel, type ModelDefinition, type ModelId, type ParameterSpec } from "../models";
import { PLATEAU_PARAMETERS } from "../models/families";
import { levenbergMarquardt, type StopReason } from "./levenbergMarquardt";
import type { FitOptions, ResidualSpace } from "./options";
import { originalJacobian, residualProblem } from "./residuals";
import { resolveFitOptions, setupFit, type FitSetup } from "./setup";
import { boundedLinearTransform, transformFor, type Transform } from "./transforms";
import { fitStatistics } from "./statistics";
import { validateFitData, type FitData } from "./validate";
import { tQuantile } from "./studentT";
import { dataWindows, plateauTest, type Undetermined } from "./determination";
import { reportParameters, type ParameterEntry } from "./parameterReport";

/** Everything a fit found out. Parameters in SI; uncertainties for the free parameters only. */
export interface FitResult {
  model: ModelId;
  parameters: Record<string, number>;
  standardErrors: Record<string, number>;
  /**
   * Two-sided intervals at options.confidenceLevel (95 % by default), Student t with n − p dof,
   * taken in the parameter's own coordinates (log for a positive quantity: intervals.ts).
   */
  confidenceIntervals: Record<string, [number, number]>;
  /**
   * Every parameter: true when the data determine it (determination.ts: finite covariance,
   * relative standard error within the limit, not on a bound, inside the measured window);
   * false for held (fixed) parameters and undetermined ones.
   */
  determined: Record<string, boolean>;
  /** The free parameters the data do not determine, with the reason and the bound they support. */
  undetermined: Record<string, Undetermined>;
  /** Converged, finite covariance and every free parameter determined. */
  wellDetermined: boolean;
  /** Lowest and highest shear rate fitted (1/s): the curve is an extrapolation outside it. */
  shearRateRange: [number, number];
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
  const jac = solved.atOptimum ?? originalJacobian(def, setup, opts.residualSpace, p, freeIndex);
  const observed = opts.residualSpace === "log" ? setup.logViscosity : setup.viscosity;
  const stats = fitStatistics(jac.jacobian, jac.residuals, observed, setup.weight, freeIndex.length, opts.confidenceLevel);

  const warnings = [...setup.warnings];
  if (!solved.converged) {
    warnings.push(warning("NOT_CONVERGED", `${def.id} fit stopped after ${solved.iterations} iterations (${solved.stopReason}) before converging; the parameters are not an optimum`));
  }
  const parameters: Record<string, number> = {};
  def.parameters.forEach((spec, j) => (parameters[spec.name] = p[j] as number));
  const windows = dataWindows(setup.rates, setup.viscosity, def.needsTemperature ? setup.temperature : undefined);
  const plateau = solved.converged ? plateauTest(def.id, parameters, windows) : {};
  const entries: ParameterEntry[] = def.parameters.map((spec, j) => {
    const f = freeIndex.indexOf(j);
    return {
      spec,
      value: p[j] as number,
      free: f >= 0,
      standardError: f >= 0 ? (stats.standardErrors[f] as number) : NaN,
      atBound: f >= 0 && (solved.atBound.includes(j) || (jac.influence[f] as number) < NEGLIGIBLE_INFLUENCE),
      plateau: plateau[spec.name],
    };
  });
  // t of the intervals: fitStatistics took it already (half-width = t·SE); computed anew only when no SE is finite
  const withSe = stats.standardErrors.findIndex((se) => se > 0 && Number.isFinite(se));
  const t = withSe >= 0 ? (stats.halfWidths[withSe] as number) / (stats.standardErrors[withSe] as number) : tQuantile((1 + opts.confidenceLevel) / 2, setup.rates.length - freeIndex.length);
  const report = reportParameters(entries, t, opts.maxRelativeStandardError, PLATEAU_PARAMETERS[def.id]?.plateau);
  warnings.push(...report.warnings);
  if (stats.singular) warnings.push(warning("SINGULAR_COVARIANCE", `the parameters of ${def.id} are not independently determined by these data; no standard errors or intervals`));
  if (stats.ssr === 0) warnings.push(warning("FIT_EXACT", `${def.id} passes through every point (zero residuals): AIC is −∞ and the parameters have no uncertainty estimate`));
  if (!Number.isFinite(stats.r2)) warnings.push(warning("R2_UNDEFINED", `R² of ${def.id} is undefined: every viscosity is the same, so there is no spread to explain`));
  const { standardErrors, confidenceIntervals, determined, undetermined } = report;
  let rateMin = Infinity;
  let rateMax = -Infinity;
  for (const w of windows) {
    rateMin = Math.min(rateMin, w.shearRateMin);
    rateMax = Math.max(rateMax, w.shearRateMax);
  }

  return {
    model: def.id,
    parameters,
    standardErrors,
    confidenceIntervals,
    determined,
    undetermined,
    wellDetermined: solved.converged && !stats.singular && Object.keys(undetermined).length === 0,
    shearRateRange: [rateMin, rateMax],
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
  /** originalJacobian at p over every free parameter, when the solver's last evaluation gives it. */
  atOptimum?: ReturnType<typeof originalJacobian>;
}

/**
 * Runs the solver over the free parameters in `freeIndex`, the others held at `base`. Those in
 * `linear` move in bounded linear coordinates (they can stop on their admissible bound).
 */
function solve(def: ModelDefinition, setup: FitSetup, opts: FitOptions, freeIndex: readonly number[], base: Float64Array, linear: readonly number[] = []): Solved {
  const transforms = freeIndex.map((j) => {
    const spec = def.parameters[j] as ParameterSpec;
    return linear.includes(j) ? boundedLinearTransform(spec, (base[j] as number) - spec.min) : transformFor(spec);
  });
  const problem = residualProblem(def, setup, opts.residualSpace, freeIndex, transforms, base);
  const u0 = freeIndex.map((j, f) => (transforms[f] as Transform).toFree(base[j] as number));
  const r = levenbergMarquardt(problem, u0, opts);
  if (r.stopReason === "not-finite") {
    throw new RheoError("convergence", "model", `${def.id} gives non-finite viscosities at the starting values; give options.initial`);
  }
  const p = Float64Array.from(base);
  freeIndex.forEach((j, f) => (p[j] = (transforms[f] as Transform).fromFree(r.u[f] as number)));
  const atBound = linear.filter((j) => p[j] === (def.parameters[j] as ParameterSpec).min);
  const everyFree = freeIndex.length === setup.freeIndex.length && opts.residualSpace === "log";
  const atOptimum = everyFree ? fromSolverJacobian(r.residuals, r.jacobian, freeIndex, transforms, r.u, p, setup.sqrtWeight) : undefined;
  return { p, iterations: r.iterations, converged: r.converged, stopReason: r.stopReason, cost: r.cost, atBound, atOptimum };
}

/**
 * The log-space originalJacobian at the solver's optimum, from its last Jacobian in u (converted
 * in place: the solver's result is not used afterwards):
 * ∂r_i/∂p_j = (∂r_i/∂u_j)/(dp_j/du_j), influence max_i |∂ln η_i/∂p_j·p_j| with ∂ln η_i/∂p_j = (∂r_i/∂p_j)/√w_i.
 * Undefined when some dp/du is 0 or not finite (then it is recomputed from the model).
 */
function fromSolverJacobian(
  residuals: Float64Array,
  jacobianU: Float64Array,
  freeIndex: readonly number[],
  transforms: readonly Transform[],
  u: Float64Array,
  p: Float64Array,
  sqrtWeight: Float64Array,
): ReturnType<typeof originalJacobian> | undefined {
  const k = freeIndex.length;
  const n = residuals.length;
  const dpdu = transforms.map((t, f) => t.derivative(u[f] as number));
  if (!dpdu.every((d) => d > 0 && Number.isFinite(d))) return undefined;
  const jacobian = jacobianU;
  const influence = new Float64Array(k);
  for (let i = 0; i < n; i++) {
    const sw = sqrtWeight[i] as number;
    for (let f = 0; f < k; f++) {
      const v = (jacobianU[i * k + f] as number) / (dpdu[f] as number);
      jacobian[i * k + f] = v;
      influence[f] = Math.max(influence[f] as number, Math.abs((v / sw) * (p[freeIndex[f] as number] as number)));
    }
  }
  return { residuals, jacobian, influence };
}

/**
 * Parameters whose physical bound is itself admissible (η∞ = 0, τy = 0) may end on it: the
 * constrained optimum there satisfies ∂SSR/∂p_j ≥ 0 (the Karush–Kuhn–Tucker condition).
 *
 * 1. When the model's gradient is finite on the bound (η∞ of Cross, Carreau, Carreau–Yasuda,
 *    Sisko; τy of Bingham, Herschel–Bulkley), one run usually does it: those parameters move in
 *    linear coordinates with the solver's projected active-set steps, so they can reach the bound
 *    and leave it again. (In log coordinates the solver would crawl towards 0 for ~100 iterations
 *    on melt data that show no second plateau.)
 * 2. Otherwise (Casson: ∂ln η/∂τy is infinite at τy = 0), or when that run does not converge (few
 *    points whose free optimum is a degenerate limit, η0 → ∞), they are held on the bound, and
 *    freed (log coordinates, from the data-based guesses) only when the cost falls as they leave
 *    it and the freed fit converges to a lower cost.
 * The iterations of every run are added up.
 */
function solveWithBounds(def: ModelDefinition, setup: FitSetup, opts: FitOptions): Solved {
  const { freeIndex, start } = setup;
  const candidates = freeIndex.filter((j) => {
    const spec = def.parameters[j] as ParameterSpec;
    return spec.minInclusive && opts.initial[spec.name] === undefined;
  });
  if (candidates.length === 0 || candidates.length === freeIndex.length) return solve(def, setup, opts, freeIndex, start);
  const oneRun = finiteOnBound(def, setup, candidates) ? solve(def, setup, opts, freeIndex, start, candidates) : undefined;
  if (oneRun?.converged) return oneRun;

  const onBound = Float64Array.from(start);
  for (const j of candidates) onBound[j] = (def.parameters[j] as ParameterSpec).min;
  const inner = solve(def, setup, opts, freeIndex.filter((j) => !candidates.includes(j)), onBound);
  const spent = (oneRun?.iterations ?? 0) + inner.iterations;
  if (!inner.converged) return oneRun ? { ...oneRun, iterations: spent } : solve(def, setup, opts, freeIndex, start);

  // Slope of the cost just inside the bound (a tiny step in from it avoids Casson's infinite slope at τy = 0).
  const probe = Float64Array.from(inner.p);
  for (const j of candidates) probe[j] = (probe[j] as number) + 1e-9 * Math.abs(start[j] as number);
  const { residuals, jacobian } = originalJacobian(def, setup, opts.residualSpace, probe, candidates);
  const leaving = candidates.filter((_, c) => {
    let slope = 0;
    for (let i = 0; i < residuals.length; i++) slope += (residuals[i] as number) * (jacobian[i * candidates.length + c] as number);
    return slope < 0;
  });
  if (leaving.length === 0) return { ...inner, iterations: spent, atBound: candidates };

  // Restart from the data-based guesses: the bound-held optimum may be a degenerate limit.
  const full = solve(def, setup, opts, freeIndex, start);
  const iterations = spent + full.iterations;
  return full.converged && full.cost <= inner.cost ? { ...full, iterations } : { ...inner, iterations, atBound: candidates };
}

/** True when ln η and its gradient are finite at the first point with the `candidates` on their bounds. */
function finiteOnBound(def: ModelDefinition, setup: FitSetup, candidates: readonly number[]): boolean {
  const p = Float64Array.from(setup.start);
  for (const j of candidates) p[j] = (def.parameters[j] as ParameterSpec).min;
  const gradient = new Float64Array(p.length);
  const lnEta = def.logGradient(p, setup.rates[0] as number, setup.temperature[0] as number, gradient);
  return Number.isFinite(lnEta) && gradient.every(Number.isFinite);
}
