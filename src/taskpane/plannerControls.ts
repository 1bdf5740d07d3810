/**
 * The Planner panel's wiring: its form fields, the prior choice, "use the last fit" and the run
 * that writes a plan sheet (Excel) or shows it (preview). The planning itself: plannerPanel.ts.
 */
import { demoPlannerForm } from "./demoData";
import { SHEET_BASE_NAMES, writeNewSheet } from "./excelWriter";
import { excelBatch } from "./officeHost";
import { byId, clearFieldErrors, fillModelSelect } from "./paneDom";
import { bestFit, failPanel, panelMeta, parameterText, setBusy, state } from "./paneState";
import { PLANNER_HELP, PlannerForm, buildPlannerPlan, runPlanner } from "./plannerPanel";
import { sheetPlanHtml } from "./preview";

/** The Planner's fields start empty in Excel (the placeholders show examples). */
const EMPTY_PLANNER: Partial<PlannerForm> = { dies: "", transducers: "", barrelDiameter: "", usableLength: "", shearRateMin: "", shearRateMax: "", points: "8", prior: "power-law", powerLawK: "", powerLawN: "", priorModel: "", priorParameters: "", dwellTime: "", density: "", compressibility: "", timePerLoad: "" };

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

/** Fills the Planner with empty fields (Excel) and attaches its controls. */
export function wirePlanner(): void {
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
}

/** Preview mode: the Planner holds the invented demo plan. */
export function previewPlanner(): void {
  writePlannerForm(demoPlannerForm());
  byId("planRun").textContent = "Plan the demo test";
}
