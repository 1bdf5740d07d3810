/**
 * The "sheet plan": a pure description of what a run writes — cell blocks at fixed positions,
 * chart specifications whose series point into those blocks, column widths. The Excel writer
 * applies a plan with Office.js; the preview renders the same plan as HTML tables and SVG, so
 * what the browser test checks is what Excel receives.
 */

/** A cell value as written: null leaves the cell blank. */
export type CellValue = string | number | boolean | null;

/** A rectangular block of cells: an optional title row, an optional header row, then data rows. */
export interface CellBlock {
  /** stable id, e.g. "flow-1" (tests and the preview find blocks by it) */
  id: string;
  role: "heading" | "text" | "table" | "list" | "chartData";
  /** 0-based position of the block's first row and column on the sheet */
  row: number;
  col: number;
  title?: string;
  header?: string[];
  rows: CellValue[][];
  /** Excel number format per data column (null: General) */
  numberFormats?: (string | null)[];
  /**
   * The columns a narrow pane shows (0-based): what an engineer reads first. The preview shows
   * the others on request; the sheet always has every column.
   */
  keyColumns?: number[];
}

/** One chart series: x and y columns of a block's data rows [first, first + count). */
export interface SeriesSpec {
  name: string;
  blockId: string;
  xColumn: number;
  yColumn: number;
  firstRow: number;
  rowCount: number;
  style: "markers" | "line" | "dashed";
  /** #rrggbb */
  colour: string;
  /** marker shape of a "markers" series (circle when absent) */
  marker?: "circle" | "square" | "diamond" | "triangle";
}

/** A scatter chart (every chart of the pane is an XY chart). */
export interface ChartSpec {
  id: string;
  title: string;
  xTitle: string;
  yTitle: string;
  xLog: boolean;
  yLog: boolean;
  /** axis minimum to force (the Bagley plot starts at or left of L/R = 0, pressure at 0) */
  xMin?: number;
  yMin?: number;
  series: SeriesSpec[];
  /** top-left cell (0-based) and size in cells */
  anchor: { row: number; col: number; rows: number; cols: number };
}

/**
 * A text rule of conditional formatting over one column of a block's data rows: cells whose text
 * contains `text` (case-insensitive, as Excel compares) get the fill and font colours. Excel
 * keeps the rule live; the preview applies the same test to the same cells.
 */
export interface ConditionalFormatSpec {
  blockId: string;
  column: number;
  /** data rows [firstRow, firstRow + rowCount) of the block */
  firstRow: number;
  rowCount: number;
  rules: { text: string; fill: string; font: string; tone: "pass" | "fail" | "caution" }[];
}

/** Everything written to one new sheet. */
export interface SheetPlan {
  /** the sheet's name (made unique by the writer before the plan is built) */
  name: string;
  blocks: CellBlock[];
  charts: ChartSpec[];
  /** conditional formats (pass/fail, range flags); none when absent */
  conditionalFormats?: ConditionalFormatSpec[];
  /** column widths in characters, from column A */
  columnWidths: number[];
}

/** The sheets of one run. */
export interface WorkbookPlan {
  results: SheetPlan;
  method: SheetPlan;
}

/** Row offsets of a block's parts. */
export function blockLayout(block: CellBlock): { titleRow: number | null; headerRow: number | null; firstDataRow: number; rowCount: number; width: number } {
  let r = block.row;
  const titleRow = block.title !== undefined ? r++ : null;
  const headerRow = block.header !== undefined ? r++ : null;
  const width = Math.max(block.header?.length ?? 0, ...block.rows.map((x) => x.length), block.title !== undefined ? 1 : 0);
  return { titleRow, headerRow, firstDataRow: r, rowCount: r - block.row + block.rows.length, width };
}

/** Column letters of a 0-based column index: 0 → "A", 27 → "AB". */
export function columnLetters(col: number): string {
  let n = col + 1;
  let s = "";
  while (n > 0) {
    const m = (n - 1) % 26;
    s = String.fromCharCode(65 + m) + s;
    n = Math.floor((n - 1) / 26);
  }
  return s;
}

/** A1 address of a cell or rectangle (0-based indices). */
export function a1(row: number, col: number, rows = 1, cols = 1): string {
  const start = `${columnLetters(col)}${row + 1}`;
  return rows === 1 && cols === 1 ? start : `${start}:${columnLetters(col + cols - 1)}${row + rows}`;
}

/** The block a series reads, or an error naming it. */
export function findBlock(plan: SheetPlan, id: string): CellBlock {
  const b = plan.blocks.find((x) => x.id === id);
  if (!b) throw new Error(`sheet plan: no block "${id}"`);
  return b;
}

/** A1 addresses of a series' x and y cells. */
export function seriesAddresses(plan: SheetPlan, s: SeriesSpec): { x: string; y: string } {
  const b = findBlock(plan, s.blockId);
  const first = blockLayout(b).firstDataRow + s.firstRow;
  return { x: a1(first, b.col + s.xColumn, s.rowCount, 1), y: a1(first, b.col + s.yColumn, s.rowCount, 1) };
}

/** The numbers of a series (blank or text cells skipped in pairs), as the chart will plot them. */
export function seriesPoints(plan: SheetPlan, s: SeriesSpec): { x: number; y: number }[] {
  const b = findBlock(plan, s.blockId);
  const out: { x: number; y: number }[] = [];
  for (const row of b.rows.slice(s.firstRow, s.firstRow + s.rowCount)) {
    const x = row[s.xColumn];
    const y = row[s.yColumn];
    if (typeof x === "number" && typeof y === "number") out.push({ x, y });
  }
  return out;
}

/** The cell grid of a block (title and header rows included), rectangular, null-padded. */
export function blockGrid(block: CellBlock): CellValue[][] {
  const { width } = blockLayout(block);
  const pad = (r: readonly CellValue[]) => Array.from({ length: width }, (_, i) => r[i] ?? null);
  const grid: CellValue[][] = [];
  if (block.title !== undefined) grid.push(pad([block.title]));
  if (block.header !== undefined) grid.push(pad(block.header));
  for (const r of block.rows) grid.push(pad(r));
  return grid;
}

/** A1 address of a conditional format's cells. */
export function conditionalFormatAddress(plan: SheetPlan, cf: ConditionalFormatSpec): string {
  const b = findBlock(plan, cf.blockId);
  return a1(blockLayout(b).firstDataRow + cf.firstRow, b.col + cf.column, cf.rowCount, 1);
}

/** The first rule whose text the cell contains (case-insensitive), or null: what Excel would show. */
export function matchingRule(cf: ConditionalFormatSpec, value: CellValue): ConditionalFormatSpec["rules"][number] | null {
  if (value === null) return null;
  const text = String(value).toLowerCase();
  return cf.rules.find((r) => text.includes(r.text.toLowerCase())) ?? null;
}
