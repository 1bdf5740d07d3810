/**
 * The charts of a run, read from the `chart` field of its result tables (resultTables.ts), for
 * every writer that draws them: the results workbook (native xlsx charts, xlsxCharts.ts) and the
 * HTML report (inline SVG, svgChart.ts). Pure.
 *
 * Conventions:
 *   - a Bagley plot is one chart per table (per group); every other kind is one chart over all
 *     tables of that kind, one series per group (table scope) and y column;
 *   - `seriesBy` splits a table's rows into one series per value of that column (e.g. one Bagley
 *     line per apparent shear rate, one curve per model);
 *   - a y column whose key contains "model", "fit" or "line" is drawn as a line (a fitted curve);
 *     every other as markers (measured or reduced points); a line and the points it was fitted to
 *     (same group, same seriesBy value) share a colour, and with more than {@link LEGEND_LIMIT}
 *     series the legend lists the points only;
 *   - a log axis that would have to show a value at or below zero is drawn linear instead (a log
 *     axis cannot show it), and the chart says so in its note.
 */
import { headerWithUnit, type ResultTable } from "./resultTables";
import type { PlotChart, PlotSeries } from "./svgChart";

export type ChartKind = NonNullable<ResultTable["chart"]>["kind"];

/** Our palette: one colour per series (deep teal first, then amber, plum, ...), the task pane's order. */
export const SERIES_COLOURS = ["#0b6e69", "#c77c0e", "#7a3b8f", "#2f5d9e", "#a23b2a", "#4f7a28", "#8c6d1f", "#1f7a8c", "#6b4f3a", "#5a5a5a"];

/** Plain chart titles per kind (a scope is added for per-group charts). */
export const CHART_TITLES: Readonly<Record<ChartKind, string>> = Object.freeze({
  bagley: "Bagley plot",
  flowCurve: "Flow curve",
  viscosity: "Viscosity",
  nPrime: "Flow index n′",
  master: "Master curve",
  joined: "Rotational and capillary viscosity joined",
});

const KIND_ORDER: readonly ChartKind[] = ["bagley", "flowCurve", "viscosity", "nPrime", "master", "joined"];

/** Where a series' values sit: table `table` (index in the list), its rows `rows`, columns `x` and `y`. */
export interface SeriesSource {
  table: number;
  rows: number[];
  x: number;
  y: number;
}

export interface ResultChartSeries extends PlotSeries {
  source: SeriesSource;
  /** series with the same key share a colour (group and seriesBy value) */
  colourKey: string;
  /** listed in the legend (a fitted line beside its points is left out when the chart has many series) */
  inLegend: boolean;
}

/** One chart: what to draw and where each series' data come from. */
export interface ResultChart extends PlotChart {
  kind: ChartKind;
  series: ResultChartSeries[];
  /** e.g. why an axis is linear although the table asked for a log axis */
  note?: string;
}

const LINE = /model|fit|line/i;

/** Above this many series a chart's legend leaves out fitted lines that have their points listed. */
export const LEGEND_LIMIT = 8;

function axisTitle(header: string, unit: string): string {
  return headerWithUnit({ header, unit });
}

/** Text of a seriesBy value for a legend. */
function valueLabel(v: unknown, unit: string): string {
  if (typeof v === "number") return `${Number(v.toPrecision(4))}${unit ? ` ${unit}` : ""}`;
  return String(v);
}

/** The charts the tables ask for, in a fixed order of kinds. */
export function resultCharts(tables: readonly ResultTable[]): ResultChart[] {
  const charts: ResultChart[] = [];
  for (const kind of KIND_ORDER) {
    const members = tables.map((t, i) => ({ t, i })).filter(({ t }) => t.chart?.kind === kind);
    if (members.length === 0) continue;
    const groups = kind === "bagley" ? members.map((m) => [m]) : [members];
    for (const group of groups) {
      const chart = buildChart(kind, group);
      if (chart) charts.push(chart);
    }
  }
  return charts;
}

