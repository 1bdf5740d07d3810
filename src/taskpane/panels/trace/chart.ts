/**
 * The trace view's chart, without DOM: each die run's pressure against time (min/max-decimated
 * so a long recording stays a light SVG), the plateau windows shaded (steady and used, steady but
 * a check, not steady), each plateau drawn across its window, and the steps left out marked.
 * Drawn as markup the way svgChart.ts draws the results charts (no script, no inline style:
 * presentation attributes only, as the pane's CSP requires). Pure.
 */
import type { RunSteps, TraceRun } from "../../../core/steps/runSteps";
import { escapeXml, scale, tickLabel } from "../../svgChart";

/** Display units of the chart: s and bar. */
const SECONDS = 1;
const BAR = 1e5;

/** One shaded window. */
export interface ChartWindow {
  step: number;
  /** window start and end, s */
  start: number;
  end: number;
  /** plateau, bar */
  pressure: number;
  /** "used": a point of the flow curve; "check": the repeated first speed; "rejected": left out */
  kind: "used" | "check" | "rejected";
  /** plain note for the tooltip */
  note: string;
}

/** What the chart of one die run shows (display units: s, bar). */
export interface TraceChartData {
  id: string;
  title: string;
  trace: { x: number; y: number }[];
  windows: ChartWindow[];
}

/**
 * Reduces (x, y) samples to at most 2·buckets points keeping each bucket's lowest and highest y
 * in time order, so spikes and oscillations stay visible.
 * @example decimateMinMax([0, 1, 2, 3], [5, 9, 1, 4], 1) // [{x: 1, y: 9}, {x: 2, y: 1}]
 */
export function decimateMinMax(x: ArrayLike<number>, y: ArrayLike<number>, buckets: number): { x: number; y: number }[] {
  const n = x.length;
  if (n <= 2 * buckets) return Array.from({ length: n }, (_, i) => ({ x: x[i] as number, y: y[i] as number }));
  const out: { x: number; y: number }[] = [];
  for (let b = 0; b < buckets; b++) {
    const a = Math.floor((b * n) / buckets);
    const e = Math.floor(((b + 1) * n) / buckets);
    let lo = a;
    let hi = a;
    for (let i = a; i < e; i++) {
      if ((y[i] as number) < (y[lo] as number)) lo = i;
      if ((y[i] as number) > (y[hi] as number)) hi = i;
    }
    for (const i of lo === hi ? [lo] : lo < hi ? [lo, hi] : [hi, lo]) out.push({ x: x[i] as number, y: y[i] as number });
  }
  return out;
}

/**
 * The chart data of one die run: its samples (with the barrel friction of each step subtracted
 * inside that step, so the trace and the plateaus agree) and its windows.
 * @param buckets decimation buckets (default 400: at most 800 points)
 */
export function traceChartData(run: TraceRun, steps: RunSteps, buckets = 400): TraceChartData {
  const pressure = Float64Array.from(run.pressure as ArrayLike<number>);
  for (const s of steps.steps) {
    if (s.friction === 0) continue;
    for (let i = 0; i < run.time.length; i++) {
      const t = run.time[i] as number;
      if (t >= s.stepStart && t <= s.stepEnd) pressure[i] = (pressure[i] as number) - s.friction;
    }
  }
  const time = Float64Array.from(run.time as ArrayLike<number>, (t) => t / SECONDS);
  const trace = decimateMinMax(time, pressure.map((p) => p / BAR), buckets);
  const windows = steps.steps.map((s): ChartWindow => ({
    step: s.step,
    start: s.start / SECONDS,
    end: s.end / SECONDS,
    pressure: s.pressure / BAR,
    kind: s.role === "check" ? "check" : s.used ? "used" : "rejected",
    note: `step ${s.step}: ${Number((s.pressure / BAR).toPrecision(4))} bar ± ${Number((s.pressureStd / BAR).toPrecision(2))}${s.steady ? "" : `, not steady (${s.reason})`}${s.oscillation ? ", oscillating" : ""}`,
  }));
  return { id: `trace-${steps.run}`, title: `Die run ${steps.run}${steps.label ? `: ${steps.label}` : ""}`, trace, windows };
}

