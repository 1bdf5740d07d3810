/**
 * Applies a sheet plan to the workbook with Office.js: new, uniquely named sheets only (existing
 * sheets and cells are never written), cell blocks with their formats, native XY charts. On any
 * failure the sheets created by the run are deleted in a fresh batch, so no half-written sheet
 * stays behind. Needs ExcelApi 1.7 (chart series, log axes; conditional formats need 1.6).
 */
import { CellBlock, ChartSpec, SheetPlan, WorkbookPlan, a1, blockGrid, blockLayout, columnLetters, conditionalFormatAddress, seriesAddresses } from "./sheetPlan";

/** Runs one batch against the workbook: `Excel.run` in the pane, a fake in tests. */
export type ExcelBatch = <T>(batch: (context: Excel.RequestContext) => Promise<T>) => Promise<T>;

/** Base names of the sheets a run creates ("Rheo results", "Rheo results 2", ...). */
export const SHEET_BASE_NAMES = Object.freeze({ results: "Rheo results", method: "Rheo method", plan: "Rheo plan", lot: "Rheo lot check" });

/** Excel's limit on sheet names. */
const MAX_SHEET_NAME = 31;

/** Our look in the workbook: deep teal headings, pale teal header rows. */
export const SHEET_STYLE = Object.freeze({ heading: "#0B4F4C", headerFill: "#DCEFEC", headerFont: "#0B3B39", chartDataFont: "#5A6B6A" });

/** Approximate points per character of column width (Calibri 11). */
const POINTS_PER_CHAR = 6.2;

/**
 * The first of `base`, `base 2`, `base 3`, ... not among `existing` (case-insensitive, as Excel
 * compares sheet names), cut to Excel's 31 characters.
 * @example uniqueSheetName("Rheo results", ["Rheo results"]) // "Rheo results 2"
 */
export function uniqueSheetName(base: string, existing: readonly string[]): string {
  const taken = new Set(existing.map((n) => n.toLowerCase()));
  for (let k = 1; ; k++) {
    const suffix = k === 1 ? "" : ` ${k}`;
    const name = base.slice(0, MAX_SHEET_NAME - suffix.length) + suffix;
    if (!taken.has(name.toLowerCase())) return name;
  }
}

/** Result and method sheet names sharing one number, both new. */
export function pairedSheetNames(existing: readonly string[]): { results: string; method: string } {
  const taken = new Set(existing.map((n) => n.toLowerCase()));
  for (let k = 1; ; k++) {
    const suffix = k === 1 ? "" : ` ${k}`;
    const results = SHEET_BASE_NAMES.results + suffix;
    const method = SHEET_BASE_NAMES.method + suffix;
    if (!taken.has(results.toLowerCase()) && !taken.has(method.toLowerCase())) return { results, method };
  }
}

function writeBlock(sheet: Excel.Worksheet, block: CellBlock): void {
  const grid = blockGrid(block).map((r) => r.map((v) => (v === null ? "" : v)));
  const lay = blockLayout(block);
  if (grid.length === 0 || lay.width === 0) return;
  const range = sheet.getRange(a1(block.row, block.col, grid.length, lay.width));
  range.values = grid;
  if (lay.titleRow !== null) {
    const title = sheet.getRange(a1(lay.titleRow, block.col));
    title.format.font.bold = true;
    title.format.font.color = SHEET_STYLE.heading;
    if (block.role === "heading") title.format.font.size = 13;
  }
  if (lay.headerRow !== null) {
    const header = sheet.getRange(a1(lay.headerRow, block.col, 1, lay.width));
    header.format.font.bold = true;
    header.format.font.color = SHEET_STYLE.headerFont;
    header.format.fill.color = SHEET_STYLE.headerFill;
    header.format.wrapText = true;
  }
  if (block.rows.length > 0 && block.numberFormats) {
    const formats = block.rows.map(() => Array.from({ length: lay.width }, (_, c) => block.numberFormats?.[c] ?? "General"));
    sheet.getRange(a1(lay.firstDataRow, block.col, block.rows.length, lay.width)).numberFormat = formats;
  }
  if (block.role === "chartData") sheet.getRange(a1(lay.firstDataRow, block.col, block.rows.length, lay.width)).format.font.color = SHEET_STYLE.chartDataFont;
}

/** Writes a sheet plan's cells and column widths into `sheet`. */
export function writeSheetCells(sheet: Excel.Worksheet, plan: SheetPlan): void {
  plan.columnWidths.forEach((chars, c) => {
    const L = columnLetters(c);
    sheet.getRange(`${L}:${L}`).format.columnWidth = chars * POINTS_PER_CHAR;
  });
  for (const block of plan.blocks) writeBlock(sheet, block);
  for (const cf of plan.conditionalFormats ?? []) {
    if (cf.rowCount === 0) continue;
    const range = sheet.getRange(conditionalFormatAddress(plan, cf));
    for (const rule of cf.rules) {
      const format = range.conditionalFormats.add("ContainsText");
      format.textComparison.format.fill.color = rule.fill;
      format.textComparison.format.font.color = rule.font;
      format.textComparison.format.font.bold = true;
      format.textComparison.rule = { operator: "Contains", text: rule.text };
    }
  }
}

