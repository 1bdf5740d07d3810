/**
 * The method record of a run: what was read (source, columns, dies), every setting, the
 * equations and references of each step actually used, the add-in version, the date and the
 * warnings, so that a result can be audited later without the pane.
 */
import { COLUMN_QUANTITIES } from "../io/headers";
import { equationsUsed as sharedEquations, type EquationLine } from "../io/methodEquations";
import type { RunOutput } from "./runReduction";
import { describeSettings } from "./settings";
import type { PlanMeta } from "./resultsPlan";
import { CellValue, SheetPlan, blockLayout, CellBlock } from "./sheetPlan";

export type { EquationLine } from "../io/methodEquations";

/** The equations of the steps a run used, in order (the shared list of src/io/methodEquations.ts). */
export function equationsUsed(run: RunOutput): EquationLine[] {
  const roles = new Set(run.input.columns.map((c) => c.role));
  return sharedEquations({
    result: run.result,
    endCorrection: run.settings.endCorrection,
    rabinowitschMethod: run.settings.rabinowitschMethod,
    flowSource: roles.has("flow_rate") ? "flow_rate" : roles.has("piston_speed") ? "piston_speed" : roles.has("mass_rate") ? "mass_rate" : null,
    fittedModels: run.fits.flatMap((f) => f.compare?.ranked.map((r) => r.model) ?? []),
    shiftLaw: run.shift ? run.shift.law.law : null,
    master: run.master ? { model: run.master.model, law: run.master.law } : null,
    joined: run.joined ? { kind: run.joined.join.warnings.some((w) => w.code === "COX_MERZ_APPLIED") ? "oscillatory" : "steady" } : null,
  });
}

/** The method sheet plan of a run. */
export function buildMethodPlan(run: RunOutput, meta: PlanMeta): SheetPlan {
  const blocks: CellBlock[] = [];
  let row = 0;
  const add = (b: Omit<CellBlock, "row" | "col">, gap = 1) => {
    const block = { ...b, row, col: 0 };
    blocks.push(block);
    row += blockLayout(block).rowCount + gap;
  };
  add({ id: "method-title", role: "heading", title: "Rheoledger method record", rows: [] }, 0);
  add({ id: "method-note", role: "text", rows: [["Written by the task pane with the results; edit neither if the record is to stay true to the results."]] });
  add({
    id: "method-run",
    role: "list",
    title: "Run",
    header: ["item", "value"],
    rows: [
      ["Results sheet", meta.names.results],
      ["Data source", run.input.sourceLabel],
      ["Data rows used", run.raw.measurements.length],
      ["Groups (temperature, die bore)", run.result.groups.length],
      ["Date", meta.date],
      ["Rheoledger version", meta.version],
    ],
  });
  add({ id: "method-settings", role: "list", title: "Settings", header: ["setting", "value"], rows: describeSettings(run.settings) });
  const columns: CellValue[][] = run.input.columns.map((c) => [
    `${c.index + 1}: ${c.header || "(no header)"}`,
    c.role === "ignore" ? "ignored" : c.role === "die" ? "die label (die list)" : `${c.role} [${c.unit}]: ${COLUMN_QUANTITIES[c.role].description}`,
    c.recognised ? "recognised" : "mapped by hand",
  ]);
  add({ id: "method-columns", role: "list", title: "Columns read", header: ["column", "read as", "how"], rows: columns });
  if (run.input.dies.length > 0) {
    add({ id: "method-dies", role: "list", title: "Die list", header: ["die", "bore D [mm]", "length L [mm]"], rows: run.input.dies.map((d) => [d.label, d.diameterMm, d.lengthMm]) });
  }
  add({ id: "method-equations", role: "list", title: "Equations", header: ["step", "formula", "reference"], rows: equationsUsed(run) });
  add({
    id: "method-warnings",
    role: "list",
    title: `Warnings (${run.warnings.length})`,
    header: ["code", "message"],
    rows: run.warnings.length > 0 ? run.warnings.map((w) => [w.code, w.message]) : [["NONE", "No warnings."]],
  });
  return { name: meta.names.method, blocks, charts: [], columnWidths: [34, 60, 40] };
}
