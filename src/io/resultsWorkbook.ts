/**
 * The results workbook of a reduction (xlsx): Summary, (for a pressure recording) Steps and Step
 * method, Bagley, Flow curve, Fits and Warnings sheets, one header row of `quantity [unit]` cells each. Written with exceljs, a Node-only
 * dependency: only the command line imports this module (never src/functions or src/taskpane).
 *
 * `resultsSheets` builds the tables (pure); `resultsWorkbookBytes` writes them.
 */
import ExcelJS from "exceljs";
import type { Warning } from "../core/errors";
import type { GroupFits } from "../core/flowCurveFits";
import { getModel } from "../core/models";
import type { ReductionResult } from "../core/reduce";
import type { TraceSteps } from "../core/steps/traceSteps";
import { headerWithUnit, stepsTable, thermalChecksTable, type ResultTable } from "./resultTables";
import { stepMethodLines } from "./stepRecord";

/** What goes into the results workbook. */
export interface ResultsInput {
  result: ReductionResult;
  /** every warning of the run (reading, reduction, fits, shift) */
  warnings: Warning[];
  /** model fits per group (same order as result.groups), when fitted */
  fits?: GroupFits[];
  /** where the data came from, e.g. the CSV path */
  source?: string;
  /** the steps of a pressure recording, when the run started from one */
  steps?: TraceSteps;
}

export type Cell = number | string | boolean | null;

/** One sheet: a title, then one header row and its rows. */
export interface ResultsSheet {
  name: string;
  header: string[];
  rows: Cell[][];
}

/** Names of the sheets, in order (tests and the summary refer to them). */
export const RESULTS_SHEETS = Object.freeze({ summary: "Summary", steps: "Steps", stepMethod: "Step method", bagley: "Bagley", flowCurve: "Flow curve", fits: "Fits", warnings: "Warnings" });

const celsius = (kelvin: number | null): Cell => (kelvin === null ? null : kelvin - 273.15);
const mm = (m: number) => m * 1e3;
const range = (values: number[]): [number, number] | [null, null] =>
  values.length === 0 ? [null, null] : [Math.min(...values), Math.max(...values)];

function summarySheet(input: ResultsInput): ResultsSheet {
  const { result, fits } = input;
  const rows: Cell[][] = result.groups.map((g, i) => {
    const rates = g.flowCurve.map((f) => f.shearRateWall).filter((v): v is number => v !== null);
    const etas = g.flowCurve.map((f) => f.viscosity).filter((v): v is number => v !== null);
    const [rateLo, rateHi] = range(rates);
    const [etaLo, etaHi] = range(etas);
    const [eLo, eHi] = range(g.bagley.map((b) => b.endCorrection));
    const best = fits?.[i]?.ranked[0];
    return [celsius(g.temperature), mm(g.dieDiameter), g.dies.length, g.flowCurve.length, rateLo, rateHi, etaLo, etaHi, eLo, eHi, best ? best.model : null, g.warnings.length];
  });
  return {
    name: RESULTS_SHEETS.summary,
    header: [
      "temperature [C]",
      "die_diameter [mm]",
      "dies [-]",
      "points [-]",
      "shear_rate_wall_min [1/s]",
      "shear_rate_wall_max [1/s]",
      "viscosity_min [Pa.s]",
      "viscosity_max [Pa.s]",
      "end_correction_min [-]",
      "end_correction_max [-]",
      "best_model (lowest AIC)",
      "warnings [-]",
    ],
    rows,
  };
}

function bagleySheet({ result }: ResultsInput): ResultsSheet {
  const rows: Cell[][] = [];
  for (const g of result.groups) {
    for (const b of g.bagley) {
      rows.push([celsius(g.temperature), mm(g.dieDiameter), b.shearRateApparent, b.wallShearStress / 1e3, b.entrancePressure / 1e5, b.endCorrection, b.r2, b.diesUsed]);
    }
  }
  return {
    name: RESULTS_SHEETS.bagley,
    header: ["temperature [C]", "die_diameter [mm]", "shear_rate_apparent [1/s]", "wall_shear_stress [kPa]", "entrance_pressure [bar]", "end_correction [-]", "r2 [-]", "dies_used [-]"],
    rows,
  };
}

