/**
 * One run of Rheoledger, the same on every surface (command line, task pane, worksheet): the
 * reduction of the measurements, the model fits asked for on each group's true flow curve, the
 * temperature shift, and every warning of all of them in one list with its severity and scope.
 * The surfaces only read their settings (src/io/reduceOptions.ts) and render the run
 * (src/io/resultTables.ts); nothing here knows about cells, flags or fields.
 */
import { RheoError, Warning, scoped, warning } from "./errors";
import { reduce, groupLabel, type Measurement, type ReduceOptions, type ReductionGroup, type ReductionResult } from "./reduce";
import { fitModel, type FitResult } from "./fit";
import { DEFAULT_FLOW_CURVE_MODELS, fitFlowCurves, type GroupFits } from "./flowCurveFits";
import { getModel, type ModelId } from "./models";
import {
  fitArrheniusShift,
  fitWlfShift,
  masterCurve,
  type ArrheniusShiftFit,
  type MasterCurve,
  type ShiftLaw,
  type TemperatureCurve,
  type VerticalShift,
  type WlfShiftFit,
} from "./temperature";
import type { TraceSteps } from "./steps/traceSteps";

/** The model fits and shift a run is asked for. */
export interface FitRequest {
  /** fit this one model to every group (an error in any group stops the run) */
  model?: ModelId;
  /** rank these models by AIC per group; absent: {@link DEFAULT_FLOW_CURVE_MODELS} when `rank` is on */
  compare?: readonly string[];
  /** rank the default models even when `compare` is not given (the summary and the workbook use it) */
  rank?: boolean;
  /**
   * temperature shift over the groups; referenceTemperature K, or null for the middle temperature;
   * glassTransitionTemperature (K, WLF) converts the universal constants when C2 cannot be fitted;
   * verticalShift applies b_T = ρ(T)T/(ρ_ref T_ref) (temperature/shiftFactors.ts)
   */
  shift?: { law: "arrhenius" | "wlf"; referenceTemperature: number | null; glassTransitionTemperature?: number; verticalShift?: VerticalShift };
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

/** Everything one run produced, SI units. */
export interface ReductionRun {
  result: ReductionResult;
  /** `model`: one fit per group, in the order of result.groups */
  modelFits?: FitResult[];
  /** `compare` or `rank`: models ranked per group, in the order of result.groups */
  comparisons?: GroupFits[];
  shift?: RunShift;
  /** every warning of the run: input (given), reduction, fits, shift; each with severity and scope */
  warnings: Warning[];
  /** the steps of a pressure recording, when the run started from one (traceRun.ts) */
  steps?: TraceSteps;
}

/** Re-raises a core error with the group in front, keeping kind and code. */
function inGroup<T>(g: ReductionGroup, call: () => T): T {
  try {
    return call();
  } catch (e) {
    if (e instanceof RheoError) throw e.retarget({ argument: "model", context: `group ${groupLabel(g)}:` });
    throw e;
  }
}

/** The points of a group's true flow curve (those with a Rabinowitsch-corrected rate). */
export function trueFlowCurve(g: ReductionGroup): { shearRate: number[]; viscosity: number[] } {
  const points = g.flowCurve.filter((p) => p.shearRateWall !== null && p.viscosity !== null);
  return { shearRate: points.map((p) => p.shearRateWall as number), viscosity: points.map((p) => p.viscosity as number) };
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

/** The warnings of a group's ranked and failed fits, scoped to the group. */
function comparisonWarnings(g: ReductionGroup, fits: GroupFits): Warning[] {
  const label = groupLabel(g);
  const out: Warning[] = [];
  if (fits.pointCount < 3 && fits.ranked.length === 0) {
    out.push(warning("FIT_SKIPPED", `${label}: only ${fits.pointCount} corrected point(s); no model was fitted.`, label));
    return out;
  }
  for (const f of fits.failed) out.push(warning("FIT_FAILED", `${label}: ${f.model} was not fitted (${f.reason}).`, label));
  for (const r of fits.ranked) out.push(...r.result.warnings.map((w) => scoped({ ...w, message: `${r.model}: ${w.message}` }, label)));
  return out;
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
  const run: ReductionRun = { result, warnings };
  if (fits.model !== undefined) {
    const def = getModel(fits.model);
    if (def.needsTemperature) throw new RheoError("value", "model", `${def.id} needs a temperature per point; fit each group with an isothermal model, or use a temperature shift`);
    run.modelFits = result.groups.map((g) => inGroup(g, () => fitModel(def.id, trueFlowCurve(g))));
    result.groups.forEach((g, i) => warnings.push(...(run.modelFits?.[i]?.warnings ?? []).map((w) => scoped(w, groupLabel(g)))));
  }
  if (fits.compare !== undefined || fits.rank) {
    run.comparisons = fitFlowCurves(result, fits.compare ?? DEFAULT_FLOW_CURVE_MODELS);
    result.groups.forEach((g, i) => warnings.push(...comparisonWarnings(g, run.comparisons?.[i] as GroupFits)));
  }
  if (fits.shift) {
    const { glassTransitionTemperature, verticalShift } = fits.shift;
    run.shift = shiftAcrossGroups(result.groups, fits.shift.law, fits.shift.referenceTemperature, {
      ...(glassTransitionTemperature !== undefined ? { glassTransitionTemperature } : {}),
      ...(verticalShift ? { verticalShift } : {}),
    });
    warnings.push(...run.shift.fit.warnings.map((w) => scoped(w, "temperature shift")));
  }
  return run;
}
