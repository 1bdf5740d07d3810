/**
 * The results workbook (xlsx), rendered from result tables (resultTables.ts) so that every table a
 * run produces appears without this module knowing it:
 *   - one sheet per table id (the tables of several groups stacked, with a "Group" column): a
 *     title row, one header row "Label [unit]" (frozen, with a filter), the rows, then the notes;
 *   - every number stored at full precision and shown with its column's significant figures;
 *     text written as text (never a formula), columns fitted to their contents;
 *   - a "Charts" sheet (second) with native XY charts reading the table sheets (xlsxCharts.ts);
 *   - a "Method" sheet (last) with the method record's tables stacked (methodRecord.ts).
 * No cell holds NaN or Infinity (finiteTables.ts). Written with exceljs, a Node-only dependency:
 * only the command line imports this module, lazily (never src/functions or src/taskpane).
 */
import ExcelJS from "exceljs";
import type { Warning } from "../core/errors";
import { xmlSafeText } from "./cellText";

import { finiteTables } from "./finiteTables";
import { DEFAULT_DIGITS, excelNumberFormat, formatSignificant } from "./numberFormat";
import { resultCharts, type ResultChart } from "./resultCharts";
import { headerWithUnit, type ResultCell, type ResultColumn, type ResultTable } from "./resultTables";
import { addChartsToXlsx, sheetRange, type XlsxChart } from "./xlsxCharts";

/** What goes into the workbook. */
export interface WorkbookContent {
  /** the run's result tables, in order (the first one's sheet opens first) */
  tables: readonly ResultTable[];
  /** the method record's tables (stacked on the Method sheet); none: no Method sheet */
  method?: readonly ResultTable[];
  /** written into the file's properties */
  title?: string;
  /** the file's creation date (default: now) */
  created?: Date;
}

/** Fixed sheet names. */
export const WORKBOOK_SHEETS = Object.freeze({ charts: "Charts", chartData: "Chart data", method: "Method" });


const GROUP_COLUMN: ResultColumn = { key: "group", header: "Group", unit: "", kind: "text" };
const TITLE_FONT = { bold: true, size: 13 };
const HEADER_FILL: ExcelJS.Fill = { type: "pattern", pattern: "solid", fgColor: { argb: "FFE8F1F0" } };
const INPUT_FILL: ExcelJS.Fill = { type: "pattern", pattern: "solid", fgColor: { argb: "FFFFF4CC" } };
const SEVERITY_FILL: Record<string, ExcelJS.Fill> = {
  serious: { type: "pattern", pattern: "solid", fgColor: { argb: "FFF8D7D3" } },
  caution: { type: "pattern", pattern: "solid", fgColor: { argb: "FFFCEBC8" } },
};

/** A sheet name Excel accepts (≤ 31 characters, none of []:*?/\), unique among `taken`. */
export function sheetName(title: string, taken: Set<string>): string {
  const base = (xmlSafeText(title).split(" (")[0] as string).replace(/: /g, ", ").replace(/[[\]:*?/\\]/g, "-").replace(/^'+|'+$/g, "").trim().slice(0, 31) || "Sheet";
  let name = base;
  for (let k = 2; [...taken].some((t) => t.toLowerCase() === name.toLowerCase()); k++) name = `${base.slice(0, 31 - String(k).length - 1)} ${k}`;
  taken.add(name);
  return name;
}

/** Where a table's rows landed: sheet, 0-based first data row, the sheet column of each table column. */
interface Placement {
  sheet: string;
  firstRow: number;
  columns: number[];
}

/** The text width of a cell as shown. */
function shownLength(v: ResultCell, column: ResultColumn): number {
  if (v === null) return 0;
  if (typeof v === "number") return formatSignificant(v, column.digits ?? DEFAULT_DIGITS).length;
  if (typeof v === "boolean") return 5;
  return Math.max(...String(v).split("\n").map((l) => l.length));
}

/** Writes one cell: numbers with a significant-figure format, text as text (format "@"), booleans as booleans. */
function writeCell(cell: ExcelJS.Cell, v: ResultCell, column: ResultColumn): void {
  if (v === null) return;
  if (typeof v === "number") {
    cell.value = v;
    cell.numFmt = excelNumberFormat(v, column.digits ?? DEFAULT_DIGITS);
  } else if (typeof v === "boolean") cell.value = v;
  else {
    // a string value is stored as a string cell (t="s"): exceljs writes formulas only for {formula} objects
    cell.value = xmlSafeText(v);
    cell.numFmt = "@";
  }
}