function buildChart(kind: ChartKind, members: { t: ResultTable; i: number }[]): ResultChart | null {
  const first = members[0]?.t;
  const spec = first?.chart;
  if (!first || !spec) return null;
  const series: ResultChartSeries[] = [];
  let xTitle = "";
  let yTitle = "";
  for (const { t, i } of members) {
    const c = t.chart as NonNullable<ResultTable["chart"]>;
    const x = t.columns.findIndex((col) => col.key === c.x);
    if (x < 0) continue;
    const xCol = t.columns[x] as ResultTable["columns"][number];
    xTitle ||= axisTitle(xCol.header, xCol.unit);
    const by = c.seriesBy === undefined ? -1 : t.columns.findIndex((col) => col.key === c.seriesBy);
    const splits: { label: string | null; rows: number[] }[] = [];
    if (by < 0) splits.push({ label: null, rows: t.rows.map((_, r) => r) });
    else {
      const byCol = t.columns[by] as ResultTable["columns"][number];
      const index = new Map<string, number[]>();
      t.rows.forEach((row, r) => {
        const v = row[by];
        if (v === null || v === undefined) return;
        const label = valueLabel(v, byCol.unit);
        index.set(label, [...(index.get(label) ?? []), r]);
      });
      for (const [label, rows] of index) splits.push({ label, rows });
    }
    for (const yKey of c.y) {
      const y = t.columns.findIndex((col) => col.key === yKey);
      if (y < 0) continue;
      const yCol = t.columns[y] as ResultTable["columns"][number];
      yTitle ||= axisTitle(yCol.header, yCol.unit);
      for (const split of splits) {
        const nameParts = [members.length > 1 || kind !== "bagley" ? t.scope : undefined, c.y.length > 1 ? yCol.header : undefined, split.label ?? undefined].filter((p): p is string => p !== undefined && p !== "");
        const points = split.rows
          .map((r) => ({ x: t.rows[r]?.[x], y: t.rows[r]?.[y] }))
          .filter((p): p is { x: number; y: number } => typeof p.x === "number" && typeof p.y === "number" && Number.isFinite(p.x) && Number.isFinite(p.y));
        if (points.length === 0) continue;
        series.push({
          name: nameParts.join(", ") || yCol.header,
          style: LINE.test(yKey) ? "line" : "markers",
          colour: "",
          colourKey: `${t.scope ?? ""}|${split.label ?? ""}`,
          inLegend: true,
          points,
          source: { table: i, rows: split.rows, x, y },
        });
      }
    }
  }
  if (series.length === 0) return null;
  const keys = [...new Set(series.map((s) => s.colourKey))];
  series.forEach((s) => (s.colour = SERIES_COLOURS[keys.indexOf(s.colourKey) % SERIES_COLOURS.length] as string));
  if (series.length > LEGEND_LIMIT) {
    for (const s of series) if (s.style !== "markers" && series.some((m) => m.style === "markers" && m.colourKey === s.colourKey)) s.inLegend = false;
  }
  const all = series.flatMap((s) => s.points);
  const notes: string[] = [];
  let xLog = spec.logX === true;
  let yLog = spec.logY === true;
  if (xLog && all.some((p) => p.x <= 0)) {
    xLog = false;
    notes.push("x axis linear: some values are zero or negative");
  }
  if (yLog && all.some((p) => p.y <= 0)) {
    yLog = false;
    notes.push("y axis linear: some values are zero or negative");
  }
  const chart: ResultChart = {
    id: kind === "bagley" && first.scope ? `bagley-${slug(first.scope)}` : kind,
    kind,
    title: kind === "bagley" && first.scope ? `${CHART_TITLES[kind]}, ${first.scope}` : CHART_TITLES[kind],
    xTitle,
    yTitle,
    xLog,
    yLog,
    series,
  };
  // a Bagley plot shows L/R = 0 and ΔP = 0 (where the lines meet the axes)
  if (kind === "bagley") {
    chart.xMin = Math.min(0, ...all.map((p) => p.x));
    chart.yMin = Math.min(0, ...all.map((p) => p.y));
  }
  if (notes.length > 0) chart.note = notes.join("; ");
  return chart;
}

function slug(text: string): string {
  return text.toLowerCase().replace(/[^a-z0-9]+/g, "-").replace(/^-|-$/g, "");
}
