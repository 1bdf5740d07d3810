/**
 * Cell addresses and writers shared by the demo-workbook generator (scripts/make-workbooks.ts)
 * and its analysis blocks (./analysisBlocks.ts): array formulas with cached results, plain
 * formulas, headers and block titles.
 */
import ExcelJS from "exceljs";
import { Grid, RangeArg, SheetCall } from "./sheetCall";

export function columnLetter(col: number): string {
  let s = "";
  for (let c = col; c > 0; c = Math.floor((c - 1) / 26)) s = String.fromCharCode(65 + ((c - 1) % 26)) + s;
  return s;
}

function sheetPrefix(sheet: string): string {
  return /^[A-Za-z_][A-Za-z0-9_]*$/.test(sheet) ? `${sheet}!` : `'${sheet.replace(/'/g, "''")}'!`;
}

/** "A1" or "'Raw data'!A1:A9" (rows and columns 1-based). */
export function rangeRef(sheet: string | null, row: number, col: number, rowEnd = row, colEnd = col): string {
  const a = `${columnLetter(col)}${row}`;
  const b = `${columnLetter(colEnd)}${rowEnd}`;
  return (sheet ? sheetPrefix(sheet) : "") + (a === b ? a : `${a}:${b}`);
}

/** A result value as the file caches it (booleans stay booleans: Excel stores them as such). */
export function cached(value: unknown): number | string | boolean {
  if (typeof value === "number" || typeof value === "string" || typeof value === "boolean") return value;
  throw new Error(`cannot cache ${String(value)}`);
}

/** Writes `call` as an array formula with its top-left cell at (row, col); returns its size. */
export function placeArray(ws: ExcelJS.Worksheet, row: number, col: number, call: SheetCall): { rows: number; cols: number } {
  const rows = call.result.length;
  const cols = Math.max(...call.result.map((r) => r.length));
  const ref = rangeRef(null, row, col, row + rows - 1, col + cols - 1);
  // exceljs supports the shareType argument ("array") but its typings omit it
  const fill = ws.fillFormula as unknown as (range: string, formula: string, results: (r: number, c: number) => number | string | boolean, shareType: "array") => void;
  fill.call(ws, ref, call.formula, (r, c) => cached(call.result[r - row]?.[c - col] ?? ""), "array");
  return { rows, cols };
}

/** The values of a one-column slice of a grid, as a range argument at the given sheet cells. */
export function columnArg(sheet: string | null, grid: Grid, col: number, firstRow: number, gridCol: number, fromGridRow: number, count: number): RangeArg {
  return {
    ref: rangeRef(sheet, firstRow, col, firstRow + count - 1, col),
    values: grid.slice(fromGridRow, fromGridRow + count).map((r) => [r[gridCol]]),
  };
}

export function header(ws: ExcelJS.Worksheet, row: number, col: number, names: string[]): void {
  names.forEach((n, i) => {
    const cell = ws.getCell(row, col + i);
    cell.value = n;
    cell.font = { bold: true };
  });
}

export function label(ws: ExcelJS.Worksheet, row: number, text: string): void {
  const cell = ws.getCell(row, 1);
  cell.value = text;
  cell.font = { bold: true, size: 12 };
}

/** A plain (non-RHEO) formula such as ="'Raw data'!C29" or =2*(A5/30)^2.5, with its cached value. */
export function referenceCell(ws: ExcelJS.Worksheet, row: number, col: number, formula: string, value: unknown): void {
  ws.getCell(row, col).value = { formula, result: cached(value) } as ExcelJS.CellFormulaValue;
}