function writeHeader(ws: ExcelJS.Worksheet, row: number, columns: readonly ResultColumn[]): void {
  columns.forEach((c, j) => {
    const cell = ws.getCell(row + 1, j + 1);
    cell.value = xmlSafeText(headerWithUnit(c));
    cell.font = { bold: true };
    cell.fill = HEADER_FILL;
    cell.border = { bottom: { style: "thin", color: { argb: "FF7F9C99" } } };
    cell.alignment = { vertical: "bottom", wrapText: true };
  });
}

/** Column widths (characters) from the header and every shown value, within [min, max]. */
function fitWidths(ws: ExcelJS.Worksheet, widths: number[], min: number, max: number): void {
  widths.forEach((w, j) => (ws.getColumn(j + 1).width = Math.min(max, Math.max(min, w + 2))));
}

/** One data sheet: the tables of one id, stacked. Returns where each table's rows landed. */
function dataSheet(wb: ExcelJS.Workbook, name: string, tables: readonly ResultTable[]): Placement[] {
  const ws = wb.addWorksheet(name, { views: [{ state: "frozen", ySplit: 2, activeCell: "A3" }] });
  const grouped = tables.length > 1 || tables.some((t) => t.scope !== undefined);
  // the union of the tables' columns, by key, in first-seen order
  const columns: ResultColumn[] = grouped ? [GROUP_COLUMN] : [];
  for (const t of tables) for (const c of t.columns) if (!columns.some((x) => x.key === c.key && x !== GROUP_COLUMN)) columns.push(c);
  const first = tables[0] as ResultTable;
  const title = ws.getCell(1, 1);
  title.value = xmlSafeText(grouped || !first.scope ? first.title : `${first.title}, ${first.scope}`);
  title.font = TITLE_FONT;
  writeHeader(ws, 1, columns);
  const widths = columns.map((c) => Math.min(24, headerWithUnit(c).length));
  let row = 2;
  const placements: Placement[] = [];
  for (const t of tables) {
    const at = t.columns.map((c) => columns.findIndex((x) => x.key === c.key && x !== GROUP_COLUMN));
    placements.push({ sheet: name, firstRow: row, columns: at });
    for (const values of t.rows) {
      if (grouped) {
        writeCell(ws.getCell(row + 1, 1), t.scope ?? "", GROUP_COLUMN);
        widths[0] = Math.max(widths[0] as number, (t.scope ?? "").length);
      }
      t.columns.forEach((c, j) => {
        const col = at[j] as number;
        const v = values[j] ?? null;
        writeCell(ws.getCell(row + 1, col + 1), v, c);
        widths[col] = Math.max(widths[col] as number, shownLength(v, c));
        if (c.key === "severity" && typeof v === "string" && SEVERITY_FILL[v]) ws.getCell(row + 1, col + 1).fill = SEVERITY_FILL[v] as ExcelJS.Fill;
      });
      row++;
    }
  }
  ws.autoFilter = { from: { row: 2, column: 1 }, to: { row: 2, column: columns.length } };
  const notes = [...new Set(tables.flatMap((t) => (t.notes ?? []).map((n) => (grouped && t.scope ? `${t.scope}: ${n}` : n))))];
  if (notes.length > 0) {
    row++;
    for (const n of notes) {
      const cell = ws.getCell(++row, 1);
      cell.value = xmlSafeText(`Note: ${n}`);
      cell.font = { italic: true };
    }
  }
  fitWidths(ws, widths, 8, 50);
  ws.pageSetup = { orientation: "landscape", fitToPage: true, fitToWidth: 1, fitToHeight: 0, printTitlesRow: "2:2" };
  return placements;
}

