/**
 * Model fits and temperature shifting on the command line: the `--model`, `--compare`, `--shift`
 * and `--tref` flags of `rheoledger reduce`, the fits on each group's true flow curve
 * (γ̇_w, η from the Rabinowitsch correction; rows without a true rate are skipped), and their JSON
 * (SI: Pa·s, s, Pa, K, J/mol) and text output. reduceCommand.ts only wires these in.
 */
import { RheoError, type Warning } from "../core/errors";
import { fitModel, type FitResult } from "../core/fit";
import { fitFlowCurves, type GroupFits } from "../core/flowCurveFits";
import { getModel, MODEL_IDS } from "../core/models";
import { groupLabel, type ReductionGroup, type ReductionResult } from "../core/reduce";
import { fitArrheniusShift, fitWlfShift, type ArrheniusShiftFit, type TemperatureCurve, type WlfShiftFit } from "../core/temperature";
import { toSI } from "../core/units";
import { FlagSpec, ParsedArgs, splitQuantity } from "./args";
import { num, table } from "./format";

export const FIT_FLAGS: Record<string, FlagSpec> = {
  model: { value: true, description: `fit a viscosity model to each group's true flow curve: ${MODEL_IDS.filter((id) => id !== "cross-wlf").join(", ")}` },
  compare: { value: true, description: "rank models by AIC per group, e.g. power-law,cross,carreau-yasuda" },
  shift: { value: true, description: "fit a temperature shift over the groups' flow curves: arrhenius or wlf (needs --tref)" },
  tref: { value: true, description: 'reference temperature of --shift, e.g. "210 C" or "483.15 K"' },
};

/** What the fit flags computed; each part only when its flag was given. */
export interface FitReport {
  /** --model: one fit per group, in the order of result.groups */
  fits?: FitResult[];
  /** --compare: models ranked per group */
  comparisons?: GroupFits[];
  /** --shift: the law fitted over the groups of one die diameter */
  shift?: { fit: ArrheniusShiftFit | WlfShiftFit; dieDiameter: number };
}

/** The points of a group's true flow curve (those with a Rabinowitsch-corrected rate). */
function trueCurve(g: ReductionGroup): { shearRate: number[]; viscosity: number[] } {
  const points = g.flowCurve.filter((p) => p.shearRateWall !== null && p.viscosity !== null);
  return { shearRate: points.map((p) => p.shearRateWall as number), viscosity: points.map((p) => p.viscosity as number) };
}

/** Re-raises a core error with the flag and the group in front, keeping its kind. */
function inGroup<T>(flag: string, g: ReductionGroup, call: () => T): T {
  try {
    return call();
  } catch (e) {
    if (e instanceof RheoError) throw new RheoError(e.kind, flag, `group ${groupLabel(g)}: ${e.message}`);
    throw e;
  }
}

/**
 * Runs the fits the flags ask for.
 * @throws RheoError naming the flag: an unknown model or law, --shift without --tref, a
 *   reference temperature without a temperature unit, data a fit cannot use (too few points,
 *   one temperature only, no temperature column).
 */
export function buildFitReport(args: ParsedArgs, result: ReductionResult): FitReport {
  const report: FitReport = {};
  const model = args.flags.get("model");
  if (typeof model === "string") {
    const def = inFlag("--model", () => getModel(model.trim().toLowerCase()));
    if (def.needsTemperature) throw new RheoError("value", "--model", `${def.id} needs a temperature per point; fit each group with an isothermal model, or use --shift`);
    report.fits = result.groups.map((g) => inGroup("--model", g, () => fitModel(def.id, trueCurve(g))));
  }
  const compare = args.flags.get("compare");
  if (typeof compare === "string") {
    const models = compare.split(",").map((s) => s.trim().toLowerCase()).filter((s) => s !== "");
    models.forEach((id) => inFlag("--compare", () => getModel(id)));
    report.comparisons = fitFlowCurves(result, models);
  }
  const shift = args.flags.get("shift");
  const tref = args.flags.get("tref");
  if (typeof tref === "string" && typeof shift !== "string") throw new RheoError("value", "--tref", "is the reference temperature of --shift; give --shift arrhenius or --shift wlf too");
  if (typeof shift === "string") {
    const law = shift.trim().toLowerCase();
    if (law !== "arrhenius" && law !== "wlf") throw new RheoError("value", "--shift", `unknown shift law "${shift}"; accepted: arrhenius, wlf`);
    if (typeof tref !== "string") throw new RheoError("missing", "--tref", 'is required with --shift, e.g. --tref "210 C"');
    const { value, unit } = splitQuantity(tref, "--tref");
    if (unit === "") throw new RheoError("value", "--tref", `needs a unit, e.g. "${value} C" or "${value} K"`);
    const Tref = toSI(value, unit, "temperature", "--tref");
    const { curves, dieDiameter } = shiftCurves(result);
    const fit = inFlag("--shift", () => (law === "arrhenius" ? fitArrheniusShift(curves, Tref) : fitWlfShift(curves, Tref)));
    report.shift = { fit, dieDiameter };
  }
  return report;
}