const W = 320;
const H = 190;
const PAD = { left: 46, right: 10, top: 10, bottom: 34 };
const COLOURS = { trace: "#4a5f5c", used: "#2a9d8f", check: "#e9c46a", rejected: "#d1495b" };

/**
 * The SVG markup of a trace chart: `<rect class="window used|check|rejected" data-step=…>` per
 * window, `<line class="plateau">` across it, `<path class="rejected-mark">` (a cross) over each
 * step left out, and the trace as one `<polyline class="trace">`.
 */
export function traceChartSvg(data: TraceChartData): string {
  const xs = [...data.trace.map((p) => p.x), ...data.windows.flatMap((w) => [w.start, w.end])];
  const ys = [...data.trace.map((p) => p.y), ...data.windows.map((w) => w.pressure)];
  const sx = scale(xs, false, undefined, PAD.left, W - PAD.right);
  const sy = scale(ys, false, 0, H - PAD.bottom, PAD.top);
  const f = (v: number) => v.toFixed(1);
  const out: string[] = [];
  const id = escapeXml(data.id);
  out.push(`<svg class="chart trace-chart" viewBox="0 0 ${W} ${H}" role="img" aria-labelledby="${id}-title" data-chart="${id}" xmlns="http://www.w3.org/2000/svg">`);
  out.push(`<title id="${id}-title">${escapeXml(data.title)}: pressure against time, plateau windows shaded</title>`);
  out.push(`<rect class="plot" x="${PAD.left}" y="${PAD.top}" width="${W - PAD.left - PAD.right}" height="${H - PAD.top - PAD.bottom}"/>`);
  for (const t of sx.ticks) {
    const x = f(sx.map(t));
    out.push(`<line class="grid" x1="${x}" x2="${x}" y1="${PAD.top}" y2="${H - PAD.bottom}"/><text class="tick" x="${x}" y="${H - PAD.bottom + 11}" text-anchor="middle">${tickLabel(t)}</text>`);
  }
  for (const t of sy.ticks) {
    const y = f(sy.map(t));
    out.push(`<line class="grid" x1="${PAD.left}" x2="${W - PAD.right}" y1="${y}" y2="${y}"/><text class="tick" x="${PAD.left - 3}" y="${y}" dy="3" text-anchor="end">${tickLabel(t)}</text>`);
  }
  out.push(`<text class="axis-title" x="${(PAD.left + W - PAD.right) / 2}" y="${H - 4}" text-anchor="middle">time [s]</text>`);
  out.push(`<text class="axis-title" transform="translate(10 ${(PAD.top + H - PAD.bottom) / 2}) rotate(-90)" text-anchor="middle">pressure [bar]</text>`);
  for (const w of data.windows) {
    const x0 = sx.map(w.start);
    const x1 = sx.map(w.end);
    const colour = COLOURS[w.kind];
    out.push(`<rect class="window ${w.kind}" data-step="${w.step}" x="${f(x0)}" y="${PAD.top}" width="${f(Math.max(1, x1 - x0))}" height="${H - PAD.top - PAD.bottom}" fill="${colour}" fill-opacity="0.18"><title>${escapeXml(w.note)}</title></rect>`);
  }
  out.push(`<polyline class="trace" fill="none" stroke="${COLOURS.trace}" stroke-width="0.9" points="${data.trace.map((p) => `${f(sx.map(p.x))},${f(sy.map(p.y))}`).join(" ")}"/>`);
  for (const w of data.windows) {
    const y = f(sy.map(w.pressure));
    out.push(`<line class="plateau ${w.kind}" data-step="${w.step}" x1="${f(sx.map(w.start))}" x2="${f(sx.map(w.end))}" y1="${y}" y2="${y}" stroke="${COLOURS[w.kind]}" stroke-width="2"/>`);
    if (w.kind === "rejected") {
      const cx = sx.map((w.start + w.end) / 2);
      const cy = sy.map(w.pressure);
      out.push(`<path class="rejected-mark" data-step="${w.step}" d="M${f(cx - 4)} ${f(cy - 4)}L${f(cx + 4)} ${f(cy + 4)}M${f(cx - 4)} ${f(cy + 4)}L${f(cx + 4)} ${f(cy - 4)}" stroke="${COLOURS.rejected}" stroke-width="1.6"/>`);
    }
  }
  out.push("</svg>");
  return out.join("");
}
