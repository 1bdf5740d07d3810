/**
 * The reduction panel's wiring: Data (source range, column mapping, dies) → Settings → Run. A run
 * writes the results and method sheets (Excel) or shows them (preview), and hands its flow curves
 * and best fit to the Planner and the Lot check. The reduction itself: runReduction.ts.
 */
import type { ModelId } from "../core/models";
import type { RabinowitschMethod } from "../core/rabinowitsch";
import { ColumnChoice, DieEntry, detectColumns } from "./columns";
import { DEMO_CSV_LABEL, demoCells } from "./demoData";
import { writeWorkbookPlan } from "./excelWriter";
import { offerRunCurves } from "./lotControls";
import { excelBatch, readSelection, readSource, supportsExcelApi } from "./officeHost";
import { byId, clearFieldErrors, renderColumns, renderDies, renderModels, showProgress } from "./paneDom";
import { fail, panelMeta, pause, setBusy, state } from "./paneState";
import { buildWorkbookPlan } from "./plan";
import { sheetPlanHtml } from "./preview";
import { PaneError, RunOutput, runReduction } from "./runReduction";
import { DEFAULT_PANE_SETTINGS, PaneSettings, SETTING_HELP, parseNumberField, usesDegree } from "./settings";
import { refreshWorkbookLists } from "./shareControls";

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

/** Reads the data (the demo table in preview, the given range or table in Excel) and maps its columns. */
export async function loadSource(): Promise<void> {
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
    transducerAccuracyPercent: parseNumberField(byId<HTMLInputElement>("transducerAccuracyPercent").value),
    representativeRate: checked("check-representativeRate"),
    slip: checked("check-slip"),
    extensional: checked("check-extensional"),
    pressureDependence: checked("check-pressureDependence"),
    heating: checked("check-heating"),
    heatingDensity: parseNumberField(byId<HTMLInputElement>("heatingDensity").value),
    heatingHeatCapacity: parseNumberField(byId<HTMLInputElement>("heatingHeatCapacity").value),
    heatingConductivity: parseNumberField(byId<HTMLInputElement>("heatingConductivity").value),
    heatingTemperatureCoefficient: parseNumberField(byId<HTMLInputElement>("heatingTemperatureCoefficient").value),
    temperatureShift: byId<HTMLSelectElement>("temperatureShift").value as PaneSettings["temperatureShift"],
    referenceTemperatureC: parseNumberField(byId<HTMLInputElement>("referenceTemperatureC").value),
    chartAllModels: checked("chartAllModels"),
  };
}

const checked = (id: string) => byId<HTMLInputElement>(id).checked;
const numberText = (v: number | null) => (v === null ? "" : String(v));

function updateOptionalHelp(): void {
  const heating = checked("check-heating");
  for (const id of ["heatingDensity", "heatingHeatCapacity", "heatingConductivity", "heatingTemperatureCoefficient"]) byId<HTMLInputElement>(id).disabled = !heating;
  const shift = byId<HTMLSelectElement>("temperatureShift").value as PaneSettings["temperatureShift"];
  byId("temperatureShift-help").textContent = SETTING_HELP.temperatureShift[shift] ?? "";
  byId<HTMLInputElement>("referenceTemperatureC").disabled = shift === "none";
}

function updateMethodHelp(): void {
  const method = byId<HTMLSelectElement>("rabinowitschMethod").value as RabinowitschMethod;
  byId("rabinowitschMethod-help").textContent = SETTING_HELP.rabinowitschMethod[method];
  byId<HTMLInputElement>("rabinowitschDegree").disabled = !usesDegree(method);
  byId<HTMLInputElement>("rabinowitschWindow").disabled = method !== "local";
}

function writeSettingsToForm(s: PaneSettings): void {
  byId<HTMLInputElement>(`end-${s.endCorrection}`).checked = true;
  byId<HTMLSelectElement>("rabinowitschMethod").value = s.rabinowitschMethod;
  byId<HTMLInputElement>("rabinowitschDegree").value = String(s.rabinowitschDegree);
  byId<HTMLInputElement>("rabinowitschWindow").value = String(s.rabinowitschWindow);
  byId<HTMLInputElement>("transducerRangeBar").value = numberText(s.transducerRangeBar);
  byId<HTMLInputElement>("transducerAccuracyPercent").value = numberText(s.transducerAccuracyPercent);
  for (const k of ["representativeRate", "slip", "extensional", "pressureDependence", "heating"] as const) byId<HTMLInputElement>(`check-${k}`).checked = s[k];
  for (const k of ["heatingDensity", "heatingHeatCapacity", "heatingConductivity", "heatingTemperatureCoefficient", "referenceTemperatureC"] as const) byId<HTMLInputElement>(k).value = numberText(s[k]);
  byId<HTMLSelectElement>("temperatureShift").value = s.temperatureShift;
  byId<HTMLInputElement>("chartAllModels").checked = s.chartAllModels;
  updateOptionalHelp();
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
    rememberRun(output);
    const meta = panelMeta();
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

/** Keeps a reduction for the panels: its flow curves become lot choices, its best fit a prior. */
function rememberRun(output: RunOutput): void {
  state.lastRun = output;
  offerRunCurves(output);
}

/** Fills the settings form and attaches the Data, Settings and Run controls. */
export function wireReduction(): void {
  writeSettingsToForm(state.settings);
  setDies([]);
  byId("rabinowitschMethod").addEventListener("change", updateMethodHelp);
  byId("check-heating").addEventListener("change", updateOptionalHelp);
  byId("temperatureShift").addEventListener("change", updateOptionalHelp);
  byId("run").addEventListener("click", () => void run());
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
}

/** Preview mode: the data source is the invented demo table. */
export function previewReduction(): void {
  const source = byId<HTMLInputElement>("source");
  source.value = DEMO_CSV_LABEL;
  source.readOnly = true;
  byId("table-pick").hidden = true;
  byId("table-pick-label").hidden = true;
  byId("run").textContent = "Reduce the demo data";
}
