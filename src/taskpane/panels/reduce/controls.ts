/**
 * The reduction panel's wiring: Data (source range, column mapping, dies) → Settings → Run. A run
 * writes the results and method sheets (Excel) or shows them (preview), results first, and hands
 * its flow curves and best fit to the Planner and the Lot check. Settings the data cannot support
 * are switched off with their reason (applicability.ts). The reduction itself: runReduction.ts.
 */
import type { ModelId } from "../../../core/models";
import type { RabinowitschMethod } from "../../../core/rabinowitsch";
import { modelName } from "../../../io/displayNames";
import { readRawTable } from "../../../io/rawTable";
import { ColumnChoice, DieEntry, applyColumnChoices, detectColumns, mappingProblems } from "../../columns";
import { DEMO_CSV_LABEL, demoCells } from "../../demoData";
import { offerRunCurves } from "../lot/controls";
import { excelBatch, readSelection, readSource, type HostMode } from "../../officeHost";
import { PaneFieldError } from "../../panelContract";
import { byId, clearFieldErrors, renderColumns, renderDies, renderModels, showProgress } from "../../paneDom";
import { fail, pause, state } from "../../paneState";
import { buildWorkbookPlan } from "../../plan";
import { RunOutput, runReduction } from "../../runReduction";
import { runToSheet } from "../../runToSheet";
import { DEFAULT_PANE_SETTINGS, PANE_MODELS, PaneSettings, SETTING_HELP, paneDefaultModels, parseNumberField, usesDegree } from "../../settings";
import { refreshWorkbookLists } from "../share/controls";
import { applicability, type Applicability, type DataDependentSetting } from "./applicability";
import { fitSettingsMode, readFitSettings, readRotationalInput, updateFitApplicability, wireFitSettings, writeFitSettings } from "./fitControls";
import { reducePanel } from "./index";
import { resultsHtml } from "./resultsView";

function setColumns(columns: ColumnChoice[]): void {
  state.columns = columns;
  const todo = columns.filter((c) => !c.recognised).length;
  byId("columns-summary").textContent = columns.length === 0 ? "Columns: none read yet" : todo === 0 ? `Columns: all ${columns.length} recognised` : `Columns: ${todo} of ${columns.length} to check`;
  byId<HTMLDetailsElement>("field-columns").open = todo > 0;
  updateApplicability();
  renderColumns(byId("columns"), columns, (index, role, unit, changed) => {
    const needsUnit = role !== "ignore" && role !== "die" && unit === null;
    state.columns = state.columns.map((c) => (c.index === index ? { ...c, role, unit, recognised: false, problem: needsUnit ? `choose the unit of ${role}` : null } : c));
    setColumns(state.columns);
    byId(`col-${index}-${changed}`).focus();
  });
}

function setDies(dies: DieEntry[]): void {
  // an edited value keeps the rows (and the focus in them); adding or removing a die redraws them
  const redraw = dies.length !== state.dies.length || byId("dies").childElementCount !== dies.length;
  state.dies = dies;
  if (redraw) renderDies(byId("dies"), dies, setDies);
  byId("dies-summary").textContent = dies.length === 0 ? "Die list: empty (dies from the table)" : `Die list: ${dies.length} die(s)`;
  updateApplicability();
}

/** The data as read with the current mapping, or null while the mapping is incomplete. */
function measurementsNow() {
  if (!state.cells || mappingProblems(state.columns, state.dies).length > 0) return null;
  try {
    return readRawTable(applyColumnChoices(state.cells, state.columns, state.dies), { rowWord: "row" }).measurements;
  } catch {
    return null; // the run names the problem at its field
  }
}