/** Adds one native XY chart of the plan to `sheet`. */
export function addChart(sheet: Excel.Worksheet, plan: SheetPlan, spec: ChartSpec): Excel.Chart {
  const first = spec.series[0];
  if (!first) throw new Error(`chart "${spec.title}" has no series`);
  const firstAddr = seriesAddresses(plan, first);
  const chart = sheet.charts.add("XYScatter", sheet.getRange(firstAddr.y), "Columns");
  chart.name = `Rheo ${spec.id}`;
  chart.title.text = spec.title;
  chart.title.format.font.size = 11;
  chart.legend.position = "Bottom";
  chart.legend.visible = !spec.id.startsWith("bagley");
  const x = chart.axes.categoryAxis;
  const y = chart.axes.valueAxis;
  x.title.text = spec.xTitle;
  y.title.text = spec.yTitle;
  if (spec.xLog) x.logBase = 10;
  if (spec.yLog) y.logBase = 10;
  if (spec.xMin !== undefined) x.minimum = spec.xMin;
  if (spec.yMin !== undefined) y.minimum = spec.yMin;
  spec.series.forEach((s, i) => {
    const addr = i === 0 ? firstAddr : seriesAddresses(plan, s);
    const series = i === 0 ? chart.series.getItemAt(0) : chart.series.add(s.name);
    series.name = s.name;
    series.setXAxisValues(sheet.getRange(addr.x));
    series.setValues(sheet.getRange(addr.y));
    if (s.style === "markers") {
      series.chartType = "XYScatter";
      series.markerStyle = "Circle";
      series.markerSize = 5;
      series.markerBackgroundColor = s.colour;
      series.markerForegroundColor = s.colour;
      series.format.line.lineStyle = "None";
    } else {
      series.chartType = "XYScatterLinesNoMarkers";
      series.format.line.color = s.colour;
      series.format.line.lineStyle = s.style === "dashed" ? "Dash" : "Continuous";
    }
  });
  const a = spec.anchor;
  chart.setPosition(a1(a.row, a.col), a1(a.row + a.rows - 1, a.col + a.cols - 1));
  return chart;
}

/** Deletes the named sheets if they exist, in a batch of its own. */
export async function deleteSheets(run: ExcelBatch, names: readonly string[]): Promise<void> {
  if (names.length === 0) return;
  await run(async (context) => {
    const found = names.map((n) => {
      const s = context.workbook.worksheets.getItemOrNullObject(n);
      s.load("name");
      return s;
    });
    await context.sync();
    for (const s of found) if (!s.isNullObject) s.delete();
    await context.sync();
  });
}

/** Progress of the writer, as for a run. */
export type WriteProgress = (step: string, fraction: number) => void;

/**
 * Creates the results and method sheets (new names: "Rheo results", "Rheo results 2", ... and the
 * method sheet with the same number), writes the plan built for those names, adds the charts,
 * and activates the results sheet. On failure deletes what it created and rethrows.
 * @returns the names of the sheets written
 */
export async function writeWorkbookPlan(
  run: ExcelBatch,
  makePlan: (names: { results: string; method: string }) => WorkbookPlan,
  onProgress: WriteProgress = () => undefined,
): Promise<{ results: string; method: string }> {
  const created: string[] = [];
  try {
    return await run(async (context) => {
      const sheets = context.workbook.worksheets;
      sheets.load("items/name");
      await context.sync();
      const names = pairedSheetNames(sheets.items.map((s) => s.name));
      const plan = makePlan(names);
      onProgress("Writing the tables", 0.92);
      created.push(names.results, names.method);
      const results = sheets.add(names.results);
      const method = sheets.add(names.method);
      writeSheetCells(results, plan.results);
      writeSheetCells(method, plan.method);
      await context.sync();
      onProgress("Adding the charts", 0.96);
      for (const spec of plan.results.charts) addChart(results, plan.results, spec);
      await context.sync();
      results.activate();
      results.getRange("A1").select();
      await context.sync();
      return names;
    });
  } catch (error) {
    return removeCreatedAndRethrow(run, created, error);
  }
}

/**
 * After a failed write: deletes the sheets it `created` (in a batch of their own) and rethrows
 * `error`; when the deletion fails too, throws one error naming both and the sheets left behind.
 */
async function removeCreatedAndRethrow(run: ExcelBatch, created: readonly string[], error: unknown): Promise<never> {
  const [noun, pronoun] = created.length === 1 ? ["sheet", "it"] : ["sheets", "them"];
  try {
    await deleteSheets(run, created);
  } catch (cleanup) {
    throw new Error(`${error instanceof Error ? error.message : String(error)} (and the new ${noun} ${created.join(", ")} could not be removed: ${cleanup instanceof Error ? cleanup.message : String(cleanup)}; delete ${pronoun} by hand)`);
  }
  throw error;
}

/**
 * Creates one new sheet named `base` (or `base 2`, ... when taken), writes the plan built for that
 * name with its conditional formats and charts, and activates it. On failure deletes the sheet it
 * created, in a batch of its own, and rethrows: nothing is left half-written.
 * @returns the name of the sheet written
 */
export async function writeNewSheet(run: ExcelBatch, base: string, makePlan: (name: string) => SheetPlan, onProgress: WriteProgress = () => undefined): Promise<string> {
  const created: string[] = [];
  try {
    return await run(async (context) => {
      const sheets = context.workbook.worksheets;
      sheets.load("items/name");
      await context.sync();
      const name = uniqueSheetName(base, sheets.items.map((s) => s.name));
      const plan = makePlan(name);
      onProgress("Writing the tables", 0.92);
      created.push(name);
      const sheet = sheets.add(name);
      writeSheetCells(sheet, plan);
      await context.sync();
      if (plan.charts.length > 0) {
        onProgress("Adding the chart", 0.96);
        for (const spec of plan.charts) addChart(sheet, plan, spec);
        await context.sync();
      }
      sheet.activate();
      sheet.getRange("A1").select();
      await context.sync();
      return name;
    });
  } catch (error) {
    return removeCreatedAndRethrow(run, created, error);
  }
}
