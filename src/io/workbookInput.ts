/**
 * A raw-data sheet of an xlsx workbook to measurements (`rheoledger reduce FILE.xlsx [--sheet
 * NAME]`): the first sheet unless one is named, its first non-empty row the header, then the same
 * table reader as CSV files and worksheet ranges (rawTable.ts). Rows are named by their sheet row
 * numbers.
 *
 * exceljs is loaded here with a dynamic import, only when a workbook is actually read, so the
 * command line does not pay for it on CSV input. Node only (never imported by the add-in bundles).
 */
import { RheoError } from "../core/errors";
import { RowList } from "../core/rowAccount";
import { HEADER_SEARCH_ROWS, findHeaderRow } from "./headers";
import { type RawTable, type RawTableOptions, RawTableReader, UnreadableCell, preambleWarning } from "./rawTable";
import { excerpt } from "./safeText";

/** A raw table read from a workbook, with the sheet it came from. */
export interface RawWorkbookTable extends RawTable {
  sheet: string;
}

/**
 * One exceljs cell value as the table reader takes it: numbers, text, booleans and blanks as they
 * are, a formula as its saved result, rich text and hyperlinks as their text, error values as
 * `{ code }`, dates as Date objects (refused by the reader).
 */
export function workbookCellValue(value: unknown): unknown {
  if (value === null || value === undefined) return null;
  if (typeof value !== "object" || value instanceof Date) return value;
  const v = value as Record<string, unknown>;
  if ("formula" in v || "sharedFormula" in v) {
    if (v.result === undefined) return new UnreadableCell("is a formula without a saved result; open the file in Excel and save it");
    return workbookCellValue(v.result);
  }
  if (Array.isArray(v.richText)) return (v.richText as { text?: string }[]).map((r) => r.text ?? "").join("");
  if (typeof v.text === "string") return v.text;
  if (typeof v.error === "string") return { code: v.error };
  return new UnreadableCell("holds a value that is neither a number nor text");
}

/** Loads exceljs on first use. */
async function loadExcelJs(): Promise<typeof import("exceljs")> {
  const mod = (await import("exceljs")) as typeof import("exceljs") & { default?: typeof import("exceljs") };
  return mod.default ?? mod;
}

/**
 * Reads the raw table of one sheet (see the module comment).
 * @param sheetName the sheet to read (exact name, else the one name that matches ignoring case); the first sheet when omitted
 * @throws RheoError naming the file: not a readable workbook, no such sheet (the sheets are listed), an empty sheet;
 *   or naming the column and row of a bad cell
 */
export async function readRawWorkbook(bytes: Uint8Array, file: string, sheetName: string | undefined, options: Partial<RawTableOptions> = {}): Promise<RawWorkbookTable> {
  const ExcelJS = await loadExcelJs();
  const workbook = new ExcelJS.Workbook();
  try {
    await workbook.xlsx.load(bytes as unknown as ArrayBuffer);
  } catch (e) {
    throw new RheoError("value", file, `looks like an xlsx workbook but cannot be read (${excerpt((e as Error).message, 80)}); open it in Excel and save it again, or save the sheet as CSV`, undefined, "UNREADABLE_WORKBOOK");
  }
  const sheets = workbook.worksheets;
  if (sheets.length === 0) throw new RheoError("missing", file, "holds no worksheet", undefined, "EMPTY_FILE");
  const names = sheets.map((s) => `"${excerpt(s.name)}"`).join(", ");
  let sheet = sheets[0] as (typeof sheets)[number];
  if (sheetName !== undefined) {
    const exact = sheets.find((s) => s.name === sheetName);
    const loose = sheets.filter((s) => s.name.toLowerCase() === sheetName.toLowerCase());
    const found = exact ?? (loose.length === 1 ? loose[0] : undefined);
    if (!found) throw new RheoError("value", "--sheet", `no sheet "${excerpt(sheetName)}" in ${file}; its sheets: ${names}`, undefined, "NO_SUCH_SHEET");
    sheet = found;
  }
  const rows = sheet.getSheetValues() as unknown[][];
  const cellsOf = (values: unknown[] | undefined): unknown[] => {
    if (!values) return [];
    const out: unknown[] = new Array(Math.max(0, values.length - 1));
    for (let c = 1; c < values.length; c++) out[c - 1] = workbookCellValue(values[c]);
    return out;
  };
  const isEmpty = (cells: unknown[]) => cells.every((c) => c === null || c === undefined || (typeof c === "string" && c.trim() === ""));
  // the header: the first row naming two known quantities among the first rows, else the first non-empty row
  const top: unknown[][] = [];
  for (let r = 1; r < rows.length && top.length < HEADER_SEARCH_ROWS; r++) top.push(cellsOf(rows[r]));
  const found = findHeaderRow(top);
  const headerRow = found >= 0 ? found + 1 : top.findIndex((cells) => !isEmpty(cells)) + 1;
  if (headerRow <= 0) throw new RheoError("missing", file, `sheet "${excerpt(sheet.name)}" is empty; its sheets: ${names} (choose one with --sheet NAME)`, undefined, "EMPTY_FILE");
  const reader = new RawTableReader(cellsOf(rows[headerRow]), { ...options, rowWord: "row", headerNumber: headerRow, source: `${file} sheet "${excerpt(sheet.name)}"` });
  const preamble = new RowList();
  for (let r = 1; r < headerRow; r++) if (!isEmpty(cellsOf(rows[r]))) preamble.add(r);
  for (let r = headerRow + 1; r < rows.length; r++) {
    const cells = cellsOf(rows[r]);
    if (isEmpty(cells)) reader.skip("blank", r);
    else reader.add(cells, r);
  }
  const table = reader.finish();
  if (preamble.count > 0) table.warnings.unshift(preambleWarning(preamble, "row", headerRow));
  return { ...table, sheet: sheet.name };
}