function flowCurveSheet({ result }: ResultsInput): ResultsSheet {
  const rows: Cell[][] = [];
  for (const g of result.groups) {
    for (const f of g.flowCurve) {
      rows.push([celsius(g.temperature), mm(g.dieDiameter), f.shearRateApparent, f.wallShearStress / 1e3, f.nPrime, f.shearRateWall, f.viscosity, f.viscosityApparent]);
    }
  }
  return {
    name: RESULTS_SHEETS.flowCurve,
    header: ["temperature [C]", "die_diameter [mm]", "shear_rate_apparent [1/s]", "wall_shear_stress [kPa]", "n_prime [-]", "shear_rate_wall [1/s]", "viscosity [Pa.s]", "viscosity_apparent [Pa.s]"],
    rows,
  };
}

function fitsSheet({ fits }: ResultsInput): ResultsSheet {
  const rows: Cell[][] = [];
  for (const gf of fits ?? []) {
    const t = celsius(gf.temperature);
    const d = mm(gf.dieDiameter);
    gf.ranked.forEach((r, rank) => {
      const def = getModel(r.model);
      for (const spec of def.parameters) {
        const ci = r.result.confidenceIntervals[spec.name];
        rows.push([
          t,
          d,
          r.model,
          rank + 1,
          r.aic,
          r.deltaAic,
          r.akaikeWeight,
          r.result.r2,
          r.result.rmse,
          spec.name,
          spec.unit,
          r.result.parameters[spec.name] ?? null,
          r.result.standardErrors[spec.name] ?? null,
          ci ? ci[0] : null,
          ci ? ci[1] : null,
          r.result.fixed.includes(spec.name),
        ]);
      }
    });
    for (const f of gf.failed) rows.push([t, d, f.model, null, null, null, null, null, null, "not fitted", null, null, null, null, null, f.reason]);
  }
  return {
    name: RESULTS_SHEETS.fits,
    header: [
      "temperature [C]",
      "die_diameter [mm]",
      "model",
      "rank [-]",
      "aic [-]",
      "delta_aic [-]",
      "akaike_weight [-]",
      "r2 [-]",
      "rmse [-] (ln viscosity)",
      "parameter",
      "unit (SI)",
      "value",
      "standard_error",
      "ci95_low",
      "ci95_high",
      "fixed",
    ],
    rows,
  };
}

function warningsSheet({ warnings }: ResultsInput): ResultsSheet {
  return {
    name: RESULTS_SHEETS.warnings,
    header: ["severity", "code", "message"],
    rows: warnings.map((w) => [w.severity, w.code, w.message]),
  };
}

/** A result table (src/io/resultTables.ts) as a sheet: headers with units, rows as they are. */
function tableSheet(name: string, t: ResultTable): ResultsSheet {
  return { name, header: t.columns.map(headerWithUnit), rows: t.rows };
}

/**
 * The audit record of a recording: the method lines (criterion, changed settings, windows set by
 * hand), then the repeated-first-speed checks under their own header row.
 */
function stepMethodSheet(steps: TraceSteps): ResultsSheet {
  const rows: Cell[][] = stepMethodLines(steps).map((l) => [l]);
  const checks = thermalChecksTable(steps.runs);
  if (checks) rows.push([], [checks.title], checks.columns.map(headerWithUnit), ...checks.rows);
  return { name: RESULTS_SHEETS.stepMethod, header: ["step detection"], rows };
}

/** The sheets of the results workbook (Fits only when fits are given; Steps and Step method for a recording). */
export function resultsSheets(input: ResultsInput): ResultsSheet[] {
  const sheets = [summarySheet(input)];
  if (input.steps) sheets.push(tableSheet(RESULTS_SHEETS.steps, stepsTable(input.steps.runs)), stepMethodSheet(input.steps));
  sheets.push(bagleySheet(input), flowCurveSheet(input));
  if (input.fits) sheets.push(fitsSheet(input));
  sheets.push(warningsSheet(input));
  return sheets;
}

/** The results workbook as xlsx bytes. */
export async function resultsWorkbookBytes(input: ResultsInput): Promise<Uint8Array> {
  const wb = new ExcelJS.Workbook();
  wb.creator = "rheoledger";
  for (const sheet of resultsSheets(input)) {
    const ws = wb.addWorksheet(sheet.name);
    ws.addRow(sheet.header).font = { bold: true };
    for (const row of sheet.rows) ws.addRow(row);
    ws.columns.forEach((c, i) => (c.width = Math.min(60, Math.max(12, (sheet.header[i] ?? "").length + 2))));
    ws.views = [{ state: "frozen", ySplit: 1 }];
  }
  if (input.source) {
    const summary = wb.getWorksheet(RESULTS_SHEETS.summary) as ExcelJS.Worksheet;
    const at = summary.rowCount + 2;
    summary.getCell(at, 1).value = "source";
    summary.getCell(at, 2).value = input.source;
  }
  return new Uint8Array(await wb.xlsx.writeBuffer());
}
