/**
 * Adapters of the model-fitting worksheet functions (RHEO.FIT, RHEO.MODEL, RHEO.COMPAREFITS,
 * RHEO.SHIFT, RHEO.SHIFTFIT): read ranges and options, call src/core/fit, src/core/models and
 * src/core/temperature, shape the spill. Kept out of fitting.ts so that file holds only the
 * declarations Excel reads.
 *
 * Spills hold SI values (Pa·s, s, Pa, K, J/mol) with the unit of each value in its own column.
 * A fit that did not converge still spills, with converged FALSE, its stop reason and a
 * NOT_CONVERGED warning row; RHEO.MODEL refuses a parameter range whose converged row is FALSE.
 */
import { RheoError, type Warning } from "../core/errors";
import { DEFAULT_FIT_OPTIONS, fitModel, type FitData, type FitResult, type ResidualSpace } from "../core/fit";
import { fitCurve, MATERIAL_CLASSES, type MaterialClass } from "../core/flowCurveFits";
import { CROSS_WLF_LITERATURE, fitMasterCurve, MASTER_LAWS, MASTER_MODELS, type MasterFitResult } from "../core/temperature/masterFit";
import { checkParameterValue, evaluateModel, getModel, MODEL_IDS, type ModelDefinition } from "../core/models";
import { fitArrheniusShift, fitWlfShift, shiftFactor, WLF_UNIVERSAL_C2, type TemperatureCurve } from "../core/temperature";
import { fromSI } from "../core/units";
import {
  DEFAULT_SHEET_UNITS as U,
  atRows,
  booleanArg,
  cellError,
  choiceArg,
  column,
  describe,
  eachRow,
  isBlank,
  mapRows,
  optionalText,
  readNumber,
  readRows,
  spill,
  unitArg,
  type DataArg,
} from "./adapter";

/** Default of the energyUnit argument of RHEO.SHIFT (SI, the unit RHEO.SHIFTFIT spills). */
export const DEFAULT_ENERGY_UNIT = "J/mol";

/** Labels of the non-parameter rows of the RHEO.FIT spill (RHEO.MODEL skips them). */
export const FIT_ROW_LABELS = Object.freeze({
  r2: "R²",
  rmse: "RMSE",
  aic: "AIC",
  points: "points",
  converged: "converged",
  stopReason: "stop reason",
  wellDetermined: "well determined",
  rateMin: "rate min",
  rateMax: "rate max",
  warning: "warning",
});

/** Row labels of the RHEO.MASTERFIT spill that are not model parameters (RHEO.MODEL skips them). */
export const MASTER_ROW_LABELS = Object.freeze({ activationEnergy: "activationEnergy", c1: "c1", c2: "c2", referenceTemperature: "Tref", factors: "aT" });

const confidencePercent = `${Math.round(DEFAULT_FIT_OPTIONS.confidenceLevel * 100)} %`;

/** Header row of the RHEO.FIT spill. */
export const FIT_HEADER = Object.freeze(["parameter", "value", "std error", `CI low (${confidencePercent})`, `CI high (${confidencePercent})`, "unit"]);

/** Header row of the RHEO.COMPAREFITS spill. */
export const COMPARE_HEADER = Object.freeze(["rank", "model", "AIC", "ΔAIC", "Akaike weight", "R²", "RMSE", "converged", "note", "well determined", "recommended"]);

/** Header row of the RHEO.MASTERFIT spill. */
export const MASTER_HEADER = Object.freeze(["parameter", "value", "std error", `CI low (${confidencePercent})`, `CI high (${confidencePercent})`, "unit", "determined"]);

/** A model's unit as the spills show it: "-" for dimensionless. */
export function unitLabel(unit: string): string {
  return unit === "1" ? "-" : unit;
}

/**
 * Reads a model id: case-insensitive, spaces and underscores read as hyphens ("Carreau Yasuda").
 * @throws RheoError("missing") when blank, ("value") for an unknown id, listing the accepted ids.
 */
export function modelArg(value: unknown, argument = "model"): ModelDefinition {
  if (isBlank(value)) throw new RheoError("missing", argument, `is required; accepted: ${MODEL_IDS.join(", ")}`);
  const id = optionalText(value, argument, "").toLowerCase().replace(/[\s_]+/g, "-");
  try {
    return getModel(id);
  } catch (e) {
    if (e instanceof RheoError && argument !== "model") throw e.retarget({ argument });
    throw e;
  }
}

