/**
 * Shared shapes of the generalized-Newtonian model definitions.
 *
 * Every model is written as ln η(γ̇[, T]) with its analytic gradient ∂ln η/∂p: the fit works in
 * ln η by default (relative errors) and gets the linear-space Jacobian as η·∂ln η/∂p.
 */

/** Stable lower-case model identifiers. */
export type ModelId =
  | "newtonian"
  | "power-law"
  | "cross"
  | "carreau"
  | "carreau-yasuda"
  | "sisko"
  | "ellis"
  | "bingham"
  | "herschel-bulkley"
  | "casson"
  | "cross-wlf";

/** One model parameter: its single documented name, SI unit and physical bounds. */
export interface ParameterSpec {
  /** The one name used everywhere (options, results, worksheets). */
  readonly name: string;
  /** SI unit ("Pa.s", "s", "Pa", "K", "1" for dimensionless, "J/mol" ...). */
  readonly unit: string;
  readonly description: string;
  /** Physical lower bound. */
  readonly min: number;
  /** True when `min` itself is physical (η∞ = 0, τy = 0); the fit still keeps the value above it. */
  readonly minInclusive: boolean;
  /** Physical upper bound (Infinity when none); never inclusive. */
  readonly max: number;
}

/** What an automatic initial guess may look at (validated SI data, any order). */
export interface GuessData {
  readonly shearRate: readonly number[];
  readonly viscosity: readonly number[];
  readonly temperature?: readonly number[];
}

/** A generalized-Newtonian model: η(γ̇) or, for Cross-WLF, η(γ̇, T). */
export interface ModelDefinition {
  readonly id: ModelId;
  /** One-line description. */
  readonly description: string;
  /** The formula in plain text (SI symbols). */
  readonly formula: string;
  /** The published reference. */
  readonly reference: string;
  /** Parameters in the order used by `logViscosity` and `logGradient`. */
  readonly parameters: readonly ParameterSpec[];
  /** True when the model needs a temperature per point (Cross-WLF). */
  readonly needsTemperature: boolean;
  /** Parameters held fixed unless the caller frees them (options.free), with their values. */
  readonly defaultFixed: Readonly<Record<string, number>>;
  /** True for yield-stress models, which also provide the stress τ(γ̇). */
  readonly hasYieldStress: boolean;
  /** ln η at one shear rate γ̇ (1/s) and temperature T (K; ignored by isothermal models). */
  logViscosity(p: ArrayLike<number>, shearRate: number, temperature: number): number;
  /** Writes ∂ln η/∂p_j into `out` (length = parameters) and returns ln η. */
  logGradient(p: ArrayLike<number>, shearRate: number, temperature: number, out: Float64Array): number;
  /**
   * Optional whole-curve fast path for the fitter, the same values as `logViscosity` and
   * `logGradient` to rounding: the parameter-only work (ln λ, (n − 1)/a, …) is done once per call
   * instead of once per point, and ln γ̇ comes precomputed (once per fit). Models without it are
   * evaluated point by point.
   */
  readonly logCurve?: LogCurve;
  /** Starting values from the data (every parameter, in order, strictly inside the bounds). */
  initialGuess(data: GuessData): number[];
}

/**
 * ln η over a whole curve: writes ln η_i into `logEta` and, when `gradient` is given,
 * ∂ln η_i/∂p_j row-major (points × parameters). `logRate` holds ln γ̇_i (γ̇ in 1/s),
 * `temperature` T_i (K; NaN for isothermal fits). Non-finite values are written as they come
 * (the caller rejects them).
 */
export type LogCurve = (
  p: ArrayLike<number>,
  logRate: Float64Array,
  temperature: Float64Array,
  logEta: Float64Array,
  gradient: Float64Array | null,
) => void;
