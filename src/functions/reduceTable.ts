/**
 * RHEO.REDUCE: a raw-data range with its `quantity [unit]` header row (as the CLI reads CSV files)
 * to the flow-curve table, one row per point of every temperature/diameter group. A pressure
 * recording (a `time` column) is refused with a pointer to RHEO.PLATEAUS and the command line.
 */
import { RheoError, Warning } from "../core/errors";
import { reduce, type ReductionResult } from "../core/reduce";
import { isTraceHeader } from "../io/traceTable";
import { fromSI } from "../core/units";
import { readRawTable } from "../io/rawTable";
import { KEYED_SETTINGS_SOURCE, REDUCE_SETTINGS, readReduceSettings, type ReduceRequest, type ReduceSettingSpec } from "../io/reduceOptions";
import { DEFAULT_SHEET_UNITS as U, booleanArg, cellError, isBlank, readSettingsRange, unitArg } from "./adapter";

/** Arguments of RHEO.REDUCE as Excel passes them. */
export interface ReduceArgs {
  rawData: unknown;
  endCorrection?: unknown;
  method?: unknown;
  degree?: unknown;
  stressUnit?: unknown;
  viscosityUnit?: unknown;
  barrelDiameter?: unknown;
  density?: unknown;
  showWarnings?: unknown;
  /** further reduce settings: a name | value range (keys of src/io/reduceOptions.ts) */
  settings?: unknown;
}

/** The reduce settings RHEO.REDUCE takes as arguments of their own, by worksheet argument name. */
const DIRECT_ARGUMENTS: Readonly<Record<string, keyof ReduceArgs>> = Object.freeze({
  endCorrection: "endCorrection",
  rabinowitschMethod: "method",
  rabinowitschDegree: "degree",
  barrelDiameter: "barrelDiameter",
  density: "density",
});

/** Settings of the worksheet: named by their argument, or "settings key" for the settings range. */
const SHEET_SOURCE = { ...KEYED_SETTINGS_SOURCE, nameOf: (s: ReduceSettingSpec) => DIRECT_ARGUMENTS[s.key] ?? `settings ${s.key}` };

/** The reduce settings of the call: its direct arguments and its settings range, by key. */
function sheetSettings(a: ReduceArgs): Record<string, unknown> {
  const keys = REDUCE_SETTINGS.filter((s) => s.key !== "si").map((s) => s.key);
  const out: Record<string, unknown> = isBlank(a.settings) || a.settings === undefined ? {} : readSettingsRange(a.settings, keys);
  for (const [key, argument] of Object.entries(DIRECT_ARGUMENTS)) {
    const value = a[argument];
    if (value === undefined || isBlank(value)) continue;
    if (out[key] !== undefined) throw new RheoError("value", argument, `is given twice: as an argument and in settings ("${key}")`, undefined, "DUPLICATE_KEY");
    out[key] = value;
  }
  return out;
}

/** Header row of the flow-curve table, `quantity [unit]`. */
export function reduceHeader(stressUnit: string, viscosityUnit: string): string[] {
  return [
    `temperature [${U.temperature}]`,
    `die_diameter [${U.length}]`,
    "shear_rate_apparent [1/s]",
    `wall_shear_stress [${stressUnit}]`,
    "n_prime [-]",
    "shear_rate_wall [1/s]",
    `viscosity [${viscosityUnit}]`,
    `viscosity_apparent [${viscosityUnit}]`,
  ];
}

