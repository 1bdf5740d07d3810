/**
 * The one verdict on a set of fitted models: which model Rheoledger recommends for a curve, and
 * why. Every surface (CLI summary and JSON, results workbook, task pane, RHEO.COMPAREFITS) shows
 * this result; none ranks models on its own.
 *
 * Rule (candidates are exactly the models the user asked for, or the default list):
 *   1. A model is adequate when its AIC is within {@link DEFAULT_VERDICT_OPTIONS}.maxDeltaAic (10)
 *      of the best converged candidate: Burnham & Anderson, Model Selection and Multimodel
 *      Inference (2002), §2.6, give ΔAIC > 10 as "essentially no support" (from memory).
 *   2. A model is well determined when its fit converged with a finite covariance and the data
 *      determine every free parameter (FitResult.wellDetermined; determination.ts).
 *   3. Recommended: the adequate, well-determined model of lowest AIC.
 *   4. When no model is both, the verdict says so (NO_WELL_DETERMINED_MODEL) and recommends the
 *      simplest adequate model: fewest free parameters, then lowest AIC. Its undetermined
 *      parameters carry their reasons and the bounds the data support.
 */
import { warning, type Warning } from "../errors";
import { getModel, type ModelId } from "../models";
import type { CompareResult, RankedFit } from "./compareModels";
import type { FitResult } from "./fitModel";

/** Options of the verdict; docs and tests import the defaults. */
export interface VerdictOptions {
  /** Largest ΔAIC of an adequate model (rule 1). */
  maxDeltaAic: number;
}

/** The documented defaults (see the module comment). */
export const DEFAULT_VERDICT_OPTIONS: Readonly<VerdictOptions> = Object.freeze({ maxDeltaAic: 10 });

/**
 * "well-determined": the recommended model passed every test; "not-well-determined": none did,
 * the simplest adequate model is recommended; "none": no model converged.
 */
export type VerdictStatus = "well-determined" | "not-well-determined" | "none";

/** How one converged candidate fared. */
export interface CandidateVerdict {
  model: ModelId;
  /** free parameters */
  parameterCount: number;
  aic: number;
  deltaAic: number;
  adequate: boolean;
  wellDetermined: boolean;
  recommended: boolean;
  /** plain words: why it was or was not recommended */
  note: string;
}

/** The verdict on one curve. */
export interface Verdict {
  status: VerdictStatus;
  recommended: ModelId | null;
  /** the recommended model's fit (null when none converged) */
  fit: FitResult | null;
  /** one plain sentence saying what was recommended and why */
  reason: string;
  /** every converged candidate, lowest AIC first */
  candidates: CandidateVerdict[];
  /** NO_WELL_DETERMINED_MODEL when the recommendation is not well determined */
  warnings: Warning[];
}

const list = (names: string[]) => (names.length <= 1 ? names.join("") : `${names.slice(0, -1).join(", ")} and ${names[names.length - 1]}`);

/**
 * Plain words for the parameters a fit does not determine, short enough for a summary line:
 * "eta0 and lambda not determined by the data (outside the measured rates: eta0 ≥ 1340 Pa.s,
 * lambda ≥ 0.0414 s); a: standard error 86 % of the value". Empty for a well-determined fit.
 */
export function undeterminedText(fit: FitResult): string {
  if (!fit.converged) return "the fit did not converge";
  const names = Object.keys(fit.undetermined);
  if (names.length === 0) return fit.wellDetermined ? "" : "its covariance is singular (no standard errors)";
  const specs = getModel(fit.model).parameters;
  const unit = (name: string) => {
    const u = specs.find((p) => p.name === name)?.unit ?? "1";
    return u === "1" ? "" : ` ${u}`;
  };
  const outside = names.filter((n) => fit.undetermined[n]?.outsideData);
  const other = names.filter((n) => !fit.undetermined[n]?.outsideData);
  const parts: string[] = [];
  if (outside.length > 0) {
    const bounds = outside.flatMap((n) => {
      const b = fit.undetermined[n]?.bound;
      return b ? [`${n} ${b.side === "lower" ? "≥" : "≤"} ${Number(b.value.toPrecision(3))}${unit(n)}`] : [];
    });
    parts.push(`${list(outside)} not determined by the data (outside the measured rates${bounds.length > 0 ? `; the data support ${bounds.join(", ")}` : ""})`);
  }
  for (const n of other) parts.push(`${n}: ${fit.undetermined[n]?.reason}`);
  return parts.join("; ");
}

/**
 * Decides the recommended model among the converged fits of `compare` (see the module comment).
 * @example decideVerdict(compareModels(["power-law", "cross"], data)).recommended // "cross"
 */
export function decideVerdict(compare: CompareResult, options: Partial<VerdictOptions> = {}): Verdict {
  const opts: VerdictOptions = { ...DEFAULT_VERDICT_OPTIONS, ...options };
  const ranked = compare.ranked;
  if (ranked.length === 0) {
    const why = compare.failed.map((f) => `${f.model}: ${f.reason}`).join("; ");
    return { status: "none", recommended: null, fit: null, reason: `no model could be fitted${why ? ` (${why})` : ""}`, candidates: [], warnings: [] };
  }
  const best = Math.min(...ranked.map((r) => r.aic));
  const adequate = (r: RankedFit) => r.aic === best || r.aic - best <= opts.maxDeltaAic;
  const chosenWell = ranked.find((r) => adequate(r) && r.result.wellDetermined);
  const simplest = [...ranked].filter(adequate).sort((a, b) => a.result.parameterCount - b.result.parameterCount || a.aic - b.aic)[0] as RankedFit;
  const chosen = chosenWell ?? simplest;
  const candidates: CandidateVerdict[] = ranked.map((r) => ({
    model: r.model,
    parameterCount: r.result.parameterCount,
    aic: r.aic,
    deltaAic: r.aic - best,
    adequate: adequate(r),
    wellDetermined: r.result.wellDetermined,
    recommended: r === chosen,
    note: candidateNote(r, r === chosen, adequate(r), opts, chosenWell !== undefined),
  }));
  if (chosenWell) {
    const passed = ranked.filter((r) => r.aic < chosenWell.aic).map((r) => r.model);
    const reason = `${chosenWell.model} is the adequate, well-determined model of lowest AIC${passed.length > 0 ? ` (${list(passed)} fit with lower AIC, but their parameters are not all determined by the data)` : ""}`;
    return { status: "well-determined", recommended: chosenWell.model, fit: chosenWell.result, reason, candidates, warnings: [] };
  }
  const why = undeterminedText(chosen.result);
  const reason = `no model is well determined by these data; ${chosen.model} is the simplest adequate model (ΔAIC ≤ ${opts.maxDeltaAic}): ${why || "it is not well determined"}`;
  return {
    status: "not-well-determined",
    recommended: chosen.model,
    fit: chosen.result,
    reason,
    candidates,
    warnings: [warning("NO_WELL_DETERMINED_MODEL", reason)],
  };
}

function candidateNote(r: RankedFit, chosen: boolean, adequate: boolean, opts: VerdictOptions, anyWell: boolean): string {
  if (chosen) return anyWell ? "recommended: adequate and well determined" : "recommended as the simplest adequate model; not well determined";
  if (!adequate) return `not adequate: ΔAIC ${r.deltaAic.toPrecision(3)} > ${opts.maxDeltaAic}`;
  if (!r.result.wellDetermined) return `not well determined: ${undeterminedText(r.result)}`;
  return "adequate and well determined, higher AIC";
}
