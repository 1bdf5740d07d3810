/**
 * The task pane: Data → Settings → Run → Share, then the Planner and the Lot check. Inside Excel
 * each run writes new sheets through the Excel writer; outside Office (a plain browser) the pane
 * runs in preview mode on the bundled demo data and shows the same plans as tables and small
 * charts. Imports src/core and src/io
 * only through the pane's modules; never src/functions (it loads as its own bundle).
 */
import { DEMO_CSV_LABEL, DEMO_LOT_LABEL, DEMO_REFERENCE_LABEL, demoCells, demoLotCells, demoPlannerForm } from "./demoData";
import { ColumnChoice, DieEntry, detectColumns } from "./columns";
import { SHEET_BASE_NAMES, writeNewSheet, writeWorkbookPlan } from "./excelWriter";
import { LOT_HELP, LotError, LotCurveInput, ReferenceInput, buildLotPlan, runLotCheck } from "./lotPanel";
import { PLANNER_HELP, PlannerError, PlannerForm, buildPlannerPlan, runPlanner } from "./plannerPanel";
import { HostMode, detectHost, excelBatch, listTablesAndSheets, readSelection, readSource, supportsExcelApi } from "./officeHost";
import { byId, clearFieldErrors, fillModelSelect, fillStaticHelp, renderColumns, renderDies, renderModels, showFieldError, showProgress } from "./paneDom";
import { buildWorkbookPlan } from "./plan";
import { sheetPlanHtml } from "./preview";
import { PaneError, RunOutput, groupLabel, runReduction, toFieldError } from "./runReduction";
import { DEFAULT_PANE_SETTINGS, FieldId, PaneSettings, SETTING_HELP, parseNumberField, usesDegree } from "./settings";
import { copySheetAsValues } from "./shareValues";
import { ADDIN_VERSION } from "./version";
import type { ModelId } from "../core/models";
import { DEFAULT_LOT_COMPARISON_OPTIONS } from "../core/lotComparison";
import type { RabinowitschMethod } from "../core/rabinowitsch";

interface PaneState {
  mode: HostMode;
  cells: unknown[][] | null;
  sourceLabel: string;
  columns: ColumnChoice[];
  dies: DieEntry[];
  settings: PaneSettings;
  busy: boolean;
  /** the last reduction (its flow curves and best fits feed the Planner and the Lot check) */
  lastRun: RunOutput | null;
}

/** The Planner's fields start empty in Excel (the placeholders show examples). */
const EMPTY_PLANNER: Partial<PlannerForm> = { dies: "", transducers: "", barrelDiameter: "", usableLength: "", shearRateMin: "", shearRateMax: "", points: "8", prior: "power-law", powerLawK: "", powerLawN: "", priorModel: "", priorParameters: "", dwellTime: "", density: "", compressibility: "", timePerLoad: "" };

const state: PaneState = {
  mode: { kind: "preview", reason: "starting" },
  cells: null,
  sourceLabel: "",
  columns: [],
  dies: [],
  settings: { ...DEFAULT_PANE_SETTINGS, models: [...DEFAULT_PANE_SETTINGS.models] },
  busy: false,
  lastRun: null,
};

/** Lets the browser repaint between steps of a run. */
const pause = () => new Promise<void>((resolve) => setTimeout(resolve, 0));

function fail(error: unknown, fallback: FieldId): void {
  if (error instanceof PlannerError || error instanceof LotError) {
    focusControl(showFieldError(error.field, error.message));
    return;
  }
  const f = error instanceof PaneError || !(error instanceof Error) || error.name === "RheoError" ? toFieldError(error) : { field: fallback, message: plainOfficeMessage(error) };
  focusControl(showFieldError(f.field, f.message));
}

function focusControl(control: HTMLElement): void {
  const focusable = control.matches("input, select, button, textarea") ? control : control.querySelector<HTMLElement>("input, select, button, textarea");
  focusable?.focus();
}

