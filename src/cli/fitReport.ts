/**
 * Model fits of a run (src/core/run.ts) as the command line prints them: the per-group `"fit"`,
 * `"compare"` and `"verdict"` keys and the top-level `"shift"`, `"masterFit"` and `"rotational"`
 * keys of the JSON document (SI: Pa·s, s, Pa, K, J/mol), and the summary's shift line (the text
 * tables are src/io/resultTables.ts). The flags that ask for them are reduce settings
 * (src/io/reduceOptions.ts).
 *
 * No NaN or infinity reaches the output: an undefined number (no standard error under a singular
 * covariance, AIC of an exact fit, R² of a constant curve) is `null` in JSON and "—" in the tables,
 * and the run's warnings say why (SINGULAR_COVARIANCE, FIT_EXACT, R2_UNDEFINED).
 */
import type { FitResult } from "../core/fit";
import type { Undetermined } from "../core/fit/determination";
import type { Verdict } from "../core/fit/verdict";
import type { GroupFits } from "../core/flowCurveFits";
import type { ReductionRun, RunMasterFit } from "../core/run";
import type { JoinedFit } from "../core/joinedFit";
import { num } from "./format";

/** The fit parts of a run the command line prints. */
export type FitReport = Pick<ReductionRun, "modelFits" | "comparisons" | "shift" | "result" | "groupFits" | "master" | "joined">;

/** A finite number, or null (JSON has no NaN; the run's warnings say why a value is missing). */
export function finiteOrNull(v: number | null | undefined): number | null {
  return typeof v === "number" && Number.isFinite(v) ? v : null;
}

function finiteRecord(r: Record<string, number>): Record<string, number | null> {
  return Object.fromEntries(Object.entries(r).map(([k, v]) => [k, finiteOrNull(v)]));
}

function intervalRecord(r: Record<string, [number, number]>): Record<string, [number | null, number | null]> {
  return Object.fromEntries(Object.entries(r).map(([k, [lo, hi]]) => [k, [finiteOrNull(lo), finiteOrNull(hi)]]));
}

function undeterminedJson(u: Record<string, Undetermined>): Record<string, { reason: string; supportedBound: { side: string; value: number | null } | null; outsideData: boolean }> {
  return Object.fromEntries(
    Object.entries(u).map(([k, v]) => [k, { reason: v.reason, supportedBound: v.bound ? { side: v.bound.side, value: finiteOrNull(v.bound.value) } : null, outsideData: v.outsideData }]),
  );
}

/** The `"fit"` key of one fit (the contract keys first, then what the data determine). */
export function fitJson(fit: FitResult): Record<string, unknown> {
  return {
    model: fit.model,
    parameters: fit.parameters,
    standardErrors: finiteRecord(fit.standardErrors),
    r2: finiteOrNull(fit.r2),
    converged: fit.converged,
    confidenceIntervals: intervalRecord(fit.confidenceIntervals),
    rmse: finiteOrNull(fit.rmse),
    aic: finiteOrNull(fit.aic),
    residualSpace: fit.residualSpace,
    pointCount: fit.pointCount,
    fixed: fit.fixed,
    iterations: fit.iterations,
    stopReason: fit.stopReason,
    warnings: fit.warnings,
    determined: fit.determined,
    wellDetermined: fit.wellDetermined,
    undetermined: undeterminedJson(fit.undetermined),
    shearRateRange: fit.shearRateRange,
  };
}

/** The `"verdict"` key: the one recommendation for a curve and how every candidate fared. */
export function verdictJson(fits: Pick<GroupFits, "verdict" | "material" | "models">): Record<string, unknown> {
  const v: Verdict = fits.verdict;
  return {
    recommended: v.recommended,
    status: v.status,
    reason: v.reason,
    material: fits.material,
    models: fits.models,
    fit: v.fit ? fitJson(v.fit) : null,
    candidates: v.candidates.map((c) => ({ ...c, aic: finiteOrNull(c.aic), deltaAic: finiteOrNull(c.deltaAic) })),
  };
}

/** The `"fit"`, `"compare"` and `"verdict"` keys of group `i` of the JSON document. */
export function fitGroupJson(report: FitReport, i: number): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  const fit = report.modelFits?.[i];
  if (fit) out.fit = fitJson(fit);
  const c = report.comparisons?.[i];
  if (c) {
    out.compare = {
      ranked: c.ranked.map((r) => ({
        model: r.model,
        aic: finiteOrNull(r.aic),
        deltaAic: finiteOrNull(r.deltaAic),
        akaikeWeight: finiteOrNull(r.akaikeWeight),
        r2: finiteOrNull(r.result.r2),
        parameters: r.result.parameters,
        wellDetermined: r.result.wellDetermined,
        recommended: c.verdict.recommended === r.model,
      })),
      failed: c.failed.map((f) => ({ model: f.model, reason: f.reason })),
    };
  }
  const g = report.groupFits[i];
  if (g) out.verdict = verdictJson(g);
  return out;
}