/** The Method sheet: each table as a block (title, header, rows, notes) with a blank row between. */
function methodSheet(wb: ExcelJS.Workbook, tables: readonly ResultTable[]): void {
  const ws = wb.addWorksheet(WORKBOOK_SHEETS.method);
  const widths: number[] = [];
  let row = 0;
  for (const t of tables) {
    const title = ws.getCell(++row, 1);
    title.value = xmlSafeText(t.scope ? `${t.title}, ${t.scope}` : t.title);
    title.font = TITLE_FONT;
    writeHeader(ws, row, t.columns);
    row++;
    t.columns.forEach((c, j) => (widths[j] = Math.max(widths[j] ?? 0, headerWithUnit(c).length)));
    for (const values of t.rows) {
      row++;
      t.columns.forEach((c, j) => {
        const v = values[j] ?? null;
        const cell = ws.getCell(row, j + 1);
        writeCell(cell, v, c);
        cell.alignment = { vertical: "top", wrapText: true };
        widths[j] = Math.max(widths[j] ?? 0, shownLength(v, c));
        if (t.id === "reportItems" && c.key === "value" && v === null) cell.fill = INPUT_FILL;
        if (c.key === "severity" && typeof v === "string" && SEVERITY_FILL[v]) cell.fill = SEVERITY_FILL[v] as ExcelJS.Fill;
      });
    }
    for (const n of t.notes ?? []) {
      const cell = ws.getCell(++row, 1);
      cell.value = xmlSafeText(`Note: ${n}`);
      cell.font = { italic: true };
    }
    row++;
  }
  fitWidths(ws, widths, 10, 80);
  ws.pageSetup = { orientation: "portrait", fitToPage: true, fitToWidth: 1, fitToHeight: 0 };
}

/** Columns of a chart on the Charts sheet, rows of it, and charts per row. */
const CHART_SIZE = { cols: 9, rows: 20, perRow: 2, top: 3 };

/**
 * The series ranges of the charts: a series whose rows are consecutive on its table's sheet reads
 * them there; any other is copied to the "Chart data" sheet (x and y side by side) and read there.
 */
function placeCharts(wb: ExcelJS.Workbook, charts: readonly ResultChart[], tables: readonly ResultTable[], placements: readonly Placement[]): XlsxChart[] {
  let dataSheetWs: ExcelJS.Worksheet | null = null;
  let dataCol = 0;
  const copied = (name: string, xs: (number | null)[], ys: (number | null)[], xTitle: string, yTitle: string) => {
    dataSheetWs ??= wb.addWorksheet(WORKBOOK_SHEETS.chartData, { views: [{ state: "frozen", ySplit: 2 }] });
    const ws = dataSheetWs;
    ws.getCell(1, dataCol + 1).value = xmlSafeText(name);
    ws.getCell(1, dataCol + 1).font = { bold: true };
    ws.getCell(2, dataCol + 1).value = xmlSafeText(xTitle);
    ws.getCell(2, dataCol + 2).value = xmlSafeText(yTitle);
    xs.forEach((x, i) => {
      if (x !== null) ws.getCell(3 + i, dataCol + 1).value = x;
      const y = ys[i];
      if (y !== null && y !== undefined) ws.getCell(3 + i, dataCol + 2).value = y;
    });
    ws.getColumn(dataCol + 1).width = Math.max(14, Math.min(40, xTitle.length + 2));
    ws.getColumn(dataCol + 2).width = Math.max(14, Math.min(40, yTitle.length + 2));
    const refs = { x: sheetRange(WORKBOOK_SHEETS.chartData, dataCol, 2, 2 + xs.length - 1), y: sheetRange(WORKBOOK_SHEETS.chartData, dataCol + 1, 2, 2 + ys.length - 1) };
    dataCol += 3;
    return refs;
  };
  return charts.map((chart, k) => {
    const series = chart.series.map((s) => {
      const t = tables[s.source.table] as ResultTable;
      const p = placements[s.source.table] as Placement;
      const num = (v: ResultCell | undefined): number | null => (typeof v === "number" && Number.isFinite(v) ? v : null);
      const xs = s.source.rows.map((r) => num(t.rows[r]?.[s.source.x]));
      const ys = s.source.rows.map((r) => num(t.rows[r]?.[s.source.y]));
      const rows = s.source.rows;
      const consecutive = rows.every((r, i) => i === 0 || r === (rows[i - 1] as number) + 1);
      const refs = consecutive
        ? {
            x: sheetRange(p.sheet, p.columns[s.source.x] as number, p.firstRow + (rows[0] as number), p.firstRow + (rows[rows.length - 1] as number)),
            y: sheetRange(p.sheet, p.columns[s.source.y] as number, p.firstRow + (rows[0] as number), p.firstRow + (rows[rows.length - 1] as number)),
          }
        : copied(`${chart.title}: ${s.name}`, xs, ys, chart.xTitle, chart.yTitle);
      return { name: s.name, style: s.style, colour: s.colour, inLegend: s.inLegend, x: { ref: refs.x, values: xs }, y: { ref: refs.y, values: ys } };
    });
    const anchor = { col: (k % CHART_SIZE.perRow) * (CHART_SIZE.cols + 1), row: CHART_SIZE.top + Math.floor(k / CHART_SIZE.perRow) * (CHART_SIZE.rows + 2), cols: CHART_SIZE.cols, rows: CHART_SIZE.rows };
    const xlsx: XlsxChart = { title: chart.title, xTitle: chart.xTitle, yTitle: chart.yTitle, xLog: chart.xLog, yLog: chart.yLog, description: `${chart.title}: ${chart.yTitle} against ${chart.xTitle}${chart.note ? ` (${chart.note})` : ""}`, series, anchor };
    if (chart.xMin !== undefined) xlsx.xMin = chart.xMin;
    if (chart.yMin !== undefined) xlsx.yMin = chart.yMin;
    return xlsx;
  });
}

