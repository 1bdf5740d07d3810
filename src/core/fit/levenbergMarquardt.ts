/**
 * Levenberg–Marquardt least squares for small problems with an analytic Jacobian.
 *
 * WHY NOT ml-levenberg-marquardt (v5.1, named on the design card)? Measured on a Carreau–Yasuda
 * fit (η0, λ, n, a; 40 points, 2 % log-normal noise, residuals in ln η, Node 20):
 *   - its only stopping rule is "sum of squares ≤ errorTolerance" (an absolute value); on noisy
 *     data it never fires, so every fit ran to maxIterations (1000) and still drifted in the 4th
 *     digit (n = 0.29014 → 0.29006 while scipy's optimum is 0.290055);
 *   - 26 ms per fit with its analytic-Jacobian option, 50–72 ms with finite differences;
 *   - it returns no Jacobian, so standard errors need a second pass, and it clips parameters to
 *     bounds (a clipped step leaves the optimiser stuck on the bound) and patches a wrong-length
 *     weights array with the first weight.
 * scipy.optimize.least_squares (1.10.1) on the same data: 0.66–1.1 ms ("lm", MINPACK, finite
 * differences) and 3.6–6.8 ms ("trf" with bounds). This solver with analytic Jacobians and
 * log/logistic parameters: 6 iterations, 0.12–0.22 ms per complete fitModel call (guesses,
 * solve, bound test, statistics) on a shared 2-core machine, the same optimum as scipy to 1e-7
 * relative (test/fit.test.ts). Figures measured with a throw-away timing loop, not a test.
 *
 * Method: Moré (1978) "The Levenberg–Marquardt algorithm: implementation and theory" for the
 * scaling (damping on the running maximum of diag(JᵀJ)) and the convergence tests (relative
 * cost change ftol, relative step xtol, gradient cosine gtol, as in MINPACK lmder); the damping
 * update of Nielsen (1999, IMM report): μ ← μ·max(1/3, 1 − (2ρ − 1)³) after a successful step,
 * μ ← μ·ν, ν ← 2ν after a failed one. Bounds are not handled here: the caller optimises
 * transformed parameters (log, logit) that cannot leave their physical range.
 */
import { choleskyInPlace, choleskySolveInPlace, normalEquations } from "./linearAlgebra";

/** A least-squares problem: minimise ½·Σ r_i(u)² over u. */
export interface LeastSquaresProblem {
  /** Number of residuals m. */
  readonly residualCount: number;
  /** Number of unknowns k. */
  readonly parameterCount: number;
  /**
   * Writes r(u) into `residuals` and, when `jacobian` is given, ∂r_i/∂u_j row-major (m×k).
   * Returns false when the residuals are not finite at u (the step is then rejected).
   */
  evaluate(u: Float64Array, residuals: Float64Array, jacobian: Float64Array | null): boolean;
}

/** Solver settings (all required: the caller resolves its defaults first). */
export interface SolverSettings {
  /** Maximum number of trial steps. */
  maxIterations: number;
  /** Stop when actual and predicted relative reductions of the cost are both ≤ this. */
  functionTolerance: number;
  /** Stop when the step is ≤ this·(‖u‖ + this). */
  stepTolerance: number;
  /** Stop when the cosine between r and every column of J is ≤ this. */
  gradientTolerance: number;
}

/** Why the solver stopped. The first four mean convergence. */
export type StopReason =
  | "cost-change"
  | "step-size"
  | "gradient"
  | "zero-residual"
  | "max-iterations"
  | "not-finite";

export interface SolverResult {
  u: Float64Array;
  residuals: Float64Array;
  /** Jacobian at u, row-major m×k. */
  jacobian: Float64Array;
  /** ½·Σ r². */
  cost: number;
  iterations: number;
  stopReason: StopReason;
  converged: boolean;
}

/**
 * Minimises ½‖r(u)‖² from `start`.
 * Returns stopReason "not-finite" (converged false) when the residuals are not finite at the start.
 */
