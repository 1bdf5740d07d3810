/**
 * A result table described once in src/io/resultTables.ts, as a cell block of a sheet plan: each
 * header with its unit ("Pressure [bar]"), the rows in their display units, flags as "yes"/"no"
 * (a word, so a sheet filter and a reader without the pane see the same thing), the table's key
 * columns as the columns a narrow pane shows, and its notes as a text block after it. Pure.
 */
import { headerWithUnit, type ResultTable } from "../io/resultTables";
import type { CellBlock, CellValue } from "./sheetPlan";

/** A block without its place on the sheet (the stacking code places it). */
export type TableBlockDraft = Omit<CellBlock, "row" | "col">;

/**
 * The block of `table` with block id `id` (the preview and the tests find it by that id).
 * @example resultTableBlock(stepsTable(runs), "steps").header?.[8] // "Pressure [bar]"
 */
export function resultTableBlock(table: ResultTable, id: string): TableBlockDraft {
  const keys = (table.keyColumns ?? []).map((k) => table.columns.findIndex((c) => c.key === k)).filter((i) => i >= 0);
  const rows = table.rows.map((r) => table.columns.map((c, i): CellValue => {
    const v = r[i] ?? null;
    return c.kind === "flag" && typeof v === "boolean" ? (v ? "yes" : "no") : v;
  }));
  return {
    id,
    role: "table",
    title: table.scope !== undefined ? `${table.title}: ${table.scope}` : table.title,
    header: table.columns.map(headerWithUnit),
    rows,
    ...(keys.length > 0 ? { keyColumns: keys } : {}),
  };
}

/** The notes of `table` as one text block each (none when it has none). */
export function resultTableNotes(table: ResultTable, id: string): TableBlockDraft[] {
  return (table.notes ?? []).map((note, i) => ({ id: `${id}-note-${i + 1}`, role: "text", rows: [[note]] }));
}