function rowsOf(range: unknown): unknown[][] {
  if (!Array.isArray(range)) return [[range]];
  return range.map((r: unknown) => (Array.isArray(r) ? (r as unknown[]) : [r]));
}

const skipLabels = new Set(["parameter", "r2", ...Object.values(FIT_ROW_LABELS), ...Object.values(MASTER_ROW_LABELS)].map((s) => s.toLowerCase()));

/**
 * Reads parameter values (SI): a two-column range of names and values (extra columns ignored, so
 * the RHEO.FIT spill itself works), or text "name=value, name=value". Blank rows, a header row
 * and the statistic rows of a RHEO.FIT spill are skipped.
 * @throws RheoError naming `argument` and the row: a value that is not a number (`value`), a name
 *   without a value (`missing`), a range of one column, the spill of a fit that did not converge.
 */
export function parameterRecord(range: unknown, argument: string): Record<string, number> {
  const record: Record<string, number> = {};
  const grid = rowsOf(range);
  const single = grid.length === 1 && grid[0]?.length === 1 ? grid[0][0] : undefined;
  if (typeof single === "string" && single.includes("=")) {
    const text = single;
    for (const part of text.split(/[,;]/)) {
      if (part.trim() === "") continue;
      const m = /^\s*([A-Za-z][\w]*)\s*=\s*(.+?)\s*$/.exec(part);
      if (!m) throw new RheoError("value", argument, `expected name=value pairs such as "etaInf=0, a=2", got "${part.trim()}"`);
      const v = readNumber(m[2], argument, `the value of ${m[1]}`);
      if (v === null) throw new RheoError("missing", argument, `${m[1]} has no value`);
      record[m[1] as string] = v;
    }
    return record;
  }
  for (const [i, row] of grid.entries()) {
    const name = row[0];
    if (isBlank(name)) continue;
    if (typeof name !== "string") throw new RheoError("value", argument, `row ${i + 1}: the first column must hold parameter names, got ${describe(name)}`);
    const key = name.trim();
    if (key.toLowerCase() === FIT_ROW_LABELS.converged && row[1] === false) {
      throw new RheoError("value", argument, `row ${i + 1}: comes from a fit that did not converge (converged FALSE); its parameters are not an optimum`);
    }
    // the aT block of a RHEO.SHIFTFIT or RHEO.MASTERFIT spill ends the parameters
    if (/^temperature \[/.test(key)) break;
    if (skipLabels.has(key.toLowerCase())) continue;
    if (row.length < 2) throw new RheoError("value", argument, "must have two columns: parameter names and their values");
    const v = readNumber(row[1], argument, `row ${i + 1}`);
    if (v === null) throw new RheoError("missing", argument, `row ${i + 1}: ${key} has no value`);
    record[key] = v;
  }
  return record;
}

/** Reads the `fixed` argument against the model: known names, values within bounds (SI). */
function fixedArg(value: unknown, model: ModelDefinition): Record<string, number> {
  if (isBlank(value) || (Array.isArray(value) && rowsOf(value).every((r) => r.every(isBlank)))) return {};
  const fixed = parameterRecord(value, "fixed");
  for (const [name, v] of Object.entries(fixed)) checkParameterValue(model, name, v, `fixed.${name}`);
  return fixed;
}

/** Arguments of RHEO.FIT and RHEO.COMPAREFITS as Excel passes them. */
export interface FitArgs {
  shearRate: unknown;
  viscosity: unknown;
  weights?: unknown;
  temperature?: unknown;
  viscosityUnit?: unknown;
  temperatureUnit?: unknown;
}

/** Reads the paired data of a fit (blank rows skipped) into SI fit data. */
function fitData(a: FitArgs) {
  const viscosityUnit = unitArg(a.viscosityUnit, "viscosityUnit", "viscosity", U.viscosity);
  const temperatureUnit = unitArg(a.temperatureUnit, "temperatureUnit", "temperature", U.temperature);
  const args: DataArg[] = [
    { argument: "shearRate", range: a.shearRate },
    { argument: "viscosity", range: a.viscosity, quantity: "viscosity", unit: viscosityUnit },
  ];
  const withWeights = !isBlankArg(a.weights);
  const withTemperature = !isBlankArg(a.temperature);
  if (withWeights) args.push({ argument: "weights", range: a.weights });
  if (withTemperature) args.push({ argument: "temperature", range: a.temperature, quantity: "temperature", unit: temperatureUnit });
  const rows = readRows(args);
  const data: FitData = {
    shearRate: column(rows, "shearRate"),
    viscosity: column(rows, "viscosity"),
    ...(withWeights ? { weights: column(rows, "weights") } : {}),
    ...(withTemperature ? { temperature: column(rows, "temperature") } : {}),
  };
  return { rows, data };
}

function isBlankArg(value: unknown): boolean {
  return value === undefined || value === null || isBlank(value) || (Array.isArray(value) && rowsOf(value).every((r) => r.every(isBlank)));
}

function residualArg(value: unknown): ResidualSpace {
  return choiceArg(value, "residuals", ["log", "linear"] as const, DEFAULT_FIT_OPTIONS.residualSpace);
}

/** Why R² = 1 − SSR/SST is not finite: SST = 0. */
const R2_UNDEFINED = "fit: R² is undefined: every viscosity is the same, so there is no spread to explain";

/** Why AIC = n·ln(SSR/n) + 2p is not finite: SSR = 0. */
const EXACT_FIT = "AIC is −∞: the model passes through every point (zero residuals), so AIC cannot rank it";

/** A number for the spill, or a #NUM! cell saying why it is missing. */
function finiteOr(value: number, why: string): unknown {
  return Number.isFinite(value) ? value : cellError("#NUM!", why);
}

/** The RHEO.FIT spill of a fit result (see fitting.ts for the layout). */
export function fitSpill(def: ModelDefinition, fit: FitResult, header: boolean): unknown[][] {
  const out: unknown[][] = header ? [[...FIT_HEADER]] : [];
  for (const spec of def.parameters) {
    const value = fit.parameters[spec.name] as number;
    if (fit.fixed.includes(spec.name)) {
      out.push([spec.name, value, "fixed", "", "", unitLabel(spec.unit)]);
      continue;
    }
    const undetermined = `fit: the uncertainty of ${spec.name} is undetermined (the data do not determine the parameters independently)`;
    const ci = fit.confidenceIntervals[spec.name] as [number, number];
    out.push([spec.name, value, finiteOr(fit.standardErrors[spec.name] as number, undetermined), finiteOr(ci[0], undetermined), finiteOr(ci[1], undetermined), unitLabel(spec.unit)]);
  }
  const L = FIT_ROW_LABELS;
  out.push([L.r2, finiteOr(fit.r2, R2_UNDEFINED), "", "", "", "-"]);
  out.push([L.rmse, fit.rmse, "", "", "", fit.residualSpace === "log" ? "-" : "Pa.s"]);
  out.push([L.aic, finiteOr(fit.aic, EXACT_FIT), "", "", "", "-"]);
  out.push([L.points, fit.pointCount, "", "", "", "-"]);
  out.push([L.converged, fit.converged, "", "", "", ""]);
  out.push([L.stopReason, fit.stopReason, "", "", "", ""]);
  out.push([L.wellDetermined, fit.wellDetermined, "", "", "", ""]);
  out.push([L.rateMin, fit.shearRateRange[0], "", "", "", "1/s"]);
  out.push([L.rateMax, fit.shearRateRange[1], "", "", "", "1/s"]);
  for (const w of fit.warnings) out.push(warningRow(w, 6));
  return out;
}

function warningRow(w: Warning, width: number): unknown[] {
  const row: unknown[] = [FIT_ROW_LABELS.warning, w.code, w.message];
  while (row.length < width) row.push("");
  return row;
}

/** RHEO.FIT: fits one model and spills parameters, uncertainties and goodness of fit. */
export function fitTable(a: FitArgs & { model: unknown; fixed?: unknown; residuals?: unknown; header?: unknown }): unknown[][] {
  const def = modelArg(a.model);
  const fixed = fixedArg(a.fixed, def);
  const residualSpace = residualArg(a.residuals);
  const header = booleanArg(a.header, "header", false);
  const { rows, data } = fitData(a);
  const fit = atRows(rows, () => fitModel(def.id, data, { fixed, residualSpace }));
  return fitSpill(def, fit, header);
}

/**
 * Cross-WLF parameters under their moulding-simulation names (a RHEO.MASTERFIT spill: D2, D3,
 * A2tilde) as the model registry names them (Tstar = D2 + D3·p and A2 = Ã2 + D3·p at p = 0).
 * @throws RheoError("value", "parameters") for D3 other than 0 (no pressure is given to RHEO.MODEL)
 */
function crossWlfModelNames(def: ModelDefinition, record: Record<string, number>): Record<string, number> {
  if (def.id !== "cross-wlf" || !("D2" in record || "A2tilde" in record || "D3" in record)) return record;
  const { D2, D3, A2tilde, ...rest } = record;
  if (D3 !== undefined && D3 !== 0) throw new RheoError("value", "parameters", `D3 = ${D3} needs a pressure; RHEO.MODEL evaluates Cross-WLF at zero pressure (D3 = 0)`);
  return { ...rest, ...(D2 !== undefined ? { Tstar: D2 } : {}), ...(A2tilde !== undefined ? { A2: A2tilde } : {}) };
}

/** Arguments of RHEO.MODEL as Excel passes them. */
export interface ModelArgs {
  model: unknown;
  parameters: unknown;
  shearRate: unknown;
  temperature?: unknown;
  outputUnit?: unknown;
  temperatureUnit?: unknown;
}

/** RHEO.MODEL: the model's viscosity at each shear rate, aligned with shearRate. */
export function modelColumn(a: ModelArgs): unknown[][] {
  const def = modelArg(a.model);
  const outputUnit = unitArg(a.outputUnit, "outputUnit", "viscosity", U.viscosity);
  const temperatureUnit = unitArg(a.temperatureUnit, "temperatureUnit", "temperature", U.temperature);
  if (isBlankArg(a.parameters)) throw new RheoError("missing", "parameters", `is required: ${def.parameters.map((p) => p.name).join(", ")} (SI), e.g. the RHEO.FIT spill`);
  const parameters = crossWlfModelNames(def, parameterRecord(a.parameters, "parameters"));
  const withTemperature = !isBlankArg(a.temperature);
  if (withTemperature && !def.needsTemperature) {
    throw new RheoError("value", "temperature", `${def.id} does not depend on temperature; leave temperature blank (shift rates and viscosities with RHEO.SHIFT)`);
  }
  const rows = readRows([
    { argument: "shearRate", range: a.shearRate },
    ...(withTemperature ? [{ argument: "temperature", range: a.temperature, quantity: "temperature" as const, unit: temperatureUnit }] : []),
  ]);
  const temps = withTemperature ? column(rows, "temperature") : undefined;
  const eta = atRows(rows, () => evaluateModel(def.id, parameters, column(rows, "shearRate"), temps), { shearRates: "shearRate", temperatures: "temperature" });
  return spill(rows, eta.map((v) => fromSI(v, outputUnit, "viscosity")));
}

/** Reads the `models` argument: a range of ids, text "a, b, c", or blank (empty: the core's default list of the material). */
export function modelListArg(value: unknown): string[] {
  if (isBlankArg(value)) return [];
  const cells = rowsOf(value).flat().filter((c) => !isBlank(c));
  const names = cells.flatMap((c) => {
    if (typeof c !== "string") throw new RheoError("value", "models", `must hold model names, got ${describe(c)}; accepted: ${MODEL_IDS.join(", ")}`);
    return c.split(/[,;]/).filter((s) => s.trim() !== "");
  });
  return [...new Set(names.map((n) => modelArg(n, "models").id))];
}

/** Reads the `material` argument: melt (default) or paste. */
export function materialArg(value: unknown): MaterialClass {
  return choiceArg(value, "material", MATERIAL_CLASSES, "melt");
}

/** RHEO.COMPAREFITS: ranks models by AIC over one data set with the core's one fitter, and marks its verdict. */
export function compareTable(a: FitArgs & { models?: unknown; residuals?: unknown; header?: unknown; material?: unknown }): unknown[][] {
  const models = modelListArg(a.models);
  const residualSpace = residualArg(a.residuals);
  const material = materialArg(a.material);
  const header = booleanArg(a.header, "header", false);
  const { rows, data } = fitData(a);
  const result = atRows(rows, () => fitCurve(data, { models, material, residualSpace }));
  if (result.ranked.length === 0) {
    throw new RheoError("missing", "models", `no model gave a converged fit: ${result.failed.map((f) => `${f.model}: ${f.reason}`).join("; ")}`);
  }
  const verdict = result.verdict;
  const out: unknown[][] = header ? [[...COMPARE_HEADER]] : [];
  result.ranked.forEach((r, i) => {
    const recommended = verdict.recommended === r.model;
    const codes = r.result.warnings.map((w) => w.code).join(", ");
    const note = recommended ? `${verdict.reason}${codes ? ` [${codes}]` : ""}` : codes;
    out.push([
      i + 1,
      r.model,
      finiteOr(r.aic, EXACT_FIT),
      finiteOr(r.deltaAic, EXACT_FIT),
      finiteOr(r.akaikeWeight, EXACT_FIT),
      finiteOr(r.result.r2, R2_UNDEFINED),
      r.result.rmse,
      true,
      note,
      r.result.wellDetermined,
      recommended,
    ]);
  });
  for (const f of result.failed) out.push(["", f.model, "", "", "", "", "", false, f.reason, false, false]);
  return out;
}

/** Arguments of RHEO.MASTERFIT as Excel passes them. */
export interface MasterFitArgs {
  temperature: unknown;
  shearRate: unknown;
  viscosity: unknown;
  model: unknown;
  law?: unknown;
  referenceTemperature?: unknown;
  fixed?: unknown;
  material?: unknown;
  temperatureUnit?: unknown;
  viscosityUnit?: unknown;
}

/** RHEO.MASTERFIT: one model fitted to every temperature at once with its temperature law. */
export function masterFitTable(a: MasterFitArgs): unknown[][] {
  if (isBlank(a.model)) throw new RheoError("missing", "model", `is required; accepted: ${MASTER_MODELS.join(", ")}`);
  const model = choiceArg(a.model, "model", MASTER_MODELS, "cross");
  const crossWlf = model === "cross-wlf";
  if (crossWlf && !isBlank(a.law)) throw new RheoError("value", "law", "belongs to the shifted models; cross-wlf carries its own WLF law (leave law blank)");
  const law = crossWlf ? null : choiceArg(a.law, "law", MASTER_LAWS, "arrhenius");
  const temperatureUnit = unitArg(a.temperatureUnit, "temperatureUnit", "temperature", U.temperature);
  const viscosityUnit = unitArg(a.viscosityUnit, "viscosityUnit", "viscosity", U.viscosity);
  const material = materialArg(a.material);
  const fixed = isBlankArg(a.fixed) ? {} : parameterRecord(a.fixed, "fixed");
  let referenceTemperature: number | null = null;
  if (!isBlankArg(a.referenceTemperature)) {
    const ref = readRows([{ argument: "referenceTemperature", range: a.referenceTemperature, quantity: "temperature", unit: temperatureUnit }]);
    const Tref = column(ref, "referenceTemperature")[0];
    if (ref.length !== 1 || Tref === undefined) throw new RheoError("value", "referenceTemperature", "must be one temperature");
    referenceTemperature = Tref;
  } else if (!crossWlf) {
    throw new RheoError("missing", "referenceTemperature", `is required with the ${law} law, e.g. 210 (${temperatureUnit})`);
  }
  const rows = readRows([
    { argument: "temperature", range: a.temperature, quantity: "temperature", unit: temperatureUnit },
    { argument: "shearRate", range: a.shearRate },
    { argument: "viscosity", range: a.viscosity, quantity: "viscosity", unit: viscosityUnit },
  ]);
  for (const name of ["temperature", "shearRate", "viscosity"]) eachRow(rows, [name], (v) => (v > 0 ? v : throwDomain(name, v)));
  const curves = curvesByTemperature(column(rows, "temperature"), column(rows, "shearRate"), column(rows, "viscosity"));
  const fit = atRows(rows, () => fitMasterCurve(curves, model, { law, referenceTemperature, material, fixed }), { curves: "temperature" });
  return masterSpill(fit, (k) => fromSI(k, temperatureUnit, "temperature"), temperatureUnit);
}

/** The RHEO.MASTERFIT spill: parameters (with "determined"), the law's constants, Tref, statistics, aT per temperature, warnings. */
export function masterSpill(fit: MasterFitResult, T: (kelvin: number) => number, temperatureUnit: string): unknown[][] {
  const specs = fit.model === "cross-wlf" ? CROSS_WLF_LITERATURE : getModel(fit.model).parameters;
  const undetermined = (name: string) => `masterFit: the uncertainty of ${name} is undetermined (the data do not determine the parameters independently)`;
  const row = (name: string, value: number, unit: string): unknown[] => {
    if (fit.fixed.includes(name) || (fit.model === "cross-wlf" && name === "c2")) return [name, value, "held", "", "", unit, false];
    const ci = fit.confidenceIntervals[name];
    const se = fit.standardErrors[name] ?? NaN;
    return [name, value, finiteOr(se, undetermined(name)), ci ? finiteOr(ci[0], undetermined(name)) : "", ci ? finiteOr(ci[1], undetermined(name)) : "", unit, fit.determined[name] === true];
  };
  const M = MASTER_ROW_LABELS;
  const out: unknown[][] = specs.map((s) => row(s.name, fit.parameters[s.name] as number, unitLabel(s.unit)));
  if (fit.law === "arrhenius") out.push(row(M.activationEnergy, fit.activationEnergy as number, "J/mol"));
  else out.push(row(M.c1, fit.c1 as number, "-"), row(M.c2, fit.c2 as number, "K"));
  const L = FIT_ROW_LABELS;
  out.push([M.referenceTemperature, T(fit.referenceTemperature), "", "", "", temperatureUnit, ""]);
  out.push([L.r2, finiteOr(fit.r2, R2_UNDEFINED), "", "", "", "-", ""]);
  out.push([L.rmse, fit.rmse, "", "", "", "-", ""]);
  out.push([L.aic, finiteOr(fit.aic, EXACT_FIT), "", "", "", "-", ""]);
  out.push([L.points, fit.pointCount, "", "", "", "-", ""]);
  out.push([L.converged, fit.converged, "", "", "", "", ""]);
  out.push([L.stopReason, fit.stopReason, "", "", "", "", ""]);
  out.push([L.wellDetermined, fit.wellDetermined, "", "", "", "", ""]);
  out.push([`temperature [${temperatureUnit}]`, M.factors, "", "", "", "", ""]);
  for (const f of fit.factors) out.push([T(f.temperature), finiteOr(f.aT, "masterFit: aT is not a finite number"), "", "", "", "-", ""]);
  for (const w of fit.warnings) out.push(warningRow(w, 7));
  return out;
}

/** Arguments of RHEO.SHIFT as Excel passes them. */
export interface ShiftArgs {
  temperature: unknown;
  referenceTemperature: unknown;
  law: unknown;
  activationEnergyOrC1: unknown;
  C2?: unknown;
  temperatureUnit?: unknown;
  energyUnit?: unknown;
}

const SHIFT_LAWS = ["arrhenius", "wlf"] as const;

/** RHEO.SHIFT: a_T per temperature for given constants. */
export function shiftColumn(a: ShiftArgs): unknown[][] {
  if (isBlank(a.law)) throw new RheoError("missing", "law", `is required; accepted: ${SHIFT_LAWS.join(", ")}`);
  const law = choiceArg(a.law, "law", SHIFT_LAWS, "arrhenius");
  const temperatureUnit = unitArg(a.temperatureUnit, "temperatureUnit", "temperature", U.temperature);
  const temperatures: DataArg[] = [
    { argument: "temperature", range: a.temperature, quantity: "temperature", unit: temperatureUnit },
    { argument: "referenceTemperature", range: a.referenceTemperature, quantity: "temperature", unit: temperatureUnit },
  ];
  if (law === "arrhenius") {
    if (!isBlankArg(a.C2)) throw new RheoError("value", "C2", "belongs to the wlf law; leave it blank for arrhenius");
    const energyUnit = unitArg(a.energyUnit, "energyUnit", "molarEnergy", DEFAULT_ENERGY_UNIT);
    return mapRows(
      [...temperatures, { argument: "activationEnergyOrC1", range: a.activationEnergyOrC1, quantity: "molarEnergy", unit: energyUnit }],
      (T, Tref, Ea) => shiftFactor({ law, referenceTemperature: Tref, activationEnergy: Ea }, T),
      undefined,
      { activationEnergy: "activationEnergyOrC1" },
    );
  }
  if (!isBlank(a.energyUnit)) throw new RheoError("value", "energyUnit", "belongs to the arrhenius law; the wlf constants C1 (-) and C2 (K) take no unit");
  const c2 = isBlankArg(a.C2) ? [[WLF_UNIVERSAL_C2]] : a.C2;
  return mapRows(
    [...temperatures, { argument: "activationEnergyOrC1", range: a.activationEnergyOrC1 }, { argument: "C2", range: c2 }],
    (T, Tref, C1, C2) => shiftFactor({ law, referenceTemperature: Tref, C1, C2 }, T),
    undefined,
    { C1: "activationEnergyOrC1" },
  );
}

/** Arguments of RHEO.SHIFTFIT as Excel passes them. */
export interface ShiftFitArgs {
  temperature: unknown;
  shearRate: unknown;
  viscosity: unknown;
  referenceTemperature: unknown;
  law?: unknown;
  temperatureUnit?: unknown;
  viscosityUnit?: unknown;
}

/** Groups paired rows into one curve per temperature (values equal to 1e-9 K). */
export function curvesByTemperature(temperature: number[], shearRate: number[], viscosity: number[]): TemperatureCurve[] {
  const curves: { temperature: number; shearRate: number[]; viscosity: number[] }[] = [];
  temperature.forEach((T, i) => {
    let curve = curves.find((c) => Math.abs(c.temperature - T) <= 1e-9);
    if (!curve) curves.push((curve = { temperature: T, shearRate: [], viscosity: [] }));
    curve.shearRate.push(shearRate[i] as number);
    curve.viscosity.push(viscosity[i] as number);
  });
  return curves.sort((x, y) => x.temperature - y.temperature);
}

/** RHEO.SHIFTFIT: the shift law's constants and a_T per temperature, fitted by superposition. */
export function shiftFitTable(a: ShiftFitArgs): unknown[][] {
  const law = choiceArg(a.law, "law", SHIFT_LAWS, "arrhenius");
  const temperatureUnit = unitArg(a.temperatureUnit, "temperatureUnit", "temperature", U.temperature);
  const viscosityUnit = unitArg(a.viscosityUnit, "viscosityUnit", "viscosity", U.viscosity);
  const ref = readRows([{ argument: "referenceTemperature", range: a.referenceTemperature, quantity: "temperature", unit: temperatureUnit }]);
  const Tref = column(ref, "referenceTemperature")[0];
  if (ref.length !== 1 || Tref === undefined) throw new RheoError("missing", "referenceTemperature", "must be one temperature");
  const rows = readRows([
    { argument: "temperature", range: a.temperature, quantity: "temperature", unit: temperatureUnit },
    { argument: "shearRate", range: a.shearRate },
    { argument: "viscosity", range: a.viscosity, quantity: "viscosity", unit: viscosityUnit },
  ]);
  for (const name of ["temperature", "shearRate", "viscosity"]) eachRow(rows, [name], (v) => (v > 0 ? v : throwDomain(name, v)));
  const curves = curvesByTemperature(column(rows, "temperature"), column(rows, "shearRate"), column(rows, "viscosity"));
  const rename = { curves: "temperature" };
  const T = (k: number) => fromSI(k, temperatureUnit, "temperature");
  if (curves.length < 2) {
    throw new RheoError("missing", "temperature", `needs points at two or more temperatures; every row is at ${curves.map((c) => T(c.temperature)).join("")} ${temperatureUnit}`);
  }
  const out: unknown[][] = [];
  if (law === "arrhenius") {
    const fit = atRows(rows, () => fitArrheniusShift(curves, Tref), rename);
    out.push(["Ea", fit.activationEnergy, fit.activationEnergyStandardError, "J/mol"]);
    pushCommon(out, fit, T(Tref), temperatureUnit);
  } else {
    const fit = atRows(rows, () => fitWlfShift(curves, Tref), rename);
    const heldNote = "held (two temperatures: C2 = 51.6 K)";
    out.push(["C1", fit.C1, finiteOr(fit.C1StandardError, "shiftFit: C1 was held"), "-"]);
    out.push(["C2", fit.C2, Number.isFinite(fit.C2StandardError) ? fit.C2StandardError : heldNote, "K"]);
    pushCommon(out, fit, T(Tref), temperatureUnit);
  }
  return out;

  function pushCommon(o: unknown[][], fit: { rmse: number; converged: boolean; factors: { temperature: number; aT: number }[]; warnings: Warning[] }, tref: number, unit: string) {
    o.push(["Tref", tref, "", unit]);
    o.push([FIT_ROW_LABELS.rmse, fit.rmse, "", "-"]);
    o.push([FIT_ROW_LABELS.converged, fit.converged, "", ""]);
    o.push([`temperature [${unit}]`, "aT [-]", "", ""]);
    for (const f of fit.factors) o.push([T(f.temperature), f.aT, "", ""]);
    for (const w of fit.warnings) o.push(warningRow(w, 4));
  }
}

function throwDomain(argument: string, value: number): never {
  throw new RheoError("domain", argument, `must be greater than zero, got ${value}`);
}
