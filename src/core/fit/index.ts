/** Model fitting: least squares with uncertainties, and model comparison by AIC. */
export { fitModel, type FitResult } from "./fitModel";
export { compareModels, DEFAULT_COMPARE_OPTIONS, type CompareOptions, type CompareResult, type RankedFit, type FailedFit } from "./compareModels";
export { DEFAULT_FIT_OPTIONS, type FitOptions, type ResidualSpace } from "./options";
export type { FitData } from "./validate";
export type { StopReason } from "./levenbergMarquardt";
export { levenbergMarquardt, type LeastSquaresProblem, type SolverResult, type SolverSettings } from "./levenbergMarquardt";
export { tQuantile, normalQuantile } from "./studentT";
export { decideVerdict, undeterminedText, DEFAULT_VERDICT_OPTIONS, type Verdict, type VerdictOptions, type VerdictStatus, type CandidateVerdict } from "./verdict";
export { plateauTest, dataWindows, relativeStandardError, DEFAULT_DETERMINATION_LIMITS, type DeterminationLimits, type DataWindow, type SupportedBound, type Undetermined } from "./determination";
export { domainInterval } from "./intervals";
export { extrapolationCheck } from "./extrapolation";
