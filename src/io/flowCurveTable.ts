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
import { type DecimalMark, TableNumberReader } from "./numberText";
import { excerpt } from "./safeText";

const RATE_NAMES = ["shear_rate", "shear_rate_wall"];

export interface FlowCurveReadOptions {
  /** what the table is called in messages ("reference", "lot") */
  argument: string;
  rowWord: "line" | "row";
  /** 1-based number of each row (header first), for messages */
  rowNumbers?: number[];
  /** the decimal mark assumed when no text number shows it (a comma-delimited file: ".") */
  decimalMark?: DecimalMark;
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
  const columns = [rate, visc];
  const numbers = new TableNumberReader({
    describe: (c, k) => ({ column: `${o.argument} ${excerpt((columns[c] as { header: string }).header)}`, row: place(k) }),
    fallback: o.decimalMark,
  });
  const read = (cell: unknown, c: number, k: number): number | null => {
    if (cell === null || cell === undefined) return null;
    if (typeof cell === "number") {
      if (Number.isFinite(cell)) return cell;
      throw new RheoError("value", `${o.argument} ${excerpt((columns[c] as { header: string }).header)}`, `${place(k)} is not a finite number (${String(cell)})`);
    }
    if (typeof cell === "string") {
      const t = cell.trim();
      return t === "" ? null : numbers.read(t, c, k, raw.length + c);
    }
    throw new RheoError("value", `${o.argument} ${excerpt((columns[c] as { header: string }).header)}`, `${place(k)} is not a number`);
  };
  // values as written, two per row (rate, viscosity); corrected once the decimal mark is known
  const raw: number[] = []; // the key of a pending cell is its index here
  cells.slice(1).forEach((row, i) => {
    const k = i + 1;
    const r = read(row[rate!.index], 0, k);
    const v = read(row[visc!.index], 1, k);
    if (r === null && v === null) return;
    if (r === null || v === null) throw new RheoError("missing", o.argument, `${place(k)} has ${r === null ? "no shear rate" : "no viscosity"}`);
    raw.push(r, v);
  });
  for (const c of numbers.finish()) raw[c.key] = c.comma;
  const shearRate: number[] = [];
  const viscosity: number[] = [];
  for (let i = 0; i < raw.length; i += 2) {
    shearRate.push(toSI(raw[i] as number, rate!.unit, "shearRate"));
    viscosity.push(toSI(raw[i + 1] as number, visc!.unit, "viscosity"));
  }
  if (shearRate.length === 0) throw new RheoError("missing", o.argument, "has no data rows");
  return { table: { shearRate, viscosity }, warnings };
}
