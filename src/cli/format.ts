/**
 * Plain-text tables for the terminal: right-aligned numbers in engineering-friendly precision.
 */
import { headerWithUnit, type ResultColumn, type ResultTable } from "../io/resultTables";

/** Formats a number with 4 significant digits, or "—" for null. */
export function num(value: number | null | undefined, digits = 4): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return "—";
  if (value === 0) return "0";
  const abs = Math.abs(value);
  if (abs >= 1e6 || abs < 1e-3) return value.toExponential(digits - 1);
  return Number(value.toPrecision(digits)).toString();
}

/** Renders rows under a header line, columns right-aligned and separated by two spaces. */
export function table(headers: string[], rows: string[][]): string {
  const widths = headers.map((h, i) => Math.max(h.length, ...rows.map((r) => (r[i] ?? "").length)));
  const line = (cells: string[]) => cells.map((c, i) => c.padStart(widths[i] as number)).join("  ");
  return [line(headers), widths.map((w) => "-".repeat(w)).join("  "), ...rows.map(line)].join("\n");
}

/** One result table (src/io/resultTables.ts) as terminal text: title, header with units, rows, notes. */
export function resultTableText(t: ResultTable): string {
  const headers = t.columns.map(headerWithUnit);
  const rows = t.rows.map((r) =>
    r.map((cell, i) => {
      const c = t.columns[i] as ResultColumn;
      if (cell === null) return "—";
      if (typeof cell === "boolean") return cell ? "yes" : "no";
      if (typeof cell === "number") return c.kind === "number" && Number.isInteger(cell) && Math.abs(cell) < 1e6 && !c.digits ? String(cell) : num(cell, c.digits ?? 4);
      return cell;
    }),
  );
  const title = t.scope ? `${t.title}, ${t.scope}` : t.title;
  return [title, table(headers, rows), ...(t.notes ?? []).map((n) => `  ${n}`)].join("\n");
}
