/**
 * The Planner panel's wiring: its form fields, the prior choice, "use the last fit" and the run
 * that writes a plan sheet (Excel) or shows it (preview). The planning itself: plannerPanel.ts.
 */
import { demoPlannerForm } from "../../demoData";
import type { HostMode } from "../../officeHost";
import { byId, fillModelSelect } from "../../paneDom";
import { bestFit, parameterText } from "../../paneState";
import { runToSheet } from "../../runToSheet";
import type { SheetPlan } from "../../sheetPlan";
import { plannerPanel } from "./index";
import { PLANNER_HELP, PlannerForm, buildPlannerPlan, runPlanner } from "./plan";
import { sheetPlanHtml } from "../../preview";

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

function runPlan(): Promise<void> {
  return runToSheet({
    panel: plannerPanel,
    statusId: "plan-status",
    resultsId: "plan-results",
    working: "Planning…",
    compute: async () => runPlanner(readPlannerForm()),
    plans: (out, [name], meta) => [buildPlannerPlan(out, { ...meta, name: name as string })],
    render: (_out, [plan], written) =>
      written ? `<details><summary>Quick look</summary>${sheetPlanHtml(plan as SheetPlan)}</details>` : `<p class="summary-box">Preview on the invented demo plan: in Excel this goes to a new sheet.</p>${sheetPlanHtml(plan as SheetPlan)}`,
    done: (out, written) => {
      const flagged = out.plan.dies.reduce((n, d) => n + d.steps.filter((st) => st.flag !== "ok" || !st.withinCapacity).length, 0);
      return written
        ? `Done: wrote “${written[0]}”; ${flagged} step(s) flagged, ${out.plan.warnings.length} warning(s).`
        : `Plan ready: ${out.plan.dies.length} die(s), ${flagged} step(s) flagged, ${out.plan.warnings.length} warning(s).`;
    },
  });
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

/** Preview mode: the Planner holds the invented demo plan; in Excel it starts empty. */
export function plannerMode(mode: HostMode): void {
  writePlannerForm(mode.kind === "preview" ? demoPlannerForm() : { ...demoPlannerForm(), ...EMPTY_PLANNER });
  byId("planRun").textContent = mode.kind === "preview" ? "Plan the demo test" : "Plan into a new sheet";
}