/** An Office failure of a panel as a message next to its run button. */
function failPanel(error: unknown, runField: "planRun" | "lotRun"): void {
  if (error instanceof PlannerError || error instanceof LotError || !(error instanceof Error)) fail(error, "run");
  else focusControl(showFieldError(runField, plainOfficeMessage(error)));
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
  for (const id of ["planRun", "lotRun"]) byId<HTMLButtonElement>(id).disabled = busy;
  for (const id of ["plan-use-fit", "lot-use-fit"]) byId<HTMLButtonElement>(id).disabled = busy || bestFit() === null;
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

/** The best model (lowest AIC) of the last reduction's first fitted group, or null. */
function bestFit(): { model: string; parameters: Record<string, number>; label: string } | null {
  const run = state.lastRun;
  if (!run) return null;
  for (const [i, f] of run.fits.entries()) {
    const best = f.compare?.ranked[0];
    const g = run.result.groups[i];
    if (best && g) return { model: best.model, parameters: best.result.parameters, label: groupLabel(g) };
  }
  return null;
}

const parameterText = (p: Record<string, number>) => Object.entries(p).map(([k, v]) => `${k}=${Number(v.toPrecision(6))}`).join(", ");

/** Keeps a reduction for the panels: its flow curves become lot choices, its best fit a prior. */
function rememberRun(output: RunOutput): void {
  state.lastRun = output;
  const source = byId<HTMLSelectElement>("lotSource");
  const current = source.value;
  source.replaceChildren(
    new Option(state.mode.kind === "preview" ? `Demo lot (${DEMO_LOT_LABEL})` : "A range (shear rate, viscosity)", "range"),
    ...output.result.groups.map((g, i) => new Option(`Last reduction: ${groupLabel(g)}`, `run-${i}`, false, `run-${i}` === current)),
  );
  updateLotFields();
}

function readPlannerForm(): PlannerForm {
  const v = (id: string) => byId<HTMLInputElement | HTMLTextAreaElement>(id).value;
  return {
    barrelDiameter: v("planBarrel"),
    usableLength: v("planUsableLength"),
    dies: v("planDies"),
    transducers: v("planTransducers"),
    shearRateMin: v("planRateMin"),
    shearRateMax: v("planRateMax"),
    points: v("planPoints"),
    prior: byId<HTMLSelectElement>("planPrior").value as PlannerForm["prior"],
    powerLawK: v("planK"),
    powerLawN: v("planN"),
    priorModel: byId<HTMLSelectElement>("planModel").value,
    priorParameters: v("planParameters"),
    mfr: v("planMfr"),
    mfrLoad: v("planMfrLoad"),
    dwellTime: v("planDwell"),
    density: v("planDensity"),
    compressibility: v("planCompressibility"),
    timePerLoad: v("planTimePerLoad"),
  };
}

function writePlannerForm(f: PlannerForm): void {
  const set = (id: string, value: string) => (byId<HTMLInputElement | HTMLTextAreaElement>(id).value = value);
  set("planBarrel", f.barrelDiameter);
  set("planUsableLength", f.usableLength);
  set("planDies", f.dies);
  set("planTransducers", f.transducers);
  set("planRateMin", f.shearRateMin);
  set("planRateMax", f.shearRateMax);
  set("planPoints", f.points);
  byId<HTMLSelectElement>("planPrior").value = f.prior;
  set("planK", f.powerLawK);
  set("planN", f.powerLawN);
  fillModelSelect(byId<HTMLSelectElement>("planModel"), f.priorModel);
  set("planParameters", f.priorParameters);
  set("planMfr", f.mfr);
  set("planMfrLoad", f.mfrLoad);
  set("planDwell", f.dwellTime);
  set("planDensity", f.density);
  set("planCompressibility", f.compressibility);
  set("planTimePerLoad", f.timePerLoad);
  updatePriorFields();
}

function updatePriorFields(): void {
  const prior = byId<HTMLSelectElement>("planPrior").value as PlannerForm["prior"];
  byId("planPrior-help").textContent = PLANNER_HELP.prior[prior];
  byId("plan-prior-power-law").hidden = prior !== "power-law";
  byId("plan-prior-model").hidden = prior !== "model";
  byId("plan-prior-mfr").hidden = prior !== "mfr";
}

function updateLotFields(): void {
  byId("lot-range-field").hidden = byId<HTMLSelectElement>("lotSource").value !== "range";
  const kind = byId<HTMLSelectElement>("refKind").value as "table" | "model";
  byId("refKind-help").textContent = LOT_HELP.refKind[kind];
  byId("ref-range-field").hidden = kind !== "table";
  byId("ref-model-field").hidden = kind !== "model";
}

const panelMeta = () => ({ version: ADDIN_VERSION, date: new Date().toISOString() });

async function runPlan(): Promise<void> {
  if (state.busy) return;
  const section = byId("planner-section");
  clearFieldErrors(section);
  setBusy(true);
  const status = byId("plan-status");
  try {
    status.textContent = "Planning…";
    const out = runPlanner(readPlannerForm());
    const flagged = out.plan.dies.reduce((n, d) => n + d.steps.filter((s) => s.flag !== "ok" || !s.withinCapacity).length, 0);
    if (state.mode.kind === "excel") {
      let plan = buildPlannerPlan(out, { ...panelMeta(), name: SHEET_BASE_NAMES.plan });
      const name = await writeNewSheet(excelBatch, SHEET_BASE_NAMES.plan, (n) => (plan = buildPlannerPlan(out, { ...panelMeta(), name: n })));
      status.textContent = `Done: wrote “${name}”; ${flagged} step(s) flagged, ${out.plan.warnings.length} warning(s).`;
      byId("plan-results").innerHTML = `<details><summary>Quick look</summary>${sheetPlanHtml(plan)}</details>`;
    } else {
      const plan = buildPlannerPlan(out, { ...panelMeta(), name: SHEET_BASE_NAMES.plan });
      byId("plan-results").innerHTML = `<p class="summary-box">Preview on the invented demo plan: in Excel this goes to a new sheet.</p>${sheetPlanHtml(plan)}`;
      status.textContent = `Plan ready: ${out.plan.dies.length} die(s), ${flagged} step(s) flagged, ${out.plan.warnings.length} warning(s).`;
    }
  } catch (error) {
    status.textContent = "Stopped; nothing was written.";
    failPanel(error, "planRun");
  } finally {
    setBusy(false);
  }
}

async function lotInput(): Promise<LotCurveInput> {
  const source = byId<HTMLSelectElement>("lotSource").value;
  if (source.startsWith("run-")) {
    const i = Number(source.slice(4));
    const g = state.lastRun?.result.groups[i];
    if (!g) throw new LotError("lotSource", "Run a reduction first, or choose a range.");
    const rows = g.flowCurve.filter((f) => f.shearRateWall !== null && f.viscosity !== null);
    return { kind: "curve", curve: { shearRate: rows.map((f) => f.shearRateWall as number), viscosity: rows.map((f) => f.viscosity as number) }, label: `last reduction, ${groupLabel(g)}` };
  }
  if (state.mode.kind === "preview") return { kind: "cells", cells: demoLotCells().lot, label: DEMO_LOT_LABEL };
  const text = byId<HTMLInputElement>("lotRange").value.trim();
  if (text === "") throw new LotError("lotRange", "Give the lot's range (e.g. Lot!A1:B12) or table name.");
  const read = await readSource(excelBatch, text).catch((e: unknown) => {
    throw new LotError("lotRange", plainOfficeMessage(e instanceof Error ? e : new Error(String(e))));
  });
  return { kind: "cells", cells: read.values, label: read.address };
}

async function referenceInput(): Promise<ReferenceInput> {
  const kind = byId<HTMLSelectElement>("refKind").value;
  if (kind === "model") {
    const model = byId<HTMLSelectElement>("refModel").value;
    const parameters = byId<HTMLInputElement>("refParameters").value;
    return { kind: "model", model, parameters, label: `${model || "model"} ${parameters}` };
  }
  if (state.mode.kind === "preview") return { kind: "table", cells: demoLotCells().reference, label: DEMO_REFERENCE_LABEL };
  const text = byId<HTMLInputElement>("refRange").value.trim();
  if (text === "") throw new LotError("refRange", "Give the reference range (e.g. Reference!A1:B8) or table name.");
  const read = await readSource(excelBatch, text).catch((e: unknown) => {
    throw new LotError("refRange", plainOfficeMessage(e instanceof Error ? e : new Error(String(e))));
  });
  return { kind: "table", cells: read.values, label: read.address };
}

async function runLot(): Promise<void> {
  if (state.busy) return;
  clearFieldErrors(byId("lot-section"));
  setBusy(true);
  const status = byId("lot-status");
  try {
    status.textContent = "Comparing…";
    const out = runLotCheck(await lotInput(), await referenceInput(), byId<HTMLInputElement>("lotTolerance").value);
    const c = out.comparison;
    const worst = c.worst ? ` Worst point ${Number(((c.worst.deviation ?? 0) * 100).toFixed(1))} % at ${Number(c.worst.shearRate.toPrecision(4))} 1/s.` : "";
    const verdict = `${c.verdict === "pass" ? "PASS" : c.verdict === "fail" ? "FAIL" : "NOT JUDGED"}: ${c.compared - c.failed} of ${c.compared} point(s) within ±${Number((c.tolerance * 100).toPrecision(6))} %.${worst}`;
    if (state.mode.kind === "excel") {
      let plan = buildLotPlan(out, { ...panelMeta(), name: SHEET_BASE_NAMES.lot });
      const name = await writeNewSheet(excelBatch, SHEET_BASE_NAMES.lot, (n) => (plan = buildLotPlan(out, { ...panelMeta(), name: n })));
      status.textContent = `Done: wrote “${name}”. ${verdict}`;
      byId("lot-results").innerHTML = `<details><summary>Quick look</summary>${sheetPlanHtml(plan)}</details>`;
    } else {
      const plan = buildLotPlan(out, { ...panelMeta(), name: SHEET_BASE_NAMES.lot });
      byId("lot-results").innerHTML = `<p class="summary-box">Preview on the invented demo lot: in Excel this goes to a new sheet.</p>${sheetPlanHtml(plan)}`;
      status.textContent = verdict;
    }
  } catch (error) {
    status.textContent = "Stopped; nothing was written.";
    failPanel(error, "lotRun");
  } finally {
    setBusy(false);
  }
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
  byId("check-heating").addEventListener("change", updateOptionalHelp);
  byId("temperatureShift").addEventListener("change", updateOptionalHelp);
  writePlannerForm({ ...demoPlannerForm(), ...EMPTY_PLANNER });
  byId("planPrior").addEventListener("change", updatePriorFields);
  byId("planRun").addEventListener("click", () => void runPlan());
  byId("plan-use-fit").addEventListener("click", () => {
    const best = bestFit();
    if (!best) return;
    byId<HTMLSelectElement>("planPrior").value = "model";
    fillModelSelect(byId<HTMLSelectElement>("planModel"), best.model);
    byId<HTMLInputElement>("planParameters").value = parameterText(best.parameters);
    updatePriorFields();
    byId("plan-status").textContent = `Prior set to ${best.model}, the best fit of ${best.label}.`;
  });
  fillModelSelect(byId<HTMLSelectElement>("refModel"), "");
  byId<HTMLInputElement>("lotTolerance").value = String(DEFAULT_LOT_COMPARISON_OPTIONS.tolerance * 100);
  byId("lotSource").addEventListener("change", updateLotFields);
  byId("refKind").addEventListener("change", updateLotFields);
  byId("lotRun").addEventListener("click", () => void runLot());
  byId("lot-use-fit").addEventListener("click", () => {
    const best = bestFit();
    if (!best) return;
    byId<HTMLSelectElement>("refKind").value = "model";
    fillModelSelect(byId<HTMLSelectElement>("refModel"), best.model);
    byId<HTMLInputElement>("refParameters").value = parameterText(best.parameters);
    updateLotFields();
    byId("lot-status").textContent = `Reference set to ${best.model}, the best fit of ${best.label}.`;
  });
  updateLotFields();
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
  writePlannerForm(demoPlannerForm());
  byId("planRun").textContent = "Plan the demo test";
  for (const [id, label] of [["lotRange", DEMO_LOT_LABEL], ["refRange", DEMO_REFERENCE_LABEL]] as const) {
    const input = byId<HTMLInputElement>(id);
    input.value = label;
    input.readOnly = true;
  }
  byId<HTMLSelectElement>("lotSource").options[0]!.text = `Demo lot (${DEMO_LOT_LABEL})`;
  byId("lotRun").textContent = "Check the demo lot";
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