/**
 * The results workbook as xlsx bytes, and the warnings raised while writing it (RESULT_NOT_FINITE:
 * they are also in its warnings table).
 */
export async function resultsWorkbookBytes(content: WorkbookContent): Promise<{ bytes: Uint8Array; warnings: Warning[] }> {
  const { tables, warnings } = finiteTables(content.tables);
  const method = content.method ? finiteTables(content.method).tables : undefined;
  const wb = new ExcelJS.Workbook();
  wb.creator = "Rheoledger";
  wb.created = content.created ?? new Date();
  wb.modified = wb.created;
  if (content.title) wb.title = xmlSafeText(content.title);

  const ids = [...new Set(tables.map((t) => t.id))];
  const taken = new Set<string>(Object.values(WORKBOOK_SHEETS));
  const names = new Map(ids.map((id) => [id, sheetName((tables.find((t) => t.id === id) as ResultTable).title, taken)]));
  const charts = resultCharts(tables);
  const placements: Placement[] = new Array(tables.length);
  let chartsSheet: ExcelJS.Worksheet | null = null;
  ids.forEach((id, k) => {
    const members = tables.map((t, i) => ({ t, i })).filter(({ t }) => t.id === id);
    dataSheet(wb, names.get(id) as string, members.map((m) => m.t)).forEach((p, j) => (placements[(members[j] as { i: number }).i] = p));
    if (k === 0 && charts.length > 0) {
      chartsSheet = wb.addWorksheet(WORKBOOK_SHEETS.charts);
      chartsSheet.getCell(1, 1).value = "Charts";
      chartsSheet.getCell(1, 1).font = TITLE_FONT;
      chartsSheet.getCell(2, 1).value = "Each chart reads its points from the table sheets of this workbook; right-click a chart to edit it.";
      // a fixed scale (fit-to-page would ignore the page breaks below): two rows of charts per landscape page, A4 or Letter
      chartsSheet.pageSetup = { orientation: "landscape", scale: 60, fitToPage: false, margins: { left: 0.5, right: 0.5, top: 0.6, bottom: 0.6, header: 0.3, footer: 0.3 } };
    }
  });
  const placed = chartsSheet ? placeCharts(wb, charts, tables, placements) : [];
  // printed: two rows of charts per page, never a chart cut by a page break
  const chartRows = Math.ceil(placed.length / CHART_SIZE.perRow);
  for (let k = 2; k < chartRows; k += 2) (chartsSheet as ExcelJS.Worksheet | null)?.getRow(CHART_SIZE.top + k * (CHART_SIZE.rows + 2)).addPageBreak();
  if (method && method.length > 0) methodSheet(wb, method);

  const bytes = new Uint8Array(await wb.xlsx.writeBuffer());
  return { bytes: placed.length > 0 ? await addChartsToXlsx(bytes, WORKBOOK_SHEETS.charts, placed) : bytes, warnings };
}

