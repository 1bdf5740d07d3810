/**
 * One run of Rheoledger, the same on every surface (command line, task pane, worksheet): the
 * reduction of the measurements, the model fits asked for on each group's true flow curve, the
 * temperature shift, and every warning of all of them in one list with its severity and scope.
 * The surfaces only read their settings (src/io/reduceOptions.ts) and render the run
 * (src/io/resultTables.ts); nothing here knows about cells, flags or fields.
 */
import { RheoError, Warning, scoped } from "./errors";
import { reduce, groupLabel, type Measurement, type ReduceOptions, type ReductionGroup, type ReductionResult } from "./reduce";
import type { FitResult } from "./fit";
import { fitFlowCurves, trueFlowCurve, verdictAgreement, type GroupFits, type MaterialClass } from "./flowCurveFits";
import { getModel, type ModelId } from "./models";
import {
  fitArrheniusShift,
  fitMasterCurve,
  fitWlfShift,
  masterCurve,
  type ArrheniusShiftFit,
  type MasterCurve,
  type MasterFitResult,
  type MasterLaw,
  type MasterModel,
  type ShiftLaw,
  type TemperatureCurve,
  type VerticalShift,
  type WlfShiftFit,
} from "./temperature";
import type { TraceSteps } from "./steps/traceSteps";
import { fitJoinedCurve, type JoinedFit } from "./joinedFit";
import type { RotationalCurve } from "./rotationalJoin";

export { trueFlowCurve };

/**
 * The model fits and shift a run is asked for. Every run fits each group's true flow curve with
 * the one fitter (flowCurveFits.ts) and decides its verdict: over `compare` and `model` when
 * given, else over the default models of the material class.
 */
export interface FitRequest {
  /** fit this one model to every group (an error in any group stops the run) */
  model?: ModelId;
  /** rank these models by AIC per group (the ranking is shown) */
  compare?: readonly string[];
  /** show the ranking of the default models even when `compare` is not given (summary, workbook) */
  rank?: boolean;
  /**
   * temperature shift over the groups; referenceTemperature K, or null for the middle temperature;
   * glassTransitionTemperature (K, WLF) converts the universal constants when C2 cannot be fitted;
   * verticalShift applies b_T = ρ(T)T/(ρ_ref T_ref) (temperature/shiftFactors.ts)
   */
  shift?: { law: "arrhenius" | "wlf"; referenceTemperature: number | null; glassTransitionTemperature?: number; verticalShift?: VerticalShift };
  /** melt (default) or paste: yield-stress models and a free η∞ only for a paste */
  material?: MaterialClass;
  /**
   * the fit across temperatures (temperature/masterFit.ts): law and reference temperature (K, or
   * null for the middle temperature) for every model but cross-wlf; for cross-wlf, D2 (K) to hold
   */
  master?: { model: MasterModel; law: MasterLaw | null; referenceTemperature: number | null; D2?: number };
  /** a rotational curve to join to the capillary curve of its temperature and fit (joinedFit.ts) */
  rotational?: RotationalCurve;
}

/** The temperature shift of a run. */
export interface RunShift {
  fit: ArrheniusShiftFit | WlfShiftFit;
  law: ShiftLaw;
  master: MasterCurve;
  /** the die diameter (m) whose groups were shifted (the bore measured at most temperatures) */
  dieDiameter: number;
  referenceChoice: "given" | "middle";
}

/** The fit across temperatures of a run, with the bore whose curves it used. */
export type RunMasterFit = MasterFitResult & { dieDiameter: number };

