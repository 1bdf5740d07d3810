/**
 * A flow curve written as a table (a reference curve, a new lot's results): a header row with a
 * shear-rate column and a viscosity column, `quantity [unit]`, then one row per point.
 *
 *   shear_rate [1/s], viscosity [Pa.s]      (shear_rate_wall is accepted for the rate column)
 *
 * Other columns are ignored with a warning; fully blank rows are skipped; a row with only one of
 * the two cells is an error (never silently dropped).
 */
import { RheoError, warning, type Warning } from "../core/errors";
import { isUnitOf, toSI, acceptedUnits } from "../core/units";
import type { FlowCurveTable } from "../core/lotComparison";
import { normaliseColumnName } from "./headers";
import { readNumberCell } from "./rawTable";

const RATE_NAMES = ["shear_rate", "shear_rate_wall"];

export interface FlowCurveReadOptions {
  /** what the table is called in messages ("reference", "lot") */
  argument: string;
  rowWord: "line" | "row";
  /** 1-based number of each row (header first), for messages */
  rowNumbers?: number[];
  decimalComma?: boolean;
}

/**
 * Reads a flow-curve table (header row first) into SI shear rates (1/s) and viscosities (Pa·s).
 * @throws RheoError naming the table, the column and the line: a missing column, an unknown unit,
 *   text in a numeric cell, half-filled rows.
 */
export function readFlowCurveTable(cells: unknown[][], o: FlowCurveReadOptions): { table: FlowCurveTable; warnings: Warning[] } {
  const first = cells[0];
  if (!first) throw new RheoError("missing", o.argument, "is empty; it needs a header row such as shear_rate [1/s], viscosity [Pa.s]");
  const place = (i: number) => `${o.rowWord} ${o.rowNumbers?.[i] ?? i + 1}`;
  let rate: { index: number; unit: string; header: string } | undefined;
  let visc: { index: number; unit: string; header: string } | undefined;
  const warnings: Warning[] = [];
  first.forEach((cell, index) => {
    const header = String(cell ?? "").trim();
    const m = /^\s*([^[(]+?)\s*(?:[[(]\s*([^\])]*?)\s*[\])])?\s*$/.exec(header);
    const name = normaliseColumnName(m?.[1] ?? header);
    const unit = m?.[2];
    const isRate = RATE_NAMES.includes(name);
    if (!isRate && name !== "viscosity") {
      if (header !== "") warnings.push(warning("COLUMN_IGNORED", `${o.argument}: column "${header}" is not shear_rate or viscosity and was ignored`));
      return;
    }
    const quantity = isRate ? "shearRate" : "viscosity";
    if (unit === undefined || !isUnitOf(quantity, unit)) {
      throw new RheoError("value", o.argument, `column "${header}" needs a ${quantity} unit in brackets; accepted: ${acceptedUnits(quantity).join(", ")}`);
    }
    if ((isRate && rate) || (!isRate && visc)) throw new RheoError("value", o.argument, `has two ${isRate ? "shear-rate" : "viscosity"} columns`);
    if (isRate) rate = { index, unit, header };
    else visc = { index, unit, header };
  });
  if (!rate || !visc) {
    throw new RheoError("missing", o.argument, `needs a "shear_rate [1/s]" and a "viscosity [Pa.s]" column in its header (${place(0)})`);
  }
  const shearRate: number[] = [];
  const viscosity: number[] = [];
  cells.slice(1).forEach((row, k) => {
    const where = place(k + 1);
    const r = readNumberCell(row[rate!.index], `${o.argument} ${rate!.header}`, where, o.decimalComma ?? false);
    const v = readNumberCell(row[visc!.index], `${o.argument} ${visc!.header}`, where, o.decimalComma ?? false);
    if (r === null && v === null) return;
    if (r === null || v === null) throw new RheoError("missing", o.argument, `${where} has ${r === null ? "no shear rate" : "no viscosity"}`);
    shearRate.push(toSI(r, rate!.unit, "shearRate"));
    viscosity.push(toSI(v, visc!.unit, "viscosity"));
  });
  if (shearRate.length === 0) throw new RheoError("missing", o.argument, "has no data rows");
  return { table: { shearRate, viscosity }, warnings };
}
