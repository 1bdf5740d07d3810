/**
 * The charts of the results sheet and the chart data they read: Bagley plot per group with its
 * lines extended to zero pressure, log–log flow curve, viscosity with the best model of each group
 * (or every model), n' against rate, and the master curve of a temperature shift. Colours are
 * ours: one per group (deep teal first, then amber, plum, ...), Bagley lines teal to amber.
 */
import type { ReductionGroup } from "../core/reduce";
import { CHART_TITLES } from "../io/resultCharts";
import type { ResultTable } from "../io/resultTables";
import { fromSI } from "../core/units";
import { BlockDraft, DEFAULT_OUTPUT_UNITS as U, bar, fmt } from "./resultsFlowBlocks";
import type { GroupFits } from "./runReduction";
import { groupLabel } from "./runReduction";
import type { CellValue, ChartSpec, SeriesSpec } from "./sheetPlan";
import type { RunShift as ShiftOutput } from "../core/run";

/** Our chart palette: one colour per group (deep teal first, then amber, plum, ...). */
export const GROUP_COLOURS = ["#0b6e69", "#c77c0e", "#7a3b8f", "#2f5d9e", "#a23b2a", "#4f7a28"];
/** Marker shapes, one per round of the palette, so that no two groups look alike. */
export const MARKER_SHAPES = ["circle", "square", "diamond", "triangle"] as const;

/**
 * The look of group (or series) `i`: its colour, and a marker shape that changes each time the
 * palette starts again, so that two series never share colour and shape (up to 24 groups).
 */
export function seriesLook(i: number): { colour: string; marker: (typeof MARKER_SHAPES)[number] } {
  const n = GROUP_COLOURS.length;
  return { colour: GROUP_COLOURS[i % n] as string, marker: MARKER_SHAPES[Math.floor(i / n) % MARKER_SHAPES.length] as (typeof MARKER_SHAPES)[number] };
}
/** Bagley lines run from teal to amber over the rates. */
const RATE_RAMP: [number[], number[]] = [[11, 110, 105], [199, 124, 14]];

/** Charts are placed by the sheet layout; until then they carry this empty anchor. */
const UNPLACED = { row: 0, col: 0, rows: 0, cols: 0 };

function rampColour(i: number, n: number): string {
  const t = n <= 1 ? 0 : i / (n - 1);
  const [a, b] = RATE_RAMP;
  return "#" + a.map((v, k) => Math.round(v + ((b[k] as number) - v) * t).toString(16).padStart(2, "0")).join("");
}

/** The Bagley plot data of group `n`: points per rate and each line from −e to the longest die. */
export function bagleyChartData(g: ReductionGroup, n: number): { block: BlockDraft; series: Omit<SeriesSpec, "blockId">[] } {
  const rows: CellValue[][] = [];
  const series: Omit<SeriesSpec, "blockId">[] = [];
  const maxLR = Math.max(...g.dies.map((d) => d.lengthOverRadius));
  g.bagley.forEach((b, i) => {
    const colour = rampColour(i, g.bagley.length);
    const name = `${fmt(b.shearRateApparent)} 1/s`;
    series.push({ name, xColumn: 1, yColumn: 2, firstRow: rows.length, rowCount: b.points.length, style: "markers", colour });
    for (const p of b.points) rows.push([name, p.lengthOverRadius, bar(p.pressure)]);
    series.push({ name: `${name} line`, xColumn: 1, yColumn: 2, firstRow: rows.length, rowCount: 2, style: "line", colour });
    rows.push([`${name} line`, -b.endCorrection, 0]);
    rows.push([`${name} line`, maxLR, bar(b.slope * maxLR + b.entrancePressure)]);
  });
  return { block: { id: `bagleydata-${n}`, role: "chartData", title: `Bagley plot data, ${groupLabel(g)}`, header: ["series", "L/R [-]", `pressure drop [${U.pressure}]`], rows, numberFormats: [null, "0.000", "0.000"] }, series };
}

/** The Bagley plot of group `n` over its chart data block `blockId`. */
export function bagleyChart(g: ReductionGroup, n: number, label: string, blockId: string, series: Omit<SeriesSpec, "blockId">[]): ChartSpec {
  return {
    id: `bagley-${n}`,
    title: `Bagley plot, ${label}`,
    xTitle: "L/R [-]",
    yTitle: `pressure drop [${U.pressure}]`,
    xLog: false,
    yLog: false,
    xMin: Math.min(0, ...g.bagley.map((b) => -b.endCorrection)),
    yMin: 0,
    series: series.map((s) => ({ ...s, blockId })),
    anchor: { ...UNPLACED },
  };
}

/** The fitted model curves of a group, one run of rows per model (in AIC order), or null. */
export function modelChartData(fits: GroupFits, label: string, n: number): { block: BlockDraft; runs: { model: string; firstRow: number; rowCount: number }[] } | null {
  if (fits.curves.length === 0) return null;
  const rows: CellValue[][] = [];
  const runs: { model: string; firstRow: number; rowCount: number }[] = [];
  for (const c of fits.curves) {
    runs.push({ model: c.model, firstRow: rows.length, rowCount: c.shearRate.length });
    c.shearRate.forEach((rate, i) => rows.push([c.model, rate, c.viscosity[i] ?? null]));
  }
  return { block: { id: `modeldata-${n}`, role: "chartData", title: `Model curves, ${label}`, header: ["model", `shear rate wall [${U.rate}]`, `viscosity [${U.viscosity}]`], rows, numberFormats: [null, "0.000", "0.00"] }, runs };
}

