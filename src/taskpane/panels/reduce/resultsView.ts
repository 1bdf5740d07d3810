/**
 * The reduction's results as the pane shows them, results first: a short summary per group
 * (temperature and die, rate and viscosity ranges, the recommended model with its parameters and
 * units, warnings by severity), then the charts, then the warnings grouped by severity with plain
 * titles (collapsed, each code kept), then the tables on demand and the method record. The same
 * sheet plans the writer puts into Excel feed it. Pure: returns markup with every text escaped.
 */
import type { Warning, WarningSeverity } from "../../../core/errors";
import { SEVERITY_ORDER } from "../../../core/warningCodes";
import { recommendedFit } from "../../recommendedFit";
import { getModel } from "../../../core/models";
import { describeWarning } from "../../../io/warningCatalog";
import { modelName, parameterSymbol, unitLabel } from "../../../io/displayNames";
import { chartFigureHtml, tableHtml } from "../../preview";
import { groupLabel, type RunOutput } from "../../runReduction";
import type { SheetPlan, WorkbookPlan } from "../../sheetPlan";
import { escapeXml } from "../../svgChart";
import { joinedCard, masterFitCard } from "./fitCards";
import { shownNumber } from "./shownNumber";

/** Words of each severity, most important first. */
export const SEVERITY_WORDS: Readonly<Record<WarningSeverity, { heading: string; one: string }>> = Object.freeze({
  serious: { heading: "Serious: results probably wrong here", one: "serious" },
  caution: { heading: "Caution: worth a look", one: "caution" },
  info: { heading: "For the record", one: "info" },
});

export { shownNumber };

/** Counts of warnings by severity. */
export function severityCounts(warnings: readonly Warning[]): Record<WarningSeverity, number> {
  const n: Record<WarningSeverity, number> = { serious: 0, caution: 0, info: 0 };
  for (const w of warnings) n[w.severity] += 1;
  return n;
}

function countsText(n: Record<WarningSeverity, number>): string {
  const parts = SEVERITY_ORDER.filter((s) => n[s] > 0).map((s) => `${n[s]} ${SEVERITY_WORDS[s].one}`);
  return parts.length === 0 ? "none" : parts.join(", ");
}

/** One group's summary card. */
function groupCard(run: RunOutput, i: number): string {
  const g = run.result.groups[i];
  if (!g) return "";
  const label = groupLabel(g);
  const pts = g.flowCurve.filter((f) => f.shearRateWall !== null && f.viscosity !== null);
  const rates = pts.map((f) => f.shearRateWall as number);
  const etas = pts.map((f) => f.viscosity as number);
  const range = (xs: number[], unit: string) => (xs.length === 0 ? "no corrected points" : `${shownNumber(Math.min(...xs))} to ${shownNumber(Math.max(...xs))} ${unit}`);
  const rec = recommendedFit(run.fits[i]);
  const rows: [string, string][] = [
    ["Wall shear rate", range(rates, "1/s")],
    ["Viscosity", range(etas, unitLabel("Pa.s"))],
  ];
  if (rec) {
    const r = rec.fit.result;
    const spec = getModel(rec.fit.model).parameters;
    const params = spec
      .filter((p) => !r.fixed.includes(p.name))
      .map((p) => `${parameterSymbol(p.name)} = ${shownNumber(r.parameters[p.name] as number)}${p.unit === "1" ? "" : ` ${unitLabel(p.unit)}`}`)
      .join(", ");
    const note = rec.passedOver.length > 0 ? ` (lower AIC but poorly determined: ${rec.passedOver.map(modelName).join(", ")})` : "";
    rows.push(["Recommended model", `${modelName(rec.fit.model)}: ${params}${note}`]);
  } else rows.push(["Recommended model", "none fitted"]);
  const scoped = run.warnings.filter((w) => w.scope === label);
  rows.push(["Warnings", countsText(severityCounts(scoped))]);
  return `<article class="group-card" data-group="${i + 1}"><h4>${escapeXml(label)}</h4><dl>${rows.map(([k, v]) => `<div><dt>${escapeXml(k)}</dt><dd>${escapeXml(v)}</dd></div>`).join("")}</dl></article>`;
}

/** The run's warnings grouped by severity, each group collapsed, plain titles first, codes kept. */
export function warningsHtml(warnings: readonly Warning[]): string {
  if (warnings.length === 0) return `<p class="no-warnings">No warnings.</p>`;
  const out: string[] = [`<h4 class="warnings-heading">Warnings (${countsText(severityCounts(warnings))})</h4>`];
  for (const sev of SEVERITY_ORDER) {
    const ws = warnings.filter((w) => w.severity === sev);
    if (ws.length === 0) continue;
    const items = ws
      .map((w) => `<li><span class="warning-title">${escapeXml(describeWarning(w.code).title)}</span> ${escapeXml(w.message)} <code class="warning-code">${escapeXml(w.code)}</code></li>`)
      .join("");
    out.push(`<details class="warnings severity-${sev}" data-severity="${sev}"><summary>${escapeXml(SEVERITY_WORDS[sev].heading)} (${ws.length})</summary><ul>${items}</ul></details>`);
  }
  return out.join("");
}

/** The tables of a sheet plan on demand: one collapsed section per group (by its heading), then the rest. */
function tablesOnDemand(plan: SheetPlan): string {
  const sections: { title: string; html: string[] }[] = [];
  let current: { title: string; html: string[] } | null = null;
  for (const b of plan.blocks) {
    if (b.role === "chartData" || b.id === "warnings" || b.id === "chartdata-title" || b.id === "title") continue;
    if (b.role === "heading") {
      current = { title: b.title ?? "", html: [] };
      sections.push(current);
      continue;
    }
    if (b.role === "text") continue;
    if (!current) {
      current = { title: "Run", html: [] };
      sections.push(current);
    }
    current.html.push(tableHtml(b, plan.conditionalFormats ?? []));
  }
  return sections
    .filter((s) => s.html.length > 0)
    .map((s) => `<details class="tables"><summary>Tables: ${escapeXml(s.title)}</summary>${s.html.join("")}</details>`)
    .join("");
}

/**
 * The results markup (see the module comment). `written` names the sheets written in Excel, or is
 * null in preview mode.
 */
export function resultsHtml(run: RunOutput, plan: WorkbookPlan, written: readonly string[] | null): string {
  const out: string[] = [];
  out.push(`<h3 class="results-heading" id="results-heading" tabindex="-1">Results</h3>`);
  out.push(
    written
      ? `<p class="summary-box">Written to the new sheets “${escapeXml(written[0] ?? "")}” and “${escapeXml(written[1] ?? "")}”: every table in full, the charts and the method record.</p>`
      : `<p class="summary-box">Preview on the invented demo data: in Excel these tables and charts go to new sheets, every column in full.</p>`,
  );
  out.push(`<div class="group-cards">${run.result.groups.map((_, i) => groupCard(run, i)).join("")}${masterFitCard(run)}${joinedCard(run)}</div>`);
  out.push(`<div class="charts">${plan.results.charts.map((c) => chartFigureHtml(plan.results, c)).join("")}</div>`);
  out.push(`<div class="warnings-block">${warningsHtml(run.warnings)}</div>`);
  out.push(tablesOnDemand(plan.results));
  out.push(`<details class="method-record"><summary>Method record</summary>${plan.method.blocks.filter((b) => b.role !== "heading" && b.role !== "text").map((b) => tableHtml(b)).join("")}</details>`);
  return out.join("");
}
