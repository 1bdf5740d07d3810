/**
 * The Lot check panel's wiring: where the lot and the reference come from (a range, the last
 * reduction, a model), "use the last fit" and the run that writes a lot sheet (Excel) or shows it
 * (preview). The comparison itself: lotPanel.ts.
 */
import { DEFAULT_LOT_COMPARISON_OPTIONS } from "../../../core/lotComparison";
import { DEMO_LOT_LABEL, DEMO_REFERENCE_LABEL, demoLotCells } from "../../demoData";
import { LOT_HELP, LotCurveInput, ReferenceInput, lotError, buildLotPlan, runLotCheck } from "./check";
import { excelBatch, readSource, type HostMode } from "../../officeHost";
import { byId, fillModelSelect } from "../../paneDom";
import { bestFit, parameterText, plainOfficeMessage, state } from "../../paneState";
import { runToSheet } from "../../runToSheet";
import type { SheetPlan } from "../../sheetPlan";
import { lotPanel } from "./index";
import { sheetPlanHtml } from "../../preview";
import { RunOutput, groupLabel } from "../../runReduction";

function updateLotFields(): void {
  byId("lot-range-field").hidden = byId<HTMLSelectElement>("lotSource").value !== "range";
  const kind = byId<HTMLSelectElement>("refKind").value as "table" | "model";
  byId("refKind-help").textContent = LOT_HELP.refKind[kind];
  byId("ref-range-field").hidden = kind !== "table";
  byId("ref-model-field").hidden = kind !== "model";
}

/** Offers the flow curves of a reduction as lot choices (keeping the current choice). */
export function offerRunCurves(output: RunOutput): void {
  const source = byId<HTMLSelectElement>("lotSource");
  const current = source.value;
  source.replaceChildren(
    new Option(state.mode.kind === "preview" ? `Demo lot (${DEMO_LOT_LABEL})` : "A range (shear rate, viscosity)", "range"),
    ...output.result.groups.map((g, i) => new Option(`Last reduction: ${groupLabel(g)}`, `run-${i}`, false, `run-${i}` === current)),
  );
  updateLotFields();
}

/** Reads a range or table for the lot or the reference; an Office failure names `field`. */
async function readRange(field: "lotRange" | "refRange", text: string): Promise<{ values: unknown[][]; address: string }> {
  return readSource(excelBatch, text).catch((e: unknown) => {
    throw lotError(field, plainOfficeMessage(e instanceof Error ? e : new Error(String(e))));
  });
}

async function lotInput(): Promise<LotCurveInput> {
  const source = byId<HTMLSelectElement>("lotSource").value;
  if (source.startsWith("run-")) {
    const i = Number(source.slice(4));
    const g = state.lastRun?.result.groups[i];
    if (!g) throw lotError("lotSource", "Run a reduction first, or choose a range.");
    const rows = g.flowCurve.filter((f) => f.shearRateWall !== null && f.viscosity !== null);
    return { kind: "curve", curve: { shearRate: rows.map((f) => f.shearRateWall as number), viscosity: rows.map((f) => f.viscosity as number) }, label: `last reduction, ${groupLabel(g)}` };
  }
  if (state.mode.kind === "preview") return { kind: "cells", cells: demoLotCells().lot, label: DEMO_LOT_LABEL };
  const text = byId<HTMLInputElement>("lotRange").value.trim();
  if (text === "") throw lotError("lotRange", "Give the lot's range (e.g. Lot!A1:B12) or table name.");
  const read = await readRange("lotRange", text);
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
  if (text === "") throw lotError("refRange", "Give the reference range (e.g. Reference!A1:B8) or table name.");
  const read = await readRange("refRange", text);
  return { kind: "table", cells: read.values, label: read.address };
}

function runLot(): Promise<void> {
  return runToSheet({
    panel: lotPanel,
    statusId: "lot-status",
    resultsId: "lot-results",
    working: "Comparing…",
    compute: async () => runLotCheck(await lotInput(), await referenceInput(), byId<HTMLInputElement>("lotTolerance").value),
    plans: (out, [name], meta) => [buildLotPlan(out, { ...meta, name: name as string })],
    render: (_out, [plan], written) =>
      written ? `<details><summary>Quick look</summary>${sheetPlanHtml(plan as SheetPlan)}</details>` : `<p class="summary-box">Preview on the invented demo lot: in Excel this goes to a new sheet.</p>${sheetPlanHtml(plan as SheetPlan)}`,
    done: (out, written) => {
      const c = out.comparison;
      const worst = c.worst ? ` Worst point ${Number(((c.worst.deviation ?? 0) * 100).toFixed(1))} % at ${Number(c.worst.shearRate.toPrecision(4))} 1/s.` : "";
      const verdict = `${c.verdict === "pass" ? "PASS" : c.verdict === "fail" ? "FAIL" : "NOT JUDGED"}: ${c.compared - c.failed} of ${c.compared} point(s) within ±${Number((c.tolerance * 100).toPrecision(6))} %.${worst}`;
      return written ? `Done: wrote “${written[0]}”. ${verdict}` : verdict;
    },
  });
}

/** Sets the Lot check's defaults and attaches its controls. */
export function wireLot(): void {
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
}

/** Preview mode: the lot and the reference are the invented demo tables; in Excel, ranges. */
export function lotMode(mode: HostMode): void {
  const preview = mode.kind === "preview";
  for (const [id, label] of [["lotRange", DEMO_LOT_LABEL], ["refRange", DEMO_REFERENCE_LABEL]] as const) {
    const input = byId<HTMLInputElement>(id);
    input.value = preview ? label : "";
    input.readOnly = preview;
  }
  byId<HTMLSelectElement>("lotSource").options[0]!.text = preview ? `Demo lot (${DEMO_LOT_LABEL})` : "A range (shear rate, viscosity)";
  byId("lotRun").textContent = preview ? "Check the demo lot" : "Check into a new sheet";
}