/** The control a data-dependent setting switches off, and the box its reason goes to (the fit settings': fitControls.ts). */
const DEPENDENT: Readonly<Record<Exclude<DataDependentSetting, "master" | "crossWlf" | "slitEdgeCorrection">, { control: string; reason: string }>> = Object.freeze({
  bagley: { control: "end-bagley", reason: "end-bagley-help" },
  orifice: { control: "end-orifice", reason: "end-orifice-help" },
  slip: { control: "check-slip", reason: "slip-reason" },
  pressureDependence: { control: "check-pressureDependence", reason: "pressureDependence-reason" },
  extensional: { control: "check-extensional", reason: "extensional-reason" },
  temperatureShift: { control: "temperatureShift", reason: "temperatureShift-reason" },
});

/**
 * Switches off what the data read cannot support, with the reason beside it (and unticks or
 * resets it), and switches it on again when they can. Nothing is decided before data are read.
 */
function updateApplicability(): void {
  const m = measurementsNow();
  const a: Applicability | null = m ? applicability(m) : null;
  for (const [key, where] of Object.entries(DEPENDENT) as [keyof typeof DEPENDENT, (typeof DEPENDENT)[keyof typeof DEPENDENT]][]) {
    const control = byId<HTMLInputElement | HTMLSelectElement>(where.control);
    const verdict = a?.[key] ?? { ok: true, reason: "" };
    control.disabled = !verdict.ok;
    const box = byId(where.reason);
    if (key === "bagley" || key === "orifice") {
      box.textContent = verdict.ok ? SETTING_HELP.endCorrection[key] : `Not available: ${verdict.reason}.`;
      box.classList.toggle("reason", !verdict.ok);
    } else {
      box.textContent = verdict.ok ? "" : `Not available: ${verdict.reason}.`;
      box.hidden = verdict.ok;
    }
    if (!verdict.ok) {
      if (control instanceof HTMLInputElement && control.type === "checkbox") control.checked = false;
      if (control instanceof HTMLSelectElement) control.value = "none";
    }
  }
  // an end correction the data cannot support falls back to one they can
  const end = document.querySelector<HTMLInputElement>("input[name=endCorrection]:checked");
  if (end?.disabled) byId<HTMLInputElement>(a?.bagley.ok ? "end-bagley" : a?.orifice.ok ? "end-orifice" : "end-none").checked = true;
  updateOptionalHelp();
  updateFitApplicability(a);
}

/** Reads the data (the demo table in preview, the given range or table in Excel) and maps its columns. */
export async function loadSource(): Promise<void> {
  clearFieldErrors();
  if (state.mode.kind === "preview") {
    state.cells = demoCells();
    state.sourceLabel = DEMO_CSV_LABEL;
  } else {
    const text = byId<HTMLInputElement>("source").value.trim();
    if (text === "") throw new PaneFieldError({ field: "source", message: "Give a range such as Data!A1:F82 or a table name, or press Use selection." });
    const read = await readSource(excelBatch, text);
    state.cells = read.values;
    state.sourceLabel = read.address;
  }
  if (!state.cells || state.cells.length < 2) throw new PaneFieldError({ field: "source", message: "The range needs a header row and at least one data row." });
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
    chartModel: byId<HTMLSelectElement>("chartModel").value as PaneSettings["chartModel"],
    ...readFitSettings(),
  };
}

const checked = (id: string) => byId<HTMLInputElement>(id).checked;
const numberText = (v: number | null) => (v === null ? "" : String(v));

function updateOptionalHelp(): void {
  const heating = checked("check-heating");
  byId("heating-fields").hidden = !heating;
  const shift = byId<HTMLSelectElement>("temperatureShift").value as PaneSettings["temperatureShift"];
  byId("temperatureShift-help").textContent = SETTING_HELP.temperatureShift[shift] ?? "";
  byId<HTMLInputElement>("referenceTemperatureC").disabled = shift === "none";
  updateFitApplicability();
}

