/**
 * The recording panel's results as the pane shows them, results first: a short summary (die runs,
 * steps, steps left out, the flow curve or why there is none), then per die run its trace with
 * the windows shaded and the steps left out marked (chart.ts) and its step table narrow enough for
 * a 350 px pane (step, window start and end, mean, sd, steady; a plain note under the table for
 * each step that has one), then the warnings grouped by severity with plain titles (as the
 * reduction's), the method record, and the two sheets on demand. Pure: markup with every text
 * escaped.
 */
import type { RunSteps } from "../../../core/steps/runSteps";
import { stepNote } from "../../../io/stepRecord";
import { shownNumber, warningsHtml } from "../reduce/resultsView";
import { sheetPlanHtml } from "../../preview";
import type { SheetPlan } from "../../sheetPlan";
import { escapeXml } from "../../svgChart";
import { traceChartSvg, type TraceChartData } from "./chart";
import type { TraceOutput } from "./run";

/** What each shade of the chart means (the legend). */
export const WINDOW_WORDS = Object.freeze({
  used: { colour: "#2a9d8f", text: "window of a point of the flow curve" },
  check: { colour: "#e9c46a", text: "repeated first speed (thermal check)" },
  rejected: { colour: "#d1495b", text: "step left out (✕)" },
});

/** Counts of one run's output: steps, steps in the flow curve, steps not steady, windows set by hand. */
export function stepCounts(out: TraceOutput): { runs: number; steps: number; used: number; notSteady: number; moved: number } {
  const steps = out.view.trace.runs.flatMap((r) => r.steps);
  return {
    runs: out.view.trace.runs.length,
    steps: steps.length,
    used: steps.filter((s) => s.used).length,
    notSteady: steps.filter((s) => !s.steady).length,
    moved: steps.filter((s) => s.window === "set").length,
  };
}

const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;

/** The step table of one die run: step, window start, end, mean, sd, steady; notes below. */
export function stepTableHtml(run: RunSteps): string {
  const head = ["Step", "Start [s]", "End [s]", "Mean [bar]", "sd [bar]", "Steady"].map((h) => `<th scope="col">${escapeXml(h)}</th>`).join("");
  const rows = run.steps
    .map((s) => {
      const label = `${s.step}${s.role === "check" ? " (repeat)" : ""}${s.window === "set" ? " ✎" : ""}`;
      const steady = s.steady ? `<td class="flag flag-pass">yes</td>` : `<td class="flag flag-fail">no ✕</td>`;
      const cells = [shownNumber(s.start), shownNumber(s.end), shownNumber(s.pressure / 1e5), shownNumber(s.pressureStd / 1e5)].map((v) => `<td class="num">${escapeXml(v)}</td>`).join("");
      return `<tr data-step="${s.step}" class="${s.steady ? "steady" : "not-steady"}${s.used ? " used" : ""}"><th scope="row">${escapeXml(label)}</th>${cells}${steady}</tr>`;
    })
    .join("");
  const notes = run.steps
    .map((s) => ({ s, note: stepNote(s) }))
    .filter(({ note }) => note !== "")
    .map(({ s, note }) => `<li data-step="${s.step}">Step ${s.step}: ${escapeXml(note)}</li>`)
    .join("");
  const caption = `Steps of die run ${run.run}`;
  return `<div class="table-wrap step-table-wrap" tabindex="0" role="region" aria-label="${escapeXml(caption)}"><table class="step-table" data-run="${run.run}"><caption>${escapeXml(caption)}</caption><thead><tr>${head}</tr></thead><tbody>${rows}</tbody></table></div>${notes ? `<ul class="step-notes">${notes}</ul>` : ""}`;
}

function legendHtml(): string {
  return `<ul class="legend">${Object.values(WINDOW_WORDS)
    .map((w) => `<li><svg class="swatch" viewBox="0 0 14 8" aria-hidden="true"><rect width="14" height="8" fill="${w.colour}" fill-opacity="0.45"/></svg>${escapeXml(w.text)}</li>`)
    .join("")}</ul>`;
}

function runHtml(run: RunSteps, chart: TraceChartData): string {
  return `<section class="trace-run" data-run="${run.run}" aria-labelledby="trace-run-${run.run}"><h4 class="group-heading" id="trace-run-${run.run}">${escapeXml(chart.title)}</h4><figure class="chart-figure" data-figure="${escapeXml(chart.id)}"><figcaption>Pressure against time</figcaption>${traceChartSvg(chart)}${legendHtml()}</figure>${stepTableHtml(run)}</section>`;
}

/**
 * The results markup (see the module comment). `plans` are the two sheets (steps, curve);
 * `written` names them as written in Excel, or is null in preview mode.
 */
export function traceResultsHtml(out: TraceOutput, plans: readonly SheetPlan[], written: readonly string[] | null): string {
  const c = stepCounts(out);
  const html: string[] = [`<h3 class="results-heading" id="trace-results-heading" tabindex="-1">Steps of the recording</h3>`];
  html.push(
    written
      ? `<p class="summary-box">Written to the new sheets “${escapeXml(written[0] ?? "")}” (steps, method) and “${escapeXml(written[1] ?? "")}” (flow curve).</p>`
      : `<p class="summary-box">Preview on an invented demo recording: in Excel the step table and the flow curve go to new sheets.</p>`,
  );
  const groups = out.reduction?.result.groups.length ?? 0;
  const curve = out.reduction ? `Flow curve: ${plural(groups, "group")} from ${plural(c.used, "plateau")}.` : `No flow curve: ${out.reductionProblem ?? "not reduced"}`;
  html.push(
    `<p class="trace-summary" id="trace-summary">${escapeXml(`${plural(c.runs, "die run")}, ${plural(c.steps, "step")}: ${c.used} in the flow curve, ${c.notSteady} not steady${c.moved > 0 ? `, ${plural(c.moved, "window")} set by hand` : ""}.`)} ${escapeXml(curve)}</p>`,
  );
  out.view.trace.runs.forEach((r, i) => html.push(runHtml(r, out.view.charts[i] as TraceChartData)));
  html.push(`<div class="warnings-block">${warningsHtml(out.warnings)}</div>`);
  html.push(`<details class="method-record"><summary>Method record</summary><ul class="method-lines">${out.view.method.map((l) => `<li>${escapeXml(l)}</li>`).join("")}</ul></details>`);
  for (const plan of plans) html.push(`<details class="tables"><summary>Sheet “${escapeXml(plan.name)}”</summary>${sheetPlanHtml(plan)}</details>`);
  return html.join("");
}
