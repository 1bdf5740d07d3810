/**
 * The fit across temperatures and the rotational join on the results sheet: the shared result
 * tables (src/io/resultTables.ts: masterFitTables, joinedTable) placed as sheet blocks, with their
 * notes under them, so the sheet says what the command line and the results workbook say. Nothing
 * is computed here.
 */
import { headerWithUnit, joinedTable, masterFitTables, type ResultTable } from "../io/resultTables";
import type { BlockDraft } from "./resultsFlowBlocks";
import type { RunOutput } from "./runReduction";

/**
 * A shared result table as a sheet block (headers with their units), then its notes as a list.
 * The narrow pane shows the table's key columns, and its unit column when it has one.
 */
export function resultTableBlocks(table: ResultTable, id: string): BlockDraft[] {
  const keys = new Set([...(table.keyColumns ?? []), "unit"]);
  const keyColumns = table.columns.map((c, i) => (keys.has(c.key) ? i : -1)).filter((i) => i >= 0);
  const block: BlockDraft = {
    id,
    role: "table",
    title: table.title,
    header: table.columns.map(headerWithUnit),
    rows: table.rows.map((r) => r.map((cell) => cell)),
    ...(table.keyColumns ? { keyColumns } : {}),
  };
  const notes: BlockDraft[] = table.notes && table.notes.length > 0 ? [{ id: `${id}-notes`, role: "list", title: `${table.title}: notes`, header: ["note"], rows: table.notes.map((n) => [n]) }] : [];
  return [block, ...notes];
}

/** The blocks of the fit across temperatures (none when it was not asked for). Ids `masterfit`, `masterfit-factors` (+ `-notes`). */
export function masterFitBlocks(run: Pick<RunOutput, "master">): BlockDraft[] {
  const ids: Record<string, string> = { masterFit: "masterfit", masterFitFactors: "masterfit-factors" };
  return masterFitTables({ master: run.master ?? undefined }).flatMap((t) => resultTableBlocks(t, ids[t.id] ?? t.id));
}

/** The blocks of the rotational join (none without a rotational curve). Id `rotational-join` (+ `-notes`). */
export function joinedBlocks(run: Pick<RunOutput, "joined">): BlockDraft[] {
  const t = joinedTable({ joined: run.joined ?? undefined });
  return t ? resultTableBlocks(t, "rotational-join") : [];
}
