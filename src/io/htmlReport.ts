/**
 * The HTML report of a run (`rheoledger reduce FILE --report report.html`): one self-contained
 * file for people without a spreadsheet — no script, no network (a Content-Security-Policy that
 * forbids every fetch), charts as inline SVG (svgChart.ts, the task pane's chart code), the
 * summary, every result table, the warnings and the method record, rendered from result tables
 * (resultTables.ts) like the workbook. Print CSS makes it a clean PDF from any browser: A4 pages,
 * table headers repeated, no chart or row split across pages, the method record on a new page.
 * Pure: returns the markup, every text escaped.
 */
import type { Warning } from "../core/errors";
import { SEVERITY_ORDER } from "../core/warningCodes";
import { finiteTables } from "./finiteTables";
import { DEFAULT_DIGITS, formatSignificant } from "./numberFormat";
import { resultCharts } from "./resultCharts";
import { headerWithUnit, type ResultCell, type ResultColumn, type ResultTable } from "./resultTables";

import { escapeXml, plotSvg } from "./svgChart";

export interface ReportContent {
  /** e.g. "Results of demo-film-grade.csv" */
  title: string;
  /** a line under the title: program, version, date */
  subtitle: string;
  tables: readonly ResultTable[];
  method?: readonly ResultTable[];
}

/** Size of the report's charts in SVG units (scaled to the page width). */
export const REPORT_PLOT_SIZE = Object.freeze({ width: 560, height: 340 });

const CSS = `
:root { --ink: #1d2a2a; --muted: #5b6b6a; --rule: #c9d6d4; --head: #e8f1f0; --serious: #f8d7d3; --caution: #fcebc8; --input: #fff4cc; }
* { box-sizing: border-box; }
body { font: 14px/1.45 system-ui, "Segoe UI", Roboto, Helvetica, Arial, sans-serif; color: var(--ink); margin: 0 auto; max-width: 1100px; padding: 1.5rem; }
h1 { font-size: 1.6rem; margin: 0 0 .25rem; } h2 { font-size: 1.25rem; margin: 2rem 0 .5rem; border-bottom: 2px solid var(--rule); padding-bottom: .2rem; }
h3 { font-size: 1rem; margin: 1.4rem 0 .4rem; } .subtitle, .note, figcaption .note { color: var(--muted); }
nav ol { columns: 2; margin: .5rem 0; padding-left: 1.2rem; }
.table-wrap { overflow-x: auto; }
table { border-collapse: collapse; margin: .3rem 0 .6rem; font-size: .86rem; }
th, td { border: 1px solid var(--rule); padding: .15rem .45rem; vertical-align: top; }
th { background: var(--head); text-align: left; font-weight: 600; }
td.num { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
td.empty { background: #fafafa; } td.fill { background: var(--input); }
tr.serious td { background: var(--serious); } tr.caution td { background: var(--caution); }
.counts span { display: inline-block; margin-right: 1rem; padding: .1rem .5rem; border-radius: 3px; background: var(--head); }
.charts { display: grid; grid-template-columns: repeat(auto-fit, minmax(420px, 1fr)); gap: 1rem; }
figure { margin: 0; border: 1px solid var(--rule); padding: .5rem; }
figcaption { font-weight: 600; margin-bottom: .3rem; }
svg.chart { width: 100%; height: auto; font-size: 10px; }
svg.chart .plot { fill: #fff; stroke: #9aa9a8; } svg.chart .grid { stroke: #e3e9e8; } svg.chart .tick, svg.chart .axis-title { fill: #3d4a49; stroke: none; }
svg.chart .axis-title { font-size: 11px; }
ul.legend { list-style: none; padding: 0; margin: .3rem 0 0; font-size: .8rem; display: flex; flex-wrap: wrap; gap: .2rem .9rem; }
ul.legend svg { width: 16px; height: 9px; margin-right: .3rem; vertical-align: middle; }
@media (max-width: 640px) { body { padding: .6rem; } .optional { display: none; } nav ol { columns: 1; } }
@media print {
  @page { size: A4; margin: 14mm 12mm; }
  body { max-width: none; padding: 0; font-size: 10pt; }
  nav { display: none; }
  h2 { break-after: avoid; } h3 { break-after: avoid; }
  .table-wrap { overflow: visible; }
  table { font-size: 8pt; width: 100%; }
  thead { display: table-header-group; }
  tr, figure { break-inside: avoid; }
  .charts { display: grid; grid-template-columns: 1fr 1fr; gap: 4mm; } figure { padding: 2mm; }
  svg.chart { max-height: 75mm; } ul.legend { font-size: 6.5pt; }
  #method { break-before: page; }
  .optional { display: table-cell; }
  * { -webkit-print-color-adjust: exact; print-color-adjust: exact; }
}`;

/** A cell as shown: numbers with the column's significant figures, flags yes/no, text as is (escaped). */
export function cellText(v: ResultCell, column: ResultColumn): string {
  if (v === null) return "";
  if (typeof v === "number") return formatSignificant(v, column.digits ?? DEFAULT_DIGITS);
  if (typeof v === "boolean") return v ? "yes" : "no";
  return v;
}

