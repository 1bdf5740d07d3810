/**
 * The preview's inline SVG charts: the same chart specs and series data as the Excel charts,
 * drawn by the shared builder src/io/svgChart.ts (also used by the command line's HTML report).
 * Pure.
 */
import { plotSvg } from "../io/svgChart";
import { ChartSpec, SheetPlan, seriesPoints } from "./sheetPlan";

export { escapeXml, markerSvg, scale, tickLabel, type Scale } from "../io/svgChart";

/**
 * The SVG markup of one chart of a plan. Each series is a `<g class="series" data-name=…>` with
 * one circle per point (markers) or a polyline (lines), so tests can count what is drawn.
 */
export function chartSvg(plan: SheetPlan, spec: ChartSpec): string {
  return plotSvg({ ...spec, series: spec.series.map((s) => ({ name: s.name, style: s.style, colour: s.colour, ...(s.marker ? { marker: s.marker } : {}), points: seriesPoints(plan, s) })) });
}
