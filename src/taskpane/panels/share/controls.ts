/**
 * The Share command (copy a sheet with Rheoledger formulas replaced by values) and the workbook
 * lists the pane offers (tables for the data source, sheets to share). Excel only.
 */
import { excelBatch, listTablesAndSheets, supportsExcelApi, type HostMode } from "../../officeHost";
import { byId, clearFieldErrors } from "../../paneDom";
import { fail, setBusy, showProblems, state } from "../../paneState";
import { copySheetAsValues } from "./values";

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
  if (state.busy) return;
  clearFieldErrors(byId("share-section"));
  const name = byId<HTMLSelectElement>("share-sheet").value;
  if (!name) {
    showProblems([{ field: "share", message: "Choose a sheet to copy." }], "shareRun");
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
    fail(error, "shareRun");
  } finally {
    setBusy(false);
  }
}

/** Attaches the Share button and refreshes the sheet list when it is opened. */
export function wireShare(): void {
  byId("share").addEventListener("click", () => void share());
  byId("share-sheet").addEventListener("focus", () => void refreshWorkbookLists().catch(() => undefined));
}

/** Preview mode: sharing needs Excel (the button is disabled and says why); in Excel, the workbook's sheets. */
export function shareMode(mode: HostMode): void {
  byId("share-help").textContent =
    mode.kind === "preview"
      ? "Needs Excel, so it is switched off here: in the workbook it copies a sheet with Rheoledger formulas replaced by values (formulas kept in notes)."
      : "Makes a copy in which Rheoledger formulas become plain numbers (each formula kept in a note), for colleagues without the add-in.";
  byId<HTMLSelectElement>("share-sheet").disabled = mode.kind === "preview";
  if (mode.kind === "excel") void refreshWorkbookLists().catch((e) => fail(e, "shareRun"));
}