function tableHtml(t: ResultTable, options: { heading: boolean }): string {
  const keep = t.keyColumns && t.keyColumns.length > 0 ? new Set(t.keyColumns) : null;
  const cls = (c: ResultColumn, base: string) => [base, keep && !keep.has(c.key) ? "optional" : ""].filter((x) => x !== "").join(" ");
  const severityAt = t.columns.findIndex((c) => c.key === "severity");
  const head = `<thead><tr>${t.columns.map((c) => `<th scope="col"${keep && !keep.has(c.key) ? ` class="optional"` : ""}>${escapeXml(headerWithUnit(c))}</th>`).join("")}</tr></thead>`;
  const body = t.rows
    .map((r) => {
      const sev = severityAt >= 0 ? r[severityAt] : null;
      const rowClass = sev === "serious" || sev === "caution" ? ` class="${sev}"` : "";
      return `<tr${rowClass}>${t.columns
        .map((c, j) => {
          const v = r[j] ?? null;
          const fill = t.id === "reportItems" && c.key === "value" && v === null;
          const c0 = cls(c, v === null ? (fill ? "fill" : "empty") : typeof v === "number" ? "num" : "");
          return `<td${c0 ? ` class="${c0}"` : ""}>${fill ? "(to be filled in)" : escapeXml(cellText(v, c))}</td>`;
        })
        .join("")}</tr>`;
    })
    .join("");
  const heading = options.heading ? `<h3 id="${anchor(t)}">${escapeXml(t.scope ? `${t.title}, ${t.scope}` : t.title)}</h3>` : "";
  const notes = (t.notes ?? []).map((n) => `<p class="note">${escapeXml(n)}</p>`).join("");
  return `${heading}<div class="table-wrap"><table data-table="${escapeXml(t.id)}">${head}<tbody>${body}</tbody></table></div>${notes}`;
}

function anchor(t: ResultTable): string {
  return `t-${t.id}${t.scope ? `-${t.scope}` : ""}`.toLowerCase().replace(/[^a-z0-9-]+/g, "-");
}

function legendHtml(series: readonly { name: string; style: string; colour: string }[]): string {
  return `<ul class="legend">${series
    .map((s) => `<li><svg viewBox="0 0 16 9" aria-hidden="true"><line x1="0" y1="4.5" x2="16" y2="4.5" stroke="${s.colour}" stroke-width="${s.style === "markers" ? 0 : 2}"${s.style === "dashed" ? ` stroke-dasharray="4 2"` : ""}/>${s.style === "markers" ? `<circle cx="8" cy="4.5" r="3" fill="${s.colour}"/>` : ""}</svg>${escapeXml(s.name)}</li>`)
    .join("")}</ul>`;
}

function warningCounts(warnings: readonly Warning[]): string {
  if (warnings.length === 0) return `<p class="counts">No warnings.</p>`;
  const by = SEVERITY_ORDER.map((s) => [s, warnings.filter((w) => w.severity === s).length] as const).filter(([, n]) => n > 0);
  return `<p class="counts">${by.map(([s, n]) => `<span>${n} ${s}</span>`).join("")}<a href="#t-warnings">the list</a></p>`;
}

/**
 * The report's HTML, and the warnings raised while writing it (RESULT_NOT_FINITE; also listed in
 * its warnings table). `warnings` are the run's warnings, counted by severity under the summary.
 */
export function htmlReport(content: ReportContent, runWarnings: readonly Warning[] = []): { html: string; warnings: Warning[] } {
  const { tables, warnings } = finiteTables(content.tables);
  const method = content.method ? finiteTables(content.method).tables : [];
  const charts = resultCharts(tables);
  const [summary, ...rest] = tables;
  const out: string[] = [];
  out.push(`<!DOCTYPE html>\n<html lang="en"><head><meta charset="utf-8">`);
  out.push(`<meta http-equiv="Content-Security-Policy" content="default-src 'none'; style-src 'unsafe-inline'; img-src data:">`);
  out.push(`<meta name="viewport" content="width=device-width, initial-scale=1"><meta name="generator" content="Rheoledger">`);
  out.push(`<title>${escapeXml(content.title)}</title><style>${CSS}</style></head><body>`);
  out.push(`<header><h1>${escapeXml(content.title)}</h1><p class="subtitle">${escapeXml(content.subtitle)}</p></header>`);
  const sections: [string, string][] = [["summary", "Summary"]];
  if (charts.length > 0) sections.push(["charts", "Charts"]);
  sections.push(["tables", "Result tables"]);
  if (method.length > 0) sections.push(["method", "Method record"]);
  out.push(`<nav aria-label="Contents"><ol>${sections.map(([id, label]) => `<li><a href="#${id}">${label}</a></li>`).join("")}</ol></nav>`);
  out.push(`<section id="summary"><h2>Summary</h2>`);
  if (summary) out.push(tableHtml(summary, { heading: false }));
  out.push(warningCounts([...runWarnings, ...warnings]), `</section>`);
  if (charts.length > 0) {
    out.push(`<section id="charts"><h2>Charts</h2><div class="charts">`);
    for (const c of charts) {
      out.push(`<figure><figcaption>${escapeXml(c.title)}${c.note ? ` <span class="note">(${escapeXml(c.note)})</span>` : ""}</figcaption>${plotSvg(c, REPORT_PLOT_SIZE)}${legendHtml(c.series.filter((s) => s.inLegend))}</figure>`);
    }
    out.push(`</div></section>`);
  }
  out.push(`<section id="tables"><h2>Result tables</h2>`);
  for (const t of rest) out.push(tableHtml(t, { heading: true }));
  out.push(`</section>`);
  if (method.length > 0) {
    out.push(`<section id="method"><h2>Method record</h2>`);
    for (const t of method) out.push(tableHtml(t, { heading: true }));
    out.push(`</section>`);
  }
  out.push(`</body></html>\n`);
  return { html: out.join("\n"), warnings };
}