/** The top-level `"masterFit"` key (SI), as issue 14 spells it, with what else the fit found. */
export function masterFitJson(m: RunMasterFit): Record<string, unknown> {
  const lawConstants = m.law === "arrhenius" ? { activationEnergy: finiteOrNull(m.activationEnergy) } : { c1: finiteOrNull(m.c1), c2: finiteOrNull(m.c2) };
  return {
    model: m.model,
    law: m.law,
    referenceTemperature: m.referenceTemperature,
    parameters: finiteRecord(m.parameters),
    standardErrors: finiteRecord(m.standardErrors),
    ...lawConstants,
    converged: m.converged,
    determined: m.determined,
    wellDetermined: m.wellDetermined,
    undetermined: undeterminedJson(m.undetermined),
    confidenceIntervals: intervalRecord(m.confidenceIntervals),
    fixed: m.fixed,
    r2: finiteOrNull(m.r2),
    rmse: finiteOrNull(m.rmse),
    aic: finiteOrNull(m.aic),
    pointCount: m.pointCount,
    temperatures: m.temperatures,
    factors: m.factors.map((f) => ({ temperature: f.temperature, aT: finiteOrNull(f.aT) })),
    reducedShearRateRange: m.reducedShearRateRange,
    dieDiameter: m.dieDiameter,
    iterations: m.iterations,
    stopReason: m.stopReason,
    warnings: m.warnings,
  };
}

/** The top-level `"rotational"` key: the join, its overlap check and the verdict on the joined curve. */
export function joinedJson(j: JoinedFit): Record<string, unknown> {
  const o = j.join.overlap;
  return {
    temperature: j.temperature,
    groups: j.groups,
    pointCount: j.join.shearRate.length,
    rotationalPointCount: j.join.source.filter((s) => s === "rotational").length,
    rotationalShearRateRange: j.join.rotationalRange,
    capillaryShearRateRange: j.join.capillaryRange,
    overlap: o ? { shearRateMin: o.shearRateMin, shearRateMax: o.shearRateMax, comparisons: o.comparisons, ratio: finiteOrNull(o.ratio), maxDeviation: finiteOrNull(o.maxDeviation), withinTolerance: o.withinTolerance } : null,
    verdict: verdictJson(j.fits),
    warnings: j.warnings,
  };
}

/** The top-level `"shift"`, `"masterFit"` and `"rotational"` keys of the JSON document (SI: K, J/mol). */
export function fitTopJson(report: FitReport): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  if (report.shift) {
    const { fit, dieDiameter } = report.shift;
    const constants =
      fit.law === "arrhenius"
        ? { activationEnergy: fit.activationEnergy, activationEnergyStandardError: finiteOrNull(fit.activationEnergyStandardError) }
        : { C1: fit.C1, C2: fit.C2, C1StandardError: finiteOrNull(fit.C1StandardError), C2StandardError: finiteOrNull(fit.C2StandardError), C2Source: fit.C2Source, universalAtReference: fit.universalAtReference };
    out.shift = {
      law: fit.law,
      referenceTemperature: fit.referenceTemperature,
      ...constants,
      ...(fit.verticalShift ? { verticalShift: fit.verticalShift } : {}),
      factors: fit.factors.map((f) => (fit.verticalShift ? { temperature: f.temperature, aT: f.aT, bT: f.bT } : { temperature: f.temperature, aT: f.aT })),
      dieDiameter,
      rmse: fit.rmse,
      converged: fit.converged,
      warnings: fit.warnings,
    };
  }
  if (report.master) out.masterFit = masterFitJson(report.master);
  if (report.joined) out.rotational = joinedJson(report.joined);
  return out;
}

/** One line on the temperature shift for the summary ("" without a shift). */
export function shiftSummary(report: FitReport): string {
  if (!report.shift) return "";
  const { fit, dieDiameter } = report.shift;
  const constants =
    fit.law === "arrhenius"
      ? `Ea = ${num(fit.activationEnergy / 1e3)} ± ${num(fit.activationEnergyStandardError / 1e3, 2)} kJ/mol`
      : `C1 = ${num(fit.C1)} ± ${num(fit.C1StandardError, 2)}, C2 = ${num(fit.C2)} ± ${num(fit.C2StandardError, 2)} K`;
  return `Temperature shift (${fit.law}, Tref ${num(fit.referenceTemperature - 273.15)} °C, die diameter ${num(dieDiameter * 1e3)} mm): ${constants}\n`;
}

/** The reduction's JSON document with the fit keys added to its groups and top level. */
export function withFitJson<D extends { groups: object[] }>(doc: D, report: FitReport): D {
  return { ...doc, groups: doc.groups.map((g, i) => ({ ...g, ...fitGroupJson(report, i) })), ...fitTopJson(report) };
}
