/**
 * Builds the results sheet plan of a run: warnings, then per group the Bagley table, the flow
 * curve with the standard error of the wall stress (and, when asked for, the ± columns of the
 * transducer uncertainty and the Schümmer cross-check), the orifice/Bagley entrance pressures,
 * the extensional, heating and pressure-dependence tables, the model ranking and fitted
 * parameters; then the slip table, the temperature shift, the fit across temperatures and the
 * rotational join (the shared result tables, resultsFitBlocks.ts). Chart data on the right; native
 * charts (Bagley plot per group with its lines extended to zero pressure, log–log flow curve,
 * viscosity with the best model of each group or every model, n' vs rate, master curve).
 * Values are SI from the core converted once to the display units {@link DEFAULT_OUTPUT_UNITS}.
 *
 * The blocks come from resultsFlowBlocks.ts (Bagley, flow curve, fits), resultsMethodBlocks.ts
 * (optional methods, slip, shift) and resultsCharts.ts (chart data and charts); this module
 * places them on the sheet.
 */
import { fromSI } from "../core/units";
import { headerLabel, modelName } from "../io/displayNames";
import { joinedCurveTable } from "../io/resultTables";
import { recommendedFit } from "./recommendedFit";
import { GROUP_COLOURS, seriesLook, bagleyChart, bagleyChartData, joinedChart, joinedChartData, masterChartData, modelChartData, summaryCharts } from "./resultsCharts";
import { BlockDraft, DEFAULT_OUTPUT_UNITS, bagleyBlock, fitBlocks, flowBlock, fmt } from "./resultsFlowBlocks";
import { methodBlocks, shiftBlocks, slipBlock } from "./resultsMethodBlocks";
import { joinedBlocks, masterFitBlocks } from "./resultsFitBlocks";
import type { RunOutput } from "./runReduction";
import { groupLabel } from "./runReduction";
import { CellBlock, CellValue, ChartSpec, SeriesSpec, SheetPlan, blockLayout } from "./sheetPlan";

export { DEFAULT_OUTPUT_UNITS, GROUP_COLOURS };

/**
 * Where things go on the results sheet (0-based columns). The charts start at `chartCol` or one
 * column right of the widest table, whichever is further right; the chart data follow the charts.
 */
export const RESULTS_LAYOUT = Object.freeze({ tableCol: 0, chartCol: 9, chartCols: 8, chartRows: 16, dataCol: 19 });

const U = DEFAULT_OUTPUT_UNITS;

/** Names and stamp of a run, decided by the caller (the writer makes the names unique). */
export interface PlanMeta {
  names: { results: string; method: string };
  version: string;
  /** ISO date-time of the run */
  date: string;
}

/** Stacks blocks down a column, one blank row between them. */
class Stack {
  row: number;
  readonly blocks: CellBlock[] = [];
  constructor(readonly col: number, start: number) {
    this.row = start;
  }
  add(block: BlockDraft, gap = 1): CellBlock {
    // one spelling of each unit, on the sheet as in the pane ("Pa·s", "°C")
    const b: CellBlock = { ...block, ...(block.header ? { header: block.header.map(headerLabel) } : {}), row: this.row, col: this.col };
    this.blocks.push(b);
    this.row += blockLayout(b).rowCount + gap;
    return b;
  }
}

/**
 * The results sheet of a run (see the module comment). Group n (1-based) owns blocks
 * `section-n`, `bagley-n` (Bagley only), `flow-n`, `ranking-n` and `parameters-n` (when models
 * were fitted), `bagleydata-n`, `modeldata-n`; charts `flowcurve`, `viscosity`, `nprime`, `bagley-n`.
 */
