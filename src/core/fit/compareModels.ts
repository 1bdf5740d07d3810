/**
 * Fits several models to one data set and ranks them by AIC (Akaike 1974; Burnham & Anderson,
 * Model Selection and Multimodel Inference (2002), ch. 2 (from memory): ΔAIC_i = AIC_i − min AIC,
 * Akaike weight w_i = exp(−ΔAIC_i/2)/Σ exp(−ΔAIC_j/2)).
 */
import { RheoError } from "../errors";
import { getModel, type ModelId } from "../models";
import { fitModel, type FitResult } from "./fitModel";
import type { FitOptions } from "./options";
import type { FitData } from "./validate";

export interface CompareOptions {
  /** Options shared by every fit (solver settings, residual space); no fixed/initial/free here. */
  shared: Partial<Omit<FitOptions, "fixed" | "initial" | "free">>;
  /** Per-model options (fixed values, initial guesses ...), keyed by model id. */
  perModel: Partial<Record<ModelId, Partial<FitOptions>>>;
}

/** Defaults of {@link compareModels}. */
export const DEFAULT_COMPARE_OPTIONS: Readonly<CompareOptions> = Object.freeze({ shared: {}, perModel: {} });

export interface RankedFit {
  model: ModelId;
  aic: number;
  deltaAic: number;
  akaikeWeight: number;
  result: FitResult;
}

export interface FailedFit {
  model: string;
  /** Why it is not ranked: the error message, or the stop reason of a fit that did not converge. */
  reason: string;
  result?: FitResult;
  /** the error that stopped it, when it was refused (kind, argument and code kept for callers) */
  error?: RheoError;
}

export interface CompareResult {
  /** Converged fits, best (lowest AIC) first. */
  ranked: RankedFit[];
  failed: FailedFit[];
}

/**
 * Fits each model to `data` and ranks the converged fits by AIC.
 * @throws RheoError for an empty model list, unknown model ids, invalid data (the data errors of
 *   {@link fitModel}) or shared options that belong to one model (fixed, initial, free).
 * @example compareModels(["cross", "carreau-yasuda"], data).ranked[0].model
 */
export function compareModels(models: readonly string[], data: FitData, options: Partial<CompareOptions> = {}): CompareResult {
  const opts: CompareOptions = { ...DEFAULT_COMPARE_OPTIONS, ...options };
  if (!Array.isArray(models) || models.length === 0) throw new RheoError("missing", "models", "lists no model");
  for (const key of ["fixed", "initial", "free"]) {
    if (key in opts.shared) throw new RheoError("value", `options.shared.${key}`, "belongs to one model; give it in options.perModel");
  }
  models.forEach((id) => getModel(id));
  const fits: { model: ModelId; result: FitResult }[] = [];
  const failed: FailedFit[] = [];
  for (const id of models) {
    try {
      const result = fitModel(id, data, { ...opts.shared, ...opts.perModel[id as ModelId], throwOnNonConvergence: false });
      if (result.converged) fits.push({ model: result.model, result });
      else failed.push({ model: id, reason: `did not converge (${result.stopReason})`, result });
    } catch (error) {
      if (!(error instanceof RheoError)) throw error;
      if (error.argument === "shearRate" || error.argument === "viscosity" || error.argument === "weights") {
        if (error.kind !== "missing") throw error; // bad data fails every model: report it once
      }
      failed.push({ model: id, reason: error.message, error });
    }
  }
  const best = Math.min(...fits.map((f) => f.result.aic));
  const relative = fits.map((f) => Math.exp(-(f.result.aic - best) / 2));
  const total = relative.reduce((s, v) => s + v, 0);
  const ranked = fits
    .map((f, i) => ({ model: f.model, aic: f.result.aic, deltaAic: f.result.aic - best, akaikeWeight: (relative[i] as number) / total, result: f.result }))
    .sort((a, b) => a.aic - b.aic);
  return { ranked, failed };
}
