/**
 * Small inline SVG scatter charts, pure markup (no script, no inline style: the task pane's CSP
 * forbids both). One builder for every surface that draws a chart as SVG: the task pane's preview
 * (src/taskpane/svgChart.ts adapts its sheet plan to {@link PlotChart}) and the command line's
 * HTML report (src/io/htmlReport.ts).
 */
import { headerLabel } from "./displayNames";

/** One series: its points in plot units, drawn as markers or a (dashed) line. */
export interface PlotSeries {
  name: string;
  style: "markers" | "line" | "dashed";
  /** #rrggbb */
  colour: string;
  /** marker shape of a markers series (default circle): no two series of a chart look alike */
  marker?: MarkerShape;
  points: readonly { x: number; y: number }[];
}

/** Marker shapes a series may use. */
export type MarkerShape = "circle" | "square" | "diamond" | "triangle";

/** One marker at (x, y) in SVG user units. */
export function markerSvg(shape: MarkerShape, x: number, y: number): string {
  const f = (v: number) => v.toFixed(1);
  if (shape === "circle") return `<circle cx="${f(x)}" cy="${f(y)}" r="2.6"/>`;
  if (shape === "square") return `<rect x="${f(x - 2.3)}" y="${f(y - 2.3)}" width="4.6" height="4.6"/>`;
  const pts = shape === "diamond" ? [[x, y - 3.2], [x + 3.2, y], [x, y + 3.2], [x - 3.2, y]] : [[x, y - 3.3], [x + 3, y + 2.2], [x - 3, y + 2.2]];
  return `<polygon points="${pts.map(([a, b]) => `${f(a as number)},${f(b as number)}`).join(" ")}"/>`;
}

/** A scatter chart in plot units. */
export interface PlotChart {
  id: string;
  title: string;
  xTitle: string;
  yTitle: string;
  xLog: boolean;
  yLog: boolean;
  /** axis minimum to force (the Bagley plot starts at or left of L/R = 0, pressure at 0) */
  xMin?: number;
  yMin?: number;
  series: readonly PlotSeries[];
}

/** Width and height of the drawing in SVG user units (the pane's preview size by default). */
export interface PlotSize {
  width: number;
  height: number;
}

export const PANE_PLOT_SIZE: Readonly<PlotSize> = Object.freeze({ width: 320, height: 210 });
const PAD = { left: 46, right: 16, top: 10, bottom: 34 };

/** Escapes text for HTML/SVG markup. */
export function escapeXml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c] as string);
}

/** A number for an axis label: 4 significant digits, exponent outside 1e-3…1e5. */
export function tickLabel(v: number): string {
  if (v === 0) return "0";
  const a = Math.abs(v);
  if (a >= 1e5 || a < 1e-3) return v.toExponential(0).replace("e+", "e");
  return Number(v.toPrecision(4)).toString();
}

export interface Scale {
  map(v: number): number;
  ticks: number[];
}

function niceStep(span: number): number {
  const raw = span / 5;
  const mag = Math.pow(10, Math.floor(Math.log10(raw)));
  const f = raw / mag;
  return (f < 1.5 ? 1 : f < 3.5 ? 2 : f < 7.5 ? 5 : 10) * mag;
}

export function scale(values: number[], log: boolean, forcedMin: number | undefined, lo: number, hi: number): Scale {
  const finite = values.filter((v) => Number.isFinite(v) && (!log || v > 0));
  let min = Math.min(...finite, ...(forcedMin !== undefined ? [forcedMin] : []));
  let max = Math.max(...finite);
  if (!Number.isFinite(min) || !Number.isFinite(max)) {
    min = log ? 1 : 0;
    max = log ? 10 : 1;
  }
  if (log) {
    const a = Math.floor(Math.log10(min));
    const b = Math.max(a + 1, Math.ceil(Math.log10(max)));
    const ticks = Array.from({ length: b - a + 1 }, (_, i) => Math.pow(10, a + i));
    return { map: (v) => lo + ((Math.log10(v) - a) / (b - a)) * (hi - lo), ticks };
  }
  if (max === min) max = min + 1;
  const step = niceStep(max - min);
  const a = Math.floor(min / step) * step;
  const b = Math.ceil(max / step) * step;
  const ticks: number[] = [];
  for (let t = a; t <= b + step / 2; t += step) ticks.push(Number(t.toPrecision(12)));
  return { map: (v) => lo + ((v - a) / (b - a)) * (hi - lo), ticks };
}

