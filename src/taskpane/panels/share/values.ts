/**
 * "Copy as values": a copy of a sheet in which the add-in's formulas (RHEO.*) are replaced by
 * their current values, each formula kept in a note on its cell, so colleagues without the add-in
 * see the numbers. Other formulas and constants are kept as they are. Notes need ExcelApi 1.18;
 * older hosts get threaded comments (1.10), and hosts without either get a list of the replaced
 * formulas below the copied cells.
 */
import { ExcelBatch, TEXT_FORMAT, deleteSheets, uniqueSheetName } from "../../excelWriter";
import { a1 } from "../../sheetPlan";

/** A formula of this add-in (the RHEO namespace, also under an Excel prefix such as _xldudf_). */
export const ADDIN_FORMULA = /(^|[^A-Za-z0-9_.])(_xldudf_)?RHEO\.[A-Z]+\s*\(/i;

/** Where a replaced formula's text is kept. */
export type FormulaKeeper = "notes" | "comments" | "list";

/** One replaced formula: 0-based offsets inside the copied range, and its text. */
export interface ReplacedFormula {
  row: number;
  col: number;
  formula: string;
}

/**
 * The cells of the copy: each add-in formula replaced by its value, everything else as it was.
 * `formulas` and `values` are the used range's `formulas` and `values` (same shape).
 * @example valuesCopyGrid([["=RHEO.FLOWRATE(A1,B1)"]], [[2.5]]).grid // [[2.5]]
 */
export function valuesCopyGrid(formulas: readonly (readonly unknown[])[], values: readonly (readonly unknown[])[]): { grid: unknown[][]; replaced: ReplacedFormula[]; text: { row: number; col: number }[] } {
  const replaced: ReplacedFormula[] = [];
  const text: { row: number; col: number }[] = [];
  const grid = formulas.map((row, r) =>
    row.map((f, c) => {
      const value = values[r]?.[c];
      if (typeof f === "string" && f.startsWith("=") && ADDIN_FORMULA.test(f)) {
        replaced.push({ row: r, col: c, formula: f });
        if (readsAsFormula(value)) text.push({ row: r, col: c });
        return value ?? "";
      }
      // a text cell whose text reads like a formula: its "formula" is its own text
      if (typeof f === "string" && f === value && readsAsFormula(f)) text.push({ row: r, col: c });
      return f;
    }),
  );
  return { grid, replaced, text };
}

/** True for text Excel would take as a formula or an entry command when written as a value. */
export function readsAsFormula(value: unknown): boolean {
  return typeof value === "string" && /^[=+\-@\t\r]/.test(value);
}

/** How formulas can be kept on this host, best first. */
export function formulaKeeper(supports: (version: string) => boolean): FormulaKeeper {
  if (supports("1.18")) return "notes";
  if (supports("1.10")) return "comments";
  return "list";
}

/** The note text of a replaced formula. */
export function noteText(formula: string): string {
  return `Value of the Rheoledger formula ${formula}`;
}

/**
 * Copies sheet `sheetName` to a new sheet "<name> values" (made unique) with the add-in's
 * formulas replaced by values. `supports(v)` tells whether ExcelApi v is available.
 * Deletes the copy again if anything fails.
 */
export async function copySheetAsValues(
  run: ExcelBatch,
  sheetName: string,
  supports: (version: string) => boolean,
): Promise<{ name: string; replaced: number; keeper: FormulaKeeper }> {
  const created: string[] = [];
  try {
    return await run(async (context) => {
      const sheets = context.workbook.worksheets;
      sheets.load("items/name");
      const source = sheets.getItem(sheetName);
      const used = source.getUsedRangeOrNullObject();
      used.load(["formulas", "values", "rowIndex", "columnIndex", "rowCount", "columnCount"]);
      await context.sync();
      const name = uniqueSheetName(`${sheetName} values`, sheets.items.map((s) => s.name));
      created.push(name);
      const copy = supports("1.10") ? source.copy("After", source) : sheets.add(name);
      copy.name = name;
      const keeper = formulaKeeper(supports);
      if (used.isNullObject) {
        await context.sync();
        return { name, replaced: 0, keeper };
      }
      const { grid, replaced, text } = valuesCopyGrid(used.formulas, used.values);
      const target = copy.getRange(a1(used.rowIndex, used.columnIndex, used.rowCount, used.columnCount));
      // text that reads like a formula (a value replacing a formula, or a text cell "=…", "+…", "-…", "@…") stays text
      for (const t of text) copy.getRange(a1(used.rowIndex + t.row, used.columnIndex + t.col)).numberFormat = [[TEXT_FORMAT]];
      target.formulas = grid;
      const at = (f: ReplacedFormula) => a1(used.rowIndex + f.row, used.columnIndex + f.col);
      if (keeper === "notes") {
        for (const f of replaced) copy.notes.add(at(f), noteText(f.formula));
      } else if (keeper === "comments") {
        for (const f of replaced) context.workbook.comments.add(`'${name.replace(/'/g, "''")}'!${at(f)}`, noteText(f.formula));
      } else if (replaced.length > 0) {
        const top = used.rowIndex + used.rowCount + 1;
        const list = [["Rheoledger formulas replaced by their values", ""], ...replaced.map((f) => [at(f), f.formula])];
        const listRange = copy.getRange(a1(top, used.columnIndex, list.length, 2));
        // the formulas are listed as text: "Text" format before the values, or "=RHEO…" would be a formula again
        listRange.numberFormat = list.map((row) => row.map(() => TEXT_FORMAT));
        listRange.values = list;
      }
      copy.activate();
      await context.sync();
      return { name, replaced: replaced.length, keeper };
    });
  } catch (error) {
    await deleteSheets(run, created).catch(() => undefined);
    throw error;
  }
}
