/**
 * The pane's lot check: a lot's flow curve (a range with shear-rate and viscosity columns, or a
 * group of the last reduction) against a reference (a range table, or a model with parameters)
 * within a tolerance band. The comparison is the core's (src/core/lotComparison.ts); the tables and
 * chart series are the shared ones (src/io/planTables.ts); this module lays them out as the
 * "Rheo lot check" sheet with PASS/FAIL conditional formats and an XY chart of the lot over the
 * band. Pure: no DOM, no Office.
 */
import { PaneFieldError, detailOf } from "../../panelContract";
import { RheoError, type Warning } from "../../../core/errors";
import { compareLot, DEFAULT_LOT_COMPARISON_OPTIONS, type FlowCurveTable, type LotComparison, type LotReference } from "../../../core/lotComparison";
import { readFlowCurveTable } from "../../../io/flowCurveTable";
import { readParameters } from "../../../io/planOptions";
import { LOT_STATUS_TEXT, PLAN_TABLE_UNITS, lotChartSeries, lotComparisonTable, lotVerdictTable } from "../../../io/planTables";
import { FLAG_COLOURS, stackBlocks, warningRows } from "../planner/plan";
import { CellValue, ChartSpec, ConditionalFormatSpec, SheetPlan, SeriesSpec, blockLayout } from "../../sheetPlan";

/** The Lot check panel's fields a message can be shown next to. */
export type LotFieldId = "lotSource" | "lotRange" | "refKind" | "refRange" | "refModel" | "refParameters" | "lotTolerance" | "lotRun";

/** One-line explanations of the Lot check panel's choices. */
export const LOT_HELP = {
  lotSource: "The lot's flow curve: a range whose header has “shear_rate [1/s]” and “viscosity [Pa.s]”, or a flow curve of the last reduction.",
  refKind: {
    table: "A reference table (a released lot) in a range with the same two columns; the lot is compared at its rates.",
    model: "A fitted model with parameters in SI units, compared at the lot's own rates; “Use the last fit” copies the last reduction's best model.",
  },
  tolerance: "Half-width of the band in %: a point passes when the lot is within ± this of the reference.",
} as const;


/** Where the lot's curve comes from: cells as read, or a flow curve already in SI. */
export type LotCurveInput = { kind: "cells"; cells: unknown[][]; label: string } | { kind: "curve"; curve: FlowCurveTable; label: string };

/** What the reference is. */
export type ReferenceInput = { kind: "table"; cells: unknown[][]; label: string } | { kind: "model"; model: string; parameters: string; label: string };

/** The result of a lot check, with the labels of its inputs. */
export interface LotOutput {
  comparison: LotComparison;
  lot: FlowCurveTable;
  lotLabel: string;
  referenceLabel: string;
  warnings: Warning[];
}

/**
 * Reads a tolerance typed in percent: "10" or "10 %" → 0.1.
 * @throws PaneFieldError for anything but a number above 0 and below 100.
 */
export function readTolerancePercent(text: string): number {
  const t = text.trim().replace(/\s*%$/, "").replace(",", ".");
  const v = t === "" ? DEFAULT_LOT_COMPARISON_OPTIONS.tolerance * 100 : Number(t);
  if (!Number.isFinite(v) || !(v > 0) || v >= 100) throw lotError("lotTolerance", `Give the tolerance in % as a number above 0 and below 100 (got “${text}”).`);
  return v / 100;
}

/** A problem for one Lot check field. */
export const lotError = (field: LotFieldId, message: string) => new PaneFieldError({ field, message });

/**
 * Runs a lot check.
 * @throws PaneFieldError naming the field at fault (bad ranges, parameters, tolerance).
 */
export function runLotCheck(lotInput: LotCurveInput, reference: ReferenceInput, tolerancePercent: string): LotOutput {
  const tolerance = readTolerancePercent(tolerancePercent);
  const warnings: Warning[] = [];
  let lot: FlowCurveTable;
  try {
    if (lotInput.kind === "cells") {
      const read = readFlowCurveTable(lotInput.cells, { argument: "lot", rowWord: "row" });
      lot = read.table;
      warnings.push(...read.warnings);
    } else lot = lotInput.curve;
  } catch (error) {
    if (error instanceof RheoError) throw lotError(lotInput.kind === "cells" ? "lotRange" : "lotSource", detailOf(error));
    throw error;
  }
  let ref: LotReference;
  try {
    if (reference.kind === "table") {
      const read = readFlowCurveTable(reference.cells, { argument: "reference", rowWord: "row" });
      ref = { kind: "table", ...read.table };
      warnings.push(...read.warnings);
    } else {
      if (reference.model.trim() === "") throw lotError("refModel", "Choose the reference model.");
      ref = { kind: "model", model: reference.model, parameters: readParameters(reference.parameters, "parameters") };
    }
  } catch (error) {
    if (error instanceof RheoError) throw lotError(reference.kind === "table" ? "refRange" : "refParameters", detailOf(error));
    throw error;
  }
  try {
    const comparison = compareLot(ref, lot, { tolerance });
    warnings.push(...comparison.warnings);
    return { comparison, lot, lotLabel: lotInput.label, referenceLabel: reference.label, warnings };
  } catch (error) {
    if (error instanceof RheoError) {
      const a = error.argument;
      const field: LotFieldId = /^lot/.test(a) ? (lotInput.kind === "cells" ? "lotRange" : "lotSource") : a === "tolerance" ? "lotTolerance" : reference.kind === "table" ? "refRange" : "refParameters";
      throw lotError(field, detailOf(error));
    }
    throw error;
  }
}