/** The models to fit, the fold's summary naming them, and the chart chooser offering them (`render`: the check boxes too). */
function setModels(models: readonly ModelId[], chart: PaneSettings["chartModel"], render = true): void {
  state.settings.models = [...models];
  if (render) renderModels(byId("models"), models, (chosen) => setModels(chosen as ModelId[], byId<HTMLSelectElement>("chartModel").value as PaneSettings["chartModel"], false));
  byId("models-summary").textContent = models.length === 0 ? "Models to fit: none" : `Models to fit: ${models.map(modelName).join(", ")}`;
  const select = byId<HTMLSelectElement>("chartModel");
  const keep = chart !== "best" && models.includes(chart) ? chart : "best";
  select.replaceChildren(new Option("Recommended model of each group", "best", false, keep === "best"), ...PANE_MODELS.filter((m) => models.includes(m)).map((m) => new Option(modelName(m), m, false, m === keep)));
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
  writeFitSettings(s);
  updateOptionalHelp();
  setModels(s.models, s.chartModel);
  updateMethodHelp();
}

function run(): Promise<void> {
  return runToSheet({
    panel: reducePanel,
    statusId: "status",
    resultsId: "results",
    working: "Reducing…",
    progress: showProgress,
    compute: async (progress) => {
      if (!state.cells) await loadSource();
      state.settings = readSettingsFromForm();
      const rotational = await readRotationalInput(state.settings);
      return runReduction({ cells: state.cells as unknown[][], columns: state.columns, dies: state.dies, sourceLabel: state.sourceLabel, ...(rotational ? { rotational } : {}) }, state.settings, progress, pause);
    },
    plans: (out, [results, method], meta) => {
      const plan = buildWorkbookPlan(out, { ...meta, names: { results: results as string, method: method as string } });
      return [plan.results, plan.method];
    },
    render: (out, [results, method], written) => resultsHtml(out, { results: results as never, method: method as never }, written),
    done: (out, written) =>
      written
        ? `Done: wrote “${written[0]}” and “${written[1]}”; ${out.result.groups.length} group(s), ${out.warnings.length} warning(s).`
        : `Preview ready: ${out.result.groups.length} group(s), ${out.warnings.length} warning(s).`,
    after: (out) => {
      rememberRun(out);
      // results first: fold the form away and bring the summary into view
      byId<HTMLDetailsElement>("reduce-form").open = false;
      byId("results-heading").focus();
      if (state.mode.kind === "excel") void refreshWorkbookLists();
    },
  });
}

/**
 * The model list follows the material class while it is the class's default list (a paste adds the
 * yield-stress models, a melt drops them); a list the user chose stays as chosen.
 */
function followMaterial(from: PaneSettings["material"], to: PaneSettings["material"]): void {
  const same = (a: readonly string[], b: readonly string[]) => a.length === b.length && a.every((m) => b.includes(m));
  if (!same(state.settings.models, paneDefaultModels(from))) return;
  setModels(paneDefaultModels(to), byId<HTMLSelectElement>("chartModel").value as PaneSettings["chartModel"]);
}

/** Keeps a reduction for the panels: its flow curves become lot choices, its best fit a prior. */
function rememberRun(output: RunOutput): void {
  state.lastRun = output;
  offerRunCurves(output);
}

/** Fills the settings form and attaches the Data, Settings and Run controls. */
export function wireReduction(): void {
  wireFitSettings(followMaterial);
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
  byId("chartModel").addEventListener("change", () => clearFieldErrors(byId("field-chartModel")));
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

/** Preview mode: the data source is the invented demo table (read at once); in Excel, a range or table. */
export function reductionMode(mode: HostMode): void {
  const preview = mode.kind === "preview";
  const source = byId<HTMLInputElement>("source");
  source.readOnly = preview;
  source.value = preview ? DEMO_CSV_LABEL : "";
  fitSettingsMode(mode);
  byId("table-pick").hidden = preview;
  byId("table-pick-label").hidden = preview;
  byId("run").textContent = preview ? "Reduce the demo data" : "Reduce into new sheets";
  state.cells = null;
  setColumns([]);
  if (preview) void loadSource().catch((e) => fail(e, "source"));
}
