/**
 * Adapters of the worksheet functions that work on a whole flow curve at once (Bagley table,
 * Rabinowitsch columns). Kept out of functions.ts so that file holds only the declarations Excel
 * reads.
 */
import { bagleyCorrection, BagleyPoint } from "../core/bagley";
import { requirePositive } from "../core/errors";
import { DEFAULT_RABINOWITSCH_OPTIONS, RabinowitschMethod, rabinowitschCorrection } from "../core/rabinowitsch";
import { fromSI } from "../core/units";
import {
  DEFAULT_SHEET_UNITS as U,
  atRows,
  booleanArg,
  cellError,
  optionalText,
  column,
  eachRow,
  integerArg,
  position,
  readRows,
  spill,
  unitArg,
} from "./adapter";
import { RheoError } from "../core/errors";

/** Arguments of RHEO.BAGLEY as Excel passes them. */
export interface BagleyArgs {
  dieLengthOrRatio: unknown;
  shearRateApparent: unknown;
  pressure: unknown;
  dieDiameter?: unknown;
  pressureUnit?: unknown;
  lengthUnit?: unknown;
  stressUnit?: unknown;
  header?: unknown;
}

/** Header row of the Bagley table, `quantity [unit]` as the raw-data tables use. */
export function bagleyHeader(pressureUnit: string, stressUnit: string): string[] {
  return [
    "shear_rate_apparent [1/s]",
    `wall_shear_stress [${stressUnit}]`,
    `entrance_pressure [${pressureUnit}]`,
    "end_correction [-]",
    "r2 [-]",
    "dies_used [-]",
  ];
}

const sameNumber = (a: number, b: number) => Math.abs(a - b) <= 1e-9 * Math.max(Math.abs(a), Math.abs(b));

/** RHEO.BAGLEY: one row per common apparent rate (see core/bagley.ts). */
export function bagleyTable(a: BagleyArgs): unknown[][] {
  const pressureUnit = unitArg(a.pressureUnit, "pressureUnit", "pressure", U.pressure);
  const lengthUnit = unitArg(a.lengthUnit, "lengthUnit", "length", U.length);
  const stressUnit = unitArg(a.stressUnit, "stressUnit", "pressure", U.stress);
  const header = booleanArg(a.header, "header", false);
  const withDiameter = a.dieDiameter !== undefined && a.dieDiameter !== null && !isBlankGrid(a.dieDiameter);
  const rows = readRows([
    { argument: "dieLengthOrRatio", range: a.dieLengthOrRatio, ...(withDiameter ? { quantity: "length" as const, unit: lengthUnit } : {}) },
    { argument: "shearRateApparent", range: a.shearRateApparent },
    { argument: "pressure", range: a.pressure, quantity: "pressure", unit: pressureUnit },
    ...(withDiameter ? [{ argument: "dieDiameter", range: a.dieDiameter, quantity: "length" as const, unit: lengthUnit }] : []),
  ]);
  const lengths = column(rows, "dieLengthOrRatio");
  let points: BagleyPoint[];
  if (withDiameter) {
    const diameters = eachRow(rows, ["dieDiameter"], (d) => requirePositive(d, "dieDiameter"));
    const first = diameters[0];
    diameters.forEach((d, k) => {
      if (first !== undefined && !sameNumber(d, first)) {
        throw new RheoError(
          "value",
          "dieDiameter",
          `${position(rows.orientation, rows.kept[k] as number)} is ${fromSI(d, lengthUnit, "length")} ${lengthUnit} but the first die's is ${fromSI(first, lengthUnit, "length")} ${lengthUnit}; the Bagley correction needs dies of one diameter`,
        );
      }
    });
    points = lengths.map((l, k) => ({
      die: `L ${fromSI(l, lengthUnit, "length")} ${lengthUnit}`,
      lengthOverRadius: (2 * l) / (diameters[k] as number),
      shearRateApparent: column(rows, "shearRateApparent")[k] as number,
      pressure: column(rows, "pressure")[k] as number,
    }));
  } else {
    points = lengths.map((ld, k) => ({
      die: `L/D ${ld}`,
      lengthOverRadius: 2 * ld,
      shearRateApparent: column(rows, "shearRateApparent")[k] as number,
      pressure: column(rows, "pressure")[k] as number,
    }));
  }
  const result = atRows(rows, () => bagleyCorrection(points), { lengthOverRadius: "dieLengthOrRatio", dieLength: "dieLengthOrRatio", die: "dieLengthOrRatio" });
  const table: unknown[][] = result.rows.map((r) => [
    r.shearRateApparent,
    fromSI(r.wallShearStress, stressUnit, "pressure"),
    fromSI(r.entrancePressure, pressureUnit, "pressure"),
    r.endCorrection,
    r.r2,
    r.diesUsed,
  ]);
  return header ? [bagleyHeader(pressureUnit, stressUnit), ...table] : table;
}

function isBlankGrid(range: unknown): boolean {
  if (!Array.isArray(range)) return range === "" || range === null || range === undefined;
  return range.every((row) => (Array.isArray(row) ? row : [row]).every((c) => c === null || c === undefined || (typeof c === "string" && c.trim() === "")));
}

/** The Rabinowitsch slope method (the core checks the name and lists the accepted ones). */
export function methodArg(value: unknown): RabinowitschMethod {
  return optionalText(value, "method", DEFAULT_RABINOWITSCH_OPTIONS.method).toLowerCase() as RabinowitschMethod;
}

/** Arguments shared by RHEO.NPRIME, RHEO.SHEARRATEWALL and RHEO.VISCOSITY. */
export interface RabinowitschArgs {
  shearRateApparent: unknown;
  wallShearStress: unknown;
  method?: unknown;
  degree?: unknown;
  stressUnit?: unknown;
  outputUnit?: unknown;
}

/**
 * n', the true wall rate or the true viscosity per row, aligned with the input. A row where
 * n' ≤ 0 (no true rate exists) holds a #NUM! error; the other rows keep their values.
 */
export function rabinowitschColumn(what: "nPrime" | "shearRateWall" | "viscosity", a: RabinowitschArgs): unknown[][] {
  const method = methodArg(a.method);
  const degree = integerArg(a.degree, "degree", DEFAULT_RABINOWITSCH_OPTIONS.degree, 1, 3);
  const stressUnit = unitArg(a.stressUnit, "stressUnit", "pressure", U.stress);
  const outputUnit = unitArg(a.outputUnit, "outputUnit", "viscosity", U.viscosity);
  const rows = readRows([
    { argument: "shearRateApparent", range: a.shearRateApparent },
    { argument: "wallShearStress", range: a.wallShearStress, quantity: "pressure", unit: stressUnit },
  ]);
  const rates = column(rows, "shearRateApparent");
  const stresses = column(rows, "wallShearStress");
  const result = atRows(rows, () => rabinowitschCorrection(rates, stresses, { method, degree }));
  if (what === "nPrime") return spill(rows, result.nPrime);
  const values = result.shearRateWall.map((rate, k) => {
    if (rate === null) {
      const where = position(rows.orientation, rows.kept[k] as number);
      return cellError("#NUM!", `${what}: ${where}: n' = ${result.nPrime[k]} is not positive, so no true wall rate exists there`);
    }
    return what === "shearRateWall" ? rate : fromSI((stresses[k] as number) / rate, outputUnit, "viscosity");
  });
  return spill(rows, values);
}
