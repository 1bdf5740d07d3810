/**
 * Model fits and the temperature shift of a run (src/core/run.ts) as the command line prints them:
 * the `"fit"`, `"compare"` and `"shift"` keys of the JSON document (SI: Pa·s, s, Pa, K, J/mol) and
 * their text tables. The flags that ask for them are reduce settings (src/io/reduceOptions.ts).
 */
import type { ReductionRun } from "../core/run";
import { num } from "./format";

/** The fit parts of a run the command line prints. */
export type FitReport = Pick<ReductionRun, "modelFits" | "comparisons" | "shift" | "result">;

/** The `"fit"` (and `"compare"`) keys of group `i` of the JSON document. */
export function fitGroupJson(report: FitReport, i: number): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  const fit = report.modelFits?.[i];
  if (fit) {
    out.fit = {
      model: fit.model,
      parameters: fit.parameters,
      standardErrors: fit.standardErrors,
      r2: fit.r2,
      converged: fit.converged,
      confidenceIntervals: fit.confidenceIntervals,
      rmse: fit.rmse,
      aic: fit.aic,
      residualSpace: fit.residualSpace,
      pointCount: fit.pointCount,
      fixed: fit.fixed,
      iterations: fit.iterations,
      stopReason: fit.stopReason,
      warnings: fit.warnings,
    };
  }
  const c = report.comparisons?.[i];
  if (c) {
    out.compare = {
      ranked: c.ranked.map((r) => ({ model: r.model, aic: r.aic, deltaAic: r.deltaAic, akaikeWeight: r.akaikeWeight, r2: r.result.r2, parameters: r.result.parameters })),
      failed: c.failed.map((f) => ({ model: f.model, reason: f.reason })),
    };
  }
  return out;
}

/** The top-level `"shift"` key of the JSON document (SI: K, J/mol). */
export function fitTopJson(report: FitReport): Record<string, unknown> {
  if (!report.shift) return {};
  const { fit, dieDiameter } = report.shift;
  const constants =
    fit.law === "arrhenius"
      ? { activationEnergy: fit.activationEnergy, activationEnergyStandardError: fit.activationEnergyStandardError }
      : { C1: fit.C1, C2: fit.C2, C1StandardError: fit.C1StandardError, C2StandardError: fit.C2StandardError, C2Source: fit.C2Source, universalAtReference: fit.universalAtReference };
  return {
    shift: {
      law: fit.law,
      referenceTemperature: fit.referenceTemperature,
      ...constants,
      ...(fit.verticalShift ? { verticalShift: fit.verticalShift } : {}),
      factors: fit.factors.map((f) => (fit.verticalShift ? { temperature: f.temperature, aT: f.aT, bT: f.bT } : { temperature: f.temperature, aT: f.aT })),
      dieDiameter,
      rmse: fit.rmse,
      converged: fit.converged,
      warnings: fit.warnings,
    },
  };
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
