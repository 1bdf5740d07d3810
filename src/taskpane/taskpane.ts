/**
 * The task pane: Data → Settings → Run → Share. Inside Excel the run writes new sheets through
 * the Excel writer; outside Office (a plain browser) the pane runs in preview mode on the bundled
 * demo data and shows the same plan as tables and small charts. Imports src/core and src/io
 * only through the pane's modules; never src/functions (it loads as its own bundle).
 */
import { DEMO_CSV_LABEL, demoCells } from "./demoData";
import { ColumnChoice, DieEntry, detectColumns } from "./columns";
import { writeWorkbookPlan } from "./excelWriter";
import { HostMode, detectHost, excelBatch, listTablesAndSheets, readSelection, readSource, supportsExcelApi } from "./officeHost";
import { byId, clearFieldErrors, fillStaticHelp, renderColumns, renderDies, renderModels, showFieldError, showProgress } from "./paneDom";
import { buildWorkbookPlan } from "./plan";
import { sheetPlanHtml } from "./preview";
import { PaneError, runReduction, toFieldError } from "./runReduction";
import { DEFAULT_PANE_SETTINGS, FieldId, PaneSettings, SETTING_HELP, parseNumberField, usesDegree } from "./settings";
import { copySheetAsValues } from "./shareValues";
import { ADDIN_VERSION } from "./version";
import type { ModelId } from "../core/models";
import type { RabinowitschMethod } from "../core/rabinowitsch";

interface PaneState {
  mode: HostMode;
  cells: unknown[][] | null;
  sourceLabel: string;
  columns: ColumnChoice[];
  dies: DieEntry[];
  settings: PaneSettings;
  busy: boolean;
}

const state: PaneState = {
  mode: { kind: "preview", reason: "starting" },
  cells: null,
  sourceLabel: "",
  columns: [],
  dies: [],
  settings: { ...DEFAULT_PANE_SETTINGS, models: [...DEFAULT_PANE_SETTINGS.models] },
  busy: false,
};

/** Lets the browser repaint between steps of a run. */
const pause = () => new Promise<void>((resolve) => setTimeout(resolve, 0));

function fail(error: unknown, fallback: FieldId): void {
  const f = error instanceof PaneError || !(error instanceof Error) || error.name === "RheoError" ? toFieldError(error) : { field: fallback, message: plainOfficeMessage(error) };
  const control = showFieldError(f.field, f.message);
  const focusable = control.matches("input, select, button") ? control : control.querySelector<HTMLElement>("input, select, button");
  focusable?.focus();
}