/** Colours of the overlay chart (the pane's palette): reference teal, band amber, lot plum. */
export const LOT_CHART_COLOURS = Object.freeze({ reference: "#0b6e69", "band-lower": "#c77c0e", "band-upper": "#c77c0e", lot: "#7a3b8f" });

/** Where things go on the lot sheet (0-based columns). */
export const LOT_LAYOUT = Object.freeze({ chartCol: 8, chartCols: 8, chartRows: 18, dataCol: 17 });

/**
 * The "Rheo lot check" sheet: the verdict with the worst point, the per-rate deviations with
 * PASS/FAIL conditional formats, the warnings, and an XY chart (log–log) of the lot's points over
 * the reference and its band. Blocks: lot-title, lot-stamp, lot-verdict, lot-points,
 * lot-warnings, lotdata; chart: lot.
 */
export function buildLotPlan(out: LotOutput, meta: { name: string; version: string; date: string }): SheetPlan {
  const s = stackBlocks();
  const c = out.comparison;
  const unit = PLAN_TABLE_UNITS.viscosity;
  s.add({ id: "lot-title", role: "heading", title: "Rheoledger lot check", rows: [] }, 0);
  s.add({ id: "lot-stamp", role: "text", rows: [[`Lot: ${out.lotLabel}; reference: ${out.referenceLabel}; ±${Number((c.tolerance * 100).toPrecision(6))} %; ${meta.date}; Rheoledger ${meta.version}`]] });
  const verdict = lotVerdictTable(c);
  const verdictBlock = s.add({ id: "lot-verdict", role: "list", title: "Verdict", header: ["item", "value"], rows: [verdict.header as CellValue[], ...verdict.rows] });
  const table = lotComparisonTable(c, unit);
  const points = s.add({ id: "lot-points", role: "table", title: "Per rate (lot interpolated log–log at the reference rates)", header: table.header, rows: table.rows, numberFormats: ["0.00", "0.0", "0.0", "0.0", "0.0", "0.00", null], keyColumns: [0, 4, 5, 6] });
  s.add({ id: "lot-warnings", role: "list", title: `Warnings (${out.warnings.length})`, header: ["code", "message"], rows: warningRows(out.warnings) });
  const rules: ConditionalFormatSpec["rules"] = [
    { text: LOT_STATUS_TEXT.fail, ...FLAG_COLOURS.fail, tone: "fail" },
    { text: LOT_STATUS_TEXT.pass, ...FLAG_COLOURS.pass, tone: "pass" },
    { text: LOT_STATUS_TEXT["not-compared"], ...FLAG_COLOURS.caution, tone: "caution" },
  ];
  const conditionalFormats: ConditionalFormatSpec[] = [
    { blockId: points.id, column: table.statusColumn, firstRow: 0, rowCount: table.rows.length, rules },
    { blockId: verdictBlock.id, column: 1, firstRow: 0, rowCount: 1, rules },
  ];

  const series = lotChartSeries(c, out.lot, unit);
  const rows: CellValue[][] = [];
  const specs: SeriesSpec[] = [];
  for (const x of series) {
    specs.push({ name: x.name, blockId: "lotdata", xColumn: 1, yColumn: 2, firstRow: rows.length, rowCount: x.x.length, style: x.style, colour: LOT_CHART_COLOURS[x.role] });
    x.x.forEach((rate, i) => rows.push([x.name, rate, x.y[i] ?? null]));
  }
  const data = { id: "lotdata", role: "chartData" as const, title: "Chart data (read by the chart)", header: ["series", "shear rate [1/s]", `viscosity [${unit}]`], rows, numberFormats: [null, "0.00", "0.0"], row: 0, col: LOT_LAYOUT.dataCol };
  const chart: ChartSpec = {
    id: "lot",
    title: `Lot over the reference band (±${Number((c.tolerance * 100).toPrecision(6))} %)`,
    xTitle: "shear rate [1/s]",
    yTitle: `viscosity [${unit}]`,
    xLog: true,
    yLog: true,
    series: specs,
    anchor: { row: 2, col: LOT_LAYOUT.chartCol, rows: LOT_LAYOUT.chartRows, cols: LOT_LAYOUT.chartCols },
  };
  const tableRight = Math.max(...s.blocks.map((b) => b.col + blockLayout(b).width));
  if (tableRight > LOT_LAYOUT.chartCol) throw new Error(`lot sheet: tables (${tableRight} columns) run under the chart`);
  const widths = [22, 16, 14, 14, 14, 12, 14, 2, ...new Array<number>(LOT_LAYOUT.dataCol - 8).fill(9), 18, 14, 14];
  return { name: meta.name, blocks: [...s.blocks, data], charts: [chart], conditionalFormats, columnWidths: widths };
}
