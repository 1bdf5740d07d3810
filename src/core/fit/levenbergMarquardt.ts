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
 * On the five-parameter Carreau–Yasuda fit of `npm run bench` (40 points, 2 % noise, η∞ free):
 * scipy.optimize.least_squares 1.10.1 "lm" (MINPACK) takes ~0.32–0.36 ms with the analytic
 * Jacobian (7 evaluations) and ~0.5–0.6 ms with finite differences. This solver: 7 iterations,
 * one run, the same optimum as scipy to ~1e-9 relative; a complete fitModel call (guesses, solve,
 * statistics) takes ~0.08–0.09 ms in `npm run bench` on a shared 2-core machine (4.1–4.2× scipy
 * when the machine is quiet), ~0.05 ms once V8 has optimised every function (after ~3000 calls;
 * the bench's 200-call warm-up ends before that). Most of that time is the model (ln η and its
 * gradient over the curve, the models' logCurve fast path: four transcendental calls a point),
 * then the normal equations and the residual/Jacobian assembly. Figures from `npm run bench`
 * and a loop under `node --cpu-prof`, not a test.
 *
 * Method: Moré (1978) "The Levenberg–Marquardt algorithm: implementation and theory" for the
 * scaling (damping on the running maximum of diag(JᵀJ)) and the convergence tests (relative
 * cost change ftol, relative step xtol, gradient cosine gtol, as in MINPACK lmder); the damping
 * update of Nielsen (1999, IMM report): μ ← μ·max(1/3, 1 − (2ρ − 1)³) after a successful step,
 * μ ← μ·ν, ν ← 2ν after a failed one. Most bounds are kept by the caller's transformed
 * parameters (log, logit), which cannot leave their physical range. Optional lower bounds on u
 * (problem.lowerBounds, for parameters whose bound is admissible: η∞ = 0, τy = 0) are kept by
 * projection with an active set, after Bertsekas, "Projected Newton methods for optimization
 * problems with simple constraints", SIAM J. Control Optim. 20 (1982) 221 (from memory): an
 * unknown on its bound whose gradient points outwards is held for that iteration, the damped
 * system is solved for the others, the trial point is projected onto the bounds and the
 * predicted reduction is taken along the projected step; the gradient test then covers the
 * moving unknowns only (the held ones satisfy the Karush–Kuhn–Tucker sign condition).
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
  /**
   * Lower bounds on u (−Infinity where none; omitted: none). A bound is the only place its
   * unknown may stop on: steps are projected onto it, and an unknown on its bound whose gradient
   * points outwards is held there for that iteration (active set).
   */
  readonly lowerBounds?: ArrayLike<number>;
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
  const lower = problem.lowerBounds;
  // Every array as a view of one buffer: typed arrays above 64 bytes get their own off-heap
  // store in V8, and a handful of those per call cost more than the arithmetic.
  const buffer = new Float64Array(2 * m * k + 2 * m + 2 * k * k + 6 * k);
  let offset = 0;
  const take = (length: number): Float64Array => buffer.subarray(offset, (offset += length));
  let u = take(k);
  let r = take(m);
  let jac = take(m * k);
  let trialU = take(k);
  let trialR = take(m);
  let trialJac = take(m * k);
  const ata = take(k * k);
  const work = take(k * k);
  const g = take(k);
  const diag = take(k);
  const reduced = take(k);
  const step = take(k);
  for (let j = 0; j < k; j++) u[j] = start[j] as number;
  /** The unknowns moved this iteration (all but those held on their bound), kf of them. */
  const free = new Int32Array(k);

  if (!problem.evaluate(u, r, jac)) return result(u, r, jac, NaN, 0, "not-finite");
  let cost = halfSquares(r);
  normalEquations(jac, r, m, k, ata, g);
  for (let j = 0; j < k; j++) diag[j] = Math.max(ata[j * k + j] as number, 1e-300);
  let mu = 1e-3;
  let nu = 2;

  for (let iteration = 0; iteration < settings.maxIterations; iteration++) {
    if (cost === 0) return result(u, r, jac, cost, iteration, "zero-residual");
    // Active set: an unknown on its lower bound whose cost gradient points outwards (∂C/∂u_j ≥ 0) stays there.
    let kf = 0;
    for (let j = 0; j < k; j++) {
      if (!(lower && (u[j] as number) <= (lower[j] as number) && (g[j] as number) >= 0)) free[kf++] = j;
    }
    if (gradientCosine(ata, g, cost, k, free, kf) <= settings.gradientTolerance) return result(u, r, jac, cost, iteration, "gradient");

    // (A_FF + μ·D_FF)·δ_F = −g_F over the free unknowns; δ = 0 for the held ones.
    for (let a = 0; a < kf; a++) {
      const fa = free[a] as number;
      for (let b = 0; b < kf; b++) work[a * kf + b] = ata[fa * k + (free[b] as number)] as number;
      work[a * kf + a] = (work[a * kf + a] as number) + mu * (diag[fa] as number);
      reduced[a] = -(g[fa] as number);
    }
    if (!choleskyInPlace(work, kf)) {
      mu *= nu;
      nu *= 2;
      continue;
    }
    choleskySolveInPlace(work, kf, reduced);
    step.fill(0);
    for (let a = 0; a < kf; a++) step[free[a] as number] = reduced[a] as number;

    // Project the trial point onto the bounds; the model of the cost is then taken along the projected step.
    let stepNorm = 0;
    let uNorm = 0;
    for (let a = 0; a < k; a++) {
      let t = (u[a] as number) + (step[a] as number);
      if (lower && t < (lower[a] as number)) t = lower[a] as number;
      trialU[a] = t;
      const da = t - (u[a] as number);
      step[a] = da;
      stepNorm += da * da;
      uNorm += (u[a] as number) ** 2;
    }
    let predicted = 0; // −gᵀδ − ½δᵀAδ
    for (let a = 0; a < k; a++) {
      let ad = 0;
      for (let b = 0; b < k; b++) ad += (ata[a * k + b] as number) * (step[b] as number);
      predicted -= (step[a] as number) * ((g[a] as number) + 0.5 * ad);
    }
    if (Math.sqrt(stepNorm) <= settings.stepTolerance * (Math.sqrt(uNorm) + settings.stepTolerance)) {
      return result(u, r, jac, cost, iteration + 1, "step-size");
    }

    const ok = problem.evaluate(trialU, trialR, trialJac);
    const trialCost = ok ? halfSquares(trialR) : Infinity;
    const actual = cost - trialCost;
    const rho = predicted > 0 ? actual / predicted : -1;
    if (rho > 0 && Number.isFinite(trialCost)) {
      const [lastU, lastR, lastJac] = [u, r, jac];
      u = trialU;
      r = trialR;
      jac = trialJac;
      trialU = lastU;
      trialR = lastR;
      trialJac = lastJac;
      const oldCost = cost;
      cost = trialCost;
      normalEquations(jac, r, m, k, ata, g);
      for (let j = 0; j < k; j++) diag[j] = Math.max(diag[j] as number, ata[j * k + j] as number);
      mu *= Math.max(1 / 3, 1 - (2 * rho - 1) ** 3);
      nu = 2;
      if (actual <= settings.functionTolerance * oldCost && predicted <= settings.functionTolerance * oldCost) {
        return result(u, r, jac, cost, iteration + 1, "cost-change");
      }
    } else {
      mu *= nu;
      nu *= 2;
      if (!Number.isFinite(mu)) return result(u, r, jac, cost, iteration + 1, "step-size");
    }
  }
  return result(u, r, jac, cost, settings.maxIterations, "max-iterations");
}

function result(u: Float64Array, residuals: Float64Array, jacobian: Float64Array, cost: number, iterations: number, stopReason: StopReason): SolverResult {
  return { u, residuals, jacobian, cost, iterations, stopReason, converged: stopReason !== "max-iterations" && stopReason !== "not-finite" };
}

function halfSquares(r: Float64Array): number {
  let s = 0;
  for (let i = 0; i < r.length; i++) s += (r[i] as number) ** 2;
  return 0.5 * s;
}

/** max_j |(Jᵀr)_j| / (‖J_j‖·‖r‖) over the free unknowns: MINPACK's scale-free gradient test. */
function gradientCosine(ata: Float64Array, g: Float64Array, cost: number, k: number, free: Int32Array, kf: number): number {
  const rNorm = Math.sqrt(2 * cost);
  let worst = 0;
  for (let a = 0; a < kf; a++) {
    const j = free[a] as number;
    const colNorm = Math.sqrt(ata[j * k + j] as number);
    if (colNorm > 0) worst = Math.max(worst, Math.abs(g[j] as number) / (colNorm * rNorm));
  }
  return worst;
}
