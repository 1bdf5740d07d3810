/** Options of {@link fitModel}, with their defaults defined once. */
import { DEFAULT_DETERMINATION_LIMITS } from "./determination";

/** How residuals are measured. */
export type ResidualSpace = "log" | "linear";

export interface FitOptions {
  /** "log": r = ln η_model − ln η (relative errors; default); "linear": r = η_model − η (Pa·s). */
  residualSpace: ResidualSpace;
  /** Parameters held at the given values (SI), e.g. { etaInf: 0 }. */
  fixed: Record<string, number>;
  /** Parameters the model holds fixed by default (Cross-WLF's A2) that should be fitted. */
  free: string[];
  /** Starting values (SI) replacing the automatic guesses for the named parameters. */
  initial: Record<string, number>;
  /** Maximum number of solver trial steps. */
  maxIterations: number;
  /** Convergence when the relative change of the sum of squares (actual and predicted) is ≤ this. */
  functionTolerance: number;
  /** Convergence when the step in the transformed parameters is ≤ this relative to their size. */
  stepTolerance: number;
  /** Convergence when the cosine between the residuals and each Jacobian column is ≤ this. */
  gradientTolerance: number;
  /** Two-sided confidence level of the reported intervals. */
  confidenceLevel: number;
  /**
   * Largest relative standard error SE/|p| of a parameter the data determine (determination.ts;
   * default {@link DEFAULT_DETERMINATION_LIMITS}: 25 %).
   */
  maxRelativeStandardError: number;
  /** Throw RheoError(kind "convergence") instead of returning converged: false. */
  throwOnNonConvergence: boolean;
}

/** The defaults of every fit option; docs and tests import this constant. */
export const DEFAULT_FIT_OPTIONS: Readonly<FitOptions> = Object.freeze({
  residualSpace: "log",
  fixed: {},
  free: [],
  initial: {},
  maxIterations: 200,
  functionTolerance: 1e-12,
  stepTolerance: 1e-10,
  gradientTolerance: 1e-10,
  confidenceLevel: 0.95,
  maxRelativeStandardError: DEFAULT_DETERMINATION_LIMITS.maxRelativeStandardError,
  throwOnNonConvergence: false,
} as FitOptions);
