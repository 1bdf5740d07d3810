/**
 * The pane's view of its host: whether it runs inside Excel or in preview mode (a plain browser),
 * and the few workbook reads the Data and Share steps need.
 */
import type { ExcelBatch } from "./excelWriter";

/** Where the pane runs. */
export type HostMode = { kind: "excel" } | { kind: "preview"; reason: string };

/** How long to wait for Office.onReady before falling back to preview mode. */
export const OFFICE_READY_TIMEOUT_MS = 4000;

/**
 * Excel when Office.onReady reports the Excel host; preview mode when office.js is absent, reports
 * no host (a plain browser) or does not answer in time (opened from file://).
 */
export function detectHost(timeoutMs = OFFICE_READY_TIMEOUT_MS): Promise<HostMode> {
  if (typeof Office === "undefined" || typeof Office.onReady !== "function") {
    return Promise.resolve({ kind: "preview", reason: "Office.js is not loaded" });
  }
  return new Promise((resolve) => {
    const timer = setTimeout(() => resolve({ kind: "preview", reason: "Office did not answer" }), timeoutMs);
    void Office.onReady((info) => {
      clearTimeout(timer);
      if (String(info.host) === "Excel" && typeof Excel !== "undefined") resolve({ kind: "excel" });
      else resolve({ kind: "preview", reason: info.host ? `host ${String(info.host)} is not Excel` : "not inside Office" });
    });
  });
}

/** `Excel.run` as an {@link ExcelBatch}. */
export const excelBatch: ExcelBatch = (batch) => Excel.run(batch);

/** True when the host supports ExcelApi `version`. */
export function supportsExcelApi(version: string): boolean {
  return typeof Office !== "undefined" && Office.context?.requirements?.isSetSupported("ExcelApi", version) === true;
}

/** Cells read from the workbook, with the address they came from. */
export interface SourceCells {
  address: string;
  values: unknown[][];
}

/** Splits "Data!A1:F82" or "'My data'!A1:F82" into sheet and range; a bare range has no sheet. */
export function splitAddress(text: string): { sheet: string | null; range: string } {
  const t = text.trim();
  const bang = t.lastIndexOf("!");
  if (bang < 0) return { sheet: null, range: t };
  const sheet = t.slice(0, bang).replace(/^'(.*)'$/, "$1").replace(/''/g, "'");
  return { sheet, range: t.slice(bang + 1) };
}

/** The selected range's address and values. */
export function readSelection(run: ExcelBatch): Promise<SourceCells> {
  return run(async (context) => {
    const range = context.workbook.getSelectedRange();
    range.load(["address", "values"]);
    await context.sync();
    return { address: range.address, values: range.values };
  });
}

/** The cells of a table (by name, header row included) or of an address such as "Data!A1:F82". */
export function readSource(run: ExcelBatch, text: string): Promise<SourceCells> {
  return run(async (context) => {
    const table = context.workbook.tables.getItemOrNullObject(text.trim());
    table.load("name");
    await context.sync();
    const { sheet, range: address } = splitAddress(text);
    const range = !table.isNullObject
      ? table.getRange()
      : sheet === null
        ? context.workbook.worksheets.getActiveWorksheet().getRange(address)
        : context.workbook.worksheets.getItem(sheet).getRange(address);
    range.load(["address", "values"]);
    await context.sync();
    return { address: !table.isNullObject ? `${table.name} (${range.address})` : range.address, values: range.values };
  });
}

/** Names of the workbook's tables and sheets. */
export function listTablesAndSheets(run: ExcelBatch): Promise<{ tables: string[]; sheets: string[] }> {
  return run(async (context) => {
    const tables = context.workbook.tables;
    const sheets = context.workbook.worksheets;
    tables.load("items/name");
    sheets.load("items/name");
    await context.sync();
    return { tables: tables.items.map((t) => t.name), sheets: sheets.items.map((s) => s.name) };
  });
}
