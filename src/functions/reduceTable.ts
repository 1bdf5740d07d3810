/**
 * RHEO.REDUCE: a raw-data range with its `quantity [unit]` header row (as the CLI reads CSV files)
 * to the flow-curve table, one row per point of every temperature/diameter group.
 */
import { RheoError, Warning } from "../core/errors";
import { DEFAULT_REDUCE_OPTIONS, ReduceOptions, reduce } from "../core/reduce";
import { fromSI, toSI } from "../core/units";
import { readRawTable } from "../io/rawTable";
import { DEFAULT_SHEET_UNITS as U, booleanArg, cellError, integerArg, optionalText, readNumber, unitArg } from "./adapter";
import { methodArg } from "./tables";
import { DEFAULT_RABINOWITSCH_OPTIONS } from "../core/rabinowitsch";

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

function optionalQuantity(value: unknown, argument: string, unit: string, quantity: "length" | "density"): number | undefined {
  const v = readNumber(value, argument, "the value");
  return v === null ? undefined : toSI(v, unit, quantity, argument);
}

/** RHEO.REDUCE (see functions.ts for the argument descriptions). */
export function reduceTable(a: ReduceArgs): unknown[][] {
  const end = optionalText(a.endCorrection, "endCorrection", DEFAULT_REDUCE_OPTIONS.endCorrection).toLowerCase();
  if (end !== "bagley" && end !== "none" && end !== "orifice") {
    throw new RheoError("value", "endCorrection", `unknown choice "${end}"; accepted: bagley, orifice, none`);
  }
  const method = methodArg(a.method);
  const degree = integerArg(a.degree, "degree", DEFAULT_RABINOWITSCH_OPTIONS.degree, 1, 3);
  const stressUnit = unitArg(a.stressUnit, "stressUnit", "pressure", U.stress);
  const viscosityUnit = unitArg(a.viscosityUnit, "viscosityUnit", "viscosity", U.viscosity);
  const showWarnings = booleanArg(a.showWarnings, "showWarnings", false);
  if (!Array.isArray(a.rawData) || a.rawData.length < 2) {
    throw new RheoError("missing", "rawData", "needs a header row and at least one data row");
  }
  const cells = a.rawData.map((row: unknown) => (Array.isArray(row) ? (row as unknown[]) : [row]));
  const raw = readRawTable(cells, {
    rowWord: "row",
    headerNumber: 1,
    barrelDiameter: optionalQuantity(a.barrelDiameter, "barrelDiameter", U.length, "length"),
    density: optionalQuantity(a.density, "density", U.density, "density"),
  });
  const options: Partial<ReduceOptions> = { endCorrection: end, rabinowitsch: { method, degree } };
  const result = reduce(raw.measurements, options);
  const table: unknown[][] = [reduceHeader(stressUnit, viscosityUnit)];
  for (const g of result.groups) {
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
  if (showWarnings) appendWarnings(table, [...raw.warnings, ...result.warnings]);
  return table;
}

/** Appends a blank row and one `[code, message]` row per warning (or `warnings | none`), padded to the table width. */
export function appendWarnings(table: unknown[][], warnings: Warning[]): void {
  const width = (table[0] as unknown[]).length;
  const pad = (cells: unknown[]) => [...cells, ...new Array<unknown>(width - cells.length).fill("")];
  table.push(pad([]));
  if (warnings.length === 0) table.push(pad(["warnings", "none"]));
  for (const w of warnings) table.push(pad([w.code, w.message]));
}