/** The master-curve data of a temperature shift, one run of rows per measured temperature. */
export function masterChartData(shift: ShiftOutput): { block: BlockDraft; runs: { name: string; firstRow: number; rowCount: number }[] } {
  const m = shift.master;
  const temps = [...new Set(m.temperature)].sort((a, b) => a - b);
  const rows: CellValue[][] = [];
  const runs: { name: string; firstRow: number; rowCount: number }[] = [];
  for (const t of temps) {
    const name = `${fmt(fromSI(t, U.temperature, "temperature"))} °C`;
    const idx = m.temperature.map((x, k) => (x === t ? k : -1)).filter((k) => k >= 0);
    runs.push({ name, firstRow: rows.length, rowCount: idx.length });
    for (const k of idx) rows.push([name, m.shearRate[k] as number, m.viscosity[k] as number]);
  }
  return { block: { id: "masterdata", role: "chartData", title: "Master curve data (reduced to the reference temperature)", header: ["measured at", `aT·shear rate [${U.rate}]`, `viscosity/aT [${U.viscosity}]`], rows, numberFormats: [null, "0.000", "0.00"] }, runs };
}

/**
 * The rotational join's chart data from the shared table (src/io/resultTables.ts joinedCurveTable:
 * the capillary points, the rotational points, then the recommended model on a log grid), with
 * the series that draw them: points as markers, the model as a line.
 */
export function joinedChartData(table: ResultTable): { block: BlockDraft; series: Omit<SeriesSpec, "blockId">[] } {
  // source, shear rate, and the viscosity of a point or of the model
  const rows: CellValue[][] = table.rows.map((r) => [r[0] ?? null, r[1] ?? null, (r[2] ?? r[3] ?? null) as CellValue]);
  const series: Omit<SeriesSpec, "blockId">[] = [];
  let firstRow = 0;
  for (let i = 1; i <= table.rows.length; i++) {
    const source = table.rows[firstRow]?.[0];
    if (i < table.rows.length && table.rows[i]?.[0] === source) continue;
    const isModel = table.rows[firstRow]?.[3] !== null;
    const k = series.length;
    series.push(
      isModel
        ? { name: String(source), xColumn: 1, yColumn: 2, firstRow, rowCount: i - firstRow, style: "line", colour: GROUP_COLOURS[2] as string }
        : { name: `${String(source)} data`, xColumn: 1, yColumn: 2, firstRow, rowCount: i - firstRow, style: "markers", ...seriesLook(k) },
    );
    firstRow = i;
  }
  return {
    block: { id: "rotationaldata", role: "chartData", title: table.title, header: ["source", `shear rate [${U.rate}]`, `viscosity [${U.viscosity}]`], rows, numberFormats: [null, "0.000", "0.00"] },
    series,
  };
}

/** The chart of the rotational join over its data block (series from {@link joinedChartData}); the title is the results workbook's. */
export function joinedChart(blockId: string, series: Omit<SeriesSpec, "blockId">[]): ChartSpec {
  return {
    id: "rotational",
    title: CHART_TITLES.joined,
    xTitle: `shear rate [${U.rate}]`,
    yTitle: `viscosity [${U.viscosity}]`,
    xLog: true,
    yLog: true,
    series: series.map((s) => ({ ...s, blockId })),
    anchor: { ...UNPLACED },
  };
}

/** The run's summary charts: flow curve, viscosity, n' and (with a shift) the master curve. */
export function summaryCharts(series: { flow: SeriesSpec[]; viscosity: SeriesSpec[]; nPrime: SeriesSpec[]; master: SeriesSpec[] }, shift: ShiftOutput | null | undefined): ChartSpec[] {
  const axis = { xLog: true, yLog: true };
  const charts: ChartSpec[] = [];
  charts.push({ id: "flowcurve", title: "Flow curve", xTitle: `shear rate wall [${U.rate}]`, yTitle: `wall shear stress [${U.stress}]`, ...axis, series: series.flow, anchor: { ...UNPLACED } });
  charts.push({ id: "viscosity", title: "Viscosity and fitted models", xTitle: `shear rate wall [${U.rate}]`, yTitle: `viscosity [${U.viscosity}]`, ...axis, series: series.viscosity, anchor: { ...UNPLACED } });
  charts.push({ id: "nprime", title: "n' against apparent shear rate", xTitle: `shear rate app. [${U.rate}]`, yTitle: "n' [-]", xLog: true, yLog: false, series: series.nPrime, anchor: { ...UNPLACED } });
  if (shift) {
    const ref = fmt(fromSI(shift.law.referenceTemperature, U.temperature, "temperature"));
    charts.push({ id: "master", title: `Master curve at ${ref} °C`, xTitle: `aT·shear rate [${U.rate}]`, yTitle: `viscosity/aT [${U.viscosity}]`, ...axis, series: series.master, anchor: { ...UNPLACED } });
  }
  return charts;
}
