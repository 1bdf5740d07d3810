/**
 * The Share command (copy a sheet with Rheoledger formulas replaced by values) and the workbook
 * lists the pane offers (tables for the data source, sheets to share). Excel only.
 */
import { excelBatch, listTablesAndSheets, supportsExcelApi } from "./officeHost";
import { byId, clearFieldErrors, showFieldError } from "./paneDom";
import { fail, setBusy, state } from "./paneState";
import { copySheetAsValues } from "./shareValues";

/** Refills the table picker and the share-sheet list from the workbook (Excel mode only). */
export async function refreshWorkbookLists(): Promise<void> {
  if (state.mode.kind !== "excel") return;
  const { tables, sheets } = await listTablesAndSheets(excelBatch);
  const pick = byId<HTMLSelectElement>("table-pick");
  pick.replaceChildren(new Option("(no table)", ""), ...tables.map((t) => new Option(t, t)));
  const share = byId<HTMLSelectElement>("share-sheet");
  const current = share.value;
  share.replaceChildren(...sheets.map((s) => new Option(s, s, false, s === current)));
}

async function share(): Promise<void> {
  clearFieldErrors();
  const name = byId<HTMLSelectElement>("share-sheet").value;
  if (!name) {
    showFieldError("share", "Choose a sheet to copy.");
    return;
  }
  setBusy(true);
  byId("share-status").textContent = "Copying…";
  try {
    const done = await copySheetAsValues(excelBatch, name, supportsExcelApi);
    const kept = done.keeper === "notes" ? "in cell notes" : done.keeper === "comments" ? "in cell comments" : "in a list below the cells";
    byId("share-status").textContent = `Wrote “${done.name}”: ${done.replaced} Rheoledger formula(s) replaced by values, each kept ${kept}.`;
    void refreshWorkbookLists();
  } catch (error) {
    byId("share-status").textContent = "";
    fail(error, "share");
  } finally {
    setBusy(false);
  }
}

/** Attaches the Share button and refreshes the sheet list when it is opened. */
export function wireShare(): void {
  byId("share").addEventListener("click", () => void share());
  byId("share-sheet").addEventListener("focus", () => void refreshWorkbookLists().catch(() => undefined));
}

/** Preview mode: sharing needs Excel; the help says what it would do. */
export function previewShare(): void {
  byId("share-help").textContent = "Needs Excel: in the workbook it copies a sheet with Rheoledger formulas replaced by values (formulas kept in notes).";
}