/** RHEO.REDUCE (see functions.ts for the argument descriptions). */
export function reduceTable(a: ReduceArgs): unknown[][] {
  const request = readReduceSettings(sheetSettings(a), SHEET_SOURCE);
  const stressUnit = unitArg(a.stressUnit, "stressUnit", "pressure", U.stress);
  const viscosityUnit = unitArg(a.viscosityUnit, "viscosityUnit", "viscosity", U.viscosity);
  const showWarnings = booleanArg(a.showWarnings, "showWarnings", false);
  if (!Array.isArray(a.rawData) || a.rawData.length < 2) {
    throw new RheoError("missing", "rawData", "needs a header row and at least one data row");
  }
  const cells = a.rawData.map((row: unknown) => (Array.isArray(row) ? (row as unknown[]) : [row]));
  const fitKeys: string[] = (["model", "compare", "shift", "referenceTemperature", "material", "master"] as const).filter((k) => request.fits[k === "referenceTemperature" ? "shift" : k] !== undefined);
  if (request.input.rotational !== undefined) fitKeys.push("rotational");
  if (fitKeys.length > 0) {
    throw new RheoError("value", `settings ${fitKeys[0]}`, "RHEO.REDUCE spills the flow curve only; fit models with RHEO.FIT or RHEO.COMPAREFITS, across temperatures with RHEO.MASTERFIT, and shift with RHEO.SHIFTFIT", undefined, "SETTING_NOT_USED_HERE");
  }
  if (isTraceHeader(cells[0] ?? [])) {
    throw new RheoError("value", "rawData", "is a pressure recording (it has a time column); find its steady steps with RHEO.PLATEAUS per die run, or reduce the recording with the command line (rheoledger reduce) or the task pane", undefined, "SETTING_NOT_USED_HERE");
  }
  const run = pointRun(cells, request);
  const table: unknown[][] = [reduceHeader(stressUnit, viscosityUnit)];
  for (const g of run.result.groups) {
    const temperature = g.temperature === null ? "" : fromSI(g.temperature, U.temperature, "temperature");
    // slit groups have no diameter: the cell stays blank (the flow curve uses the slit formulas)
    const diameter = Number.isFinite(g.dieDiameter) ? fromSI(g.dieDiameter, U.length, "length") : "";
    g.flowCurve.forEach((f, i) => {
      const noWallRate = (what: string) =>
        cellError("#NUM!", `${what}: flow-curve point ${i + 1} has n' = ${f.nPrime}, not positive; no true wall rate exists there`);
      table.push([
        temperature,
        diameter,
        f.shearRateApparent,
        fromSI(f.wallShearStress, stressUnit, "pressure"),
        f.nPrime,
        f.shearRateWall === null ? noWallRate("shear_rate_wall") : f.shearRateWall,
        f.viscosity === null ? noWallRate("viscosity") : fromSI(f.viscosity, viscosityUnit, "viscosity"),
        fromSI(f.viscosityApparent, viscosityUnit, "viscosity"),
      ]);
    });
  }
  if (showWarnings) appendWarnings(table, run.warnings);
  return table;
}

/** A point table reduced; step settings are refused (they apply to recordings, which RHEO.REDUCE does not read). */
function pointRun(cells: unknown[][], request: ReduceRequest): { result: ReductionResult; warnings: Warning[] } {
  const stepKey = Object.keys(request.steps)[0];
  if (stepKey !== undefined) {
    throw new RheoError("value", `settings ${stepKey}`, "applies to pressure recordings, which RHEO.REDUCE does not read (use the command line or the task pane)", undefined, "SETTING_NOT_USED_HERE");
  }
  const { rotational: _rotational, ...input } = request.input;
  const raw = readRawTable(cells, { rowWord: "row", headerNumber: 1, ...input });
  const result = reduce(raw.measurements, request.options);
  return { result, warnings: [...raw.warnings, ...result.warnings] };
}

/** Appends a blank row and one `[code, message]` row per warning (or `warnings | none`), padded to the table width. */
export function appendWarnings(table: unknown[][], warnings: Warning[]): void {
  const width = (table[0] as unknown[]).length;
  const pad = (cells: unknown[]) => [...cells, ...new Array<unknown>(width - cells.length).fill("")];
  table.push(pad([]));
  if (warnings.length === 0) table.push(pad(["warnings", "none"]));
  for (const w of warnings) table.push(pad([w.code, w.message]));
}