/** An Office error in plain words. */
function plainOfficeMessage(error: Error): string {
  const text = error.message || String(error);
  if (/ItemNotFound|doesn't exist|does not exist/i.test(text)) return `Excel could not find that range or table: ${text}`;
  if (/InvalidArgument|not valid/i.test(text)) return `Excel did not accept the address: ${text}`;
  return `Excel reported a problem, and nothing was written: ${text}`;
}

function setBusy(busy: boolean): void {
  state.busy = busy;
  for (const id of ["run", "share", "read-columns", "use-selection"]) byId<HTMLButtonElement>(id).disabled = busy || (id !== "run" && id !== "read-columns" && state.mode.kind === "preview");
  byId("run").setAttribute("aria-busy", String(busy));
}

function setColumns(columns: ColumnChoice[]): void {
  state.columns = columns;
  renderColumns(byId("columns"), columns, (index, role, unit, changed) => {
    const needsUnit = role !== "ignore" && role !== "die" && unit === null;
    state.columns = state.columns.map((c) => (c.index === index ? { ...c, role, unit, recognised: false, problem: needsUnit ? `choose the unit of ${role}` : null } : c));
    setColumns(state.columns);
    byId(`col-${index}-${changed}`).focus();
  });
}

function setDies(dies: DieEntry[]): void {
  state.dies = dies;
  renderDies(byId("dies"), dies, setDies);
}

async function loadSource(): Promise<void> {
  clearFieldErrors();
  if (state.mode.kind === "preview") {
    state.cells = demoCells();
    state.sourceLabel = DEMO_CSV_LABEL;
  } else {
    const text = byId<HTMLInputElement>("source").value.trim();
    if (text === "") throw new PaneError("source", "Give a range such as Data!A1:F82 or a table name, or press Use selection.");
    const read = await readSource(excelBatch, text);
    state.cells = read.values;
    state.sourceLabel = read.address;
  }
  if (!state.cells || state.cells.length < 2) throw new PaneError("source", "The range needs a header row and at least one data row.");
  setColumns(detectColumns(state.cells[0] ?? []));
  byId("status").textContent = `Read ${state.cells.length - 1} data rows and ${state.columns.length} columns from ${state.sourceLabel}.`;
}

function readSettingsFromForm(): PaneSettings {
  const end = document.querySelector<HTMLInputElement>("input[name=endCorrection]:checked")?.value ?? DEFAULT_PANE_SETTINGS.endCorrection;
  return {
    endCorrection: end as PaneSettings["endCorrection"],
    rabinowitschMethod: byId<HTMLSelectElement>("rabinowitschMethod").value as RabinowitschMethod,
    rabinowitschDegree: Number(byId<HTMLInputElement>("rabinowitschDegree").value),
    rabinowitschWindow: Number(byId<HTMLInputElement>("rabinowitschWindow").value),
    models: state.settings.models,
    transducerRangeBar: parseNumberField(byId<HTMLInputElement>("transducerRangeBar").value),
  };
}

function updateMethodHelp(): void {
  const method = byId<HTMLSelectElement>("rabinowitschMethod").value as RabinowitschMethod;
  byId("rabinowitschMethod-help").textContent = SETTING_HELP.rabinowitschMethod[method];
  byId<HTMLInputElement>("rabinowitschDegree").disabled = !usesDegree(method);
  byId<HTMLInputElement>("rabinowitschWindow").disabled = method !== "local";
}

function writeSettingsToForm(s: PaneSettings): void {
  byId<HTMLInputElement>(s.endCorrection === "bagley" ? "end-bagley" : "end-none").checked = true;
  byId<HTMLSelectElement>("rabinowitschMethod").value = s.rabinowitschMethod;
  byId<HTMLInputElement>("rabinowitschDegree").value = String(s.rabinowitschDegree);
  byId<HTMLInputElement>("rabinowitschWindow").value = String(s.rabinowitschWindow);
  byId<HTMLInputElement>("transducerRangeBar").value = s.transducerRangeBar === null ? "" : String(s.transducerRangeBar);
  renderModels(byId("models"), s.models, (models) => (state.settings.models = models as ModelId[]));
  updateMethodHelp();
}

async function run(): Promise<void> {
  if (state.busy) return;
  clearFieldErrors();
  setBusy(true);
  const results = byId("results");
  try {
    if (!state.cells) await loadSource();
    state.settings = readSettingsFromForm();
    const output = await runReduction(
      { cells: state.cells as unknown[][], columns: state.columns, dies: state.dies, sourceLabel: state.sourceLabel },
      state.settings,
      (step, fraction) => showProgress(`${step}…`, fraction),
      pause,
    );
    const meta = { version: ADDIN_VERSION, date: new Date().toISOString() };
    if (state.mode.kind === "excel") {
      if (!supportsExcelApi("1.7")) throw new PaneError("run", "This version of Excel lacks the charting functions the pane needs (ExcelApi 1.7); use the RHEO worksheet functions instead.");
      let plan = buildWorkbookPlan(output, { ...meta, names: { results: "Rheo results", method: "Rheo method" } });
      const names = await writeWorkbookPlan(excelBatch, (n) => (plan = buildWorkbookPlan(output, { ...meta, names: n })), (step, f) => showProgress(`${step}…`, f));
      showProgress(`Done: wrote “${names.results}” and “${names.method}” with ${output.warnings.length} warning(s).`, null);
      results.innerHTML = `<p class="summary-box">New sheets “${escapeText(names.results)}” and “${escapeText(names.method)}”. ${output.warnings.length} warning(s) are listed on both.</p><details><summary>Quick look</summary>${sheetPlanHtml(plan.results)}</details>`;
      void refreshWorkbookLists();
    } else {
      const plan = buildWorkbookPlan(output, { ...meta, names: { results: "Rheo results", method: "Rheo method" } });
      results.innerHTML = `<p class="summary-box">Preview on the invented demo data: in Excel these tables and charts go to new sheets.</p>${sheetPlanHtml(plan.results)}<details class="method-record"><summary>Method record</summary>${sheetPlanHtml(plan.method)}</details>`;
      showProgress(`Preview ready: ${output.result.groups.length} group(s), ${output.warnings.length} warning(s).`, null);
    }
  } catch (error) {
    showProgress("Stopped; nothing was written.", null);
    fail(error, "run");
  } finally {
    setBusy(false);
  }
}

function escapeText(t: string): string {
  const d = document.createElement("span");
  d.textContent = t;
  return d.innerHTML;
}

async function refreshWorkbookLists(): Promise<void> {
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

function wire(): void {
  fillStaticHelp();
  writeSettingsToForm(state.settings);
  setDies([]);
  byId("version").textContent = `Rheoledger ${ADDIN_VERSION}`;
  byId("rabinowitschMethod").addEventListener("change", updateMethodHelp);
  byId("run").addEventListener("click", () => void run());
  byId("share").addEventListener("click", () => void share());
  byId("add-die").addEventListener("click", () => {
    setDies([...state.dies, { label: `D${state.dies.length + 1}`, diameterMm: NaN, lengthMm: NaN }]);
    byId(`die-${state.dies.length - 1}-label`).focus();
  });
  byId("read-columns").addEventListener("click", () => {
    loadSource().catch((e) => fail(e, "source"));
  });
  byId("source").addEventListener("change", () => (state.cells = null));
  byId("use-selection").addEventListener("click", () => {
    clearFieldErrors();
    readSelection(excelBatch)
      .then((r) => {
        byId<HTMLInputElement>("source").value = r.address;
        state.cells = null;
        return loadSource();
      })
      .catch((e) => fail(e, "source"));
  });
  byId("table-pick").addEventListener("change", () => {
    const t = byId<HTMLSelectElement>("table-pick").value;
    if (!t) return;
    byId<HTMLInputElement>("source").value = t;
    state.cells = null;
    loadSource().catch((e) => fail(e, "source"));
  });
  byId("safety-link").addEventListener("click", () => {
    const d = byId<HTMLDetailsElement>("safety");
    d.open = true;
    d.querySelector("summary")?.focus();
  });
  byId("share-sheet").addEventListener("focus", () => void refreshWorkbookLists().catch(() => undefined));
}

function enterPreview(reason: string): void {
  const banner = byId("mode-banner");
  banner.hidden = false;
  banner.textContent = `Preview mode (${reason}): the pane runs on bundled, invented demo data and shows its tables and charts here. Writing sheets and sharing need Excel.`;
  const source = byId<HTMLInputElement>("source");
  source.value = DEMO_CSV_LABEL;
  source.readOnly = true;
  byId("table-pick").hidden = true;
  byId("table-pick-label").hidden = true;
  byId("run").textContent = "Reduce the demo data";
  byId("share-help").textContent = "Needs Excel: in the workbook it copies a sheet with Rheoledger formulas replaced by values (formulas kept in notes).";
  setBusy(false);
  void loadSource().catch((e) => fail(e, "source"));
}

async function start(): Promise<void> {
  wire();
  state.mode = await detectHost();
  document.body.dataset.mode = state.mode.kind;
  if (state.mode.kind === "preview") enterPreview(state.mode.reason);
  else {
    setBusy(false);
    await refreshWorkbookLists().catch((e) => fail(e, "source"));
  }
}

if (typeof document !== "undefined") {
  if (document.readyState === "loading") document.addEventListener("DOMContentLoaded", () => void start());
  else void start();
}
