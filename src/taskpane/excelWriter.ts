/**
 * Applies a sheet plan to the workbook with Office.js: new, uniquely named sheets only (existing
 * sheets and cells are never written), cell blocks with their formats, native XY charts. On any
 * failure the sheets created by the run are deleted in a fresh batch, so no half-written sheet
 * stays behind. Needs ExcelApi 1.7 (chart series, log axes; conditional formats need 1.6).
 */
import { headerLabel } from "../io/displayNames";
import { CellBlock, ChartSpec, SheetPlan, WorkbookPlan, a1, blockGrid, blockLayout, columnLetters, conditionalFormatAddress, seriesAddresses } from "./sheetPlan";

/** Runs one batch against the workbook: `Excel.run` in the pane, a fake in tests. */
export type ExcelBatch = <T>(batch: (context: Excel.RequestContext) => Promise<T>) => Promise<T>;

/**
 * Base names of the sheets the pane's runs create ("Rheo results", "Rheo results 2", ...). Each
 * panel lists its own in its `sheets` (src/taskpane/panels/); these are the reduction's, the
 * planner's and the lot check's, kept here for the writer's tests and the pair below.
 */
export const SHEET_BASE_NAMES = Object.freeze({ results: "Rheo results", method: "Rheo method", plan: "Rheo plan", lot: "Rheo lot check", steps: "Rheo steps", traceCurve: "Rheo trace curve" });

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

/** Names for `bases` sharing one number ("X", "Y"; "X 2", "Y 2"; ...), all new, each cut to 31 characters. */
export function numberedSheetNames(bases: readonly string[], existing: readonly string[]): string[] {
  const taken = new Set(existing.map((n) => n.toLowerCase()));
  for (let k = 1; ; k++) {
    const suffix = k === 1 ? "" : ` ${k}`;
    const names = bases.map((b) => b.slice(0, MAX_SHEET_NAME - suffix.length) + suffix);
    if (names.every((n) => !taken.has(n.toLowerCase()))) return names;
  }
}

/** Result and method sheet names sharing one number, both new. */
export function pairedSheetNames(existing: readonly string[]): { results: string; method: string } {
  const [results, method] = numberedSheetNames([SHEET_BASE_NAMES.results, SHEET_BASE_NAMES.method], existing) as [string, string];
  return { results, method };
}

/** Excel's number format "Text": a cell in it keeps what is written as text, never a formula. */
export const TEXT_FORMAT = "@";

/**
 * The number format of each cell of a block's grid: every text cell (titles, headers, labels,
 * whatever came from the user or from a file) is "Text", so that a label such as `=HYPERLINK(…)`,
 * `-L20`, `+5`, `@P50` or one starting with a tab or carriage return stays the text it was and
 * never becomes a formula; numbers get their column's format (General when none).
 */
export function cellFormats(block: CellBlock): string[][] {
  const lay = blockLayout(block);
  const grid = blockGrid(block);
  return grid.map((row, r) =>
    row.map((v, c) => {
      if (typeof v === "string") return TEXT_FORMAT;
      const dataRow = r - (lay.firstDataRow - block.row);
      return dataRow >= 0 ? (block.numberFormats?.[c] ?? "General") : "General";
    }),
  );
}

function writeBlock(sheet: Excel.Worksheet, block: CellBlock): void {
  const grid = blockGrid(block).map((r) => r.map((v) => (v === null ? "" : v)));
  const lay = blockLayout(block);
  if (grid.length === 0 || lay.width === 0) return;
  const range = sheet.getRange(a1(block.row, block.col, grid.length, lay.width));
  // formats first: a text cell must be "Text" before its value arrives
  range.numberFormat = cellFormats(block);
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
  x.title.text = headerLabel(spec.xTitle);
  y.title.text = headerLabel(spec.yTitle);
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
      series.markerStyle = s.marker === "square" ? "Square" : s.marker === "diamond" ? "Diamond" : s.marker === "triangle" ? "Triangle" : "Circle";
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
 * The one way the pane writes: creates one new sheet per base name (numbered together: "Rheo
 * results 2" with "Rheo method 2"), writes the plans built for those names with their
 * conditional formats and charts, and activates the first. On any failure deletes the sheets it
 * created, in a batch of its own, and rethrows: nothing is left half-written.
 * @returns the names of the sheets written, in the order of `bases`
 */
export async function writeSheets(run: ExcelBatch, bases: readonly string[], makePlans: (names: readonly string[]) => SheetPlan[], onProgress: WriteProgress = () => undefined): Promise<string[]> {
  const created: string[] = [];
  try {
    return await run(async (context) => {
      const sheets = context.workbook.worksheets;
      sheets.load("items/name");
      await context.sync();
      const names = numberedSheetNames(bases, sheets.items.map((s) => s.name));
      const plans = makePlans(names);
      if (plans.length !== names.length) throw new Error(`writer: ${plans.length} sheet plan(s) for ${names.length} sheet name(s)`);
      onProgress("Writing the tables", 0.92);
      created.push(...names);
      const added = names.map((n) => sheets.add(n));
      plans.forEach((plan, i) => writeSheetCells(added[i] as Excel.Worksheet, plan));
      await context.sync();
      if (plans.some((p) => p.charts.length > 0)) {
        onProgress("Adding the charts", 0.96);
        plans.forEach((plan, i) => {
          for (const spec of plan.charts) addChart(added[i] as Excel.Worksheet, plan, spec);
        });
        await context.sync();
      }
      const first = added[0] as Excel.Worksheet;
      first.activate();
      first.getRange("A1").select();
      await context.sync();
      return names;
    });
  } catch (error) {
    return removeCreatedAndRethrow(run, created, error);
  }
}

/** The results and method sheets of a reduction ({@link writeSheets} with their two base names). */
export async function writeWorkbookPlan(
  run: ExcelBatch,
  makePlan: (names: { results: string; method: string }) => WorkbookPlan,
  onProgress: WriteProgress = () => undefined,
): Promise<{ results: string; method: string }> {
  const [results, method] = (await writeSheets(run, [SHEET_BASE_NAMES.results, SHEET_BASE_NAMES.method], ([r, m]) => {
    const plan = makePlan({ results: r as string, method: m as string });
    return [plan.results, plan.method];
  }, onProgress)) as [string, string];
  return { results, method };
}

/** One new sheet named `base` (or `base 2`, ...): {@link writeSheets} with one base name. */
export async function writeNewSheet(run: ExcelBatch, base: string, makePlan: (name: string) => SheetPlan, onProgress: WriteProgress = () => undefined): Promise<string> {
  const [name] = await writeSheets(run, [base], ([n]) => [makePlan(n as string)], onProgress);
  return name as string;
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