/** The points of a series a chart can draw (finite, and positive on a log axis). */
export function plottablePoints(chart: Pick<PlotChart, "xLog" | "yLog">, points: readonly { x: number; y: number }[]): { x: number; y: number }[] {
  return points.filter((p) => Number.isFinite(p.x) && Number.isFinite(p.y) && (!chart.xLog || p.x > 0) && (!chart.yLog || p.y > 0));
}

/**
 * The SVG markup of one chart. Each series is a `<g class="series" data-name=…>` with one circle
 * per point (markers) or a polyline (lines), so tests can count what is drawn.
 */
export function plotSvg(chart: PlotChart, size: PlotSize = PANE_PLOT_SIZE): string {
  const W = size.width;
  const H = size.height;
  const data = chart.series.map((s) => ({ s, pts: plottablePoints(chart, s.points) }));
  const xs = data.flatMap((d) => d.pts.map((p) => p.x));
  const ys = data.flatMap((d) => d.pts.map((p) => p.y));
  const sx = scale(xs, chart.xLog, chart.xMin, PAD.left, W - PAD.right);
  const sy = scale(ys, chart.yLog, chart.yMin, H - PAD.bottom, PAD.top);
  const f = (v: number) => v.toFixed(1);
  const id = escapeXml(chart.id);
  const out: string[] = [];
  out.push(`<svg class="chart" viewBox="0 0 ${W} ${H}" role="img" aria-labelledby="${id}-title" data-chart="${id}" xmlns="http://www.w3.org/2000/svg">`);
  out.push(`<title id="${id}-title">${escapeXml(chart.title)}: ${escapeXml(headerLabel(chart.yTitle))} against ${escapeXml(headerLabel(chart.xTitle))}</title>`);
  out.push(`<rect class="plot" x="${PAD.left}" y="${PAD.top}" width="${W - PAD.left - PAD.right}" height="${H - PAD.top - PAD.bottom}"/>`);
  for (const t of sx.ticks) {
    const x = f(sx.map(t));
    out.push(`<line class="grid" x1="${x}" x2="${x}" y1="${PAD.top}" y2="${H - PAD.bottom}"/><text class="tick" x="${x}" y="${H - PAD.bottom + 11}" text-anchor="middle">${tickLabel(t)}</text>`);
  }
  for (const t of sy.ticks) {
    const y = f(sy.map(t));
    out.push(`<line class="grid" x1="${PAD.left}" x2="${W - PAD.right}" y1="${y}" y2="${y}"/><text class="tick" x="${PAD.left - 3}" y="${y}" dy="3" text-anchor="end">${tickLabel(t)}</text>`);
  }
  out.push(`<text class="axis-title" x="${(PAD.left + W - PAD.right) / 2}" y="${H - 4}" text-anchor="middle">${escapeXml(headerLabel(chart.xTitle))}</text>`);
  out.push(`<text class="axis-title" transform="translate(10 ${(PAD.top + H - PAD.bottom) / 2}) rotate(-90)" text-anchor="middle">${escapeXml(headerLabel(chart.yTitle))}</text>`);
  for (const { s, pts } of data) {
    out.push(`<g class="series ${s.style}" data-name="${escapeXml(s.name)}" stroke="${s.colour}" fill="${s.colour}">`);
    if (s.style === "markers") {
      for (const p of pts) out.push(markerSvg(s.marker ?? "circle", sx.map(p.x), sy.map(p.y)));
    } else if (pts.length > 0) {
      const dash = s.style === "dashed" ? ` stroke-dasharray="5 3"` : "";
      out.push(`<polyline fill="none" stroke-width="1.4"${dash} points="${pts.map((p) => `${f(sx.map(p.x))},${f(sy.map(p.y))}`).join(" ")}"/>`);
    }
    out.push("</g>");
  }
  out.push("</svg>");
  return out.join("");
}