function inFlag<T>(flag: string, call: () => T): T {
  try {
    return call();
  } catch (e) {
    if (e instanceof RheoError) throw new RheoError(e.kind, flag, e.message.slice(e.argument.length + 2));
    throw e;
  }
}

/** The true flow curves of the die diameter measured at the most temperatures. */
function shiftCurves(result: ReductionResult): { curves: TemperatureCurve[]; dieDiameter: number } {
  const withT = result.groups.filter((g) => g.temperature !== null && g.geometry !== "slit");
  if (withT.length === 0) throw new RheoError("missing", "--shift", "needs a temperature column in the file (one flow curve per temperature)");
  const byDiameter = new Map<number, ReductionGroup[]>();
  for (const g of withT) byDiameter.set(g.dieDiameter, [...(byDiameter.get(g.dieDiameter) ?? []), g]);
  const [dieDiameter, groups] = [...byDiameter.entries()].sort((a, b) => b[1].length - a[1].length)[0] as [number, ReductionGroup[]];
  if (groups.length < 2) {
    throw new RheoError("missing", "--shift", `needs flow curves at two or more temperatures; the file has only ${groupLabel(groups[0] as ReductionGroup)}`);
  }
  const curves = groups.map((g) => ({ temperature: g.temperature as number, ...trueCurve(g) }));
  return { curves, dieDiameter };
}

/** The `"fit"` (and `"compare"`) keys of group `i` of the JSON document. */
export function fitGroupJson(report: FitReport, i: number): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  const fit = report.fits?.[i];
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
      : { C1: fit.C1, C2: fit.C2, C1StandardError: fit.C1StandardError, C2StandardError: fit.C2StandardError };
  return {
    shift: {
      law: fit.law,
      referenceTemperature: fit.referenceTemperature,
      ...constants,
      factors: fit.factors.map((f) => ({ temperature: f.temperature, aT: f.aT })),
      dieDiameter,
      rmse: fit.rmse,
      converged: fit.converged,
      warnings: fit.warnings,
    },
  };
}

const unitText = (unit: string) => (unit === "1" ? "-" : unit);

/** Readable tables of the fits (values in SI, the unit of each parameter in its own column). */
export function fitReportText(report: FitReport, result: ReductionResult): string {
  const out: string[] = [];
  result.groups.forEach((g, i) => {
    const fit = report.fits?.[i];
    if (fit) {
      out.push(`== ${groupLabel(g)}: ${fit.model} fit, ${fit.converged ? "converged" : `NOT converged (${fit.stopReason})`}, R² ${fit.r2.toFixed(5)}, ${fit.pointCount} points`);
      out.push(
        table(
          ["parameter", "value", "std error", "95 % CI", "unit"],
          getModel(fit.model).parameters.map((p) => {
            const ci = fit.confidenceIntervals[p.name];
            const held = fit.fixed.includes(p.name);
            return [p.name, num(fit.parameters[p.name]), held ? "fixed" : num(fit.standardErrors[p.name], 3), ci ? `${num(ci[0])} … ${num(ci[1])}` : "", unitText(p.unit)];
          }),
        ),
      );
      out.push(...warningLines(fit.warnings), "");
    }
    const c = report.comparisons?.[i];
    if (c) {
      out.push(`== ${groupLabel(g)}: models ranked by AIC`);
      out.push(
        table(
          ["rank", "model", "AIC", "ΔAIC", "weight", "R²"],
          c.ranked.map((r, k) => [String(k + 1), r.model, num(r.aic, 5), num(r.deltaAic, 3), num(r.akaikeWeight, 3), r.result.r2.toFixed(5)]),
        ),
      );
      for (const f of c.failed) out.push(`  not ranked: ${f.model}: ${f.reason}`);
      out.push("");
    }
  });
  if (report.shift) {
    const { fit, dieDiameter } = report.shift;
    const constants =
      fit.law === "arrhenius"
        ? `Ea = ${num(fit.activationEnergy / 1e3)} ± ${num(fit.activationEnergyStandardError / 1e3, 2)} kJ/mol`
        : `C1 = ${num(fit.C1)} ± ${num(fit.C1StandardError, 2)}, C2 = ${num(fit.C2)} ± ${num(fit.C2StandardError, 2)} K`;
    out.push(`== Temperature shift (${fit.law}, Tref ${num(fit.referenceTemperature - 273.15)} °C, die diameter ${num(dieDiameter * 1e3)} mm): ${constants}`);
    out.push(table(["temperature [°C]", "aT [-]"], fit.factors.map((f) => [num(f.temperature - 273.15), num(f.aT)])));
    out.push(...warningLines(fit.warnings), "");
  }
  return out.length > 0 ? out.join("\n") + "\n" : "";
}

function warningLines(warnings: Warning[]): string[] {
  return warnings.map((w) => `  [${w.code}] ${w.message}`);
}

/** The reduction's JSON document with the fit keys added to its groups and top level. */
export function withFitJson<D extends { groups: object[] }>(doc: D, report: FitReport): D {
  return { ...doc, groups: doc.groups.map((g, i) => ({ ...g, ...fitGroupJson(report, i) })), ...fitTopJson(report) };
}
