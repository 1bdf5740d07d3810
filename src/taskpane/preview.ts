/**
 * Renders a sheet plan as HTML (tables, small SVG charts): the pane shows it in preview mode
 * (outside Office) and as a quick look after a run. Pure: returns markup with every text escaped.
 */
import { headerLabel } from "../io/displayNames";
import { chartSvg, escapeXml, markerSvg } from "./svgChart";
import { CellBlock, CellValue, ChartSpec, ConditionalFormatSpec, SheetPlan, blockLayout, matchingRule } from "./sheetPlan";

/** A cell as shown in the preview: numbers to 4 significant digits, exponent outside 1e-3…1e6. */
export function formatCell(v: CellValue): string {
  if (v === null) return "";
  if (typeof v === "boolean") return v ? "TRUE" : "FALSE";
  if (typeof v === "string") return v;
  if (!Number.isFinite(v)) return String(v);
  if (Number.isInteger(v) && Math.abs(v) < 1e6) return String(v);
  const a = Math.abs(v);
  if (a !== 0 && (a >= 1e6 || a < 1e-3)) return v.toExponential(3);
  return Number(v.toPrecision(4)).toString();
}

/** The tone class of a cell under the plan's conditional formats (what Excel would colour). */
function toneOf(formats: readonly ConditionalFormatSpec[], block: CellBlock, row: number, col: number, v: CellValue): string | null {
  for (const cf of formats) {
    if (cf.blockId !== block.id || cf.column !== col || row < cf.firstRow || row >= cf.firstRow + cf.rowCount) continue;
    const rule = matchingRule(cf, v);
    if (rule) return rule.tone;
  }
  return null;
}

/**
 * A table block as HTML. Columns outside the block's `keyColumns` carry the class `col-more`:
 * a narrow pane hides them (CSS) until the table's "All columns" button is pressed, so the key
 * columns fit without sideways scrolling; the sheet always has every column.
 */
export function tableHtml(block: CellBlock, formats: readonly ConditionalFormatSpec[] = []): string {
  const lay = blockLayout(block);
  const keys = block.keyColumns && block.keyColumns.length < lay.width ? new Set(block.keyColumns) : null;
  const colClass = (c: number) => (keys === null ? [] : keys.has(c) ? ["col-key"] : ["col-more"]);
  const head = block.header
    ? `<thead><tr>${block.header.map((h, c) => `<th scope="col"${colClass(c).length > 0 ? ` class="${colClass(c).join(" ")}"` : ""}>${escapeXml(headerLabel(h))}</th>`).join("")}</tr></thead>`
    : "";
  const body = block.rows
    .map((r, i) => `<tr>${Array.from({ length: lay.width }, (_, c) => {
      const v = r[c] ?? null;
      const classes = [typeof v === "number" ? "num" : "", ...colClass(c), ...[toneOf(formats, block, i, c, v)].filter((t) => t !== null).map((t) => `flag flag-${t}`)].filter((x) => x !== "");
      return `<td${classes.length > 0 ? ` class="${classes.join(" ")}"` : ""}>${escapeXml(formatCell(v))}</td>`;
    }).join("")}</tr>`)
    .join("");
  const caption = block.title !== undefined ? `<caption>${escapeXml(block.title)}</caption>` : "";
  const id = escapeXml(block.id);
  const toggle = keys === null ? "" : `<button type="button" class="link all-columns" data-table="${id}" aria-pressed="false">All ${lay.width} columns</button>`;
  return `<div class="table-wrap${keys === null ? "" : " narrowable"}" tabindex="0" role="region" aria-label="${escapeXml(block.title ?? block.id)}">${toggle}<table data-block="${id}">${caption}${head}<tbody>${body}</tbody></table></div>`;
}

const SHEET_TITLES = ["title", "method-title", "plan-title", "lot-title"];

function blockHtml(block: CellBlock, formats: readonly ConditionalFormatSpec[]): string {
  if (block.role === "heading") {
    return SHEET_TITLES.includes(block.id) ? "" : `<h4 class="group-heading" data-block="${escapeXml(block.id)}">${escapeXml(block.title ?? "")}</h4>`;
  }
  if (block.role === "text") return `<p class="stamp" data-block="${escapeXml(block.id)}">${escapeXml(String(block.rows[0]?.[0] ?? ""))}</p>`;
  return tableHtml(block, formats);
}

/** One chart of a plan as a figure: caption, SVG and a legend of its series. */
export function chartFigureHtml(plan: SheetPlan, c: ChartSpec): string {
  const legend = c.id.startsWith("bagley")
    ? `<p class="legend-note">One colour per apparent shear rate: measured points and the fitted line, drawn back to zero pressure.</p>`
    : `<ul class="legend">${c.series.map((s) => `<li><svg class="swatch" viewBox="0 0 14 8" aria-hidden="true"><line x1="0" y1="4" x2="14" y2="4" stroke="${s.colour}" stroke-width="${s.style === "markers" ? 0 : 2}"${s.style === "dashed" ? ` stroke-dasharray="4 2"` : ""}/>${s.style === "markers" ? `<g fill="${s.colour}">${markerSvg(s.marker ?? "circle", 7, 4)}</g>` : ""}</svg>${escapeXml(s.name)}</li>`).join("")}</ul>`;
  return `<figure class="chart-figure" data-figure="${escapeXml(c.id)}"><figcaption>${escapeXml(c.title)}</figcaption>${chartSvg(plan, c)}${legend}</figure>`;
}

/**
 * The markup of a sheet plan: tables in sheet order, the charts (each with a legend of its
 * series), and the chart data folded away at the end.
 */
export function sheetPlanHtml(plan: SheetPlan): string {
  const main = plan.blocks.filter((b) => b.role !== "chartData" && b.id !== "chartdata-title");
  const data = plan.blocks.filter((b) => b.role === "chartData");
  const out: string[] = [`<h3 class="sheet-name">Sheet “${escapeXml(plan.name)}”</h3>`];
  out.push(...main.map((b) => blockHtml(b, plan.conditionalFormats ?? [])));
  if (plan.charts.length > 0) out.push(`<div class="charts">${plan.charts.map((c) => chartFigureHtml(plan, c)).join("")}</div>`);
  if (data.length > 0) out.push(`<details class="chart-data"><summary>Chart data</summary>${data.map((b) => tableHtml(b)).join("")}</details>`);
  return out.join("");
}