export function buildResultsPlan(run: RunOutput, meta: PlanMeta): SheetPlan {
  const L = RESULTS_LAYOUT;
  const left = new Stack(L.tableCol, 0);
  left.add({ id: "title", role: "heading", title: "Rheoledger results", rows: [] }, 0);
  left.add({ id: "stamp", role: "text", rows: [[`Data ${run.input.sourceLabel}; method record on sheet "${meta.names.method}"; ${meta.date}; Rheoledger ${meta.version}`]] });
  const warnings = run.warnings.length > 0 ? run.warnings.map((w): CellValue[] => [w.code, w.message]) : [["NONE", "No warnings."]];
  left.add({ id: "warnings", role: "list", title: `Warnings (${run.warnings.length})`, header: ["code", "message"], rows: warnings });

  const right = new Stack(L.dataCol, 0); // moved right of the charts at the end
  right.add({ id: "chartdata-title", role: "heading", title: "Chart data (read by the charts)", rows: [] }, 0);
  const flowSeries: SeriesSpec[] = [];
  const viscositySeries: SeriesSpec[] = [];
  const nPrimeSeries: SeriesSpec[] = [];
  const bagleyCharts: ChartSpec[] = [];
  const dashed: SeriesSpec["style"][] = ["line", "dashed"];

  run.result.groups.forEach((g, i) => {
    const n = i + 1;
    const label = groupLabel(g);
    const { colour, marker } = seriesLook(i);
    const dies = g.dies.map((d) => fmt(d.dieLength / g.dieDiameter)).join(", ");
    left.add({ id: `section-${n}`, role: "heading", title: `${label}; dies L/D ${dies}`, rows: [] }, 0);
    if (g.bagley.length > 0) left.add(bagleyBlock(g, n));
    const flow = left.add(flowBlock(g, n));
    for (const b of methodBlocks(g, n)) left.add(b);
    const fits = run.fits[i] ?? { compare: null, verdict: null, curves: [] };
    for (const b of fitBlocks(fits, n)) left.add(b);
    left.row += 1;

    const count = flow.rows.length;
    flowSeries.push({ name: label, blockId: flow.id, xColumn: 4, yColumn: 1, firstRow: 0, rowCount: count, style: "markers", colour, marker });
    viscositySeries.push({ name: label, blockId: flow.id, xColumn: 4, yColumn: 5, firstRow: 0, rowCount: count, style: "markers", colour, marker });
    nPrimeSeries.push({ name: label, blockId: flow.id, xColumn: 0, yColumn: 3, firstRow: 0, rowCount: count, style: "markers", colour, marker });
    const models = modelChartData(fits, label, n);
    if (models) {
      const block = right.add(models.block);
      // one curve per group, in the group's colour: the recommended model, or the one chosen
      const chosen = run.settings.chartModel;
      const recommended = recommendedFit(fits)?.fit.model;
      const r = models.runs.find((x) => x.model === (chosen === "best" ? recommended : chosen));
      if (r) {
        const name = `${label}, ${modelName(r.model)}${r.model === recommended ? " (recommended)" : ""}`;
        viscositySeries.push({ name, blockId: block.id, xColumn: 1, yColumn: 2, firstRow: r.firstRow, rowCount: r.rowCount, style: dashed[Math.floor(i / GROUP_COLOURS.length) % 2] as SeriesSpec["style"], colour });
      }
    }
    if (g.bagley.length > 0) {
      const data = bagleyChartData(g, n);
      const block = right.add(data.block);
      bagleyCharts.push(bagleyChart(g, n, label, block.id, data.series));
    }
  });

  const slip = slipBlock(run.result);
  if (slip) left.add(slip);
  const masterSeries: SeriesSpec[] = [];
  if (run.shift) {
    left.add({ id: "section-shift", role: "heading", title: `Temperature shift to ${fmt(fromSI(run.shift.law.referenceTemperature, U.temperature, "temperature"))} °C`, rows: [] }, 0);
    for (const b of shiftBlocks(run.shift)) left.add(b);
    const master = masterChartData(run.shift);
    const block = right.add(master.block);
    master.runs.forEach((r, k) => masterSeries.push({ name: r.name, blockId: block.id, xColumn: 1, yColumn: 2, firstRow: r.firstRow, rowCount: r.rowCount, style: "markers", ...seriesLook(k) }));
  }

  const master = masterFitBlocks(run);
  if (master.length > 0) {
    left.add({ id: "section-masterfit", role: "heading", title: "Fit across temperatures", rows: [] }, 0);
    for (const b of master) left.add(b);
  }
  const joined = joinedBlocks(run);
  const joinedCharts: ChartSpec[] = [];
  if (joined.length > 0) {
    left.add({ id: "section-rotational", role: "heading", title: `Rotational data joined (${run.input.rotational?.label ?? "rotational curve"})`, rows: [] }, 0);
    for (const b of joined) left.add(b);
  }
  const joinedCurve = joinedCurveTable({ joined: run.joined ?? undefined });
  if (joinedCurve) {
    const data = joinedChartData(joinedCurve);
    const block = right.add(data.block);
    joinedCharts.push(joinedChart(block.id, data.series));
  }

  const charts = [...summaryCharts({ flow: flowSeries, viscosity: viscositySeries, nPrime: nPrimeSeries, master: masterSeries }, run.shift), ...joinedCharts, ...bagleyCharts];
  const tableRight = Math.max(...left.blocks.map((b) => b.col + blockLayout(b).width));
  const chartCol = Math.max(L.chartCol, tableRight + 1);
  const dataCol = chartCol + L.chartCols + 2;
  for (const b of right.blocks) b.col = dataCol;
  charts.forEach((c, k) => (c.anchor = { row: 3 + k * (L.chartRows + 1), col: chartCol, rows: L.chartRows, cols: L.chartCols }));

  const tableWidths = [16, 16, 16, 16, 14, 14, 14, ...new Array<number>(Math.max(0, chartCol - 7)).fill(13)].slice(0, chartCol);
  tableWidths[chartCol - 1] = 2;
  const widths = [...tableWidths, ...new Array<number>(dataCol - chartCol).fill(9), 22, 12, 14];
  return { name: meta.names.results, blocks: [...left.blocks, ...right.blocks], charts, columnWidths: widths };
}
