/**
 * The sheets the recording panel writes, as sheet plans (the writer applies them in Excel, the
 * preview shows them): "Rheo steps", the audit of which part of the recording was used (the
 * method lines with every window set by hand, the step table with start, end, mean, sd and
 * steady, the repeated-first-speed checks, the warnings), and "Rheo trace curve", the flow curve
 * reduced from the plateaus (groups, Bagley and flow-curve tables of src/io/resultTables.ts, and
 * a log–log chart of viscosity against the true wall rate). Pure.
 */
import { groupLabel } from "../../../core/grouping";
import { bagleyTable, flowCurveTable, groupsTable, type ResultTable } from "../../../io/resultTables";
import { describeWarning } from "../../../io/warningCatalog";
import { resultTableBlock, resultTableNotes } from "../../resultTableBlock";
import { seriesLook } from "../../resultsCharts";
import { stackBlocks } from "../planner/plan";
import { blockLayout, type CellValue, type ChartSpec, type SeriesSpec, type SheetPlan } from "../../sheetPlan";
import type { TraceOutput } from "./run";

/** Names and stamp of one run (the writer makes the names unique). */
export interface TraceSheetMeta {
  names: { steps: string; curve: string };
  version: string;
  date: string;
}

/** The reduction's words in the method lines: the panel reduces with the default settings. */
export const TRACE_REDUCTION_NOTE = "Flow curve: the plateaus of the steps in the flow curve, reduced with the default settings (Bagley end correction, Rabinowitsch correction by the transition method); for other settings, reduce the point table in the Reduce panel or with rheoledger steps and reduce.";

/** The warnings as rows: most serious first, with their plain titles. */
function warningRows(out: TraceOutput): CellValue[][] {
  const rank = { serious: 0, caution: 1, info: 2 } as const;
  const sorted = [...out.warnings].sort((a, b) => rank[a.severity] - rank[b.severity]);
  return sorted.length > 0 ? sorted.map((w) => [w.severity, describeWarning(w.code).title, w.message, w.code]) : [["", "No warnings.", "", "NONE"]];
}

/**
 * The "Rheo steps" sheet. Blocks: steps-title, steps-stamp, steps-method, steps (with its note),
 * thermal-checks (when a run repeats its first speed), steps-warnings.
 */
export function buildStepsPlan(out: TraceOutput, meta: TraceSheetMeta): SheetPlan {
  const s = stackBlocks();
  s.add({ id: "steps-title", role: "heading", title: "Rheoledger steps of a pressure recording", rows: [] }, 0);
  s.add({ id: "steps-stamp", role: "text", rows: [[`Recording ${out.label}; flow curve on sheet "${meta.names.curve}"; ${meta.date}; Rheoledger ${meta.version}`]] });
  const method = [...out.view.method, out.reduction ? TRACE_REDUCTION_NOTE : `No flow curve: ${out.reductionProblem ?? "not reduced"}`];
  s.add({ id: "steps-method", role: "list", title: "Method", header: ["method"], rows: method.map((line) => [line]) });
  s.add(resultTableBlock(out.view.steps, "steps"));
  for (const note of resultTableNotes(out.view.steps, "steps")) s.add(note);
  if (out.view.thermalChecks) s.add(resultTableBlock(out.view.thermalChecks, "thermal-checks"));
  s.add({ id: "steps-warnings", role: "list", title: `Warnings (${out.warnings.length})`, header: ["severity", "warning", "message", "code"], rows: warningRows(out), keyColumns: [1, 2] }, 0);
  return { name: meta.names.steps, blocks: s.blocks, charts: [], columnWidths: [12, 16, 8, 12, 10, 12, 12, 9, 12, 10, 8, 10, 60] };
}

/**
 * The "Rheo trace curve" sheet. Blocks: curve-title, curve-stamp, then groups, bagley-n and
 * flow-n with their notes (n = 1, 2, … per group) and the chart "trace-viscosity"; or, without a
 * reduction, curve-none saying why.
 */
export function buildCurvePlan(out: TraceOutput, meta: TraceSheetMeta): SheetPlan {
  const s = stackBlocks();
  s.add({ id: "curve-title", role: "heading", title: "Rheoledger flow curve from a pressure recording", rows: [] }, 0);
  s.add({ id: "curve-stamp", role: "text", rows: [[`Recording ${out.label}; steps and method on sheet "${meta.names.steps}"; ${meta.date}; Rheoledger ${meta.version}`]] });
  if (!out.reduction) {
    s.add({ id: "curve-none", role: "text", rows: [[`No flow curve: ${out.reductionProblem ?? "not reduced"}`]] });
    return { name: meta.names.curve, blocks: s.blocks, charts: [], columnWidths: [80] };
  }
  const series: SeriesSpec[] = [];
  const add = (t: ResultTable, id: string) => {
    const block = s.add(resultTableBlock(t, id));
    for (const note of resultTableNotes(t, id)) s.add(note);
    return block;
  };
  // no models are fitted here: the recommended-model column stays empty, so it is no key column
  const groups = groupsTable(out.reduction);
  add({ ...groups, keyColumns: (groups.keyColumns ?? []).filter((k) => k !== "recommendedModel") }, "groups");
  out.reduction.result.groups.forEach((g, i) => {
    const bagley = bagleyTable(g);
    if (bagley) add(bagley, `bagley-${i + 1}`);
    const flow = flowCurveTable(g);
    const block = add(flow, `flow-${i + 1}`);
    const x = flow.columns.findIndex((c) => c.key === "shearRateWall");
    const y = flow.columns.findIndex((c) => c.key === "viscosity");
    series.push({ name: groupLabel(g), blockId: block.id, xColumn: x, yColumn: y, firstRow: 0, rowCount: flow.rows.length, style: "markers", ...seriesLook(i) });
  });
  const right = Math.max(...s.blocks.map((b) => b.col + blockLayout(b).width));
  const chart: ChartSpec = {
    id: "trace-viscosity",
    title: "Viscosity from the plateaus",
    xTitle: "true wall shear rate [1/s]",
    yTitle: "viscosity [Pa·s]",
    xLog: true,
    yLog: true,
    series,
    anchor: { row: 2, col: right + 1, rows: 16, cols: 8 },
  };
  return { name: meta.names.curve, blocks: s.blocks, charts: series.length > 0 ? [chart] : [], columnWidths: [22, 14, 14, 14, 14, 14, 14, 14, 14, 14, 14] };
}
