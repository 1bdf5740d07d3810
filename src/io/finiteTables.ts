/**
 * No NaN and no Infinity in any written cell: a result that is not a finite number becomes an
 * empty cell, the table gets a note saying which column and rows, and the run gets a
 * RESULT_NOT_FINITE warning (added to the warnings table too, when there is one). Every writer
 * (results workbook, HTML report) passes its tables through {@link finiteTables} first.
 */
import { warning, type Warning } from "../core/errors";
import type { ResultCell, ResultTable } from "./resultTables";

/** Row numbers as a short list: "3, 5–7, 12". */
function rowList(rows: number[]): string {
  const parts: string[] = [];
  for (let i = 0; i < rows.length; ) {
    let j = i;
    while (j + 1 < rows.length && (rows[j + 1] as number) === (rows[j] as number) + 1) j++;
    parts.push(i === j ? String(rows[i]) : `${rows[i]}–${rows[j]}`);
    i = j + 1;
  }
  return parts.join(", ");
}

const notFinite = (v: ResultCell): boolean => typeof v === "number" && !Number.isFinite(v);

/**
 * The tables with every non-finite number replaced by null, a note per affected column, and one
 * warning per affected table (also appended to the table with id "warnings", by its column keys
 * code, severity, message, scope where present).
 */
export function finiteTables(tables: readonly ResultTable[]): { tables: ResultTable[]; warnings: Warning[] } {
  const warnings: Warning[] = [];
  const out = tables.map((t) => {
    const bad = new Map<number, number[]>();
    t.rows.forEach((r, i) => r.forEach((v, c) => {
      if (notFinite(v)) bad.set(c, [...(bad.get(c) ?? []), i + 1]);
    }));
    if (bad.size === 0) return t;
    const notes = [...bad].map(([c, rows]) => `"${t.columns[c]?.header ?? `column ${c + 1}`}" is empty in row${rows.length === 1 ? "" : "s"} ${rowList(rows)} of this table: the value was not a finite number (NaN or infinite).`);
    const where = t.scope ? `${t.title} (${t.scope})` : t.title;
    warnings.push(warning("RESULT_NOT_FINITE", `${where}: ${[...bad.values()].reduce((n, r) => n + r.length, 0)} value(s) were not finite numbers and are left empty (${[...bad.keys()].map((c) => t.columns[c]?.header ?? `column ${c + 1}`).join(", ")}).`, t.scope));
    return { ...t, rows: t.rows.map((r) => r.map((v) => (notFinite(v) ? null : v))), notes: [...(t.notes ?? []), ...notes] };
  });
  if (warnings.length === 0) return { tables: out, warnings };
  return {
    tables: out.map((t) => {
      if (t.id !== "warnings") return t;
      const row = (w: Warning): ResultCell[] => t.columns.map((c) => (c.key === "code" ? w.code : c.key === "severity" ? w.severity : c.key === "message" ? w.message : c.key === "scope" ? (w.scope ?? null) : null));
      return { ...t, rows: [...t.rows, ...warnings.map(row)] };
    }),
    warnings,
  };
}
