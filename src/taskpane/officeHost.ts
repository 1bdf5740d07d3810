/**
 * The pane's view of its host: whether it runs inside Excel or in preview mode (a plain browser),
 * and the few workbook reads the Data and Share steps need.
 */
import type { ExcelBatch } from "./excelWriter";

/** Where the pane runs. */
export type HostMode = { kind: "excel" } | { kind: "preview"; reason: string };

/**
 * How long the pane waits for office.js and Office.onReady before it opens in preview mode. The
 * pane's scripts start at once (taskpane.html loads office.js `defer`, the pane `async`), so the
 * preview is up within this time plus the pane's own start-up, whatever the network does.
 */
export const OFFICE_READY_TIMEOUT_MS = 3000;
/** How often the pane looks whether office.js has arrived. */
const OFFICE_POLL_MS = 50;
/** How long the pane keeps listening for a late Excel after opening in preview mode. */
export const LATE_OFFICE_WINDOW_MS = 120_000;

/** office.js is loaded (its global `Office` with `onReady`). */
const officeLoaded = (): boolean => typeof Office !== "undefined" && typeof Office.onReady === "function";

/** Resolves when office.js has loaded, or with false after `ms`. */
function whenOfficeLoaded(ms: number, poll = OFFICE_POLL_MS): Promise<boolean> {
  return new Promise((resolve) => {
    const started = Date.now();
    const look = () => {
      if (officeLoaded()) resolve(true);
      else if (Date.now() - started >= ms) resolve(false);
      else setTimeout(look, poll);
    };
    look();
  });
}

/** The host Office.onReady reports, or null when it does not answer within `ms`. */
function onReadyWithin(ms: number): Promise<HostMode | null> {
  return new Promise((resolve) => {
    const timer = setTimeout(() => resolve(null), ms);
    void Office.onReady((info) => {
      clearTimeout(timer);
      if (String(info.host) === "Excel" && typeof Excel !== "undefined") resolve({ kind: "excel" });
      else resolve({ kind: "preview", reason: info.host ? `host ${String(info.host)} is not Excel` : "not inside Office" });
    });
  });
}

/**
 * Excel when office.js loads and Office.onReady reports the Excel host; preview mode when
 * office.js does not arrive (blocked, hanging, offline), reports no host (a plain browser) or does
 * not answer, all within `timeoutMs` in total. When the answer was "no answer in time",
 * `onLateExcel` is called if Excel answers later (a slow network inside Excel), so the pane can
 * leave preview mode.
 */
export async function detectHost(timeoutMs = OFFICE_READY_TIMEOUT_MS, onLateExcel?: () => void): Promise<HostMode> {
  const started = Date.now();
  const loaded = await whenOfficeLoaded(timeoutMs);
  const answer = loaded ? await onReadyWithin(Math.max(0, timeoutMs - (Date.now() - started))) : null;
  if (answer) return answer;
  if (onLateExcel) {
    void (async () => {
      if (!(await whenOfficeLoaded(LATE_OFFICE_WINDOW_MS, 250))) return;
      const late = await onReadyWithin(LATE_OFFICE_WINDOW_MS);
      if (late?.kind === "excel") onLateExcel();
    })();
  }
  return { kind: "preview", reason: loaded ? "Office did not answer in time" : "Office.js did not load in time" };
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
