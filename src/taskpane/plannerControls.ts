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

/** The Planner's text fields and the id of the input holding each (one table for reading and writing). */
const TEXT_FIELDS = {
  barrelDiameter: "planBarrel",
  usableLength: "planUsableLength",
  dies: "planDies",
  transducers: "planTransducers",
  shearRateMin: "planRateMin",
  shearRateMax: "planRateMax",
  points: "planPoints",
  powerLawK: "planK",
  powerLawN: "planN",
  priorParameters: "planParameters",
  mfr: "planMfr",
  mfrLoad: "planMfrLoad",
  dwellTime: "planDwell",
  density: "planDensity",
  compressibility: "planCompressibility",
  timePerLoad: "planTimePerLoad",
} as const satisfies Partial<Record<keyof PlannerForm, string>>;

type TextField = keyof typeof TEXT_FIELDS;

function textInput(field: TextField): HTMLInputElement | HTMLTextAreaElement {
  return byId<HTMLInputElement | HTMLTextAreaElement>(TEXT_FIELDS[field]);
}

function readPlannerForm(): PlannerForm {
  const text = Object.fromEntries((Object.keys(TEXT_FIELDS) as TextField[]).map((f) => [f, textInput(f).value])) as Record<TextField, string>;
  return {
    ...text,
    prior: byId<HTMLSelectElement>("planPrior").value as PlannerForm["prior"],
    priorModel: byId<HTMLSelectElement>("planModel").value,
  };
}

function writePlannerForm(f: PlannerForm): void {
  for (const field of Object.keys(TEXT_FIELDS) as TextField[]) textInput(field).value = f[field];
  byId<HTMLSelectElement>("planPrior").value = f.prior;
  fillModelSelect(byId<HTMLSelectElement>("planModel"), f.priorModel);
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