/** Everything one run produced, SI units. */
export interface ReductionRun {
  result: ReductionResult;
  /** every group's fits and the one verdict on them, in the order of result.groups */
  groupFits: GroupFits[];
  /** `model`: one fit per group, in the order of result.groups */
  modelFits?: FitResult[];
  /** `compare` or `rank`: the same fits as groupFits, when the ranking is to be shown */
  comparisons?: GroupFits[];
  shift?: RunShift;
  /** `master`: the fit across temperatures */
  master?: RunMasterFit;
  /** `rotational`: the joined curve and its fits */
  joined?: JoinedFit;
  /** every warning of the run: input (given), reduction, fits, shift; each with severity and scope */
  warnings: Warning[];
  /** the steps of a pressure recording, when the run started from one (traceRun.ts) */
  steps?: TraceSteps;
}

/**
 * The true flow curves of the round-die bore measured at the most temperatures, one per
 * temperature (slip between bores must not be mistaken for a temperature shift).
 * @throws RheoError("missing", "shift") without temperatures, or with fewer than two of them
 */
export function shiftCurves(groups: readonly ReductionGroup[]): { curves: TemperatureCurve[]; dieDiameter: number } {
  const withT = groups.filter((g) => g.temperature !== null && g.geometry !== "slit");
  if (withT.length === 0) throw new RheoError("missing", "shift", "needs a temperature column in the data (one flow curve per temperature)");
  const byDiameter = new Map<number, ReductionGroup[]>();
  for (const g of withT) byDiameter.set(g.dieDiameter, [...(byDiameter.get(g.dieDiameter) ?? []), g]);
  const [dieDiameter, chosen] = [...byDiameter.entries()].sort((a, b) => b[1].length - a[1].length)[0] as [number, ReductionGroup[]];
  if (chosen.length < 2) {
    throw new RheoError("missing", "shift", `needs flow curves at two or more temperatures; the data have only ${groupLabel(chosen[0] as ReductionGroup)}`);
  }
  const curves = chosen
    .map((g) => ({ temperature: g.temperature as number, ...trueFlowCurve(g) }))
    .filter((c) => c.shearRate.length > 0)
    .sort((a, b) => a.temperature - b.temperature);
  return { curves, dieDiameter };
}

/**
 * Fits a temperature shift law over the groups and reduces every point onto the master curve.
 * @param referenceTemperature K, or null for the middle measured temperature
 * @param options WLF's glass transition temperature (K) and the optional vertical shift
 */
export function shiftAcrossGroups(
  groups: readonly ReductionGroup[],
  law: "arrhenius" | "wlf",
  referenceTemperature: number | null,
  options: { glassTransitionTemperature?: number; verticalShift?: VerticalShift } = {},
): RunShift {
  const { curves, dieDiameter } = shiftCurves(groups);
  const temps = curves.map((c) => c.temperature);
  const reference = referenceTemperature ?? (temps[temps.length >> 1] as number);
  const fit = law === "arrhenius" ? fitArrheniusShift(curves, reference, { verticalShift: options.verticalShift }) : fitWlfShift(curves, reference, options);
  const vertical = options.verticalShift ? { verticalShift: options.verticalShift } : {};
  const shiftLaw: ShiftLaw =
    fit.law === "arrhenius" ? { law: "arrhenius", referenceTemperature: reference, activationEnergy: fit.activationEnergy, ...vertical } : { law: "wlf", referenceTemperature: reference, C1: fit.C1, C2: fit.C2, ...vertical };
  return { fit, law: shiftLaw, master: masterCurve(curves, shiftLaw), dieDiameter, referenceChoice: referenceTemperature === null ? "middle" : "given" };
}

/**
 * Runs a whole reduction with its fits (see the module comment).
 * @param inputWarnings warnings of reading the data, placed first in the run's list
 * @throws RheoError from the reduction (naming the argument and row); from a fit asked for by
 *   name (`model`, naming the group); from the shift (argument "shift")
 */