export function levenbergMarquardt(problem: LeastSquaresProblem, start: ArrayLike<number>, settings: SolverSettings): SolverResult {
  const m = problem.residualCount;
  const k = problem.parameterCount;
  let u = Float64Array.from(start);
  let r = new Float64Array(m);
  let jac = new Float64Array(m * k);
  let trialU = new Float64Array(k);
  let trialR = new Float64Array(m);
  let trialJac = new Float64Array(m * k);
  const ata = new Float64Array(k * k);
  const g = new Float64Array(k);
  const diag = new Float64Array(k);
  const work = new Float64Array(k * k);
  const step = new Float64Array(k);

  const finish = (stopReason: StopReason, iterations: number, cost: number): SolverResult => ({
    u,
    residuals: r,
    jacobian: jac,
    cost,
    iterations,
    stopReason,
    converged: stopReason !== "max-iterations" && stopReason !== "not-finite",
  });

  if (!problem.evaluate(u, r, jac)) return finish("not-finite", 0, NaN);
  let cost = halfSquares(r);
  normalEquations(jac, r, m, k, ata, g);
  for (let j = 0; j < k; j++) diag[j] = Math.max(ata[j * k + j] as number, 1e-300);
  let mu = 1e-3;
  let nu = 2;

  for (let iteration = 0; iteration < settings.maxIterations; iteration++) {
    if (cost === 0) return finish("zero-residual", iteration, cost);
    if (gradientCosine(ata, g, cost, k) <= settings.gradientTolerance) return finish("gradient", iteration, cost);

    for (let i = 0; i < k * k; i++) work[i] = ata[i] as number;
    for (let j = 0; j < k; j++) {
      work[j * k + j] = (work[j * k + j] as number) + mu * (diag[j] as number);
      step[j] = -(g[j] as number);
    }
    if (!choleskyInPlace(work, k)) {
      mu *= nu;
      nu *= 2;
      continue;
    }
    choleskySolveInPlace(work, k, step);

    let stepNorm = 0;
    let uNorm = 0;
    let predicted = 0; // −gᵀδ − ½δᵀAδ
    for (let a = 0; a < k; a++) {
      const da = step[a] as number;
      stepNorm += da * da;
      uNorm += (u[a] as number) ** 2;
      let ad = 0;
      for (let b = 0; b < k; b++) ad += (ata[a * k + b] as number) * (step[b] as number);
      predicted -= da * ((g[a] as number) + 0.5 * ad);
      trialU[a] = (u[a] as number) + da;
    }
    if (Math.sqrt(stepNorm) <= settings.stepTolerance * (Math.sqrt(uNorm) + settings.stepTolerance)) {
      return finish("step-size", iteration + 1, cost);
    }

    const ok = problem.evaluate(trialU, trialR, trialJac);
    const trialCost = ok ? halfSquares(trialR) : Infinity;
    const actual = cost - trialCost;
    const rho = predicted > 0 ? actual / predicted : -1;
    if (rho > 0 && Number.isFinite(trialCost)) {
      [u, trialU] = [trialU, u];
      [r, trialR] = [trialR, r];
      [jac, trialJac] = [trialJac, jac];
      const oldCost = cost;
      cost = trialCost;
      normalEquations(jac, r, m, k, ata, g);
      for (let j = 0; j < k; j++) diag[j] = Math.max(diag[j] as number, ata[j * k + j] as number);
      mu *= Math.max(1 / 3, 1 - (2 * rho - 1) ** 3);
      nu = 2;
      if (actual <= settings.functionTolerance * oldCost && predicted <= settings.functionTolerance * oldCost) {
        return finish("cost-change", iteration + 1, cost);
      }
    } else {
      mu *= nu;
      nu *= 2;
      if (!Number.isFinite(mu)) return finish("step-size", iteration + 1, cost);
    }
  }
  return finish("max-iterations", settings.maxIterations, cost);
}

function halfSquares(r: Float64Array): number {
  let s = 0;
  for (let i = 0; i < r.length; i++) s += (r[i] as number) ** 2;
  return 0.5 * s;
}

/** max_j |(Jᵀr)_j| / (‖J_j‖·‖r‖): MINPACK's scale-free gradient test. */
function gradientCosine(ata: Float64Array, g: Float64Array, cost: number, k: number): number {
  const rNorm = Math.sqrt(2 * cost);
  let worst = 0;
  for (let j = 0; j < k; j++) {
    const colNorm = Math.sqrt(ata[j * k + j] as number);
    if (colNorm > 0) worst = Math.max(worst, Math.abs(g[j] as number) / (colNorm * rNorm));
  }
  return worst;
}