export function runReduction(measurements: Measurement[], options: Partial<ReduceOptions>, fits: FitRequest = {}, inputWarnings: Warning[] = []): ReductionRun {
  const result = reduce(measurements, options);
  const warnings: Warning[] = [...inputWarnings.map((w) => (w.scope ? w : { ...w, scope: "input" })), ...result.warnings];
  const asked = [...(fits.compare ?? []), ...(fits.model !== undefined ? [fits.model] : [])];
  const groupFits = fitFlowCurves(result, { models: asked, material: fits.material });
  const run: ReductionRun = { result, groupFits, warnings };
  for (const gf of groupFits) warnings.push(...gf.warnings);
  if (fits.model !== undefined) {
    const def = getModel(fits.model);
    run.modelFits = result.groups.map((g, i) => {
      const gf = groupFits[i] as GroupFits;
      const ranked = gf.ranked.find((r) => r.model === def.id);
      if (ranked) {
        if (gf.verdict.recommended !== def.id) warnings.push(...ranked.result.warnings.map((w) => scoped({ ...w, message: `${def.id}: ${w.message}` }, gf.label)));
        return ranked.result;
      }
      const failed = gf.failed.find((f) => f.model === def.id);
      if (failed?.result) return failed.result; // did not converge: reported with converged false
      const context = `group ${groupLabel(g)}:`;
      if (failed?.error) throw failed.error.retarget({ argument: "model", context });
      throw new RheoError("convergence", "model", `${context} ${def.id} could not be fitted${failed ? ` (${failed.reason})` : ""}`);
    });
  }
  if (fits.compare !== undefined) {
    // the user asked to see these models: their own warnings join the run's (the recommended one's are there already)
    for (const gf of groupFits) {
      for (const r of gf.ranked) {
        if (r.model !== gf.verdict.recommended && r.model !== fits.model) warnings.push(...r.result.warnings.map((w) => scoped({ ...w, message: `${r.model}: ${w.message}` }, gf.label)));
      }
    }
  }
  if (fits.compare !== undefined || fits.rank) run.comparisons = groupFits;
  warnings.push(...verdictAgreement(groupFits));
  if (fits.shift) {
    const { glassTransitionTemperature, verticalShift } = fits.shift;
    run.shift = shiftAcrossGroups(result.groups, fits.shift.law, fits.shift.referenceTemperature, {
      ...(glassTransitionTemperature !== undefined ? { glassTransitionTemperature } : {}),
      ...(verticalShift ? { verticalShift } : {}),
    });
    warnings.push(...run.shift.fit.warnings.map((w) => scoped(w, "temperature shift")));
  }
  if (fits.master) {
    run.master = masterAcrossGroups(result.groups, fits.master, fits.material);
    warnings.push(...run.master.warnings.map((w) => scoped(w, "fit across temperatures")));
  }
  if (fits.rotational) {
    run.joined = fitJoinedCurve(result, fits.rotational, { models: asked, material: fits.material });
    warnings.push(...run.joined.warnings);
  }
  return run;
}

/**
 * The fit across temperatures over the curves {@link shiftCurves} picks (one bore, one curve per
 * temperature). Errors are re-addressed to the run's settings: "master" (model, curves, data),
 * "shift" (the law), "referenceTemperature".
 * @param referenceTemperature of `master`: K, or null for the middle measured temperature
 */
export function masterAcrossGroups(groups: readonly ReductionGroup[], master: NonNullable<FitRequest["master"]>, material?: MaterialClass): RunMasterFit {
  try {
    const { curves, dieDiameter } = shiftCurves(groups);
    const temps = curves.map((c) => c.temperature);
    const crossWlf = master.model === "cross-wlf";
    const referenceTemperature = crossWlf ? (master.D2 ?? null) : (master.referenceTemperature ?? (temps[temps.length >> 1] as number));
    const fit = fitMasterCurve(curves, master.model, { law: crossWlf ? null : master.law, referenceTemperature, material });
    return { ...fit, dieDiameter };
  } catch (e) {
    if (!(e instanceof RheoError)) throw e;
    const argument = e.argument === "law" ? "shift" : e.argument === "referenceTemperature" ? (master.model === "cross-wlf" ? "crossWlfD2" : "referenceTemperature") : "master";
    throw e.retarget({ argument });
  }
}
